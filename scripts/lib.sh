# Shared by start.sh and test.sh: make sure what Kickpanel needs is on this machine.
log() { echo "[kickpanel] $*" >&2; }

# How Node runs the app server (start.sh, cluster.sh, the end-to-end tests and the benchmarks): with a young
# generation four times V8's default here (64 MB half-spaces instead of 16), so a page view's garbage dies
# young under load instead of being copied twice and promoted (DEVELOPERS.md, "What keeps pages fast").
SERVER_NODE_FLAGS="--max-semi-space-size=64"

ensure_node_modules() {
	if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
		log "installing npm dependencies…"
		npm ci --no-audit --no-fund --loglevel=error
	fi
}

apt_install() {
	# $1 = command that proves it is there, rest = Debian packages
	local probe="$1"; shift
	if command -v "$probe" >/dev/null 2>&1 || [ -x "/usr/sbin/$probe" ] || [ -x "/usr/bin/$probe" ]; then return; fi
	if [ "$(id -u)" -ne 0 ]; then
		log "missing $probe. Install it with: sudo apt-get update && sudo apt-get install -y $*"
		exit 1
	fi
	log "installing Debian packages: $*"
	export DEBIAN_FRONTEND=noninteractive
	if [ ! -f /tmp/.kickpanel-apt-updated ]; then apt-get update -qq && touch /tmp/.kickpanel-apt-updated; fi
	apt-get install -y -qq "$@" >/dev/null
}

ensure_auth_secret() {
	mkdir -p .data
	if [ -z "${AUTH_SECRET:-}" ]; then
		if [ ! -s .data/auth-secret ]; then
			node -e "process.stdout.write(require('node:crypto').randomBytes(32).toString('base64url'))" > .data/auth-secret
			chmod 600 .data/auth-secret
		fi
		AUTH_SECRET="$(cat .data/auth-secret)"
		export AUTH_SECRET
	fi
}

# Rebuild when any source is newer than the last build.
ensure_build() {
	if [ ! -f build/index.js ] || [ -n "$(find src static content-seed svelte.config.js vite.config.ts tailwind.config.ts package-lock.json -newer build/index.js -print -quit 2>/dev/null)" ]; then
		log "building…"
		npx vite build --logLevel error >/dev/null
	fi
}

wait_for_http() {
	local url="$1" tries="${2:-150}"
	for _ in $(seq 1 "$tries"); do
		if curl -fsS -o /dev/null "$url" 2>/dev/null; then return 0; fi
		sleep 0.2
	done
	return 1
}

# A port nothing listens on, at or a little above $1 (a leftover server must not break a run); the
# random start keeps two test runs on one machine from picking the same one.
free_port() {
	local port=$(($1 + RANDOM % 200))
	while (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; do port=$((port + 1)); done
	echo "$port"
}

# True when $1 is an address only this machine can reach.
is_loopback_host() {
	[[ "$1" =~ ^(localhost|::1|\[::1\]|127\.[0-9]{1,3}\.[0-9]{1,3}\.[0-9]{1,3})$ ]]
}

# Whether npm start loads the sample shop (people with published passwords): SAMPLE_DATA=1 or 0 decides,
# unset means yes only on a loopback HOST. Never on an install reachable from elsewhere; prints 1 or 0.
sample_data_choice() {
	local host="$1" asked="${2:-}"
	if ! is_loopback_host "$host"; then
		if [ "$asked" = 1 ]; then log "SAMPLE_DATA=1 is ignored: HOST=$host is reachable from other machines, and the sample people's passwords are published."; fi
		echo 0
		return
	fi
	case "$asked" in
		0) echo 0 ;;
		*) echo 1 ;;
	esac
}
