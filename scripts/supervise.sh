#!/usr/bin/env bash
# Keeps one process running: starts it, and whenever it exits for any reason other than being
# told to stop, logs the exit and starts it again after a pause (1 s, doubling to 30 s while it
# keeps failing within a minute of starting; back to 1 s after a good minute).
# Usage: supervise.sh NAME LOG_FILE COMMAND [ARGS...]
# Used by scripts/start.sh for the app and the e-mail dispatcher. PostgreSQL runs on its own
# (pg_ctl), so no crash here ever stops the database.
set -uo pipefail
name="$1" log="$2"; shift 2
stopping=false child=""
stop() {
  stopping=true
  [ -n "$child" ] && kill -TERM "$child" 2>/dev/null
}
trap stop TERM INT
stamp() { date -u +%Y-%m-%dT%H:%M:%SZ; }

pause=1 restarts=0
while true; do
  started=$(date +%s)
  "$@" >>"$log" 2>&1 </dev/null &
  child=$!
  wait "$child"
  code=$?
  # A trap interrupts wait; wait again for the real exit status.
  while kill -0 "$child" 2>/dev/null; do wait "$child"; code=$?; done
  [ "$stopping" = true ] && exit 0
  restarts=$((restarts + 1))
  if [ $(($(date +%s) - started)) -ge 60 ]; then pause=1; fi
  echo "$(stamp) supervisor: $name exited with code $code; restart $restarts in ${pause}s (log: $log)" | tee -a "$log"
  sleep "$pause" & wait $! 2>/dev/null
  [ "$stopping" = true ] && exit 0
  pause=$((pause * 2 > 30 ? 30 : pause * 2))
done
