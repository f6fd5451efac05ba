#!/usr/bin/env bash
# A real documentation tree with translations for the real-editor tests: the GNOME desktop help
# from Debian's gnome-user-docs package (CC-BY-SA 3.0), the original (C/) and eight translations
# (de es fr it ja pt_BR ru zh_CN) of its two guides, about 2,900 Mallard pages. apt-get download +
# dpkg-deb -x into .cache/e2e (nothing is installed). Idempotent; writes
# .cache/e2e/doc-tree/gnome-user-docs-<version>/ and prints its path.
set -euo pipefail
PACKAGE="gnome-user-docs"
VERSION="43.0-2"
LANGS=(C de es fr it ja pt_BR ru zh_CN)
REPO_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
DEST="$REPO_ROOT/.cache/e2e/doc-tree/$PACKAGE-$VERSION"
[[ -f "$DEST/.complete" ]] && { echo "$DEST"; exit 0; }
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
chmod 755 "$tmp" # apt's download user must be able to write here
if ! (cd "$tmp" && apt-get download -q "$PACKAGE=$VERSION" >/dev/null 2>&1); then
  apt-get update -q >/dev/null
  (cd "$tmp" && apt-get download -q "$PACKAGE=$VERSION" >/dev/null)
fi
dpkg-deb -x "$tmp"/"$PACKAGE"_*.deb "$tmp/x"
rm -rf "$DEST"
mkdir -p "$DEST"
for l in "${LANGS[@]}"; do
  # Pages and their small text includes only (figures are binary and left out).
  (cd "$tmp/x/usr/share/help" && find "$l" -type f \( -name '*.page' -o -name '*.xml' \) -print0 | xargs -0 cp --parents -t "$DEST")
done
cp "$tmp/x/usr/share/doc/$PACKAGE/copyright" "$DEST/COPYRIGHT"
touch "$DEST/.complete"
echo "$DEST"
