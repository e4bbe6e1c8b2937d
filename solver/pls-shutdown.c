/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-shutdown.c: what happens when the air goes off.
 *
 * From the idle state (air on, every applicator shut) the pumps stop and
 * the dump valves open at t = 0.  The lumped model is integrated until
 * every node that has a way out is below the safe pressure and has stayed
 * there for the confirmation window (or the time limit).  The window is
 * the first-mode period of the slowest line, 4 L / c (closed at one end):
 * a pressure wave that could lift a node back above the safe pressure
 * returns within it, so a line that only rings below the safe pressure
 * for that long is decaying for good.  The safe time is the last moment a
 * node fell below the safe pressure (linear interpolation inside the
 * step, as the series), not the end of the step that found it, so that it
 * does not move with the step sizes.  A volume with no way out once the air is off (no path through
 * lines, fittings, open valves to a drain or tank; a stopped pump's check
 * valve and a shut applicator are no path) keeps its pressure for ever in
 * this model: it is reported as trapped before any integration, from the
 * topology of the air-off state.
 *
 * Stored energy at the start: the gas, p0 V0 ln(p/p0) (isothermal) or
 * (p V - p0 V0)/(n - 1) (polytropic), from pls_accumulator_gas_energy;
 * the compressed fluid and the walls, the integral of p dV over the
 * linear compliance, 1/2 C p^2.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pls-transient-private.h"

struct pls_shutdown_result
{
  pls_allocator alloc;
  size_t n_nodes, n_elements;
  pls_transient_stats stats;
  double safe_time, gas_energy, fluid_energy;
  double *node_safe;              /* n_nodes                               */
  unsigned char *trapped;         /* n_nodes                               */
  size_t samples;
  double *times;                  /* samples                               */
  double *series;                 /* n_nodes x samples, node-major         */
  double *flow_series;            /* n_elements x samples, element-major   */
  pls_finding_list findings;
};

#define PLS_SHUTDOWN_SAMPLES 200

typedef struct
{
  pls_shutdown_result *r;
  const unsigned char *trapped_model;  /* per model node */
  double safe;
  double window;      /* confirmation window, s                           */
  double below_since; /* last time every node fell below safe; -1: above  */
  double *p_low;      /* model nodes: lowest pressure of the run, Pa      */
  /* every accepted step's end, for the series */
  double *t;      /* cap */
  double *p;      /* cap x (n_nodes + n_elements): pressures, then flows */
  size_t count, cap;
} pls_decay;

/* Appends the model's network-node pressures and element flows at time t
 * to the record. */
static pls_status
pls_decay_push (pls_decay *d, const pls__model *m, double t)
{
  const pls_allocator *a = &d->r->alloc;
  size_t n = d->r->n_nodes + d->r->n_elements, k;
  double *row;

  if (d->count == d->cap)
    {
      size_t cap = d->cap ? 2 * d->cap : 256;
      double *nt = pls__realloc (a, d->t, cap * sizeof *nt);
      double *np;

      if (nt == NULL)
        return PLS_ERR_NOMEM;
      d->t = nt;
      np = pls__realloc (a, d->p, cap * n * sizeof *np);
      if (np == NULL)
        return PLS_ERR_NOMEM;
      d->p = np;
      d->cap = cap;
    }
  d->t[d->count] = t;
  row = d->p + d->count * n;
  memcpy (row, m->p, d->r->n_nodes * sizeof *m->p);
  for (k = 0; k < d->r->n_elements; k++)
    row[d->r->n_nodes + k] = m->elem_link[k] >= 0 ? m->q[m->elem_link[k]] : 0.0;
  d->count++;
  return PLS_OK;
}

/* 1 if model node i is an accumulator's chamber whose bladder has shut
 * the port: it holds its precharge and no fluid (pls-bladder.c). */
static int
pls_chamber_shut (const pls__model *m, size_t i)
{
  int acc = m->nodes[i].acc;

  return acc >= 0 && m->shut[m->elem_link[acc]];
}

static pls_status
pls_decay_step (void *user_data, pls__model *m, double t0, double tg, double t1)
{
  pls_decay *d = user_data;
  pls_shutdown_result *r = d->r;
  size_t i, n = r->n_nodes;
  double last = t0;   /* latest fall below safe inside this step */
  int all_safe = 1;

  if (pls_decay_push (d, m, t1) != PLS_OK)
    return PLS_ERR_NOMEM;
  for (i = 0; i < m->n_nodes; i++)
    {
      double pa = m->p0[i], pb = m->p[i], cross;

      if (d->trapped_model[i] || m->nodes[i].fixed || pls_chamber_shut (m, i))
        continue;
      if (pb > d->safe)
        {
          if (i < n)
            r->node_safe[i] = -1.0;
          all_safe = 0;
          continue;
        }
      /* Crossed below: linear interpolation inside the step. */
      cross = pa > d->safe ? t0 + (t1 - t0) * (pa - d->safe) / (pa - pb) : t0;
      last = fmax (last, cross);
      if (i < n && r->node_safe[i] < 0.0)
        r->node_safe[i] = cross;
    }
  (void) tg;
  pls__pocket_track (m, d->p_low);
  if (!all_safe)
    d->below_since = -1.0;
  else if (d->below_since < 0.0)
    d->below_since = last;
  if (d->below_since >= 0.0 && t1 - d->below_since >= d->window)
    {
      r->safe_time = d->below_since;
      m->stop = 1;
    }
  return PLS_OK;
}

static int
pls_root (int *parent, int i)
{
  while (parent[i] != i)
    {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
  return i;
}

void
pls_shutdown_result_free (pls_shutdown_result *r)
{
  pls_allocator a;

  if (r == NULL)
    return;
  a = r->alloc;
  pls__free (&a, r->node_safe);
  pls__free (&a, r->trapped);
  pls__free (&a, r->times);
  pls__free (&a, r->series);
  pls__free (&a, r->flow_series);
  pls__free (&a, r->findings.items);
  pls__free (&a, r);
}

pls_status
pls_solve_shutdown (const pls_network *net, const pls_transient_options *options,
                    pls_shutdown_result **out, pls_error *err)
{
  pls_transient_options defaults;
  const pls_transient_options *o = options;
  const pls_allocator *a;
  pls_shutdown_result *r = NULL;
  pls__model *m = NULL;
  pls__schedule closed;
  pls_decay d;
  int *parent = NULL;
  unsigned char *drains = NULL, *trapped_model = NULL;
  double t0 = pls__now ();
  pls_status st;
  size_t i, k, n;

  memset (&d, 0, sizeof d);
  pls__error_clear (err);
  if (out == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the result");
  *out = NULL;
  st = pls__transient_options (net, options, &defaults, 0, &o, err);
  if (st != PLS_OK)
    return st;
  a = &net->alloc;
  n = net->n_nodes;
  r = pls__calloc (a, 1, sizeof *r);
  if (r == NULL)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the shutdown run");
  r->alloc = net->alloc;
  r->n_nodes = n;
  r->n_elements = net->n_elements;
  r->safe_time = -1.0;
  r->node_safe = pls__calloc (a, n, sizeof (double));
  r->trapped = pls__calloc (a, n, 1);
  if (!r->node_safe || !r->trapped)
    goto nomem;

  st = pls__transient_start (net, o, &m, err);
  if (st != PLS_OK)
    goto out;

  /* Stored energy at the start. */
  for (i = 0; i < m->n_nodes; i++)
    if (!m->nodes[i].fixed)
      r->fluid_energy += 0.5 * m->nodes[i].compliance * m->p[i] * m->p[i];
  for (k = 0; k < net->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_ACCUMULATOR)
      r->gas_energy += pls_accumulator_gas_energy (&net->elements[k].u.accumulator,
                                                   m->p[m->chamber[k]]);

  /* Trapped volumes: components of the air-off links with no fixed node. */
  pls__model_set_air (m, 0, o->air_pressure);
  parent = pls__malloc (a, m->n_nodes * sizeof *parent);
  drains = pls__calloc (a, m->n_nodes, 1);
  trapped_model = pls__calloc (a, m->n_nodes, 1);
  d.p_low = pls__malloc (a, m->n_nodes * sizeof *d.p_low);
  if (!parent || !drains || !trapped_model || !d.p_low)
    goto nomem;
  memcpy (d.p_low, m->p, m->n_nodes * sizeof *d.p_low);
  for (i = 0; i < m->n_nodes; i++)
    parent[i] = (int) i;
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];

      if (!m->active[k] || l->kind == PLS__LINK_NOZZLE || l->b < 0)
        continue;
      parent[pls_root (parent, l->a)] = pls_root (parent, l->b);
    }
  for (i = 0; i < m->n_nodes; i++)
    if (m->nodes[i].fixed)
      drains[pls_root (parent, (int) i)] = 1;
  for (i = 0; i < m->n_nodes; i++)
    trapped_model[i] = !drains[pls_root (parent, (int) i)];
  for (i = 0; i < n; i++)
    {
      r->trapped[i] = trapped_model[i] && m->p[i] > o->safe_pressure;
      r->node_safe[i] = m->nodes[i].fixed || m->p[i] <= o->safe_pressure ? 0.0 : -1.0;
      if (r->trapped[i])
        {
          char label[96];

          pls__node_label (net, (int) i, label, sizeof label);
          if (pls__finding_add (&r->findings, a, PLS_SEVERITY_ERROR, "trapped-pressure", -1,
                                (int) i, m->p[i], o->safe_pressure,
                                "%s stays at %.4g bar after the air goes off: no path to a "
                                "drain (closed valve or check valve)", label, m->p[i] / 1e5)
              != PLS_OK)
            goto nomem;
        }
    }

  /* The decay. */
  d.r = r;
  d.trapped_model = trapped_model;
  d.safe = o->safe_pressure;
  d.below_since = -1.0;
  for (k = 0; k < net->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_LINE)
      {
        double c;

        pls__line_wave (&net->fluid, &net->elements[k].u.line, &c, NULL);
        d.window = fmax (d.window, 4.0 * net->elements[k].u.line.length / c);
      }
  memset (&closed, 0, sizeof closed);
  closed.kind = PLS__SCHED_CLOSED;
  if (pls_decay_push (&d, m, 0.0) != PLS_OK)
    goto nomem;
  m->tol.h_max = o->shutdown_time / 50.0;
  m->tol.h_min = 1e-14 * o->shutdown_time;
  m->tol.p_scale_global = 1;
  {
    int any = 0;

    for (i = 0; i < m->n_nodes; i++)
      if (!trapped_model[i] && !m->nodes[i].fixed && m->p[i] > o->safe_pressure)
        any = 1;
    if (!any)
      r->safe_time = 0.0;
    else
      {
        st = pls__integrate (m, &closed, 0.0, o->shutdown_time, pls_decay_step, &d, err);
        if (st == PLS_ERR_NOMEM)
          goto nomem;
        if (st != PLS_OK)
          goto out;
        /* Below safe at the time limit, its window not yet over. */
        if (r->safe_time < 0.0 && d.below_since >= 0.0)
          r->safe_time = d.below_since;
      }
  }
  if (r->safe_time < 0.0
      && pls__finding_add (&r->findings, a, PLS_SEVERITY_WARNING, "shutdown-slow", -1, -1,
                           o->shutdown_time, o->shutdown_time, "the line is not below %.3g "
                           "bar within %g s of the air going off", o->safe_pressure / 1e5,
                           o->shutdown_time) != PLS_OK)
    goto nomem;

  if (pls__pocket_finding (&r->findings, a, m, d.p_low, "shutdown-cavitation", "shutdown")
      != PLS_OK)
    goto nomem;

  /* Series: the run's steps resampled evenly from the start to the safe
   * time (to the run's end when it never got there). */
  r->samples = PLS_SHUTDOWN_SAMPLES;
  r->times = pls__calloc (a, r->samples, sizeof (double));
  r->series = pls__calloc (a, r->samples * n, sizeof (double));
  r->flow_series = pls__calloc (a, r->samples * r->n_elements, sizeof (double));
  if (!r->times || !r->series || !r->flow_series)
    goto nomem;
  {
    double t_end = r->safe_time >= 0.0 ? r->safe_time : d.t[d.count - 1];
    size_t s, j = 1, w = n + r->n_elements;

    for (s = 0; s < r->samples; s++)
      {
        double ts = t_end * (double) s / (double) (r->samples - 1);

        r->times[s] = ts;
        while (j < d.count - 1 && d.t[j] < ts)
          j++;
        for (i = 0; i < w; i++)
          {
            double v = d.p[i];

            if (d.count > 1)
              {
                double ta = d.t[j - 1], tb = d.t[j], u = (ts - ta) / (tb - ta);

                v = d.p[(j - 1) * w + i] + u * (d.p[j * w + i] - d.p[(j - 1) * w + i]);
              }
            if (i < n)
              r->series[i * r->samples + s] = v;
            else
              r->flow_series[(i - n) * r->samples + s] = v;
          }
      }
  }
  pls__stats_add (m, &r->stats);
  r->stats.wall_seconds = pls__now () - t0;
  *out = r;
  r = NULL;
  st = PLS_OK;
  goto out;

nomem:
  st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the shutdown run");
out:
  pls__free (a, parent);
  pls__free (a, drains);
  pls__free (a, trapped_model);
  pls__free (a, d.t);
  pls__free (a, d.p);
  pls__free (a, d.p_low);
  pls__model_free (m);
  pls_shutdown_result_free (r);
  return st;
}

void
pls_shutdown_result_stats (const pls_shutdown_result *r, pls_transient_stats *out)
{
  if (out == NULL)
    return;
  if (r == NULL)
    memset (out, 0, sizeof *out);
  else
    *out = r->stats;
}

double
pls_shutdown_safe_time (const pls_shutdown_result *r)
{
  return r != NULL ? r->safe_time : -1.0;
}

double
pls_shutdown_node_safe_time (const pls_shutdown_result *r, int node)
{
  if (r == NULL || node < 0 || (size_t) node >= r->n_nodes)
    return 0.0;
  return r->node_safe[node];
}

int
pls_shutdown_node_trapped (const pls_shutdown_result *r, int node)
{
  if (r == NULL || node < 0 || (size_t) node >= r->n_nodes)
    return 0;
  return r->trapped[node];
}

double
pls_shutdown_gas_energy (const pls_shutdown_result *r)
{
  return r != NULL ? r->gas_energy : 0.0;
}

double
pls_shutdown_fluid_energy (const pls_shutdown_result *r)
{
  return r != NULL ? r->fluid_energy : 0.0;
}

size_t
pls_shutdown_sample_count (const pls_shutdown_result *r)
{
  return r != NULL ? r->samples : 0;
}

double
pls_shutdown_sample_time (const pls_shutdown_result *r, size_t i)
{
  if (r == NULL || i >= r->samples)
    return 0.0;
  return r->times[i];
}

double
pls_shutdown_sample_pressure (const pls_shutdown_result *r, int node, size_t i)
{
  if (r == NULL || node < 0 || (size_t) node >= r->n_nodes || i >= r->samples)
    return 0.0;
  return r->series[(size_t) node * r->samples + i];
}

double
pls_shutdown_sample_flow (const pls_shutdown_result *r, int element, size_t i)
{
  if (r == NULL || element < 0 || (size_t) element >= r->n_elements || i >= r->samples)
    return 0.0;
  return r->flow_series[(size_t) element * r->samples + i];
}

size_t
pls_shutdown_finding_count (const pls_shutdown_result *r)
{
  return r != NULL ? r->findings.count : 0;
}

const pls_finding *
pls_shutdown_finding (const pls_shutdown_result *r, size_t index)
{
  if (r == NULL || index >= r->findings.count)
    return NULL;
  return &r->findings.items[index];
}
