/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-workspace.c: the reusable steady workspace.  A solve with a
 * workspace must give bit-for-bit the result of a fresh pls_solve_steady,
 * whether it redid the symbolic analysis or reused it; it reuses it after
 * a change of parameters, pressures or elevations (the same layout
 * compiled anew, as the editor does after an edit) and redoes it when the
 * set of active elements changes (idle against steady-open, a valve shut).
 * A closed-form network checks that a reused analysis still solves the
 * changed problem right, not just the same as a fresh solve.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

/* ---- a pump layout with everything a solve touches ---------------------- */

/* tank -> pump -> N1 -> hose -> header of `stations` tees (hoses), each
 * with a drop hose to an applicator; a ball valve from N1 to a side branch
 * with one more applicator; a dump valve to the drain; optionally a
 * return hose closing a loop.  Every figure can be varied without
 * changing the wiring: `scale` multiplies bores, the pump ratio, the
 * applicators' passage resistance and the nodes' elevations. */
typedef struct
{
  int stations;
  int looped;
  int power_law;
  int valve_open;
  double scale;
} layout_spec;

static pls_network *
build (const layout_spec *s)
{
  pls_fluid_params f;
  pls_pump_params pp;
  pls_line_params hose;
  pls_nozzle_params z;
  pls_valve_params bv = { PLS_VALVE_BALL, 2.0, 6e-3, 0, 0.0 };
  pls_valve_params dv = { PLS_VALVE_DUMP, 2.0, 6e-3, 0, 0.0 };
  pls_network *net;
  pls_error err;
  int tank, drain, n1, prev, side, i, first = -1;

  pls_fluid_params_init (&f);
  if (s->power_law)
    {
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 8.0;
      f.flow_index = 0.55;
    }
  net = pls_network_new (&f, NULL, &err);
  ck_assert_ptr_nonnull (net);
  memset (&pp, 0, sizeof pp);
  pp.ratio = 30.0 * s->scale;
  pp.displacement = 2e-6 * (s->stations + 1);
  pp.max_cycle_rate = 1.0;
  pp.curve_exponent = 1.0;
  memset (&hose, 0, sizeof hose);
  hose.length = 2.0;
  hose.bore = 9.5e-3 * s->scale;
  memset (&z, 0, sizeof z);
  z.orifice_diameter = 0.5e-3;
  z.orifice_length = 1e-3;
  z.cd_model = PLS_CD_LICHTAROWICZ;
  z.discharge_coefficient = 0.7;
  z.passage_resistance = 2e12 * s->scale;
  bv.open = s->valve_open;

  tank = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", &err);
  drain = pls_network_add_fixed_node (net, -0.5, 0.0, "drain", &err);
  n1 = pls_network_add_node (net, 0.2 * s->scale, "N1", &err);
  ck_assert_int_ge (pls_network_add_pump (net, tank, n1, &pp, "P1", &err), 0);
  ck_assert_int_ge (pls_network_add_valve (net, n1, drain, &dv, "D1", &err), 0);
  prev = n1;
  for (i = 0; i < s->stations; i++)
    {
      int h = pls_network_add_node (net, 0.1 * i * s->scale, NULL, &err);
      int st = pls_network_add_node (net, -0.3 * s->scale, NULL, &err);

      ck_assert_int_ge (pls_network_add_line (net, prev, h, &hose, NULL, &err), 0);
      ck_assert_int_ge (pls_network_add_line (net, h, st, &hose, NULL, &err), 0);
      ck_assert_int_ge (pls_network_add_nozzle (net, st, &z, NULL, &err), 0);
      if (i == 0)
        first = h;
      prev = h;
    }
  if (s->looped && s->stations > 1)
    ck_assert_int_ge (pls_network_add_line (net, prev, first, &hose, "R", &err), 0);
  side = pls_network_add_node (net, 0.0, "S", &err);
  ck_assert_int_ge (pls_network_add_valve (net, n1, side, &bv, "V1", &err), 0);
  ck_assert_int_ge (pls_network_add_nozzle (net, side, &z, "AS", &err), 0);
  return net;
}

/* Two results are the same bit for bit: every node and element. */
static void
assert_identical (const pls_steady_result *a, const pls_steady_result *b)
{
  size_t i, n = pls_steady_result_node_count (a), m = pls_steady_result_element_count (a);

  ck_assert_uint_eq (n, pls_steady_result_node_count (b));
  ck_assert_uint_eq (m, pls_steady_result_element_count (b));
  ck_assert_int_eq (pls_steady_result_iterations (a), pls_steady_result_iterations (b));
  ck_assert_int_eq (pls_steady_result_converged (a), pls_steady_result_converged (b));
  for (i = 0; i < n; i++)
    {
      double pa = pls_steady_node_pressure (a, (int) i);
      double pb = pls_steady_node_pressure (b, (int) i);

      ck_assert_int_eq (pls_steady_node_solved (a, (int) i), pls_steady_node_solved (b, (int) i));
      ck_assert_msg (memcmp (&pa, &pb, sizeof pa) == 0, "node %zu: %.17g vs %.17g", i, pa, pb);
    }
  for (i = 0; i < m; i++)
    {
      double qa = pls_steady_element_flow (a, (int) i), qb = pls_steady_element_flow (b, (int) i);

      ck_assert_msg (memcmp (&qa, &qb, sizeof qa) == 0, "element %zu: %.17g vs %.17g", i, qa,
                     qb);
    }
  ck_assert_uint_eq (pls_steady_finding_count (a), pls_steady_finding_count (b));
}

static pls_steady_result *
solve_fresh (const pls_network *net, const pls_steady_options *o)
{
  pls_steady_result *r = NULL;
  pls_error err;

  ck_assert_msg (pls_solve_steady (net, o, &r, &err) == PLS_OK, "%s", err.message);
  return r;
}

static pls_steady_result *
solve_ws (pls_steady_workspace *ws, const pls_network *net, const pls_steady_options *o)
{
  pls_steady_result *r = NULL;
  pls_error err;

  ck_assert_msg (pls_solve_steady_with (ws, net, o, &r, &err) == PLS_OK, "%s", err.message);
  return r;
}

static pls_steady_options
options (pls_applicator_set set)
{
  pls_steady_options o;

  pls_steady_options_init (&o);
  o.applicators = set;
  return o;
}

/* Layouts of the identity test: tree, loop, power law, several sizes. */
static const layout_spec specs[] = {
  { 1, 0, 0, 1, 1.0 },
  { 6, 0, 0, 1, 1.0 },
  { 6, 1, 0, 0, 1.0 },
  { 25, 1, 1, 1, 1.0 },
  { 40, 0, 1, 0, 1.3 },
};

START_TEST (test_identical_to_fresh)
{
  pls_network *net = build (&specs[_i]);
  pls_steady_workspace *ws = pls_steady_workspace_new (NULL, NULL);
  pls_applicator_set sets[2] = { PLS_APPLICATORS_ALL, PLS_APPLICATORS_NONE };
  int k, rep;

  ck_assert_ptr_nonnull (ws);
  for (k = 0; k < 2; k++)
    {
      pls_steady_options o = options (sets[k]);
      pls_steady_result *fresh = solve_fresh (net, &o);

      /* First with this pattern (analysis), then again (reused). */
      for (rep = 0; rep < 2; rep++)
        {
          pls_steady_result *r = solve_ws (ws, net, &o);

          assert_identical (fresh, r);
          pls_steady_result_free (r);
        }
      ck_assert_int_eq (pls_steady_workspace_analyses (ws), k + 1);
      pls_steady_result_free (fresh);
    }
  pls_steady_workspace_free (ws);
  pls_network_free (net);
}
END_TEST

/* The editor's case: every figure changes, the wiring does not, and the
 * layout is compiled into a new network.  One analysis serves them all,
 * and each result is the fresh one. */
START_TEST (test_parameters_reuse_analysis)
{
  static const double scales[] = { 1.0, 1.2, 0.8, 1.05 };
  pls_steady_workspace *ws = pls_steady_workspace_new (NULL, NULL);
  pls_steady_options o = options (PLS_APPLICATORS_ALL);
  size_t i;

  for (i = 0; i < sizeof scales / sizeof scales[0]; i++)
    {
      layout_spec s = { 12, 1, (int) (i % 2), 1, scales[i] };
      pls_network *net = build (&s);
      pls_steady_result *fresh = solve_fresh (net, &o), *r = solve_ws (ws, net, &o);

      assert_identical (fresh, r);
      ck_assert_int_eq (pls_steady_workspace_analyses (ws), 1);
      pls_steady_result_free (fresh);
      pls_steady_result_free (r);
      pls_network_free (net);
    }
  /* Options that do not change the active set (tolerances, air pressure)
   * keep it too. */
  {
    layout_spec s = { 12, 1, 0, 1, 1.0 };
    pls_network *net = build (&s);
    pls_steady_result *fresh, *r;

    o.air_pressure = 4e5;
    o.pressure_tolerance = 1e-6;
    fresh = solve_fresh (net, &o);
    r = solve_ws (ws, net, &o);
    assert_identical (fresh, r);
    ck_assert_int_eq (pls_steady_workspace_analyses (ws), 1);
    pls_steady_result_free (fresh);
    pls_steady_result_free (r);
    pls_network_free (net);
  }
  pls_steady_workspace_free (ws);
}
END_TEST

/* Another active set means another matrix pattern: the analysis is redone
 * on every switch and the results stay the fresh ones. */
START_TEST (test_active_set_redoes_analysis)
{
  layout_spec s = { 8, 0, 0, 1, 1.0 };
  pls_network *net = build (&s), *shut;
  pls_steady_workspace *ws = pls_steady_workspace_new (NULL, NULL);
  pls_steady_options idle = options (PLS_APPLICATORS_NONE);
  pls_steady_options open = options (PLS_APPLICATORS_ALL);
  pls_steady_options airoff = options (PLS_APPLICATORS_ALL);
  struct
  {
    const pls_network *net;
    const pls_steady_options *o;
    long analyses;   /* expected count after the solve */
  } steps[7];
  size_t i;

  airoff.air_on = 0;   /* pump stopped, dump valve open */
  s.valve_open = 0;
  shut = build (&s);
  steps[0].net = net, steps[0].o = &idle, steps[0].analyses = 1;
  steps[1].net = net, steps[1].o = &open, steps[1].analyses = 2;
  steps[2].net = net, steps[2].o = &open, steps[2].analyses = 2;
  steps[3].net = net, steps[3].o = &idle, steps[3].analyses = 3;
  steps[4].net = shut, steps[4].o = &idle, steps[4].analyses = 4;   /* valve shut */
  steps[5].net = net, steps[5].o = &airoff, steps[5].analyses = 5;
  steps[6].net = net, steps[6].o = &airoff, steps[6].analyses = 5;
  for (i = 0; i < sizeof steps / sizeof steps[0]; i++)
    {
      pls_steady_result *fresh = solve_fresh (steps[i].net, steps[i].o);
      pls_steady_result *r = solve_ws (ws, steps[i].net, steps[i].o);

      assert_identical (fresh, r);
      ck_assert_msg (pls_steady_workspace_analyses (ws) == steps[i].analyses,
                     "step %zu: %ld analyses", i, pls_steady_workspace_analyses (ws));
      pls_steady_result_free (fresh);
      pls_steady_result_free (r);
    }
  pls_steady_workspace_free (ws);
  pls_network_free (net);
  pls_network_free (shut);
}
END_TEST

/* A reused analysis solves the new figures right, checked against a
 * closed form.  Reservoirs H1 and H2, a junction drawing 3, links
 * h = r1 Q|Q| and r2 Q|Q| (units arbitrary and consistent).  With
 * H1 = 100, H2 = 90, r1 = 1, r2 = 2: H_J = 90.0478645 (PHYSICS.md).  With
 * H1 = H2 = 100 both links feed the junction: r1 Q1^2 = r2 Q2^2 and
 * Q1 + Q2 = 3 give Q2 = 3 / (1 + sqrt(r2/r1)), H_J = 100 - r2 Q2^2
 * (derived from the same equations). */
static pls_network *
two_reservoirs (double h1, double h2, double r1, double r2, int *junction)
{
  pls_fluid_params f;
  pls_network *net;
  int a, b, j;

  pls_fluid_params_init (&f);
  net = pls_network_new (&f, NULL, NULL);
  a = pls_network_add_fixed_node (net, 0.0, h1, "R1", NULL);
  b = pls_network_add_fixed_node (net, 0.0, h2, "R2", NULL);
  j = pls_network_add_node (net, 0.0, "J", NULL);
  /* Newton starts away from Q = 0, where h = r Q|Q| has a zero slope. */
  ck_assert_int_ge (pls_network_add_custom_link (net, a, j, 0.0, r1, 1.0, "L1", NULL), 0);
  ck_assert_int_ge (pls_network_add_custom_link (net, b, j, 0.0, r2, 1.0, "L2", NULL), 0);
  ck_assert_int_eq (pls_network_set_demand (net, j, 3.0, NULL), PLS_OK);
  *junction = j;
  return net;
}

START_TEST (test_reused_analysis_closed_form)
{
  pls_steady_workspace *ws = pls_steady_workspace_new (NULL, NULL);
  pls_steady_options o = options (PLS_APPLICATORS_NONE);
  pls_steady_result *r;
  pls_network *net;
  double q2;
  int j;

  o.pressure_tolerance = 1e-9;
  o.flow_tolerance = 1e-13;
  net = two_reservoirs (100.0, 90.0, 1.0, 2.0, &j);
  r = solve_ws (ws, net, &o);
  /* The reference has 9 significant digits: half a unit in the last. */
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, j), 90.0478645, 5e-8);
  pls_steady_result_free (r);
  pls_network_free (net);

  net = two_reservoirs (100.0, 100.0, 1.0, 4.0, &j);
  r = solve_ws (ws, net, &o);
  ck_assert_int_eq (pls_steady_workspace_analyses (ws), 1);
  /* Q2 = 3 / (1 + 2) = 1, H_J = 100 - 4 = 96; Newton stops at 1e-9 of a
   * pressure step, quadratic convergence leaves far less: 1e-9. */
  q2 = 3.0 / (1.0 + sqrt (4.0));
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, j), 100.0 - 4.0 * q2 * q2, 1e-9);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, 1), q2, 1e-9);
  pls_steady_result_free (r);
  pls_network_free (net);
  pls_steady_workspace_free (ws);
}
END_TEST

/* Networks of other sizes through one workspace (its arrays grow and the
 * analysis follows), and failures that leave it usable. */
START_TEST (test_sizes_and_failures)
{
  static const int sizes[] = { 3, 30, 2, 60, 30 };
  pls_steady_workspace *ws = pls_steady_workspace_new (NULL, NULL);
  pls_steady_options o = options (PLS_APPLICATORS_ALL), bad = o;
  pls_steady_result *r = NULL;
  pls_network *empty;
  pls_fluid_params f;
  pls_error err;
  size_t i;

  for (i = 0; i < sizeof sizes / sizeof sizes[0]; i++)
    {
      layout_spec s = { sizes[i], (int) (i % 2), 0, 1, 1.0 };
      pls_network *net = build (&s);
      pls_steady_result *fresh = solve_fresh (net, &o), *rw;

      /* A failed solve in between: bad options, then an empty network. */
      bad.pressure_tolerance = -1.0;
      ck_assert_int_eq (pls_solve_steady_with (ws, net, &bad, &r, &err), PLS_ERR_INVALID);
      ck_assert_ptr_null (r);
      ck_assert (strstr (err.message, "pressure_tolerance") != NULL);
      rw = solve_ws (ws, net, &o);
      assert_identical (fresh, rw);
      pls_steady_result_free (fresh);
      pls_steady_result_free (rw);
      pls_network_free (net);
    }
  pls_fluid_params_init (&f);
  empty = pls_network_new (&f, NULL, NULL);
  ck_assert_int_eq (pls_solve_steady_with (ws, empty, &o, &r, &err), PLS_ERR_TOPOLOGY);
  ck_assert_ptr_null (r);
  pls_network_free (empty);
  /* NULL workspace or network: a status, not a crash. */
  ck_assert_int_eq (pls_solve_steady_with (NULL, NULL, &o, &r, &err), PLS_ERR_INVALID);
  ck_assert (strstr (err.message, "workspace") != NULL);
  ck_assert_int_eq (pls_solve_steady_with (ws, NULL, &o, &r, &err), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_steady_workspace_analyses (NULL), 0);
  pls_steady_workspace_free (ws);
  pls_steady_workspace_free (NULL);
}
END_TEST

static Suite *
workspace_suite (void)
{
  Suite *s = suite_create ("workspace");
  TCase *tc = tcase_create ("reuse");

  tcase_add_loop_test (tc, test_identical_to_fresh, 0,
                       (int) (sizeof specs / sizeof specs[0]));
  tcase_add_test (tc, test_parameters_reuse_analysis);
  tcase_add_test (tc, test_active_set_redoes_analysis);
  tcase_add_test (tc, test_reused_analysis_closed_form);
  tcase_add_test (tc, test_sizes_and_failures);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (workspace_suite ());
}
