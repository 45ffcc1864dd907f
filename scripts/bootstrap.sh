#!/usr/bin/env bash
# Installs what is missing before the stack can start: Debian packages (MariaDB, Chromium for the
# browser tests; Galera, rsync and HAProxy for the cluster) with apt-get, then the npm packages from the lock file. Idempotent and quiet when
# everything is already there.
set -euo pipefail
cd "$(dirname "$0")/.."

missing=()
command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || missing+=(mariadb-server)
command -v mariadb >/dev/null 2>&1 || missing+=(mariadb-client)
[ -x /usr/bin/chromium ] || missing+=(chromium)
# the cluster (npm run cluster, the cluster test layer): Galera's provider, its rsync state transfer, HAProxy
[ -f /usr/lib/galera/libgalera_smm.so ] || missing+=(galera-4)
command -v rsync >/dev/null 2>&1 || missing+=(rsync)
command -v haproxy >/dev/null 2>&1 || [ -x /usr/sbin/haproxy ] || missing+=(haproxy)

if [ ${#missing[@]} -gt 0 ]; then
  echo "loamline: installing Debian packages: ${missing[*]}"
  SUDO=""
  [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq -o DPkg::Lock::Timeout=600
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq -o DPkg::Lock::Timeout=600 \
    --no-install-recommends "${missing[@]}" >/dev/null
fi

# npm ci when node_modules is missing or older than the lock file.
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "loamline: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi
