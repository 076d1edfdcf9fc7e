#!/usr/bin/env bash
# Private MariaDB server for Channelsmith, on loopback, with its own data directory, socket and port.
#   scripts/mariadb.sh start   # install (Debian mariadb-server) when missing, initialise, start, create db + user
#   scripts/mariadb.sh stop    # clean shutdown
#   scripts/mariadb.sh status
# Instance settings come from the environment (defaults = the demo instance, see .env.example):
#   DB_INSTANCE (folder name under .data/), DB_PORT, DB_NAME, DB_USER, DB_PASSWORD
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
instance="${DB_INSTANCE:-demo}"
port="${DB_PORT:-3407}"
name="${DB_NAME:-channelsmith}"
user="${DB_USER:-channelsmith}"
password="${DB_PASSWORD:-channelsmith-dev}"
# Outside the sources Tailwind and Turbopack scan: a live socket inside the tree breaks `next build`.
base="$root/.data/mariadb-$instance"
datadir="$base/data"
sock="$base/mysqld.sock"
pidfile="$base/mysqld.pid"
log="$base/error.log"

admin() { mariadb-admin --no-defaults --protocol=socket --socket="$sock" -uroot --connect-timeout=1 "$@"; }
client() { mariadb --no-defaults --protocol=socket --socket="$sock" -uroot "$@"; }

ensure_installed() {
  if ! command -v mariadbd >/dev/null 2>&1 && [ ! -x /usr/sbin/mariadbd ]; then
    echo "[mariadb] mariadbd not found: installing Debian's mariadb-server" >&2
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null
    apt-get install -y -qq mariadb-server >/dev/null
  fi
  export PATH="$PATH:/usr/sbin"
}

running() { [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null && admin ping >/dev/null 2>&1; }

start() {
  ensure_installed
  mkdir -p "$base"
  if running; then
    echo "[mariadb:$instance] already running on 127.0.0.1:$port"
  else
    # Recover from a stale pid file or socket left by a killed server.
    if [ -f "$pidfile" ] && ! kill -0 "$(cat "$pidfile")" 2>/dev/null; then rm -f "$pidfile"; fi
    if [ -S "$sock" ] && ! admin ping >/dev/null 2>&1; then rm -f "$sock"; fi
    if [ ! -d "$datadir/mysql" ]; then
      echo "[mariadb:$instance] initialising $datadir"
      mariadb-install-db --no-defaults --datadir="$datadir" --user=root \
        --auth-root-authentication-method=normal --skip-test-db --skip-name-resolve >"$base/install.log" 2>&1
    fi
    mariadbd --no-defaults --datadir="$datadir" --socket="$sock" --pid-file="$pidfile" --port="$port" \
      --bind-address=127.0.0.1 --skip-name-resolve --log-error="$log" --user=root \
      --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci --skip-log-bin \
      --innodb-buffer-pool-size=128M >/dev/null 2>&1 &
    for _ in $(seq 1 120); do
      if admin ping >/dev/null 2>&1; then break; fi
      sleep 0.25
    done
    if ! admin ping >/dev/null 2>&1; then
      echo "[mariadb:$instance] did not start; last lines of $log:" >&2
      tail -n 20 "$log" >&2 || true
      exit 1
    fi
    echo "[mariadb:$instance] started on 127.0.0.1:$port (data in $datadir)"
  fi
  # With --skip-name-resolve TCP clients match 'user'@'127.0.0.1', so create the user for both hosts.
  client <<SQL
CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$user'@'127.0.0.1' IDENTIFIED BY '$password';
CREATE USER IF NOT EXISTS '$user'@'localhost' IDENTIFIED BY '$password';
ALTER USER '$user'@'127.0.0.1' IDENTIFIED BY '$password';
ALTER USER '$user'@'localhost' IDENTIFIED BY '$password';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$user'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$user'@'localhost';
FLUSH PRIVILEGES;
SQL
}

stop() {
  if [ ! -f "$pidfile" ]; then echo "[mariadb:$instance] not running"; return 0; fi
  pid="$(cat "$pidfile")"
  if kill -0 "$pid" 2>/dev/null; then
    admin shutdown >/dev/null 2>&1 || kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 80); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    if kill -0 "$pid" 2>/dev/null; then kill -9 "$pid" 2>/dev/null || true; fi
  fi
  rm -f "$pidfile" "$sock"
  echo "[mariadb:$instance] stopped"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if running; then echo "running on 127.0.0.1:$port"; else echo "not running"; exit 1; fi ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 64 ;;
esac
