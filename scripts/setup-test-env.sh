#!/usr/bin/env bash
# Installs what the tests need beyond npm packages: Debian's chromium for the browser tests.
# (Test tools' own browser downloads are not used.) Needs root or sudo on a Debian machine.
set -euo pipefail
if ! command -v chromium >/dev/null 2>&1; then
  SUDO=""; [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq chromium >/dev/null
fi
chromium --version
