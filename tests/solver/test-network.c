/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-network.c: building networks, and steady solutions of networks that
 * have a closed form.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

/* Tolerances far below the test tolerances: the flows here are O(1) or
 * O(1e-5), so 1e-13 is near rounding for the first and 1e-8 relative for
 * the second (Newton's last step then squares it). */
static pls_steady_options
tight_options (void)
{
  pls_steady_options o;

  pls_steady_options_init (&o);
  o.pressure_tolerance = 1e-9;
  o.flow_tolerance = 1e-13;
  return o;
}

static pls_network *
newtonian_net (double mu)
{
  pls_fluid_params f;
  pls_network *net;

  pls_fluid_params_init (&f);
  f.law = PLS_VISCOSITY_NEWTONIAN;
  f.mu = mu;
  net = pls_network_new (&f, NULL, NULL);
  ck_assert_ptr_nonnull (net);
  return net;
}

static pls_line_params
hose (double length, double bore)
{
  pls_line_params p;

  memset (&p, 0, sizeof p);
  p.kind = PLS_LINE_HOSE;
  p.length = length;
  p.bore = bore;
  p.roughness = 0.0;
  return p;
}

/* Two reservoirs at 100 and 90, a junction drawing 3, links h = Q|Q| and
 * h = 2 Q|Q|: H_J = 90.0478645 (PHYSICS.md, closed form: it solves
 * sqrt(100 - H) - sqrt((H - 90) / 2) = 3).  Units are arbitrary and
 * consistent; elevations 0 so the density never enters. */
START_TEST (test_two_reservoirs)
{
  pls_network *net = newtonian_net (1.0);
  pls_steady_options o = tight_options ();
  pls_steady_result *r = NULL;
  pls_error err;
  int r1, r2, j, l1, l2;
  double h, q1, q2;

  r1 = pls_network_add_fixed_node (net, 0.0, 100.0, "R1", &err);
  r2 = pls_network_add_fixed_node (net, 0.0, 90.0, "R2", &err);
  j = pls_network_add_node (net, 0.0, "J", &err);
  /* Newton starts away from Q = 0, where h = r Q|Q| has a zero slope. */
  l1 = pls_network_add_custom_link (net, r1, j, 0.0, 1.0, 1.0, "L1", &err);
  l2 = pls_network_add_custom_link (net, r2, j, 0.0, 2.0, 1.0, "L2", &err);
  ck_assert_int_ge (l2, 0);
  ck_assert_int_eq (pls_network_set_demand (net, j, 3.0, &err), PLS_OK);
  ck_assert_msg (pls_solve_steady (net, &o, &r, &err) == PLS_OK, "%s", err.message);
  h = pls_steady_node_pressure (r, j);
  /* The reference has 9 significant digits: half a unit in the last. */
  ck_assert_double_eq_tol (h, 90.0478645, 5e-8);
  q1 = pls_steady_element_flow (r, l1);
  q2 = pls_steady_element_flow (r, l2);
  /* Derived from the same closed form: Q1 = sqrt(100 - H),
   * Q2 = -sqrt((H - 90) / 2); mass balance Q1 + Q2 = 3. */
  ck_assert_double_eq_tol (q1, sqrt (100.0 - h), 1e-9);
  ck_assert_double_eq_tol (q2, -sqrt ((h - 90.0) / 2.0), 1e-9);
  ck_assert_double_eq_tol (q1 + q2, 3.0, 1e-12);
  ck_assert_int_eq (pls_steady_result_converged (r), 1);
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

/* Linear links in series and in parallel between 1 MPa and 0: the hand
 * formulas of resistances in series (s1 + s2) and in parallel
 * (1 / (1/s1 + 1/s2)), which any circuit text gives. */
static const struct
{
  double s1, s2;
} linear_cases[] = {
  { 1e10, 1e10 }, { 1e10, 3e11 }, { 5e12, 2e9 }, { 7e8, 7e8 },
};

START_TEST (test_linear_series_parallel)
{
  pls_network *net = newtonian_net (1.0);
  pls_steady_options o = tight_options ();
  pls_steady_result *r = NULL;
  pls_error err;
  double s1 = linear_cases[_i].s1, s2 = linear_cases[_i].s2, dp = 1e6;
  int in, out, mid, a, b, c, d;

  in = pls_network_add_fixed_node (net, 0.0, dp, "in", &err);
  out = pls_network_add_fixed_node (net, 0.0, 0.0, "out", &err);
  mid = pls_network_add_node (net, 0.0, "mid", &err);
  a = pls_network_add_custom_link (net, in, mid, s1, 0.0, 0.0, "a", &err);
  b = pls_network_add_custom_link (net, mid, out, s2, 0.0, 0.0, "b", &err);
  c = pls_network_add_custom_link (net, in, out, s1, 0.0, 0.0, "c", &err);
  d = pls_network_add_custom_link (net, in, out, s2, 0.0, 0.0, "d", &err);
  ck_assert_int_ge (d, 0);
  ck_assert_int_eq (pls_solve_steady (net, &o, &r, &err), PLS_OK);
  /* A linear network is solved exactly by one Newton step; 1e-12
   * relative leaves room for rounding in the factorisation. */
  ck_assert_double_eq_tol (pls_steady_element_flow (r, a), dp / (s1 + s2),
                           1e-12 * dp / (s1 + s2));
  ck_assert_double_eq_tol (pls_steady_element_flow (r, b), dp / (s1 + s2),
                           1e-12 * dp / (s1 + s2));
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, mid), dp * s2 / (s1 + s2),
                           1e-12 * dp);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, c) + pls_steady_element_flow (r, d),
                           dp * (1.0 / s1 + 1.0 / s2), 1e-12 * dp * (1.0 / s1 + 1.0 / s2));
  ck_assert_int_le (pls_steady_result_iterations (r), 3);
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

/* Laminar Newtonian hoses, Hagen-Poiseuille dp = 128 mu L Q / (pi D^4):
 * PHYSICS.md's check value mu 1 Pa s, D 6.35 mm, L 10 m, Q 1 L/min ->
 * 4.1765 MPa, then series (5 m + 5 m) and parallel (two 10 m hoses). */
START_TEST (test_hagen_poiseuille_network)
{
  pls_network *net = newtonian_net (1.0);
  pls_steady_options o = tight_options ();
  pls_steady_result *r = NULL;
  pls_error err;
  pls_line_params h10 = hose (10.0, 6.35e-3), h5 = hose (5.0, 6.35e-3);
  double q = 1e-3 / 60.0, dp = 128.0 * 1.0 * 10.0 * q / (PLS_PI * pow (6.35e-3, 4));
  int in, out, mid, single, s1, s2, p1, p2;

  /* The formula against the table first: 5 digits given. */
  ck_assert_double_eq_tol (dp, 4.1765e6, 0.00005e6);
  in = pls_network_add_fixed_node (net, 0.0, dp, "in", &err);
  out = pls_network_add_fixed_node (net, 0.0, 0.0, "out", &err);
  mid = pls_network_add_node (net, 0.0, "mid", &err);
  single = pls_network_add_line (net, in, out, &h10, "H1", &err);
  s1 = pls_network_add_line (net, in, mid, &h5, "H2", &err);
  s2 = pls_network_add_line (net, mid, out, &h5, "H3", &err);
  p1 = pls_network_add_line (net, in, out, &h10, "H4", &err);
  p2 = pls_network_add_line (net, in, out, &h10, "H5", &err);
  ck_assert_int_ge (p2, 0);
  ck_assert_int_eq (pls_solve_steady (net, &o, &r, &err), PLS_OK);
  /* Laminar Newtonian drop is linear in Q: 1e-9 relative covers the
   * law's own arithmetic. */
  ck_assert_double_eq_tol (pls_steady_element_flow (r, single), q, 1e-9 * q);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, s1), q, 1e-9 * q);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, s2), q, 1e-9 * q);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, mid), 0.5 * dp, 1e-9 * dp);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, p1) + pls_steady_element_flow (r, p2),
                           2.0 * q, 2e-9 * q);
  {
    pls_line_result lr;

    ck_assert_int_eq (pls_steady_line (r, single, &lr), PLS_OK);
    /* Mean velocity Q / A and the Newtonian wall shear rate 8 V / D. */
    ck_assert_double_eq_tol (lr.velocity, q / (0.25 * PLS_PI * 6.35e-3 * 6.35e-3), 1e-9);
    ck_assert_double_eq_tol (lr.wall_shear_rate, 8.0 * lr.velocity / 6.35e-3,
                             1e-6 * lr.wall_shear_rate);
    ck_assert_int_eq (lr.regime, PLS_FLOW_LAMINAR);
  }
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

/* Elevation as rho g dz: two open tanks at 0 gauge, 10 m apart in height,
 * joined through a junction by linear links; a dead-end branch shows the
 * hydrostatic pressure p = rho g (z_ref - z).  Standard gravity 9.80665
 * (CGPM 1901), density 1100 (the default fluid). */
START_TEST (test_elevation)
{
  pls_network *net = newtonian_net (1.0);
  pls_steady_options o = tight_options ();
  pls_steady_result *r = NULL;
  pls_error err;
  double rho_g = 1100.0 * 9.80665, s = 1e9;
  int top, bottom, j, dead, a;

  top = pls_network_add_fixed_node (net, 10.0, 0.0, "top", &err);
  bottom = pls_network_add_fixed_node (net, 0.0, 0.0, "bottom", &err);
  j = pls_network_add_node (net, 5.0, "J", &err);
  dead = pls_network_add_node (net, -2.0, "D", &err);
  a = pls_network_add_custom_link (net, top, j, s, 0.0, 0.0, "a", &err);
  pls_network_add_custom_link (net, j, bottom, s, 0.0, 0.0, "b", &err);
  pls_network_add_custom_link (net, j, dead, s, 0.0, 0.0, "c", &err);
  ck_assert_int_eq (pls_solve_steady (net, &o, &r, &err), PLS_OK);
  /* Q = rho g dz / (2 s); junction piezometric head halfway: p_J =
   * rho g (10 + 0) / 2 - rho g 5 = 0; dead end at rest: p = rho g (5 - (-2)). */
  ck_assert_double_eq_tol (pls_steady_element_flow (r, a), rho_g * 10.0 / (2.0 * s), 1e-15);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, j), 0.0, 1e-6);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, dead), rho_g * 7.0, 1e-6);
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

/* Names, kinds and ports read back as given. */
START_TEST (test_build_read_back)
{
  pls_network *net = newtonian_net (1.0);
  pls_line_params h = hose (2.0, 6e-3);
  pls_gauge_params g = { 25e6 };
  pls_error err;
  int a, b, e, ge;

  a = pls_network_add_node (net, 0.0, "N1", &err);
  b = pls_network_add_node (net, 1.5, NULL, &err);
  e = pls_network_add_line (net, a, b, &h, "H7", &err);
  ge = pls_network_add_gauge (net, b, &g, "G2", &err);
  ck_assert_int_eq (a, 0);
  ck_assert_int_eq (b, 1);
  ck_assert_int_eq (e, 0);
  ck_assert_int_eq (ge, 1);
  ck_assert_uint_eq (pls_network_node_count (net), 2);
  ck_assert_uint_eq (pls_network_element_count (net), 2);
  ck_assert_str_eq (pls_network_node_name (net, a), "N1");
  ck_assert_str_eq (pls_network_node_name (net, b), "");
  ck_assert_str_eq (pls_network_element_name (net, e), "H7");
  ck_assert_int_eq (pls_network_element_kind (net, ge), PLS_ELEMENT_GAUGE);
  ck_assert_int_eq (pls_network_element_node (net, e, 1), b);
  ck_assert_int_eq (pls_network_element_node (net, ge, 1), -1);
  ck_assert_int_eq (pls_network_node_is_fixed (net, a), 0);
  ck_assert_str_eq (pls_network_element_name (net, 99), "");
  pls_network_free (net);
}
END_TEST

static Suite *
network_suite (void)
{
  Suite *s = suite_create ("network");
  TCase *tc = tcase_create ("closed-form");

  tcase_add_test (tc, test_two_reservoirs);
  tcase_add_loop_test (tc, test_linear_series_parallel, 0,
                       (int) (sizeof linear_cases / sizeof linear_cases[0]));
  tcase_add_test (tc, test_hagen_poiseuille_network);
  tcase_add_test (tc, test_elevation);
  tcase_add_test (tc, test_build_read_back);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (network_suite ());
}
