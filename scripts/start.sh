#!/usr/bin/env bash
# `npm start`: install what is missing, start the services, migrate, seed, build and serve.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/bootstrap.sh
exec ./node_modules/.bin/tsx scripts/start.ts "$@"
