/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-param-row.h: one editable parameter of a part, the scenario or the
 * title block: its label, an editor that fits its kind, its unit in the
 * user's preferences and, below, the reason when a value was refused.
 *
 * Numbers sit in a spin button that reads what a person types with units
 * ("1/2 in", "2500 psi", "12,5 mm") and that steps continuously while its
 * arrows are held or the wheel turns; a run of steps is one undo step.
 * Choices are drop-downs, booleans switches, texts entries.  Every change
 * is a command pushed on the undo stack; a refused value leaves the
 * document as it was and shows the refusal's sentence beside the field.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-undo-stack.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_PARAM_ROW (pl_param_row_get_type ())
G_DECLARE_FINAL_TYPE (PlParamRow, pl_param_row, PL, PARAM_ROW, GtkBox)

/* A row for spec of the item item_id ("p3", "scenario", "title"); keeps
 * references to doc and undo; prefs is copied (NULL: SI).  The special key
 * NULL for spec makes the row edit the part's tag. */
GtkWidget *pl_param_row_new (PlDocument *doc, PlUndoStack *undo, const PlUnitPrefs *prefs,
                             const char *item_id, const PlParamSpec *spec);

const PlParamSpec *pl_param_row_get_spec (PlParamRow *self);
const char *pl_param_row_get_item_id (PlParamRow *self);
/* The widget that edits the value (spin button, drop-down, switch, entry). */
GtkWidget *pl_param_row_get_editor (PlParamRow *self);

/* Shows the document's present value.  A value that the user typed and
 * that was refused stays in the field (with its reason) until the
 * document's value changes. */
void pl_param_row_sync (PlParamRow *self);

/* Reads text as the user would type it and, if it is a fitting value,
 * pushes the change.  FALSE, with the reason shown, otherwise.  For numbers,
 * tags and texts; what pressing Enter in the field does. */
gboolean pl_param_row_commit_text (PlParamRow *self, const char *text);

/* The refusal shown beside the field, or NULL. */
const char *pl_param_row_get_reason (PlParamRow *self);

G_END_DECLS
