#!/usr/bin/env bash
set -euo pipefail
cd "$(dirname "$0")/.."
bash server/ensure-deps.sh
exec node --import tsx server/start.ts "$@"
