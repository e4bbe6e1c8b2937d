/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results-wait.h: waiting for the full results (cycle and shutdown) of
 * a window's document before a work order is made, without blocking the
 * main loop.
 *
 * When the newest full results belong to the document's present revision
 * the callback runs at once.  Otherwise a small modal dialog with a
 * spinner and a Cancel button stays up while the scheduler's worker runs;
 * the editor keeps drawing.  The callback gets the first full results
 * that match the document as it is when they arrive (an edit meanwhile
 * waits for its own solve), or NULL when the user cancelled or the window
 * went away.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-results.h"
#include "pl-window.h"

G_BEGIN_DECLS

typedef void (*PlResultsReadyFunc) (PlWindow *window, PlResults *results, gpointer data);

/* title: the dialog's title (translated), the action it waits for.
 * destroy (may be NULL) frees data after func has run. */
void pl_results_wait (PlWindow *window, const char *title, PlResultsReadyFunc func,
                      gpointer data, GDestroyNotify destroy);

/* For tests: the waiting dialog of window, or NULL when none is up. */
GtkWindow *pl_results_wait_get_dialog (PlWindow *window);

G_END_DECLS
