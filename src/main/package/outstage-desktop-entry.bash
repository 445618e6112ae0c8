#!/usr/bin/env bash
# Adds Outstage to the desktop's application menu (Linux image): writes outstage.desktop, naming this image's launcher
# and icon where the image is now, into ${XDG_DATA_HOME:-~/.local/share}/applications/. Run it again after moving the
# image. tools/package-image installs it as bin/outstage-desktop-entry, with the entry's template in lib/.
set -euo pipefail
case "${1:-}" in
  -h|--help) echo "usage: outstage-desktop-entry    adds Outstage to the desktop's application menu, naming this image where it is now"; exit 0 ;;
  "") ;;
  *) echo "outstage-desktop-entry: no option '$1' (usage: outstage-desktop-entry [--help])" >&2; exit 2 ;;
esac
app="$(cd "$(dirname "$(readlink -f "${BASH_SOURCE[0]}")")/.." && pwd -P)"
template="$app/lib/outstage.desktop.in"
[ -f "$template" ] || { echo "outstage-desktop-entry: $template is missing" >&2; exit 2; }
dest="${XDG_DATA_HOME:-$HOME/.local/share}/applications"
mkdir -p "$dest"
# the path goes into a sed replacement: escape what sed would read there (backslash, the delimiter, &)
esc=$(printf '%s' "$app" | sed 's/[\\|&]/\\&/g')
sed "s|@APPDIR@|$esc|g" "$template" > "$dest/outstage.desktop.tmp"
mv -f "$dest/outstage.desktop.tmp" "$dest/outstage.desktop"
echo "outstage-desktop-entry: $dest/outstage.desktop (starts $app/bin/outstage)"
