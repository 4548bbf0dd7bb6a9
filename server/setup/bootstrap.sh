#!/usr/bin/env bash
# First step of `npm start` and `npm test`: the parts that must run before TypeScript can.
# Checks Node.js and (re)installs npm dependencies when node_modules is missing or older than the lock file.
set -euo pipefail
cd "$(dirname "$0")/../.."

node -e '
const [maj, min] = process.versions.node.split(".").map(Number);
if (!((maj === 20 && min >= 19) || (maj === 22 && min >= 13) || maj >= 24)) {
  console.error(`Cutline needs Node.js 20.19+ (found ${process.versions.node}).`);
  process.exit(1);
}'

stamp=node_modules/.cutline-lock.sha256
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
  echo "Installing npm dependencies from the lock file (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi
