#!/usr/bin/env bash
# npm start: everything a fresh clone needs to serve Kickpanel on http://127.0.0.1:${PORT:-3000}.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

ensure_node_modules
ensure_auth_secret
export PORT="${PORT:-3000}"
export HOST="${HOST:-127.0.0.1}"
export ORIGIN="${ORIGIN:-http://127.0.0.1:$PORT}"
export BODY_SIZE_LIMIT="${BODY_SIZE_LIMIT:-64M}"
export NODE_ENV=production

started_db=0
if ! bash scripts/db.sh status >/dev/null 2>&1; then
	bash scripts/db.sh start
	started_db=1
fi
services_pid=""
server_pid=""
cleanup() {
	trap - INT TERM EXIT
	if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then
		kill -TERM "$server_pid" 2>/dev/null || true
		wait "$server_pid" 2>/dev/null || true
	fi
	if [ -n "$services_pid" ] && kill -0 "$services_pid" 2>/dev/null; then
		kill -TERM "$services_pid" 2>/dev/null || true
		wait "$services_pid" 2>/dev/null || true
	fi
	if [ "$started_db" = 1 ]; then bash scripts/db.sh stop; fi
	log "stopped"
}
trap cleanup INT TERM EXIT

if [ -f scripts/services.ts ]; then
	node --import tsx scripts/services.ts &
	services_pid=$!
fi
npx tsx scripts/migrate.ts
sample_data="$(sample_data_choice "$HOST" "${SAMPLE_DATA:-}")"
if [ "$sample_data" = 1 ]; then
	npx tsx scripts/seed.ts --if-empty
else
	npx tsx scripts/setup-link.ts
fi
ensure_build

node $SERVER_NODE_FLAGS server.js &
server_pid=$!
if wait_for_http "http://127.0.0.1:$PORT/api/health"; then
	echo
	echo "  Kickpanel is running at $ORIGIN"
	if [ "$sample_data" = 1 ]; then
		cat <<MSG

  ================================ SAMPLE DATA ================================
  For trying Kickpanel out on this machine: an invented shop whose people have
  the published passwords below. SAMPLE_DATA=0 starts without them; a HOST
  other than 127.0.0.1 never loads them.
$(node -e "for (const u of require('./content-seed/users.json').users) console.log('    ' + u.role.padEnd(10) + u.email.padEnd(30) + u.password)")
  =============================================================================
MSG
	fi
	echo
	echo "  Ctrl-C stops the server and the database it started."
	echo
fi
wait "$server_pid"
