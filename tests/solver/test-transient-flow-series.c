/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-transient-flow-series.c: the per-element flow samples of the firing
 * cycle and the shutdown (pls_cycle_sample_flow, pls_shutdown_sample_flow),
 * checked against the volumes the solver integrates step by step.
 */

#include "config.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#include "pl-check.h"
#include "pressline-solver.h"
#include "pls-laws.h"
#include "test-transient-layouts.h"

/* Composite trapezoidal rule over the evenly spaced cycle samples. */
static double
cycle_flow_integral (const pls_cycle_result *r, int element)
{
  size_t n = pls_cycle_sample_count (r), i;
  double sum = 0.0;

  for (i = 0; i + 1 < n; i++)
    sum += 0.5 * (pls_cycle_sample_time (r, i + 1) - pls_cycle_sample_time (r, i))
           * (pls_cycle_sample_flow (r, element, i) + pls_cycle_sample_flow (r, element, i + 1));
  return sum;
}

static pls_cycle_result *
run_cycle (const pls_network *net, int samples)
{
  pls_transient_options o;
  pls_cycle_result *r = NULL;
  pls_error err;

  pls_transient_options_init (&o);
  o.samples = samples;
  ck_assert_msg (pls_solve_cycle (net, &o, &r, &err) == PLS_OK, "%s", err.message);
  return r;
}

/* Shot volume check (composite trapezoidal rule): the trapezoidal integral
 * of each applicator's sampled flow over the cycle equals its shot volume,
 * shot mass / density, which the solver integrates at every step.  The
 * rule's error is O(h^2) on smooth stretches and O(h^2 * slope jump) at
 * each of the valve ramp's four kinks, so it must shrink as the samples
 * get denser: 0.15 % of the shot at the default 200 samples (h = 2.5 ms
 * against 2 ms ramps; asked below 0.5 %), 4e-5 % at 4000 (h = 0.125 ms;
 * asked below 0.01 %). */
START_TEST (test_cycle_shot_volume)
{
  pls_test_layout l = pls_test_layout_new (4, 0, 10e-3);
  pls_cycle_result *coarse = run_cycle (l.net, 200), *fine = run_cycle (l.net, 4000);
  pls_fluid_params f;
  int a;

  pls_fluid_params_init (&f);
  for (a = 0; a < l.n_app; a++)
    {
      int e = l.first_app + a * l.app_stride;
      double shot = pls_cycle_shot_mass (fine, e) / f.density;
      double err_fine = fabs (cycle_flow_integral (fine, e) - shot);
      double err_coarse = fabs (cycle_flow_integral (coarse, e) - pls_cycle_shot_mass (coarse, e)
                                / f.density);

      printf ("figure: A%d shot volume check: trapezoid error %.3g %% at 200 samples, "
              "%.3g %% at 4000\n", a + 1, 100.0 * err_coarse / shot, 100.0 * err_fine / shot);
      ck_assert_double_gt (shot, 0.0);
      ck_assert_double_lt (err_coarse, 5e-3 * shot);
      ck_assert_double_lt (err_fine, 1e-4 * shot);
      ck_assert_double_lt (err_fine, err_coarse + 1e-6 * shot);
      /* An applicator's flow leaves the line: never much below zero. */
      for (size_t i = 0; i < pls_cycle_sample_count (fine); i++)
        ck_assert_double_ge (pls_cycle_sample_flow (fine, e, i), -1e-3 * shot);
    }
  /* The pump: its sampled flow integrates to the volume it delivered. */
  {
    pls_cycle_pump pump;

    ck_assert_int_eq (pls_cycle_pump_flow (fine, l.pump, &pump), PLS_OK);
    ck_assert_double_eq_tol (cycle_flow_integral (fine, l.pump), pump.volume,
                             1e-3 * pump.volume);
  }
  /* Out of range: 0, as every read-back. */
  ck_assert_double_eq (pls_cycle_sample_flow (fine, -1, 0), 0.0);
  ck_assert_double_eq (pls_cycle_sample_flow (fine, l.pump, 4000), 0.0);
  ck_assert_double_eq (pls_cycle_sample_flow (NULL, l.pump, 0), 0.0);
  pls_cycle_result_free (coarse);
  pls_cycle_result_free (fine);
  pls_network_free (l.net);
}
END_TEST

/* Shutdown drain volume check: with the applicators shut and the pump's
 * check valve closed, the dump valve is the only way out, so the volume
 * through it over the run is at least the fluid the accumulator held at
 * idle (it empties below its precharge; fluid volume from the polytropic
 * gas law, pls-laws.h) and at most that plus what the lines' compliance
 * held, bounded here by twice the supply hose's (A/K + e) L p (it holds
 * most of the line's fluid compliance; the manifold is short and rigid). */
START_TEST (test_shutdown_drain_volume)
{
  pls_test_layout l = pls_test_layout_new (2, 0, 10e-3);
  pls_transient_options o;
  pls_shutdown_result *r = NULL;
  pls_accumulator_params ap = { 0 };
  pls_error err;
  double area = 0.25 * PLS_PI_TEST * 12.7e-3 * 12.7e-3, p = 18e6, drained = 0.0;
  double acc_volume, hose_volume;
  size_t n, i;

  pls_transient_options_init (&o);
  ck_assert_msg (pls_solve_shutdown (l.net, &o, &r, &err) == PLS_OK, "%s", err.message);
  n = pls_shutdown_sample_count (r);
  ck_assert_uint_ge (n, 2);
  for (i = 0; i + 1 < n; i++)
    drained += 0.5 * (pls_shutdown_sample_time (r, i + 1) - pls_shutdown_sample_time (r, i))
               * (pls_shutdown_sample_flow (r, l.dump, i)
                  + pls_shutdown_sample_flow (r, l.dump, i + 1));
  /* The layout's accumulator (test-transient-layouts.h). */
  ap.gas_volume = 0.5e-3;
  ap.precharge = 9e6;
  ap.precharge_temperature = 293.15;
  ap.gas_temperature = 293.15;
  ap.polytropic_exponent = 1.4;
  ap.neck_diameter = 0.01;
  ap.neck_length = 0.05;
  acc_volume = pls_accumulator_fluid_volume (&ap, p);
  hose_volume = (area / 1.5e9 + 3e-14) * 10.0 * p;
  printf ("figure: drained %.4g mL; accumulator held %.4g mL, hose bound %.4g mL\n",
          1e6 * drained, 1e6 * acc_volume, 2e6 * hose_volume);
  ck_assert_double_gt (acc_volume, 0.0);
  ck_assert_double_ge (drained, 0.98 * acc_volume);
  ck_assert_double_le (drained, acc_volume + 2.0 * hose_volume);
  /* The stopped pump delivers nothing. */
  for (i = 0; i < n; i++)
    ck_assert_double_le (fabs (pls_shutdown_sample_flow (r, l.pump, i)), 1e-9);
  ck_assert_double_eq (pls_shutdown_sample_flow (r, 1000, 0), 0.0);
  ck_assert_double_eq (pls_shutdown_sample_flow (NULL, l.dump, 0), 0.0);
  pls_shutdown_result_free (r);
  pls_network_free (l.net);
}
END_TEST

static Suite *
flow_series_suite (void)
{
  Suite *s = suite_create ("transient-flow-series");
  TCase *tc = tcase_create ("flow-series");

  tcase_set_timeout (tc, 120);
  tcase_add_test (tc, test_cycle_shot_volume);
  tcase_add_test (tc, test_shutdown_drain_volume);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  pls_route_cholmod_allocations ();
  return pl_check_run (flow_series_suite ());
}
