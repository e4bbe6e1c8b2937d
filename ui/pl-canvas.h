/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-canvas.h: the drawing area of a layout.
 *
 * The canvas owns a PlViewport and its event controllers; its snapshot()
 * calls pl_render_document() and never changes the model.  Every edit it
 * makes (place, move, wire, rotate, flip, delete, paste) is a command
 * pushed on the undo stack it was given.
 *
 * Gestures (primary button): click selects (Shift adds or removes), a drag
 * on empty paper draws a rubber band, a drag on a part moves the selection
 * (snapped to the grid, one undo step per drag), a drag from a port draws a
 * wire to another port.  Middle drag or Space + drag pans; Ctrl + wheel and
 * pinch zoom at the pointer.  An armed part type (pl_canvas_arm_type) is
 * placed where the next click lands; a part type key dropped on the canvas
 * (a G_TYPE_STRING drop) is placed where it falls.
 *
 * Signals:
 *   "selection-changed" (PlCanvas *)
 *   "armed-changed" (PlCanvas *): the armed type was set or cleared
 *   "message" (PlCanvas *, const char *text): a refusal to show briefly
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-document.h"
#include "pl-render.h"
#include "pl-results.h"
#include "pl-undo-stack.h"
#include "pl-units.h"
#include "pl-viewport.h"

G_BEGIN_DECLS

#define PL_TYPE_CANVAS (pl_canvas_get_type ())
G_DECLARE_FINAL_TYPE (PlCanvas, pl_canvas, PL, CANVAS, GtkWidget)

GtkWidget *pl_canvas_new (void);

/* The document to show and the stack its edits go to (references kept;
 * both NULL to show nothing).  Clears selection, drag and results, and
 * fits the view to the document at the next allocation. */
void pl_canvas_set_document (PlCanvas *self, PlDocument *doc, PlUndoStack *undo);
PlDocument *pl_canvas_get_document (PlCanvas *self);

/* The scheduler's newest fast and full snapshots (either may be NULL).  The
 * canvas draws the full one when its revision is the document's, else the
 * fast one, and marks the drawing stale when neither is current. */
void pl_canvas_set_results (PlCanvas *self, PlResults *fast, PlResults *full);
/* The snapshot the last draw used, and whether it was drawn as stale. */
PlResults *pl_canvas_get_shown_results (PlCanvas *self, gboolean *stale);

void pl_canvas_set_units (PlCanvas *self, const PlUnitPrefs *prefs);
void pl_canvas_set_style (PlCanvas *self, PlRenderStyle style);
PlRenderStyle pl_canvas_get_style (PlCanvas *self);

/* --- view --- */
const PlViewport *pl_canvas_get_viewport (PlCanvas *self);
/* factor about the centre of the widget (zoom in, out) */
void pl_canvas_zoom (PlCanvas *self, double factor);
/* Zoom at a widget point (px), as Ctrl + wheel does. */
void pl_canvas_zoom_at (PlCanvas *self, double factor, double x, double y);
void pl_canvas_zoom_reset (PlCanvas *self);
void pl_canvas_zoom_fit (PlCanvas *self);

/* --- selection --- */
/* The selected ids (parts, wires, notes) in document order, a new
 * NULL-terminated array (g_strfreev). */
char **pl_canvas_get_selection (PlCanvas *self);
/* Replaces the selection with the ids that exist (NULL or empty: none). */
void pl_canvas_select (PlCanvas *self, const char *const *ids);
void pl_canvas_select_all (PlCanvas *self);

/* --- edits (all through the undo stack; FALSE and a "message" when the
 * stack refuses or there is nothing to do) --- */
gboolean pl_canvas_delete_selection (PlCanvas *self);
gboolean pl_canvas_rotate_selection (PlCanvas *self);
gboolean pl_canvas_flip_selection (PlCanvas *self);
/* Keeps the selected parts, their values and the wires between them. */
gboolean pl_canvas_copy (PlCanvas *self);
gboolean pl_canvas_can_paste (PlCanvas *self);
/* Adds the copied parts with new ids and tags, shifted so they do not sit
 * on the originals, keeps their internal wires, and selects them. */
gboolean pl_canvas_paste (PlCanvas *self);

/* Adds a part of that type at world point p (snapped) and selects it;
 * returns its new id (owned by the caller) or NULL with a "message". */
char *pl_canvas_place_part (PlCanvas *self, const char *type_key, PlPoint p);
/* Joins two ports by a wire as a dragged wire would, with the same
 * refusals; returns the new wire id (owned) or NULL with a "message". */
char *pl_canvas_connect (PlCanvas *self, const char *part_a, const char *port_a,
                         const char *part_b, const char *port_b);

/* Arms a part type (NULL: disarm): the next primary click places it. */
void pl_canvas_arm_type (PlCanvas *self, const char *type_key);
const char *pl_canvas_get_armed_type (PlCanvas *self);
/* Escape: ends a drag without its edit, or disarms.  TRUE if anything was
 * cancelled. */
gboolean pl_canvas_cancel (PlCanvas *self);

/* --- the primary-button gesture, callable by tests and scripts (widget
 * pixels).  press / motion / release are what the drag gesture calls. --- */
void pl_canvas_pointer_press (PlCanvas *self, double x, double y, GdkModifierType mods);
void pl_canvas_pointer_motion (PlCanvas *self, double x, double y);
void pl_canvas_pointer_release (PlCanvas *self, double x, double y);

/* --- frame statistics (test builds, PRESSLINE_FRAME_STATS=1) ---
 * The longest interval (µs) between two frame-clock ticks since the last
 * reset while a drag was active, and how many ticks were seen. */
void pl_canvas_reset_frame_stats (PlCanvas *self);
gint64 pl_canvas_get_max_frame_interval (PlCanvas *self, guint *n_ticks);
/* Draws counted since construction (each snapshot() is one). */
guint pl_canvas_get_n_draws (PlCanvas *self);

G_END_DECLS
