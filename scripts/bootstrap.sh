#!/usr/bin/env bash
# Makes node_modules match package-lock.json (npm ci when missing or stale), then runs the
# TypeScript entry point given as $1 with the server's tsconfig (tsx: decorators for TypeORM).
set -euo pipefail
cd "$(dirname "$0")/.."

if ! command -v node >/dev/null 2>&1; then
  echo "Node.js 20 or newer is needed: install it first (e.g. apt-get install nodejs npm)." >&2
  exit 1
fi
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "Installing npm packages (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
fi

entry="$1"; shift
export TSX_TSCONFIG_PATH=server/tsconfig.json
exec node --import tsx "$entry" "$@"
