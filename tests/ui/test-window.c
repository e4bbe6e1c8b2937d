/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include <gtk/gtk.h>

#include "pl-application.h"
#include "pl-check.h"
#include "pl-ui-test.h"
#include "pl-window.h"

static void
wait_until_mapped (GtkWidget *widget)
{
  for (int i = 0; i < 500 && !gtk_widget_get_mapped (widget); i++)
    g_main_context_iteration (NULL, TRUE);
}

START_TEST (test_window_opens_with_saved_size)
{
  GSettings *settings = pl_application_get_settings (app);
  PlWindow *window;
  int width = 0, height = 0;

  ck_assert_ptr_nonnull (settings);
  g_settings_set_int (settings, "window-width", 900);
  g_settings_set_int (settings, "window-height", 640);

  window = pl_window_new (app);
  gtk_window_present (GTK_WINDOW (window));
  wait_until_mapped (GTK_WIDGET (window));
  ck_assert (gtk_widget_get_mapped (GTK_WIDGET (window)));

  /* The application picks the cairo renderer unless told otherwise (the
   * test environment does not set GSK_RENDERER). */
  ck_assert_ptr_nonnull (g_getenv ("GSK_RENDERER"));
  if (g_str_equal (g_getenv ("GSK_RENDERER"), "cairo"))
    ck_assert_msg (GSK_IS_CAIRO_RENDERER (gtk_native_get_renderer (GTK_NATIVE (window))),
                   "renderer: %s",
                   G_OBJECT_TYPE_NAME (gtk_native_get_renderer (GTK_NATIVE (window))));

  gtk_window_get_default_size (GTK_WINDOW (window), &width, &height);
  ck_assert_int_eq (width, 900);
  ck_assert_int_eq (height, 640);
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "Untitled layout — Pressline");

  /* Closing saves the size back. */
  gtk_window_set_default_size (GTK_WINDOW (window), 1000, 700);
  gtk_window_close (GTK_WINDOW (window));
  ck_assert_int_eq (g_settings_get_int (settings, "window-width"), 1000);
  ck_assert_int_eq (g_settings_get_int (settings, "window-height"), 700);
}
END_TEST

START_TEST (test_application_has_actions_and_icon)
{
  GtkIconTheme *theme;

  ck_assert (g_action_map_lookup_action (G_ACTION_MAP (app), "about") != NULL);
  ck_assert (g_action_map_lookup_action (G_ACTION_MAP (app), "quit") != NULL);

  /* The icon comes from the application's resources even when uninstalled. */
  theme = gtk_icon_theme_get_for_display (gdk_display_get_default ());
  ck_assert (gtk_icon_theme_has_icon (theme, APP_ID));
  ck_assert (gtk_icon_theme_has_icon (theme, APP_ID "-symbolic"));
}
END_TEST

static Suite *
window_suite (void)
{
  Suite *s = suite_create ("window");
  TCase *tc = tcase_create ("main window");

  tcase_add_unchecked_fixture (tc, pl_ui_test_app_setup, pl_ui_test_app_teardown);
  tcase_add_test (tc, test_window_opens_with_saved_size);
  tcase_add_test (tc, test_application_has_actions_and_icon);
  suite_add_tcase (s, tc);
  return s;
}

int
main (int argc, char **argv)
{
  gtk_init ();
  return pl_check_run (window_suite ());
}
