/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-what-if.h: quick controls for what a class plays with -- the supply
 * hose's bore and length, the fluid's viscosity, whether the accumulator
 * is there and its precharge, the air pressure, the applicators' on-time.
 *
 * Every change is a document command pushed on the undo stack, so it is
 * undone like any edit and the document solves live while a slider is
 * dragged.  Changes of one control that follow each other within
 * PL_WHAT_IF_MERGE_MS are folded into one undo step (one drag, one step).
 * Removing the accumulator is a remove command; putting it back re-adds
 * the same part with its values and wires, as a second step.  On a layout
 * that never had one, switching it on fits one as a what-if step (see
 * pl-accumulator-fit.h): at the applicators' feed node, sized from the
 * fresh fast results, with the precharge control's value.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-solve-scheduler.h"
#include "pl-undo-stack.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_WHAT_IF_MERGE_MS 600

/* The controls' keys. */
#define PL_WHAT_IF_HOSE_BORE "hose-bore"
#define PL_WHAT_IF_HOSE_LENGTH "hose-length"
#define PL_WHAT_IF_VISCOSITY "viscosity"
#define PL_WHAT_IF_PRECHARGE "precharge"
#define PL_WHAT_IF_AIR_PRESSURE "air-pressure"
#define PL_WHAT_IF_ON_TIME "on-time"

#define PL_TYPE_WHAT_IF (pl_what_if_get_type ())
G_DECLARE_FINAL_TYPE (PlWhatIf, pl_what_if, PL, WHAT_IF, GtkWidget)

GtkWidget *pl_what_if_new (void);

/* The document and the stack its edits go to (references kept). */
void pl_what_if_set_document (PlWhatIf *self, PlDocument *doc, PlUndoStack *undo);
void pl_what_if_set_units (PlWhatIf *self, const PlUnitPrefs *units);
/* Where the fast results for sizing a fitted accumulator come from
 * (a reference is kept; NULL: none can be fitted). */
void pl_what_if_set_scheduler (PlWhatIf *self, PlSolveScheduler *scheduler);

/* For tests: a control's slider (NULL for an unknown key) and the
 * accumulator's switch. */
GtkRange *pl_what_if_get_control (PlWhatIf *self, const char *key);
GtkSwitch *pl_what_if_get_accumulator_switch (PlWhatIf *self);
/* The last refusal shown ("" when none). */
const char *pl_what_if_get_message (PlWhatIf *self);
/* What the last fitted accumulator got and by which rule ("" when none is
 * shown). */
const char *pl_what_if_get_fit_note (PlWhatIf *self);

G_END_DECLS
