/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-steady.c: the steady solve of pump layouts (idle, steady-open, a
 * chosen set of applicators, air off) and the findings: one small layout
 * per finding code that triggers it, and a clean layout that triggers none.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

/* The base layout: tank -> pump P1 -> N1 -> hose H1 -> N2 (manifold) with
 * applicator A1, accumulator C1 on N2, gauge G1 on N1, dump valve D1 from
 * N1 to the drain.  Figures: 30:1 pump at 6 bar air stalls at 18 MPa (ratio
 * definition, common practice); 10 mL a double stroke at 1 /s gives
 * 0.6 L/min free flow; a 9.5 mm, 5 m hose; accumulator precharged to half
 * the stall pressure (common practice, no source). */
typedef struct
{
  pls_network *net;
  int tank, drain, n1, n2;
  int pump, h1, a1, c1, g1, d1;
} layout;

static pls_pump_params
pump_params (void)
{
  pls_pump_params p;

  memset (&p, 0, sizeof p);
  p.ratio = 30.0;
  p.displacement = 1e-5;
  p.max_cycle_rate = 1.0;
  p.curve_exponent = 1.0;
  p.rated_pressure = 25e6;
  return p;
}

static pls_line_params
hose (double length, double bore, double rated)
{
  pls_line_params p;

  memset (&p, 0, sizeof p);
  p.kind = PLS_LINE_HOSE;
  p.length = length;
  p.bore = bore;
  p.rated_pressure = rated;
  return p;
}

static pls_nozzle_params
nozzle (void)
{
  pls_nozzle_params p;

  memset (&p, 0, sizeof p);
  p.orifice_diameter = 0.5e-3;
  p.orifice_length = 1e-3;
  p.cd_model = PLS_CD_FIXED;
  p.discharge_coefficient = 0.65;
  p.passage_resistance = 2e12;
  return p;
}

static pls_accumulator_params
accumulator (double precharge)
{
  pls_accumulator_params p;

  memset (&p, 0, sizeof p);
  p.gas_volume = 1e-3;
  p.precharge = precharge;
  p.precharge_temperature = 293.15;
  p.gas_temperature = 293.15;
  p.polytropic_exponent = 1.0;
  p.neck_diameter = 0.01;
  p.neck_length = 0.05;
  return p;
}

static layout
base_layout (void)
{
  pls_fluid_params f;
  pls_pump_params pp = pump_params ();
  pls_line_params hp = hose (5.0, 9.5e-3, 25e6);
  pls_nozzle_params np = nozzle ();
  pls_accumulator_params ap = accumulator (9e6);
  pls_gauge_params gp = { 30e6 };
  pls_valve_params dv = { PLS_VALVE_DUMP, 1.0, 6e-3, 0, 0.0 };
  layout l;
  pls_error err;

  pls_fluid_params_init (&f);
  l.net = pls_network_new (&f, NULL, &err);
  ck_assert_ptr_nonnull (l.net);
  l.tank = pls_network_add_fixed_node (l.net, 0.0, 0.0, "tank", &err);
  l.drain = pls_network_add_fixed_node (l.net, 0.0, 0.0, "drain", &err);
  l.n1 = pls_network_add_node (l.net, 0.0, "N1", &err);
  l.n2 = pls_network_add_node (l.net, 0.0, "N2", &err);
  l.pump = pls_network_add_pump (l.net, l.tank, l.n1, &pp, "P1", &err);
  l.h1 = pls_network_add_line (l.net, l.n1, l.n2, &hp, "H1", &err);
  l.a1 = pls_network_add_nozzle (l.net, l.n2, &np, "A1", &err);
  l.c1 = pls_network_add_accumulator (l.net, l.n2, &ap, "C1", &err);
  l.g1 = pls_network_add_gauge (l.net, l.n1, &gp, "G1", &err);
  l.d1 = pls_network_add_valve (l.net, l.n1, l.drain, &dv, "D1", &err);
  ck_assert_msg (l.d1 >= 0, "%s", err.message);
  return l;
}

static pls_steady_result *
solve (const pls_network *net, const pls_steady_options *o)
{
  pls_steady_result *r = NULL;
  pls_error err;
  pls_status st = pls_solve_steady (net, o, &r, &err);

  ck_assert_msg (st == PLS_OK, "solve: %s", err.message);
  return r;
}

static int
has_code (const pls_steady_result *r, const char *code)
{
  size_t i;

  for (i = 0; i < pls_steady_finding_count (r); i++)
    if (strcmp (pls_steady_finding (r, i)->code, code) == 0)
      return 1;
  return 0;
}

static const pls_finding *
find_code (const pls_steady_result *r, const char *code)
{
  size_t i;

  for (i = 0; i < pls_steady_finding_count (r); i++)
    if (strcmp (pls_steady_finding (r, i)->code, code) == 0)
      return pls_steady_finding (r, i);
  return NULL;
}

/* Idle: everything shut, so no flow and the stall pressure (18 MPa) all
 * the way out (ratio x air pressure; common practice, pump ratio). */
START_TEST (test_idle_stall)
{
  layout l = base_layout ();
  pls_steady_options o;
  pls_steady_result *r;
  pls_pump_result pr;
  pls_accumulator_result ar;
  double p0a, pa, vf;

  pls_steady_options_init (&o);
  r = solve (l.net, &o);
  /* The pump law's check valve and floor terms shift stall by < 1e-9. */
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, l.n1), 18e6, 18e6 * 1e-9);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, l.n2), 18e6, 18e6 * 1e-9);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, l.pump), 0.0, 1e-15);
  ck_assert_int_eq (pls_steady_element_active (r, l.a1), 0);
  ck_assert_int_eq (pls_steady_element_active (r, l.d1), 0);
  ck_assert_int_eq (pls_steady_pump (r, l.pump, &pr), PLS_OK);
  ck_assert_int_eq (pr.running, 1);
  ck_assert_double_eq_tol (pr.stall_pressure, 18e6, 1e-6);
  ck_assert_double_eq_tol (pr.free_flow, 1e-5, 1e-18);
  /* Stored fluid by the polytropic law, n = 1 (PHYSICS.md):
   * Vf = V0 [1 - p0_abs / p_abs], absolute pressures (+101325 Pa). */
  ck_assert_int_eq (pls_steady_accumulator (r, l.c1, &ar), PLS_OK);
  p0a = 9e6 + 101325.0;
  pa = ar.pressure + 101325.0;
  vf = 1e-3 * (1.0 - p0a / pa);
  ck_assert_double_eq_tol (ar.fluid_volume, vf, 1e-12);
  /* Isothermal gas energy p0 V0 ln(p/p0) (PHYSICS.md). */
  ck_assert_double_eq_tol (ar.gas_energy, p0a * 1e-3 * log (pa / p0a), 1e-6);
  ck_assert_int_eq (pls_steady_pump (r, l.h1, &pr), PLS_ERR_INVALID);
  ck_assert_uint_eq (pls_steady_finding_count (r), 0);
  pls_steady_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* Steady-open: the pump sits on its straight curve (m = 1):
 * p_out = p_stall (1 - Q / Q_free) (PHYSICS.md pump law), and all its flow
 * leaves through the applicator. */
START_TEST (test_steady_open)
{
  layout l = base_layout ();
  pls_steady_options o;
  pls_steady_result *r;
  double q, p1, p2, rh;
  pls_nozzle_params np = nozzle ();

  pls_steady_options_init (&o);
  o.applicators = PLS_APPLICATORS_ALL;
  r = solve (l.net, &o);
  q = pls_steady_element_flow (r, l.pump);
  p1 = pls_steady_node_pressure (r, l.n1);
  p2 = pls_steady_node_pressure (r, l.n2);
  ck_assert (q > 0.0);
  /* The law's regularisation (u0 = 1e-6 of the free flow, plus a 1e-9
   * floor) is exact at m = 1 but for the floor: 1e-7 relative. */
  ck_assert_double_eq_tol (p1, 18e6 * (1.0 - q / 1e-5), 18e6 * 1e-7);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, l.a1), q, 1e-12 * q);
  /* Hagen-Poiseuille across H1 (mu 1 Pa s, laminar): 128 mu L Q/(pi D^4). */
  rh = 128.0 * 1.0 * 5.0 / (PLS_PI * pow (9.5e-3, 4));
  ck_assert_double_eq_tol (p1 - p2, rh * q, 1e-8 * rh * q);
  /* Applicator: R Q + rho Q^2 / (2 Cd^2 A^2) (PHYSICS.md).  At this orifice
   * Reynolds number (about 13) the fixed-Cd law rounds Q^2 off into
   * Q sqrt(Q^2 + Qs^2) (Qs at Re 1, see pls-nozzle.c), which moves the
   * orifice term by about 0.3 %, i.e. 0.03 % of the total: 1e-3 covers it. */
  {
    double area = 0.25 * PLS_PI * np.orifice_diameter * np.orifice_diameter;
    double dp = np.passage_resistance * q + 1100.0 * q * q / (2.0 * 0.65 * 0.65 * area * area);

    ck_assert_double_eq_tol (p2, dp, 1e-3 * dp);
  }
  ck_assert_uint_eq (pls_steady_finding_count (r), 0);
  pls_steady_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* Air off: the pump stops, the dump valve opens, everything drains to 0. */
START_TEST (test_air_off)
{
  layout l = base_layout ();
  pls_steady_options o;
  pls_steady_result *r;

  pls_steady_options_init (&o);
  o.air_on = 0;
  r = solve (l.net, &o);
  ck_assert_int_eq (pls_steady_element_active (r, l.pump), 0);
  ck_assert_int_eq (pls_steady_element_active (r, l.d1), 1);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, l.n1), 0.0, 1e-6);
  ck_assert_double_eq_tol (pls_steady_node_pressure (r, l.n2), 0.0, 1e-6);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, l.d1), 0.0, 1e-15);
  pls_steady_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* A chosen set: two applicators, only the second held open. */
START_TEST (test_applicator_list)
{
  layout l = base_layout ();
  pls_nozzle_params np = nozzle ();
  pls_steady_options o;
  pls_steady_result *r = NULL;
  pls_error err;
  int a2 = pls_network_add_nozzle (l.net, l.n2, &np, "A2", &err), list[1], bad[1] = { 0 };

  list[0] = a2;
  pls_steady_options_init (&o);
  o.applicators = PLS_APPLICATORS_LIST;
  o.open_list = list;
  o.open_count = 1;
  r = solve (l.net, &o);
  ck_assert_int_eq (pls_steady_element_active (r, l.a1), 0);
  ck_assert_int_eq (pls_steady_element_active (r, a2), 1);
  ck_assert_double_eq_tol (pls_steady_element_flow (r, a2),
                           pls_steady_element_flow (r, l.pump), 1e-15);
  ck_assert_double_eq (pls_steady_element_flow (r, l.a1), 0.0);
  pls_steady_result_free (r);
  /* Element 0 is the pump, not an applicator: a clear refusal. */
  o.open_list = bad;
  ck_assert_int_eq (pls_solve_steady (l.net, &o, &r, &err), PLS_ERR_INVALID);
  ck_assert_ptr_null (r);
  ck_assert_int_eq (err.element, 0);
  ck_assert_ptr_nonnull (strstr (err.message, "not an applicator"));
  pls_network_free (l.net);
}
END_TEST

/* ---- findings: one layout per code ------------------------------------ */

typedef enum
{
  MOD_UNREACHED, MOD_NO_REFERENCE, MOD_OPEN_PORT, MOD_UNFED, MOD_STALL_PRESSURE,
  MOD_STALL_FLOW, MOD_SPREAD, MOD_RATING, MOD_GAUGE_LOW, MOD_GAUGE_HIGH, MOD_PRE_HIGH,
  MOD_PRE_LOW, MOD_VELOCITY, MOD_SHEAR,
} modification;

static const struct
{
  modification mod;
  int open_all;
  const char *code;
  const char *named;   /* the part the sentence must name */
  int removed;         /* a part is left out (solved = 0) */
} finding_cases[] = {
  { MOD_UNREACHED, 0, "unreached", "V9", 1 },
  { MOD_NO_REFERENCE, 0, "no-reference", "P2", 1 },
  { MOD_OPEN_PORT, 0, "open-port", "H7", 0 },
  { MOD_UNFED, 0, "nozzle-unfed", "A9", 1 },
  { MOD_STALL_PRESSURE, 1, "pump-stall-short", "P1", 0 },
  { MOD_STALL_FLOW, 1, "pump-stall-short", "P1", 0 },
  { MOD_SPREAD, 1, "manifold-spread", "A3", 0 },
  { MOD_RATING, 0, "rating-exceeded", "H1", 0 },
  { MOD_GAUGE_LOW, 0, "gauge-range-low", "G1", 0 },
  { MOD_GAUGE_HIGH, 0, "gauge-range-high", "G1", 0 },
  { MOD_PRE_HIGH, 0, "precharge-too-high", "C1", 0 },
  { MOD_PRE_LOW, 0, "precharge-too-low", "C1", 0 },
  { MOD_VELOCITY, 1, "velocity-high", "H1", 0 },
  { MOD_SHEAR, 1, "shear-high", "H1", 0 },
};

/* The base layout rebuilt with one change; every figure that is not the
 * point of the case stays clean. */
static layout
modified_layout (modification mod, pls_steady_options *o)
{
  pls_fluid_params f;
  pls_pump_params pp = pump_params ();
  pls_line_params hp = hose (5.0, 9.5e-3, 25e6);
  pls_nozzle_params np = nozzle ();
  pls_accumulator_params ap = accumulator (9e6);
  pls_gauge_params gp = { 30e6 };
  pls_valve_params dv = { PLS_VALVE_DUMP, 1.0, 6e-3, 0, 0.0 };
  pls_valve_params bv = { PLS_VALVE_BALL, 1.0, 6e-3, 0, 0.0 };
  layout l;
  pls_error err;
  int x, y;

  pls_steady_options_init (o);
  if (mod == MOD_RATING)
    hp.rated_pressure = 10e6;   /* below the 18 MPa stall */
  if (mod == MOD_GAUGE_LOW)
    gp.full_scale = 20e6;       /* < 1.5 x 18 MPa */
  if (mod == MOD_GAUGE_HIGH)
    gp.full_scale = 100e6;      /* 18 MPa < 100 / 3 */
  if (mod == MOD_PRE_HIGH)
    ap = accumulator (20e6);    /* above the 18 MPa idle pressure */
  if (mod == MOD_PRE_LOW)
    ap = accumulator (2e6);     /* < 18 MPa / 4 */
  if (mod == MOD_STALL_PRESSURE)
    o->demand_pressure = 20e6;
  if (mod == MOD_STALL_FLOW)
    o->demand_flow = 2e-5;      /* twice the free flow */
  if (mod == MOD_VELOCITY)
    o->velocity_limit = 0.01;   /* the hose runs at about 0.06 m/s */
  if (mod == MOD_SHEAR)
    o->shear_rate_limit = 10.0; /* 8 V / D is about 50 1/s */

  pls_fluid_params_init (&f);
  l.net = pls_network_new (&f, NULL, &err);
  l.tank = pls_network_add_fixed_node (l.net, 0.0, 0.0, "tank", &err);
  l.drain = pls_network_add_fixed_node (l.net, 0.0, 0.0, "drain", &err);
  l.n1 = pls_network_add_node (l.net, 0.0, "N1", &err);
  l.n2 = pls_network_add_node (l.net, 0.0, "N2", &err);
  l.pump = pls_network_add_pump (l.net, l.tank, l.n1, &pp, "P1", &err);
  l.h1 = pls_network_add_line (l.net, l.n1, l.n2, &hp, "H1", &err);
  l.a1 = pls_network_add_nozzle (l.net, l.n2, &np, "A1", &err);
  l.c1 = pls_network_add_accumulator (l.net, l.n2, &ap, "C1", &err);
  l.g1 = pls_network_add_gauge (l.net, l.n1, &gp, "G1", &err);
  l.d1 = pls_network_add_valve (l.net, l.n1, l.drain, &dv, "D1", &err);
  switch (mod)
    {
    case MOD_UNREACHED:
      /* A branch behind a shut ball valve, a gauge at its end. */
      x = pls_network_add_node (l.net, 0.0, "N8", &err);
      y = pls_network_add_node (l.net, 0.0, "N9", &err);
      pls_network_add_valve (l.net, l.n2, x, &bv, "V9", &err);
      pls_network_add_line (l.net, x, y, &hp, "H9", &err);
      pls_network_add_gauge (l.net, y, &gp, "G9", &err);
      break;
    case MOD_UNFED:
      x = pls_network_add_node (l.net, 0.0, "N8", &err);
      pls_network_add_valve (l.net, l.n2, x, &bv, "V9", &err);
      pls_network_add_nozzle (l.net, x, &np, "A9", &err);
      break;
    case MOD_NO_REFERENCE:
      /* A second pump drawing from a closed pot (a node with a gauge),
       * pushing into a dead-end hose with a gauge. */
      x = pls_network_add_node (l.net, 0.0, "pot", &err);
      y = pls_network_add_node (l.net, 0.0, "N9", &err);
      pls_network_add_gauge (l.net, x, &gp, "G8", &err);
      pls_network_add_pump (l.net, x, y, &pp, "P2", &err);
      pls_network_add_gauge (l.net, y, &gp, "G9", &err);
      break;
    case MOD_OPEN_PORT:
      x = pls_network_add_node (l.net, 0.0, "N7", &err);
      pls_network_add_line (l.net, l.n2, x, &hp, "H7", &err);
      break;
    case MOD_SPREAD:
      /* A second applicator at the end of a long thin hose. */
      {
        pls_line_params thin = hose (20.0, 3e-3, 25e6);

        x = pls_network_add_node (l.net, 0.0, "N3", &err);
        pls_network_add_line (l.net, l.n2, x, &thin, "H3", &err);
        pls_network_add_nozzle (l.net, x, &np, "A3", &err);
      }
      break;
    case MOD_STALL_PRESSURE:
    case MOD_STALL_FLOW:
    case MOD_RATING:
    case MOD_GAUGE_LOW:
    case MOD_GAUGE_HIGH:
    case MOD_PRE_HIGH:
    case MOD_PRE_LOW:
    case MOD_VELOCITY:
    case MOD_SHEAR:
    default:
      break;
    }
  ck_assert_msg (err.status == PLS_OK, "%s", err.message);
  return l;
}

START_TEST (test_finding_triggers)
{
  pls_steady_options o;
  layout l = modified_layout (finding_cases[_i].mod, &o);
  pls_steady_result *r;
  const pls_finding *f;
  size_t i;
  int any_removed = 0;

  if (finding_cases[_i].open_all)
    o.applicators = PLS_APPLICATORS_ALL;
  r = solve (l.net, &o);
  f = find_code (r, finding_cases[_i].code);
  ck_assert_msg (f != NULL, "case %d: no %s finding", _i, finding_cases[_i].code);
  ck_assert_msg (strstr (f->message, finding_cases[_i].named) != NULL,
                 "case %d: '%s' does not name %s", _i, f->message, finding_cases[_i].named);
  ck_assert (f->element >= -1 && f->node >= -1);
  for (i = 0; i < pls_network_node_count (l.net); i++)
    if (!pls_steady_node_solved (r, (int) i))
      {
        any_removed = 1;
        ck_assert_double_eq (pls_steady_node_pressure (r, (int) i), 0.0);
      }
  ck_assert_int_eq (any_removed, finding_cases[_i].removed);
  /* The rest still solves: the main line is at stall or flowing. */
  ck_assert (pls_steady_node_pressure (r, l.n1) > 1e6);
  pls_steady_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* The clean layout triggers nothing, idle or open, and a capped stub with
 * a gauge at its end is not an open port. */
START_TEST (test_clean_layout)
{
  layout l = base_layout ();
  pls_steady_options o;
  pls_steady_result *r;
  int set;

  for (set = 0; set < 2; set++)
    {
      pls_steady_options_init (&o);
      o.applicators = set ? PLS_APPLICATORS_ALL : PLS_APPLICATORS_NONE;
      r = solve (l.net, &o);
      ck_assert_msg (pls_steady_finding_count (r) == 0, "%s",
                     pls_steady_finding_count (r) ? pls_steady_finding (r, 0)->message : "");
      ck_assert_ptr_null (pls_steady_finding (r, 0));
      ck_assert (!has_code (r, "open-port"));
      pls_steady_result_free (r);
    }
  pls_network_free (l.net);
}
END_TEST

static Suite *
steady_suite (void)
{
  Suite *s = suite_create ("steady");
  TCase *tc = tcase_create ("pump-layouts");
  TCase *tf = tcase_create ("findings");

  tcase_add_test (tc, test_idle_stall);
  tcase_add_test (tc, test_steady_open);
  tcase_add_test (tc, test_air_off);
  tcase_add_test (tc, test_applicator_list);
  suite_add_tcase (s, tc);
  tcase_add_loop_test (tf, test_finding_triggers, 0,
                       (int) (sizeof finding_cases / sizeof finding_cases[0]));
  tcase_add_test (tf, test_clean_layout);
  suite_add_tcase (s, tf);
  return s;
}

int
main (void)
{
  return pl_check_run (steady_suite ());
}
