/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-export-dialog.h: "Export Work Order…": format, paper, orientation and
 * resolution, then a file chooser; and the export itself, which the
 * window's "export-work-order-to" action runs without any dialog.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-window.h"
#include "pl-work-order.h"

G_BEGIN_DECLS

/* What an export is made with; the dialog remembers the last choice for
 * the process's life. */
typedef struct
{
  PlWorkOrderFormat format;
  PlPaper paper;
  PlOrientation orientation;
  double dpi;
} PlExportSettings;

/* The settings the next dialog starts from (PDF, A4, orientation auto,
 * 150 dpi at first).  Borrowed, never NULL. */
const PlExportSettings *pl_export_dialog_get_settings (void);

/* Shows the dialog for window; the chosen file is written through
 * pl_export_dialog_write, a failure shown in an error dialog. */
void pl_export_dialog_show (PlWindow *window);

/* Writes the window's work order with results (full results of the
 * present revision) to file with settings, the format from
 * the file's extension when it has one of ours (else settings->format).
 * FALSE with error naming the file; nothing half written.  Sheets an
 * earlier export left beyond the new count are removed
 * (pl_work_order_write_full); removed (may be NULL) gets their names. */
gboolean pl_export_dialog_write (PlWindow *window, PlResults *results, GFile *file,
                                 const PlExportSettings *settings, GPtrArray *removed,
                                 GError **error);

/* The same once the full results are there (pl_results_wait: a spinner
 * and a Cancel while they are not), then a toast, or an error dialog.  A
 * copy of settings is taken. */
void pl_export_dialog_write_when_solved (PlWindow *window, GFile *file,
                                         const PlExportSettings *settings);

/* "Work order written to NAME", and the sheets removed if any: what the
 * window's toast says after an export.  Newly allocated. */
char *pl_export_dialog_describe (GFile *file, GPtrArray *removed);

G_END_DECLS
