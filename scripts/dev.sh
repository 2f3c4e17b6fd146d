#!/usr/bin/env bash
# npm run dev: the Vite dev server with hot reload, signing sessions with the secret kept in .data/.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh

ensure_node_modules
ensure_auth_secret
exec npx vite dev "$@"
