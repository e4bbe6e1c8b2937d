/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-cycle.c: the firing cycle run to a periodic steady state, its
 * results, and the search for the highest cycle rate that keeps the shots
 * uniform.  Also the pieces the shutdown shares: options, the idle start.
 *
 * Periodic steady state: after the first shot from idle, the schedule is
 * integrated cycle after cycle from the steady state with every valve
 * held at its mean opening (pls_first_shot), corrected once for the mean
 * shot flow after the first cycle (pls_mean_correct), until the largest
 * change of a model node pressure between the starts of two successive
 * cycles, relative to the largest idle pressure, falls below the
 * tolerance; between later cycles the sequence of cycle-start states is
 * extrapolated to its limit (pls_rre_add).  The last cycle is reported;
 * the cycle count is that of the periodic run.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pls-transient-private.h"

#define PLS_GAMMA (2.0 - 1.41421356237309504880)

struct pls_cycle_result
{
  pls_allocator alloc;
  size_t n_nodes, n_elements;
  int cycles, periodic;
  double change, period;
  pls_transient_stats stats;
  int *segments;                  /* n_elements                               */
  double *pmin, *pmax, *pmean, *pidle, *recovery; /* n_nodes                  */
  size_t samples;
  double *series;                 /* n_nodes x samples, node-major            */
  double *flow_series;            /* n_elements x samples, element-major      */
  double *shot, *shot_dev, *first_shot;           /* n_elements (kg, -, kg)   */
  pls_cycle_accumulator *acc;     /* n_elements                               */
  pls_cycle_pump *pump;           /* n_elements                               */
  double pumped, shot_total, stored_change;
  pls_finding_list findings;
};

void
pls_transient_options_init (pls_transient_options *o)
{
  if (o == NULL)
    return;
  memset (o, 0, sizeof *o);
  o->air_pressure = 6e5;          /* 6 bar shop air, common practice */
  o->cycle_rate = 2.0;
  o->on_time = 0.05;
  o->open_ramp = 2e-3;            /* a few ms: PHYSICS.md, applicators */
  o->close_ramp = 2e-3;
  o->segments_per_wavelength = 13.0;  /* first resonance within 1 %, PHYSICS.md */
  o->min_segments = 1;
  o->max_segments = 32;
  /* Shot masses move by 3e-6 between rtol 1e-3 and 1e-4 on the test
   * layouts (the waves after each valve event set the step, and their
   * phase errors average out over a shot); 1e-3 halves the steps. */
  o->rtol = 1e-3;
  o->atol_pressure = 10.0;
  o->atol_flow = 1e-9;
  o->periodic_tolerance = 1e-4;
  o->max_cycles = 200;
  o->samples = 200;
  o->uniformity_tolerance = 0.02;     /* common practice, no source */
  o->recovery_fraction = 0.01;
  o->safe_pressure = 1e5;             /* common practice, no source */
  o->shutdown_time = 600.0;
}

static pls_status
pls_transient_check (const pls_network *net, const pls_transient_options *o, int cycle,
                     pls_error *err)
{
  const struct
  {
    const char *name;
    double value;
    int positive;
  } f[] = {
    { "air_pressure", o->air_pressure, 0 },
    { "segments_per_wavelength", o->segments_per_wavelength, 1 },
    { "rtol", o->rtol, 1 },
    { "atol_pressure", o->atol_pressure, 1 },
    { "atol_flow", o->atol_flow, 1 },
    { "periodic_tolerance", o->periodic_tolerance, 1 },
    { "uniformity_tolerance", o->uniformity_tolerance, 1 },
    { "recovery_fraction", o->recovery_fraction, 1 },
    { "safe_pressure", o->safe_pressure, 1 },
    { "shutdown_time", o->shutdown_time, 1 },
    { "cycle_rate", o->cycle_rate, 1 },
    { "open_ramp", o->open_ramp, 1 },
    { "close_ramp", o->close_ramp, 1 },
  };
  size_t i, k;
  double period;

  for (i = 0; i < sizeof f / sizeof f[0]; i++)
    if (!isfinite (f[i].value) || f[i].value < 0.0 || (f[i].positive && f[i].value == 0.0))
      return pls__error (err, PLS_ERR_INVALID, -1, -1, "transient options: %s must be %s, "
                         "not %g", f[i].name, f[i].positive ? "positive" : "finite and >= 0",
                         f[i].value);
  if (o->min_segments < 1 || o->max_segments < o->min_segments)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "transient options: segments must "
                       "satisfy 1 <= min_segments <= max_segments, not %d and %d",
                       o->min_segments, o->max_segments);
  if (o->max_cycles < 1 || o->samples < 2)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "transient options: max_cycles must be "
                       ">= 1 and samples >= 2, not %d and %d", o->max_cycles, o->samples);
  if (net->n_nodes == 0 || net->n_elements == 0)
    return pls__error (err, PLS_ERR_TOPOLOGY, -1, -1,
                       "the network is empty: it needs nodes and parts");
  if (!cycle)
    return PLS_OK;
  period = 1.0 / o->cycle_rate;
  if (!(isfinite (o->on_time) && o->on_time > 0.0 && o->on_time < period))
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "firing schedule: on_time must be "
                       "positive and shorter than the cycle (%g s), not %g s", period,
                       o->on_time);
  if (o->open_ramp > o->on_time)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "firing schedule: open_ramp (%g s) "
                       "must not exceed on_time (%g s)", o->open_ramp, o->on_time);
  if (o->delays != NULL && o->delay_count != net->n_elements)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "firing schedule: delays has %zu "
                       "entries, the network %zu elements", o->delay_count, net->n_elements);
  for (k = 0; k < net->n_elements; k++)
    {
      double d = o->delays != NULL ? o->delays[k] : 0.0;
      char label[96];

      if (net->elements[k].kind != PLS_ELEMENT_NOZZLE)
        continue;
      pls__element_label (net, (int) k, label, sizeof label);
      if (!(isfinite (d) && d >= 0.0))
        return pls__error (err, PLS_ERR_INVALID, (int) k, -1, "%s: firing delay must be "
                           ">= 0 s, not %g s", label, d);
      if (d + o->on_time + o->close_ramp > period * (1.0 + 1e-12))
        return pls__error (err, PLS_ERR_INVALID, (int) k, -1, "%s: delay %g s + on_time + "
                           "close_ramp must end within the cycle (%g s)", label, d, period);
    }
  return PLS_OK;
}

pls_status
pls__transient_options (const pls_network *net, const pls_transient_options *options,
                        pls_transient_options *defaults, int cycle,
                        const pls_transient_options **o, pls_error *err)
{
  if (net == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
  if (options == NULL)
    {
      pls_transient_options_init (defaults);
      options = defaults;
    }
  *o = options;
  return pls_transient_check (net, options, cycle, err);
}

double
pls__stored_volume (const pls__model *m)
{
  double v = 0.0;
  size_t j;

  for (j = 0; j < m->nf; j++)
    {
      int i = m->col_node[j];

      v += pls__node_volume (m, (size_t) i, m->p[i], NULL);
    }
  return v;
}

void
pls__stats_add (const pls__model *m, pls_transient_stats *s)
{
  s->steps += m->steps;
  s->rejected += m->rejected;
  s->newton_iterations += m->newton_iterations;
  s->factorisations += m->factorisations;
}

pls_status
pls__transient_start (const pls_network *net, const pls_transient_options *o,
                      pls__model **out, pls_error *err)
{
  pls__model_options mo;
  pls_steady_options so;
  pls_steady_result *sr = NULL;
  pls__schedule closed;
  pls__model *m = NULL;
  pls_status st;

  *out = NULL;
  memset (&mo, 0, sizeof mo);
  mo.t_event = fmin (o->open_ramp, o->close_ramp);
  mo.per_wavelength = o->segments_per_wavelength;
  mo.min_segments = o->min_segments;
  mo.max_segments = o->max_segments;
  mo.air_on = 1;
  mo.air_pressure = o->air_pressure;
  st = pls__model_new (net, &mo, &m, err);
  if (st != PLS_OK)
    return st;
  m->tol.rtol = o->rtol;
  m->tol.atol_p = o->atol_pressure;
  m->tol.atol_q = o->atol_flow;
  m->tol.h_max = INFINITY;
  m->tol.h_min = 1e-13;

  /* Seed: the steady idle state, where the steady solve has one (parts it
   * leaves out start at zero and are settled below). */
  pls_steady_options_init (&so);
  so.air_on = 1;
  so.air_pressure = o->air_pressure;
  so.applicators = PLS_APPLICATORS_NONE;
  if (pls_solve_steady (net, &so, &sr, NULL) == PLS_OK && sr != NULL)
    pls__model_from_steady (m, sr);
  pls_steady_result_free (sr);

  memset (&closed, 0, sizeof closed);
  closed.kind = PLS__SCHED_CLOSED;
  st = pls__settle (m, &closed, 0.0, err);
  if (st != PLS_OK)
    {
      pls__model_free (m);
      return st;
    }
  *out = m;
  return PLS_OK;
}

/* ---- per-cycle bookkeeping ---------------------------------------------- */

typedef struct
{
  pls_cycle_result *r;
  double t_start, shot_end;
  size_t next_sample;
  double *pint;       /* n_nodes: integral of p over the cycle */
  double *last_out;   /* n_nodes: last time out of the recovery band */
  double *p_low;      /* model nodes: lowest pressure of the cycle */
  double frac;
} pls_tracker;

static void
pls_tracker_reset (pls_tracker *tr, pls__model *m, double t_start)
{
  pls_cycle_result *r = tr->r;
  const pls_network *net = m->net;
  size_t i, k;

  tr->t_start = t_start;
  tr->next_sample = 1;
  for (i = 0; i < r->n_nodes; i++)
    {
      r->pmin[i] = r->pmax[i] = m->p[i];
      tr->pint[i] = 0.0;
      tr->last_out[i] = -1.0;
      r->series[i * r->samples] = m->p[i];
    }
  memcpy (tr->p_low, m->p, m->n_nodes * sizeof *tr->p_low);
  for (k = 0; k < r->n_elements; k++)
    r->flow_series[k * r->samples] = m->elem_link[k] >= 0 ? m->q[m->elem_link[k]] : 0.0;
  for (k = 0; k < r->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      if (e->kind == PLS_ELEMENT_ACCUMULATOR)
        {
          double p = m->p[m->chamber[k]];
          double v = pls_accumulator_fluid_volume (&e->u.accumulator, p);

          r->acc[k].min_pressure = r->acc[k].max_pressure = p;
          r->acc[k].min_fluid_volume = r->acc[k].max_fluid_volume = v;
        }
      else if (e->kind == PLS_ELEMENT_PUMP && m->elem_link[k] >= 0)
        r->pump[k].min_flow = r->pump[k].max_flow = m->q[m->elem_link[k]];
    }
}

static double
pls_quad (double t0, double tg, double t1, double y0, double yg, double y1, double t)
{
  /* Lagrange interpolation through the step's three points. */
  double l0 = (t - tg) * (t - t1) / ((t0 - tg) * (t0 - t1));
  double lg = (t - t0) * (t - t1) / ((tg - t0) * (tg - t1));
  double l1 = (t - t0) * (t - tg) / ((t1 - t0) * (t1 - tg));

  return l0 * y0 + lg * yg + l1 * y1;
}

static int
pls_out_of_band (const pls_tracker *tr, size_t i, double p)
{
  double idle = tr->r->pidle[i];

  return fabs (p - idle) > tr->frac * fabs (idle);
}

static pls_status
pls_track_step (void *user_data, pls__model *m, double t0, double tg, double t1)
{
  pls_tracker *tr = user_data;
  pls_cycle_result *r = tr->r;
  const pls_network *net = m->net;
  const double gam = PLS_GAMMA, h = t1 - t0;
  const double w = 1.0 / (2.0 * (2.0 - gam)), w1 = (1.0 - gam) / (2.0 - gam);
  double dts = r->period / (double) (r->samples - 1);
  size_t i, k;

  for (i = 0; i < r->n_nodes; i++)
    {
      double a = m->p0[i], b = m->pg[i], c = m->p[i];

      r->pmin[i] = fmin (r->pmin[i], fmin (b, c));
      r->pmax[i] = fmax (r->pmax[i], fmax (b, c));
      tr->pint[i] += h * (w * (a + b) + w1 * c);
      if (t1 > tr->shot_end)
        {
          if (pls_out_of_band (tr, i, c))
            tr->last_out[i] = t1;
          else if (pls_out_of_band (tr, i, a) && t0 >= tr->shot_end)
            {
              /* Crossing back into the band: linear interpolation. */
              double idle = r->pidle[i], band = tr->frac * fabs (idle);
              double da = fabs (a - idle) - band, dc = fabs (c - idle) - band;

              tr->last_out[i] = t0 + h * da / (da - dc);
            }
        }
    }
  while (tr->next_sample < r->samples)
    {
      double ts = tr->t_start + dts * (double) tr->next_sample;

      if (ts > t1 + 1e-9 * h)
        break;
      for (i = 0; i < r->n_nodes; i++)
        r->series[i * r->samples + tr->next_sample]
          = pls_quad (t0, tg, t1, m->p0[i], m->pg[i], m->p[i], fmin (ts, t1));
      for (k = 0; k < r->n_elements; k++)
        {
          int l = m->elem_link[k];

          r->flow_series[k * r->samples + tr->next_sample]
            = l < 0 ? 0.0 : pls_quad (t0, tg, t1, m->q0[l], m->qg[l], m->q[l], fmin (ts, t1));
        }
      tr->next_sample++;
    }
  for (k = 0; k < r->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      if (e->kind == PLS_ELEMENT_ACCUMULATOR)
        {
          int c = m->chamber[k];
          double pb = m->pg[c], pc = m->p[c];

          r->acc[k].min_pressure = fmin (r->acc[k].min_pressure, fmin (pb, pc));
          r->acc[k].max_pressure = fmax (r->acc[k].max_pressure, fmax (pb, pc));
          r->acc[k].min_fluid_volume
            = fmin (r->acc[k].min_fluid_volume,
                    pls_accumulator_fluid_volume (&e->u.accumulator, fmin (pb, pc)));
          r->acc[k].max_fluid_volume
            = fmax (r->acc[k].max_fluid_volume,
                    pls_accumulator_fluid_volume (&e->u.accumulator, fmax (pb, pc)));
        }
      else if (e->kind == PLS_ELEMENT_PUMP && m->elem_link[k] >= 0)
        {
          int l = m->elem_link[k];

          r->pump[k].min_flow = fmin (r->pump[k].min_flow, fmin (m->qg[l], m->q[l]));
          r->pump[k].max_flow = fmax (r->pump[k].max_flow, fmax (m->qg[l], m->q[l]));
        }
    }
  pls__pocket_track (m, tr->p_low);
  return PLS_OK;
}

static pls_cycle_result *
pls_cycle_result_new (const pls_network *net, size_t samples)
{
  const pls_allocator *a = &net->alloc;
  size_t n = net->n_nodes, e = net->n_elements;
  pls_cycle_result *r = pls__calloc (a, 1, sizeof *r);

  if (r == NULL)
    return NULL;
  r->alloc = net->alloc;
  r->n_nodes = n;
  r->n_elements = e;
  r->samples = samples;
  r->segments = pls__calloc (a, e, sizeof *r->segments);
  r->pmin = pls__calloc (a, n, sizeof (double));
  r->pmax = pls__calloc (a, n, sizeof (double));
  r->pmean = pls__calloc (a, n, sizeof (double));
  r->pidle = pls__calloc (a, n, sizeof (double));
  r->recovery = pls__calloc (a, n, sizeof (double));
  r->series = pls__calloc (a, n * samples, sizeof (double));
  r->flow_series = pls__calloc (a, e * samples, sizeof (double));
  r->shot = pls__calloc (a, e, sizeof (double));
  r->shot_dev = pls__calloc (a, e, sizeof (double));
  r->first_shot = pls__calloc (a, e, sizeof (double));
  r->acc = pls__calloc (a, e, sizeof *r->acc);
  r->pump = pls__calloc (a, e, sizeof *r->pump);
  if (!r->segments || !r->pmin || !r->pmax || !r->pmean || !r->pidle || !r->recovery
      || !r->series || !r->flow_series || !r->shot || !r->shot_dev || !r->first_shot || !r->acc || !r->pump)
    {
      pls_cycle_result_free (r);
      return NULL;
    }
  return r;
}

void
pls_cycle_result_free (pls_cycle_result *r)
{
  pls_allocator a;

  if (r == NULL)
    return;
  a = r->alloc;
  pls__free (&a, r->segments);
  pls__free (&a, r->pmin);
  pls__free (&a, r->pmax);
  pls__free (&a, r->pmean);
  pls__free (&a, r->pidle);
  pls__free (&a, r->recovery);
  pls__free (&a, r->series);
  pls__free (&a, r->flow_series);
  pls__free (&a, r->shot);
  pls__free (&a, r->shot_dev);
  pls__free (&a, r->first_shot);
  pls__free (&a, r->acc);
  pls__free (&a, r->pump);
  pls__free (&a, r->findings.items);
  pls__free (&a, r);
}

/* Fills the per-cycle figures of r after the cycle [t0, t0 + T]. */
static pls_status
pls_cycle_finish (pls_cycle_result *r, pls__model *m, pls_tracker *tr, double v_start,
                  const pls_transient_options *o)
{
  const pls_network *net = m->net;
  const pls_allocator *a = &r->alloc;
  double rho = net->fluid.density, mean = 0.0;
  size_t i, k, n_app = 0, n_bad = 0;
  int worst_node = -1;
  double worst_dev = 0.0;

  for (i = 0; i < r->n_nodes; i++)
    {
      r->pmean[i] = tr->pint[i] / r->period;
      if (net->nodes[i].fixed)
        r->recovery[i] = 0.0;
      else if (pls_out_of_band (tr, i, m->p[i]))
        {
          r->recovery[i] = -1.0;
          n_bad++;
          if (worst_node < 0 || fabs (m->p[i] - r->pidle[i]) > worst_dev)
            {
              worst_node = (int) i;
              worst_dev = fabs (m->p[i] - r->pidle[i]);
            }
        }
      else
        r->recovery[i] = tr->last_out[i] < 0.0 ? 0.0
                         : tr->last_out[i] - tr->shot_end;
    }
  r->pumped = r->shot_total = 0.0;
  for (k = 0; k < r->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int l = m->elem_link[k];

      if (e->kind == PLS_ELEMENT_NOZZLE && l >= 0)
        {
          r->shot[k] = rho * m->qint[l];
          r->shot_total += m->qint[l];
          mean += r->shot[k];
          n_app++;
        }
      else if (e->kind == PLS_ELEMENT_PUMP && l >= 0)
        {
          r->pump[k].volume = m->qint[l];
          r->pump[k].mean_flow = m->qint[l] / r->period;
          r->pumped += m->qint[l];
        }
    }
  r->stored_change = pls__stored_volume (m) - v_start;
  if (n_app > 0)
    mean /= (double) n_app;
  for (k = 0; k < r->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_NOZZLE)
      r->shot_dev[k] = mean > 0.0 ? (r->shot[k] - mean) / mean : 0.0;

  /* Findings of the reported cycle. */
  r->findings.count = 0;
  if (worst_node >= 0)
    {
      char label[96];

      pls__node_label (net, worst_node, label, sizeof label);
      if (pls__finding_add (&r->findings, a, PLS_SEVERITY_WARNING, "no-recovery", -1,
                            worst_node, m->p[worst_node], r->pidle[worst_node],
                            "%s is not back within %g %% of its idle pressure before the "
                            "next shot (%zu node%s in all)", label,
                            100.0 * o->recovery_fraction, n_bad, n_bad == 1 ? "" : "s")
          != PLS_OK)
        return PLS_ERR_NOMEM;
    }
  if (pls__pocket_finding (&r->findings, a, m, tr->p_low, "cycle-cavitation", "firing cycle")
      != PLS_OK)
    return PLS_ERR_NOMEM;
  for (k = 0; k < r->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_NOZZLE
        && fabs (r->shot_dev[k]) > o->uniformity_tolerance)
      {
        char label[96];

        pls__element_label (net, (int) k, label, sizeof label);
        if (pls__finding_add (&r->findings, a, PLS_SEVERITY_WARNING, "shot-uniformity",
                              (int) k, net->elements[k].a, r->shot_dev[k],
                              o->uniformity_tolerance, "%s: shot %.4g g is %+.2f %% off "
                              "the mean along the manifold (tolerance %g %%)", label,
                              1e3 * r->shot[k], 100.0 * r->shot_dev[k],
                              100.0 * o->uniformity_tolerance) != PLS_OK)
          return PLS_ERR_NOMEM;
      }
  return PLS_OK;
}

/* Extrapolation of the cycle map x -> F(x) to its fixed point by reduced
 * rank extrapolation (RRE; Smith, Ford & Sidi, "Extrapolation methods for
 * vector sequences", SIAM Review 29(2), 1987, sec. 3, in its restarted
 * "cycling" form, sec. 6).  x_0 is the state at the start of a plain run
 * of cycles, x_1 .. x_L the states after each; u_j = x_{j+1} - x_j.  RRE
 * takes the weights gamma (sum 1) that minimise |sum gamma_j u_j|, i.e.
 * gamma = y / sum y with G y = 1, G_ij = <u_i, u_j>, and the estimate
 * s = sum gamma_j x_{j+1}.  Near the periodic state F is close to linear
 * and the change is made of a few slowly decaying modes (the accumulators
 * and hoses charged by the pump through the supply line), which L
 * differences remove exactly; L = 2 is the one-mode extrapolation of
 * Skelboe (IEEE Trans. Circuits Syst. 27(3), 1980).  The fit's residual
 * |sum gamma_j u_j| = 1 / sqrt(sum y) estimates the change left after
 * the jump: it is taken when that is below PLS_RRE_GAIN of the last plain
 * change, and the run restarts from s; a window of PLS_RRE_MAX differences
 * without such a fit slides on.  The weights are fitted on the pressures
 * (what the periodicity test measures; the end-of-cycle flows carry the
 * ringing of the last valve event) and applied to pressures and flows.
 * The convergence test always sees a plain cycle from the state it
 * measures, so the periodicity criterion is unchanged. */
#define PLS_RRE_MAX 6
#define PLS_RRE_GAIN 0.3
/* Largest jump, in multiples of the last change: a one-mode decay with
 * lambda = 0.995 asks for 199. */
#define PLS_RRE_JUMP 200.0

typedef struct
{
  size_t n;        /* vector length: free node pressures, link flows    */
  size_t nfit;     /* leading components the weights are fitted on      */
  int len;         /* vectors held: x_0 .. x_{len-1}                    */
  double pref, qref;
  double *x;       /* (PLS_RRE_MAX + 1) x n, scaled states             */
} pls_rre;

static void
pls_rre_pack (const pls__model *m, const pls_rre *e, double *x)
{
  size_t j, k;

  for (j = 0; j < m->nf; j++)
    x[j] = m->p[m->col_node[j]] / e->pref;
  for (k = 0; k < m->n_links; k++)
    x[m->nf + k] = m->q[k] / e->qref;
}

/* Solves the small dense system G y = b in place by Gaussian elimination
 * with partial pivoting; 0 if singular. */
static int
pls_rre_solve (double *g, double *b, int l)
{
  int i, j, k;

  for (k = 0; k < l; k++)
    {
      int piv = k;

      for (i = k + 1; i < l; i++)
        if (fabs (g[i * l + k]) > fabs (g[piv * l + k]))
          piv = i;
      if (!(fabs (g[piv * l + k]) > 0.0))
        return 0;
      if (piv != k)
        {
          double t;

          for (j = 0; j < l; j++)
            {
              t = g[k * l + j];
              g[k * l + j] = g[piv * l + j];
              g[piv * l + j] = t;
            }
          t = b[k];
          b[k] = b[piv];
          b[piv] = t;
        }
      for (i = k + 1; i < l; i++)
        {
          double f = g[i * l + k] / g[k * l + k];

          for (j = k; j < l; j++)
            g[i * l + j] -= f * g[k * l + j];
          b[i] -= f * b[k];
        }
    }
  for (k = l - 1; k >= 0; k--)
    {
      double v = b[k];

      for (j = k + 1; j < l; j++)
        v -= g[k * l + j] * b[j];
      b[k] = v / g[k * l + k];
    }
  return 1;
}

/* Restarts the sequence at the model's present state. */
static void
pls_rre_restart (pls_rre *e, const pls__model *m)
{
  size_t k;

  e->qref = 1e-12;
  for (k = 0; k < m->n_links; k++)
    e->qref = fmax (e->qref, fabs (m->q[k]));
  pls_rre_pack (m, e, e->x);
  e->len = 1;
}

/* Adds the state after a plain cycle; extrapolates (changing m->p, m->q)
 * and restarts when the fit promises enough. */
static void
pls_rre_add (pls_rre *e, pls__model *m)
{
  double g[PLS_RRE_MAX * PLS_RRE_MAX], y[PLS_RRE_MAX], gam[PLS_RRE_MAX];
  double sum = 0.0, res, last = 0.0, jump = 0.0, trace = 0.0;
  const size_t n = e->n;
  int i, j, l;
  size_t a;

  pls_rre_pack (m, e, e->x + (size_t) e->len * n);
  e->len++;
  l = e->len - 1;
  if (l < 2)
    return;
  for (i = 0; i < l; i++)
    for (j = i; j < l; j++)
      {
        const double *xi = e->x + (size_t) i * n, *xj = e->x + (size_t) j * n;
        double v = 0.0;

        for (a = 0; a < e->nfit; a++)
          v += (xi[n + a] - xi[a]) * (xj[n + a] - xj[a]);
        g[i * l + j] = g[j * l + i] = v;
      }
  last = g[(l - 1) * l + (l - 1)];
  for (i = 0; i < l; i++)
    trace += g[i * l + i];
  /* A relative ridge: the differences of a one-mode decay are parallel
   * and G singular; the ridge picks the least-norm weights then. */
  for (i = 0; i < l; i++)
    {
      g[i * l + i] += 1e-13 * trace;
      y[i] = 1.0;
    }
  if (!(last > 0.0) || !pls_rre_solve (g, y, l))
    goto slide;
  for (i = 0; i < l; i++)
    sum += y[i];
  if (!(sum > 0.0) || !isfinite (sum))
    goto slide;
  res = 1.0 / sum;            /* |sum gamma_j u_j|^2 */
  if (res >= PLS_RRE_GAIN * PLS_RRE_GAIN * last)
    goto slide;
  for (i = 0; i < l; i++)
    gam[i] = y[i] / sum;
  /* s - x_L = sum gamma_j (x_{j+1} - x_L), in the slot after x_L. */
  {
    double *s = e->x + (size_t) e->len * n;
    const double *xl = e->x + (size_t) l * n;

    for (a = 0; a < n; a++)
      {
        double v = 0.0;

        for (j = 0; j < l; j++)
          v += gam[j] * (e->x[(size_t) (j + 1) * n + a] - xl[a]);
        if (a < e->nfit)
          jump += v * v;
        s[a] = v;
      }
    if (!isfinite (jump) || jump > PLS_RRE_JUMP * PLS_RRE_JUMP * last)
      goto slide;
    for (a = 0; a < m->nf; a++)
      m->p[m->col_node[a]] += e->pref * s[a];
    for (a = 0; a < m->n_links; a++)
      m->q[a] += e->qref * s[m->nf + a];
    /* The predictor of the next step's first stage belongs to the state
     * before the jump. */
    m->pred_valid = 0;
  }
  pls_rre_restart (e, m);
  return;

slide:
  /* A full window without a good fit: the oldest state leaves it (the
   * newest cycles are the nearest to the linear regime). */
  if (e->len > PLS_RRE_MAX)
    {
      memmove (e->x, e->x + n, (size_t) (e->len - 1) * n * sizeof *e->x);
      e->len--;
    }
}

/* The start of the periodic run (pls_first_shot, pls_mean_correct). */
typedef struct
{
  pls__schedule held;   /* every valve at one opening                      */
  double flow;          /* the nozzles' total flow in the held state, m^3/s */
  double *p, *q;        /* the held state                                  */
} pls_mean_start;

/* The held steady state at ms->held.held from the model's state: into the
 * model, ms->p, ms->q and ms->flow. */
static pls_status
pls_mean_settle (pls__model *m, pls_mean_start *ms, pls_error *err)
{
  pls_status st = pls__settle (m, &ms->held, 0.0, err);
  size_t j;

  if (st != PLS_OK)
    return st;
  ms->flow = 0.0;
  for (j = 0; j < m->n_app; j++)
    ms->flow += m->q[m->app_link[j]];
  memcpy (ms->p, m->p, m->n_nodes * sizeof *m->p);
  memcpy (ms->q, m->q, m->n_links * sizeof *m->q);
  return PLS_OK;
}

/* The first shot from idle, which the rate search compares every shot
 * with: integrated from idle to the end of the shot, its volumes are the
 * nozzles' flow integrals.  Then the start of the periodic run: the
 * steady state with every valve held at its mean opening over the cycle
 * (on_time less half of each ramp, over the period), which draws about
 * the mean shot flow at about the mean pressures of the periodic state.
 * From idle the pump has to pull the line down to them through the slow
 * mode of the accumulator and the supply line (a pump near stall gives
 * little more flow for a lower pressure, so that mode loses only a few
 * per cent a cycle); from here what is left is the swing within the
 * cycle and the error of the mean shot flow (pls_mean_correct). */
static pls_status
pls_first_shot (pls__model *m, const pls__schedule *firing, pls_cycle_result *r,
                double shot_end, const pls_transient_options *o, pls_mean_start *ms,
                pls_error *err)
{
  const pls_network *net = m->net;
  pls_status st;
  size_t k;

  for (k = 0; k < m->n_links; k++)
    m->qint[k] = 0.0;
  st = pls__integrate (m, firing, 0.0, fmin (shot_end, firing->period), NULL, NULL, err);
  if (st != PLS_OK)
    return st;
  for (k = 0; k < r->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_NOZZLE && m->elem_link[k] >= 0)
      r->first_shot[k] = net->fluid.density * m->qint[m->elem_link[k]];
  memset (&ms->held, 0, sizeof ms->held);
  ms->held.kind = PLS__SCHED_HELD;
  ms->held.held = (o->on_time - 0.5 * o->open_ramp + 0.5 * o->close_ramp) / firing->period;
  /* Pumps start a fresh stroke, with no changeover gap pending. */
  pls__model_set_air (m, 1, o->air_pressure);
  return pls_mean_settle (m, ms, err);
}

/* After the first cycle from the held state x0 (opening s0, nozzle flow
 * Q0): its shots drew the volume S in the period T while the pump
 * delivered P.  Periodic means P = S, and with little slope in the pump's
 * curve near stall a small flow error moves the balancing pressure a lot.
 * A second held state x1 at s1 = s0 (1 + (S - P) / (Q0 T)) (nozzle flow
 * Q1) gives the direction along which the line's stored state moves: a
 * step a (x1 - x0) changes the pump's delivery by about a (Q1 - Q0) T and
 * the shots by a S (r - 1), r = (Q1 / s1) / (Q0 / s0) the change of a
 * nozzle's flow per opening with the pressure.  The cycle's end state is
 * moved by the a that balances the two: one secant step along the slow
 * mode, which keeps the within-cycle swing the cycle has built.  Skipped
 * when the flows are far apart (a starved line, whose mean pressures the
 * held state does not describe). */
static pls_status
pls_mean_correct (pls__model *m, pls_mean_start *ms, double shot, double pumped,
                  double period, pls_error *err)
{
  /* The cycle's offset from x0 waits in the predictor's arrays, which
   * settling does not use (and the jump invalidates). */
  double ratio = 1.0 + (shot - pumped) / (ms->flow * period);
  double *dp = m->pred_p0, *dq = m->pred_q0, *p0 = m->pred_pg, *q0 = m->pred_qg;
  double s0 = ms->held.held, q0_flow = ms->flow, r, den, step;
  size_t i, k;
  pls_status st;

  if (!(ratio > 0.8 && ratio < 1.25) || ratio == 1.0)
    return PLS_OK;
  for (i = 0; i < m->n_nodes; i++)
    dp[i] = m->p[i] - ms->p[i];
  for (k = 0; k < m->n_links; k++)
    dq[k] = m->q[k] - ms->q[k];
  memcpy (p0, ms->p, m->n_nodes * sizeof *p0);
  memcpy (q0, ms->q, m->n_links * sizeof *q0);
  memcpy (m->p, ms->p, m->n_nodes * sizeof *m->p);
  memcpy (m->q, ms->q, m->n_links * sizeof *m->q);
  ms->held.held = s0 * ratio;
  st = pls_mean_settle (m, ms, err);
  if (st != PLS_OK)
    return st;
  r = (ms->flow / ms->held.held) / (q0_flow / s0);
  den = (ms->flow - q0_flow) * period - shot * (r - 1.0);
  step = (shot - pumped) / den;
  if (!(isfinite (step) && step > 0.0 && step < 4.0))
    step = 1.0;
  for (i = 0; i < m->n_nodes; i++)
    if (!m->nodes[i].fixed)
      m->p[i] = p0[i] + dp[i] + step * (m->p[i] - p0[i]);
  for (k = 0; k < m->n_links; k++)
    m->q[k] = q0[k] + dq[k] + step * (m->q[k] - q0[k]);
  m->pred_valid = 0;
  return PLS_OK;
}

/* Secant steps along the held states, after the first cycles (a second
 * one helps a large manifold little: what is left there is its own
 * recovery, not the pump's balance). */
#define PLS_MEAN_CORRECTIONS 1

/* The cycle run on a started model; r gets the results. */
static pls_status
pls_run_cycles (pls__model *m, const pls_transient_options *o, pls_cycle_result *r,
                pls_error *err)
{
  const pls_network *net = m->net;
  const pls_allocator *a = &net->alloc;
  pls__schedule s;
  pls_tracker tr;
  double *app_delay = NULL, *pprev = NULL, pref = 1.0, t = 0.0, max_delay = 0.0;
  pls_mean_start ms;
  pls_rre rre;
  pls_status st = PLS_OK;
  size_t i, j;
  int c;

  memset (&tr, 0, sizeof tr);
  r->period = 1.0 / o->cycle_rate;
  app_delay = pls__calloc (a, m->n_app + 1, sizeof *app_delay);
  pprev = pls__calloc (a, m->n_nodes, sizeof *pprev);
  memset (&rre, 0, sizeof rre);
  rre.n = m->nf + m->n_links;
  rre.nfit = m->nf;
  /* PLS_RRE_MAX + 2 vectors: x_0 .. x_L and the jump. */
  rre.x = pls__calloc (a, (PLS_RRE_MAX + 2) * rre.n + 1, sizeof *rre.x);
  tr.pint = pls__calloc (a, r->n_nodes, sizeof (double));
  tr.last_out = pls__calloc (a, r->n_nodes, sizeof (double));
  tr.p_low = pls__calloc (a, m->n_nodes, sizeof (double));
  memset (&ms, 0, sizeof ms);
  ms.p = pls__calloc (a, m->n_nodes, sizeof (double));
  ms.q = pls__calloc (a, m->n_links + 1, sizeof (double));
  if (!app_delay || !pprev || !rre.x || !tr.pint || !tr.last_out || !tr.p_low || !ms.p
      || !ms.q)
    {
      st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the cycle run");
      goto out;
    }
  for (j = 0; j < m->n_app; j++)
    {
      app_delay[j] = o->delays != NULL ? o->delays[m->app_elem[j]] : 0.0;
      max_delay = fmax (max_delay, app_delay[j]);
    }
  memset (&s, 0, sizeof s);
  s.kind = PLS__SCHED_FIRING;
  s.period = r->period;
  s.on_time = o->on_time;
  s.open_ramp = o->open_ramp;
  s.close_ramp = o->close_ramp;
  s.delay = app_delay;
  m->tol.h_max = r->period / 20.0;
  m->tol.h_min = 1e-10 * r->period;

  tr.r = r;
  tr.frac = o->recovery_fraction;
  tr.shot_end = max_delay + o->on_time + o->close_ramp;
  for (i = 0; i < r->n_nodes; i++)
    {
      r->pidle[i] = m->p[i];
      pref = fmax (pref, fabs (m->p[i]));
    }
  rre.pref = pref;
  st = pls_first_shot (m, &s, r, tr.shot_end, o, &ms, err);
  if (st != PLS_OK)
    goto out;
  memcpy (pprev, m->p, m->n_nodes * sizeof *pprev);
  pls_rre_restart (&rre, m);
  for (c = 1; c <= o->max_cycles; c++)
    {
      double v_start = pls__stored_volume (m), change = 0.0;
      size_t k;

      for (k = 0; k < m->n_links; k++)
        m->qint[k] = 0.0;
      pls_tracker_reset (&tr, m, t);
      tr.shot_end = t + max_delay + o->on_time + o->close_ramp;
      st = pls__integrate (m, &s, t, t + r->period, pls_track_step, &tr, err);
      if (st != PLS_OK)
        goto out;
      t += r->period;
      st = pls_cycle_finish (r, m, &tr, v_start, o);
      if (st != PLS_OK)
        {
          st = pls__error (err, st, -1, -1, "out of memory in the cycle run");
          goto out;
        }
      for (i = 0; i < m->n_nodes; i++)
        if (!m->nodes[i].fixed)
          change = fmax (change, fabs (m->p[i] - pprev[i]) / pref);
      r->cycles = c;
      r->change = change;
      if (change < o->periodic_tolerance)
        {
          r->periodic = 1;
          break;
        }
      if (c <= PLS_MEAN_CORRECTIONS)
        {
          st = pls_mean_correct (m, &ms, r->shot_total, r->pumped, r->period, err);
          if (st != PLS_OK)
            goto out;
          pls_rre_restart (&rre, m);
        }
      else
        pls_rre_add (&rre, m);
      memcpy (pprev, m->p, m->n_nodes * sizeof *pprev);
    }
  if (!r->periodic
      && pls__finding_add (&r->findings, a, PLS_SEVERITY_WARNING, "not-periodic", -1, -1,
                           r->change, o->periodic_tolerance, "the firing cycle was not "
                           "periodic after %d cycles (change %.3g, tolerance %.3g)",
                           r->cycles, r->change, o->periodic_tolerance) != PLS_OK)
    st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the cycle run");

out:
  pls__free (a, app_delay);
  pls__free (a, pprev);
  pls__free (a, rre.x);
  pls__free (a, tr.pint);
  pls__free (a, tr.last_out);
  pls__free (a, tr.p_low);
  pls__free (a, ms.p);
  pls__free (a, ms.q);
  return st;
}

pls_status
pls_solve_cycle (const pls_network *net, const pls_transient_options *options,
                 pls_cycle_result **out, pls_error *err)
{
  pls_transient_options defaults;
  const pls_transient_options *o = options;
  pls_cycle_result *r = NULL;
  pls__model *m = NULL;
  double t0 = pls__now ();
  pls_status st;

  pls__error_clear (err);
  if (out == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the result");
  *out = NULL;
  st = pls__transient_options (net, options, &defaults, 1, &o, err);
  if (st != PLS_OK)
    return st;
  r = pls_cycle_result_new (net, (size_t) o->samples);
  if (r == NULL)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the cycle run");
  st = pls__transient_start (net, o, &m, err);
  if (st == PLS_OK)
    {
      memcpy (r->segments, m->segments, net->n_elements * sizeof *r->segments);
      st = pls_run_cycles (m, o, r, err);
    }
  if (m != NULL)
    pls__stats_add (m, &r->stats);
  pls__model_free (m);
  if (st != PLS_OK)
    {
      pls_cycle_result_free (r);
      return st;
    }
  r->stats.wall_seconds = pls__now () - t0;
  *out = r;
  return PLS_OK;
}

/* ---- read-back ----------------------------------------------------------- */

#define NODE_OK(r, i) ((r) != NULL && (i) >= 0 && (size_t) (i) < (r)->n_nodes)
#define ELEM_OK(r, k) ((r) != NULL && (k) >= 0 && (size_t) (k) < (r)->n_elements)

int
pls_cycle_result_cycles (const pls_cycle_result *r)
{
  return r != NULL ? r->cycles : 0;
}

int
pls_cycle_result_periodic (const pls_cycle_result *r)
{
  return r != NULL ? r->periodic : 0;
}

double
pls_cycle_result_change (const pls_cycle_result *r)
{
  return r != NULL ? r->change : 0.0;
}

void
pls_cycle_result_stats (const pls_cycle_result *r, pls_transient_stats *out)
{
  if (out == NULL)
    return;
  if (r == NULL)
    memset (out, 0, sizeof *out);
  else
    *out = r->stats;
}

int
pls_cycle_result_segments (const pls_cycle_result *r, int element)
{
  return ELEM_OK (r, element) ? r->segments[element] : 0;
}

double
pls_cycle_node_min (const pls_cycle_result *r, int node)
{
  return NODE_OK (r, node) ? r->pmin[node] : 0.0;
}

double
pls_cycle_node_max (const pls_cycle_result *r, int node)
{
  return NODE_OK (r, node) ? r->pmax[node] : 0.0;
}

double
pls_cycle_node_mean (const pls_cycle_result *r, int node)
{
  return NODE_OK (r, node) ? r->pmean[node] : 0.0;
}

double
pls_cycle_node_idle (const pls_cycle_result *r, int node)
{
  return NODE_OK (r, node) ? r->pidle[node] : 0.0;
}

double
pls_cycle_node_recovery (const pls_cycle_result *r, int node)
{
  return NODE_OK (r, node) ? r->recovery[node] : 0.0;
}

size_t
pls_cycle_sample_count (const pls_cycle_result *r)
{
  return r != NULL ? r->samples : 0;
}

double
pls_cycle_sample_time (const pls_cycle_result *r, size_t i)
{
  if (r == NULL || i >= r->samples)
    return 0.0;
  return r->period * (double) i / (double) (r->samples - 1);
}

double
pls_cycle_sample_pressure (const pls_cycle_result *r, int node, size_t i)
{
  if (!NODE_OK (r, node) || i >= r->samples)
    return 0.0;
  return r->series[(size_t) node * r->samples + i];
}

double
pls_cycle_sample_flow (const pls_cycle_result *r, int element, size_t i)
{
  if (!ELEM_OK (r, element) || i >= r->samples)
    return 0.0;
  return r->flow_series[(size_t) element * r->samples + i];
}

double
pls_cycle_shot_mass (const pls_cycle_result *r, int element)
{
  return ELEM_OK (r, element) ? r->shot[element] : 0.0;
}

double
pls_cycle_shot_deviation (const pls_cycle_result *r, int element)
{
  return ELEM_OK (r, element) ? r->shot_dev[element] : 0.0;
}

double
pls_cycle_first_shot_mass (const pls_cycle_result *r, int element)
{
  return ELEM_OK (r, element) ? r->first_shot[element] : 0.0;
}

pls_status
pls_cycle_accumulator_swing (const pls_cycle_result *r, int element,
                             pls_cycle_accumulator *out)
{
  if (out == NULL)
    return PLS_ERR_INVALID;
  memset (out, 0, sizeof *out);
  if (!ELEM_OK (r, element))
    return PLS_ERR_INVALID;
  *out = r->acc[element];
  return PLS_OK;
}

pls_status
pls_cycle_pump_flow (const pls_cycle_result *r, int element, pls_cycle_pump *out)
{
  if (out == NULL)
    return PLS_ERR_INVALID;
  memset (out, 0, sizeof *out);
  if (!ELEM_OK (r, element))
    return PLS_ERR_INVALID;
  *out = r->pump[element];
  return PLS_OK;
}

void
pls_cycle_result_volumes (const pls_cycle_result *r, double *pumped, double *shot,
                          double *stored_change)
{
  if (pumped != NULL)
    *pumped = r != NULL ? r->pumped : 0.0;
  if (shot != NULL)
    *shot = r != NULL ? r->shot_total : 0.0;
  if (stored_change != NULL)
    *stored_change = r != NULL ? r->stored_change : 0.0;
}

size_t
pls_cycle_finding_count (const pls_cycle_result *r)
{
  return r != NULL ? r->findings.count : 0;
}

const pls_finding *
pls_cycle_finding (const pls_cycle_result *r, size_t index)
{
  if (r == NULL || index >= r->findings.count)
    return NULL;
  return &r->findings.items[index];
}

/* ---- highest rate -------------------------------------------------------- */

/* 1 if every shot at this rate is within the tolerance of the mean and of
 * its first shot from idle. */
static pls_status
pls_rate_ok (const pls_network *net, const pls_transient_options *base, double rate,
             int *ok, pls_transient_stats *stats, pls_error *err)
{
  pls_transient_options o = *base;
  pls_cycle_result *r = NULL;
  pls_status st;
  size_t k;

  o.cycle_rate = rate;
  st = pls_solve_cycle (net, &o, &r, err);
  if (st != PLS_OK)
    return st;
  *ok = 1;
  for (k = 0; k < r->n_elements; k++)
    {
      double first = r->first_shot[k];

      if (net->elements[k].kind != PLS_ELEMENT_NOZZLE)
        continue;
      if (fabs (r->shot_dev[k]) > o.uniformity_tolerance
          || (first > 0.0 && fabs (r->shot[k] - first) > o.uniformity_tolerance * first))
        *ok = 0;
    }
  if (stats != NULL)
    {
      stats->steps += r->stats.steps;
      stats->rejected += r->stats.rejected;
      stats->newton_iterations += r->stats.newton_iterations;
      stats->factorisations += r->stats.factorisations;
      stats->wall_seconds += r->stats.wall_seconds;
    }
  pls_cycle_result_free (r);
  return PLS_OK;
}

pls_status
pls_cycle_max_rate (const pls_network *net, const pls_transient_options *options,
                    double rate_low, double *rate, pls_transient_stats *stats,
                    pls_error *err)
{
  pls_transient_options defaults;
  const pls_transient_options *o = options;
  double lo = rate_low, hi, span = 0.0;
  pls_status st;
  size_t k;
  int ok = 0;

  pls__error_clear (err);
  if (rate == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the rate");
  *rate = 0.0;
  if (net == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
  if (o == NULL)
    {
      pls_transient_options_init (&defaults);
      o = &defaults;
    }
  if (stats != NULL)
    memset (stats, 0, sizeof *stats);
  /* The fastest schedule the valves allow: the longest delay + on-time +
   * closing ramp fills the whole cycle. */
  for (k = 0; k < net->n_elements; k++)
    if (net->elements[k].kind == PLS_ELEMENT_NOZZLE && o->delays != NULL
        && k < o->delay_count)
      span = fmax (span, o->delays[k]);
  span += o->on_time + o->close_ramp;
  if (!(span > 0.0) || !isfinite (span))
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "firing schedule: on_time must be "
                       "positive, not %g s", o->on_time);
  hi = (1.0 - 1e-9) / span;
  if (!(isfinite (rate_low) && rate_low > 0.0 && rate_low < hi))
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "rate search: the lowest rate must be "
                       "positive and below %g /s, not %g /s", hi, rate_low);
  st = pls_rate_ok (net, o, lo, &ok, stats, err);
  if (st != PLS_OK || !ok)
    return st;
  st = pls_rate_ok (net, o, hi, &ok, stats, err);
  if (st != PLS_OK)
    return st;
  if (ok)
    {
      *rate = hi;
      return PLS_OK;
    }
  while (hi - lo > 0.01 * lo)
    {
      double mid = 0.5 * (lo + hi);

      st = pls_rate_ok (net, o, mid, &ok, stats, err);
      if (st != PLS_OK)
        return st;
      if (ok)
        lo = mid;
      else
        hi = mid;
    }
  *rate = lo;
  return PLS_OK;
}
