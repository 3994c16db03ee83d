#!/usr/bin/env bash
set -euo pipefail
cd "$(dirname "$0")/../.."
bash server/setup/ensure.sh
exec node --import tsx server/setup/start.ts "$@"
