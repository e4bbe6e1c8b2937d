/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-invariants.c: properties any correct solution has, whatever the
 * layout: mass balance at every node, independence of the numbering, and
 * the scaling of laminar drops with bore.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

#define MAX_NODES 24
#define MAX_PARTS 64

static double
rnd (unsigned long long *s)
{
  *s = *s * 6364136223846793005ULL + 1442695040888963407ULL;
  return (double) (*s >> 11) / 9007199254740992.0;
}

/* A layout as plain data so it can be added to a network in any order. */
typedef struct
{
  int kind;            /* 0 hose, 1 applicator, 2 pump */
  int a, b;            /* layout node numbers; b = -1 for applicators */
  double length, bore, orifice;
} part;

typedef struct
{
  pls_fluid_params fluid;
  int n_nodes;         /* node 0 is the tank */
  double z[MAX_NODES];
  int n_parts;
  part parts[MAX_PARTS];
} plan;

static void
make_plan (unsigned long long seed, plan *pl)
{
  unsigned long long s = seed * 104729ULL + 3ULL;
  int i, n;

  memset (pl, 0, sizeof *pl);
  pls_fluid_params_init (&pl->fluid);
  if (seed % 2)
    {
      pl->fluid.law = PLS_VISCOSITY_POWER_LAW;
      pl->fluid.consistency = 5.0 + 10.0 * rnd (&s);
      pl->fluid.flow_index = 0.4 + 0.5 * rnd (&s);
    }
  n = 5 + (int) (15.0 * rnd (&s));
  pl->n_nodes = n + 1;
  for (i = 1; i <= n; i++)
    pl->z[i] = -3.0 + 6.0 * rnd (&s);
  pl->parts[pl->n_parts++] = (part) { 2, 0, 1, 0, 0, 0 };
  for (i = 2; i <= n + n / 2; i++)
    {
      part p = { 0, 0, 0, 0.5 + 8.0 * rnd (&s), 3e-3 + 8e-3 * rnd (&s), 0 };

      if (i <= n)
        {
          p.a = 1 + (int) (rnd (&s) * (i - 1));
          p.b = i;
        }
      else
        {
          p.a = 1 + (int) (rnd (&s) * n);
          p.b = 1 + (int) (rnd (&s) * n);
          if (p.a == p.b)
            continue;
        }
      pl->parts[pl->n_parts++] = p;
    }
  for (i = 2; i <= n; i++)
    if (i == n || rnd (&s) < 0.5)
      pl->parts[pl->n_parts++] = (part) { 1, i, -1, 0, 0, 0.3e-3 + 0.5e-3 * rnd (&s) };
}

/* Builds the plan, nodes added in the order node_order[], parts in the
 * order part_order[]; node_index[] and part_index[] receive the indices. */
static pls_network *
build (const plan *pl, const int *node_order, const int *part_order, int *node_index,
       int *part_index)
{
  pls_network *net = pls_network_new (&pl->fluid, NULL, NULL);
  pls_error err;
  int i;

  ck_assert_ptr_nonnull (net);
  for (i = 0; i < pl->n_nodes; i++)
    {
      int nd = node_order[i];

      node_index[nd] = nd == 0 ? pls_network_add_fixed_node (net, 0.0, 0.0, "tank", &err)
                               : pls_network_add_node (net, pl->z[nd], NULL, &err);
    }
  for (i = 0; i < pl->n_parts; i++)
    {
      const part *p = &pl->parts[part_order[i]];
      int idx;

      if (p->kind == 0)
        {
          pls_line_params h;

          memset (&h, 0, sizeof h);
          h.length = p->length;
          h.bore = p->bore;
          idx = pls_network_add_line (net, node_index[p->a], node_index[p->b], &h, NULL, &err);
        }
      else if (p->kind == 1)
        {
          pls_nozzle_params z;

          memset (&z, 0, sizeof z);
          z.orifice_diameter = p->orifice;
          z.orifice_length = p->orifice;
          z.cd_model = PLS_CD_LICHTAROWICZ;
          z.discharge_coefficient = 0.7;
          z.passage_resistance = 5e10;
          idx = pls_network_add_nozzle (net, node_index[p->a], &z, NULL, &err);
        }
      else
        {
          pls_pump_params pp;

          memset (&pp, 0, sizeof pp);
          pp.ratio = 40.0;
          pp.displacement = 2e-5;
          pp.max_cycle_rate = 1.0;
          pp.curve_exponent = 1.0;
          idx = pls_network_add_pump (net, node_index[p->a], node_index[p->b], &pp, "P",
                                      &err);
        }
      ck_assert_msg (idx >= 0, "%s", err.message);
      part_index[part_order[i]] = idx;
    }
  return net;
}

static pls_steady_result *
solve_open (const pls_network *net)
{
  pls_steady_options o;
  pls_steady_result *r = NULL;
  pls_error err;

  pls_steady_options_init (&o);
  o.applicators = PLS_APPLICATORS_ALL;
  o.pressure_tolerance = 1e-6;
  o.flow_tolerance = 1e-16;
  ck_assert_msg (pls_solve_steady (net, &o, &r, &err) == PLS_OK, "%s", err.message);
  return r;
}

/* Mass balance: what enters each free node leaves it, to 1e-10 of the
 * flow through the node (the gradient algorithm keeps the balance exactly
 * after every full step; 1e-10 leaves room for rounding). */
START_TEST (test_mass_balance)
{
  plan pl;
  int order_n[MAX_NODES], order_p[MAX_PARTS], ni[MAX_NODES], pi[MAX_PARTS], i;
  pls_network *net;
  pls_steady_result *r;
  double net_flow[MAX_NODES] = { 0 }, through[MAX_NODES] = { 0 };

  make_plan ((unsigned long long) _i, &pl);
  for (i = 0; i < pl.n_nodes; i++)
    order_n[i] = i;
  for (i = 0; i < pl.n_parts; i++)
    order_p[i] = i;
  net = build (&pl, order_n, order_p, ni, pi);
  r = solve_open (net);
  for (i = 0; i < pl.n_parts; i++)
    {
      double q = pls_steady_element_flow (r, pi[i]);

      ck_assert (isfinite (q));
      net_flow[pl.parts[i].a] += q;
      through[pl.parts[i].a] += fabs (q);
      if (pl.parts[i].b >= 0)
        {
          net_flow[pl.parts[i].b] -= q;
          through[pl.parts[i].b] += fabs (q);
        }
    }
  for (i = 1; i < pl.n_nodes; i++)
    {
      ck_assert (isfinite (pls_steady_node_pressure (r, ni[i])));
      ck_assert_msg (fabs (net_flow[i]) <= 1e-10 * through[i] + 1e-25,
                     "node %d: imbalance %g of %g", i, net_flow[i], through[i]);
    }
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

/* Renumbering: nodes and parts added in reversed and shuffled orders give
 * the same pressures and flows (the equations do not depend on the order;
 * only rounding and the stopping point differ: 1e-9 relative). */
START_TEST (test_renumbering)
{
  plan pl;
  int order_n[MAX_NODES], order_p[MAX_PARTS], ni[MAX_NODES], pi[MAX_PARTS];
  int ni2[MAX_NODES], pi2[MAX_PARTS], i;
  unsigned long long s = (unsigned long long) _i + 5ULL;
  pls_network *a, *b;
  pls_steady_result *ra, *rb;

  make_plan ((unsigned long long) _i, &pl);
  for (i = 0; i < pl.n_nodes; i++)
    order_n[i] = i;
  for (i = 0; i < pl.n_parts; i++)
    order_p[i] = i;
  a = build (&pl, order_n, order_p, ni, pi);
  /* Reverse the nodes, shuffle the parts (Fisher-Yates). */
  for (i = 0; i < pl.n_nodes; i++)
    order_n[i] = pl.n_nodes - 1 - i;
  for (i = pl.n_parts - 1; i > 0; i--)
    {
      int j = (int) (rnd (&s) * (i + 1)), t = order_p[i];

      order_p[i] = order_p[j];
      order_p[j] = t;
    }
  b = build (&pl, order_n, order_p, ni2, pi2);
  ra = solve_open (a);
  rb = solve_open (b);
  for (i = 1; i < pl.n_nodes; i++)
    {
      double pa = pls_steady_node_pressure (ra, ni[i]), pb = pls_steady_node_pressure (rb, ni2[i]);

      ck_assert_msg (fabs (pa - pb) <= 1e-9 * fabs (pa) + 1e-6, "node %d: %.15g vs %.15g", i,
                     pa, pb);
    }
  for (i = 0; i < pl.n_parts; i++)
    {
      double qa = pls_steady_element_flow (ra, pi[i]), qb = pls_steady_element_flow (rb, pi2[i]);

      ck_assert_msg (fabs (qa - qb) <= 1e-9 * fabs (qa) + 1e-20, "part %d: %g vs %g", i, qa,
                     qb);
    }
  pls_steady_result_free (ra);
  pls_steady_result_free (rb);
  pls_network_free (a);
  pls_network_free (b);
}
END_TEST

/* Laminar drop at a fixed flow (a withdrawal at the end of one hose from a
 * tank) against the bore: doubling it cuts a Newtonian drop to 1/16
 * (common practice, no source; it is Hagen-Poiseuille's D^-4), and a
 * power-law drop to 2^-(3n+1) (Rabinowitsch-Mooney: Q ~ R^3 (dp R / 2 L
 * K)^(1/n), Chhabra & Richardson, 2nd ed., sec. 3.2). */
static const struct
{
  pls_viscosity_law law;
  double n;
} bore_cases[] = {
  { PLS_VISCOSITY_NEWTONIAN, 1.0 },
  { PLS_VISCOSITY_POWER_LAW, 0.5 },
  { PLS_VISCOSITY_POWER_LAW, 0.8 },
};

static double
drop_at (pls_viscosity_law law, double n, double bore, double q)
{
  pls_fluid_params f;
  pls_line_params h;
  pls_network *net;
  pls_steady_result *r = NULL;
  pls_steady_options o;
  pls_error err;
  int t, e;
  double dp;

  pls_fluid_params_init (&f);
  f.law = law;
  f.consistency = 10.0;
  f.flow_index = n;
  net = pls_network_new (&f, NULL, &err);
  memset (&h, 0, sizeof h);
  h.length = 10.0;
  h.bore = bore;
  t = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", &err);
  e = pls_network_add_node (net, 0.0, "end", &err);
  pls_network_add_line (net, t, e, &h, "H", &err);
  ck_assert_int_eq (pls_network_set_demand (net, e, q, &err), PLS_OK);
  pls_steady_options_init (&o);
  o.pressure_tolerance = 1e-9;
  o.flow_tolerance = 1e-18;
  ck_assert_msg (pls_solve_steady (net, &o, &r, &err) == PLS_OK, "%s", err.message);
  dp = -pls_steady_node_pressure (r, e);
  pls_steady_result_free (r);
  pls_network_free (net);
  return dp;
}

START_TEST (test_bore_scaling)
{
  double n = bore_cases[_i].n, q = 1e-3 / 60.0;
  double d1 = drop_at (bore_cases[_i].law, n, 6.35e-3, q);
  double d2 = drop_at (bore_cases[_i].law, n, 12.7e-3, q);

  /* Both at Re << 1: fully laminar; 1e-8 relative covers the laws'
   * quadrature (1e-13) and Newton's stopping point. */
  ck_assert (d1 > 0.0);
  ck_assert_double_eq_tol (d2 / d1, pow (2.0, -(3.0 * n + 1.0)), 1e-8);
}
END_TEST

static Suite *
invariants_suite (void)
{
  Suite *s = suite_create ("invariants");
  TCase *tc = tcase_create ("invariants");

  tcase_add_loop_test (tc, test_mass_balance, 0, 30);
  tcase_add_loop_test (tc, test_renumbering, 0, 20);
  tcase_add_loop_test (tc, test_bore_scaling, 0,
                       (int) (sizeof bore_cases / sizeof bore_cases[0]));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (invariants_suite ());
}
