#!/bin/sh
# Add Ebullio to this user's application menu and let the file manager open
# .ebullio project files with it. Run from the unpacked ebullio folder:
#     ./install-desktop-entry.sh            (add)
#     ./install-desktop-entry.sh --remove   (take it out again)
# Writes only under $XDG_DATA_HOME (default ~/.local/share); needs no root.
set -eu
here=$(cd "$(dirname "$0")" && pwd)
data=${XDG_DATA_HOME:-$HOME/.local/share}
sizes="16 24 32 48 64 128 256"

refresh() {
    if command -v update-mime-database >/dev/null 2>&1; then update-mime-database "$data/mime"; fi
    if command -v update-desktop-database >/dev/null 2>&1; then update-desktop-database "$data/applications"; fi
    if command -v gtk-update-icon-cache >/dev/null 2>&1; then gtk-update-icon-cache -q -t "$data/icons/hicolor" || true; fi
}

if [ "${1:-}" = "--remove" ]; then
    rm -f "$data/applications/ebullio.desktop" "$data/mime/packages/ebullio.xml" \
          "$data/icons/hicolor/scalable/apps/ebullio.svg"
    for s in $sizes; do rm -f "$data/icons/hicolor/${s}x${s}/apps/ebullio.png"; done
    refresh
    echo "Ebullio removed from the application menu (the folder $here is left as it is)."
    exit 0
fi

mkdir -p "$data/applications" "$data/mime/packages" "$data/icons/hicolor/scalable/apps"
# The entry names this folder's executable, so the menu works without PATH.
sed "s|^Exec=ebullio |Exec=\"$here/ebullio\" |" "$here/share/applications/ebullio.desktop" \
    > "$data/applications/ebullio.desktop"
cp "$here/share/mime/packages/ebullio.xml" "$data/mime/packages/ebullio.xml"
cp "$here/share/icons/hicolor/scalable/apps/ebullio.svg" "$data/icons/hicolor/scalable/apps/"
for s in $sizes; do
    mkdir -p "$data/icons/hicolor/${s}x${s}/apps"
    cp "$here/share/icons/hicolor/${s}x${s}/apps/ebullio.png" "$data/icons/hicolor/${s}x${s}/apps/"
done
refresh
echo "Ebullio added to the application menu; .ebullio files now open with $here/ebullio"
