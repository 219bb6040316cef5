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
# Every suite closes what it opened, so jest ends by itself (no --forceExit). Should a teardown
# ever hang, the run is stopped after 45 minutes and counts as failed rather than holding CI.
NODE_ENV=test timeout --signal=TERM 2700 jest --ci --json --outputFile=.artifacts/jest-results.json "$@"
status=$?
if [[ $status -eq 124 ]]; then say "the test run did not end within 45 minutes: something was left open"; fi
node scripts/test-summary.js .artifacts/jest-results.json || status=1
exit $status
