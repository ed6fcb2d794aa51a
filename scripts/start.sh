#!/usr/bin/env bash
# npm start: everything a new machine needs, then the app on http://localhost:$PORT (3000).
# SLAKEWISE_INSTANCES=N starts N server processes on PORT, PORT+1, … over the same
# database, for a reverse proxy to balance. Safe to run twice. Ctrl-C stops what this script started.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
mkdir -p .data

PORT=${PORT:-3000}
INSTANCES=${SLAKEWISE_INSTANCES:-1}
[[ "$INSTANCES" =~ ^[1-9][0-9]*$ ]] || { echo "[start] SLAKEWISE_INSTANCES must be a whole number of at least 1, not '$INSTANCES'" >&2; exit 2; }
MAIL_SMTP_PORT=${MAIL_SMTP_PORT:-1025}
MAIL_WEB_PORT=${MAIL_WEB_PORT:-1080}
children=()
started_db=0

stop_all() {
  trap - INT TERM EXIT
  echo; echo "[start] stopping…"
  for pid in "${children[@]}"; do stop_process "$pid" 10 & done
  wait 2>/dev/null || true
  [ "$started_db" = 1 ] && scripts/db.sh stop dev || true
}
trap stop_all INT TERM EXIT

ensure_node_modules
ensure_sheet_fonts

if [ -z "${DATABASE_URL:-}" ]; then
  scripts/db.sh status dev >/dev/null 2>&1 || started_db=1
  scripts/db.sh start dev
  DATABASE_URL=$(scripts/db.sh url dev)
fi
export DATABASE_URL
export PORT NITRO_HOST=${HOST:-127.0.0.1}
export AUTH_ORIGIN=${AUTH_ORIGIN:-http://localhost:$PORT/api/auth}
export NUXT_AUTH_SECRET=${NUXT_AUTH_SECRET:-$(ensure_secret auth-secret)}
export NUXT_RECORD_SEAL_KEY=${NUXT_RECORD_SEAL_KEY:-$(ensure_secret record-seal-key)}
# The demo shop's name on sheets and initials on load numbers.
export NUXT_SHOP_NAME=${NUXT_SHOP_NAME:-Kestrel Bay Heat Treat}
export NUXT_LOAD_PREFIX=${NUXT_LOAD_PREFIX:-KB}
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts

if [ -z "${SMTP_URL:-}" ]; then
  if curl -fsS -o /dev/null "http://127.0.0.1:$MAIL_WEB_PORT/api/healthz" 2>/dev/null; then
    echo "[mail] a mail catcher already answers on port $MAIL_WEB_PORT"
  else
    node_modules/.bin/maildev --smtp "$MAIL_SMTP_PORT" --ip 127.0.0.1 --web "$MAIL_WEB_PORT" --web-ip 127.0.0.1 > .data/maildev.log 2>&1 &
    children+=($!)
  fi
  SMTP_URL="smtp://127.0.0.1:$MAIL_SMTP_PORT"
fi
export SMTP_URL

build_if_stale

# Separate processes, not Nitro's cluster preset: each has its own port, so any proxy can
# balance them and one can be restarted alone. Sessions are signed cookies and everything
# that must happen once is decided in the database, so no instance needs sticky sessions.
addresses=()
for ((n = 0; n < INSTANCES; n++)); do
  PORT=$((PORT + n)) node .output/server/index.mjs &
  children+=($!)
  addresses+=("http://localhost:$((PORT + n))")
done
for address in "${addresses[@]}"; do
  wait_for_url "${address/localhost/127.0.0.1}/api/health" || { echo "[start] the app did not answer at $address" >&2; exit 1; }
done

cat <<MSG

  Slakewise is running:   ${addresses[*]}
  Mail catcher (inbox):   http://localhost:$MAIL_WEB_PORT   (SMTP on 127.0.0.1:$MAIL_SMTP_PORT)

  Demo sign-ins (Kestrel Bay Heat Treat, a fictional shop; on loopback only):
$(npx tsx scripts/demo-sign-ins.ts)
  A shop's own first administrator: see "Putting Slakewise on the shop network" in README.md.

  Press Ctrl-C to stop.
MSG
wait
