/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-window.h"

#include <glib/gi18n.h>

struct _PlWindow
{
  GtkApplicationWindow parent_instance;

  GtkLabel *status_label;
};

G_DEFINE_FINAL_TYPE (PlWindow, pl_window, GTK_TYPE_APPLICATION_WINDOW)

static GSettings *
pl_window_settings (PlWindow *self)
{
  GtkApplication *app = gtk_window_get_application (GTK_WINDOW (self));

  return app != NULL ? pl_application_get_settings (PL_APPLICATION (app)) : NULL;
}

static void
pl_window_restore_size (PlWindow *self)
{
  GSettings *settings = pl_window_settings (self);

  if (settings == NULL)
    return;
  gtk_window_set_default_size (GTK_WINDOW (self),
                               g_settings_get_int (settings, "window-width"),
                               g_settings_get_int (settings, "window-height"));
  if (g_settings_get_boolean (settings, "window-maximized"))
    gtk_window_maximize (GTK_WINDOW (self));
}

static void
pl_window_save_size (PlWindow *self)
{
  GSettings *settings = pl_window_settings (self);
  int width, height;

  if (settings == NULL)
    return;
  /* The default size tracks the unmaximised size, which is what to restore. */
  gtk_window_get_default_size (GTK_WINDOW (self), &width, &height);
  g_settings_set_int (settings, "window-width", width);
  g_settings_set_int (settings, "window-height", height);
  g_settings_set_boolean (settings, "window-maximized",
                          gtk_window_is_maximized (GTK_WINDOW (self)));
}

static gboolean
pl_window_close_request (GtkWindow *window)
{
  pl_window_save_size (PL_WINDOW (window));
  return GTK_WINDOW_CLASS (pl_window_parent_class)->close_request (window);
}

static void
pl_window_class_init (PlWindowClass *klass)
{
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  GtkWindowClass *window_class = GTK_WINDOW_CLASS (klass);

  window_class->close_request = pl_window_close_request;

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/pressline/Pressline/pl-window.ui");
  gtk_widget_class_bind_template_child (widget_class, PlWindow, status_label);
}

static void
pl_window_init (PlWindow *self)
{
  g_autofree char *version = NULL;

  gtk_widget_init_template (GTK_WIDGET (self));

  version = g_strdup_printf (_("Version %s"), PACKAGE_VERSION);
  gtk_label_set_text (self->status_label, version);
}

PlWindow *
pl_window_new (PlApplication *app)
{
  PlWindow *self;

  g_return_val_if_fail (PL_IS_APPLICATION (app), NULL);

  self = g_object_new (PL_TYPE_WINDOW, "application", app, NULL);
  /* "application" is not a construct property, so the settings are only
   * reachable once g_object_new has returned. */
  pl_window_restore_size (self);
  return self;
}

/* Opens a layout file in this window.  This build has no layout reader yet
 * (it comes with the document model), so the window says so plainly rather
 * than pretending to show the file. */
void
pl_window_open_file (PlWindow *self,
                     GFile    *file)
{
  g_autofree char *name = NULL;
  g_autofree char *message = NULL;

  g_return_if_fail (PL_IS_WINDOW (self));
  g_return_if_fail (G_IS_FILE (file));

  name = g_file_get_basename (file);
  message = g_strdup_printf (_("“%s” was not opened: this version of Pressline cannot "
                               "read layouts yet."), name);
  gtk_label_set_text (self->status_label, message);
}
