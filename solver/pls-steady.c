/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-steady.c: the steady solve's driver: options, topology, the links
 * of the solved parts, results.  The iterations are in pls-newton.c.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pls-network-private.h"

void
pls_steady_options_init (pls_steady_options *o)
{
  if (o == NULL)
    return;
  memset (o, 0, sizeof *o);
  o->air_on = 1;
  o->air_pressure = 6e5;             /* 6 bar shop air, common practice */
  o->applicators = PLS_APPLICATORS_NONE;
  /* 1e-3 Pa against working pressures of 1e6..1e8 Pa is 1e-9..1e-11
   * relative; Newton's last step is quadratically smaller still. */
  o->pressure_tolerance = 1e-3;
  o->flow_tolerance = 1e-12;         /* 6e-8 mL/min */
  o->max_iterations = 100;
  o->manifold_spread_tolerance = 0.05;   /* common practice, no source */
  o->velocity_limit = 3.0;               /* common practice, no source */
  o->shear_rate_limit = 2e4;             /* common practice, no source */
  o->gauge_low_factor = 1.5;             /* common practice, no source */
  o->gauge_high_factor = 3.0;            /* middle third: common practice */
  o->precharge_low_fraction = 0.25;      /* bladder p2 <= 4 p0, vendor guides */
}

static pls_status
pls_check_options (const pls_steady_options *o, pls_error *err)
{
  const struct
  {
    const char *name;
    double value;
    int positive;   /* 1: > 0 needed, 0: >= 0 */
  } f[] = {
    { "air_pressure", o->air_pressure, 0 },
    { "pressure_tolerance", o->pressure_tolerance, 1 },
    { "flow_tolerance", o->flow_tolerance, 1 },
    { "demand_pressure", o->demand_pressure, 0 },
    { "demand_flow", o->demand_flow, 0 },
    { "manifold_spread_tolerance", o->manifold_spread_tolerance, 0 },
    { "velocity_limit", o->velocity_limit, 0 },
    { "shear_rate_limit", o->shear_rate_limit, 0 },
    { "gauge_low_factor", o->gauge_low_factor, 0 },
    { "gauge_high_factor", o->gauge_high_factor, 0 },
    { "precharge_low_fraction", o->precharge_low_fraction, 0 },
  };
  size_t i;

  for (i = 0; i < sizeof f / sizeof f[0]; i++)
    if (!isfinite (f[i].value) || f[i].value < 0.0 || (f[i].positive && f[i].value == 0.0))
      return pls__error (err, PLS_ERR_INVALID, -1, -1, "options: %s must be %s, not %g",
                         f[i].name, f[i].positive ? "positive" : "finite and >= 0",
                         f[i].value);
  if (o->max_iterations < 1)
    return pls__error (err, PLS_ERR_INVALID, -1, -1,
                       "options: max_iterations must be at least 1");
  if (o->applicators != PLS_APPLICATORS_NONE && o->applicators != PLS_APPLICATORS_ALL
      && o->applicators != PLS_APPLICATORS_LIST)
    return pls__error (err, PLS_ERR_INVALID, -1, -1,
                       "options: applicators must be none, all or a list");
  return PLS_OK;
}

static pls_steady_result *
pls_result_new (const pls_network *net)
{
  const pls_allocator *a = &net->alloc;
  size_t n = net->n_nodes, m = net->n_elements;
  pls_steady_result *r = pls__calloc (a, 1, sizeof *r);

  if (r == NULL)
    return NULL;
  r->alloc = net->alloc;
  r->n_nodes = n;
  r->n_elements = m;
  r->pressure = pls__calloc (a, n, sizeof *r->pressure);
  r->node_solved = pls__calloc (a, n, 1);
  r->flow = pls__calloc (a, m, sizeof *r->flow);
  r->elem_solved = pls__calloc (a, m, 1);
  r->elem_active = pls__calloc (a, m, 1);
  r->detail = pls__calloc (a, m, sizeof *r->detail);
  r->kind = pls__calloc (a, m, 1);
  if (!r->pressure || !r->node_solved || !r->flow || !r->elem_solved || !r->elem_active
      || !r->detail || !r->kind)
    {
      pls_steady_result_free (r);
      return NULL;
    }
  return r;
}

void
pls_steady_result_free (pls_steady_result *r)
{
  pls_allocator a;

  if (r == NULL)
    return;
  a = r->alloc;
  pls__free (&a, r->pressure);
  pls__free (&a, r->node_solved);
  pls__free (&a, r->flow);
  pls__free (&a, r->elem_solved);
  pls__free (&a, r->elem_active);
  pls__free (&a, r->detail);
  pls__free (&a, r->kind);
  pls__free (&a, r->findings.items);
  pls__free (&a, r);
}

/* Per-element figures of the solved state. */
static void
pls_fill_details (const pls_network *net, const pls_steady_options *o, pls_steady_result *r)
{
  size_t k;

  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      pls_element_detail *dt = &r->detail[k];

      r->kind[k] = (unsigned char) e->kind;
      if (!r->elem_solved[k])
        continue;
      if (e->kind == PLS_ELEMENT_LINE)
        {
          pls_line_state s;
          pls_drop dr;

          pls_line_drop (&net->fluid, &e->u.line, r->flow[k], &dr, &s);
          dt->line.flow = r->flow[k];
          dt->line.velocity = s.velocity;
          dt->line.reynolds = s.reynolds;
          dt->line.wall_shear_rate = s.wall_shear_rate;
          dt->line.wall_shear_stress = s.wall_shear_stress;
          dt->line.darcy_friction = s.darcy_friction;
          dt->line.regime = s.regime == PLS_REGIME_TURBULENT ? PLS_FLOW_TURBULENT
                            : s.regime == PLS_REGIME_TRANSITION ? PLS_FLOW_TRANSITION
                            : PLS_FLOW_LAMINAR;
        }
      else if (e->kind == PLS_ELEMENT_PUMP)
        {
          dt->pump.running = r->elem_active[k];
          dt->pump.flow = r->flow[k];
          dt->pump.inlet_pressure = r->pressure[e->a];
          dt->pump.outlet_pressure = r->pressure[e->b];
          dt->pump.stall_pressure = pls_pump_stall_pressure (&e->u.pump, o->air_pressure);
          dt->pump.free_flow = pls_pump_free_flow (&e->u.pump);
        }
      else if (e->kind == PLS_ELEMENT_ACCUMULATOR)
        {
          const pls_accumulator_params *ap = &e->u.accumulator;
          double p = r->pressure[e->a];

          dt->accumulator.pressure = p;
          dt->accumulator.precharge = pls_accumulator_effective_precharge (ap);
          dt->accumulator.fluid_volume = pls_accumulator_fluid_volume (ap, p);
          dt->accumulator.gas_energy = pls_accumulator_gas_energy (ap, p);
        }
    }
}

pls_status
pls_solve_steady (const pls_network *net, const pls_steady_options *options,
                  pls_steady_result **out, pls_error *err)
{
  pls_steady_options defaults;
  const pls_steady_options *o = options;
  const pls_allocator *a;
  pls_steady_result *r = NULL;
  pls_work w;
  unsigned char *active = NULL, *pumped = NULL;
  int *comp = NULL, *col = NULL;
  double rho_g, pscale = 1.0, fscale = 0.0, t_analyse = 0.0, t0 = pls__now ();
  pls_status st;
  size_t i, k;
  int driven = 0;

  memset (&w, 0, sizeof w);
  pls__error_clear (err);
  if (out == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the result");
  *out = NULL;
  if (net == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
  if (o == NULL)
    {
      pls_steady_options_init (&defaults);
      o = &defaults;
    }
  st = pls_check_options (o, err);
  if (st != PLS_OK)
    return st;
  if (net->n_nodes == 0 || net->n_elements == 0)
    return pls__error (err, PLS_ERR_TOPOLOGY, -1, -1,
                       "the network is empty: it needs nodes and parts");
  /* Something must drive the fluid: a pump, a demand, or two fixed
   * pressures that differ. */
  {
    double pmin = INFINITY, pmax = -INFINITY;

    rho_g = net->fluid.density * PLS_GRAVITY;
    for (i = 0; i < net->n_nodes; i++)
      {
        const pls_node *nd = &net->nodes[i];

        if (nd->fixed)
          {
            double pz = nd->pressure + rho_g * nd->elevation;

            pmin = pz < pmin ? pz : pmin;
            pmax = pz > pmax ? pz : pmax;
            if (fabs (pz) > pscale)
              pscale = fabs (pz);
          }
        if (nd->demand != 0.0)
          driven = 1;
        fscale += fabs (nd->demand);
      }
    if (net->n_pumps > 0 || pmax > pmin)
      driven = 1;
    if (!driven)
      return pls__error (err, PLS_ERR_TOPOLOGY, -1, -1,
                         "the network has no pump: nothing drives the fluid");
  }

  a = &net->alloc;
  w.net = net;
  w.alloc = a;
  w.air = o->air_pressure;
  r = pls_result_new (net);
  active = pls__calloc (a, net->n_elements, 1);
  pumped = pls__calloc (a, net->n_nodes, 1);
  comp = pls__malloc (a, net->n_nodes * sizeof *comp);
  col = pls__malloc (a, net->n_nodes * sizeof *col);
  if (!r || !active || !pumped || !comp || !col)
    goto nomem;

  st = pls__active_elements (net, o, active, err);
  if (st != PLS_OK)
    goto out;
  st = pls__topology (net, o, active, r->node_solved, comp, pumped, &r->findings);
  if (st != PLS_OK)
    goto nomem;

  /* Columns of the solved free nodes; links of the solved parts. */
  for (i = 0; i < net->n_nodes; i++)
    col[i] = (!net->nodes[i].fixed && r->node_solved[i]) ? (int) w.nf++ : -1;
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      r->elem_solved[k] = r->node_solved[e->a] && (e->b < 0 || r->node_solved[e->b]);
      if (active[k] && r->elem_solved[k])
        {
          r->elem_active[k] = 1;
          w.m++;
        }
    }
  if (w.m == 0)
    {
      st = pls__error (err, PLS_ERR_TOPOLOGY, -1, -1, "%s",
                       r->findings.count > 0 ? r->findings.items[0].message
                       : "nothing is left to solve");
      goto out;
    }
  w.links = pls__malloc (a, w.m * sizeof *w.links);
  w.col_node = pls__malloc (a, (w.nf + 1) * sizeof *w.col_node);
  w.demand = pls__calloc (a, w.nf + 1, sizeof *w.demand);
  w.q = pls__calloc (a, w.m, sizeof (double));
  w.qt = pls__calloc (a, w.m, sizeof (double));
  w.h = pls__calloc (a, w.m, sizeof (double));
  w.d = pls__calloc (a, w.m, sizeof (double));
  w.ht = pls__calloc (a, w.m, sizeof (double));
  w.dt = pls__calloc (a, w.m, sizeof (double));
  w.dq = pls__calloc (a, w.m, sizeof (double));
  w.p = pls__calloc (a, w.nf + 1, sizeof (double));
  w.pt = pls__calloc (a, w.nf + 1, sizeof (double));
  w.dp = pls__calloc (a, w.nf + 1, sizeof (double));
  w.res = pls__calloc (a, w.nf + 1, sizeof (double));
  if (!w.links || !w.col_node || !w.demand || !w.q || !w.qt || !w.h || !w.d || !w.ht
      || !w.dt || !w.dq || !w.p || !w.pt || !w.dp || !w.res)
    goto nomem;
  for (i = 0; i < net->n_nodes; i++)
    if (col[i] >= 0)
      {
        w.col_node[col[i]] = (int) i;
        w.demand[col[i]] = net->nodes[i].demand;
      }
  {
    size_t j = 0;

    for (k = 0; k < net->n_elements; k++)
      {
        const pls_element *e = &net->elements[k];
        pls_link *l;

        if (!r->elem_active[k])
          continue;
        l = &w.links[j];
        l->elem = (int) k;
        l->ca = col[e->a];
        l->fa = net->nodes[e->a].pressure + rho_g * net->nodes[e->a].elevation;
        if (e->b >= 0)
          {
            l->cb = col[e->b];
            l->fb = net->nodes[e->b].pressure + rho_g * net->nodes[e->b].elevation;
          }
        else
          {
            /* Applicator: the atmosphere (0 gauge) at its node's height. */
            l->cb = -1;
            l->fb = rho_g * net->nodes[e->a].elevation;
          }
        if (e->kind == PLS_ELEMENT_CUSTOM)
          {
            w.q[j] = e->u.custom.q0;
            fscale += fabs (e->u.custom.q0);
          }
        if (e->kind == PLS_ELEMENT_PUMP)
          {
            double stall = pls_pump_stall_pressure (&e->u.pump, o->air_pressure);

            if (stall > pscale)
              pscale = stall;
            fscale += pls_pump_free_flow (&e->u.pump);
          }
        j++;
      }
  }
  if (!(fscale > 0.0))
    fscale = 1e-6;   /* replaced by the first step's flows */

  st = pls__pattern (&w);
  if (st != PLS_OK)
    goto nomem;
  st = pls__newton (&w, o, pscale, fscale, r, &t_analyse, err);
  if (st != PLS_OK)
    goto out;

  /* Results: gauge pressures back from piezometric ones. */
  for (i = 0; i < net->n_nodes; i++)
    {
      const pls_node *nd = &net->nodes[i];

      if (nd->fixed)
        r->pressure[i] = nd->pressure;
      else if (col[i] >= 0)
        r->pressure[i] = w.p[col[i]] - rho_g * nd->elevation;
    }
  for (k = 0; k < w.m; k++)
    r->flow[w.links[k].elem] = w.q[k];
  pls_fill_details (net, o, r);
  r->t_analyse = t_analyse;
  st = pls__design_checks (net, o, r, comp);
  if (st != PLS_OK)
    goto nomem;
  r->t_total = pls__now () - t0;
  if (!r->converged)
    {
      st = pls__error (err, PLS_ERR_NO_CONVERGENCE, -1, -1,
                       "the steady solve did not converge in %d iterations "
                       "(pressure change %g Pa, flow residual %g m^3/s)",
                       r->iterations, r->pressure_change, r->flow_residual);
      *out = r;
      r = NULL;
      goto out;
    }
  *out = r;
  r = NULL;
  st = PLS_OK;
  goto out;

nomem:
  st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the steady solve");
out:
  pls__work_free (&w);
  pls__free (a, active);
  pls__free (a, pumped);
  pls__free (a, comp);
  pls__free (a, col);
  pls_steady_result_free (r);
  return st;
}
