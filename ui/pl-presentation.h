/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-presentation.h: the presentation mode for a class: a full-screen
 * window with large type and high contrast, the layout on a stage that
 * follows a slow-motion replay of the firing cycle or the shutdown, the
 * chosen gauges and applicators as big readouts at the replay instant, a
 * transport bar (play/pause, speed, time scrubber, cycle or shutdown),
 * quick what-if controls and a pinned baseline with its before/after
 * table.  It shows the editor's own document, undo stack and scheduler:
 * what-if edits are ordinary undoable edits of that document.
 *
 * Keys: Space plays or pauses, Escape or F5 leaves.  Actions
 * (prefix "presentation."): play-pause, pin, unpin, leave.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-baseline-table.h"
#include "pl-document.h"
#include "pl-readouts.h"
#include "pl-replay.h"
#include "pl-solve-scheduler.h"
#include "pl-stage.h"
#include "pl-undo-stack.h"
#include "pl-units.h"
#include "pl-what-if.h"

G_BEGIN_DECLS

#define PL_TYPE_PRESENTATION (pl_presentation_get_type ())
G_DECLARE_FINAL_TYPE (PlPresentation, pl_presentation, PL, PRESENTATION, GtkWindow)

/* A presentation of doc (edits go to undo; results come from scheduler,
 * which must watch doc), transient for parent and destroyed with it.
 * fullscreen: take the whole screen (tests may say FALSE). */
PlPresentation *pl_presentation_new (GtkWindow *parent, PlDocument *doc, PlUndoStack *undo,
                                     PlSolveScheduler *scheduler, const PlUnitPrefs *units,
                                     gboolean fullscreen);

/* --- for tests (borrowed) --- */
PlStage *pl_presentation_get_stage (PlPresentation *self);
GtkRange *pl_presentation_get_scrubber (PlPresentation *self);
GtkDropDown *pl_presentation_get_speed (PlPresentation *self);
GtkToggleButton *pl_presentation_get_run_button (PlPresentation *self, PlRun run);
PlWhatIf *pl_presentation_get_what_if (PlPresentation *self);
PlBaselineTable *pl_presentation_get_baseline_table (PlPresentation *self);
PlBaseline *pl_presentation_get_baseline (PlPresentation *self);
const PlReplay *pl_presentation_get_replay (PlPresentation *self);
/* The big value of a part's readout ("141 bar"), NULL if none. */
const char *pl_presentation_get_readout (PlPresentation *self, const char *part_id);
/* Frame-clock ticks while playing since the last reset: how many, their
 * mean and longest interval (us). */
void pl_presentation_reset_frame_stats (PlPresentation *self);
guint pl_presentation_get_frame_stats (PlPresentation *self, double *mean_us, gint64 *max_us);

G_END_DECLS
