#!/bin/sh
# First step of `npm start` and `npm test` on any machine: install what is missing, then hand over
# to the TypeScript script named by $1 (scripts/start.ts or scripts/test.ts).
set -eu
cd "$(dirname "$0")/.."

missing=""
ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || missing="$missing postgresql"
[ -x /usr/bin/chromium ] || missing="$missing chromium"
[ -x /usr/bin/pdftoppm ] || missing="$missing poppler-utils"
if [ -n "$missing" ]; then
  if [ "$(id -u)" -ne 0 ]; then
    echo "[benchwarden] missing Debian packages:$missing — install them with: sudo apt-get install -y$missing" >&2
    exit 1
  fi
  echo "[benchwarden] installing Debian packages:$missing"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -q
  # shellcheck disable=SC2086
  apt-get install -y -q --no-install-recommends $missing fonts-dejavu-core
fi

if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[benchwarden] installing npm dependencies (npm ci)"
  npm ci --no-audit --no-fund
fi

# Any further arguments go to the script (npm run bench -- --queue-only).
script="$1"
shift
exec node_modules/.bin/tsx "scripts/$script.ts" "$@"
