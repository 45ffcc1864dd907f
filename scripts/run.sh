#!/usr/bin/env bash
# npm start / npm test / npm run bench: install what is missing, then hand over to the stack
# script (exec, so that signals sent to npm reach it directly).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/bootstrap.sh
exec node --import tsx scripts/stack.ts "$@"
