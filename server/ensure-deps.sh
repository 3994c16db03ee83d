#!/usr/bin/env bash
# Shared first steps of `npm start`, `npm test` and `npm run bench`: dependencies installed and
# current. Everything else (PostgreSQL, Chromium, the build) is handled by the TypeScript steps.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ] || [ ! -f node_modules/.package-lock.json ]; then
  echo "[stepstock] installing dependencies (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
fi
