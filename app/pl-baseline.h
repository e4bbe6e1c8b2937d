/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-baseline.h: a pinned results snapshot and its comparison with the
 * current results, part by part, for "before" and "after" a change.
 *
 * Pinning keeps a reference to the snapshot (which never changes) and the
 * tag and kind of every gauge and applicator of the document it belongs
 * to, so a part that is removed later still has a name in the table.  The
 * comparison matches parts by id: a part in both is compared figure by
 * figure, a part only in the current document is "added" (no before), one
 * only in the pinned document is "removed" (no after).  A figure that one
 * side lacks (a part left out of the solve, the cycle not run yet) is NaN
 * there, and so is its difference.  Values are SI: Pa gauge, kg.
 */
#pragma once

#include <glib-object.h>

#include "pl-document.h"
#include "pl-part-type.h"
#include "pl-results.h"

G_BEGIN_DECLS

/* The figures compared at each gauge and applicator (at a gauge's
 * connection, at an applicator's inlet). */
typedef enum
{
  PL_BASELINE_IDLE,          /* pressure with every applicator shut, Pa */
  PL_BASELINE_STEADY_OPEN,   /* pressure with every applicator held open, Pa */
  PL_BASELINE_CYCLE_MIN,     /* lowest pressure over the firing cycle, Pa */
  PL_BASELINE_SHOT_MASS,     /* mass per shot, kg (applicators only) */
  PL_BASELINE_N_FIGURES
} PlBaselineFigure;

typedef enum
{
  PL_BASELINE_KEPT,          /* in both */
  PL_BASELINE_ADDED,         /* only in the current document */
  PL_BASELINE_REMOVED,       /* only in the pinned one */
} PlBaselineChange;

typedef struct
{
  char *part_id;
  char *tag;                 /* the current tag, or the pinned one if removed */
  PlPartKind kind;           /* PL_PART_GAUGE or PL_PART_APPLICATOR */
  PlBaselineChange change;
  double before[PL_BASELINE_N_FIGURES];   /* NaN: not known */
  double after[PL_BASELINE_N_FIGURES];
  double difference[PL_BASELINE_N_FIGURES]; /* after - before, NaN unless both */
} PlBaselineRow;

#define PL_TYPE_BASELINE (pl_baseline_get_type ())
G_DECLARE_FINAL_TYPE (PlBaseline, pl_baseline, PL, BASELINE, GObject)

/* Pins results, which must belong to doc's present revision (NULL and a
 * critical warning otherwise). */
PlBaseline *pl_baseline_new (PlDocument *doc, PlResults *results);
PlResults *pl_baseline_get_results (PlBaseline *baseline);     /* borrowed */

/* The table against doc and its current results (NULL or of another
 * revision: every after is NaN): rows of the current document's gauges
 * and applicators in document order, then the removed ones in pinned
 * order.  A GArray of PlBaselineRow that clears its rows when freed. */
GArray *pl_baseline_compare (PlBaseline *baseline, PlDocument *doc, PlResults *results);

/* Stable ASCII keys: "idle", "steady_open", "cycle_min", "shot_mass";
 * NULL out of range. */
const char *pl_baseline_figure_get_key (PlBaselineFigure figure);

G_END_DECLS
