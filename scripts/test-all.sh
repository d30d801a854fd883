#!/usr/bin/env bash
# The whole test suite: what `npm test` runs, on a fresh clone or a developer's tree.
# Installs what the tests need when it is missing (npm packages; Debian's chromium and FastJet when root).
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

step() { printf '\n=== %s\n' "$*"; }

# Each vitest layer also writes a JSON report, so that the run ends with one count over all layers.
RESULTS=tests/artifacts/results
rm -rf "$RESULTS" && mkdir -p "$RESULTS"
layer() {
  local name=$1; shift
  npx vitest run "$@" --reporter=default --reporter=json --outputFile.json="$RESULTS/$name.json"
}

step "npm packages"
if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  npm ci --no-audit --no-fund
fi

step "Debian packages (chromium, FastJet reference library)"
bash scripts/ensure-debian-packages.sh

step "engine bundle"
npm run -s build:engine

step "unit and reference tests"
layer unit --config vitest.config.mts

step "production build"
npm run -s build

step "API tests (real server, temporary database)"
layer api --config vitest.api.config.mts

step "end-to-end tests (headless Chromium)"
layer e2e --config vitest.e2e.config.mts

step "summary"
node -e '
const fs = require("fs"), dir = process.argv[1];
let passed = 0, failed = 0, skipped = 0;
for (const f of fs.readdirSync(dir)) {
  const r = JSON.parse(fs.readFileSync(dir + "/" + f, "utf8"));
  passed += r.numPassedTests; failed += r.numFailedTests; skipped += r.numPendingTests + r.numTodoTests;
}
console.log(`${passed} passed, ${failed} failed` + (skipped ? `, ${skipped} skipped` : ""));
process.exit(failed ? 1 : 0);
' "$RESULTS"
