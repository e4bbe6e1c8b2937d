/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-ui-test.h: what the GTK suites share.  Header-only, tests only.
 */
#pragma once

#include <check.h>
#include <glib/gstdio.h>
#include <stdio.h>
#include <gtk/gtk.h>

#include "pl-application.h"

/* The application, registered (which runs its startup) without owning the
 * bus name.  A process can register it once: make it in an unchecked
 * fixture. */
static inline PlApplication *
pl_ui_test_app_new (void)
{
  g_autoptr (GError) error = NULL;
  PlApplication *app = pl_application_new ();

  g_application_set_flags (G_APPLICATION (app),
                           G_APPLICATION_HANDLES_OPEN | G_APPLICATION_NON_UNIQUE);
  ck_assert_msg (g_application_register (G_APPLICATION (app), NULL, &error),
                 "register: %s", error ? error->message : "");
  return app;
}

/* What a widget shows, rendered by its own renderer. */
static inline GdkTexture *
render_widget (GtkWidget *widget)
{
  int w = gtk_widget_get_width (widget), h = gtk_widget_get_height (widget);
  g_autoptr (GdkPaintable) paintable = gtk_widget_paintable_new (widget);
  GtkSnapshot *snapshot = gtk_snapshot_new ();
  GskRenderNode *node;
  GskRenderer *renderer = gtk_native_get_renderer (gtk_widget_get_native (widget));
  GdkTexture *texture;

  ck_assert_int_gt (w, 0);
  gdk_paintable_snapshot (paintable, snapshot, w, h);
  node = gtk_snapshot_free_to_node (snapshot);
  ck_assert_ptr_nonnull (node);
  texture = gsk_renderer_render_texture (renderer, node, &GRAPHENE_RECT_INIT (0, 0, w, h));
  gsk_render_node_unref (node);
  return texture;
}

/* Saves what a widget shows as BUILD/tests/ui/screenshots/NAME (PNG) and
 * names the file in the test log. */
static inline void
save_shot (GtkWidget *widget, const char *name)
{
  const char *root = g_getenv ("PRESSLINE_BUILD_ROOT");
  g_autofree char *dir = g_build_filename (root != NULL ? root : ".", "tests", "ui",
                                           "screenshots", NULL);
  g_autofree char *path = g_build_filename (dir, name, NULL);
  g_autoptr (GdkTexture) texture = render_widget (widget);

  g_mkdir_with_parents (dir, 0755);
  ck_assert_msg (gdk_texture_save_to_png (texture, path), "cannot write %s", path);
  printf ("artifact: %s\n", path);
}
