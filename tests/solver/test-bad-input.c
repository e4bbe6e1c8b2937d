/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-bad-input.c: NaN, infinite and out-of-range values, missing
 * parameters, empty networks, no pump, bad indices: each gives a clear
 * status and a message naming the part, never a crash, a leak or a NaN.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

static pls_network *
fresh (int *tank, int *n1, int *n2)
{
  pls_fluid_params f;
  pls_network *net;

  pls_fluid_params_init (&f);
  net = pls_network_new (&f, NULL, NULL);
  ck_assert_ptr_nonnull (net);
  *tank = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", NULL);
  *n1 = pls_network_add_node (net, 0.0, "N1", NULL);
  *n2 = pls_network_add_node (net, 0.0, "N2", NULL);
  return net;
}

static pls_line_params
good_hose (void)
{
  pls_line_params h;

  memset (&h, 0, sizeof h);
  h.length = 5.0;
  h.bore = 6e-3;
  return h;
}

static pls_pump_params
good_pump (void)
{
  pls_pump_params p;

  memset (&p, 0, sizeof p);
  p.ratio = 30.0;
  p.displacement = 1e-5;
  p.max_cycle_rate = 1.0;
  p.curve_exponent = 1.0;
  return p;
}

static pls_nozzle_params
good_nozzle (void)
{
  pls_nozzle_params z;

  memset (&z, 0, sizeof z);
  z.orifice_diameter = 0.5e-3;
  z.discharge_coefficient = 0.65;
  z.passage_resistance = 1e12;
  return z;
}

/* One bad part per row: what is wrong, and what the message must name. */
typedef enum
{
  BAD_HOSE_NAN_BORE, BAD_HOSE_INF_LENGTH, BAD_HOSE_NEG_LENGTH, BAD_HOSE_NODE_RANGE,
  BAD_HOSE_SAME_NODE, BAD_HOSE_NULL, BAD_PUMP_NAN_RATIO, BAD_PUMP_NODE_NEG,
  BAD_NOZZLE_CD, BAD_NOZZLE_NODE, BAD_GAUGE_ZERO, BAD_GAUGE_NAN, BAD_NODE_NAN_Z,
  BAD_FIXED_INF_P, BAD_VALVE_KV, BAD_FITTING_NAN, BAD_ACCUMULATOR_N,
} bad_kind;

static const struct
{
  bad_kind kind;
  const char *named;   /* in the message */
} bad_parts[] = {
  { BAD_HOSE_NAN_BORE, "hose H3" },
  { BAD_HOSE_INF_LENGTH, "hose H3" },
  { BAD_HOSE_NEG_LENGTH, "hose H3" },
  { BAD_HOSE_NODE_RANGE, "hose H3" },
  { BAD_HOSE_SAME_NODE, "hose H3" },
  { BAD_HOSE_NULL, "H3" },
  { BAD_PUMP_NAN_RATIO, "pump P1" },
  { BAD_PUMP_NODE_NEG, "pump P1" },
  { BAD_NOZZLE_CD, "applicator A1" },
  { BAD_NOZZLE_NODE, "applicator A1" },
  { BAD_GAUGE_ZERO, "gauge G1" },
  { BAD_GAUGE_NAN, "gauge G1" },
  { BAD_NODE_NAN_Z, "N9" },
  { BAD_FIXED_INF_P, "T9" },
  { BAD_VALVE_KV, "valve V1" },
  { BAD_FITTING_NAN, "fitting F1" },
  { BAD_ACCUMULATOR_N, "accumulator C1" },
};

START_TEST (test_bad_part)
{
  int tank, n1, n2, idx = 0;
  pls_network *net = fresh (&tank, &n1, &n2);
  pls_line_params h = good_hose ();
  pls_pump_params pp = good_pump ();
  pls_nozzle_params z = good_nozzle ();
  pls_gauge_params g = { 1e7 };
  pls_valve_params v = { PLS_VALVE_BALL, 1.0, 6e-3, 1, 0.0 };
  pls_fitting_params fp = { 800.0, 0.25, 6e-3, 0.0 };
  pls_accumulator_params ap;
  pls_error err;
  size_t before = pls_network_element_count (net);

  memset (&ap, 0, sizeof ap);
  ap.gas_volume = 1e-3;
  ap.precharge = 5e6;
  ap.precharge_temperature = ap.gas_temperature = 293.15;
  ap.polytropic_exponent = 3.0;   /* outside [1, 1.67] */
  ap.neck_diameter = 0.01;
  ap.neck_length = 0.05;
  switch (bad_parts[_i].kind)
    {
    case BAD_HOSE_NAN_BORE:
      h.bore = NAN;
      idx = pls_network_add_line (net, n1, n2, &h, "H3", &err);
      break;
    case BAD_HOSE_INF_LENGTH:
      h.length = INFINITY;
      idx = pls_network_add_line (net, n1, n2, &h, "H3", &err);
      break;
    case BAD_HOSE_NEG_LENGTH:
      h.length = -1.0;
      idx = pls_network_add_line (net, n1, n2, &h, "H3", &err);
      break;
    case BAD_HOSE_NODE_RANGE:
      idx = pls_network_add_line (net, n1, 42, &h, "H3", &err);
      break;
    case BAD_HOSE_SAME_NODE:
      idx = pls_network_add_line (net, n1, n1, &h, "H3", &err);
      break;
    case BAD_HOSE_NULL:
      idx = pls_network_add_line (net, n1, n2, NULL, "H3", &err);
      break;
    case BAD_PUMP_NAN_RATIO:
      pp.ratio = NAN;
      idx = pls_network_add_pump (net, tank, n1, &pp, "P1", &err);
      break;
    case BAD_PUMP_NODE_NEG:
      idx = pls_network_add_pump (net, -1, n1, &pp, "P1", &err);
      break;
    case BAD_NOZZLE_CD:
      z.discharge_coefficient = 1.5;
      idx = pls_network_add_nozzle (net, n2, &z, "A1", &err);
      break;
    case BAD_NOZZLE_NODE:
      idx = pls_network_add_nozzle (net, 7, &z, "A1", &err);
      break;
    case BAD_GAUGE_ZERO:
      g.full_scale = 0.0;
      idx = pls_network_add_gauge (net, n2, &g, "G1", &err);
      break;
    case BAD_GAUGE_NAN:
      g.full_scale = NAN;
      idx = pls_network_add_gauge (net, n2, &g, "G1", &err);
      break;
    case BAD_NODE_NAN_Z:
      idx = pls_network_add_node (net, NAN, "N9", &err);
      break;
    case BAD_FIXED_INF_P:
      idx = pls_network_add_fixed_node (net, 0.0, INFINITY, "T9", &err);
      break;
    case BAD_VALVE_KV:
      v.kv = -2.0;
      idx = pls_network_add_valve (net, n1, n2, &v, "V1", &err);
      break;
    case BAD_FITTING_NAN:
      fp.k1 = NAN;
      idx = pls_network_add_fitting (net, n1, n2, &fp, "F1", &err);
      break;
    case BAD_ACCUMULATOR_N:
      idx = pls_network_add_accumulator (net, n2, &ap, "C1", &err);
      break;
    default:
      break;
    }
  ck_assert_int_eq (idx, -1);
  ck_assert_int_eq (err.status, PLS_ERR_INVALID);
  ck_assert_msg (strstr (err.message, bad_parts[_i].named) != NULL, "'%s' lacks '%s'",
                 err.message, bad_parts[_i].named);
  /* Nothing was added; the network still works. */
  ck_assert_uint_eq (pls_network_element_count (net), before);
  ck_assert_uint_eq (pls_network_node_count (net), 3);
  {
    pls_steady_result *r = NULL;
    pls_steady_options o;

    pp = good_pump ();
    h = good_hose ();
    z = good_nozzle ();
    pls_network_add_pump (net, tank, n1, &pp, "P1", &err);
    pls_network_add_line (net, n1, n2, &h, "H3", &err);
    pls_network_add_nozzle (net, n2, &z, "A1", &err);
    pls_steady_options_init (&o);
    o.applicators = PLS_APPLICATORS_ALL;
    ck_assert_int_eq (pls_solve_steady (net, &o, &r, &err), PLS_OK);
    ck_assert (pls_steady_node_pressure (r, n2) > 0.0);
    pls_steady_result_free (r);
  }
  pls_network_free (net);
}
END_TEST

START_TEST (test_bad_fluid)
{
  pls_fluid_params f;
  pls_error err;

  pls_fluid_params_init (&f);
  f.density = NAN;
  ck_assert_ptr_null (pls_network_new (&f, NULL, &err));
  ck_assert_int_eq (err.status, PLS_ERR_INVALID);
  ck_assert_ptr_nonnull (strstr (err.message, "fluid"));
  ck_assert_ptr_nonnull (strstr (err.message, "density"));
  ck_assert_ptr_null (pls_network_new (NULL, NULL, &err));
  ck_assert_int_eq (err.status, PLS_ERR_INVALID);
  f.density = 1000.0;
  f.mu = -INFINITY;
  ck_assert_ptr_null (pls_network_new (&f, NULL, NULL));   /* err may be NULL */
}
END_TEST

START_TEST (test_empty_and_no_pump)
{
  int tank, n1, n2;
  pls_network *net = fresh (&tank, &n1, &n2);
  pls_line_params h = good_hose ();
  pls_steady_result *r = (pls_steady_result *) &h;   /* must be reset to NULL */
  pls_error err;
  pls_fluid_params f;
  pls_network *empty;

  pls_fluid_params_init (&f);
  empty = pls_network_new (&f, NULL, NULL);
  ck_assert_int_eq (pls_solve_steady (empty, NULL, &r, &err), PLS_ERR_TOPOLOGY);
  ck_assert_ptr_null (r);
  ck_assert_ptr_nonnull (strstr (err.message, "empty"));
  pls_network_free (empty);

  pls_network_add_line (net, tank, n1, &h, "H1", &err);
  pls_network_add_line (net, n1, n2, &h, "H2", &err);
  ck_assert_int_eq (pls_solve_steady (net, NULL, &r, &err), PLS_ERR_TOPOLOGY);
  ck_assert_ptr_null (r);
  ck_assert_ptr_nonnull (strstr (err.message, "no pump"));
  pls_network_free (net);
}
END_TEST

/* Bad options: each field that must be finite/positive, named. */
static const struct
{
  const char *field;
} bad_options[] = {
  { "pressure_tolerance" }, { "flow_tolerance" }, { "air_pressure" }, { "max_iterations" },
  { "velocity_limit" }, { "applicators" }, { "open_list" },
};

START_TEST (test_bad_options)
{
  int tank, n1, n2;
  pls_network *net = fresh (&tank, &n1, &n2);
  pls_pump_params pp = good_pump ();
  pls_line_params h = good_hose ();
  pls_steady_options o;
  pls_steady_result *r = NULL;
  pls_error err;

  pls_network_add_pump (net, tank, n1, &pp, "P1", &err);
  pls_network_add_line (net, n1, n2, &h, "H1", &err);
  pls_steady_options_init (&o);
  switch (_i)
    {
    case 0: o.pressure_tolerance = NAN; break;
    case 1: o.flow_tolerance = 0.0; break;
    case 2: o.air_pressure = -INFINITY; break;
    case 3: o.max_iterations = 0; break;
    case 4: o.velocity_limit = NAN; break;
    case 5: o.applicators = (pls_applicator_set) 17; break;
    case 6:
      o.applicators = PLS_APPLICATORS_LIST;
      o.open_count = 3;
      o.open_list = NULL;
      break;
    default: break;
    }
  ck_assert_int_eq (pls_solve_steady (net, &o, &r, &err), PLS_ERR_INVALID);
  ck_assert_ptr_null (r);
  ck_assert_msg (strstr (err.message, bad_options[_i].field) != NULL, "'%s'", err.message);
  pls_network_free (net);
}
END_TEST

/* NULL everywhere and out-of-range reads: zeros, no crash. */
START_TEST (test_null_and_ranges)
{
  pls_steady_result *r = NULL;
  pls_line_result lr;
  pls_error err;

  ck_assert_int_eq (pls_solve_steady (NULL, NULL, &r, &err), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_solve_steady (NULL, NULL, NULL, NULL), PLS_ERR_INVALID);
  ck_assert_int_eq (pls_network_add_node (NULL, 0.0, "x", &err), -1);
  ck_assert_int_eq (pls_network_add_line (NULL, 0, 1, NULL, "x", &err), -1);
  ck_assert_uint_eq (pls_network_node_count (NULL), 0);
  ck_assert_double_eq (pls_steady_node_pressure (NULL, 3), 0.0);
  ck_assert_double_eq (pls_steady_element_flow (NULL, -1), 0.0);
  ck_assert_int_eq (pls_steady_line (NULL, 0, &lr), PLS_ERR_INVALID);
  ck_assert_double_eq (lr.velocity, 0.0);
  ck_assert_ptr_null (pls_steady_finding (NULL, 0));
  ck_assert_uint_eq (pls_steady_finding_count (NULL), 0);
  ck_assert_str_eq (pls_status_string (PLS_ERR_NOMEM), "out of memory");
  pls_network_free (NULL);
  pls_steady_result_free (NULL);
  {
    int tank, n1, n2;
    pls_network *net = fresh (&tank, &n1, &n2);
    pls_pump_params pp = good_pump ();
    pls_line_params h = good_hose ();

    pls_network_add_pump (net, tank, n1, &pp, "P1", &err);
    pls_network_add_line (net, n1, n2, &h, "H1", &err);
    ck_assert_int_eq (pls_solve_steady (net, NULL, &r, &err), PLS_OK);
    ck_assert_double_eq (pls_steady_node_pressure (r, 99), 0.0);
    ck_assert_double_eq (pls_steady_node_pressure (r, -5), 0.0);
    ck_assert_int_eq (pls_steady_element_solved (r, 99), 0);
    ck_assert_int_eq (pls_steady_line (r, 0, &lr), PLS_ERR_INVALID);   /* the pump */
    ck_assert_int_eq (pls_steady_line (r, 1, &lr), PLS_OK);
    ck_assert_int_eq (pls_steady_line (r, 1, NULL), PLS_ERR_INVALID);
    pls_steady_result_free (r);
    pls_network_free (net);
  }
}
END_TEST

/* Extreme but valid values: results are finite or the law at fault is
 * named; never a NaN. */
START_TEST (test_extreme_values)
{
  int tank, n1, n2;
  pls_network *net = fresh (&tank, &n1, &n2);
  pls_pump_params pp = good_pump ();
  pls_line_params h = good_hose ();
  pls_nozzle_params z = good_nozzle ();
  pls_steady_options o;
  pls_steady_result *r = NULL;
  pls_error err;
  pls_status st;
  size_t i;

  h.length = 1e250;
  h.bore = 1e-250;
  pls_network_add_pump (net, tank, n1, &pp, "P1", &err);
  if (pls_network_add_line (net, n1, n2, &h, "H1", &err) < 0)
    ck_assert_ptr_nonnull (strstr (err.message, "H1"));
  pls_network_add_nozzle (net, n2, &z, "A1", &err);
  pls_steady_options_init (&o);
  o.applicators = PLS_APPLICATORS_ALL;
  o.max_iterations = 30;
  st = pls_solve_steady (net, &o, &r, &err);
  if (st == PLS_OK || st == PLS_ERR_NO_CONVERGENCE)
    {
      for (i = 0; i < pls_steady_result_node_count (r); i++)
        ck_assert (isfinite (pls_steady_node_pressure (r, (int) i)));
      for (i = 0; i < pls_steady_result_element_count (r); i++)
        ck_assert (isfinite (pls_steady_element_flow (r, (int) i)));
    }
  else
    {
      ck_assert_ptr_null (r);
      ck_assert (err.message[0] != '\0');
    }
  pls_steady_result_free (r);
  pls_network_free (net);
}
END_TEST

static Suite *
bad_input_suite (void)
{
  Suite *s = suite_create ("bad-input");
  TCase *tc = tcase_create ("bad-input");

  tcase_add_loop_test (tc, test_bad_part, 0, (int) (sizeof bad_parts / sizeof bad_parts[0]));
  tcase_add_test (tc, test_bad_fluid);
  tcase_add_test (tc, test_empty_and_no_pump);
  tcase_add_loop_test (tc, test_bad_options, 0,
                       (int) (sizeof bad_options / sizeof bad_options[0]));
  tcase_add_test (tc, test_null_and_ranges);
  tcase_add_test (tc, test_extreme_values);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (bad_input_suite ());
}
