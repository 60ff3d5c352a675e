#!/usr/bin/env bash
# Installs Debian's chromium when /usr/bin/chromium is missing: the browser
# that Playwright (npm test) and the Explorer bench (npm run bench:ui) drive.
# No browser is ever downloaded from anywhere else.
set -euo pipefail
if [ -x /usr/bin/chromium ]; then exit 0; fi
echo "[chromium] installing Debian's chromium"
{ apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends chromium >/dev/null; } || {
  echo "[chromium] could not install chromium (needs root and Debian's package archive)"
  exit 1
}
