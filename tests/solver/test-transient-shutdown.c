/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-transient-shutdown.c: the shutdown from idle (air off: pumps stop,
 * dump valves open) and the bad input of the time-domain entry points.
 */

#include "config.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pl-check.h"
#include "pressline-solver.h"
#include "test-transient-layouts.h"

static pls_shutdown_result *
shut (const pls_network *net, const pls_transient_options *o)
{
  pls_shutdown_result *r = NULL;
  pls_error err;

  ck_assert_msg (pls_solve_shutdown (net, o, &r, &err) == PLS_OK, "%s", err.message);
  ck_assert_ptr_nonnull (r);
  return r;
}

static int
has_code (const pls_shutdown_result *r, const char *code)
{
  size_t i;

  for (i = 0; i < pls_shutdown_finding_count (r); i++)
    if (strcmp (pls_shutdown_finding (r, i)->code, code) == 0)
      return 1;
  return 0;
}

/* The layout drains through its dump valve: every node falls below the
 * safe pressure, none is trapped, the decay is monotone at the head, and
 * the energies are the closed forms at the idle pressure: polytropic gas
 * (p V - p0 V0) / (n - 1) with p V^n = p0 V0^n (absolute pressures), and
 * 1/2 C p^2 summed over the model's compliances (bounded here by the
 * fluid in the lines: the supply hose alone holds 1/2 (A/K + e) L p^2). */
START_TEST (test_layout_drains)
{
  pls_test_layout l = pls_test_layout_new (2, 0, 10e-3);
  pls_transient_options o;
  pls_shutdown_result *r;
  double p = 18e6 + 101325.0, p0 = 9e6 + 101325.0, v0 = 0.5e-3, n = 1.4, v, gas, hose_e;
  double area = 0.25 * PLS_PI_TEST * 12.7e-3 * 12.7e-3;
  size_t s;
  int i;

  pls_transient_options_init (&o);
  r = shut (l.net, &o);
  ck_assert_double_gt (pls_shutdown_safe_time (r), 0.0);
  ck_assert_double_lt (pls_shutdown_safe_time (r), o.shutdown_time);
  ck_assert (!has_code (r, "trapped-pressure"));
  ck_assert (!has_code (r, "shutdown-slow"));
  for (i = 0; i < (int) pls_network_node_count (l.net); i++)
    {
      ck_assert (!pls_shutdown_node_trapped (r, i));
      ck_assert_double_ge (pls_shutdown_node_safe_time (r, i), 0.0);
      ck_assert_double_le (pls_shutdown_node_safe_time (r, i), pls_shutdown_safe_time (r));
    }
  ck_assert_double_gt (pls_shutdown_node_safe_time (r, l.head), 0.0);
  /* Series: from idle down to safe. */
  ck_assert_uint_ge (pls_shutdown_sample_count (r), 2);
  ck_assert_double_eq_tol (pls_shutdown_sample_pressure (r, l.head, 0), 18e6, 1e3);
  s = pls_shutdown_sample_count (r) - 1;
  ck_assert_double_le (pls_shutdown_sample_pressure (r, l.head, s), o.safe_pressure);
  ck_assert_double_eq_tol (pls_shutdown_sample_time (r, s), pls_shutdown_safe_time (r), 1e-12);

  v = v0 * pow (p0 / p, 1.0 / n);
  gas = (p * v - p0 * v0) / (n - 1.0);
  ck_assert_double_eq_tol (pls_shutdown_gas_energy (r), gas, 1e-9 * gas);
  hose_e = 0.5 * (area / 1.5e9 + 3e-14) * 10.0 * 18e6 * 18e6;
  ck_assert_double_gt (pls_shutdown_fluid_energy (r), hose_e);
  ck_assert_double_lt (pls_shutdown_fluid_energy (r), 1.5 * hose_e);
  pls_shutdown_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* A closed ball valve between the head and a branch with its own
 * accumulator: the branch keeps its pressure when the air goes off. */
START_TEST (test_trapped_volume)
{
  pls_test_layout l = pls_test_layout_new (1, 0, 10e-3);
  pls_transient_options o;
  pls_shutdown_result *r;
  pls_valve_params bv;
  pls_line_params pipe = pls_test_pipe (1.0, 10e-3);
  pls_error err;
  int b1, b2, found = 0;
  size_t i;

  memset (&bv, 0, sizeof bv);
  bv.kind = PLS_VALVE_BALL;
  bv.kv = 1.0;
  bv.bore = 10e-3;
  bv.open = 0;
  b1 = pls_network_add_node (l.net, 0.0, "B1", NULL);
  b2 = pls_network_add_node (l.net, 0.0, "B2", NULL);
  ck_assert_int_ge (pls_network_add_valve (l.net, l.head, b1, &bv, "V9", &err), 0);
  ck_assert_int_ge (pls_network_add_line (l.net, b1, b2, &pipe, "P9", &err), 0);
  pls_transient_options_init (&o);
  r = shut (l.net, &o);
  /* The branch never saw pressure (the valve was shut at idle too), so it
   * is not trapped at a dangerous pressure. */
  ck_assert (!pls_shutdown_node_trapped (r, b1));
  pls_shutdown_result_free (r);
  pls_network_free (l.net);

  /* Now a line behind the pump's check valve with no dump valve: the
   * pump's outlet side drains nowhere once the air is off. */
  {
    pls_fluid_params f;
    pls_pump_params pp;
    pls_accumulator_params ap;
    pls_network *net;
    int tank, n1, n2;

    pls_fluid_params_init (&f);
    net = pls_network_new (&f, NULL, NULL);
    memset (&pp, 0, sizeof pp);
    pp.ratio = 30.0;
    pp.displacement = 40e-6;
    pp.max_cycle_rate = 2.0;
    pp.curve_exponent = 1.0;
    memset (&ap, 0, sizeof ap);
    ap.gas_volume = 0.5e-3;
    ap.precharge = 9e6;
    ap.precharge_temperature = ap.gas_temperature = 293.15;
    ap.polytropic_exponent = 1.4;
    ap.neck_diameter = 0.01;
    ap.neck_length = 0.05;
    tank = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", NULL);
    n1 = pls_network_add_node (net, 0.0, "N1", NULL);
    n2 = pls_network_add_node (net, 0.0, "N2", NULL);
    ck_assert_int_ge (pls_network_add_pump (net, tank, n1, &pp, "P1", NULL), 0);
    ck_assert_int_ge (pls_network_add_line (net, n1, n2, &pipe, "L1", NULL), 0);
    ck_assert_int_ge (pls_network_add_accumulator (net, n2, &ap, "C1", NULL), 0);
    r = shut (net, &o);
    ck_assert (has_code (r, "trapped-pressure"));
    ck_assert (pls_shutdown_node_trapped (r, n2));
    ck_assert (pls_shutdown_node_trapped (r, n1));
    ck_assert_double_gt (pls_shutdown_gas_energy (r), 0.0);
    for (i = 0; i < pls_shutdown_finding_count (r); i++)
      if (strcmp (pls_shutdown_finding (r, i)->code, "trapped-pressure") == 0
          && strstr (pls_shutdown_finding (r, i)->message, "N2") != NULL)
        found = 1;
    ck_assert (found);
    ck_assert_double_eq (pls_shutdown_safe_time (r), 0.0);
    pls_shutdown_result_free (r);
    pls_network_free (net);
  }
}
END_TEST

/* Lowest recorded pressure of node i over the shutdown's series. */
static double
series_min (const pls_shutdown_result *r, int node)
{
  double lo = INFINITY;
  size_t s;

  for (s = 0; s < pls_shutdown_sample_count (r); s++)
    lo = fmin (lo, pls_shutdown_sample_pressure (r, node, s));
  return lo;
}

/* A dump valve opened wide on a pipe that ends closed sends a rarefaction
 * wave down it that comes back doubled from the closed end: Joukowsky's
 * dp = rho c dv, reflected with the same sign at a dead end (Wylie &
 * Streeter, Fluid Transients in Systems, 1993, sec. 1.3; from memory),
 * so the far end of a lightly damped line would swing to about minus its
 * idle pressure (-5.8 MPa in the model without free gas).  The liquid
 * parts instead: the far end must stay above vacuum, and the shutdown
 * must report the cavity, at the far end, by its volume.  A dump valve 500
 * times smaller drains without the swing (lowest +0.87 bar) and says
 * nothing.  A 50 mPa s coating, so that the line settles within a second
 * (water would slosh, parting and rejoining, for some 15 s). */
START_TEST (test_cavitation_flagged)
{
  static const double kvs[] = { 5.0, 0.01 };
  pls_line_params pipe = pls_test_pipe (20.0, 10e-3);
  size_t i;

  for (i = 0; i < sizeof kvs / sizeof kvs[0]; i++)
    {
      pls_fluid_params f;
      pls_pump_params pp;
      pls_valve_params dv;
      pls_transient_options o;
      pls_shutdown_result *r;
      pls_network *net;
      int tank, n1, far, found = 0;
      size_t k;

      pls_fluid_params_init (&f);
      f.law = PLS_VISCOSITY_NEWTONIAN;
      f.mu = 0.05;
      net = pls_network_new (&f, NULL, NULL);
      memset (&pp, 0, sizeof pp);
      pp.ratio = 30.0;
      pp.displacement = 40e-6;
      pp.max_cycle_rate = 2.0;
      pp.curve_exponent = 1.0;
      memset (&dv, 0, sizeof dv);
      dv.kind = PLS_VALVE_DUMP;
      dv.kv = kvs[i];
      dv.bore = 10e-3;
      tank = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", NULL);
      n1 = pls_network_add_node (net, 0.0, "N1", NULL);
      far = pls_network_add_node (net, 0.0, "FAR", NULL);
      ck_assert_int_ge (pls_network_add_pump (net, tank, n1, &pp, "P1", NULL), 0);
      ck_assert_int_ge (pls_network_add_valve (net, n1, tank, &dv, "DV1", NULL), 0);
      ck_assert_int_ge (pls_network_add_line (net, n1, far, &pipe, "L1", NULL), 0);
      pls_transient_options_init (&o);
      r = shut (net, &o);
      for (k = 0; k < pls_shutdown_finding_count (r); k++)
        {
          const pls_finding *fd = pls_shutdown_finding (r, k);

          if (strcmp (fd->code, "shutdown-cavitation") == 0)
            {
              found = 1;
              ck_assert_double_gt (fd->value, 1e-6);   /* m^3: 23 mL measured */
              ck_assert_double_lt (fd->value, 1.6e-3); /* the line holds 1.6 L */
              ck_assert_double_eq (fd->limit, -101325.0);
              /* At the dead end or inside the line next to it. */
              ck_assert_msg (fd->node == far
                             || (fd->node < 0 && strstr (fd->message, "L1") != NULL),
                             "%s", fd->message);
            }
        }
      if (i == 0)
        {
          ck_assert_msg (found, "no cavitation finding; far end's lowest %g Pa",
                         series_min (r, far));
          ck_assert_double_ge (series_min (r, far), -101325.0);
          ck_assert_double_lt (series_min (r, far), -0.9 * 101325.0);
        }
      else
        {
          ck_assert_msg (!found, "cavitation flagged on a slow drain");
          ck_assert_double_gt (series_min (r, far), -101325.0);
        }
      pls_shutdown_result_free (r);
      pls_network_free (net);
    }
}
END_TEST

/* ---- bad input: a clear status naming the part or the option ------------ */

typedef struct
{
  const char *what;
  const char *expect;   /* a word the message must hold */
} bad_case;

static const bad_case bad_cases[] = {
  { "on_time zero", "on_time" },
  { "on_time = period", "on_time" },
  { "on_time > period", "on_time" },
  { "negative delay", "A1" },
  { "delay past the cycle", "A2" },
  { "open ramp zero", "open_ramp" },
  { "ramp longer than on_time", "open_ramp" },
  { "rtol zero", "rtol" },
  { "NaN rate", "cycle_rate" },
  { "segments", "segments" },
  { "delay count", "delays" },
};

START_TEST (test_bad_options)
{
  pls_test_layout l = pls_test_layout_new (2, 0, 10e-3);
  pls_transient_options o;
  pls_cycle_result *r = (pls_cycle_result *) &o;   /* must come back NULL */
  double delays[64];
  pls_error err;
  size_t ne = pls_network_element_count (l.net), k;

  for (k = 0; k < 64; k++)
    delays[k] = 0.0;
  pls_transient_options_init (&o);
  switch (_i)
    {
    case 0: o.on_time = 0.0; break;
    case 1: o.on_time = 1.0 / o.cycle_rate; break;
    case 2: o.on_time = 2.0 / o.cycle_rate; break;
    case 3:
      delays[l.first_app] = -0.01;
      o.delays = delays;
      o.delay_count = ne;
      break;
    case 4:
      delays[l.first_app + l.app_stride] = 0.48;
      o.delays = delays;
      o.delay_count = ne;
      break;
    case 5: o.open_ramp = 0.0; break;
    case 6: o.open_ramp = 2.0 * o.on_time; break;
    case 7: o.rtol = 0.0; break;
    case 8: o.cycle_rate = NAN; break;
    case 9: o.min_segments = 0; break;
    case 10:
      o.delays = delays;
      o.delay_count = ne - 1;
      break;
    default: break;
    }
  ck_assert_int_eq (pls_solve_cycle (l.net, &o, &r, &err), PLS_ERR_INVALID);
  ck_assert_ptr_null (r);
  ck_assert_int_eq (err.status, PLS_ERR_INVALID);
  ck_assert_msg (strstr (err.message, bad_cases[_i].expect) != NULL, "%s: \"%s\"",
                 bad_cases[_i].what, err.message);
  if (_i == 3 || _i == 4)
    ck_assert_int_eq (err.element, _i == 3 ? l.first_app : l.first_app + l.app_stride);
  pls_network_free (l.net);
}
END_TEST

/* Parts are checked when they are added: zero gas volume and a negative
 * precharge are refused with the accumulator's name. */
START_TEST (test_bad_accumulator)
{
  pls_test_layout l = pls_test_layout_new (1, 0, 10e-3);
  pls_accumulator_params ap;
  pls_error err;

  memset (&ap, 0, sizeof ap);
  ap.gas_volume = 0.0;
  ap.precharge = 9e6;
  ap.precharge_temperature = ap.gas_temperature = 293.15;
  ap.polytropic_exponent = 1.4;
  ap.neck_diameter = 0.01;
  ap.neck_length = 0.05;
  ck_assert_int_eq (pls_network_add_accumulator (l.net, l.head, &ap, "C7", &err), -1);
  ck_assert_int_eq (err.status, PLS_ERR_INVALID);
  ck_assert_ptr_nonnull (strstr (err.message, "C7"));
  ck_assert_ptr_nonnull (strstr (err.message, "gas_volume"));
  ap.gas_volume = 1e-3;
  ap.precharge = -1e5;
  ck_assert_int_eq (pls_network_add_accumulator (l.net, l.head, &ap, "C8", &err), -1);
  ck_assert_ptr_nonnull (strstr (err.message, "C8"));
  ck_assert_ptr_nonnull (strstr (err.message, "precharge"));
  pls_network_free (l.net);
}
END_TEST

START_TEST (test_bad_calls)
{
  pls_test_layout l = pls_test_layout_new (1, 0, 10e-3);
  pls_transient_options o;
  pls_shutdown_result *sr = NULL;
  pls_cycle_result *cr = NULL;
  pls_network *empty;
  pls_fluid_params f;
  pls_error err;
  double rate = 1.0;

  pls_transient_options_init (&o);
  ck_assert_int_eq (pls_solve_cycle (NULL, &o, &cr, &err), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_solve_cycle (l.net, &o, NULL, &err), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_solve_shutdown (NULL, &o, &sr, &err), PLS_ERR_INVALID);
  o.safe_pressure = -1.0;
  ck_assert_int_eq (pls_solve_shutdown (l.net, &o, &sr, &err), PLS_ERR_INVALID);
  ck_assert_ptr_nonnull (strstr (err.message, "safe_pressure"));
  ck_assert_ptr_null (sr);
  pls_transient_options_init (&o);
  ck_assert_int_eq (pls_cycle_max_rate (l.net, &o, -1.0, &rate, NULL, &err), PLS_ERR_INVALID);
  ck_assert_double_eq (rate, 0.0);
  pls_fluid_params_init (&f);
  empty = pls_network_new (&f, NULL, NULL);
  ck_assert_int_eq (pls_solve_cycle (empty, &o, &cr, &err), PLS_ERR_TOPOLOGY);
  ck_assert_ptr_null (cr);
  /* Read-back of NULL results is harmless. */
  ck_assert_int_eq (pls_cycle_result_cycles (NULL), 0);
  ck_assert_double_eq (pls_cycle_node_max (NULL, 0), 0.0);
  ck_assert_double_eq (pls_shutdown_safe_time (NULL), -1.0);
  pls_cycle_result_free (NULL);
  pls_shutdown_result_free (NULL);
  pls_network_free (empty);
  pls_network_free (l.net);
}
END_TEST

static Suite *
transient_shutdown_suite (void)
{
  Suite *s = suite_create ("transient-shutdown");
  TCase *tc = tcase_create ("shutdown");
  TCase *tb = tcase_create ("bad-input");

  tcase_set_timeout (tc, 120);
  tcase_add_test (tc, test_layout_drains);
  tcase_add_test (tc, test_trapped_volume);
  tcase_add_test (tc, test_cavitation_flagged);
  tcase_add_loop_test (tb, test_bad_options, 0, (int) (sizeof bad_cases / sizeof bad_cases[0]));
  tcase_add_test (tb, test_bad_accumulator);
  tcase_add_test (tb, test_bad_calls);
  suite_add_tcase (s, tc);
  suite_add_tcase (s, tb);
  return s;
}

int
main (void)
{
  pls_route_cholmod_allocations ();
  return pl_check_run (transient_shutdown_suite ());
}
