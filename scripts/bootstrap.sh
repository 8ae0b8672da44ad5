#!/usr/bin/env bash
# Installs what a fresh machine lacks: Debian packages, then the npm dependencies.
# Usage: scripts/bootstrap.sh [debian-package ...]
set -euo pipefail
cd "$(dirname "$0")/.."

want=(mariadb-server "$@")
missing=()
for p in "${want[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  echo "» Installing Debian packages: ${missing[*]}"
  SUDO=""; [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi

# npm ci when node_modules is missing or older than the lockfile.
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "» Installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi
