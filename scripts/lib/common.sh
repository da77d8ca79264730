# shellcheck shell=bash
# Shared helpers for Runproof's local scripts (services.sh, start.sh, test.sh, ...).
#
# Usage:  source "$(dirname "${BASH_SOURCE[0]}")/lib/common.sh"
#
# Sourcing only defines variables and functions; it starts nothing and creates nothing,
# so it is safe (and cheap, a few ms) to source from any script, even before
# `npm install` or before PostgreSQL is installed. It does not change shell options of
# the caller.

# Sourcing twice (start.sh sources it, then calls services.sh which sources it again)
# must not redo work or clobber values the caller already adjusted.
if [[ -n "${_RUNPROOF_COMMON_LOADED:-}" ]]; then
  return 0
fi
_RUNPROOF_COMMON_LOADED=1

# --- locations ---------------------------------------------------------------------

# Resolve physically (pwd -P) so that the path hash, and therefore the fallback cluster
# dir, is the same however the checkout is reached (symlinks, relative invocations).
RUNPROOF_ROOT="$(cd -P -- "$(dirname -- "${BASH_SOURCE[0]}")/../.." && pwd -P)"
RUNPROOF_DATA="$RUNPROOF_ROOT/.data"    # git-ignored scratch space for all services
RUNPROOF_RUN="$RUNPROOF_DATA/run"       # pid files and logs of background services
export RUNPROOF_ROOT RUNPROOF_DATA RUNPROOF_RUN

# --- ports and credentials (env overridable so parallel checkouts can coexist) --------

PG_HOST=127.0.0.1
PG_PORT="${PGPORT_RUNPROOF:-54329}"
PG_APP_USER=runproof
PG_APP_PASSWORD=runproof
PG_APP_DB=runproof
PG_TEST_DB=runproof_test
PG_SUPERUSER=postgres                   # created by our initdb -U, whatever the OS user
SMTP_PORT="${SMTP_PORT:-1025}"
MAILDEV_WEB_PORT="${MAILDEV_WEB_PORT:-1080}"
S3_PORT="${S3_PORT:-4569}"
E2E_PORT="${E2E_PORT:-3100}"            # the production build under Playwright
# Derived, never set on its own: a stale value would send tests to another checkout's catcher.
MAIL_CATCHER_URL="http://127.0.0.1:$MAILDEV_WEB_PORT"
S3_BUCKET="${S3_BUCKET:-runproof}"
S3_ENDPOINT="http://127.0.0.1:$S3_PORT"
S3_ACCESS_KEY_ID=S3RVER                 # s3rver's hard-wired credentials
S3_SECRET_ACCESS_KEY=S3RVER
S3_REGION="${S3_REGION:-us-east-1}"
RUNPROOF_DATABASE_URL="postgres://$PG_APP_USER:$PG_APP_PASSWORD@$PG_HOST:$PG_PORT/$PG_APP_DB"
RUNPROOF_TEST_DATABASE_URL="postgres://$PG_APP_USER:$PG_APP_PASSWORD@$PG_HOST:$PG_PORT/$PG_TEST_DB"
export PG_HOST PG_PORT PG_APP_USER PG_APP_PASSWORD PG_APP_DB PG_TEST_DB PG_SUPERUSER \
  SMTP_PORT MAILDEV_WEB_PORT MAIL_CATCHER_URL E2E_PORT S3_PORT S3_BUCKET S3_ENDPOINT S3_ACCESS_KEY_ID \
  S3_SECRET_ACCESS_KEY S3_REGION RUNPROOF_DATABASE_URL RUNPROOF_TEST_DATABASE_URL

# --- secrets ------------------------------------------------------------------------

# rp_ensure_auth_secret [FILE] -- print the server's signing secret, creating a random one
# (256 bits, hex) in FILE on first use and reusing it afterwards. Only the owner may read it.
rp_ensure_auth_secret() {
  local file="${1:-$RUNPROOF_DATA/auth-secret}" secret=""
  if [[ -s "$file" ]]; then
    secret="$(tr -d '[:space:]' <"$file")"
  fi
  if (( ${#secret} < 32 )); then
    mkdir -p -- "$(dirname -- "$file")"
    secret="$(od -An -N32 -tx1 /dev/urandom | tr -d ' \n')"
    (umask 077 && printf '%s\n' "$secret" >"$file.tmp") && mv -f -- "$file.tmp" "$file"
  fi
  chmod 600 -- "$file" 2>/dev/null || true
  printf '%s\n' "$secret"
}

# --- messages ----------------------------------------------------------------------

RUNPROOF_QUIET="${RUNPROOF_QUIET:-}"

rp_log() { [[ -n "$RUNPROOF_QUIET" ]] || printf '%s\n' "$*"; }
rp_warn() { printf 'warning: %s\n' "$*" >&2; }
rp_die() {
  printf 'error: %s\n' "$*" >&2
  exit 1
}

# rp_log_tail FILE [LINES] -- show the end of a log on stderr, to explain a failure.
rp_log_tail() {
  local file="$1" lines="${2:-30}"
  if [[ -s "$file" ]]; then
    printf -- '--- last %s lines of %s ---\n' "$lines" "$file" >&2
    tail -n "$lines" -- "$file" >&2 || true
    printf -- '---\n' >&2
  else
    printf '(log %s is empty or missing)\n' "$file" >&2
  fi
}

# rp_path_hash -- short, stable id of this checkout, used to name dirs outside of it.
rp_path_hash() { printf '%s' "$RUNPROOF_ROOT" | sha256sum | cut -c1-12; }

# --- PostgreSQL ---------------------------------------------------------------------

# rp_pg_find_bin -- print the newest /usr/lib/postgresql/<ver>/bin that has initdb.
# Never rely on PATH: /usr/local/bin/pg_ctl etc. on some machines are not Debian's.
rp_pg_find_bin() {
  local d best="" best_ver=-1 ver
  for d in /usr/lib/postgresql/*/bin; do
    [[ -x "$d/initdb" ]] || continue
    ver="${d#/usr/lib/postgresql/}"
    ver="${ver%/bin}"
    [[ "$ver" =~ ^[0-9]+$ ]] || continue
    if ((ver > best_ver)); then
      best_ver=$ver
      best=$d
    fi
  done
  [[ -n "$best" ]] && printf '%s\n' "$best"
}

# The OS user that owns the cluster: initdb refuses to run as root.
if [[ "$(id -u)" -eq 0 ]]; then
  PG_OS_USER=postgres
else
  PG_OS_USER="$(id -un)"
fi
export PG_OS_USER

# rp_as_pg CMD [ARGS...] -- run a PostgreSQL command as the cluster owner.
# cd / first: as root the caller's cwd may be unreadable for the postgres user, and the
# pg tools complain (or fail) when they cannot resolve their working directory.
rp_as_pg() {
  if [[ "$(id -u)" -eq 0 ]]; then
    (cd / && runuser -u "$PG_OS_USER" -- "$@")
  else
    "$@"
  fi
}

# rp_pg_can_reach DIR -- can the cluster owner traverse DIR (and so all its parents)?
# A checkout below a 0700 dir (e.g. /root/...) is not reachable by `postgres`.
rp_pg_can_reach() {
  if [[ "$(id -u)" -ne 0 ]]; then
    return 0
  fi
  id -u "$PG_OS_USER" >/dev/null 2>&1 || return 1
  (cd / && runuser -u "$PG_OS_USER" -- test -x "$1") 2>/dev/null
}

# rp_pg_resolve -- (re)compute PG_BIN, PG_DATA, PG_SOCKDIR, PG_LOG.
# Deterministic from the filesystem, so up/down/status and other scripts agree on the
# same cluster without any state file. Call again after installing PostgreSQL.
rp_pg_resolve() {
  PG_BIN="$(rp_pg_find_bin || true)"
  local preferred="$RUNPROOF_DATA/pg" probe="$RUNPROOF_DATA"
  # .data may not exist yet on a fresh clone: then its parent decides.
  [[ -d "$probe" ]] || probe="$RUNPROOF_ROOT"
  PG_DATA_FALLBACK=0
  if [[ -n "${PG_DATA_RUNPROOF:-}" ]]; then
    PG_DATA="$PG_DATA_RUNPROOF"         # explicit override wins
  elif rp_pg_can_reach "$probe"; then
    PG_DATA="$preferred"
  else
    PG_DATA="/var/tmp/runproof-pg-$(rp_path_hash)"
    PG_DATA_FALLBACK=1
  fi
  # Unix socket paths are limited to ~107 bytes (sun_path); stay well below.
  PG_SOCKDIR="$PG_DATA"
  if (( ${#PG_SOCKDIR} + ${#PG_PORT} + 10 >= 100 )); then
    PG_SOCKDIR="/var/tmp/runproof-pgsock-$(rp_path_hash)"
  fi
  PG_LOG="$PG_DATA/server.log"
  export PG_BIN PG_DATA PG_DATA_FALLBACK PG_SOCKDIR PG_LOG
}
rp_pg_resolve

# rp_pg_running -- is our cluster's postmaster alive?
# Not `pg_ctl status`: after a kill -9 it trusts postmaster.pid as long as that pid
# exists, and a not-yet-reaped zombie (or a recycled pid) counts as "running".
rp_pg_running() {
  [[ -n "$PG_BIN" && -f "$PG_DATA/postmaster.pid" ]] || return 1
  local pid cwd
  pid="$(head -n1 -- "$PG_DATA/postmaster.pid" 2>/dev/null)" || return 1
  [[ "$pid" =~ ^[0-9]+$ ]] && rp_pid_alive "$pid" || return 1
  [[ "$(cat "/proc/$pid/comm" 2>/dev/null)" == postgres* ]] || return 1
  # The postmaster chdirs into its data dir: make sure it is ours, not another cluster's.
  cwd="$(readlink "/proc/$pid/cwd" 2>/dev/null)" || return 0
  [[ "$cwd" == "$(cd -P -- "$PG_DATA" 2>/dev/null && pwd -P)" ]]
}

# rp_psql_super [PSQL ARGS...] -- psql as the superuser over the trusted unix socket.
# -X: never read ~/.psqlrc (as root, HOME is /root, unreadable for postgres).
rp_psql_super() {
  rp_as_pg "$PG_BIN/psql" -X -v ON_ERROR_STOP=1 -h "$PG_SOCKDIR" -p "$PG_PORT" \
    -U "$PG_SUPERUSER" "$@"
}

# rp_psql_app [PSQL ARGS...] -- psql as the app role over TCP, like the app connects.
rp_psql_app() {
  PGPASSWORD="$PG_APP_PASSWORD" "${PG_BIN:-/usr/bin}/psql" -X -v ON_ERROR_STOP=1 \
    -h "$PG_HOST" -p "$PG_PORT" -U "$PG_APP_USER" "$@"
}

# rp_pid_alive PID -- is PID running? A zombie counts as dead: detached services are
# reparented to PID 1, which on some VMs/containers reaps them only after a delay.
rp_pid_alive() {
  kill -0 "$1" 2>/dev/null || return 1
  local stat
  stat="$(cat "/proc/$1/stat" 2>/dev/null)" || return 1
  stat="${stat##*) }"
  [[ "${stat:0:1}" != Z ]]
}

# --- waiting ------------------------------------------------------------------------

# rp_port_open PORT [HOST] -- is something accepting TCP connections?
rp_port_open() {
  local port="$1" host="${2:-127.0.0.1}"
  # bash's /dev/tcp avoids depending on nc; subshell so the fd closes immediately.
  (exec 3<>"/dev/tcp/$host/$port") 2>/dev/null
}

# rp_http_ok URL -- does URL answer with a 2xx?
rp_http_ok() { curl -sf -o /dev/null --max-time 2 "$1"; }

# rp_http_any URL -- does URL give any HTTP answer (s3rver answers / with 403/200)?
rp_http_any() { curl -s -o /dev/null --max-time 2 "$1"; }

# rp_wait_for TIMEOUT_SECONDS PID CMD [ARGS...]
# Poll CMD every 0.1 s until it succeeds. Fails early if PID (when non-empty) has died,
# so a crashing service is reported at once instead of after the whole timeout.
rp_wait_for() {
  local timeout="$1" pid="$2"
  shift 2
  local deadline=$((SECONDS + timeout))
  while ((SECONDS < deadline)); do
    if "$@"; then return 0; fi
    if [[ -n "$pid" ]] && ! rp_pid_alive "$pid"; then return 2; fi
    sleep 0.1
  done
  "$@"
}

# rp_wait_port PORT [TIMEOUT] [HOST] -- wait until PORT accepts connections.
rp_wait_port() { rp_wait_for "${2:-20}" "" rp_port_open "$1" "${3:-127.0.0.1}"; }

# rp_wait_http URL [TIMEOUT] -- wait until URL answers 2xx.
rp_wait_http() { rp_wait_for "${2:-20}" "" rp_http_ok "$1"; }

# rp_print_env -- the connection settings as KEY=value lines (e.g. to write a .env).
rp_print_env() {
  cat <<EOF
DATABASE_URL=$RUNPROOF_DATABASE_URL
TEST_DATABASE_URL=$RUNPROOF_TEST_DATABASE_URL
SMTP_HOST=127.0.0.1
SMTP_PORT=$SMTP_PORT
MAIL_CATCHER_URL=$MAIL_CATCHER_URL
S3_ENDPOINT=$S3_ENDPOINT
S3_BUCKET=$S3_BUCKET
S3_REGION=$S3_REGION
S3_ACCESS_KEY_ID=$S3_ACCESS_KEY_ID
S3_SECRET_ACCESS_KEY=$S3_SECRET_ACCESS_KEY
S3_FORCE_PATH_STYLE=true
EOF
}
