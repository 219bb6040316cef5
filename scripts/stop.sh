#!/usr/bin/env bash
# npm stop: stop what npm start (or npm run dev) started.
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
for name in server dev-web; do
  f="$BASTED_DATA_DIR/run/$name.pid"
  if pid_alive "$f"; then
    pid="$(cat "$f")"
    kill -- "-$pid" 2>/dev/null || kill "$pid"
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    say "$name stopped"
  fi
  rm -f "$f"
done
bash "$ROOT/scripts/fakes.sh" stop
bash "$ROOT/scripts/pg.sh" stop
