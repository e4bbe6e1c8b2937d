/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-accumulator.c: bladder accumulator volumes and gas energy.
 */
#include "config.h"

#include "pls-laws.h"

#include "pl-check.h"
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define BAR 1e5

/* Absolute pressure in bar -> the solver's gauge Pa. */
static double
gauge (double bar_abs)
{
  return bar_abs * BAR - PLS_ATMOSPHERE;
}

static pls_accumulator_params
accumulator (double v0, double p0_bar_abs, double n)
{
  pls_accumulator_params p;

  memset (&p, 0, sizeof p);
  p.gas_volume = v0;
  p.precharge = gauge (p0_bar_abs);
  p.precharge_temperature = 293.15;
  p.gas_temperature = 293.15;
  p.polytropic_exponent = n;
  p.neck_diameter = 0.02;
  p.neck_length = 0.05;
  return p;
}

START_TEST (test_sizing_check_values)
{
  /* PHYSICS.md: usable dV 5 L between p1 80 and p2 180 bar with precharge
   * 72 bar -> V0 10.000 L (n 1), 12.261 L (n 1.4), polytropic gas law
   * dV = V0 [(p0/p1)^(1/n) - (p0/p2)^(1/n)].  The table's figures come out
   * of the pressure ratios as given, i.e. absolute pressures, so they are
   * converted to gauge here.  Tolerance 5e-4 L: the printed digits. */
  static const double n[] = { 1.0, 1.4 }, v0[] = { 10.000e-3, 12.261e-3 };
  pls_accumulator_params p = accumulator (1.0, 72.0, n[_i]);
  double per_v0 = pls_accumulator_fluid_volume (&p, gauge (180.0))
                  - pls_accumulator_fluid_volume (&p, gauge (80.0));

  ck_assert_double_eq_tol (5e-3 / per_v0, v0[_i], 5e-7);
  /* And forward: that V0 stores 5 L over the band. */
  p.gas_volume = 5e-3 / per_v0;
  ck_assert_double_eq_tol (pls_accumulator_fluid_volume (&p, gauge (180.0))
                           - pls_accumulator_fluid_volume (&p, gauge (80.0)), 5e-3, 1e-15);
}
END_TEST

START_TEST (test_volumes)
{
  /* At or below precharge the bladder is full: no fluid, all gas.  Above:
   * gas V0 (p0/p)^(1/n), fluid the rest (polytropic law, absolute p). */
  pls_accumulator_params p = accumulator (4e-3, 50.0, 1.3);
  double pr;

  ck_assert_double_eq (pls_accumulator_fluid_volume (&p, gauge (50.0)), 0.0);
  ck_assert_double_eq (pls_accumulator_fluid_volume (&p, gauge (20.0)), 0.0);
  ck_assert_double_eq (pls_accumulator_fluid_volume (&p, -PLS_ATMOSPHERE), 0.0);
  ck_assert_double_eq (pls_accumulator_gas_volume (&p, 0.0), 4e-3);
  ck_assert_double_eq (pls_accumulator_gas_energy (&p, gauge (10.0)), 0.0);
  for (pr = 51.0; pr < 400.0; pr *= 1.3)
    {
      double vg = pls_accumulator_gas_volume (&p, gauge (pr));

      ck_assert_double_eq_tol (vg / (4e-3 * pow (50.0 / pr, 1.0 / 1.3)), 1.0, 1e-13);
      ck_assert_double_eq_tol (pls_accumulator_fluid_volume (&p, gauge (pr)) + vg, 4e-3, 1e-17);
      /* p V^n is conserved. */
      ck_assert_double_eq_tol (pr * pow (vg, 1.3) / (50.0 * pow (4e-3, 1.3)), 1.0, 1e-12);
    }
}
END_TEST

START_TEST (test_precharge_temperature)
{
  /* Gay-Lussac: at constant gas volume p_abs / T is constant.  72 bar abs
   * set at 20 C reads 72 x 333.15/293.15 bar abs at 60 C. */
  pls_accumulator_params p = accumulator (1e-3, 72.0, 1.0);

  p.gas_temperature = 333.15;
  ck_assert_double_eq_tol (pls_accumulator_effective_precharge (&p) + PLS_ATMOSPHERE,
                           72.0 * BAR * 333.15 / 293.15, 1e-6);
  ck_assert_double_eq (pls_accumulator_fluid_volume (&p, gauge (72.0 * 333.15 / 293.15)), 0.0);
  ck_assert (pls_accumulator_fluid_volume (&p, gauge (72.0 * 333.15 / 293.15) + 1e3) > 0.0);
}
END_TEST

typedef struct
{
  double p0, v0, n;
} gas;

static double
gas_pressure (double v, void *data)
{
  const gas *g = data;

  return g->p0 * pow (g->v0 / v, g->n);
}

START_TEST (test_gas_energy)
{
  /* Work on the gas W = -int_{V0}^{V} p dV' with p = p0 (V0/V')^n, by
   * GSL's QAGS (an independent evaluation), against the closed forms
   * isothermal p0 V0 ln(p/p0) and (p V - p0 V0)/(n - 1).  Tolerance 1e-10:
   * QAGS is asked for 1e-12. */
  static const double ns[] = { 1.0, 1.0000001, 1.2, 1.4, 1.67 };
  pls_accumulator_params p = accumulator (10e-3, 72.0, ns[_i]);
  gas g = { 72.0 * BAR, 10e-3, ns[_i] };
  gsl_integration_workspace *ws = gsl_integration_workspace_alloc (200);
  gsl_function fn = { gas_pressure, &g };
  double pr;

  gsl_set_error_handler_off ();
  for (pr = 80.0; pr <= 300.0; pr += 55.0)
    {
      double v = pls_accumulator_gas_volume (&p, gauge (pr)), w, err;

      gsl_integration_qags (&fn, v, 10e-3, 0.0, 1e-12, 200, ws, &w, &err);
      ck_assert_double_eq_tol (pls_accumulator_gas_energy (&p, gauge (pr)) / w, 1.0, 1e-10);
    }
  /* Isothermal figure by hand: 72 bar, 10 L to 180 bar:
   * 7.2e6 x 0.01 x ln 2.5 = 65 972.9 J. */
  if (_i == 0)
    ck_assert_double_eq_tol (pls_accumulator_gas_energy (&p, gauge (180.0)), 65972.9, 0.1);
  gsl_integration_workspace_free (ws);
}
END_TEST

static const struct
{
  const char *field;
  size_t offset;
  double value;
} bad_acc[] = {
  { "gas_volume", offsetof (pls_accumulator_params, gas_volume), 0.0 },
  { "gas_volume", offsetof (pls_accumulator_params, gas_volume), -1e-3 },
  { "gas_volume", offsetof (pls_accumulator_params, gas_volume), NAN },
  { "precharge", offsetof (pls_accumulator_params, precharge), 0.0 },
  { "precharge", offsetof (pls_accumulator_params, precharge), INFINITY },
  { "precharge_temperature", offsetof (pls_accumulator_params, precharge_temperature), 0.0 },
  { "gas_temperature", offsetof (pls_accumulator_params, gas_temperature), -5.0 },
  { "gas_temperature", offsetof (pls_accumulator_params, gas_temperature), NAN },
  { "polytropic_exponent", offsetof (pls_accumulator_params, polytropic_exponent), 0.9 },
  { "polytropic_exponent", offsetof (pls_accumulator_params, polytropic_exponent), 2.0 },
  { "polytropic_exponent", offsetof (pls_accumulator_params, polytropic_exponent), NAN },
  { "neck_diameter", offsetof (pls_accumulator_params, neck_diameter), 0.0 },
  { "neck_length", offsetof (pls_accumulator_params, neck_length), INFINITY },
  { "rated_pressure", offsetof (pls_accumulator_params, rated_pressure), -1.0 },
};

START_TEST (test_accumulator_validator)
{
  pls_accumulator_params p = accumulator (1e-3, 72.0, 1.4);
  char why[PLS_MESSAGE_MAX];
  size_t n = strlen (bad_acc[_i].field);

  ck_assert_int_eq (pls_accumulator_params_check (&p, why, sizeof why), PLS_OK);
  *(double *) ((char *) &p + bad_acc[_i].offset) = bad_acc[_i].value;
  ck_assert_int_eq (pls_accumulator_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (strncmp (why, bad_acc[_i].field, n) == 0 && why[n] == ' ',
                 "'%s' vs '%s'", why, bad_acc[_i].field);
  ck_assert_int_eq (pls_accumulator_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
}
END_TEST

static Suite *
accumulator_suite (void)
{
  Suite *s = suite_create ("accumulator");
  TCase *tc = tcase_create ("laws");

  tcase_add_loop_test (tc, test_sizing_check_values, 0, 2);
  tcase_add_test (tc, test_volumes);
  tcase_add_test (tc, test_precharge_temperature);
  tcase_add_loop_test (tc, test_gas_energy, 0, 5);
  tcase_add_loop_test (tc, test_accumulator_validator, 0,
                       (int) (sizeof bad_acc / sizeof bad_acc[0]));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (accumulator_suite ());
}
