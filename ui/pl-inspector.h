/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-inspector.h: the panel beside the canvas that shows and edits the
 * selection.
 *
 * One part: its tag, its type and every parameter of its type (those that
 * its present choices make irrelevant are hidden), then its live results.
 * Several parts: how many and which (editing several at once is left to
 * the canvas's own commands).  Nothing selected: the scenario (fluid, air,
 * firing schedule, tolerances) and the title block, then a summary of the
 * results.  Results marked stale are shown greyed under "Results out of
 * date".
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-results.h"
#include "pl-undo-stack.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_INSPECTOR (pl_inspector_get_type ())
G_DECLARE_FINAL_TYPE (PlInspector, pl_inspector, PL, INSPECTOR, GtkWidget)

GtkWidget *pl_inspector_new (void);

/* The document to edit through undo (references kept; both NULL to let
 * go) and the units to show (copied; NULL: SI).  Clears the selection. */
void pl_inspector_set_context (PlInspector *self, PlDocument *doc, PlUndoStack *undo,
                               const PlUnitPrefs *prefs);
/* NULL-terminated part ids; NULL or empty: the scenario and title block. */
void pl_inspector_set_selection (PlInspector *self, const char *const *part_ids);
/* The results to show for the selection (a reference is kept; NULL: none). */
void pl_inspector_set_results (PlInspector *self, PlResults *results, gboolean stale);

/* For tests and the window: the row editing key of the shown item ("tag"
 * for the tag), or NULL. */
GtkWidget *pl_inspector_get_row (PlInspector *self, const char *key);
/* The title shown at the top ("H2", "Scenario", "3 parts selected"). */
const char *pl_inspector_get_title (PlInspector *self);
/* The results section as "label\tvalue" lines, for tests and screen
 * readers' summaries; newly allocated. */
char *pl_inspector_dup_results_text (PlInspector *self);
gboolean pl_inspector_get_results_stale (PlInspector *self);

G_END_DECLS
