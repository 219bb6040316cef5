#!/usr/bin/env bash
# npm run dev: the API with reload on change, and Metro serving the app with fast refresh.
# Metro (port 8081) forwards /api/* to the API (see metro.config.js), so open http://localhost:8081.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
cd "$ROOT"
bash scripts/setup.sh --services
export NODE_ENV=development
node --import tsx db/cli.ts migrate
node --import tsx db/cli.ts seed
node --import tsx db/cli.ts accounts

setsid node --import tsx --watch server/index.ts &
echo $! >"$BASTED_DATA_DIR/run/server.pid"
trap 'bash scripts/stop.sh >/dev/null 2>&1 || true' EXIT
say "inbox: $INBOX_URL"
# Started directly, not through npx, so that stopping it leaves no child behind.
setsid expo start --web --port 8081 &
echo $! >"$BASTED_DATA_DIR/run/dev-web.pid"
wait
