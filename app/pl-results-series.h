/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results-series.h: a snapshot's figures at an instant of its firing
 * cycle or shutdown, read from the solver's evenly spaced samples
 * (pressline-solver.h) by linear interpolation between the two samples
 * around the instant.  The cycle is periodic, so a time wraps round it;
 * the shutdown runs once, so a time is held within [0, its length].
 *
 * Lookups return FALSE, as those of pl-results.h do, when the part, port
 * or element does not exist, when the part was left out of the solve, or
 * when the run has not run (yet).  Values are SI: Pa gauge, m^3/s, s.
 */
#pragma once

#include "pl-results.h"

G_BEGIN_DECLS

typedef enum
{
  PL_RUN_CYCLE,          /* the last firing cycle, periodic */
  PL_RUN_SHUTDOWN,       /* from the air going off, once */
  PL_N_RUNS
} PlRun;

/* Stable ASCII keys: "cycle", "shutdown"; NULL out of range. */
const char *pl_run_get_key (PlRun run);

/* How long the run's samples last (s): the cycle's period, the span of the
 * shutdown that was followed. */
gboolean pl_results_get_run_length (const PlResults *results, PlRun run, double *out);
/* Pressure at a port at time t (s) of the run. */
gboolean pl_results_get_port_pressure_at (const PlResults *results, const char *part_id,
                                          const char *port_key, PlRun run, double t,
                                          double *out);
/* Flow of the part's element in slot at time t, signed as
 * pl_results_get_flow. */
gboolean pl_results_get_flow_at (const PlResults *results, const char *part_id, guint slot,
                                 PlRun run, double t, double *out);
/* The time of the run's lowest sampled pressure at a port (s), and that
 * pressure (either may be NULL). */
gboolean pl_results_get_port_min_time (const PlResults *results, const char *part_id,
                                       const char *port_key, PlRun run, double *time,
                                       double *pressure);

G_END_DECLS
