#!/bin/sh
# SPDX-License-Identifier: GPL-3.0-or-later
# The floors link downwards only: solver/ sees no GLib, GTK, cairo or
# libxml2; app/ sees no GTK or GDK (ARCHITECTURE.md).  The build enforces
# most of this through dependencies; this check names the offending line.
set -eu
top="$1"
status=0
if grep -rnE '#[[:space:]]*include[[:space:]]*[<"](glib|gio/|gobject/|gtk/|gdk/|cairo|pango|libxml/)' \
     "$top/solver"; then
  echo "solver/ must include no GLib, GTK, cairo, Pango or libxml2 header" >&2
  status=1
fi
if grep -rnE '#[[:space:]]*include[[:space:]]*[<"](gtk/|gdk/)' "$top/app"; then
  echo "app/ must include no GTK or GDK header" >&2
  status=1
fi
[ $status -eq 0 ] && echo "layering: solver/ and app/ include only what their floor allows"
exit $status
