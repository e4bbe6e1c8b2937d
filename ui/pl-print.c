/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-print.c: the work order on a printer.  begin-print lays the sheets out
 * for the paper chosen in the dialog and sets the page count; draw-page
 * draws sheet N into the print context's cairo context, whose user units
 * are mm.
 */
#include "config.h"

#include "pl-print.h"

#include <glib/gi18n.h>

#include "pl-window-private.h"

PlWorkOrder *
pl_print_make_work_order (PlWindow *window, PlResults *results, double width_mm,
                          double height_mm)
{
  PlDocument *doc = pl_window_get_document (window);
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_autofree char *path = NULL;
  PlWorkOrderOptions opts;

  g_return_val_if_fail (results != NULL, NULL);
  pl_work_order_options_init (&opts);
  opts.width_mm = width_mm;
  opts.height_mm = height_mm;
  opts.units = window->units;
  if (pl_window_get_file (window) != NULL)
    path = g_file_get_path (pl_window_get_file (window));
  opts.file_name = path;
  return pl_work_order_new (copy, results, &opts);
}

static void
begin_print_cb (GtkPrintOperation *op, GtkPrintContext *context, gpointer data)
{
  PlWindow *window = data;
  PlResults *results = g_object_get_data (G_OBJECT (op), "pl-results");
  /* In mm (the operation's unit), the whole paper (full page). */
  PlWorkOrder *wo = pl_print_make_work_order (window, results,
                                              gtk_print_context_get_width (context),
                                              gtk_print_context_get_height (context));

  g_object_set_data_full (G_OBJECT (op), "pl-work-order", wo, g_object_unref);
  gtk_print_operation_set_n_pages (op, (int) pl_work_order_get_n_sheets (wo));
}

static void
draw_page_cb (GtkPrintOperation *op, GtkPrintContext *context, int page_nr, gpointer data)
{
  PlWorkOrder *wo = g_object_get_data (G_OBJECT (op), "pl-work-order");
  cairo_t *cr = gtk_print_context_get_cairo_context (context);

  if (wo == NULL || page_nr < 0 || (guint) page_nr >= pl_work_order_get_n_sheets (wo))
    return;
  /* The context's user units are mm already (gtk_print_operation_set_unit). */
  pl_work_order_draw_sheet (wo, cr, (guint) page_nr);
}

static void
end_print_cb (GtkPrintOperation *op, GtkPrintContext *context, gpointer data)
{
  g_object_set_data (G_OBJECT (op), "pl-work-order", NULL);
}

GtkPrintOperationResult
pl_print_run (PlWindow *window, PlResults *results, GtkPrintOperationAction action,
              const char *export_filename, GError **error)
{
  g_autoptr (GtkPrintOperation) op = gtk_print_operation_new ();
  const char *number = pl_part_get_text (pl_document_get_title (pl_window_get_document (window)),
                                         "work-order");
  g_autofree char *job = *number != '\0'
                         /* Translators: the print job's name, with the work order's number. */
                         ? g_strdup_printf (_("Work order %s"), number)
                         : g_strdup (_("Work order"));

  g_return_val_if_fail (PL_IS_WINDOW (window), GTK_PRINT_OPERATION_RESULT_ERROR);
  g_return_val_if_fail (results != NULL, GTK_PRINT_OPERATION_RESULT_ERROR);

  gtk_print_operation_set_job_name (op, job);
  /* Sheets have their own margins: draw on the whole paper. */
  gtk_print_operation_set_use_full_page (op, TRUE);
  gtk_print_operation_set_unit (op, GTK_UNIT_MM);
  gtk_print_operation_set_embed_page_setup (op, TRUE);
  if (export_filename != NULL)
    gtk_print_operation_set_export_filename (op, export_filename);
  g_object_set_data_full (G_OBJECT (op), "pl-results", pl_results_ref (results),
                          (GDestroyNotify) pl_results_unref);
  g_signal_connect (op, "begin-print", G_CALLBACK (begin_print_cb), window);
  g_signal_connect (op, "draw-page", G_CALLBACK (draw_page_cb), window);
  g_signal_connect (op, "end-print", G_CALLBACK (end_print_cb), window);
  return gtk_print_operation_run (op, action, GTK_WINDOW (window), error);
}
