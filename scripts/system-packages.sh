#!/usr/bin/env bash
# Installs the Debian packages the tests need to draw the OpenGL scene under Xvfb with Mesa
# (software rendering, no GPU). Installs only what is missing: apt-get as root, sudo otherwise.
set -euo pipefail
packages=(xvfb xauth libgl1-mesa-dri libegl1 libopengl0 libxkbcommon-x11-0 libxcb-cursor0
  libxcb-icccm4 libxcb-keysyms1 libxcb-shape0 libxcb-xinerama0 libxcb-randr0 libxcb-render-util0
  libxcb-image0 libfontconfig1 libdbus-1-3 fonts-dejavu-core)
missing=()
if ! command -v dpkg-query >/dev/null 2>&1; then
  echo "system-packages: not a Debian-like system; install these yourself if tests fail: ${packages[*]}"
  exit 0
fi
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
[ ${#missing[@]} -eq 0 ] && exit 0
echo "system-packages: installing ${missing[*]}"
if [ "$(id -u)" -eq 0 ]; then
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}"
elif command -v sudo >/dev/null 2>&1; then
  sudo apt-get update -qq
  sudo DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}"
else
  echo "system-packages: missing ${missing[*]}; install them (apt-get install ...) and run again" >&2
  exit 1
fi
