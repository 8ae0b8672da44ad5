#!/usr/bin/env bash
# `npm run dev`: the demo services and worker, with the Vite dev server instead of a build.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/bootstrap.sh
exec ./node_modules/.bin/tsx scripts/start.ts --dev "$@"
