/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-line.c: hose and pipe friction against published formulas.
 */
#include "config.h"

#include "pls-laws.h"

#include "law-fixtures.h"
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define LPM (1e-3 / 60.0)   /* 1 L/min in m^3/s */

static double
drop (const pls_fluid_params *f, const pls_line_params *l, double q)
{
  pls_drop d;

  pls_line_drop (f, l, q, &d, NULL);
  return d.h;
}

/* ---- check values of PHYSICS.md ------------------------------------------ */

START_TEST (test_hagen_poiseuille_check_value)
{
  /* PHYSICS.md check value, derived from dp = 128 mu L Q / (pi D^4): mu 1 Pa s,
   * D 6.35 mm, L 10 m, Q 1 L/min -> 4.1765 MPa.  Tolerance: half a unit of
   * the value's last printed digit (50 Pa). */
  pls_fluid_params f = fixture_newtonian (1.0, 1100.0);
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 0.0);
  pls_drop d;
  pls_line_state st;

  pls_line_drop (&f, &l, LPM, &d, &st);
  ck_assert_double_eq_tol (d.h, 4.1765e6, 50.0);
  /* Same formula, full precision; slope = 128 mu L / (pi D^4). */
  ck_assert_double_eq_tol (d.h / (128.0 * 10.0 * LPM / (PLS_PI * pow (6.35e-3, 4))),
                           1.0, 1e-13);
  ck_assert_double_eq_tol (d.dh_dq * PLS_PI * pow (6.35e-3, 4) / 1280.0, 1.0, 1e-13);
  ck_assert_int_eq (st.regime, PLS_REGIME_LAMINAR);
  /* Darcy f = 64 / Re in laminar flow (Hagen-Poiseuille). */
  ck_assert_double_eq_tol (st.darcy_friction * st.reynolds, 64.0, 1e-10);
  /* Newtonian wall shear rate is 8V/D exactly. */
  ck_assert_double_eq_tol (st.wall_shear_rate / (8.0 * st.velocity / 6.35e-3), 1.0, 1e-13);
}
END_TEST

START_TEST (test_power_law_check_value)
{
  /* PHYSICS.md: K 10 Pa s^n, n 0.5, same hose and flow -> 1.8135 MPa
   * (Rabinowitsch-Mooney).  The closed form, evaluated in full precision,
   * gives 1.813448 MPa, which rounds to 1.8134: the table's last digit is
   * off by one.  Tolerance 100 Pa covers the table's figure; the closed form
   * itself is held to 1e-10 in test_power_law_closed_form. */
  pls_fluid_params f = fixture_power_law (10.0, 0.5, 1100.0);
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 0.0);

  ck_assert_double_eq_tol (drop (&f, &l, LPM), 1.8135e6, 100.0);
  ck_assert_double_eq_tol (drop (&f, &l, LPM), 1.813448e6, 1.0);
}
END_TEST

/* Power law against the closed form Q = [pi n/(3n+1)] R^3 (tau_w/K)^(1/n)
 * (Rabinowitsch-Mooney; Chhabra & Richardson 2nd ed. eq. 3.9), i.e.
 * dp = (2 L K / R) [Q (3n+1) / (pi n R^3)]^n, and the true wall shear rate
 * (3n+1)/(4n) 8V/D.  The solver integrates the law numerically with a
 * Newtonian plateau below gc = 1e-3 1/s, so this checks the quadrature and
 * the inversion too.  Tolerance 1e-10 + 30 (gc/gamma_w)^min(2, 3n+1): the
 * plateau changes the viscosity by (1-n)/2 (gc/gamma)^2 at a shear rate
 * gamma, and the core below gc carries a share (gc/gamma_w)^(3n+1) of the
 * flow; weighted over the radius, Q = pi int r^2 gamma dr, the first gives
 * (gc/gamma_w)^2 int x^(2-1/n) dx, a factor ~10 near n = 1/3, hence 30
 * (the error is 2e-8 at 0.01 L/min, 2e-12 at 1 L/min for n 0.5).  The
 * quadrature adds ~1e-13, the Newton stop round-off. */
static const struct { double n, q; } pl_cases[] = {
  { 0.2, 1.0 }, { 0.35, 0.1 }, { 0.5, 1.0 }, { 0.5, 0.01 }, { 0.8, 3.0 },
  { 1.0, 1.0 }, { 1.3, 0.3 }, { 1.8, 1.0 }, { 0.25, 2.0 },
};

START_TEST (test_power_law_closed_form)
{
  double n = pl_cases[_i].n, q = pl_cases[_i].q * LPM, r = 0.5 * 6.35e-3, k = 10.0;
  pls_fluid_params f = fixture_power_law (k, n, 1100.0);
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 0.0);
  double expect = 2.0 * 10.0 * k / r * pow (q * (3.0 * n + 1.0) / (PLS_PI * n * r * r * r), n);
  double v = q / (PLS_PI * r * r);
  pls_drop d;
  pls_line_state st;

  double gw = (3.0 * n + 1.0) / (4.0 * n) * 8.0 * v / (2.0 * r);
  double tol = 1e-10 + 30.0 * pow (PLS_POWER_LAW_PLATEAU_SHEAR / gw, fmin (2.0, 3.0 * n + 1.0));

  pls_line_drop (&f, &l, q, &d, &st);
  ck_assert_int_eq (st.regime, PLS_REGIME_LAMINAR);
  ck_assert_double_eq_tol (d.h / expect, 1.0, tol);
  /* d(dp)/dQ = n dp / Q for a pure power law. */
  ck_assert_double_eq_tol (d.dh_dq / (n * expect / q), 1.0, 3.0 * tol);
  ck_assert_double_eq_tol (st.wall_shear_rate / gw, 1.0, 3.0 * tol);
  /* Metzner-Reed: Re_MR = rho V^(2-n) D^n / [K 8^(n-1) ((3n+1)/(4n))^n]
   * (Metzner & Reed 1955), and Fanning f = 16 / Re_MR. */
  ck_assert_double_eq_tol (st.reynolds
                           / (1100.0 * pow (v, 2.0 - n) * pow (2.0 * r, n)
                              / (k * pow (8.0, n - 1.0)
                                 * pow ((3.0 * n + 1.0) / (4.0 * n), n))), 1.0, 3.0 * tol);
}
END_TEST

START_TEST (test_power_law_n1_is_hagen_poiseuille)
{
  /* n = 1, K = mu: the power law is the Newtonian law (derived). */
  pls_fluid_params f = fixture_power_law (2.5, 1.0, 900.0), g = fixture_newtonian (2.5, 900.0);
  pls_line_params l = fixture_hose (3.0, 4e-3, 0.0);

  ck_assert_double_eq_tol (drop (&f, &l, 0.7 * LPM) / drop (&g, &l, 0.7 * LPM), 1.0, 1e-9);
}
END_TEST

START_TEST (test_carreau_limits)
{
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 0.0);
  /* lambda = 0: Carreau is Newtonian with mu_0 (definition of the law). */
  pls_fluid_params c0 = fixture_carreau (3.0, 0.1, 0.0, 0.4, 1100.0), g = fixture_newtonian (3.0, 1100.0);
  /* High shear: with mu_inf = 0 and lambda gamma >> 1 Carreau tends to the
   * power law K = mu_0 lambda^(n-1) (Bird, Armstrong & Hassager, sec. 4.4).
   * Here lambda gamma_w ~ 1e6; the Newtonian core near the axis carries
   * ~1e-12 of the flow, so 1e-7 is ample. */
  pls_fluid_params c1 = fixture_carreau (100.0, 0.0, 1e3, 0.5, 1100.0);
  pls_fluid_params p1 = fixture_power_law (100.0 * pow (1e3, -0.5), 0.5, 1100.0);
  /* Carreau with n = 1 is Newtonian whatever lambda is. */
  pls_fluid_params c2 = fixture_carreau (3.0, 0.0, 5.0, 1.0, 1100.0);

  ck_assert_double_eq_tol (drop (&c0, &l, LPM) / drop (&g, &l, LPM), 1.0, 1e-14);
  ck_assert_double_eq_tol (drop (&c1, &l, LPM) / drop (&p1, &l, LPM), 1.0, 1e-7);
  ck_assert_double_eq_tol (drop (&c2, &l, LPM) / drop (&g, &l, LPM), 1.0, 1e-14);
}
END_TEST

/* ---- Carreau quadrature against GSL (independent method) ------------------ */

typedef struct
{
  double mu0, muinf, lambda, n, tau;
} gsl_carreau;

static double
gsl_tau_residual (double gamma, void *data)
{
  const gsl_carreau *c = data;
  double mu = c->muinf + (c->mu0 - c->muinf)
              * pow (1.0 + c->lambda * c->lambda * gamma * gamma, 0.5 * (c->n - 1.0));

  return mu * gamma - c->tau;
}

/* gamma(tau) by Brent's method (GSL), not the solver's Newton. */
static double
gsl_gamma_of_tau (gsl_carreau *c, double tau)
{
  gsl_root_fsolver *s = gsl_root_fsolver_alloc (gsl_root_fsolver_brent);
  gsl_function fn = { gsl_tau_residual, c };
  double lo = 0.0, hi = tau / c->mu0 + 1.0, root = 0.0;
  int it, status;

  c->tau = tau;
  if (tau == 0.0)
    {
      gsl_root_fsolver_free (s);
      return 0.0;
    }
  while (gsl_tau_residual (hi, c) < 0.0)
    hi *= 2.0;
  gsl_root_fsolver_set (s, &fn, lo, hi);
  for (it = 0; it < 500; it++)
    {
      gsl_root_fsolver_iterate (s);
      root = gsl_root_fsolver_root (s);
      status = gsl_root_test_interval (gsl_root_fsolver_x_lower (s),
                                       gsl_root_fsolver_x_upper (s), 0.0, 1e-15);
      if (status == GSL_SUCCESS)
        break;
    }
  gsl_root_fsolver_free (s);
  return root;
}

static double
gsl_flow_integrand (double tau, void *data)
{
  return tau * tau * gsl_gamma_of_tau (data, tau);
}

static const struct { double mu0, muinf, lambda, n, q; } carreau_cases[] = {
  { 50.0, 0.0, 0.5, 0.4, 1.0 },     /* shear-thinning adhesive            */
  { 10.0, 0.5, 2.0, 0.3, 5.0 },     /* with an infinite-shear plateau     */
  { 5.0, 0.0, 0.01, 0.6, 0.2 },     /* mostly in its Newtonian plateau    */
  { 2.0, 0.0, 0.1, 1.4, 2.0 },      /* shear-thickening                   */
};

START_TEST (test_carreau_against_gsl)
{
  /* Q = (pi R^3 / tau_w^3) int_0^tau_w tau^2 gamma(tau) dtau
   * (Rabinowitsch-Mooney), here by GSL's adaptive QAGS in the stress
   * variable with gamma(tau) by Brent's root finder: an independent
   * evaluation of the same integral.  Tolerance 1e-8: QAGS is asked for
   * 1e-11 relative and Brent for 1e-15 in gamma. */
  double r = 0.5 * 6.35e-3, len = 10.0;
  gsl_carreau c = { carreau_cases[_i].mu0, carreau_cases[_i].muinf,
                    carreau_cases[_i].lambda, carreau_cases[_i].n, 0.0 };
  pls_fluid_params f = fixture_carreau (c.mu0, c.muinf, c.lambda, c.n, 1100.0);
  pls_line_params l = fixture_hose (len, 2.0 * r, 0.0);
  double q = carreau_cases[_i].q * LPM, tau_w, result, err, dq;
  gsl_integration_workspace *ws = gsl_integration_workspace_alloc (1000);
  gsl_function fn = { gsl_flow_integrand, &c };
  pls_drop d, d2;
  pls_line_state st;

  gsl_set_error_handler_off ();
  pls_line_drop (&f, &l, q, &d, &st);
  ck_assert_int_eq (st.regime, PLS_REGIME_LAMINAR);
  tau_w = d.h * r / (2.0 * len);
  gsl_integration_qags (&fn, 0.0, tau_w, 0.0, 1e-11, 1000, ws, &result, &err);
  ck_assert_double_eq_tol (PLS_PI * r * r * r * result / pow (tau_w, 3.0) / q, 1.0, 1e-8);
  /* Wall shear rate = gamma(tau_w). */
  ck_assert_double_eq_tol (st.wall_shear_rate / gsl_gamma_of_tau (&c, tau_w), 1.0, 1e-10);
  /* Slope against a central difference (step 1e-5 q: truncation ~1e-10). */
  dq = 1e-5 * q;
  pls_line_drop (&f, &l, q + dq, &d2, NULL);
  result = d2.h;
  pls_line_drop (&f, &l, q - dq, &d2, NULL);
  ck_assert_double_eq_tol (d.dh_dq / ((result - d2.h) / (2.0 * dq)), 1.0, 1e-7);
  gsl_integration_workspace_free (ws);
}
END_TEST

START_TEST (test_bore_doubling)
{
  /* Doubling the bore cuts the laminar drop to 1/16 (common practice, no
   * source; it is D^-4 in Hagen-Poiseuille).  For a power law the factor is
   * 2^-(3n+1) (from the closed form above). */
  pls_fluid_params g = fixture_newtonian (1.0, 1100.0), p = fixture_power_law (10.0, 0.5, 1100.0);
  pls_line_params a = fixture_hose (10.0, 6.35e-3, 0.0), b = fixture_hose (10.0, 12.7e-3, 0.0);

  ck_assert_double_eq_tol (drop (&g, &b, LPM) / drop (&g, &a, LPM), 1.0 / 16.0, 1e-14);
  ck_assert_double_eq_tol (drop (&p, &b, LPM) / drop (&p, &a, LPM), pow (2.0, -2.5), 1e-9);
}
END_TEST

/* ---- the Newton contract: sweeps over all laws and regimes ---------------- */

static pls_fluid_params
sweep_fluid (int k)
{
  switch (k)
    {
    case 0: return fixture_newtonian (1e-3, 998.0);               /* water            */
    case 1: return fixture_newtonian (2.0, 1100.0);               /* adhesive         */
    case 2: return fixture_power_law (0.05, 0.6, 1000.0);
    case 3: return fixture_power_law (0.02, 0.3, 1000.0);
    case 4: return fixture_power_law (0.001, 1.0, 1000.0);
    case 5: return fixture_power_law (0.0005, 1.5, 1000.0);
    case 6: return fixture_carreau (0.1, 0.0, 0.05, 0.5, 1000.0);
    case 7: return fixture_carreau (0.02, 0.002, 1.0, 0.4, 1000.0);
    case 8: return fixture_carreau (0.002, 0.0, 0.01, 1.3, 1000.0);
    /* Dodge-Metzner falls below laminar friction near the Ryan-Johnson
     * onset for small n: the blend's floor keeps h monotone. */
    default: return fixture_power_law (0.01, 0.15, 1000.0);
    }
}

START_TEST (test_sweep_contract)
{
  /* Over 1e-9 .. 1e2 L/s in a 10 mm line with roughness (rough pipes raise
   * the turbulent branch): h strictly increasing and odd, dh/dq finite,
   * > 0 and equal to a central difference.  The difference uses a step of
   * 1e-6 q, so its truncation error is ~1e-12 where h is smooth and ~1e-6
   * relative where h is only C1 (the ends of the blend band); 1e-5 is the
   * tolerance.  Continuity of dh/dq is asserted at the band edges too. */
  pls_fluid_params f = sweep_fluid (_i / 2);
  pls_line_params l = fixture_hose (5.0, 0.01, (_i % 2) ? 5e-5 : 0.0);
  double q, prev = 0.0, lo, hi, a = 0.25 * PLS_PI * 0.01 * 0.01;
  int saw_turbulent = 0, saw_laminar = 0;

  for (q = 1e-12; q < 0.1; q *= 1.07)
    {
      pls_drop d, dp, dm, dn;
      pls_line_state st;
      double dq = 1e-6 * q, fd;

      pls_line_drop (&f, &l, q, &d, &st);
      pls_line_drop (&f, &l, q + dq, &dp, NULL);
      pls_line_drop (&f, &l, q - dq, &dm, NULL);
      pls_line_drop (&f, &l, -q, &dn, NULL);
      fd = (dp.h - dm.h) / (2.0 * dq);
      ck_assert (isfinite (d.h) && isfinite (d.dh_dq));
      ck_assert (d.dh_dq > 0.0);
      ck_assert (d.h > prev);
      ck_assert_double_eq_tol (fd / d.dh_dq, 1.0, 1e-5);
      ck_assert_double_eq (dn.h, -d.h);
      ck_assert_double_eq (dn.dh_dq, d.dh_dq);
      ck_assert (isfinite (st.reynolds) && isfinite (st.wall_shear_rate)
                 && isfinite (st.darcy_friction));
      saw_turbulent |= st.regime == PLS_REGIME_TURBULENT;
      saw_laminar |= st.regime == PLS_REGIME_LAMINAR;
      prev = d.h;
    }
  ck_assert (saw_laminar && saw_turbulent);
  /* dh/dq on both sides of each band edge (relative 1e-9 apart in Re). */
  pls_line_transition_band (&f, &lo, &hi);
  for (int e = 0; e < 2; e++)
    {
      double re_edge = e ? hi : lo, qa, qb, qm;
      pls_drop da, db;
      pls_line_state st;

      /* Find the flow of the edge by bisection on the reported Re. */
      qa = 1e-12;
      qb = 0.1;
      for (int it = 0; it < 200; it++)
        {
          qm = sqrt (qa * qb);
          pls_line_drop (&f, &l, qm, &da, &st);
          if (st.reynolds < re_edge)
            qa = qm;
          else
            qb = qm;
        }
      pls_line_drop (&f, &l, qa * (1.0 - 1e-9), &da, NULL);
      pls_line_drop (&f, &l, qb * (1.0 + 1e-9), &db, NULL);
      ck_assert_double_eq_tol (da.dh_dq / db.dh_dq, 1.0, 1e-6);
      ck_assert_double_eq_tol (da.h / db.h, 1.0, 1e-8);
    }
  (void) a;
}
END_TEST

START_TEST (test_zero_flow)
{
  /* q = 0: no drop, the slope of the zero-shear (plateau) viscosity, i.e.
   * Hagen-Poiseuille with mu_0 (power law: K gc^(n-1)). */
  pls_fluid_params f = sweep_fluid (_i);
  pls_line_params l = fixture_hose (2.0, 5e-3, 0.0);
  double mu0 = pls_fluid_zero_shear_viscosity (&f);
  pls_drop d;
  pls_line_state st;

  pls_line_drop (&f, &l, 0.0, &d, &st);
  ck_assert_double_eq (d.h, 0.0);
  ck_assert_double_eq_tol (d.dh_dq / (128.0 * mu0 * 2.0 / (PLS_PI * pow (5e-3, 4))), 1.0,
                           1e-12);
  ck_assert_double_eq (st.reynolds, 0.0);
  ck_assert_double_eq (st.darcy_friction, 0.0);
  ck_assert_int_eq (st.regime, PLS_REGIME_LAMINAR);
}
END_TEST

/* ---- validator ------------------------------------------------------------ */

static const struct
{
  const char *field;
  size_t offset;
  double value;
} bad_line[] = {
  { "length", offsetof (pls_line_params, length), 0.0 },
  { "length", offsetof (pls_line_params, length), -1.0 },
  { "length", offsetof (pls_line_params, length), NAN },
  { "length", offsetof (pls_line_params, length), INFINITY },
  { "bore", offsetof (pls_line_params, bore), 0.0 },
  { "bore", offsetof (pls_line_params, bore), -6e-3 },
  { "bore", offsetof (pls_line_params, bore), NAN },
  { "bore", offsetof (pls_line_params, bore), INFINITY },
  { "roughness", offsetof (pls_line_params, roughness), -1e-6 },
  { "roughness", offsetof (pls_line_params, roughness), NAN },
  { "roughness", offsetof (pls_line_params, roughness), 0.01 },
  { "volumetric_expansion", offsetof (pls_line_params, volumetric_expansion), -1.0 },
  { "wall_thickness", offsetof (pls_line_params, wall_thickness), NAN },
  { "youngs_modulus", offsetof (pls_line_params, youngs_modulus), -INFINITY },
  { "rated_pressure", offsetof (pls_line_params, rated_pressure), -1.0 },
};

START_TEST (test_line_validator)
{
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 1e-6);
  char why[PLS_MESSAGE_MAX];

  ck_assert_int_eq (pls_line_params_check (&l, why, sizeof why), PLS_OK);
  *(double *) ((char *) &l + bad_line[_i].offset) = bad_line[_i].value;
  ck_assert_int_eq (pls_line_params_check (&l, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (strstr (why, bad_line[_i].field) == why, "message '%s' names '%s'", why,
                 bad_line[_i].field);
}
END_TEST

START_TEST (test_line_validator_kind)
{
  pls_line_params l = fixture_hose (10.0, 6.35e-3, 0.0);
  char why[PLS_MESSAGE_MAX];

  l.kind = (pls_line_kind) 7;
  ck_assert_int_eq (pls_line_params_check (&l, why, sizeof why), PLS_ERR_INVALID);
  ck_assert (strstr (why, "kind") != NULL);
  ck_assert_int_eq (pls_line_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_line_params_check (NULL, NULL, 0), PLS_ERR_INVALID);
}
END_TEST

static Suite *
line_suite (void)
{
  Suite *s = suite_create ("line");
  TCase *tc = tcase_create ("laws");

  tcase_set_timeout (tc, 60);
  tcase_add_test (tc, test_hagen_poiseuille_check_value);
  tcase_add_test (tc, test_power_law_check_value);
  tcase_add_loop_test (tc, test_power_law_closed_form, 0,
                       (int) (sizeof pl_cases / sizeof pl_cases[0]));
  tcase_add_test (tc, test_power_law_n1_is_hagen_poiseuille);
  tcase_add_test (tc, test_carreau_limits);
  tcase_add_loop_test (tc, test_carreau_against_gsl, 0,
                       (int) (sizeof carreau_cases / sizeof carreau_cases[0]));
  tcase_add_test (tc, test_bore_doubling);
  tcase_add_loop_test (tc, test_sweep_contract, 0, 20);
  tcase_add_loop_test (tc, test_zero_flow, 0, 10);
  tcase_add_loop_test (tc, test_line_validator, 0,
                       (int) (sizeof bad_line / sizeof bad_line[0]));
  tcase_add_test (tc, test_line_validator_kind);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (line_suite ());
}
