#!/usr/bin/env bash
# Installs npm dependencies when node_modules is missing or older than the lockfile.
set -euo pipefail
cd "$(dirname "$0")/.."
stamp=node_modules/.sortie-lock-sha256
want=$(sha256sum package-lock.json | cut -d' ' -f1)
have=$(cat "$stamp" 2>/dev/null || true)
if [ ! -d node_modules ] || [ "$want" != "$have" ]; then
  echo "[sortie] installing npm dependencies (package-lock.json changed or node_modules missing)…"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi
