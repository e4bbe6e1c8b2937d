#!/bin/sh
# SPDX-License-Identifier: GPL-3.0-or-later
# Fails when a translation lacks a string that the sources mark for
# translation (untranslated and fuzzy entries count as missing).
#   check-po-complete.sh SOURCE_ROOT LANG
set -eu
top="$1"
lang="$2"
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
grep -v '^#' "$top/po/POTFILES.in" | grep -v '^$' > "$tmp/files"
cd "$top"
xgettext --from-code=UTF-8 --add-comments=Translators --keyword=_ --keyword=N_ \
  --keyword=C_:1c,2 --keyword=NC_:1c,2 --keyword=g_dngettext:2,3 \
  --keyword=ngettext:1,2 --keyword=g_dpgettext2:2c,3 \
  --files-from="$tmp/files" -o "$tmp/pressline.pot"
msgcmp "po/$lang.po" "$tmp/pressline.pot"
echo "po/$lang.po: every string of the sources is translated"
