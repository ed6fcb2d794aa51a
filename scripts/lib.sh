# Shared helpers for scripts/start.sh and scripts/test.sh (sourced, not run).

# npm dependencies: install from the lock file when missing or older than it.
# The hold-time sheet's PDF falls back to DejaVu Sans for the characters IBM Plex's
# subsets lack (≤, ≥); Debian ships it as fonts-dejavu-core.
ensure_sheet_fonts() {
  [ -f /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf ] && return 0
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null 2>&1; then
    echo "[setup] installing DejaVu Sans from Debian's packages for the PDF sheets (first run only)…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq fonts-dejavu-core >/dev/null
  else
    echo "DejaVu Sans is missing: install Debian's 'fonts-dejavu-core' package (PDF sheets print ≤ and ≥ with it)." >&2
  fi
}

ensure_node_modules() {
  if [ ! -x node_modules/.bin/nuxt ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "[setup] installing npm dependencies (npm ci)…"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}

# Prints the secret kept in .data/<name>, making a random one the first time.
# Readable by the owner only (0600), also when an older copy was not.
ensure_secret() {
  mkdir -p .data && chmod 700 .data
  [ -s ".data/$1" ] || (umask 077 && node -e "process.stdout.write(require('crypto').randomBytes(32).toString('hex'))" > ".data/$1")
  chmod 600 ".data/$1"
  cat ".data/$1"
}

# Stops a process: TERM, then KILL when it has not ended after the grace period
# (a server busy in a long computation cannot run its TERM handler).
stop_process() {
  local pid=$1 grace=${2:-10}
  kill -TERM "$pid" 2>/dev/null || return 0
  for _ in $(seq 1 $((grace * 10))); do
    kill -0 "$pid" 2>/dev/null || return 0
    sleep 0.1
  done
  echo "[stop] process $pid did not stop within ${grace} s; killing it" >&2
  kill -KILL "$pid" 2>/dev/null || true
}

# Rebuilds the app when any source is newer than the last build.
build_if_stale() {
  local stamp=.output/nitro.json
  if [ ! -f "$stamp" ] || [ -n "$(find app.vue pages layouts components composables stores middleware modules server shared assets public \
       nuxt.config.ts tailwind.config.ts package-lock.json -newer "$stamp" -print -quit 2>/dev/null)" ]; then
    echo "[setup] building the app (nuxt build, about 30 s)…"
    npx nuxt build > .data/build.log 2>&1 || { tail -40 .data/build.log >&2; echo "[setup] build failed; full log in .data/build.log" >&2; return 1; }
  fi
}

wait_for_url() {
  local url=$1 tries=${2:-120}
  for _ in $(seq 1 "$tries"); do
    curl -fsS -o /dev/null "$url" 2>/dev/null && return 0
    sleep 0.5
  done
  return 1
}
