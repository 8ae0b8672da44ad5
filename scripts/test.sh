#!/usr/bin/env bash
# `npm test`: the same bootstrap with throw-away services, then every test layer.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/bootstrap.sh chromium python3-scipy python3-numpy poppler-utils
exec ./node_modules/.bin/tsx scripts/run-tests.ts "$@"
