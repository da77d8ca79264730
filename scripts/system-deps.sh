#!/usr/bin/env bash
# Install the Debian packages Runproof's local services and e2e tests need, only if
# missing. Usage: scripts/system-deps.sh [postgres] [chromium] [nginx]   (no argument: postgres and
# chromium; nginx only for the scale-out test, npm run test:scale)
#
# Deliberately cheap when everything is present (no apt calls at all), so start/test
# scripts and CI can call it unconditionally.
set -euo pipefail

want=("$@")
if ((${#want[@]} == 0)); then
  want=(postgres chromium)
fi

have_postgres() {
  # Same rule as rp_pg_find_bin in lib/common.sh: any /usr/lib/postgresql/<ver>/bin/initdb.
  # (Not `command -v pg_ctl`: /usr/local/bin may hold unrelated pg_* tools.)
  local d
  for d in /usr/lib/postgresql/*/bin; do
    [[ -x "$d/initdb" ]] && return 0
  done
  return 1
}
have_chromium() { [[ -x /usr/bin/chromium ]]; }
have_nginx() { [[ -x /usr/sbin/nginx ]]; }

missing=()
for w in "${want[@]}"; do
  case "$w" in
    postgres | postgresql) have_postgres || missing+=(postgresql) ;;
    chromium) have_chromium || missing+=(chromium) ;;
    nginx) have_nginx || missing+=(nginx) ;;
    -h | --help)
      sed -n '2,3p' "$0"
      exit 0
      ;;
    *)
      printf 'error: unknown dependency "%s" (known: postgres, chromium, nginx)\n' "$w" >&2
      exit 2
      ;;
  esac
done

if ((${#missing[@]} == 0)); then
  exit 0
fi

sudo=()
if [[ "$(id -u)" -ne 0 ]]; then
  if command -v sudo >/dev/null 2>&1; then
    sudo=(sudo)
  else
    printf 'error: missing Debian packages: %s\n  run as root: apt-get install -y %s\n' \
      "${missing[*]}" "${missing[*]}" >&2
    exit 1
  fi
fi

printf 'system-deps: installing %s (apt-get) ...\n' "${missing[*]}"
log="$(mktemp -t runproof-apt.XXXXXX.log)"
# The package lists on fresh images are empty or stale: update once, and only here,
# because it costs several seconds and needs the network.
if ! "${sudo[@]}" env DEBIAN_FRONTEND=noninteractive apt-get update >"$log" 2>&1 ||
  ! "${sudo[@]}" env DEBIAN_FRONTEND=noninteractive \
    apt-get install -y --no-install-recommends "${missing[@]}" >>"$log" 2>&1; then
  printf 'error: could not install %s; apt output (last 25 lines of %s):\n' \
    "${missing[*]}" "$log" >&2
  tail -n 25 "$log" >&2
  exit 1
fi

# Verify, since a package name could install without providing the expected binary.
for m in "${missing[@]}"; do
  case "$m" in
    postgresql) have_postgres || { echo "error: postgresql installed but no initdb under /usr/lib/postgresql/*/bin" >&2; exit 1; } ;;
    chromium) have_chromium || { echo "error: chromium installed but /usr/bin/chromium is missing" >&2; exit 1; } ;;
    nginx) have_nginx || { echo "error: nginx installed but /usr/sbin/nginx is missing" >&2; exit 1; } ;;
  esac
done
rm -f -- "$log"
printf 'system-deps: installed %s\n' "${missing[*]}"
