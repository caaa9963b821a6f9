#!/usr/bin/env bash
# Installs the npm dependencies when they are missing or older than package-lock.json; everything
# after this step is TypeScript run through tsx, which itself comes from node_modules.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[setup] installing dependencies (npm ci)…"
  npm ci --no-audit --no-fund
fi
