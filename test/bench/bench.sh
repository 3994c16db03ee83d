#!/usr/bin/env bash
# npm run bench: speed and memory figures as JSON lines (stdout), progress on stderr. Makes its own
# throwaway PostgreSQL cluster and data on 127.0.0.1 and removes them afterwards.
#   npm run bench                 every figure
#   npm run bench -- holds lists  some groups: lists holds import client start
set -euo pipefail
cd "$(dirname "$0")/../.."
bash server/ensure-deps.sh
exec node --import tsx test/bench/run.ts "$@"
