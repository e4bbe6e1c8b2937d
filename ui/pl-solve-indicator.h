/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-solve-indicator.h: the run state in the header bar.  It only shows;
 * it never blocks anything.
 */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

typedef enum
{
  PL_SOLVE_STATE_NONE,      /* nothing to solve (an empty layout) */
  PL_SOLVE_STATE_FRESH,     /* every result belongs to the drawing */
  PL_SOLVE_STATE_SOLVING,   /* fast results fresh; cycle and shutdown running */
  PL_SOLVE_STATE_STALE,     /* the results shown are of an older drawing */
  PL_SOLVE_STATE_ERROR,     /* a solve failed; the tooltip says why */
} PlSolveState;

#define PL_TYPE_SOLVE_INDICATOR (pl_solve_indicator_get_type ())
G_DECLARE_FINAL_TYPE (PlSolveIndicator, pl_solve_indicator, PL, SOLVE_INDICATOR, GtkWidget)

GtkWidget *pl_solve_indicator_new (void);
/* reason: the failure for ERROR (may be NULL otherwise). */
void pl_solve_indicator_set_state (PlSolveIndicator *self, PlSolveState state,
                                   const char *reason);
PlSolveState pl_solve_indicator_get_state (PlSolveIndicator *self);
/* The text shown beside the symbol (for tests). */
const char *pl_solve_indicator_get_text (PlSolveIndicator *self);

G_END_DECLS
