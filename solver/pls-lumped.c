/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-lumped.c: the lumped R-L-C model of a network for the time-domain
 * side.
 *
 * Lines are cut into pi-segments: each segment is a link with the
 * inertance I = rho dx / A and the line's own law scaled to the segment's
 * length (every line law is a drop per length), and half of its
 * compliance C = C' dx sits at each end (e.g. Wylie & Streeter, Fluid
 * Transients in Systems, 1993, ch. 12, lumped-parameter lines).  The
 * number of segments follows from the shortest wavelength of interest,
 * lambda = c t_event with t_event the fastest valve ramp, at
 * per_wavelength segments a wavelength (13 keep the first resonance of the
 * discrete ladder within 1 %: w1,N / w1 = (4N/pi) sin(pi/(4N))), clamped to
 * [min_segments, max_segments].
 *
 * Wall compliance: a rigid pipe by Korteweg's formula (Korteweg 1878;
 * Wylie & Streeter eq. 2.18 for a thin-walled pipe free to stretch),
 * 1/K_eff = 1/K + D/(E e); a hose by its datasheet's volumetric expansion
 * per length and pressure, added to the fluid's A/K (hoses do not follow
 * Korteweg: their reinforcement makes the wall response nonlinear and
 * time-dependent, so only a measured figure is honest).
 *
 * Accumulator: a gas chamber node with the polytropic fluid volume
 * Vf(p) = V0 [1 - (p0/p)^(1/n)] (absolute pressures), joined to its node
 * by the neck, a rigid pipe of the neck's length and bore (inertance and
 * resistance from the line law); at precharge the bladder shuts the port,
 * a switched state (pls-bladder.c).
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pls-transient-private.h"

/* A node with no line, chamber or other volume still holds some fluid
 * (the bore of the fitting or tee it stands for).  0.1 mL, a modelling
 * choice (common practice, no source): it keeps every free node's stored
 * volume strictly increasing, so the nodal matrix stays positive definite
 * even where only algebraic elements meet, and makes the system an ODE. */
#define PLS_NODE_FLOOR_VOLUME 1e-7

void
pls__line_wave (const pls_fluid_params *f, const pls_line_params *l, double *speed,
                double *compliance_per_length)
{
  double area = 0.25 * PLS_PI * l->bore * l->bore, cp;

  if (l->kind == PLS_LINE_PIPE)
    {
      /* Korteweg: 1/K_eff = 1/K + D / (E e); no wall figure = rigid wall. */
      double inv = 1.0 / f->bulk_modulus;

      if (l->wall_thickness > 0.0 && l->youngs_modulus > 0.0)
        inv += l->bore / (l->youngs_modulus * l->wall_thickness);
      cp = area * inv;
    }
  else
    cp = area / f->bulk_modulus + l->volumetric_expansion;
  /* c = sqrt(A / (rho C')), from I' = rho / A and C' (Wylie & Streeter). */
  if (speed != NULL)
    *speed = sqrt (area / (f->density * cp));
  if (compliance_per_length != NULL)
    *compliance_per_length = cp;
}

double
pls__accumulator_slope (const pls_accumulator_params *p, double pressure)
{
  double slope;

  pls__bladder_volume (p, pressure, &slope);
  return slope;
}

double
pls__chamber_volume (const pls__model *m, const pls__tnode *nd, double p, double *slope)
{
  const pls_accumulator_params *ap = &m->net->elements[nd->acc].u.accumulator;
  double sa, v = nd->compliance * p + pls__bladder_volume (ap, p, &sa);

  if (slope != NULL)
    *slope = nd->compliance + sa;
  return v;
}

void
pls__model_set_air (pls__model *m, int air_on, double air_pressure)
{
  size_t k;

  m->air_on = air_on;
  m->air_pressure = air_pressure;
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];
      const pls_element *e = &m->net->elements[l->elem];

      if (l->kind != PLS__LINK_ELEMENT)
        m->active[k] = 1;
      else if (e->kind == PLS_ELEMENT_PUMP)
        m->active[k] = air_on != 0;
      else if (e->kind == PLS_ELEMENT_VALVE && e->u.valve.kind == PLS_VALVE_DUMP)
        m->active[k] = air_on == 0;
      else
        m->active[k] = 1;
      if (!m->active[k])
        m->q[k] = 0.0;
      m->stroke[k] = 0.0;
      m->gap_end[k] = 0.0;
    }
}

/* Valve opening of applicator j at time t under a schedule: linear ramps
 * (the valve's flow area grows in proportion to its travel, a modelling
 * choice), open for on_time from the start of opening to the start of
 * closing. */
static double
pls_opening (const pls__schedule *s, size_t j, double t)
{
  switch (s->kind)
    {
    case PLS__SCHED_OPEN:
      return 1.0;
    case PLS__SCHED_HELD:
      return s->held;
    case PLS__SCHED_CLOSE_AT:
      if (t <= s->t_close)
        return 1.0;
      if (t >= s->t_close + s->close_ramp)
        return 0.0;
      return 1.0 - (t - s->t_close) / s->close_ramp;
    case PLS__SCHED_FIRING:
      {
        double d = s->delay != NULL ? s->delay[j] : 0.0, x = t - d;
        double ph = x - s->period * floor (x / s->period);

        /* Phases within a hair of the period are the next cycle's start. */
        if (s->period - ph < 1e-12 * s->period)
          ph = 0.0;
        if (ph < s->open_ramp)
          return ph / s->open_ramp;
        if (ph <= s->on_time)
          return 1.0;
        if (ph < s->on_time + s->close_ramp)
          return 1.0 - (ph - s->on_time) / s->close_ramp;
        return 0.0;
      }
    case PLS__SCHED_CLOSED:
    default:
      return 0.0;
    }
}

void
pls__schedule_apply (pls__model *m, const pls__schedule *s, double t)
{
  size_t j;

  for (j = 0; j < m->n_app; j++)
    {
      double o = pls_opening (s, j, t);

      /* Openings below 1e-12 are shut: the law's slope /s would overflow. */
      m->open[j] = o > 1e-12 ? o : 0.0;
    }
}

double
pls__schedule_next_event (const pls__model *m, const pls__schedule *s, double t)
{
  double best = INFINITY, eps = 1e-12 * (1.0 + fabs (t));
  size_t j;

  if (s->kind == PLS__SCHED_CLOSE_AT)
    {
      if (s->t_close > t + eps)
        return s->t_close;
      if (s->t_close + s->close_ramp > t + eps)
        return s->t_close + s->close_ramp;
      return INFINITY;
    }
  if (s->kind != PLS__SCHED_FIRING)
    return INFINITY;
  for (j = 0; j < m->n_app; j++)
    {
      double d = s->delay != NULL ? s->delay[j] : 0.0;
      double k = floor ((t - d) / s->period), off[4];
      int c, i;

      off[0] = 0.0;
      off[1] = s->open_ramp;
      off[2] = s->on_time;
      off[3] = s->on_time + s->close_ramp;
      for (c = 0; c < 2; c++)
        for (i = 0; i < 4; i++)
          {
            double te = d + (k + c) * s->period + off[i];

            if (te > t + eps && te < best)
              best = te;
          }
    }
  return best;
}

static pls_status
pls_model_alloc (pls__model *m)
{
  const pls_allocator *a = m->alloc;
  size_t n = m->n_nodes, l = m->n_links, e = m->net->n_elements;

  m->nodes = pls__calloc (a, n, sizeof *m->nodes);
  m->links = pls__calloc (a, l, sizeof *m->links);
  m->segments = pls__calloc (a, e, sizeof *m->segments);
  m->chamber = pls__malloc (a, (e + 1) * sizeof *m->chamber);
  m->chamber_node = pls__malloc (a, (e + 1) * sizeof *m->chamber_node);
  m->elem_link = pls__malloc (a, (e + 1) * sizeof *m->elem_link);
  m->app_elem = pls__calloc (a, m->n_app + 1, sizeof *m->app_elem);
  m->app_link = pls__calloc (a, m->n_app + 1, sizeof *m->app_link);
  m->open = pls__calloc (a, m->n_app + 1, sizeof *m->open);
  m->col_node = pls__calloc (a, n, sizeof *m->col_node);
  m->active = pls__calloc (a, l, 1);
  m->shut = pls__calloc (a, l + 1, 1);
  m->algebraic = pls__calloc (a, l + 1, 1);
  m->on = pls__calloc (a, l + 1, 1);
  if (!m->chamber_node || !m->on || !m->shut || !m->algebraic || !m->nodes || !m->links
      || !m->segments || !m->chamber || !m->elem_link || !m->app_elem || !m->app_link || !m->open || !m->col_node
      || !m->active)
    return PLS_ERR_NOMEM;
  {
    double **nv[] = { &m->p, &m->p0, &m->pg, &m->hist_v, &m->fv0, &m->fvg, &m->fv1,
                      &m->rn, &m->dp, &m->ev, &m->pred_p0, &m->pred_pg, &m->head,
                      &m->xs };
    double **lv[] = { &m->q, &m->q0, &m->qg, &m->hist_q, &m->fq0, &m->fqg, &m->fq1,
                      &m->g, &m->rl, &m->dq, &m->eq, &m->h, &m->dh, &m->qint,
                      &m->stroke, &m->gap_end, &m->pred_q0, &m->pred_qg };
    size_t i;

    for (i = 0; i < sizeof nv / sizeof nv[0]; i++)
      if ((*nv[i] = pls__calloc (a, n, sizeof (double))) == NULL)
        return PLS_ERR_NOMEM;
    for (i = 0; i < sizeof lv / sizeof lv[0]; i++)
      if ((*lv[i] = pls__calloc (a, l, sizeof (double))) == NULL)
        return PLS_ERR_NOMEM;
  }
  return PLS_OK;
}

void
pls__model_free (pls__model *m)
{
  const pls_allocator *a;

  if (m == NULL)
    return;
  a = m->alloc;
  if (m->c_started)
    {
      const pls_allocator *prev = pls__cholmod_enter (a);

      cholmod_free_dense (&m->X, &m->c);
      cholmod_free_dense (&m->Y, &m->c);
      cholmod_free_dense (&m->E, &m->c);
      cholmod_free_dense (&m->B, &m->c);
      cholmod_free_factor (&m->L, &m->c);
      cholmod_free_sparse (&m->A, &m->c);
      cholmod_finish (&m->c);
      pls__cholmod_leave (prev);
    }
  pls__work_free (&m->w);
  {
    double *v[] = { m->p, m->p0, m->pg, m->hist_v, m->fv0, m->fvg, m->fv1, m->rn, m->dp,
                    m->ev, m->head, m->q, m->q0, m->qg, m->hist_q, m->fq0, m->fqg, m->fq1, m->g,
                    m->rl, m->dq, m->eq, m->h, m->dh, m->qint, m->stroke,
                    m->gap_end, m->pred_p0, m->pred_pg, m->pred_q0, m->pred_qg, m->xs };
    size_t i;

    for (i = 0; i < sizeof v / sizeof v[0]; i++)
      pls__free (a, v[i]);
  }
  pls__free (a, m->nodes);
  pls__free (a, m->links);
  pls__free (a, m->segments);
  pls__free (a, m->chamber);
  pls__free (a, m->chamber_node);
  pls__free (a, m->elem_link);
  pls__free (a, m->app_elem);
  pls__free (a, m->app_link);
  pls__free (a, m->open);
  pls__free (a, m->col_node);
  pls__free (a, m->active);
  pls__free (a, m->shut);
  pls__free (a, m->algebraic);
  pls__free (a, m->on);
  pls__free (a, m);
}

/* Segments of a line: ceil(per_wavelength L / (c t_event)), clamped. */
static int
pls_line_segments (const pls_network *net, const pls_line_params *l,
                   const pls__model_options *o)
{
  double c, n;

  pls__line_wave (&net->fluid, l, &c, NULL);
  n = ceil (o->per_wavelength * l->length / (c * o->t_event) - 1e-9);
  if (!(n >= o->min_segments))
    n = o->min_segments;
  if (n > o->max_segments)
    n = o->max_segments;
  return (int) n;
}

/* The laminar branch of pls_line_drop for a Newtonian fluid, as a constant
 * resistance: Hagen-Poiseuille, h = 128 mu L q / (pi D^4) (written as
 * pls_line_drop has it, 2 L tau_w / R with tau_w = 4 mu q / (pi R^3)), which
 * pls_line_drop returns for every flow whose Reynolds number
 * Re = rho V D / mu = 2 rho |q| (pi R^3) / (mu A^2) is at or below the
 * transition band's lower end.  lam_qmax is that flow less 1e-9 of it, so a
 * rounding difference in Re never takes the shortcut where the full law
 * would blend in turbulent friction.  Every Newton iteration evaluates
 * every link: on a large manifold this is most of the law work. */
/* The power-law counterpart: pls_line_drop's laminar closed form
 * (Rabinowitsch-Mooney, regularised below the corner wall rate gamma_c;
 * see power_law_wall_state in pls-line.c), h = scale (2L/R) tau_w with
 *   tau_w = K gamma (gamma^2 + gamma_c^2)^((n-1)/2),  gamma = s |q|,
 *   s = (3n+1) / (pi n R^3),  gamma_c = gc exp(log1p((n-1)/(3n+1))/(n-1)),
 * taken while the Metzner-Reed number 8 rho V^2 / tau_w is at or below the
 * Ryan-Johnson onset.  gamma_c and the onset depend only on the fluid:
 * computing them once leaves one power (an exp of a log) per evaluation
 * of the three transcendental pairs the full law takes.  The factors
 * scale 2L/R and 8 rho / A^2 are folded too, so an evaluation has no
 * division; it agrees with the full law to some 1e-14 relative. */
static void
pls_power_law_shortcut (const pls_fluid_params *f, const pls_line_params *line, double scale,
                        pls__tlink *l)
{
  double n = f->flow_index, d = line->bore, r = 0.5 * d, expo, area;

  if (f->law != PLS_VISCOSITY_POWER_LAW || !(n > 0.0) || !(r > 0.0)
      || !(line->length > 0.0) || !(f->consistency > 0.0))
    return;
  /* The expressions of pls-line.c, so the values are the same doubles. */
  expo = n == 1.0 ? 0.25 : log1p ((n - 1.0) / (3.0 * n + 1.0)) / (n - 1.0);
  l->pl_gc = PLS_POWER_LAW_PLATEAU_SHEAR * exp (expo);
  l->pl_s = (3.0 * n + 1.0) / (PLS_PI * n * r * r * r);
  area = 0.25 * PLS_PI * d * d;
  l->pl_h = scale * 2.0 * line->length / r;
  l->pl_re = 8.0 * f->density / (area * area);
  pls_line_transition_band (f, &l->pl_re_lo, NULL);
  l->pl_on = isfinite (l->pl_gc) && isfinite (l->pl_s) && isfinite (l->pl_re_lo)
             && isfinite (l->pl_h) && isfinite (l->pl_re);
}

static void
pls_laminar_shortcut (const pls_fluid_params *f, const pls_line_params *line, double scale,
                      pls__tlink *l)
{
  double r = 0.5 * line->bore, k = PLS_PI * r * r * r, area = PLS_PI * r * r;
  double mu0, re_lo;

  l->lam_r = 0.0;
  l->lam_qmax = 0.0;
  l->pl_on = 0;
  if (!pls_fluid_is_newtonian (f))
    {
      pls_power_law_shortcut (f, line, scale, l);
      return;
    }
  mu0 = pls_fluid_zero_shear_viscosity (f);
  pls_line_transition_band (f, &re_lo, NULL);
  if (!(mu0 > 0.0 && isfinite (mu0) && r > 0.0 && line->length > 0.0))
    return;
  l->lam_r = 2.0 * line->length * (4.0 * mu0 / k) / r * scale;
  l->lam_qmax = (1.0 - 1e-9) * re_lo * mu0 * area * area / (2.0 * f->density * k);
  if (!(isfinite (l->lam_r) && l->lam_r > 0.0 && isfinite (l->lam_qmax)))
    l->lam_qmax = 0.0;
}

/* The links' matrix columns from the nodes' into the pattern's records,
 * and the pattern (pls__pattern, shared with the steady solve). */
static pls_status
pls_model_pattern (pls__model *m)
{
  pls_work *w = &m->w;
  size_t k;

  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];

      w->links[k].elem = l->elem;
      w->links[k].ca = m->nodes[l->a].col;
      w->links[k].cb = l->b >= 0 ? m->nodes[l->b].col : -1;
    }
  pls__free (m->alloc, w->ap);
  pls__free (m->alloc, w->ai);
  w->ap = NULL;
  w->ai = NULL;
  return pls__pattern (w);
}

/* The nodal matrix as CHOLMOD's upper triangle on the pattern, values 0. */
static cholmod_sparse *
pls_model_sparse (pls__model *m)
{
  cholmod_sparse *A = cholmod_allocate_sparse (m->nf, m->nf, m->w.nnz, 1, 1, 1,
                                               CHOLMOD_REAL, &m->c);

  if (A != NULL)
    {
      memcpy (A->p, m->w.ap, (m->nf + 1) * sizeof (int));
      memcpy (A->i, m->w.ai, m->w.nnz * sizeof (int));
      memset (A->x, 0, m->w.nnz * sizeof (double));
    }
  return A;
}

/* Renumbers the free nodes' matrix columns in the fill-reducing order of
 * AMD (cholmod_amd) on the pattern in node order, so that the factor is
 * analysed with the natural ordering: cholmod_factorize then factors the
 * stored upper triangle in place instead of building the permuted matrix
 * by two transposes at every factorisation (CHOLMOD 3,
 * Cholesky/cholmod_factorize.c, as pls-workspace.c explains for the
 * steady side), and cholmod_solve2 has no permutation to apply. */
static pls_status
pls_model_renumber (pls__model *m)
{
  const pls_allocator *a = m->alloc;
  cholmod_sparse *A0 = pls_model_sparse (m);
  int *perm = pls__malloc (a, (m->nf + 1) * sizeof *perm);
  int *old = pls__malloc (a, (m->nf + 1) * sizeof *old);
  pls_status st = PLS_ERR_NOMEM;
  size_t j;

  if (A0 == NULL || perm == NULL || old == NULL)
    goto out;
  if (!cholmod_amd (A0, NULL, 0, perm, &m->c))
    {
      st = PLS_ERR_LINALG;
      goto out;
    }
  /* perm[j]: the old column that becomes column j. */
  memcpy (old, m->col_node, m->nf * sizeof *old);
  for (j = 0; j < m->nf; j++)
    {
      int node = old[perm[j]];

      m->col_node[j] = node;
      m->nodes[node].col = (int) j;
    }
  st = pls_model_pattern (m) == PLS_OK ? PLS_OK : PLS_ERR_NOMEM;

out:
  cholmod_free_sparse (&A0, &m->c);
  pls__free (a, perm);
  pls__free (a, old);
  return st;
}

/* CHOLMOD set-up: the pattern of the nodal matrix in the renumbered
 * columns and its symbolic analysis, done once for the model's life: the
 * pattern holds every link that may carry flow in any air state, so
 * neither the air state nor the valve openings change it. */
static pls_status
pls_model_matrix (pls__model *m, pls_error *err)
{
  pls_work *w = &m->w;
  const pls_allocator *prev;
  pls_status st = PLS_OK;

  w->net = m->net;
  w->alloc = m->alloc;
  w->m = m->n_links;
  w->nf = m->nf;
  w->links = pls__calloc (m->alloc, m->n_links + 1, sizeof *w->links);
  if (w->links == NULL || pls_model_pattern (m) != PLS_OK)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory building the model");
  if (m->nf == 0)
    return PLS_OK;

  prev = pls__cholmod_enter (m->alloc);
  cholmod_start (&m->c);
  m->c_started = 1;
  m->c.print = 0;
  m->c.supernodal = CHOLMOD_SIMPLICIAL;   /* line ladders fill little */
  st = pls_model_renumber (m);
  if (st == PLS_OK)
    {
      m->c.nmethods = 1;
      m->c.method[0].ordering = CHOLMOD_NATURAL;
      m->c.postorder = 0;
      m->A = pls_model_sparse (m);
      if (m->A != NULL)
        m->L = cholmod_analyze (m->A, &m->c);
      if (m->L != NULL)
        m->B = cholmod_zeros (m->nf, 1, CHOLMOD_REAL, &m->c);
      if (m->A == NULL || m->L == NULL || m->B == NULL)
        st = m->c.status == CHOLMOD_OUT_OF_MEMORY ? PLS_ERR_NOMEM : PLS_ERR_LINALG;
      else if (m->L->ordering != CHOLMOD_NATURAL)
        st = PLS_ERR_LINALG;   /* would bring the transposes back; never seen */
    }
  if (st != PLS_OK)
    st = pls__error (err, st == PLS_ERR_NOMEM || m->c.status == CHOLMOD_OUT_OF_MEMORY
                     ? PLS_ERR_NOMEM : PLS_ERR_LINALG, -1, -1,
                     "the sparse analysis of the time-domain model failed "
                     "(CHOLMOD status %d)", m->c.status);
  pls__cholmod_leave (prev);
  return st;
}

pls_status
pls__model_new (const pls_network *net, const pls__model_options *o, pls__model **out,
                pls_error *err)
{
  const pls_allocator *a = &net->alloc;
  pls__model *m = NULL;
  pls_status st;
  size_t k, i, nn, nl, node, link, app;

  *out = NULL;
  m = pls__calloc (a, 1, sizeof *m);
  if (m == NULL)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory building the model");
  m->net = net;
  m->alloc = a;
  m->rho_g = net->fluid.density * PLS_GRAVITY;
  pls_fluid_carreau_form (&net->fluid, &m->fluid_c);
  m->n_net_nodes = net->n_nodes;

  /* Count model nodes and links. */
  nn = net->n_nodes;
  nl = 0;
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      switch (e->kind)
        {
        case PLS_ELEMENT_LINE:
          {
            int n = pls_line_segments (net, &e->u.line, o);

            nn += (size_t) n - 1;
            nl += (size_t) n;
          }
          break;
        case PLS_ELEMENT_ACCUMULATOR:
          nn++;
          nl++;
          break;
        case PLS_ELEMENT_NOZZLE:
          m->n_app++;
          nl++;
          break;
        case PLS_ELEMENT_VALVE:
          if (e->u.valve.kind == PLS_VALVE_DUMP || e->u.valve.open)
            nl++;
          break;
        case PLS_ELEMENT_PUMP:
          if (e->u.pump.changeover_time > 0.0)
            m->has_changeover = 1;
          nl++;
          break;
        case PLS_ELEMENT_FITTING:
        case PLS_ELEMENT_CUSTOM:
          nl++;
          break;
        case PLS_ELEMENT_GAUGE:
        default:
          break;
        }
    }
  m->n_nodes = nn;
  m->n_links = nl;
  if (pls_model_alloc (m) != PLS_OK)
    {
      st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory building the model");
      goto fail;
    }

  for (i = 0; i < net->n_nodes; i++)
    {
      pls__tnode *nd = &m->nodes[i];

      nd->elevation = net->nodes[i].elevation;
      nd->fixed = net->nodes[i].fixed;
      nd->fixed_pressure = net->nodes[i].pressure;
      nd->acc = -1;
    }
  node = net->n_nodes;
  link = 0;
  app = 0;
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      m->chamber[k] = -1;
      m->elem_link[k] = -1;
      switch (e->kind)
        {
        case PLS_ELEMENT_LINE:
          {
            int n = pls_line_segments (net, &e->u.line, o), s;
            double cp, area = 0.25 * PLS_PI * e->u.line.bore * e->u.line.bore;
            double dx = e->u.line.length / n, za = net->nodes[e->a].elevation;
            double zb = net->nodes[e->b].elevation;

            pls__line_wave (&net->fluid, &e->u.line, NULL, &cp);
            m->segments[k] = n;
            m->elem_link[k] = (int) link;
            for (s = 0; s < n; s++)
              {
                pls__tlink *l = &m->links[link++];
                int na = s == 0 ? e->a : (int) (node + (size_t) s - 1);
                int nb = s == n - 1 ? e->b : (int) (node + (size_t) s);

                l->kind = PLS__LINK_SEGMENT;
                l->elem = (int) k;
                l->a = na;
                l->b = nb;
                l->inertance = net->fluid.density * dx / area;
                l->scale = 1.0 / n;
                l->app = -1;
                pls_laminar_shortcut (&net->fluid, &e->u.line, l->scale, l);
                m->nodes[na].compliance += 0.5 * cp * dx;
                m->nodes[nb].compliance += 0.5 * cp * dx;
                m->nodes[na].volume += 0.5 * area * dx;
                m->nodes[nb].volume += 0.5 * area * dx;
                if (s < n - 1)
                  {
                    pls__tnode *nd = &m->nodes[nb];

                    nd->elevation = za + (zb - za) * (s + 1.0) / n;
                    nd->acc = -1;
                  }
              }
            node += (size_t) n - 1;
          }
          break;
        case PLS_ELEMENT_ACCUMULATOR:
          {
            const pls_accumulator_params *ap = &e->u.accumulator;
            pls__tlink *l = &m->links[link];
            pls__tnode *nd = &m->nodes[node];
            double area = 0.25 * PLS_PI * ap->neck_diameter * ap->neck_diameter;

            nd->elevation = net->nodes[e->a].elevation;
            nd->acc = (int) k;
            /* The neck's own fluid volume is the chamber's linear part. */
            nd->compliance = area * ap->neck_length / net->fluid.bulk_modulus;
            m->chamber[k] = (int) node;
            m->chamber_node[m->n_chambers++] = (int) node;
            m->elem_link[k] = (int) link;
            l->kind = PLS__LINK_NECK;
            l->elem = (int) k;
            l->a = e->a;
            l->b = (int) node;
            l->inertance = net->fluid.density * ap->neck_length / area;
            l->scale = 1.0;
            l->app = -1;
            memset (&l->neck, 0, sizeof l->neck);
            l->neck.kind = PLS_LINE_PIPE;
            l->neck.length = ap->neck_length;
            l->neck.bore = ap->neck_diameter;
            pls_laminar_shortcut (&net->fluid, &l->neck, 1.0, l);
            link++;
            node++;
          }
          break;
        case PLS_ELEMENT_NOZZLE:
        case PLS_ELEMENT_VALVE:
        case PLS_ELEMENT_FITTING:
        case PLS_ELEMENT_PUMP:
        case PLS_ELEMENT_CUSTOM:
          {
            pls__tlink *l;

            if (e->kind == PLS_ELEMENT_VALVE && e->u.valve.kind != PLS_VALVE_DUMP
                && !e->u.valve.open)
              break;   /* a closed ball valve is no path at all */
            l = &m->links[link];
            m->elem_link[k] = (int) link;
            l->kind = e->kind == PLS_ELEMENT_NOZZLE ? PLS__LINK_NOZZLE : PLS__LINK_ELEMENT;
            l->elem = (int) k;
            l->a = e->a;
            l->b = e->b;
            l->scale = 1.0;
            l->app = -1;
            if (e->kind == PLS_ELEMENT_NOZZLE)
              {
                l->app = (int) app;
                m->app_elem[app] = (int) k;
                m->app_link[app] = (int) link;
                app++;
              }
            link++;
          }
          break;
        case PLS_ELEMENT_GAUGE:
        default:
          break;
        }
    }

  for (k = 0; k < m->n_links; k++)
    m->algebraic[k] = !(m->links[k].inertance > 0.0);
  for (i = 0; i < m->n_nodes; i++)
    m->head[i] = m->rho_g * m->nodes[i].elevation;
  for (i = 0; i < m->n_nodes; i++)
    {
      pls__tnode *nd = &m->nodes[i];

      if (nd->fixed)
        {
          nd->col = -1;
          m->p[i] = nd->fixed_pressure;
          continue;
        }
      if (nd->compliance < PLS_NODE_FLOOR_VOLUME / net->fluid.bulk_modulus && nd->acc < 0)
        {
          nd->compliance += PLS_NODE_FLOOR_VOLUME / net->fluid.bulk_modulus;
          nd->volume += PLS_NODE_FLOOR_VOLUME;
        }
      if (nd->acc < 0)
        pls__pocket_init (nd);
      nd->col = (int) m->nf;
      m->col_node[m->nf++] = (int) i;
    }
  st = pls_model_matrix (m, err);
  if (st != PLS_OK)
    goto fail;
  pls__model_set_air (m, o->air_on, o->air_pressure);
  *out = m;
  return PLS_OK;

fail:
  pls__model_free (m);
  return st;
}

void
pls__model_from_steady (pls__model *m, const pls_steady_result *r)
{
  const pls_network *net = m->net;
  size_t k, i;

  for (i = 0; i < m->n_net_nodes; i++)
    m->p[i] = net->nodes[i].fixed ? net->nodes[i].pressure
              : pls_steady_node_pressure (r, (int) i);
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int l0 = m->elem_link[k];
      double q = pls_steady_element_flow (r, (int) k);

      if (l0 < 0)
        continue;
      if (e->kind == PLS_ELEMENT_LINE)
        {
          int n = m->segments[k], s;
          double pa = m->p[e->a], pb = m->p[e->b];

          /* Interior pressures on the straight line between the ends
           * (exact for the uniform drop of a line at one flow). */
          for (s = 0; s < n; s++)
            {
              const pls__tlink *l = &m->links[l0 + s];

              m->q[l0 + s] = q;
              if (s < n - 1)
                m->p[l->b] = pa + (pb - pa) * (s + 1.0) / n;
            }
        }
      else if (e->kind == PLS_ELEMENT_ACCUMULATOR)
        {
          m->p[m->chamber[k]] = m->p[e->a];
          m->q[l0] = 0.0;
        }
      else
        m->q[l0] = m->active[l0] ? q : 0.0;
    }
}
