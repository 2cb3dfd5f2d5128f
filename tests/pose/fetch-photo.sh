#!/usr/bin/env bash
# Extracts one real photograph of a person for tests/pose/photo.test.ts: the public-domain NASA
# astronaut portrait that scikit-image ships as sample data, taken from Debian's python3-skimage
# package. Idempotent and quiet; writes fixtures/generated/photos/astronaut.png.
set -euo pipefail
cd "$(dirname "$0")/../.."
out=fixtures/generated/photos/astronaut.png
sha=88431cd9653ccd539741b555fb0a46b61558b301d4110412b5bc28b5e3ea6cb5
if [ -f "$out" ] && echo "$sha  $out" | sha256sum -c --quiet 2>/dev/null; then exit 0; fi
mkdir -p "$(dirname "$out")"
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
chmod 777 "$tmp"
(
  cd "$tmp"
  apt-get download -qq python3-skimage 2>/dev/null || { apt-get update -qq && apt-get download -qq python3-skimage 2>/dev/null; }
)
dpkg-deb --fsys-tarfile "$tmp"/python3-skimage_*.deb \
  | tar -xO ./usr/lib/python3/dist-packages/skimage/data/astronaut.png > "$tmp/astronaut.png"
echo "$sha  $tmp/astronaut.png" | sha256sum -c --quiet
mv "$tmp/astronaut.png" "$out"
