#!/usr/bin/env bash
# cpack -G DEB builds a package holding both programs, the desktop entry and the icon, with its
# dependencies worked out from the binaries. (Installing it needs root and changes the machine,
# so that step is checked by hand: see DEVELOPERS.md.)
set -euo pipefail
build=$1
out=$(mktemp -d)
trap 'rm -rf "$out"' EXIT
(cd "$build" && cpack -G DEB -B "$out" >/dev/null)
deb=$(ls "$out"/plumbline_*.deb)
contents=$(dpkg-deb -c "$deb")
for path in ./usr/bin/plumbline ./usr/bin/plumbline-cli ./usr/share/applications/plumbline.desktop \
            ./usr/share/icons/hicolor/scalable/apps/plumbline.svg; do
  grep -q " $path\$" <<<"$contents" || { echo "FAIL: $path missing from the package"; exit 1; }
done
dpkg-deb -f "$deb" Depends | grep -q libqt6charts6 || { echo "FAIL: no Qt Charts dependency"; exit 1; }
echo "ok: $(basename "$deb") holds the programs, desktop entry and icon"
