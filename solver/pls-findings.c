/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-findings.c: the findings list and the design checks run on a solved
 * steady state.  Each check compares one figure with one limit; the figure
 * and the limit travel with the finding (SI) so the user interface can
 * restate them in the user's units.
 */

#include "config.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pls-network-private.h"

#define MPA(p) ((p) * 1e-6)

pls_status
pls__finding_add (pls_finding_list *list, const pls_allocator *a, pls_severity severity,
                  const char *code, int element, int node, double value, double limit,
                  const char *fmt, ...)
{
  pls_finding *f;
  va_list ap;

  if (list->count == list->cap)
    {
      size_t cap = list->cap ? 2 * list->cap : 8;
      pls_finding *p = pls__realloc (a, list->items, cap * sizeof *p);

      if (p == NULL)
        return PLS_ERR_NOMEM;
      list->items = p;
      list->cap = cap;
    }
  f = &list->items[list->count++];
  f->severity = severity;
  f->code = code;
  f->element = element;
  f->node = node;
  f->value = value;
  f->limit = limit;
  va_start (ap, fmt);
  vsnprintf (f->message, sizeof f->message, fmt, ap);
  va_end (ap);
  return PLS_OK;
}

static double
pls_rating (const pls_element *e)
{
  switch (e->kind)
    {
    case PLS_ELEMENT_LINE: return e->u.line.rated_pressure;
    case PLS_ELEMENT_FITTING: return e->u.fitting.rated_pressure;
    case PLS_ELEMENT_VALVE: return e->u.valve.rated_pressure;
    case PLS_ELEMENT_PUMP: return e->u.pump.rated_pressure;
    case PLS_ELEMENT_NOZZLE: return e->u.nozzle.rated_pressure;
    case PLS_ELEMENT_ACCUMULATOR: return e->u.accumulator.rated_pressure;
    case PLS_ELEMENT_GAUGE:
    case PLS_ELEMENT_CUSTOM:
    default: return 0.0;
    }
}

/* The highest pressure each node can see: its steady pressure, or the
 * stall pressure of a running pump that reaches it at idle (all applicators
 * shut, no flow, so the pressure is stall less rho g dz everywhere the
 * outlet reaches through open parts; a check valve stops it at the pump
 * inlet, a tank or drain holds its own pressure).  seen, by: n_nodes. */
static pls_status
pls_seen_pressures (const pls_network *net, const pls_steady_options *o,
                    const pls_steady_result *r, double *seen, int *by)
{
  const pls_allocator *a = &net->alloc;
  size_t n = net->n_nodes, m = net->n_elements, i, k;
  size_t *start = NULL, *adj = NULL;
  int *stack = NULL, *mark = NULL;
  pls_status st = PLS_ERR_NOMEM;
  double rho_g = net->fluid.density * PLS_GRAVITY;

  for (i = 0; i < n; i++)
    {
      seen[i] = r->node_solved[i] ? r->pressure[i] : 0.0;
      by[i] = -1;
    }
  if (!o->air_on || net->n_pumps == 0)
    return PLS_OK;
  start = pls__calloc (a, n + 1, sizeof *start);
  adj = pls__malloc (a, 2 * m * sizeof *adj);
  stack = pls__malloc (a, n * sizeof *stack);
  mark = pls__malloc (a, n * sizeof *mark);
  if (!start || !adj || !stack || !mark)
    goto out;
  /* Adjacency of the open, solved two-ports other than pumps. */
  for (k = 0; k < m; k++)
    {
      const pls_element *e = &net->elements[k];

      if (e->b >= 0 && r->elem_active[k] && e->kind != PLS_ELEMENT_PUMP)
        {
          start[e->a + 1]++;
          start[e->b + 1]++;
        }
    }
  for (i = 0; i < n; i++)
    start[i + 1] += start[i];
  for (i = 0; i < n; i++)
    mark[i] = (int) start[i];   /* next free slot, reused as a cursor */
  for (k = 0; k < m; k++)
    {
      const pls_element *e = &net->elements[k];

      if (e->b >= 0 && r->elem_active[k] && e->kind != PLS_ELEMENT_PUMP)
        {
          adj[mark[e->a]++] = k;
          adj[mark[e->b]++] = k;
        }
    }
  for (k = 0; k < m; k++)
    {
      const pls_element *e = &net->elements[k];
      double stall, pz;
      int top = 0;

      if (e->kind != PLS_ELEMENT_PUMP || !r->elem_active[k] || net->nodes[e->b].fixed)
        continue;
      stall = pls_pump_stall_pressure (&e->u.pump, o->air_pressure);
      pz = stall + rho_g * net->nodes[e->b].elevation;
      for (i = 0; i < n; i++)
        mark[i] = 0;
      stack[top++] = e->b;
      mark[e->b] = 1;
      while (top > 0)
        {
          int nd = stack[--top];
          double p = pz - rho_g * net->nodes[nd].elevation;
          size_t s;

          if (p > seen[nd])
            {
              seen[nd] = p;
              by[nd] = (int) k;
            }
          for (s = start[nd]; s < start[nd + 1]; s++)
            {
              const pls_element *l = &net->elements[adj[s]];
              int other = l->a == nd ? l->b : l->a;

              if (!mark[other] && !net->nodes[other].fixed)
                {
                  mark[other] = 1;
                  stack[top++] = other;
                }
            }
        }
    }
  st = PLS_OK;

out:
  pls__free (a, start);
  pls__free (a, adj);
  pls__free (a, stack);
  pls__free (a, mark);
  return st;
}

static pls_status
pls_check_pumps (const pls_network *net, const pls_steady_options *o, pls_steady_result *r)
{
  const pls_allocator *a = &net->alloc;
  double free_total = 0.0;
  int first = -1;
  char label[96];
  size_t k;
  pls_status st = PLS_OK;

  if (!o->air_on)
    return PLS_OK;
  for (k = 0; k < net->n_elements && st == PLS_OK; k++)
    {
      const pls_element *e = &net->elements[k];
      double stall;

      if (e->kind != PLS_ELEMENT_PUMP || !r->elem_solved[k])
        continue;
      if (first < 0)
        first = (int) k;
      free_total += pls_pump_free_flow (&e->u.pump);
      stall = pls_pump_stall_pressure (&e->u.pump, o->air_pressure);
      if (o->demand_pressure > 0.0 && stall < o->demand_pressure)
        {
          pls__element_label (net, (int) k, label, sizeof label);
          st = pls__finding_add (&r->findings, a, PLS_SEVERITY_ERROR, "pump-stall-short",
                                 (int) k, e->b, stall, o->demand_pressure,
                                 "%s stalls at %.3g MPa with this air supply, below the "
                                 "%.3g MPa the applicators need.",
                                 label, MPA (stall), MPA (o->demand_pressure));
        }
    }
  if (st == PLS_OK && first >= 0 && o->demand_flow > 0.0 && free_total < o->demand_flow)
    {
      pls__element_label (net, first, label, sizeof label);
      st = pls__finding_add (&r->findings, a, PLS_SEVERITY_ERROR, "pump-stall-short", first,
                             net->elements[first].b, free_total, o->demand_flow,
                             "%s delivers at most %.3g L/min at free flow, short of the "
                             "%.3g L/min the applicators need.",
                             label, free_total * 6e4, o->demand_flow * 6e4);
    }
  return st;
}

/* Pressure spread of the open applicators on each connected part. */
static pls_status
pls_check_spread (const pls_network *net, const pls_steady_options *o,
                  pls_steady_result *r, const int *comp)
{
  const pls_allocator *a = &net->alloc;
  size_t n = net->n_nodes, k;
  int *lo = NULL, *hi = NULL, *cnt = NULL;
  pls_status st = PLS_ERR_NOMEM;

  lo = pls__malloc (a, n * sizeof *lo);
  hi = pls__malloc (a, n * sizeof *hi);
  cnt = pls__calloc (a, n, sizeof *cnt);
  if (!lo || !hi || !cnt)
    goto out;
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int c;

      if (e->kind != PLS_ELEMENT_NOZZLE || !r->elem_active[k] || comp[e->a] < 0)
        continue;
      c = comp[e->a];
      if (cnt[c]++ == 0)
        lo[c] = hi[c] = (int) k;
      else
        {
          double p = r->pressure[e->a];

          if (p < r->pressure[net->elements[lo[c]].a])
            lo[c] = (int) k;
          if (p > r->pressure[net->elements[hi[c]].a])
            hi[c] = (int) k;
        }
    }
  st = PLS_OK;
  for (k = 0; k < n && st == PLS_OK; k++)
    {
      double pl, ph, spread;
      char l1[96], l2[96];

      if (cnt[k] < 2)
        continue;
      pl = r->pressure[net->elements[lo[k]].a];
      ph = r->pressure[net->elements[hi[k]].a];
      if (!(ph > 0.0))
        continue;
      spread = (ph - pl) / ph;
      if (spread <= o->manifold_spread_tolerance)
        continue;
      pls__element_label (net, lo[k], l1, sizeof l1);
      pls__element_label (net, hi[k], l2, sizeof l2);
      st = pls__finding_add (&r->findings, a, PLS_SEVERITY_WARNING, "manifold-spread", lo[k],
                             net->elements[lo[k]].a, spread, o->manifold_spread_tolerance,
                             "The open applicators' pressures spread by %.1f %% (%s at "
                             "%.3g MPa, %s at %.3g MPa), more than the %.1f %% allowed.",
                             100.0 * spread, l1, MPA (pl), l2, MPA (ph),
                             100.0 * o->manifold_spread_tolerance);
    }

out:
  pls__free (a, lo);
  pls__free (a, hi);
  pls__free (a, cnt);
  return st;
}

pls_status
pls__design_checks (const pls_network *net, const pls_steady_options *o,
                    pls_steady_result *r, const int *comp)
{
  const pls_allocator *a = &net->alloc;
  pls_finding_list *fl = &r->findings;
  double *seen = NULL;
  int *by = NULL;
  pls_status st = PLS_ERR_NOMEM;
  char label[96], plabel[96];
  size_t k;

  seen = pls__malloc (a, net->n_nodes * sizeof *seen);
  by = pls__malloc (a, net->n_nodes * sizeof *by);
  if (!seen || !by)
    goto out;
  st = pls_seen_pressures (net, o, r, seen, by);
  if (st == PLS_OK)
    st = pls_check_pumps (net, o, r);
  if (st == PLS_OK)
    st = pls_check_spread (net, o, r, comp);

  for (k = 0; k < net->n_elements && st == PLS_OK; k++)
    {
      const pls_element *e = &net->elements[k];
      double rated = pls_rating (e), p;
      int nd;

      if (!r->elem_solved[k])
        continue;
      nd = e->a;
      if (e->b >= 0 && seen[e->b] > seen[e->a])
        nd = e->b;
      p = seen[nd];
      /* The label only when a check fires (formatting it for every part
       * costs more than the checks). */
#define LABEL() pls__element_label (net, (int) k, label, sizeof label)

      if (rated > 0.0 && p > rated)
        {
          LABEL ();
          if (by[nd] >= 0 && p > r->pressure[nd])
            {
              pls__element_label (net, by[nd], plabel, sizeof plabel);
              st = pls__finding_add (fl, a, PLS_SEVERITY_ERROR, "rating-exceeded", (int) k,
                                     nd, p, rated,
                                     "%s is rated for %.3g MPa but can see %.3g MPa when "
                                     "%s stalls with every applicator shut.",
                                     label, MPA (rated), MPA (p), plabel);
            }
          else
            st = pls__finding_add (fl, a, PLS_SEVERITY_ERROR, "rating-exceeded", (int) k, nd,
                                   p, rated,
                                   "%s is rated for %.3g MPa but works at %.3g MPa.",
                                   label, MPA (rated), MPA (p));
          if (st != PLS_OK)
            break;
        }

      if (e->kind == PLS_ELEMENT_GAUGE && o->air_on && p > 0.0)
        {
          double fs = e->u.gauge.full_scale;

          /* Common practice, no source: full scale at least 1.5x the
           * highest reading, readings in the middle third of the dial. */
          LABEL ();
          if (fs < o->gauge_low_factor * p)
            st = pls__finding_add (fl, a, PLS_SEVERITY_WARNING, "gauge-range-low", (int) k,
                                   nd, fs, o->gauge_low_factor * p,
                                   "%s reads up to %.3g MPa; its %.3g MPa full scale is too "
                                   "low (want at least %.3g MPa).",
                                   label, MPA (p), MPA (fs), MPA (o->gauge_low_factor * p));
          else if (o->gauge_high_factor > 0.0 && p < fs / o->gauge_high_factor)
            st = pls__finding_add (fl, a, PLS_SEVERITY_INFO, "gauge-range-high", (int) k, nd,
                                   fs, p * o->gauge_high_factor,
                                   "%s reads at most %.3g MPa, below the middle third of "
                                   "its %.3g MPa scale: a smaller gauge reads closer.",
                                   label, MPA (p), MPA (fs));
        }
      else if (e->kind == PLS_ELEMENT_ACCUMULATOR && o->air_on && p > 0.0)
        {
          double p0 = pls_accumulator_effective_precharge (&e->u.accumulator);

          LABEL ();
          if (p0 >= p)
            st = pls__finding_add (fl, a, PLS_SEVERITY_WARNING, "precharge-too-high",
                                   (int) k, nd, p0, p,
                                   "%s is precharged to %.3g MPa, at or above the "
                                   "%.3g MPa it sees at idle: it never fills.",
                                   label, MPA (p0), MPA (p));
          else if (p0 < o->precharge_low_fraction * p)
            st = pls__finding_add (fl, a, PLS_SEVERITY_WARNING, "precharge-too-low",
                                   (int) k, nd, p0, o->precharge_low_fraction * p,
                                   "%s is precharged to %.3g MPa, below %.0f %% of its "
                                   "%.3g MPa working pressure (bladder makers' limit).",
                                   label, MPA (p0), 100.0 * o->precharge_low_fraction,
                                   MPA (p));
        }
      else if (e->kind == PLS_ELEMENT_LINE)
        {
          const pls_line_result *lr = &r->detail[k].line;

          if (o->velocity_limit > 0.0 && fabs (lr->velocity) > o->velocity_limit
              && (LABEL (), 1))
            st = pls__finding_add (fl, a, PLS_SEVERITY_WARNING, "velocity-high", (int) k, -1,
                                   fabs (lr->velocity), o->velocity_limit,
                                   "%s runs at %.3g m/s, above the %.3g m/s limit.",
                                   label, fabs (lr->velocity), o->velocity_limit);
          if (st == PLS_OK && o->shear_rate_limit > 0.0
              && lr->wall_shear_rate > o->shear_rate_limit && (LABEL (), 1))
            st = pls__finding_add (fl, a, PLS_SEVERITY_WARNING, "shear-high", (int) k, -1,
                                   lr->wall_shear_rate, o->shear_rate_limit,
                                   "%s shears the fluid at its wall at %.3g 1/s, above the "
                                   "%.3g 1/s limit.",
                                   label, lr->wall_shear_rate, o->shear_rate_limit);
        }
    }

#undef LABEL

out:
  pls__free (a, seen);
  pls__free (a, by);
  return st;
}
