#!/usr/bin/env bash
# npm run bench: builds what the benchmarks need (server bundle, web export), then runs every
# benchmark beside its floor in the same run and writes .artifacts/bench.json. Not part of npm test.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
cd "$ROOT"
bash scripts/setup.sh
mkdir -p .artifacts
exec node --import tsx scripts/bench/run.ts "$@"
