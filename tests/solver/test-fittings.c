/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-fittings.c: Hooper 2-K fitting losses and the ball / dump valves.
 */
#include "config.h"

#include "pls-laws.h"

#include "law-fixtures.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

static pls_fluid_params
fluid_of (int k)
{
  pls_fluid_params f;

  pls_fluid_params_init (&f);
  switch (k)
    {
    case 0:
      f.mu = 1e-3;
      f.density = 998.0;
      break;
    case 1:
      f.mu = 5.0;
      break;
    case 2:
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 10.0;
      f.flow_index = 0.5;
      break;
    default:
      f.law = PLS_VISCOSITY_CARREAU;
      f.mu_zero = 20.0;
      f.mu_infinity = 0.1;
      f.lambda = 0.3;
      f.flow_index = 0.4;
      break;
    }
  return f;
}

static const struct { double k1, kinf; } hooper[] = {
  { PLS_HOOPER_TEE_RUN_K1, PLS_HOOPER_TEE_RUN_KINF },
  { PLS_HOOPER_TEE_BRANCH_K1, PLS_HOOPER_TEE_BRANCH_KINF },
  { PLS_HOOPER_ELBOW_90_K1, PLS_HOOPER_ELBOW_90_KINF },
};

START_TEST (test_two_k_newtonian)
{
  /* Hooper 1981: K = K1/Re + Kinf (1 + 1/D_inch), dp = K rho V^2 / 2.
   * Hand-evaluated at Re 1, 100, 1e4, 1e6 in a 1-inch (25.4 mm) bore,
   * where 1 + 1/D_inch = 2; e.g. the elbow (K1 800, Kinf 0.4) at Re 1e4:
   * K = 0.08 + 0.8 = 0.88.  Tolerance 1e-12 (same formula, round-off). */
  pls_fluid_params w = fluid_of (0);
  pls_fitting_params p = { hooper[_i].k1, hooper[_i].kinf, 0.0254, 0.0 };
  double a = 0.25 * PLS_PI * 0.0254 * 0.0254, re;

  for (re = 1.0; re <= 1e6; re *= 100.0)
    {
      double v = re * 1e-3 / (998.0 * 0.0254), k = p.k1 / re + 2.0 * p.k_infinity;
      pls_drop d;

      pls_fitting_drop (&w, &p, v * a, &d);
      ck_assert_double_eq_tol (d.h / (k * 998.0 * v * v / 2.0), 1.0, 1e-12);
      /* dh/dq = (K1 mu / (2 D) + Kinf' rho V) / A (derivative of the same). */
      ck_assert_double_eq_tol (d.dh_dq / ((p.k1 * 1e-3 / (2.0 * 0.0254)
                                           + 2.0 * p.k_infinity * 998.0 * v) / a), 1.0, 1e-12);
    }
  /* The hand figure for the elbow at Re 1e4. */
  ck_assert_double_eq_tol (PLS_HOOPER_ELBOW_90_K1 / 1e4 + 2.0 * PLS_HOOPER_ELBOW_90_KINF,
                           0.88, 1e-12);
}
END_TEST

START_TEST (test_two_k_published_example)
{
  /* Worked example in the documentation of the `fluids` library's
   * Hooper2K (C. Bell, after Hooper 1981): standard globe valve, 2-inch
   * bore, Re 1e4 -> K = 6.15.  Here through the drop: K = 2 dp / (rho V^2). */
  pls_fluid_params w = fluid_of (0);
  pls_fitting_params p = { PLS_HOOPER_GLOBE_VALVE_K1, PLS_HOOPER_GLOBE_VALVE_KINF, 0.0508, 0.0 };
  double v = 1e4 * 1e-3 / (998.0 * 0.0508), a = 0.25 * PLS_PI * 0.0508 * 0.0508;
  pls_drop d;

  pls_fitting_drop (&w, &p, v * a, &d);
  ck_assert_double_eq_tol (2.0 * d.h / (998.0 * v * v), 6.15, 1e-12);
}
END_TEST

START_TEST (test_two_k_low_re_is_linear)
{
  /* At the Re of adhesives (Re << K1/Kinf) the loss is viscous: dp
   * proportional to Q for a Newtonian fluid, to Q^n for a power law (from
   * K1 tau(8V/D)/16).  Tolerance 1e-3: the Kinf term is a share
   * Re Kinf (1 + 1/D_in) / K1 of the total, 6e-5 at Re 8e-3 here. */
  pls_fluid_params g = fluid_of (1), p = fluid_of (2);
  pls_fitting_params fit = { PLS_HOOPER_TEE_BRANCH_K1, PLS_HOOPER_TEE_BRANCH_KINF, 6e-3, 0.0 };
  double q = 0.01e-3 / 60.0;
  pls_drop a, b;

  pls_fitting_drop (&g, &fit, q, &a);
  pls_fitting_drop (&g, &fit, 2.0 * q, &b);
  ck_assert_double_eq_tol (b.h / a.h, 2.0, 1e-3);
  pls_fitting_drop (&p, &fit, q, &a);
  pls_fitting_drop (&p, &fit, 2.0 * q, &b);
  ck_assert_double_eq_tol (b.h / a.h, sqrt (2.0), 1e-3);
}
END_TEST

static void
fitting_law (const pls_fluid_params *f, const void *p, double q, pls_drop *d)
{
  pls_fitting_drop (f, p, q, d);
}

static void
valve_law (const pls_fluid_params *f, const void *p, double q, pls_drop *d)
{
  pls_valve_drop (f, p, q, d);
}

START_TEST (test_fitting_contract)
{
  pls_fluid_params f = fluid_of (_i);
  pls_fitting_params p = { PLS_HOOPER_TEE_RUN_K1, PLS_HOOPER_TEE_RUN_KINF, 8e-3, 0.0 };

  /* Smooth laws: 1e-7 covers the difference's truncation and round-off. */
  fixture_check_odd_law (fitting_law, &f, &p, 1e-12, 1.0, 1.1, 1e-7);
}
END_TEST

START_TEST (test_valve_contract)
{
  pls_fluid_params f = fluid_of (_i / 2);
  pls_valve_params p = { (_i % 2) ? PLS_VALVE_DUMP : PLS_VALVE_BALL, 2.5, 0.01, 1, 0.0 };

  fixture_check_odd_law (valve_law, &f, &p, 1e-12, 1.0, 1.1, 1e-7);
}
END_TEST

START_TEST (test_valve_kv)
{
  /* Kv definition (IEC 60534-1): water (1000 kg/m^3) at Kv m^3/h drops
   * 1 bar; at 2 Kv, 4 bar; dp scales with rho / 1000.  The laminar floor
   * (Hooper K1/Re on the bore) adds ~K1 mu 8V/D / 16 = 3e-4 bar here, so
   * the tolerance is 1e-3 relative. */
  pls_fluid_params w;
  pls_valve_params p = { PLS_VALVE_BALL, 10.0, 0.025, 1, 0.0 };
  pls_drop d;

  pls_fluid_params_init (&w);
  w.mu = 1e-3;
  w.density = 1000.0;
  pls_valve_drop (&w, &p, 10.0 / 3600.0, &d);
  ck_assert_double_eq_tol (d.h / 1e5, 1.0, 1e-3);
  pls_valve_drop (&w, &p, 20.0 / 3600.0, &d);
  ck_assert_double_eq_tol (d.h / 4e5, 1.0, 1e-3);
  w.density = 1200.0;
  pls_valve_drop (&w, &p, 10.0 / 3600.0, &d);
  ck_assert_double_eq_tol (d.h / 1.2e5, 1.0, 1e-3);
  /* The dump valve's seat has the larger viscous term (K1 1500 vs 300). */
  {
    pls_fluid_params g = fluid_of (1);
    pls_valve_params dv = p;
    pls_drop db, dd;

    dv.kind = PLS_VALVE_DUMP;
    pls_valve_drop (&g, &p, 0.0, &db);
    pls_valve_drop (&g, &dv, 0.0, &dd);
    ck_assert_double_eq_tol (dd.dh_dq / db.dh_dq, 5.0, 1e-6);
  }
}
END_TEST

/* ---- validators ------------------------------------------------------------ */

static const struct
{
  const char *field;
  size_t offset;
  double value;
} bad_fitting[] = {
  { "k1", offsetof (pls_fitting_params, k1), 0.0 },
  { "k1", offsetof (pls_fitting_params, k1), -100.0 },
  { "k1", offsetof (pls_fitting_params, k1), NAN },
  { "k1", offsetof (pls_fitting_params, k1), INFINITY },
  { "k_infinity", offsetof (pls_fitting_params, k_infinity), -0.1 },
  { "k_infinity", offsetof (pls_fitting_params, k_infinity), NAN },
  { "bore", offsetof (pls_fitting_params, bore), 0.0 },
  { "bore", offsetof (pls_fitting_params, bore), -1.0 },
  { "bore", offsetof (pls_fitting_params, bore), INFINITY },
  { "rated_pressure", offsetof (pls_fitting_params, rated_pressure), NAN },
};

static int
names_field (const char *why, const char *field)
{
  size_t n = strlen (field);

  return strncmp (why, field, n) == 0 && why[n] == ' ';
}

START_TEST (test_fitting_validator)
{
  pls_fitting_params p = { 200.0, 0.1, 6e-3, 0.0 };
  char why[PLS_MESSAGE_MAX];

  ck_assert_int_eq (pls_fitting_params_check (&p, why, sizeof why), PLS_OK);
  *(double *) ((char *) &p + bad_fitting[_i].offset) = bad_fitting[_i].value;
  ck_assert_int_eq (pls_fitting_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (names_field (why, bad_fitting[_i].field), "'%s' vs '%s'", why,
                 bad_fitting[_i].field);
}
END_TEST

static const struct
{
  const char *field;
  size_t offset;
  double value;
} bad_valve[] = {
  { "kv", offsetof (pls_valve_params, kv), 0.0 },
  { "kv", offsetof (pls_valve_params, kv), -2.0 },
  { "kv", offsetof (pls_valve_params, kv), NAN },
  { "kv", offsetof (pls_valve_params, kv), INFINITY },
  { "bore", offsetof (pls_valve_params, bore), 0.0 },
  { "bore", offsetof (pls_valve_params, bore), NAN },
  { "rated_pressure", offsetof (pls_valve_params, rated_pressure), -5.0 },
};

START_TEST (test_valve_validator)
{
  pls_valve_params p = { PLS_VALVE_BALL, 2.0, 6e-3, 1, 0.0 };
  char why[PLS_MESSAGE_MAX];

  ck_assert_int_eq (pls_valve_params_check (&p, why, sizeof why), PLS_OK);
  *(double *) ((char *) &p + bad_valve[_i].offset) = bad_valve[_i].value;
  ck_assert_int_eq (pls_valve_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (names_field (why, bad_valve[_i].field), "'%s' vs '%s'", why,
                 bad_valve[_i].field);
}
END_TEST

START_TEST (test_valve_validator_ints)
{
  pls_valve_params p = { PLS_VALVE_DUMP, 2.0, 6e-3, 0, 0.0 };
  char why[PLS_MESSAGE_MAX];

  ck_assert_int_eq (pls_valve_params_check (&p, why, sizeof why), PLS_OK);
  p.open = 2;
  ck_assert_int_eq (pls_valve_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert (names_field (why, "open"));
  p.open = 1;
  p.kind = (pls_valve_kind) -1;
  ck_assert_int_eq (pls_valve_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert (names_field (why, "kind"));
  ck_assert_int_eq (pls_valve_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_fitting_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
}
END_TEST

static Suite *
fittings_suite (void)
{
  Suite *s = suite_create ("fittings");
  TCase *tc = tcase_create ("laws");

  tcase_add_loop_test (tc, test_two_k_newtonian, 0, 3);
  tcase_add_test (tc, test_two_k_published_example);
  tcase_add_test (tc, test_two_k_low_re_is_linear);
  tcase_add_loop_test (tc, test_fitting_contract, 0, 4);
  tcase_add_loop_test (tc, test_valve_contract, 0, 8);
  tcase_add_test (tc, test_valve_kv);
  tcase_add_loop_test (tc, test_fitting_validator, 0,
                       (int) (sizeof bad_fitting / sizeof bad_fitting[0]));
  tcase_add_loop_test (tc, test_valve_validator, 0,
                       (int) (sizeof bad_valve / sizeof bad_valve[0]));
  tcase_add_test (tc, test_valve_validator_ints);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (fittings_suite ());
}
