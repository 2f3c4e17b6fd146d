#!/usr/bin/env bash
# npm run cluster: a two-machine shop layout on one box. A MariaDB primary and a read replica (GTID
# replication on loopback, own data dirs and ports), two app servers, and nginx in front of them as the load
# balancer (gzip on, no sticky sessions) on http://127.0.0.1:${CLUSTER_PORT:-8080}.
# Usage: scripts/cluster.sh [start]          everything, in the foreground until Ctrl-C
#        scripts/cluster.sh databases start|stop   only the primary and the replica (tests use this)
# Environment: CLUSTER_DIR (.data/cluster), PRIMARY_PORT (3327), REPLICA_PORT (3328), APP_PORTS ("3101 3102"),
#              METRICS_PORTS ("9464 9465", one per app server, or "off"), CLUSTER_PORT (8080), plus everything
#              npm start reads.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

CLUSTER_DIR="${CLUSTER_DIR:-.data/cluster}"
PRIMARY_PORT="${PRIMARY_PORT:-3327}"
REPLICA_PORT="${REPLICA_PORT:-3328}"
APP_PORTS="${APP_PORTS:-3101 3102}"
METRICS_PORTS="${METRICS_PORTS:-9464 9465}"
CLUSTER_PORT="${CLUSTER_PORT:-8080}"
REPL_USER=replicator
REPL_PASSWORD="${REPL_PASSWORD:-replicator-local}"
mkdir -p "$CLUSTER_DIR"
CLUSTER_DIR="$(cd "$CLUSTER_DIR" && pwd)"

as_root() { mariadb --socket="$CLUSTER_DIR/$1/mysqld.sock" -uroot; }

databases_start() {
	DB_DATA_DIR="$CLUSTER_DIR/primary" DB_PORT="$PRIMARY_PORT" DB_SERVER_ID=1 bash scripts/db.sh start
	as_root primary <<SQL
CREATE USER IF NOT EXISTS '$REPL_USER'@'127.0.0.1' IDENTIFIED BY '$REPL_PASSWORD';
GRANT REPLICATION SLAVE ON *.* TO '$REPL_USER'@'127.0.0.1';
SQL
	DB_DATA_DIR="$CLUSTER_DIR/replica" DB_PORT="$REPLICA_PORT" DB_SERVER_ID=2 DB_READ_ONLY=1 bash scripts/db.sh start
	# A new replica starts from the primary's first log; one that ran before carries on from where it was.
	as_root replica <<SQL
STOP SLAVE;
CHANGE MASTER TO MASTER_HOST='127.0.0.1', MASTER_PORT=$PRIMARY_PORT, MASTER_USER='$REPL_USER',
  MASTER_PASSWORD='$REPL_PASSWORD', MASTER_USE_GTID=slave_pos, MASTER_CONNECT_RETRY=1;
START SLAVE;
SQL
	for _ in $(seq 1 100); do
		if as_root replica <<<"SHOW SLAVE STATUS\G" | grep -q "Slave_IO_Running: Yes"; then
			log "replica on 127.0.0.1:$REPLICA_PORT follows the primary on 127.0.0.1:$PRIMARY_PORT"
			return
		fi
		sleep 0.2
	done
	log "the replica did not connect to the primary:"
	as_root replica <<<"SHOW SLAVE STATUS\G" | grep -E "Last_(IO|SQL)_Error" >&2 || true
	exit 1
}

databases_stop() {
	DB_DATA_DIR="$CLUSTER_DIR/replica" DB_PORT="$REPLICA_PORT" bash scripts/db.sh stop || true
	DB_DATA_DIR="$CLUSTER_DIR/primary" DB_PORT="$PRIMARY_PORT" bash scripts/db.sh stop || true
}

nginx_conf() {
	local upstreams=""
	for p in $APP_PORTS; do upstreams+="    server 127.0.0.1:$p max_fails=1 fail_timeout=2s;"$'\n'; done
	mkdir -p "$CLUSTER_DIR/nginx"
	cat >"$CLUSTER_DIR/nginx/nginx.conf" <<CONF
daemon off;
worker_processes 1;
pid $CLUSTER_DIR/nginx/nginx.pid;
error_log $CLUSTER_DIR/nginx/error.log warn;
events { worker_connections 1024; }
http {
  access_log off;
  client_body_temp_path $CLUSTER_DIR/nginx/body;
  proxy_temp_path $CLUSTER_DIR/nginx/proxy;
  fastcgi_temp_path $CLUSTER_DIR/nginx/fastcgi;
  uwsgi_temp_path $CLUSTER_DIR/nginx/uwsgi;
  scgi_temp_path $CLUSTER_DIR/nginx/scgi;
  client_max_body_size 64m;
  gzip on;
  gzip_proxied any;
  gzip_types text/css application/javascript application/json image/svg+xml text/plain;
  upstream kickpanel {
$upstreams    # Connections to the app servers are kept open between requests instead of one per request.
    keepalive 32;
  }
  server {
    listen 127.0.0.1:$CLUSTER_PORT;
    location / {
      proxy_pass http://kickpanel;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host \$http_host;
      proxy_set_header X-Forwarded-For \$remote_addr;
      proxy_set_header X-Request-Id \$request_id;
      # A server that goes away mid-request is not asked to repeat a save: only reads move on.
      proxy_next_upstream error timeout http_502 http_503;
    }
  }
}
CONF
}

start_all() {
	ensure_node_modules
	ensure_auth_secret
	apt_install nginx nginx
	export NODE_ENV=production HOST=127.0.0.1 BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-64M}"
	export ORIGIN="${ORIGIN:-http://127.0.0.1:$CLUSTER_PORT}"
	export DB_PORT="$PRIMARY_PORT" DB_REPLICA_PORT="$REPLICA_PORT"
	# The client's address comes from the balancer's header (one proxy in front).
	export ADDRESS_HEADER=x-forwarded-for XFF_DEPTH=1
	local pids=()
	cleanup() {
		trap - INT TERM EXIT
		for pid in "${pids[@]}"; do kill -TERM "$pid" 2>/dev/null || true; done
		for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
		databases_stop
		log "cluster stopped"
	}
	trap cleanup INT TERM EXIT
	databases_start
	node --import tsx scripts/services.ts &
	pids+=($!)
	npx tsx scripts/migrate.ts
	if [ "$(sample_data_choice "$HOST" "${SAMPLE_DATA:-}")" = 1 ]; then npx tsx scripts/seed.ts --if-empty; else npx tsx scripts/setup-link.ts; fi
	ensure_build
	local metrics=($METRICS_PORTS) i=0
	for p in $APP_PORTS; do
		PORT="$p" METRICS_PORT="${metrics[$i]:-${metrics[0]}}" node $SERVER_NODE_FLAGS server.js &
		pids+=($!)
		i=$((i + 1))
	done
	for p in $APP_PORTS; do
		wait_for_http "http://127.0.0.1:$p/api/health" || { log "app server on $p did not start"; exit 1; }
	done
	nginx_conf
	nginx -c "$CLUSTER_DIR/nginx/nginx.conf" -p "$CLUSTER_DIR/nginx" &
	pids+=($!)
	wait_for_http "http://127.0.0.1:$CLUSTER_PORT/api/health" || { log "nginx did not start; see $CLUSTER_DIR/nginx/error.log"; exit 1; }
	echo
	echo "  Kickpanel cluster at $ORIGIN: nginx → app servers on $APP_PORTS;"
	echo "  MariaDB primary 127.0.0.1:$PRIMARY_PORT, replica 127.0.0.1:$REPLICA_PORT. Ctrl-C stops everything."
	wait -n "${pids[@]}" || true
}

case "${1:-start}" in
	start) start_all ;;
	databases)
		case "${2:-}" in
			start) databases_start ;;
			stop) databases_stop ;;
			*) echo "usage: $0 databases start|stop" >&2; exit 2 ;;
		esac ;;
	*) echo "usage: $0 [start] | databases start|stop" >&2; exit 2 ;;
esac
