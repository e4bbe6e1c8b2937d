/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-baseline-table.h: the before/after table of a pinned baseline: one
 * row per gauge and applicator, for each figure the value before and
 * after and the change, signed and with an arrow (so it reads in black
 * and white) and coloured by direction.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-baseline.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_BASELINE_TABLE (pl_baseline_table_get_type ())
G_DECLARE_FINAL_TYPE (PlBaselineTable, pl_baseline_table, PL, BASELINE_TABLE, GtkWidget)

GtkWidget *pl_baseline_table_new (void);

/* Rebuilds the table from a comparison (pl_baseline_compare; a reference
 * is kept, NULL empties it). */
void pl_baseline_table_set_rows (PlBaselineTable *self, GArray *rows,
                                 const PlUnitPrefs *units);
/* The rows shown (borrowed, may be NULL) and the text of one change cell
 * ("▲ +2.1 bar"), NULL if the part has no row. */
GArray *pl_baseline_table_get_rows (PlBaselineTable *self);
const char *pl_baseline_table_get_change_text (PlBaselineTable *self, const char *part_id,
                                               PlBaselineFigure figure);

G_END_DECLS
