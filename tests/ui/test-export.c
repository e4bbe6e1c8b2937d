/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-export.c: the work order from the editor: the export action writes
 * the sheets without its dialog, the dialog opens with its choices and
 * cancels cleanly, and printing runs through GtkPrintOperation's export
 * to a PDF (no printer needed) with one page per sheet.
 */
#include "config.h"

#include <cairo.h>
#include <glib/gstdio.h>
#include <gtk/gtk.h>
#include <stdio.h>
#include <string.h>

#include "pl-application.h"
#include "pl-check.h"
#include "pl-export-dialog.h"
#include "pl-command.h"
#include "pl-print.h"
#include "pl-results-wait.h"
#include "pl-tmpdir.h"
#include "pl-ui-test.h"
#include "pl-window.h"

static char *
pdftotext (const char *pdf)
{
  const char *argv[] = { "pdftotext", "-enc", "UTF-8", pdf, "-", NULL };
  char *out = NULL;
  int status = 0;

  ck_assert (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL, &out,
                           NULL, &status, NULL));
  ck_assert (g_spawn_check_wait_status (status, NULL));
  return out;
}

static guint
count (const char *text, const char *needle)
{
  guint n = 0;

  for (const char *p = strstr (text, needle); p != NULL; p = strstr (p + 1, needle))
    n++;
  return n;
}

/* Turns the main loop until path exists (the export waits for the
 * worker's full results when they are stale; 60 s at most). */
static void
wait_for_file (const char *path)
{
  for (int i = 0; i < 30000 && !g_file_test (path, G_FILE_TEST_IS_REGULAR); i++)
    {
      g_main_context_iteration (NULL, FALSE);
      g_usleep (2000);
    }
  ck_assert_msg (g_file_test (path, G_FILE_TEST_IS_REGULAR), "%s not written", path);
}

/* The action writes what the dialog would, with its last settings (A4,
 * orientation auto, 150 dpi at first): a PDF with every sheet, or PNG
 * sheets of 1754 x 1240 pixels (ISO 216 A4, 297 x 210 mm landscape, at
 * 150 dpi: the demo's diagram is more than 1.41 times wider than tall). */
START_TEST (test_export_action)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  g_autofree char *pdf = g_build_filename (pl_tmpdir, "from-action.pdf", NULL);
  g_autofree char *png = g_build_filename (pl_tmpdir, "from-action.png", NULL);
  g_autofree char *text = NULL;
  cairo_surface_t *image;

  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order-to", "s",
                                         pdf));
  wait_for_file (pdf);
  text = pdftotext (pdf);
  ck_assert_ptr_nonnull (strstr (text, "DEMO-0001"));
  ck_assert_ptr_nonnull (strstr (text, "Safety cautions"));
  ck_assert_uint_ge (count (text, "Sheet "), 2);

  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order-to", "s",
                                         png));
  wait_for_file (png);
  image = cairo_image_surface_create_from_png (png);
  ck_assert_int_eq (cairo_surface_status (image), CAIRO_STATUS_SUCCESS);
  ck_assert_int_eq (cairo_image_surface_get_width (image), 1754);
  ck_assert_int_eq (cairo_image_surface_get_height (image), 1240);
  cairo_surface_destroy (image);
  gtk_window_destroy (GTK_WINDOW (window));
}
END_TEST

static GtkWindow *
find_dialog (PlWindow *window)
{
  GListModel *tops = gtk_window_get_toplevels ();

  for (guint i = 0; i < g_list_model_get_n_items (tops); i++)
    {
      g_autoptr (GtkWindow) w = g_list_model_get_item (tops, i);

      if (GTK_IS_DIALOG (w) && gtk_window_get_transient_for (w) == GTK_WINDOW (window))
        return w;
    }
  return NULL;
}

/* The menu's action opens the dialog with the format, paper, orientation
 * and resolution choices; cancelling closes it and writes nothing. */
START_TEST (test_export_dialog)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  GtkWindow *dialog;

  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order", NULL));
  for (int i = 0; i < 200 && (dialog = find_dialog (window)) == NULL; i++)
    pl_ui_test_spin (5);
  ck_assert_ptr_nonnull (dialog);
  /* Mapped, then laid out: on a loaded machine the first allocation can
   * come well after the map. */
  for (int i = 0; i < 1000 && (!gtk_widget_get_mapped (GTK_WIDGET (dialog))
                               || gtk_widget_get_width (GTK_WIDGET (dialog)) == 0); i++)
    pl_ui_test_spin (5);
  pl_ui_test_spin (100);
  pl_ui_test_save_shot (GTK_WIDGET (dialog), "export-dialog.png");
  {
    guint n_drop_downs = 0, n_spins = 0;

    for (GtkWidget *w = gtk_widget_get_first_child (GTK_WIDGET (dialog)); w != NULL;)
      {
        GtkWidget *next;

        n_drop_downs += GTK_IS_DROP_DOWN (w);
        n_spins += GTK_IS_SPIN_BUTTON (w);
        /* Depth first over the dialog's widgets. */
        next = gtk_widget_get_first_child (w);
        while (next == NULL && w != NULL && w != GTK_WIDGET (dialog))
          {
            next = gtk_widget_get_next_sibling (w);
            if (next == NULL)
              w = gtk_widget_get_parent (w);
          }
        w = next;
      }
    ck_assert_uint_eq (n_drop_downs, 3);
    ck_assert_uint_eq (n_spins, 1);
  }
  gtk_dialog_response (GTK_DIALOG (dialog), GTK_RESPONSE_CANCEL);
  pl_ui_test_spin (50);
  ck_assert_ptr_null (find_dialog (window));
  gtk_window_destroy (GTK_WINDOW (window));
}
END_TEST

/* Printing with GTK_PRINT_OPERATION_ACTION_EXPORT: the same sheets, one
 * page each, through begin-print and draw-page. */
START_TEST (test_print_export)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  g_autofree char *pdf = g_build_filename (pl_tmpdir, "printed.pdf", NULL);
  g_autoptr (GError) error = NULL;
  g_autofree char *text = NULL, *last = NULL;
  GtkPrintOperationResult result;
  const char *of;
  guint n;

  pl_ui_test_wait_for_full (window);
  result = pl_print_run (window,
                         pl_solve_scheduler_get_full_results (pl_window_get_scheduler (window)),
                         GTK_PRINT_OPERATION_ACTION_EXPORT, pdf, &error);
  ck_assert_msg (result == GTK_PRINT_OPERATION_RESULT_APPLY, "print: %d %s", result,
                 error ? error->message : "");
  ck_assert (g_file_test (pdf, G_FILE_TEST_IS_REGULAR));
  text = pdftotext (pdf);
  /* The paper is the print setup's default, so the count comes from the
   * sheets themselves; pdftotext ends each page with a form feed. */
  of = strstr (text, "Sheet 1 of ");
  ck_assert_ptr_nonnull (of);
  n = (guint) g_ascii_strtoull (of + strlen ("Sheet 1 of "), NULL, 10);
  ck_assert_uint_ge (n, 2);
  ck_assert_uint_eq (count (text, "\f"), n);
  last = g_strdup_printf ("Sheet %u of %u", n, n);
  ck_assert_ptr_nonnull (strstr (text, last));
  ck_assert_ptr_nonnull (strstr (text, "Safety cautions"));
  gtk_window_destroy (GTK_WINDOW (window));
}
END_TEST

static gboolean
count_tick_cb (gpointer data)
{
  (*(guint *) data)++;
  return G_SOURCE_CONTINUE;
}

/* An export asked for while the full results are stale waits for the
 * worker instead of solving on the main thread: the action returns with
 * nothing written and a waiting dialog up, the main loop keeps turning
 * (a 1 ms timeout fires) until the results arrive, and the sheets
 * then give the same numbers as an export of the fresh document.  Cancel
 * in the dialog writes nothing. */
START_TEST (test_export_waits_for_stale_results)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/carton-sealer-starved.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  const char *hose = pl_part_get_id (pl_document_find_part_by_tag (doc, "H1"));
  g_autofree char *stale = g_build_filename (pl_tmpdir, "stale.pdf", NULL);
  g_autofree char *fresh = g_build_filename (pl_tmpdir, "fresh.pdf", NULL);
  g_autofree char *cancelled = g_build_filename (pl_tmpdir, "cancelled.pdf", NULL);
  g_autofree char *stale_text = NULL, *fresh_text = NULL;
  g_autoptr (PlCommand) longer = pl_command_new_set_number (hose, "length", 9.0);
  g_autoptr (PlCommand) longer_still = pl_command_new_set_number (hose, "length", 12.0);
  GtkWindow *wait_dialog;
  guint ticks = 0, tick_id;

  pl_ui_test_wait_for_full (window);
  ck_assert (pl_undo_stack_push (undo, longer, NULL));
  /* Stale now: the worker has the new revision. */
  ck_assert (pl_results_get_revision (pl_solve_scheduler_get_full_results (
               pl_window_get_scheduler (window))) != pl_document_get_revision (doc));
  tick_id = g_timeout_add (1, count_tick_cb, &ticks);
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order-to", "s",
                                         stale));
  ck_assert (!g_file_test (stale, G_FILE_TEST_EXISTS));
  wait_dialog = pl_results_wait_get_dialog (window);
  ck_assert_ptr_nonnull (wait_dialog);
  ck_assert (gtk_window_get_modal (wait_dialog));
  /* The tick is due before the loop turns again, so a loop that turns
   * dispatches it at least once before or with the results. */
  g_usleep (2000);
  wait_for_file (stale);
  g_source_remove (tick_id);
  ck_assert_msg (ticks >= 1, "the main loop turned %u times while waiting", ticks);
  ck_assert_ptr_null (pl_results_wait_get_dialog (window));

  /* The same state, fresh: the same sheets (the date and everything). */
  pl_ui_test_wait_for_full (window);
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order-to", "s",
                                         fresh));
  ck_assert (g_file_test (fresh, G_FILE_TEST_IS_REGULAR));
  stale_text = pdftotext (stale);
  fresh_text = pdftotext (fresh);
  ck_assert_str_eq (stale_text, fresh_text);

  /* Stale again, then Cancel: nothing written, no dialog left. */
  ck_assert (pl_undo_stack_push (undo, longer_still, NULL));
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.export-work-order-to", "s",
                                         cancelled));
  wait_dialog = pl_results_wait_get_dialog (window);
  ck_assert_ptr_nonnull (wait_dialog);
  gtk_dialog_response (GTK_DIALOG (wait_dialog), GTK_RESPONSE_CANCEL);
  ck_assert_ptr_null (pl_results_wait_get_dialog (window));
  pl_ui_test_wait_for_full (window);
  ck_assert (!g_file_test (cancelled, G_FILE_TEST_EXISTS));
  pl_undo_stack_mark_clean (undo);
  gtk_window_destroy (GTK_WINDOW (window));
}
END_TEST

static Suite *
export_suite (void)
{
  Suite *s = suite_create ("export");
  TCase *tc = tcase_create ("editor");

  tcase_add_unchecked_fixture (tc, pl_ui_test_app_setup, pl_ui_test_app_teardown);
  tcase_add_checked_fixture (tc, pl_tmpdir_setup, pl_tmpdir_teardown);
  tcase_set_timeout (tc, 120);
  tcase_add_test (tc, test_export_action);
  tcase_add_test (tc, test_export_dialog);
  tcase_add_test (tc, test_print_export);
  tcase_add_test (tc, test_export_waits_for_stale_results);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  gtk_init ();
  return pl_check_run (export_suite ());
}
