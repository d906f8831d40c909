#!/usr/bin/env bash
# Run by `npm test` before anything else: the end-to-end tests drive Debian's Chromium
# (playwright.config.ts; CHROMIUM_PATH points elsewhere). Installs it when missing and we
# are root; otherwise stops at once with one line saying what to install.
set -euo pipefail

browser="${CHROMIUM_PATH:-/usr/bin/chromium}"
[ -x "$browser" ] && exit 0

if [ -n "${CHROMIUM_PATH:-}" ]; then
  echo "npm test: CHROMIUM_PATH=$browser is not an executable browser; unset it to use Debian's chromium." >&2
  exit 1
fi
if [ "$(id -u)" -ne 0 ] || ! command -v apt-get >/dev/null; then
  echo "npm test: the end-to-end tests need Debian's Chromium at $browser: run 'sudo apt-get install chromium' (or set CHROMIUM_PATH), then npm test again." >&2
  exit 1
fi

echo "npm test: installing Debian's chromium for the end-to-end tests"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq >/dev/null
apt-get install -y -qq --no-install-recommends chromium >/dev/null
if [ ! -x "$browser" ]; then
  echo "npm test: apt-get installed chromium, but $browser is still missing." >&2
  exit 1
fi
