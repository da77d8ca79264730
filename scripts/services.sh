#!/usr/bin/env bash
# Local backing services for Runproof: PostgreSQL (private cluster), maildev, s3rver.
#
# Usage: scripts/services.sh up|down|status [--quiet]
#
#   up      start whatever is not running (idempotent; ~0.1-0.5 s when all are up)
#   down    stop everything this checkout started (tolerates things not running)
#   status  print each service up/down; exit 0 only if all are up
#
# Ports/env: PGPORT_RUNPROOF (54329), SMTP_PORT (1025), MAILDEV_WEB_PORT (1080, and MAIL_CATCHER_URL from it),
# S3_PORT (4569). See scripts/lib/common.sh for the exported variables and helpers.
set -euo pipefail

# shellcheck source-path=SCRIPTDIR source=lib/common.sh
source "$(dirname -- "${BASH_SOURCE[0]}")/lib/common.sh"

usage() {
  sed -n '4,9p' "$0" | sed 's/^# \{0,1\}//'
  exit 2
}

cmd=""
for arg in "$@"; do
  case "$arg" in
    -q | --quiet) export RUNPROOF_QUIET=1 ;;
    up | down | status) [[ -z "$cmd" ]] || usage; cmd="$arg" ;;
    -h | --help) usage ;;
    *) printf 'error: unknown argument "%s"\n' "$arg" >&2; usage ;;
  esac
done
[[ -n "$cmd" ]] || usage

MAILDEV_BIN="$RUNPROOF_ROOT/node_modules/.bin/maildev"
MAILDEV_URL="http://127.0.0.1:$MAILDEV_WEB_PORT"
MAILDEV_PIDFILE="$RUNPROOF_RUN/maildev.pid"
MAILDEV_LOG="$RUNPROOF_RUN/maildev.log"
S3_PIDFILE="$RUNPROOF_RUN/s3rver.pid"
S3_LOG="$RUNPROOF_RUN/s3rver.log"

# Print a summary line: NAME STATE DETAIL
summary() { rp_log "$(printf '%-9s %-5s %s' "$1" "$2" "$3")"; }

# --- background process helpers -------------------------------------------------------

# svc_pid PIDFILE MARKER -- print the pid from PIDFILE if that process is alive and its
# command line contains MARKER (guards against a recycled pid after a reboot/kill -9).
svc_pid() {
  local pidfile="$1" marker="$2" pid
  [[ -f "$pidfile" ]] || return 1
  pid="$(<"$pidfile")"
  [[ "$pid" =~ ^[0-9]+$ ]] || return 1
  rp_pid_alive "$pid" || return 1
  tr '\0' ' ' <"/proc/$pid/cmdline" 2>/dev/null | grep -qF -- "$marker" || return 1
  printf '%s\n' "$pid"
}

# svc_start PIDFILE LOG CMD... -- start CMD detached in its own session.
# The child writes its own pid before exec'ing, so the pid file is right whether or not
# setsid had to fork; its own session/process group lets `down` kill node's children too
# and keeps it alive after the calling terminal or CI step goes away.
# 9>&- : do not leak our flock fd, or the lock would be held as long as the service runs.
svc_start() {
  local pidfile="$1" log="$2"
  shift 2
  rm -f -- "$pidfile"
  : >"$log"
  # shellcheck disable=SC2016 # $$ and $1 are for the inner bash
  (cd "$RUNPROOF_ROOT" &&
    setsid -f bash -c 'echo $$ >"$1"; shift; exec "$@"' _ "$pidfile" "$@" \
      </dev/null >>"$log" 2>&1 9>&-)
  local i
  for ((i = 0; i < 50; i++)); do
    [[ -s "$pidfile" ]] && break
    sleep 0.05
  done
  [[ -s "$pidfile" ]] && cat -- "$pidfile"
}

# svc_stop NAME PIDFILE MARKER
svc_stop() {
  local name="$1" pidfile="$2" marker="$3" pid i
  if ! pid="$(svc_pid "$pidfile" "$marker")"; then
    rm -f -- "$pidfile"
    summary "$name" down "(was not running)"
    return 0
  fi
  kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
  for ((i = 0; i < 50; i++)); do
    rp_pid_alive "$pid" || break
    sleep 0.05
  done
  if rp_pid_alive "$pid"; then
    kill -KILL -- "-$pid" 2>/dev/null || kill -KILL "$pid" 2>/dev/null || true
  fi
  rm -f -- "$pidfile"
  summary "$name" down "(stopped pid $pid)"
}

# --- PostgreSQL -----------------------------------------------------------------------

pg_write_config() {
  # Regenerated on every start so a changed PGPORT_RUNPROOF or socket dir takes effect;
  # kept in a separate include so postgresql.conf stays initdb's pristine file.
  local sockdir_escaped="${PG_SOCKDIR//\'/\'\'}"
  cat >"$PG_DATA/runproof.conf" <<EOF
# Written by scripts/services.sh on each start; edits here are overwritten.
listen_addresses = '127.0.0.1'
port = $PG_PORT
unix_socket_directories = '$sockdir_escaped'
# Dev/test cluster: trade crash durability of the last few commits for test speed.
synchronous_commit = off
EOF
  cat >"$PG_DATA/pg_hba.conf" <<EOF
# Written by scripts/services.sh. TYPE DATABASE USER ADDRESS METHOD
local   all   $PG_SUPERUSER                  trust
local   all   $PG_APP_USER                   scram-sha-256
host    all   $PG_APP_USER   127.0.0.1/32    scram-sha-256
EOF
  if [[ "$(id -u)" -eq 0 ]]; then
    chown "$PG_OS_USER:" "$PG_DATA/runproof.conf" "$PG_DATA/pg_hba.conf"
  fi
  chmod 600 "$PG_DATA/runproof.conf" "$PG_DATA/pg_hba.conf"
}

pg_init() {
  if [[ -d "$PG_DATA" ]] && [[ -n "$(ls -A -- "$PG_DATA")" ]]; then
    rp_die "PostgreSQL: $PG_DATA exists and is not empty but holds no cluster (no PG_VERSION); remove it and retry"
  fi
  # 0700 is required by postgres for its data dir (its parent, .data or /var/tmp, exists).
  [[ -d "$PG_DATA" ]] || mkdir -m 0700 -- "$PG_DATA"
  if [[ "$(id -u)" -eq 0 ]]; then
    chown "$PG_OS_USER:" "$PG_DATA"
  fi
  rp_log "PostgreSQL: creating cluster in $PG_DATA ..."
  local log="$RUNPROOF_RUN/initdb.log"
  # -U: a fixed superuser name whatever the OS user, so scripts can rely on it.
  if ! rp_as_pg "$PG_BIN/initdb" -D "$PG_DATA" -U "$PG_SUPERUSER" -E UTF8 --locale=C.UTF-8 \
    --auth-local=trust --auth-host=scram-sha-256 --no-instructions >"$log" 2>&1; then
    rp_log_tail "$log"
    rp_die "PostgreSQL: initdb failed (full log: $log)"
  fi
  printf "\ninclude_if_exists = 'runproof.conf'\n" >>"$PG_DATA/postgresql.conf"
}

# A postmaster.pid left by kill -9 makes start fail when its pid got reused by another
# process (the lock check only sees "a process with that pid exists").
pg_clear_stale_pid() {
  local pidfile="$PG_DATA/postmaster.pid" pid
  [[ -f "$pidfile" ]] || return 0
  pid="$(head -n1 -- "$pidfile")"
  if rp_pg_running; then
    return 0 # our postmaster (maybe still recovering): leave it alone
  fi
  rp_log "PostgreSQL: removing stale $pidfile (pid $pid is not this cluster's postmaster)"
  rm -f -- "$pidfile"
}

pg_ensure_roles() {
  # One psql round trip; \gexec runs the generated statements only when needed.
  # CREATE DATABASE cannot run in a transaction block, so no -1 here.
  rp_psql_super -d postgres -qAt \
    -v app_user="$PG_APP_USER" -v app_pw="$PG_APP_PASSWORD" \
    -v app_db="$PG_APP_DB" -v test_db="$PG_TEST_DB" >/dev/null <<'SQL'
SELECT format('CREATE ROLE %I LOGIN CREATEDB PASSWORD %L', :'app_user', :'app_pw')
 WHERE NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = :'app_user') \gexec
SELECT format('ALTER ROLE %I LOGIN CREATEDB PASSWORD %L', :'app_user', :'app_pw')
 WHERE EXISTS (SELECT 1 FROM pg_roles WHERE rolname = :'app_user'
                AND NOT (rolcanlogin AND rolcreatedb)) \gexec
SELECT format('CREATE DATABASE %I OWNER %I', d, :'app_user')
  FROM unnest(ARRAY[:'app_db', :'test_db']) AS d
 WHERE NOT EXISTS (SELECT 1 FROM pg_database WHERE datname = d) \gexec
SQL
}

pg_up() {
  if [[ -z "$PG_BIN" ]]; then
    bash "$RUNPROOF_ROOT/scripts/system-deps.sh" postgres
    rp_pg_resolve
    [[ -n "$PG_BIN" ]] || rp_die "PostgreSQL: no initdb under /usr/lib/postgresql/*/bin after install"
  fi
  if [[ "$(id -u)" -eq 0 ]] && ! id -u "$PG_OS_USER" >/dev/null 2>&1; then
    rp_die "PostgreSQL: running as root but there is no '$PG_OS_USER' system user (reinstall the postgresql package)"
  fi
  if ((PG_DATA_FALLBACK)); then
    rp_log "PostgreSQL: $RUNPROOF_DATA is not reachable by user '$PG_OS_USER' (a parent dir is not traversable); using fallback cluster $PG_DATA"
  fi

  local state="already running"
  if ! rp_pg_running; then
    state="started"
    [[ -f "$PG_DATA/PG_VERSION" ]] || pg_init
    if [[ "$PG_SOCKDIR" != "$PG_DATA" ]]; then
      [[ -d "$PG_SOCKDIR" ]] || mkdir -m 0700 -- "$PG_SOCKDIR"
      [[ "$(id -u)" -ne 0 ]] || chown "$PG_OS_USER:" "$PG_SOCKDIR"
    fi
    pg_write_config
    if rp_port_open "$PG_PORT"; then
      rp_die "PostgreSQL: port $PG_PORT on 127.0.0.1 is already used by another process (set PGPORT_RUNPROOF, or see: ss -ltnp 'sport = :$PG_PORT')"
    fi
    local attempt ok=0
    for attempt in 1 2 3; do
      pg_clear_stale_pid
      # 9>&- : the postmaster must not inherit our lock fd.
      if rp_as_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -l "$PG_LOG" -w -t 30 start >/dev/null 2>&1 9>&-; then
        ok=1
        break
      fi
      rp_warn "PostgreSQL: start attempt $attempt failed, retrying"
      sleep 1
    done
    if ((!ok)); then
      rp_log_tail "$PG_LOG"
      rp_die "PostgreSQL: could not start the cluster in $PG_DATA (log: $PG_LOG)"
    fi
  fi
  if ! pg_ensure_roles; then
    rp_die "PostgreSQL: could not create role/databases (log: $PG_LOG)"
  fi
  summary postgres up "127.0.0.1:$PG_PORT db=$PG_APP_DB,$PG_TEST_DB user=$PG_APP_USER ($state; data $PG_DATA)"
}

pg_down() {
  if [[ -z "$PG_BIN" || ! -f "$PG_DATA/PG_VERSION" ]]; then
    summary postgres down "(no cluster at $PG_DATA)"
  elif rp_pg_running; then
    rp_as_pg "$PG_BIN/pg_ctl" -D "$PG_DATA" -m fast -w -t 30 stop >/dev/null ||
      rp_die "PostgreSQL: pg_ctl stop failed (log: $PG_LOG)"
    summary postgres down "(stopped)"
  else
    summary postgres down "(was not running)"
  fi
}

pg_status() {
  if rp_pg_running && "$PG_BIN/pg_isready" -q -h "$PG_HOST" -p "$PG_PORT"; then
    summary postgres up "127.0.0.1:$PG_PORT (data $PG_DATA)"
  else
    summary postgres down "(data $PG_DATA)"
    return 1
  fi
}

# --- maildev --------------------------------------------------------------------------

maildev_up() {
  if rp_http_ok "$MAILDEV_URL/api/healthz"; then
    local note="already running"
    svc_pid "$MAILDEV_PIDFILE" maildev >/dev/null || note="already answering, not started by this checkout"
    summary maildev up "smtp 127.0.0.1:$SMTP_PORT web $MAILDEV_URL ($note)"
    return 0
  fi
  [[ -x "$MAILDEV_BIN" ]] || rp_die "maildev: $MAILDEV_BIN not found (run npm install)"
  if rp_port_open "$SMTP_PORT"; then
    rp_die "maildev: SMTP port $SMTP_PORT is already in use by something else (set SMTP_PORT)"
  fi
  # A stale instance that stopped answering would keep the ports: replace it.
  if svc_pid "$MAILDEV_PIDFILE" maildev >/dev/null; then
    RUNPROOF_QUIET=1 svc_stop maildev "$MAILDEV_PIDFILE" maildev
  fi
  local pid rc=0
  pid="$(svc_start "$MAILDEV_PIDFILE" "$MAILDEV_LOG" "$MAILDEV_BIN" \
    --ip 127.0.0.1 --web-ip 127.0.0.1 --smtp "$SMTP_PORT" --web "$MAILDEV_WEB_PORT")" || true
  rp_wait_for 20 "$pid" rp_http_ok "$MAILDEV_URL/api/healthz" || rc=$?
  if ((rc != 0)); then
    rp_log_tail "$MAILDEV_LOG"
    if ((rc == 2)); then
      rp_die "maildev: exited during startup (log: $MAILDEV_LOG)"
    fi
    rp_die "maildev: $MAILDEV_URL/api/healthz did not answer within 20 s (log: $MAILDEV_LOG)"
  fi
  summary maildev up "smtp 127.0.0.1:$SMTP_PORT web $MAILDEV_URL (started, pid $pid)"
}

maildev_status() {
  if rp_http_ok "$MAILDEV_URL/api/healthz"; then
    summary maildev up "smtp 127.0.0.1:$SMTP_PORT web $MAILDEV_URL"
  else
    summary maildev down ""
    return 1
  fi
}

# --- s3rver ---------------------------------------------------------------------------

s3_up() {
  if rp_http_any "$S3_ENDPOINT/"; then
    local note="already running"
    svc_pid "$S3_PIDFILE" s3-server.mjs >/dev/null || note="already answering, not started by this checkout"
    summary s3 up "$S3_ENDPOINT bucket=$S3_BUCKET ($note)"
    return 0
  fi
  [[ -d "$RUNPROOF_ROOT/node_modules/s3rver" ]] || rp_die "s3: node_modules/s3rver not found (run npm install)"
  if svc_pid "$S3_PIDFILE" s3-server.mjs >/dev/null; then
    RUNPROOF_QUIET=1 svc_stop s3 "$S3_PIDFILE" s3-server.mjs
  fi
  local pid rc=0
  pid="$(S3_DIR="$RUNPROOF_DATA/s3" S3_HOST=127.0.0.1 \
    svc_start "$S3_PIDFILE" "$S3_LOG" node "$RUNPROOF_ROOT/scripts/s3-server.mjs")" || true
  rp_wait_for 20 "$pid" rp_http_any "$S3_ENDPOINT/" || rc=$?
  if ((rc != 0)); then
    rp_log_tail "$S3_LOG"
    if ((rc == 2)); then
      rp_die "s3: s3-server.mjs exited during startup (log: $S3_LOG)"
    fi
    rp_die "s3: $S3_ENDPOINT did not answer within 20 s (log: $S3_LOG)"
  fi
  summary s3 up "$S3_ENDPOINT bucket=$S3_BUCKET (started, pid $pid)"
}

s3_status() {
  if rp_http_any "$S3_ENDPOINT/"; then
    summary s3 up "$S3_ENDPOINT bucket=$S3_BUCKET"
  else
    summary s3 down ""
    return 1
  fi
}

# --- main -----------------------------------------------------------------------------

take_lock() {
  # Concurrent `up`s (start.sh and test.sh at once) would race on initdb and ports.
  [[ -d "$RUNPROOF_DATA" ]] || mkdir -m 0755 -- "$RUNPROOF_DATA"
  mkdir -p -- "$RUNPROOF_RUN"
  exec 9>"$RUNPROOF_RUN/services.lock"
  flock -w 120 9 || rp_die "another services.sh is still running (lock $RUNPROOF_RUN/services.lock)"
}

case "$cmd" in
  up)
    take_lock
    # .data may have just been created, which can change the cluster location decision.
    rp_pg_resolve
    pg_up
    maildev_up
    s3_up
    ;;
  down)
    if [[ -d "$RUNPROOF_DATA" ]]; then take_lock; fi
    svc_stop s3 "$S3_PIDFILE" s3-server.mjs
    svc_stop maildev "$MAILDEV_PIDFILE" maildev
    pg_down
    ;;
  status)
    rc=0
    pg_status || rc=3
    maildev_status || rc=3
    s3_status || rc=3
    exit "$rc"
    ;;
esac
