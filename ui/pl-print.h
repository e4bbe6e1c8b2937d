/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-print.h: printing the work order through GtkPrintOperation, with the
 * same sheets as the export (app/pl-work-order.h).
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-window.h"
#include "pl-work-order.h"

G_BEGIN_DECLS

/* A work order of the window's document as it is now, on a sheet of
 * width x height mm in the window's units, with results: full results of
 * the present revision (pl_results_wait gives them without blocking the
 * main loop).  The document is copied, so later edits do not touch the
 * sheets. */
PlWorkOrder *pl_print_make_work_order (PlWindow *window, PlResults *results, double width_mm,
                                       double height_mm);

/* Prints the work order with results (as above): action is
 * GTK_PRINT_OPERATION_ACTION_PRINT_DIALOG for the editor's Print command,
 * or _EXPORT with export_filename (a PDF) for tests.  Blocks until the
 * dialog is done.  The result of gtk_print_operation_run; with _ERROR,
 * error says why. */
GtkPrintOperationResult pl_print_run (PlWindow *window, PlResults *results,
                                      GtkPrintOperationAction action,
                                      const char *export_filename, GError **error);

G_END_DECLS
