/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-application.h"

#include <glib/gi18n.h>

#include "pl-resources.h"
#include "pl-window-private.h"
#include "pl-window.h"

struct _PlApplication
{
  GtkApplication parent_instance;

  GSettings *settings;
};

G_DEFINE_FINAL_TYPE (PlApplication, pl_application, GTK_TYPE_APPLICATION)

static void
pl_application_about_action (GSimpleAction *action,
                             GVariant      *parameter,
                             gpointer       user_data)
{
  GtkApplication *app = GTK_APPLICATION (user_data);
  const char *developers[] = { _("The Pressline developers"), NULL };

  gtk_show_about_dialog (gtk_application_get_active_window (app),
                         "program-name", _("Pressline"),
                         "logo-icon-name", APP_ID,
                         "version", PACKAGE_VERSION,
                         "comments", _("Design, check and explain high-pressure adhesive "
                                       "and coating spray lines."),
                         "license-type", GTK_LICENSE_GPL_3_0,
                         "authors", developers,
                         "translator-credits", _("translator-credits"),
                         NULL);
}

static void
pl_application_quit_action (GSimpleAction *action,
                            GVariant      *parameter,
                            gpointer       user_data)
{
  GApplication *app = G_APPLICATION (user_data);
  GList *windows = gtk_application_get_windows (GTK_APPLICATION (app));

  /* Close every window the normal way so each one saves its state. */
  for (GList *l = windows; l != NULL;)
    {
      GtkWindow *window = l->data;
      l = l->next;
      gtk_window_close (window);
    }
}

static void
pl_application_new_window_action (GSimpleAction *action,
                                  GVariant      *parameter,
                                  gpointer       user_data)
{
  PlWindow *window = pl_window_new (PL_APPLICATION (user_data));

  gtk_window_present (GTK_WINDOW (window));
}

static const GActionEntry app_actions[] = {
  { "about", pl_application_about_action, NULL, NULL, NULL, { 0 } },
  { "new-window", pl_application_new_window_action, NULL, NULL, NULL, { 0 } },
  { "quit", pl_application_quit_action, NULL, NULL, NULL, { 0 } },
};

static void
pl_application_startup (GApplication *app)
{
  PlApplication *self = PL_APPLICATION (app);
  static const char *quit_accels[] = { "<Control>q", NULL };
  g_autoptr (GtkCssProvider) css = NULL;

  /* Everything Pressline draws is cairo (the canvas, symbols, plots), so
   * GSK's GL renderer gains it nothing, and on a machine without a GPU
   * (Mesa's llvmpipe) it costs about 50 ms of the main loop per frame
   * (bench-editor: longest main-loop block with a value held down, 50 ms
   * with GL, 1.5 ms with cairo).  The cairo renderer is the default; a
   * user's own GSK_RENDERER still wins.  Read when the first window is
   * realised, so it must be set before. */
  g_setenv ("GSK_RENDERER", "cairo", FALSE);

  G_APPLICATION_CLASS (pl_application_parent_class)->startup (app);

  /* The name the desktop shows for the program, and under which GTK files
   * its entries in the recently used list. */
  g_set_application_name (_("Pressline"));
  self->settings = g_settings_new (APP_ID);
  g_action_map_add_action_entries (G_ACTION_MAP (app), app_actions,
                                   G_N_ELEMENTS (app_actions), app);
  gtk_application_set_accels_for_action (GTK_APPLICATION (app), "app.quit", quit_accels);
  pl_window_set_accels (GTK_APPLICATION (app));
  gtk_window_set_default_icon_name (APP_ID);

  css = gtk_css_provider_new ();
  gtk_css_provider_load_from_resource (css, "/org/pressline/Pressline/style.css");
  gtk_style_context_add_provider_for_display (gdk_display_get_default (),
                                              GTK_STYLE_PROVIDER (css),
                                              GTK_STYLE_PROVIDER_PRIORITY_APPLICATION);
}

static void
pl_application_activate (GApplication *app)
{
  GtkWindow *window = gtk_application_get_active_window (GTK_APPLICATION (app));

  if (window == NULL)
    window = GTK_WINDOW (pl_window_new (PL_APPLICATION (app)));
  gtk_window_present (window);
}

static void
pl_application_open (GApplication  *app,
                     GFile        **files,
                     int            n_files,
                     const char    *hint)
{
  for (int i = 0; i < n_files; i++)
    {
      PlWindow *window = pl_window_new (PL_APPLICATION (app));

      pl_window_open_file (window, files[i]);
      gtk_window_present (GTK_WINDOW (window));
    }
}

static void
pl_application_dispose (GObject *object)
{
  PlApplication *self = PL_APPLICATION (object);

  g_clear_object (&self->settings);
  G_OBJECT_CLASS (pl_application_parent_class)->dispose (object);
}

static void
pl_application_class_init (PlApplicationClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GApplicationClass *app_class = G_APPLICATION_CLASS (klass);

  pl_register_resource ();

  object_class->dispose = pl_application_dispose;
  app_class->startup = pl_application_startup;
  app_class->activate = pl_application_activate;
  app_class->open = pl_application_open;
}

static void
pl_application_init (PlApplication *self)
{
}

PlApplication *
pl_application_new (void)
{
  return g_object_new (PL_TYPE_APPLICATION,
                       "application-id", APP_ID,
                       "flags", G_APPLICATION_HANDLES_OPEN,
                       "resource-base-path", "/org/pressline/Pressline",
                       NULL);
}

/* The application's settings; valid from startup until the application is
 * disposed. */
GSettings *
pl_application_get_settings (PlApplication *self)
{
  g_return_val_if_fail (PL_IS_APPLICATION (self), NULL);

  return self->settings;
}
