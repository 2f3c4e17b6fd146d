#!/usr/bin/env bash
# npm test: unit and integration tests (vitest, real MariaDB), then end-to-end in Chromium against the built app.
# Starts a throw-away MariaDB on its own port and stops everything it started; exits non-zero on any failure.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

# `npm test -- e2e [vitest filters]` runs only the end-to-end tests; the default runs everything.
only_e2e=""
if [ "${1:-}" = "e2e" ]; then only_e2e=1; shift; fi

ensure_node_modules
apt_install mariadbd mariadb-server
apt_install chromium chromium

export DB_DATA_DIR="${TEST_DB_DATA_DIR:-.data/test-mariadb}"
export DB_PORT="${TEST_DB_PORT:-$(free_port 3317)}"
export DB_NAME=kickpanel_test
export DB_FAST=1
export DB_POOL_MAX=20
export AUTH_SECRET=test-secret-not-for-production-000000
export TEST_APP_PORT="${TEST_APP_PORT:-$(free_port 3117)}"
export ORIGIN="http://127.0.0.1:$TEST_APP_PORT"
export KICKPANEL_DEV_TOOLS=1
export LOG_LEVEL="${LOG_LEVEL:-warn}"
export METRICS_PORT="${METRICS_PORT:-$(free_port 9464)}"
# Local stand-ins for hosted services listen on their own test ports.
VIN_DECODE_PORT="$(free_port 3392)"; S3_FAKE_PORT="$(free_port 4570)"; SMTP_CAPTURE_PORT="$(free_port 2526)"
export VIN_DECODE_PORT S3_FAKE_PORT SMTP_CAPTURE_PORT
export S3_FAKE_DIR=.data/test-s3
export BODY_SIZE_LIMIT=64M
export MAIL_CAPTURE_DIR=.data/test-outbox

server_pid=""
services_pid=""
cleanup() {
	local code=$?
	trap - EXIT INT TERM
	set +e
	if [ -n "$server_pid" ]; then kill -TERM "$server_pid" 2>/dev/null; wait "$server_pid" 2>/dev/null; fi
	if [ -n "$services_pid" ]; then kill -TERM "$services_pid" 2>/dev/null; wait "$services_pid" 2>/dev/null; fi
	bash scripts/db.sh stop
	rm -rf "$DB_DATA_DIR" "$S3_FAKE_DIR" "$MAIL_CAPTURE_DIR"
	exit "$code"
}
trap cleanup EXIT INT TERM

bash scripts/db.sh stop >/dev/null 2>&1 || true
rm -rf "$DB_DATA_DIR"
bash scripts/db.sh start

if [ -z "$only_e2e" ]; then
	log "type check, import cycles and layers"
	npx svelte-kit sync >/dev/null
	npx svelte-check --tsconfig ./tsconfig.json --threshold error --output human
	npm run --silent check:layers
	log "unit and integration tests"
	npx vitest run
fi

log "end-to-end: building and starting the app on $ORIGIN"
node --import tsx scripts/services.ts >.data/e2e-services.log 2>&1 &
services_pid=$!
npx vite build --logLevel error >/dev/null
bash scripts/check-client.sh >/dev/null
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
PORT="$TEST_APP_PORT" HOST=127.0.0.1 NODE_ENV=production node $SERVER_NODE_FLAGS server.js >.data/e2e-server.log 2>&1 &
server_pid=$!
if ! wait_for_http "$ORIGIN/api/health"; then
	log "the app did not start; its log:"
	cat .data/e2e-server.log >&2
	exit 1
fi
npx vitest run --config tests/e2e/vitest.config.ts "$@"
