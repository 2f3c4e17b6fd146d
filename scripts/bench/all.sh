#!/usr/bin/env bash
# npm run bench: every benchmark in turn; results land in bench-results/*.json.
set -euo pipefail
cd "$(dirname "$0")/../.."
for b in fit boot search pages transfer evidence; do
	if [ -f "scripts/bench/$b.ts" ]; then
		echo "== bench:$b"
		npx tsx "scripts/bench/$b.ts"
	fi
done
