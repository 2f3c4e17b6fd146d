#!/usr/bin/env bash
# Private MariaDB for Kickpanel: its own data dir, its own port, bound to 127.0.0.1.
# Usage: scripts/db.sh start|stop|status|reset
# Environment: DB_DATA_DIR (default .data/mariadb), DB_PORT (3307), DB_NAME (kickpanel),
#              DB_USER (kickpanel), DB_PASSWORD (kickpanel-local), DB_FAST=1 for throw-away test data,
#              DB_SERVER_ID=n to keep a binary log for replication (DB_READ_ONLY=1 on a replica).
set -euo pipefail
cd "$(dirname "$0")/.."

DATA_DIR="${DB_DATA_DIR:-.data/mariadb}"
PORT="${DB_PORT:-3307}"
NAME="${DB_NAME:-kickpanel}"
USER_NAME="${DB_USER:-kickpanel}"
PASSWORD="${DB_PASSWORD:-kickpanel-local}"
mkdir -p "$(dirname "$DATA_DIR")"
DATA_DIR="$(cd "$(dirname "$DATA_DIR")" && pwd)/$(basename "$DATA_DIR")"
SOCK="$DATA_DIR/mysqld.sock"
PIDFILE="$DATA_DIR/mysqld.pid"

log() { echo "[db] $*" >&2; }

ensure_installed() {
	if command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ]; then return; fi
	if [ "$(id -u)" -ne 0 ]; then
		log "MariaDB is not installed. Install Debian's server package first:"
		log "  sudo apt-get update && sudo apt-get install -y mariadb-server"
		exit 1
	fi
	log "installing Debian's mariadb-server (once)…"
	export DEBIAN_FRONTEND=noninteractive
	apt-get update -qq
	apt-get install -y -qq mariadb-server >/dev/null
}

mariadbd_bin() { command -v mariadbd || echo /usr/sbin/mariadbd; }

running() {
	[ -f "$PIDFILE" ] && kill -0 "$(cat "$PIDFILE")" 2>/dev/null && mariadb-admin --socket="$SOCK" ping >/dev/null 2>&1
}

start() {
	ensure_installed
	if running; then log "already running on 127.0.0.1:$PORT"; return; fi
	if [ ! -d "$DATA_DIR/mysql" ]; then
		log "initialising $DATA_DIR"
		mkdir -p "$DATA_DIR"
		mariadb-install-db --no-defaults --datadir="$DATA_DIR" --user="$(id -un)" \
			--auth-root-authentication-method=socket --skip-test-db >"$DATA_DIR/install.log" 2>&1
	fi
	local extra=()
	if [ "${DB_FAST:-0}" = "1" ]; then
		extra+=(--innodb-flush-log-at-trx-commit=0 --innodb-doublewrite=0)
	fi
	# A replication primary keeps a binary log; a replica is read-only to everyone but its replication thread.
	if [ -n "${DB_SERVER_ID:-}" ]; then
		extra+=(--server-id="$DB_SERVER_ID" --log-bin="$DATA_DIR/binlog" --binlog-format=ROW --log-slave-updates=ON)
		if [ "${DB_READ_ONLY:-0}" = "1" ]; then extra+=(--read-only=ON); fi
	else
		extra+=(--skip-log-bin)
	fi
	"$(mariadbd_bin)" --no-defaults --datadir="$DATA_DIR" --socket="$SOCK" --pid-file="$PIDFILE" \
		--log-error="$DATA_DIR/error.log" --port="$PORT" --bind-address=127.0.0.1 --user="$(id -un)" \
		--innodb-buffer-pool-size="${DB_BUFFER_POOL:-64M}" --innodb-log-file-size=16M \
		--performance-schema=OFF --skip-name-resolve \
		--character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
		--max-connections=300 "${extra[@]}" >/dev/null 2>&1 &
	for _ in $(seq 1 100); do
		if mariadb-admin --socket="$SOCK" ping >/dev/null 2>&1; then break; fi
		sleep 0.2
	done
	if ! mariadb-admin --socket="$SOCK" ping >/dev/null 2>&1; then
		log "MariaDB did not start; last lines of $DATA_DIR/error.log:"
		tail -n 20 "$DATA_DIR/error.log" >&2 || true
		exit 1
	fi
	# On a replica the set-up below stays out of its own binary log: the primary's copy arrives by replication.
	local quiet=""
	if [ "${DB_READ_ONLY:-0}" = "1" ]; then quiet="SET SESSION sql_log_bin = 0;"; fi
	mariadb --socket="$SOCK" -uroot <<SQL
$quiet
CREATE DATABASE IF NOT EXISTS \`$NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$USER_NAME'@'127.0.0.1' IDENTIFIED BY '$PASSWORD';
ALTER USER '$USER_NAME'@'127.0.0.1' IDENTIFIED BY '$PASSWORD';
GRANT ALL PRIVILEGES ON \`$NAME\`.* TO '$USER_NAME'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`${NAME}_%\`.* TO '$USER_NAME'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
	log "running on 127.0.0.1:$PORT (data: $DATA_DIR)"
}

stop() {
	if [ ! -f "$PIDFILE" ]; then log "not running"; return; fi
	local pid; pid="$(cat "$PIDFILE")"
	if kill -0 "$pid" 2>/dev/null; then
		kill -TERM "$pid"
		for _ in $(seq 1 150); do kill -0 "$pid" 2>/dev/null || break; sleep 0.2; done
		if kill -0 "$pid" 2>/dev/null; then log "still running after 30 s; killing"; kill -KILL "$pid"; fi
	fi
	rm -f "$PIDFILE"
	log "stopped"
}

status() {
	if running; then log "running on 127.0.0.1:$PORT (pid $(cat "$PIDFILE"))"; else log "not running"; return 1; fi
}

case "${1:-}" in
	start) start ;;
	stop) stop ;;
	status) status ;;
	reset) stop; rm -rf "$DATA_DIR"; start ;;
	*) echo "usage: $0 start|stop|status|reset" >&2; exit 2 ;;
esac
