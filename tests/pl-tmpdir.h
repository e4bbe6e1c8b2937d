/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-tmpdir.h: a fresh temporary folder per test, removed with what the
 * test wrote into it.  Header-only, tests only.
 */
#pragma once

#include <check.h>
#include <glib.h>
#include <glib/gstdio.h>

static char *pl_tmpdir;

static inline void
pl_tmpdir_setup (void)
{
  pl_tmpdir = g_dir_make_tmp ("pressline-test-XXXXXX", NULL);
  ck_assert_ptr_nonnull (pl_tmpdir);
}

static inline void
pl_tmpdir_teardown (void)
{
  g_autoptr (GDir) dir = g_dir_open (pl_tmpdir, 0, NULL);
  const char *name;

  while (dir != NULL && (name = g_dir_read_name (dir)) != NULL)
    {
      g_autofree char *path = g_build_filename (pl_tmpdir, name, NULL);

      g_unlink (path);
    }
  g_rmdir (pl_tmpdir);
  g_clear_pointer (&pl_tmpdir, g_free);
}

/* A path in the folder, newly allocated. */
static inline char *
pl_tmpdir_path (const char *name)
{
  return g_build_filename (pl_tmpdir, name, NULL);
}
