/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results.h: an immutable snapshot of everything the solver said about
 * one revision of a document, addressable by part id and port key.
 *
 * A snapshot holds the compiled network (pl-compile.h), the idle and
 * steady-open solutions, and -- once the worker has run them -- the firing
 * cycle and the shutdown, plus every finding mapped to a part.  It never
 * changes after it is made and is reference counted atomically (a boxed
 * GType for signals), so the main loop and a worker may share one.
 *
 * Missing numbers are not errors: a lookup returns FALSE when the part,
 * port or element does not exist, when that part was left out of the solve
 * (unreached, refused), or when the cycle or shutdown has not run (yet).
 * Values are SI: Pa gauge, m^3/s, m/s, kg, s.
 */
#pragma once

#include <gio/gio.h>
#include <glib-object.h>

#include "pl-compile.h"
#include "pressline-solver.h"

G_BEGIN_DECLS

typedef struct _PlResults PlResults;

#define PL_TYPE_RESULTS (pl_results_get_type ())
GType pl_results_get_type (void) G_GNUC_CONST;

/* The two steady cases. */
typedef enum
{
  PL_CASE_IDLE,          /* every applicator shut, air as the scenario says */
  PL_CASE_STEADY_OPEN,   /* every applicator held open */
  PL_N_CASES
} PlSteadyCase;

/* Which pressure of a port. */
typedef enum
{
  PL_PRESSURE_IDLE,
  PL_PRESSURE_STEADY_OPEN,
  PL_PRESSURE_CYCLE_MIN,
  PL_PRESSURE_CYCLE_MAX,
  PL_PRESSURE_CYCLE_MEAN,
  PL_N_PRESSURES
} PlPressureKind;

/* Where the time-domain half of a snapshot stands. */
typedef enum
{
  PL_TRANSIENT_PENDING,  /* fast results only: the worker has not delivered */
  PL_TRANSIENT_DONE,     /* cycle and shutdown were run (either may have failed:
                          * then a "solve-failed" finding says why) */
  PL_TRANSIENT_SKIPPED,  /* nothing to run: no network or no steady solution */
} PlTransientState;

/* Stable ASCII keys: "idle", "steady_open", "cycle_min", "cycle_max",
 * "cycle_mean"; "pending", "done", "skipped".  NULL out of range. */
const char *pl_steady_case_get_key (PlSteadyCase c);
const char *pl_pressure_kind_get_key (PlPressureKind kind);
const char *pl_transient_state_get_key (PlTransientState state);

/* --- making snapshots --- */

/* Runs the idle and steady-open solves of compiled (both fast) and returns
 * a snapshot with the transient half PENDING (or SKIPPED when there is
 * nothing to solve).  Never NULL; solver failures become findings. */
PlResults *pl_results_solve_fast (PlCompiled *compiled);
/* The same, reusing the symbolic analysis kept in a steady workspace per
 * case (pressline-solver.h); workspaces[c] may be NULL (a plain solve).
 * Results are bit for bit those of pl_results_solve_fast.  A workspace
 * serves one thread at a time: the scheduler keeps its pair on the main
 * thread. */
PlResults *pl_results_solve_fast_with (PlCompiled *compiled,
                                       pls_steady_workspace *const workspaces[PL_N_CASES]);
/* Runs the cycle and the shutdown for fast's network and returns a new
 * snapshot that shares fast's steady half.  Checks cancellable before,
 * between and after the two runs (the solver itself cannot be interrupted):
 * NULL with G_IO_ERROR_CANCELLED if it fired.  A fast snapshot that is
 * SKIPPED comes back as another reference to itself. */
PlResults *pl_results_solve_full (PlResults *fast, GCancellable *cancellable,
                                  GError **error);
/* The same content under another document revision: for edits that do not
 * change what is solved (moves, bends). */
PlResults *pl_results_retag (PlResults *results, guint64 revision);

PlResults *pl_results_ref (PlResults *results);
void pl_results_unref (PlResults *results);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (PlResults, pl_results_unref)

/* --- what the snapshot is --- */

guint64 pl_results_get_revision (const PlResults *results);
PlCompiled *pl_results_get_compiled (const PlResults *results);   /* borrowed */
PlTransientState pl_results_get_transient_state (const PlResults *results);
/* Whether the steady solve of that case ran and met both tolerances. */
gboolean pl_results_get_converged (const PlResults *results, PlSteadyCase c);
/* The raw solver results (borrowed), or NULL when not solved / not run. */
const pls_steady_result *pl_results_get_steady (const PlResults *results, PlSteadyCase c);
const pls_cycle_result *pl_results_get_cycle (const PlResults *results);
const pls_shutdown_result *pl_results_get_shutdown (const PlResults *results);

/* --- lookups by part id and port key --- */

gboolean pl_results_get_port_pressure (const PlResults *results, const char *part_id,
                                       const char *port_key, PlPressureKind kind,
                                       double *out);
/* Seconds after the end of the last shot until the port's node is back
 * near its idle pressure; -1 if it does not recover within the cycle. */
gboolean pl_results_get_port_recovery (const PlResults *results, const char *part_id,
                                       const char *port_key, double *out);
/* Flow of the part's element in slot (0; a tee's legs 0 = a, 1 = b,
 * 2 = branch, each from the centre outwards), m^3/s, port 0 -> port 1 (an
 * applicator: out of the line; a pump: delivered). */
gboolean pl_results_get_flow (const PlResults *results, const char *part_id, guint slot,
                              PlSteadyCase c, double *out);
/* Hose or pipe. */
gboolean pl_results_get_line (const PlResults *results, const char *part_id,
                              PlSteadyCase c, pls_line_result *out);
/* Pump operating point. */
gboolean pl_results_get_pump (const PlResults *results, const char *part_id,
                              PlSteadyCase c, pls_pump_result *out);
gboolean pl_results_get_accumulator (const PlResults *results, const char *part_id,
                                     PlSteadyCase c, pls_accumulator_result *out);
/* Cycle figures (FALSE until the cycle has run). */
gboolean pl_results_get_accumulator_swing (const PlResults *results, const char *part_id,
                                           pls_cycle_accumulator *out);
gboolean pl_results_get_pump_cycle (const PlResults *results, const char *part_id,
                                    pls_cycle_pump *out);
/* Applicator: mass per shot (kg), its relative deviation from the mean of
 * all applicators, and the first shot from idle (any may be NULL). */
gboolean pl_results_get_shot (const PlResults *results, const char *part_id, double *mass,
                              double *deviation, double *first_mass);
/* Shutdown: time until every node that is not trapped is below the safe
 * pressure (s; -1 if not within the run).  FALSE until it has run. */
gboolean pl_results_get_shutdown_safe_time (const PlResults *results, double *out);

/* --- findings: compile, steady (idle, then open; duplicates folded),
 * cycle, shutdown, in that order --- */

guint pl_results_get_n_findings (const PlResults *results);
const PlFinding *pl_results_get_finding (const PlResults *results, guint index);
/* How many findings have at least that severity. */
guint pl_results_count_findings (const PlResults *results, pls_severity at_least);

G_END_DECLS
