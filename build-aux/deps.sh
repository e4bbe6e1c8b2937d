# SPDX-License-Identifier: GPL-3.0-or-later
# Shared by build-aux/run and build-aux/test: what Pressline needs from the
# distribution, and how it is installed.  Sourced, not run.

# To build and run: compiler, meson, GTK 4, libxml2, cairo/Pango, CHOLMOD,
# gettext, GLib's tools (schemas, resources).
PRESSLINE_BUILD_PACKAGES="gcc meson ninja-build pkg-config libgtk-4-dev libxml2-dev
  libcairo2-dev libpango1.0-dev libsuitesparse-dev gettext libglib2.0-dev-bin
  libglib2.0-bin shared-mime-info hicolor-icon-theme adwaita-icon-theme
  librsvg2-common"

# To test: Check, GSL (the independent reference), validators, a headless X
# server with a session bus, PDF and image tools for the export checks, and
# fonts with Cyrillic and CJK glyphs (the work-order test prints a title in
# both and reads it back from the PDF; a bare system has neither).
PRESSLINE_TEST_PACKAGES="check libgsl-dev libxml2-utils desktop-file-utils
  appstream xvfb xauth dbus-daemon poppler-utils imagemagick locales
  fonts-dejavu-core fonts-droid-fallback"

pressline_missing_packages ()
{
  local missing="" pkg
  for pkg in "$@"; do
    if ! dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q 'install ok installed'; then
      missing="$missing $pkg"
    fi
  done
  echo "$missing"
}

# Installs whatever of the given packages is missing, with apt, as root or
# through sudo; says what it installs; does nothing when all are present.
pressline_install_packages ()
{
  local missing
  if ! command -v dpkg-query >/dev/null 2>&1; then
    echo "build-aux: this is not a Debian or Ubuntu system; install by hand:" >&2
    echo "  $*" >&2
    return 0
  fi
  # shellcheck disable=SC2086
  missing=$(pressline_missing_packages $*)
  [ -z "$missing" ] && return 0

  local sudo=""
  if [ "$(id -u)" -ne 0 ]; then
    if command -v sudo >/dev/null 2>&1; then
      sudo="sudo"
    else
      echo "build-aux: these packages are missing and neither root nor sudo is available:" >&2
      echo " $missing" >&2
      return 1
    fi
  fi
  echo "build-aux: installing with apt:$missing"
  $sudo env DEBIAN_FRONTEND=noninteractive apt-get update -qq || return 1
  # shellcheck disable=SC2086
  $sudo env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends \
    $missing || return 1
}

# Configures (once) and builds a meson build directory.
#   pressline_build DIR [MESON SETUP OPTIONS...]
pressline_build ()
{
  local dir="$1"
  shift
  if [ ! -f "$dir/build.ninja" ]; then
    meson setup "$dir" "$@" || return 1
  fi
  meson compile -C "$dir" || return 1
}
