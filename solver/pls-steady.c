/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-steady.c: the steady solve's driver: options, topology, the links
 * of the solved parts, results.  The iterations are in pls-newton.c, the
 * reusable workspace (analysis, matrix, work arrays) in pls-workspace.c;
 * pls_solve_steady is pls_solve_steady_with on a workspace of its own.
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

/* Pressure and flow scales of the merit, and whether anything drives the
 * fluid (a pump, a demand, or two fixed pressures that differ). */
static pls_status
pls_scales (const pls_network *net, double *pscale, double *fscale, pls_error *err)
{
  double pmin = INFINITY, pmax = -INFINITY, rho_g = net->fluid.density * PLS_GRAVITY;
  size_t i;
  int driven = 0;

  *pscale = 1.0;
  *fscale = 0.0;
  for (i = 0; i < net->n_nodes; i++)
    {
      const pls_node *nd = &net->nodes[i];

      if (nd->fixed)
        {
          double pz = nd->pressure + rho_g * nd->elevation;

          pmin = pz < pmin ? pz : pmin;
          pmax = pz > pmax ? pz : pmax;
          if (fabs (pz) > *pscale)
            *pscale = fabs (pz);
        }
      if (nd->demand != 0.0)
        driven = 1;
      *fscale += fabs (nd->demand);
    }
  if (net->n_pumps > 0 || pmax > pmin)
    driven = 1;
  if (!driven)
    return pls__error (err, PLS_ERR_TOPOLOGY, -1, -1,
                       "the network has no pump: nothing drives the fluid");
  return PLS_OK;
}

pls_status
pls_solve_steady_with (pls_steady_workspace *ws, const pls_network *net,
                       const pls_steady_options *options, pls_steady_result **out,
                       pls_error *err)
{
  pls_steady_options defaults;
  const pls_steady_options *o = options;
  pls_steady_result *r = NULL;
  double rho_g, pscale, fscale, t_analyse = 0.0, t0 = pls__now ();
  pls_status st;
  size_t i, k, m = 0, nf = 0;
  int *col;

  pls__error_clear (err);
  if (out == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the result");
  *out = NULL;
  if (ws == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no workspace given");
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
  st = pls_scales (net, &pscale, &fscale, err);
  if (st != PLS_OK)
    return st;
  rho_g = net->fluid.density * PLS_GRAVITY;

  r = pls_result_new (net);
  if (r == NULL)
    goto nomem;
  /* Scratch for the topology first (its size is known), links after. */
  st = pls__ws_reserve (ws, 0, 0, net->n_nodes, net->n_elements);
  if (st != PLS_OK)
    goto nomem;
  col = ws->col;
  st = pls__active_elements (net, o, ws->active, err);
  if (st != PLS_OK)
    goto out;
  st = pls__topology (net, o, ws->active, r->node_solved, ws->comp, ws->pumped,
                      &r->findings);
  if (st != PLS_OK)
    goto nomem;

  /* Columns of the solved free nodes (the topology's numbering); links of
   * the solved parts. */
  for (i = 0; i < net->n_nodes; i++)
    col[i] = (!net->nodes[i].fixed && r->node_solved[i]) ? (int) nf++ : -1;
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      r->elem_solved[k] = r->node_solved[e->a] && (e->b < 0 || r->node_solved[e->b]);
      if (ws->active[k] && r->elem_solved[k])
        {
          r->elem_active[k] = 1;
          m++;
        }
    }
  if (m == 0)
    {
      st = pls__error (err, PLS_ERR_TOPOLOGY, -1, -1, "%s",
                       r->findings.count > 0 ? r->findings.items[0].message
                       : "nothing is left to solve");
      goto out;
    }
  st = pls__ws_reserve (ws, m, nf, net->n_nodes, net->n_elements);
  if (st != PLS_OK)
    goto nomem;
  ws->m = m;
  ws->nf = nf;
  {
    size_t j = 0;

    memset (ws->q, 0, m * sizeof *ws->q);
    for (k = 0; k < net->n_elements; k++)
      {
        const pls_element *e = &net->elements[k];
        pls__wlink *l;
        double fa, fb;

        if (!r->elem_active[k])
          continue;
        l = &ws->links[j];
        l->elem = (int) k;
        l->ca = col[e->a];
        fa = net->nodes[e->a].pressure + rho_g * net->nodes[e->a].elevation;
        if (e->b >= 0)
          {
            l->cb = col[e->b];
            fb = net->nodes[e->b].pressure + rho_g * net->nodes[e->b].elevation;
          }
        else
          {
            /* Applicator: the atmosphere (0 gauge) at its node's height. */
            l->cb = -1;
            fb = rho_g * net->nodes[e->a].elevation;
          }
        l->fixed = (l->ca < 0 ? fa : 0.0) - (l->cb < 0 ? fb : 0.0);
        if (e->kind == PLS_ELEMENT_CUSTOM)
          {
            ws->q[j] = e->u.custom.q0;
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

  st = pls__ws_prepare (ws, &t_analyse, err);
  if (st != PLS_OK)
    goto out;
  /* Matrix columns from here on. */
  for (i = 0; i < net->n_nodes; i++)
    if (col[i] >= 0)
      {
        int c = ws->colmap[col[i]];

        col[i] = c;
        ws->col_node[c] = (int) i;
        ws->demand[c] = net->nodes[i].demand;
      }
  memset (ws->p, 0, nf * sizeof *ws->p);
  st = pls__newton_ws (ws, net, o->air_pressure, o, pscale, fscale, r, err);
  if (st != PLS_OK)
    goto out;

  /* Results: gauge pressures back from piezometric ones. */
  for (i = 0; i < net->n_nodes; i++)
    {
      const pls_node *nd = &net->nodes[i];

      if (nd->fixed)
        r->pressure[i] = nd->pressure;
      else if (col[i] >= 0)
        r->pressure[i] = ws->p[col[i]] - rho_g * nd->elevation;
    }
  for (k = 0; k < m; k++)
    r->flow[ws->links[k].elem] = ws->q[k];
  pls_fill_details (net, o, r);
  r->t_analyse = t_analyse;
  st = pls__design_checks (net, o, r, ws->comp);
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
  pls_steady_result_free (r);
  return st;
}

pls_status
pls_solve_steady (const pls_network *net, const pls_steady_options *options,
                  pls_steady_result **out, pls_error *err)
{
  pls_steady_workspace *ws;
  pls_status st;

  pls__error_clear (err);
  if (out == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no place given for the result");
  *out = NULL;
  if (net == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
  /* A workspace for this call only, from the network's allocator: the
   * same code path as a reused one, so both give identical results. */
  ws = pls_steady_workspace_new (&net->alloc, err);
  if (ws == NULL)
    return PLS_ERR_NOMEM;
  st = pls_solve_steady_with (ws, net, options, out, err);
  pls_steady_workspace_free (ws);
  return st;
}
