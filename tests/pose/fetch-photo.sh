#!/usr/bin/env bash
# Extracts real photographs of people for the pose tests, from Debian packages (public registry
# material, checked by sha256). Idempotent and quiet; writes fixtures/generated/photos/.
#  - astronaut.png: the public-domain NASA astronaut portrait that scikit-image ships as sample data
#    (python3-skimage), for tests/pose/photo.test.ts.
#  - opencv/: OpenCV's sample data (opencv-doc, BSD/Apache licensed samples): messi5.jpg (a footballer
#    kicking), basketball1.png (two men passing a ball) and four frames of vtest.avi (pedestrians seen
#    from above), for the knee-flexion evaluation in tests/pose/photo-eval.ts.
set -euo pipefail
cd "$(dirname "$0")/../.."
dir=fixtures/generated/photos
mkdir -p "$dir/opencv"
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
chmod 777 "$tmp"

# apt-get download into $tmp; refresh the package lists once if the package is unknown.
download() {
  (cd "$tmp" && { apt-get download -qq "$1" 2>/dev/null || { apt-get update -qq && apt-get download -qq "$1" 2>/dev/null; }; })
}

# check FILE SHA: true when FILE exists with that sha256.
check() { [ -f "$1" ] && echo "$2  $1" | sha256sum -c --quiet 2>/dev/null; }

astronaut_sha=88431cd9653ccd539741b555fb0a46b61558b301d4110412b5bc28b5e3ea6cb5
if ! check "$dir/astronaut.png" $astronaut_sha; then
  download python3-skimage
  dpkg-deb --fsys-tarfile "$tmp"/python3-skimage_*.deb \
    | tar -xO ./usr/lib/python3/dist-packages/skimage/data/astronaut.png > "$tmp/astronaut.png"
  check "$tmp/astronaut.png" $astronaut_sha
  mv "$tmp/astronaut.png" "$dir/astronaut.png"
fi

declare -A opencv_sha=(
  [messi5.jpg]=1d570e49654e84c7a943918537bd9e5e1ef82920152e147c834006e235be97c9
  [basketball1.png]=ba06f6701f7260998b430c39b6557f775497e6ce7b1a74f0b7ea6af371bf54a6
  [vtest.avi]=45cddc9490be69345cbdab64ca583be65987e864ca408038e648db99e10516cf
)
missing=0
for f in "${!opencv_sha[@]}"; do check "$dir/opencv/$f" "${opencv_sha[$f]}" || missing=1; done
if [ $missing = 1 ]; then
  download opencv-doc
  for f in "${!opencv_sha[@]}"; do
    dpkg-deb --fsys-tarfile "$tmp"/opencv-doc_*.deb | tar -xO "./usr/share/doc/opencv-doc/examples/data/$f" > "$tmp/$f"
    check "$tmp/$f" "${opencv_sha[$f]}"
    mv "$tmp/$f" "$dir/opencv/$f"
  done
fi

# vtest.avi frames by decoded frame number, with the ffmpeg the app ships.
ffmpeg=$(node -p "require('@ffmpeg-installer/ffmpeg').path")
for n in 20 200 400 600; do
  out="$dir/opencv/vtest-$n.png"
  [ -s "$out" ] && continue
  "$ffmpeg" -loglevel error -y -i "$dir/opencv/vtest.avi" -vf "select=eq(n\\,$n)" -vsync 0 -frames:v 1 "$tmp/f.png"
  mv "$tmp/f.png" "$out"
done
