#!/usr/bin/env bash
# Debian's Chromium for the browser tests, installed when missing (never a downloaded browser build).
set -euo pipefail
if [[ -x "${CHROMIUM_PATH:-/usr/bin/chromium}" ]]; then exit 0; fi
[[ $EUID -eq 0 ]] || { echo "[basted] chromium is missing; install it with: sudo apt-get install -y chromium" >&2; exit 1; }
echo "[basted] installing chromium from Debian (apt-get) ..." >&2
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq --no-install-recommends chromium fonts-dejavu-core >/dev/null
