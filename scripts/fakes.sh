#!/usr/bin/env bash
# Start/stop the local fakes (S3 + SMTP with a readable inbox) as one background process.
#   scripts/fakes.sh start|stop|status
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
PIDFILE="$BASTED_DATA_DIR/run/fakes.pid"

port_open() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
all_up() { port_open "$FAKE_S3_PORT" && port_open "$FAKE_SMTP_PORT" && port_open "$FAKE_INBOX_PORT"; }

case "${1:-}" in
  start)
    if pid_alive "$PIDFILE" && all_up; then say "local fakes already running"; exit 0; fi
    for p in "$FAKE_S3_PORT" "$FAKE_SMTP_PORT" "$FAKE_INBOX_PORT"; do
      ! port_open "$p" || { say "port $p is taken by another program; set FAKE_S3_PORT / FAKE_SMTP_PORT / FAKE_INBOX_PORT"; exit 1; }
    done
    say "starting local fakes (S3 :$FAKE_S3_PORT, SMTP :$FAKE_SMTP_PORT, inbox :$FAKE_INBOX_PORT)"
    cd "$ROOT"
    setsid node --import tsx scripts/fakes/main.ts >>"$BASTED_DATA_DIR/logs/fakes.log" 2>&1 < /dev/null &
    echo $! >"$PIDFILE"
    for _ in $(seq 1 100); do all_up && exit 0; pid_alive "$PIDFILE" || break; sleep 0.2; done
    tail -n 20 "$BASTED_DATA_DIR/logs/fakes.log" >&2
    say "the local fakes did not come up"; exit 1
    ;;
  stop)
    if pid_alive "$PIDFILE"; then
      kill "$(cat "$PIDFILE")"
      for _ in $(seq 1 50); do pid_alive "$PIDFILE" || break; sleep 0.1; done
      say "local fakes stopped"
    else
      say "local fakes not running"
    fi
    rm -f "$PIDFILE"
    ;;
  status)
    if pid_alive "$PIDFILE" && all_up; then echo "running"; else echo "not running"; exit 3; fi
    ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 2 ;;
esac
