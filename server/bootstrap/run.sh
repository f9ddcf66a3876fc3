#!/usr/bin/env bash
# Entry point for `npm start`, `npm run dev` and `npm test` on a fresh Debian machine:
# installs what is missing (npm packages, Debian's postgresql, chromium and nginx for tests), then hands
# over to the TypeScript bootstrap for the chosen mode.
set -euo pipefail
mode="${1:-start}"
shift || true
cd "$(dirname "$0")/../.."

if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "[benchwright] installing npm packages (npm ci)…"
  npm ci --no-audit --no-fund
fi

missing=()
if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then missing+=(postgresql); fi
if [ "$mode" = test ] && [ ! -x /usr/bin/chromium ]; then missing+=(chromium); fi
# The multi-node test puts three app processes behind Debian's nginx (started by the test, on loopback).
if [ "$mode" = test ] && [ ! -x /usr/sbin/nginx ]; then missing+=(nginx); fi
if [ ${#missing[@]} -gt 0 ]; then
  echo "[benchwright] installing Debian packages: ${missing[*]}"
  sudo_cmd=""
  if [ "$(id -u)" != 0 ]; then sudo_cmd="sudo"; fi
  $sudo_cmd apt-get update
  DEBIAN_FRONTEND=noninteractive $sudo_cmd apt-get install -y --no-install-recommends "${missing[@]}"
fi

exec node --import tsx "server/bootstrap/${mode}.ts" "$@"
