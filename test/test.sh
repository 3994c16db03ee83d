#!/usr/bin/env bash
# npm test: every test against a throwaway PostgreSQL and a real browser.
#   npm test                      everything
#   bash test/test.sh api --testPathPatterns test/api/users   one stage (unit|client|api|drills|e2e) with jest args
set -euo pipefail
cd "$(dirname "$0")/.."
bash server/ensure-deps.sh
exec node --import tsx test/run.ts "$@"
