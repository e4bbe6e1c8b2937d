/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-pump.c: air-driven ratio pump curve and its check valve.
 */
#include "config.h"

#include "pls-laws.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

static pls_pump_params
pump (double ratio, double m)
{
  pls_pump_params p;

  memset (&p, 0, sizeof p);
  p.ratio = ratio;
  p.friction_offset = 0.0;
  p.displacement = 50e-6;     /* 50 cm^3 per double stroke */
  p.max_cycle_rate = 1.0;     /* 60 cycles/min */
  p.curve_exponent = m;
  return p;
}

START_TEST (test_stall_check_value)
{
  /* PHYSICS.md: stall = ratio x air pressure, 30:1 at 6 bar -> 180 bar
   * (common practice: the definition of the pump ratio).  A seal-friction
   * offset comes off the top. */
  pls_pump_params p = pump (30.0, 1.0);
  pls_drop d;

  ck_assert_double_eq_tol (pls_pump_stall_pressure (&p, 6e5), 180e5, 1e-6);
  pls_pump_drop (&p, 6e5, 0.0, &d);
  ck_assert_double_eq_tol (d.h, -180e5, 1e-6);
  p.friction_offset = 3e5;
  ck_assert_double_eq_tol (pls_pump_stall_pressure (&p, 6e5), 177e5, 1e-6);
  /* Air off, or too little air to beat friction: no pressure. */
  ck_assert_double_eq (pls_pump_stall_pressure (&p, 0.0), 0.0);
  ck_assert_double_eq (pls_pump_stall_pressure (&p, 0.05e5), 0.0);
  ck_assert_double_eq (pls_pump_stall_pressure (&p, -1e5), 0.0);
}
END_TEST

START_TEST (test_free_flow_and_curve)
{
  /* Q_free = cycle rate x displacement; Q = Q_free (1 - p/p_stall)^m
   * (PHYSICS.md pump model).  At p = p_stall/2: Q = Q_free 2^-m.  The
   * regularisations (see pls-pump.c) move the curve by <= 1e-6 p_stall away
   * from q < 1e-6 Q_free, and the series floor by 1e-9: tolerance 2e-6. */
  static const double ms[] = { 0.5, 1.0, 1.5, 2.0, 3.0 };
  double m = ms[_i];
  pls_pump_params p = pump (20.0, m);
  double qf = pls_pump_free_flow (&p), ps = pls_pump_stall_pressure (&p, 5e5);
  pls_drop d;

  ck_assert_double_eq_tol (qf, 50e-6, 1e-18);
  pls_pump_drop (&p, 5e5, qf * pow (0.5, m), &d);
  ck_assert_double_eq_tol (d.h / ps, -0.5, 2e-6);
  pls_pump_drop (&p, 5e5, qf, &d);
  ck_assert_double_eq_tol (d.h / ps, 0.0, 2e-6);
  pls_pump_drop (&p, 5e5, 0.1 * qf, &d);
  ck_assert_double_eq_tol (d.h / ps, -(1.0 - pow (0.1, 1.0 / m)), 2e-6);
  /* Slope of p = p_s (1 - u^(1/m)): dp/dq = p_s u^(1/m - 1) / (m Q_free). */
  ck_assert_double_eq_tol (d.dh_dq / (ps * pow (0.1, 1.0 / m - 1.0) / (m * qf)), 1.0, 2e-5);
}
END_TEST

START_TEST (test_pump_contract)
{
  /* From backflow (check valve) through stall to past free flow: h strictly
   * increasing, dh/dq finite and > 0, continuous at q = 0 (both sides) and
   * equal to a central difference (step 1e-7 Q_free: the curve's
   * curvature over the step is below 1e-5 relative except inside the
   * regularised first millionth of the flow, which the sweep steps over). */
  static const double ms[] = { 0.5, 1.0, 2.0, 4.0 };
  pls_pump_params p = pump (30.0, ms[_i % 4]);
  double air = (_i < 4) ? 6e5 : 0.0, qf = pls_pump_free_flow (&p), q, prev = -HUGE_VAL;
  pls_drop a, b;

  for (q = -0.05 * qf; q < 1.3 * qf; q += 0.0013 * qf)
    {
      pls_drop d, dp, dm;
      double dq = 1e-7 * qf;

      pls_pump_drop (&p, air, q, &d);
      pls_pump_drop (&p, air, q + dq, &dp);
      pls_pump_drop (&p, air, q - dq, &dm);
      ck_assert (isfinite (d.h) && isfinite (d.dh_dq) && d.dh_dq > 0.0);
      ck_assert (d.h > prev);
      if (fabs (q) > 2e-6 * qf)
        ck_assert_msg (fabs ((dp.h - dm.h) / (2.0 * dq) / d.dh_dq - 1.0) < 1e-4,
                       "q/qf %g fd %g dh %g", q / qf, (dp.h - dm.h) / (2.0 * dq), d.dh_dq);
      prev = d.h;
    }
  pls_pump_drop (&p, air, -1e-300, &a);
  pls_pump_drop (&p, air, 0.0, &b);
  ck_assert_double_eq_tol (a.dh_dq / b.dh_dq, 1.0, 1e-12);
  ck_assert_double_eq_tol (a.h - b.h, 0.0, 1e-6);
  /* The check valve holds: far backflow is steep, 1e3 p_ref / Q_free. */
  pls_pump_drop (&p, air, -0.05 * qf, &a);
  ck_assert_double_eq_tol (a.dh_dq / (1e3 * fmax (pls_pump_stall_pressure (&p, air), 30e5) / qf),
                           1.0, 1e-6);
}
END_TEST

static const struct
{
  const char *field;
  size_t offset;
  double value;
} bad_pump[] = {
  { "ratio", offsetof (pls_pump_params, ratio), 0.0 },
  { "ratio", offsetof (pls_pump_params, ratio), -30.0 },
  { "ratio", offsetof (pls_pump_params, ratio), NAN },
  { "ratio", offsetof (pls_pump_params, ratio), INFINITY },
  { "friction_offset", offsetof (pls_pump_params, friction_offset), -1.0 },
  { "friction_offset", offsetof (pls_pump_params, friction_offset), NAN },
  { "displacement", offsetof (pls_pump_params, displacement), 0.0 },
  { "displacement", offsetof (pls_pump_params, displacement), INFINITY },
  { "max_cycle_rate", offsetof (pls_pump_params, max_cycle_rate), 0.0 },
  { "max_cycle_rate", offsetof (pls_pump_params, max_cycle_rate), NAN },
  { "curve_exponent", offsetof (pls_pump_params, curve_exponent), 0.0 },
  { "curve_exponent", offsetof (pls_pump_params, curve_exponent), -1.0 },
  { "curve_exponent", offsetof (pls_pump_params, curve_exponent), 50.0 },
  { "curve_exponent", offsetof (pls_pump_params, curve_exponent), NAN },
  { "changeover_time", offsetof (pls_pump_params, changeover_time), -0.01 },
  { "changeover_time", offsetof (pls_pump_params, changeover_time), 0.6 },
  { "rated_pressure", offsetof (pls_pump_params, rated_pressure), NAN },
};

START_TEST (test_pump_validator)
{
  pls_pump_params p = pump (30.0, 1.0);
  char why[PLS_MESSAGE_MAX];
  size_t n = strlen (bad_pump[_i].field);

  ck_assert_int_eq (pls_pump_params_check (&p, why, sizeof why), PLS_OK);
  *(double *) ((char *) &p + bad_pump[_i].offset) = bad_pump[_i].value;
  ck_assert_int_eq (pls_pump_params_check (&p, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (strncmp (why, bad_pump[_i].field, n) == 0 && why[n] == ' ',
                 "'%s' vs '%s'", why, bad_pump[_i].field);
  ck_assert_int_eq (pls_pump_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
}
END_TEST

static Suite *
pump_suite (void)
{
  Suite *s = suite_create ("pump");
  TCase *tc = tcase_create ("laws");

  tcase_add_test (tc, test_stall_check_value);
  tcase_add_loop_test (tc, test_free_flow_and_curve, 0, 5);
  tcase_add_loop_test (tc, test_pump_contract, 0, 8);
  tcase_add_loop_test (tc, test_pump_validator, 0,
                       (int) (sizeof bad_pump / sizeof bad_pump[0]));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (pump_suite ());
}
