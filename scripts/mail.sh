#!/usr/bin/env bash
# Local fake SMTP server with a web inbox (maildev) standing in for the hosted mail service.
#   scripts/mail.sh start|stop|status
# MAIL_INSTANCE (folder under .data/), SMTP_PORT (default 1025), MAIL_WEB_PORT (default 1080).
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
instance="${MAIL_INSTANCE:-demo}"
smtp_port="${SMTP_PORT:-1025}"
web_port="${MAIL_WEB_PORT:-1080}"
base="$root/.data/mail-$instance"
pidfile="$base/maildev.pid"
log="$base/maildev.log"

running() { [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null; }

start() {
  mkdir -p "$base"
  if running; then echo "[mail:$instance] already running (inbox http://127.0.0.1:$web_port)"; return 0; fi
  rm -f "$pidfile"
  node "$root/node_modules/maildev/bin/maildev" --ip 127.0.0.1 --web-ip 127.0.0.1 \
    --smtp "$smtp_port" --web "$web_port" --silent >"$log" 2>&1 &
  echo $! >"$pidfile"
  for _ in $(seq 1 80); do
    if node -e "fetch(process.argv[1]).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" "http://127.0.0.1:$web_port/email"; then
      echo "[mail:$instance] SMTP on 127.0.0.1:$smtp_port, inbox http://127.0.0.1:$web_port"; return 0
    fi
    sleep 0.25
  done
  echo "[mail:$instance] did not start; see $log" >&2; tail -n 20 "$log" >&2 || true; exit 1
}

stop() {
  if running; then
    pid="$(cat "$pidfile")"; kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 40); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    kill -9 "$pid" 2>/dev/null || true
  fi
  rm -f "$pidfile"; echo "[mail:$instance] stopped"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then echo running; else echo "not running"; exit 1; fi ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 64 ;;
esac
