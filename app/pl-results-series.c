/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results-series.c: a snapshot's figures at an instant of a run.
 */
#include "config.h"

#include "pl-results-series.h"

#include <math.h>

/* The run's samples as one view. */
typedef struct
{
  const pls_cycle_result *cycle;
  const pls_shutdown_result *shutdown;
  size_t n;
  double length;
} Series;

static gboolean
series_get (const PlResults *results, PlRun run, Series *s)
{
  *s = (Series) { 0 };
  if (run == PL_RUN_CYCLE && (s->cycle = pl_results_get_cycle (results)) != NULL)
    {
      s->n = pls_cycle_sample_count (s->cycle);
      s->length = s->n >= 2 ? pls_cycle_sample_time (s->cycle, s->n - 1) : 0.0;
    }
  else if (run == PL_RUN_SHUTDOWN && (s->shutdown = pl_results_get_shutdown (results)) != NULL)
    {
      s->n = pls_shutdown_sample_count (s->shutdown);
      s->length = s->n >= 2 ? pls_shutdown_sample_time (s->shutdown, s->n - 1) : 0.0;
    }
  return s->n >= 2 && isfinite (s->length) && s->length > 0.0;
}

/* Both runs' samples are evenly spaced from 0 to their length (the cycle:
 * pressline-solver.h; the shutdown: resampled so in pls-shutdown.c), so
 * the instant's neighbours are found by division. */
static gboolean
series_slot (const Series *s, double t, size_t *i, double *f)
{
  double idx;

  if (!isfinite (t))
    return FALSE;
  if (s->cycle != NULL)
    {
      t = fmod (t, s->length);
      if (t < 0.0)
        t += s->length;
    }
  else
    t = CLAMP (t, 0.0, s->length);
  idx = t / s->length * (double) (s->n - 1);
  *i = MIN ((size_t) idx, s->n - 2);
  *f = idx - (double) *i;
  return TRUE;
}

static double
series_pressure (const Series *s, int node, size_t i)
{
  return s->cycle != NULL ? pls_cycle_sample_pressure (s->cycle, node, i)
                          : pls_shutdown_sample_pressure (s->shutdown, node, i);
}

static double
series_flow (const Series *s, int element, size_t i)
{
  return s->cycle != NULL ? pls_cycle_sample_flow (s->cycle, element, i)
                          : pls_shutdown_sample_flow (s->shutdown, element, i);
}

/* The node of a port, if the steady idle solve included it (the runs
 * leave out what it left out, as pl_results_get_port_pressure does). */
static int
solved_node (const PlResults *results, const char *part_id, const char *port_key)
{
  int node = pl_compiled_get_port_node (pl_results_get_compiled (results), part_id, port_key);
  const pls_steady_result *idle = pl_results_get_steady (results, PL_CASE_IDLE);

  if (node < 0 || (idle != NULL && !pls_steady_node_solved (idle, node)))
    return -1;
  return node;
}

const char *
pl_run_get_key (PlRun run)
{
  static const char *const keys[] = { "cycle", "shutdown" };

  return (guint) run < G_N_ELEMENTS (keys) ? keys[run] : NULL;
}

gboolean
pl_results_get_run_length (const PlResults *results, PlRun run, double *out)
{
  Series s;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  if (!series_get (results, run, &s))
    return FALSE;
  *out = s.length;
  return TRUE;
}

gboolean
pl_results_get_port_pressure_at (const PlResults *results, const char *part_id,
                                 const char *port_key, PlRun run, double t, double *out)
{
  Series s;
  size_t i;
  double f, p0, p1;
  int node;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  if (!series_get (results, run, &s) || !series_slot (&s, t, &i, &f)
      || (node = solved_node (results, part_id, port_key)) < 0)
    return FALSE;
  p0 = series_pressure (&s, node, i);
  p1 = series_pressure (&s, node, i + 1);
  if (!(isfinite (p0) && isfinite (p1)))
    return FALSE;
  *out = p0 + f * (p1 - p0);
  return TRUE;
}

gboolean
pl_results_get_flow_at (const PlResults *results, const char *part_id, guint slot, PlRun run,
                        double t, double *out)
{
  const PlCompiledPart *part;
  const pls_steady_result *idle;
  Series s;
  size_t i;
  double f, q0, q1;
  int e;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  part = pl_compiled_find_part (pl_results_get_compiled (results), part_id);
  if (part == NULL || !part->compiled || slot >= part->n_elements
      || (e = part->elements[slot]) < 0)
    return FALSE;
  idle = pl_results_get_steady (results, PL_CASE_IDLE);
  if ((idle != NULL && !pls_steady_element_solved (idle, e))
      || !series_get (results, run, &s) || !series_slot (&s, t, &i, &f))
    return FALSE;
  q0 = series_flow (&s, e, i);
  q1 = series_flow (&s, e, i + 1);
  if (!(isfinite (q0) && isfinite (q1)))
    return FALSE;
  *out = q0 + f * (q1 - q0);
  return TRUE;
}

gboolean
pl_results_get_port_min_time (const PlResults *results, const char *part_id,
                              const char *port_key, PlRun run, double *time,
                              double *pressure)
{
  Series s;
  size_t best = 0;
  double lo = INFINITY;
  int node;

  g_return_val_if_fail (results != NULL, FALSE);
  if (!series_get (results, run, &s) || (node = solved_node (results, part_id, port_key)) < 0)
    return FALSE;
  for (size_t i = 0; i < s.n; i++)
    {
      double p = series_pressure (&s, node, i);

      if (isfinite (p) && p < lo)
        {
          lo = p;
          best = i;
        }
    }
  if (!isfinite (lo))
    return FALSE;
  if (time != NULL)
    *time = s.length * (double) best / (double) (s.n - 1);
  if (pressure != NULL)
    *pressure = lo;
  return TRUE;
}
