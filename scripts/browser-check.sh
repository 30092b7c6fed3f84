#!/usr/bin/env bash
# Builds and runs browser tests while holding a lock, so several developers on one machine never
# build into .next while another's browser run serves from it. Usage: scripts/browser-check.sh [e2e files…]
set -euo pipefail
cd "$(dirname "$0")/.."
exec flock /tmp/baywright-build.lock bash -c 'npx next build >/tmp/baywright-build.log 2>&1 || { tail -40 /tmp/baywright-build.log; exit 1; }; npx vitest run --config vitest.e2e.config.ts "$@"' _ "$@"
