#!/usr/bin/env bash
# Installs the Debian packages the tests need when they are missing: Debian's chromium (browser tests;
# never a downloaded browser), a PostgreSQL server (the integration suite's second run) and GDAL's
# command-line tools (the GIS exports are opened with ogrinfo, as a desktop GIS would read them).
#
# Another install may hold the package lock (a fresh machine often runs its own updates at first boot):
# wait for it, up to APT_LOCK_WAIT seconds (default 600), rather than fail at once.
set -euo pipefail
lock_wait="${APT_LOCK_WAIT:-600}"

need=()
[ -x /usr/bin/chromium ] || need+=(chromium)
ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || need+=(postgresql)
command -v ogrinfo >/dev/null 2>&1 || need+=(gdal-bin)
[ ${#need[@]} -gt 0 ] || exit 0

echo "Installing Debian packages: ${need[*]}"
SUDO=""
[ "$(id -u)" -eq 0 ] || SUDO="sudo"
apt_get() { DEBIAN_FRONTEND=noninteractive $SUDO apt-get -o DPkg::Lock::Timeout="$lock_wait" "$@"; }

# `apt-get install` waits for the dpkg lock through DPkg::Lock::Timeout; `apt-get update` (apt 2.6) ignores
# that option for the package lists' lock, so it is retried here until the same deadline.
deadline=$((SECONDS + lock_wait))
while ! out=$(apt_get update -qq 2>&1); do
  if ! grep -q "Could not get lock" <<<"$out" || [ "$SECONDS" -ge "$deadline" ]; then
    echo "$out" >&2
    exit 1
  fi
  echo "Waiting for another package install to release the lock…"
  sleep 5
done
[ -z "$out" ] || echo "$out"
apt_get install -y -qq --no-install-recommends "${need[@]}"
