#!/usr/bin/env bash
# npm start: set everything up, then serve Basted in the foreground (Ctrl-C or `npm stop` ends it).
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
cd "$ROOT"
bash scripts/setup.sh

PIDFILE="$BASTED_DATA_DIR/run/server.pid"
if pid_alive "$PIDFILE"; then
  say "Basted is already running (pid $(cat "$PIDFILE")) on port $PORT; \`npm stop\` stops it"
  exit 0
fi

node --import tsx db/cli.ts accounts
cat >&2 <<MSG

  Basted      http://localhost:$PORT
  Inbox       $INBOX_URL   (every e-mail the app sends, captured locally)
  API health  http://localhost:$PORT/api/health

MSG
echo $$ >"$PIDFILE"
# The bundle setup.sh built (scripts/build-server.mjs): plain node, no TypeScript at run time.
# The local set-up: fakes, the development secret and plain-http cookies are allowed by name.
NODE_ENV=development exec node --enable-source-maps dist-server/index.js
