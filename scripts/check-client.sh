#!/usr/bin/env bash
# After a build: no script a browser downloads may carry the validation library (zod). Forms,
# endpoints and saves check input on the server; pages read plain data (see .dependency-cruiser.browser.cjs).
set -euo pipefail
dir=${1:-build/client}
if [ ! -d "$dir" ]; then
	echo "No $dir: run npm run build first." >&2
	exit 2
fi
if found=$(grep -rl --include='*.js' -e 'ZodError' "$dir"); then
	echo "The validation library is in the browser's scripts:" >&2
	echo "$found" >&2
	exit 1
fi
echo "No validation library in $dir."
