#!/usr/bin/env bash
# Checks the Debian packages Duosweep needs and installs the missing ones when
# it can (root, or password-less sudo); otherwise prints exactly what to install.
#   scripts/deps.sh build   # cgo + X headers: building the desktop app and -race tests; poppler-utils for the PDF tests
#   scripts/deps.sh gui     # build + Xvfb, xdotool, ImageMagick, Mesa: smoke tests and screenshots
set -euo pipefail
what=${1:-build}
build_pkgs=(gcc libc6-dev pkg-config libgl-dev libx11-dev libxcursor-dev libxrandr-dev libxinerama-dev libxi-dev libxxf86vm-dev)
gui_pkgs=(xvfb xauth imagemagick xdotool libgl1-mesa-dri libglx-mesa0)
# poppler-utils (pdftotext, pdfinfo, pdffonts, pdftoppm): the briefing PDF tests read the PDFs back with them
test_pkgs=(poppler-utils)
pkgs=("${build_pkgs[@]}" "${test_pkgs[@]}")
[ "$what" = gui ] && pkgs+=("${gui_pkgs[@]}")

if ! command -v go >/dev/null 2>&1; then
  if [ -x /usr/local/go/bin/go ]; then
    echo "deps: go is at /usr/local/go/bin but not on PATH: export PATH=\$PATH:/usr/local/go/bin" >&2
  else
    echo "deps: Go 1.26 or newer is needed: install it from your distribution or the Go project's release archive" >&2
  fi
  exit 1
fi

if ! command -v dpkg-query >/dev/null 2>&1; then
  echo "deps: not a Debian-like system; see the README for this platform's prerequisites" >&2
  exit 0
fi
missing=()
for p in "${pkgs[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
[ ${#missing[@]} -eq 0 ] && exit 0

echo "deps: missing Debian packages: ${missing[*]}" >&2
if [ "$(id -u)" = 0 ]; then
  sudo=""
elif command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
  sudo="sudo"
else
  echo "deps: install them with:" >&2
  echo "  sudo apt-get update && sudo apt-get install -y --no-install-recommends ${missing[*]}" >&2
  exit 1
fi
export DEBIAN_FRONTEND=noninteractive
$sudo apt-get update -qq
$sudo apt-get install -y -qq --no-install-recommends "${missing[@]}"
