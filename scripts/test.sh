#!/usr/bin/env bash
# npm test: the same set-up as npm start, then every suite (unit, API, component, browser).
# Ends with one plain line "N passed, N failed" counted over all suites; exits non-zero on any failure.
#   npm test -- [jest arguments]    e.g. npm test -- --selectProjects api
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
cd "$ROOT"
bash scripts/setup.sh || exit 1
bash scripts/chromium.sh || exit 1

mkdir -p .artifacts
rm -f .artifacts/jest-results.json
# --forceExit: a suite whose teardown fails (and leaves a socket open) must not hold CI forever;
# its failure is still in the results and the summary below.
NODE_ENV=test jest --ci --forceExit --json --outputFile=.artifacts/jest-results.json "$@"
status=$?
node scripts/test-summary.js .artifacts/jest-results.json || status=1
exit $status
