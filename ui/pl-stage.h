/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-stage.h: a read-only view of a layout for presenting: always fitted
 * to the whole drawing, results drawn at a replay instant, no editing.
 *
 * It draws the newest snapshot whose revision is the document's (the full
 * one when current, else the fast one), so a replay shows the last cycle
 * as soon as the worker has delivered it and steady pressures until then.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-render.h"
#include "pl-results.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_STAGE (pl_stage_get_type ())
G_DECLARE_FINAL_TYPE (PlStage, pl_stage, PL, STAGE, GtkWidget)

GtkWidget *pl_stage_new (void);

/* References kept; NULL shows an empty sheet. */
void pl_stage_set_document (PlStage *self, PlDocument *doc);
void pl_stage_set_results (PlStage *self, PlResults *fast, PlResults *full);
void pl_stage_set_units (PlStage *self, const PlUnitPrefs *units);
/* The instant drawn (NaN: steady-open pressures). */
void pl_stage_set_replay (PlStage *self, PlRun run, double time);
/* The snapshot drawn (borrowed), or NULL. */
PlResults *pl_stage_get_shown_results (PlStage *self);
/* Draws since construction (each snapshot() is one). */
guint pl_stage_get_n_draws (PlStage *self);

G_END_DECLS
