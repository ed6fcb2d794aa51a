#!/usr/bin/env bash
# npm test: installs what the suite needs (npm packages, MariaDB, Chromium), builds the
# app, then runs all three tiers (unit, api, e2e). Extra arguments go to vitest,
# e.g. `npm test -- --project unit` or `npm test -- tests/api/users.test.ts`.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib.sh
mkdir -p .data test-results

ensure_node_modules
ensure_sheet_fonts

if ! command -v chromium >/dev/null 2>&1; then
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null 2>&1; then
    echo "[setup] installing Chromium from Debian's packages for the browser tests (first run only)…"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  else
    echo "Chromium is missing: install Debian's 'chromium' package (the browser tests drive /usr/bin/chromium)." >&2
    exit 1
  fi
fi

build_if_stale
status=0
# A full run also type-checks the app, server and tests (vue-tsc) and lints them (ESLint is
# the formatter too, so style drift fails here); a run of chosen files skips both.
# Both are single-threaded, so they run side by side: the run grows by the longer of the two.
if [ $# -eq 0 ]; then
  echo "[check] type-checking (nuxt typecheck) and linting (eslint) side by side…"
  npx eslint . > .data/lint.log 2>&1 &
  lint_pid=$!
  npx nuxt typecheck > .data/typecheck.log 2>&1 && echo "[check] types: no errors" || { cat .data/typecheck.log; echo "[check] types: errors above" >&2; status=1; }
  wait "$lint_pid" && echo "[check] lint: no problems" || { cat .data/lint.log; echo "[check] lint: problems above" >&2; status=1; }
fi
rm -f test-results/vitest.json
npx vitest run --reporter=default --reporter=json --outputFile.json=test-results/vitest.json "$@" || status=1
# One plain closing line that any CI can read, from vitest's own JSON report.
if [ -f test-results/vitest.json ]; then
  node -e "const r=require('./test-results/vitest.json'); console.log('Summary: ' + r.numPassedTests + ' passed, ' + r.numFailedTests + ' failed' + (r.numPendingTests ? ', ' + r.numPendingTests + ' skipped' : ''))"
fi
exit $status
