/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results-panel.h: the results below the canvas.
 *
 * Four pages: "points" (per part and port: idle, steady-open, cycle minimum
 * and maximum, recovery), "parts" (flows, velocity, Reynolds number, shot
 * mass and deviation, pump and accumulator figures), "plot" (chosen ports
 * over one firing cycle and over the shutdown) and "findings" (severity and
 * a sentence; activating one names its part).  Rows and tags come from the
 * snapshot the numbers come from, so an edit never shows new parts beside
 * old figures; stale snapshots are shown dimmed under "Results out of date".
 *
 * Updates are incremental: a new snapshot changes the cells of the rows on
 * screen in place (the rows stay) and new rows are made only when the set
 * of parts and ports changes; only the visible page follows, once a frame
 * however many snapshots arrive; a hidden page catches up when shown.  The
 * getters below bring their page up to date first, so they always answer
 * for the latest snapshot.
 *
 * Signal "part-activated" (PlResultsPanel *, const char *part_id, gpointer):
 * a finding or a table row was activated (click, Enter).
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-plot.h"
#include "pl-results.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_RESULTS_PANEL (pl_results_panel_get_type ())
G_DECLARE_FINAL_TYPE (PlResultsPanel, pl_results_panel, PL, RESULTS_PANEL, GtkWidget)

typedef enum
{
  PL_RESULTS_TABLE_POINTS,
  PL_RESULTS_TABLE_PARTS,
  PL_RESULTS_TABLE_FINDINGS,
  PL_N_RESULTS_TABLES
} PlResultsTable;

GtkWidget *pl_results_panel_new (void);

/* doc (a reference is kept; may be NULL) and the units (copied; NULL: SI). */
void pl_results_panel_set_context (PlResultsPanel *self, PlDocument *doc,
                                   const PlUnitPrefs *prefs);
/* fast: idle and steady-open; full: with cycle and shutdown (either may be
 * NULL).  Cycle figures show only when full is of fast's revision. */
void pl_results_panel_set_results (PlResultsPanel *self, PlResults *fast, PlResults *full,
                                   gboolean stale);

/* Shows a page by name: "points", "parts", "plot", "findings". */
void pl_results_panel_show_page (PlResultsPanel *self, const char *name);

/* --- for tests, and for the window's own use --- */
guint pl_results_panel_get_n_rows (PlResultsPanel *self, PlResultsTable table);
/* The text of a cell (findings: column 0 is the severity, 1 the sentence),
 * or NULL out of range. */
const char *pl_results_panel_get_cell (PlResultsPanel *self, PlResultsTable table, guint row,
                                       guint column);
const char *pl_results_panel_get_row_part_id (PlResultsPanel *self, PlResultsTable table,
                                              guint row);
/* The GtkColumnView of a table or the GtkListView of the findings. */
GtkWidget *pl_results_panel_get_view (PlResultsPanel *self, PlResultsTable table);
/* The cycle plot (shutdown FALSE) or the shutdown plot. */
PlPlot *pl_results_panel_get_plot (PlResultsPanel *self, gboolean shutdown);
/* Which ports the plots show, as "part-id/port-key" (NULL-terminated;
 * NULL: the default, every gauge and applicator). */
void pl_results_panel_set_plotted (PlResultsPanel *self, const char *const *ports);
gboolean pl_results_panel_get_stale (PlResultsPanel *self);
/* How many times a table's rows were replaced as a whole (a new row set,
 * or for the findings a changed list). */
guint pl_results_panel_get_n_rebuilds (PlResultsPanel *self, PlResultsTable table);

G_END_DECLS
