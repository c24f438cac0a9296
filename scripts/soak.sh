#!/usr/bin/env bash
# `npm run soak`: the load and fault tests in their full form (see scripts/soak.ts).
set -euo pipefail
cd "$(dirname "$0")/.."
export NEXT_TELEMETRY_DISABLED=1 AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
bash scripts/ensure-deps.sh
exec ./node_modules/.bin/tsx scripts/soak.ts "$@"
