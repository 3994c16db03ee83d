#!/usr/bin/env bash
# npm test: every test against a throwaway PostgreSQL and a real browser.
#   npm test                      everything
#   bash server/setup/test.sh api test/api/users   one stage (unit|client|api|drills|e2e) with jest args
set -euo pipefail
cd "$(dirname "$0")/../.."
bash server/setup/ensure.sh
exec node --import tsx server/setup/test-run.ts "$@"
