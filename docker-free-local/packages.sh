#!/usr/bin/env bash
# Install the Debian packages the app and its tests use, only when missing.
set -euo pipefail
need=()
for pkg in postgresql chromium python3-gsw python3-numpy python3-netcdf4 fonts-dejavu-core poppler-utils; do
  dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q "install ok installed" || need+=("$pkg")
done
if [ ${#need[@]} -gt 0 ]; then
  echo "[sigmaline] installing Debian packages: ${need[*]}"
  SUDO=""; [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi
