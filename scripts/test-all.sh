#!/usr/bin/env bash
# The whole test suite: what `npm test` runs, on a fresh clone or a developer's tree.
# Installs what the tests need when it is missing (npm packages; Debian's chromium and FastJet when root).
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1

step() { printf '\n=== %s\n' "$*"; }

step "npm packages"
if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  npm ci --no-audit --no-fund
fi

step "Debian packages (chromium, FastJet reference library)"
bash scripts/ensure-debian-packages.sh

step "engine bundle"
npm run -s build:engine

step "unit and reference tests"
npx vitest run --config vitest.config.mts

step "production build"
npm run -s build

step "API tests (real server, temporary database)"
npx vitest run --config vitest.api.config.mts

step "end-to-end tests (headless Chromium)"
npx vitest run --config vitest.e2e.config.mts
