/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-ui-test.h: what a GTK suite needs besides Check: turning the main
 * loop for a while, waiting for a window's full results, and writing a
 * widget's rendering to BUILD/tests/ui/screenshots; making the
 * application.  Header-only, tests only.
 */
#pragma once

#include <glib/gstdio.h>
#include <gtk/gtk.h>
#include <stdio.h>

#include "pl-application.h"
#include "pl-check.h"
#include "pl-window.h"

/* The application, registered without owning the bus name (a test need
 * not be the only instance); registering runs its startup. */
static inline PlApplication *
pl_ui_test_app_new (void)
{
  g_autoptr (GError) error = NULL;
  PlApplication *application;

  /* g_application_run() names the program after argv[0]; a suite does
   * not run it, and GTK's recently-used list needs the name. */
  if (g_get_prgname () == NULL)
    g_set_prgname ("pressline");
  application = pl_application_new ();
  g_application_set_flags (G_APPLICATION (application),
                           G_APPLICATION_HANDLES_OPEN | G_APPLICATION_NON_UNIQUE);
  ck_assert_msg (g_application_register (G_APPLICATION (application), NULL, &error),
                 "register: %s", error ? error->message : "");
  return application;
}

/* The suite's one application: a second could not register its name on
 * the bus while the first is alive.  For tcase_add_unchecked_fixture (tc,
 * pl_ui_test_app_setup, pl_ui_test_app_teardown). */
static PlApplication *app G_GNUC_UNUSED;

static inline void
pl_ui_test_app_setup (void)
{
  if (app == NULL)
    app = pl_ui_test_app_new ();
}

static inline void
pl_ui_test_app_teardown (void)
{
  g_clear_object (&app);
}

/* Turns the main loop for ms, bounded by the clock alone: while a tick
 * callback runs, the frame clock always has work pending. */
static inline void
pl_ui_test_spin (guint ms)
{
  gint64 end = g_get_monotonic_time () + (gint64) ms * 1000;

  while (g_get_monotonic_time () < end)
    {
      g_main_context_iteration (NULL, FALSE);
      g_usleep (1000);
    }
}

/* Until the worker has delivered the present revision's cycle and
 * shutdown (60 s at most: sanitizer builds on a shared machine). */
static inline void
pl_ui_test_wait_for_full (PlWindow *window)
{
  PlSolveScheduler *sched = pl_window_get_scheduler (window);
  gint64 end = g_get_monotonic_time () + 60 * G_USEC_PER_SEC;

  while (g_get_monotonic_time () < end)
    {
      PlResults *full = pl_solve_scheduler_get_full_results (sched);

      if (!pl_solve_scheduler_get_busy (sched) && full != NULL
          && pl_results_get_revision (full)
               == pl_document_get_revision (pl_window_get_document (window)))
        {
          pl_ui_test_spin (20);
          return;
        }
      g_main_context_iteration (NULL, FALSE);
      g_usleep (2000);
    }
  ck_abort_msg ("no full results within 60 s");
}

/* A window of 1400 x 900 presented, mapped and laid out (on a loaded
 * machine the first allocation, which fits the canvas's view, can come
 * well after the map: a pointer aimed before it would miss), with the
 * layout at path (from the source tree's top, "samples/X.pline") loaded
 * when path is not NULL. */
static inline PlWindow *
pl_ui_test_open_window (PlApplication *application, const char *path)
{
  PlWindow *window = pl_window_new (application);

  gtk_window_set_default_size (GTK_WINDOW (window), 1400, 900);
  gtk_window_present (GTK_WINDOW (window));
  for (int i = 0; i < 2000 && (!gtk_widget_get_mapped (GTK_WIDGET (window))
                               || gtk_widget_get_width (pl_window_get_canvas (window)) == 0);
       i++)
    pl_ui_test_spin (5);
  if (path != NULL)
    {
      g_autofree char *full = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), path, NULL);
      g_autoptr (GFile) file = g_file_new_for_path (full);
      g_autoptr (GError) error = NULL;

      ck_assert_msg (pl_window_load_file (window, file, &error), "%s: %s", path,
                     error ? error->message : "");
    }
  pl_ui_test_spin (50);
  return window;
}

/* What a widget shows, rendered by its own renderer.  A widget waiting
 * for a new layout (results just arrived, a label grew) has no picture
 * until the next frame lays it out: wait for that frame, 10 s at most. */
static inline GdkTexture *
pl_ui_test_render_widget (GtkWidget *widget)
{
  GskRenderer *renderer = gtk_native_get_renderer (gtk_widget_get_native (widget));
  GskRenderNode *node = NULL;
  GdkTexture *texture;
  int w = 0, h = 0;

  for (int attempt = 0; attempt < 1000 && node == NULL; attempt++)
    {
      g_autoptr (GdkPaintable) paintable = NULL;
      GtkSnapshot *snapshot;

      if (attempt > 0)
        pl_ui_test_spin (10);
      w = gtk_widget_get_width (widget);
      h = gtk_widget_get_height (widget);
      if (w <= 0 || h <= 0)
        continue;
      paintable = gtk_widget_paintable_new (widget);
      snapshot = gtk_snapshot_new ();
      gdk_paintable_snapshot (paintable, snapshot, w, h);
      node = gtk_snapshot_free_to_node (snapshot);
    }
  ck_assert_msg (node != NULL, "the widget drew nothing within 10 s (%d x %d)", w, h);
  texture = gsk_renderer_render_texture (renderer, node, &GRAPHENE_RECT_INIT (0, 0, w, h));
  gsk_render_node_unref (node);
  return texture;
}

/* Saves what a widget shows as BUILD/tests/ui/screenshots/NAME (PNG) and
 * names the file in the test log. */
static inline void
pl_ui_test_save_shot (GtkWidget *widget, const char *name)
{
  const char *root = g_getenv ("PRESSLINE_BUILD_ROOT");
  g_autofree char *dir = g_build_filename (root != NULL ? root : ".", "tests", "ui",
                                           "screenshots", NULL);
  g_autofree char *path = g_build_filename (dir, name, NULL);
  g_autoptr (GdkTexture) texture = pl_ui_test_render_widget (widget);

  g_mkdir_with_parents (dir, 0755);
  ck_assert_msg (gdk_texture_save_to_png (texture, path), "cannot write %s", path);
  printf ("artifact: %s (%d x %d)\n", path, gdk_texture_get_width (texture),
          gdk_texture_get_height (texture));
}
