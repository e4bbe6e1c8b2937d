/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-readouts.h: the big readouts of the presentation mode, one for each
 * gauge (at its connection) and applicator (at its inlet) of a document:
 * the pressure at the replay instant, and under it the lowest pressure of
 * the cycle (or, in the shutdown, the idle pressure it starts from).  A
 * list of check buttons (pl_readouts_get_choices) chooses which are shown.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-results-series.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_READOUTS (pl_readouts_get_type ())
G_DECLARE_FINAL_TYPE (PlReadouts, pl_readouts, PL, READOUTS, GtkWidget)

GtkWidget *pl_readouts_new (void);

/* Rebuilds the readouts for doc's gauges and applicators now and whenever
 * parts or tags change (a reference is kept; NULL: none). */
void pl_readouts_set_document (PlReadouts *self, PlDocument *doc);
/* Fills them in: at time t of run from full (the present revision's
 * cycle and shutdown, may be NULL), else the steady-open pressures of
 * any (the present revision's newest snapshot, may be NULL). */
void pl_readouts_update (PlReadouts *self, PlResults *full, PlResults *any, PlRun run,
                         double t, const PlUnitPrefs *units);
/* The check buttons that show and hide each readout (owned by self; for a
 * popover). */
GtkWidget *pl_readouts_get_choices (PlReadouts *self);
/* The big value of a part's readout ("141 bar"), NULL if none. */
const char *pl_readouts_get_value (PlReadouts *self, const char *part_id);

G_END_DECLS
