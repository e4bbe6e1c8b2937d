/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-window.h: the main window: header bar, parts shelf, canvas,
 * inspector and results, one layout document and its live solves.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-application.h"
#include "pl-document.h"
#include "pl-solve-scheduler.h"
#include "pl-undo-stack.h"

G_BEGIN_DECLS

#define PL_TYPE_WINDOW (pl_window_get_type ())
G_DECLARE_FINAL_TYPE (PlWindow, pl_window, PL, WINDOW, GtkApplicationWindow)

PlWindow *pl_window_new (PlApplication *app);

/* Reads a layout into this window (no confirmation: the caller asks
 * first).  On failure the current document stays as it was and error
 * holds the reader's message, which names FILE:LINE. */
gboolean pl_window_load_file (PlWindow *self, GFile *file, GError **error);
/* The same, showing a failure in an error dialog. */
void pl_window_open_file (PlWindow *self, GFile *file);
/* Writes the document to file and makes it this window's file.  FALSE with
 * error (naming the file) if the save failed; the document is unchanged. */
gboolean pl_window_save_to_file (PlWindow *self, GFile *file, GError **error);

/* Borrowed; for the application and the tests. */
PlDocument *pl_window_get_document (PlWindow *self);
PlUndoStack *pl_window_get_undo_stack (PlWindow *self);
PlSolveScheduler *pl_window_get_scheduler (PlWindow *self);
GFile *pl_window_get_file (PlWindow *self);
gboolean pl_window_get_dirty (PlWindow *self);
GtkWidget *pl_window_get_canvas (PlWindow *self);
GtkWidget *pl_window_get_shelf (PlWindow *self);
GtkWidget *pl_window_get_inspector (PlWindow *self);
GtkWidget *pl_window_get_results_panel (PlWindow *self);
GtkWidget *pl_window_get_indicator (PlWindow *self);
/* The text of the brief message over the canvas ("" when none shown). */
const char *pl_window_get_toast (PlWindow *self);

G_END_DECLS
