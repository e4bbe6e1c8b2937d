/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-compile.c: document -> solver network -> results addressed by part
 * id and port key.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pl-check.h"

#include "pl-command.h"
#include "pl-compile.h"
#include "pl-document.h"
#include "pl-results.h"

/* --- building documents with the document's own commands --- */

static char *
add_part (PlDocument *doc, const char *type)
{
  g_autoptr (PlCommand) cmd = pl_command_new_add_part (type, NULL, 0.0, 0.0);
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "add %s: %s", type,
                 error ? error->message : "");
  return g_strdup (pl_command_get_created_id (cmd));
}

static void
set_number (PlDocument *doc, const char *id, const char *key, double value)
{
  g_autoptr (PlCommand) cmd = pl_command_new_set_number (id, key, value);
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "set %s.%s: %s", id, key,
                 error ? error->message : "");
}

static void
set_choice (PlDocument *doc, const char *id, const char *key, const char *choice)
{
  g_autoptr (PlCommand) cmd = pl_command_new_set_choice (id, key, choice);
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "set %s.%s: %s", id, key,
                 error ? error->message : "");
}

static void
wire (PlDocument *doc, const char *a, const char *pa, const char *b, const char *pb)
{
  g_autoptr (PlCommand) cmd = pl_command_new_add_wire (NULL, a, pa, b, pb, NULL, 0);
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "wire %s.%s-%s.%s: %s", a, pa, b, pb,
                 error ? error->message : "");
}

/* A pump feeding a hose, a tee, and two applicators behind it:
 *   P.out - H1.a, H1.b - T.a, T.b - H2.a, H2.b - N2.in, T.branch - N1.in */
typedef struct
{
  PlDocument *doc;
  char *pump, *h1, *tee, *h2, *n1, *n2;
} TeeLine;

static void
tee_line_init (TeeLine *t)
{
  t->doc = pl_document_new ();
  t->pump = add_part (t->doc, "pump");
  t->h1 = add_part (t->doc, "hose");
  t->tee = add_part (t->doc, "tee");
  t->h2 = add_part (t->doc, "hose");
  t->n1 = add_part (t->doc, "applicator");
  t->n2 = add_part (t->doc, "applicator");
  wire (t->doc, t->pump, "out", t->h1, "a");
  wire (t->doc, t->h1, "b", t->tee, "a");
  wire (t->doc, t->tee, "b", t->h2, "a");
  wire (t->doc, t->h2, "b", t->n2, "in");
  wire (t->doc, t->tee, "branch", t->n1, "in");
}

static void
tee_line_clear (TeeLine *t)
{
  g_object_unref (t->doc);
  g_free (t->pump);
  g_free (t->h1);
  g_free (t->tee);
  g_free (t->h2);
  g_free (t->n1);
  g_free (t->n2);
}

START_TEST (test_wired_ports_share_a_node)
{
  TeeLine t;
  g_autoptr (PlCompiled) c = NULL;
  const pls_network *net;
  const PlCompiledPart *tee, *pump;
  int n_pump, n_h1a, n_h1b, n_ta, n_tb, n_tbr, n_h2a, n_h2b, n_n1, n_n2;

  tee_line_init (&t);
  c = pl_compile (t.doc);
  net = pl_compiled_get_network (c);
  ck_assert_ptr_nonnull (net);
  ck_assert_uint_eq (pl_compiled_get_n_findings (c), 0);

  n_pump = pl_compiled_get_port_node (c, t.pump, "out");
  n_h1a = pl_compiled_get_port_node (c, t.h1, "a");
  n_h1b = pl_compiled_get_port_node (c, t.h1, "b");
  n_ta = pl_compiled_get_port_node (c, t.tee, "a");
  n_tb = pl_compiled_get_port_node (c, t.tee, "b");
  n_tbr = pl_compiled_get_port_node (c, t.tee, "branch");
  n_h2a = pl_compiled_get_port_node (c, t.h2, "a");
  n_h2b = pl_compiled_get_port_node (c, t.h2, "b");
  n_n1 = pl_compiled_get_port_node (c, t.n1, "in");
  n_n2 = pl_compiled_get_port_node (c, t.n2, "in");

  /* Joined by a wire: one node.  Two ends of one part: two nodes. */
  ck_assert_int_ge (n_pump, 0);
  ck_assert_int_eq (n_pump, n_h1a);
  ck_assert_int_eq (n_h1b, n_ta);
  ck_assert_int_eq (n_tb, n_h2a);
  ck_assert_int_eq (n_h2b, n_n2);
  ck_assert_int_eq (n_tbr, n_n1);
  ck_assert_int_ne (n_h1a, n_h1b);
  ck_assert_int_ne (n_ta, n_tb);
  ck_assert_int_ne (n_ta, n_tbr);
  ck_assert_int_ne (n_tb, n_tbr);

  /* Nodes: supply drum, P/H1.a, H1.b/T.a, tee centre, T.b/H2.a, H2.b/N2,
   * T.branch/N1.  Elements: pump, two hoses, three tee legs, two nozzles. */
  ck_assert_uint_eq (pls_network_node_count (net), 7);
  ck_assert_uint_eq (pls_network_element_count (net), 8);

  pump = pl_compiled_find_part (c, t.pump);
  ck_assert (pump->compiled);
  ck_assert_uint_eq (pump->n_elements, 1);
  ck_assert_int_eq (pls_network_element_kind (net, pump->elements[0]), PLS_ELEMENT_PUMP);
  ck_assert (pls_network_node_is_fixed (net, pump->internal_node));
  ck_assert_int_eq (pls_network_element_node (net, pump->elements[0], 0), pump->internal_node);
  ck_assert_int_eq (pls_network_element_node (net, pump->elements[0], 1), n_pump);

  /* A tee: a centre node and three fittings from it to a, b, branch. */
  tee = pl_compiled_find_part (c, t.tee);
  ck_assert_uint_eq (tee->n_elements, 3);
  ck_assert_int_ge (tee->internal_node, 0);
  ck_assert (!pls_network_node_is_fixed (net, tee->internal_node));
  for (guint k = 0; k < 3; k++)
    {
      const int ends[3] = { n_ta, n_tb, n_tbr };
      int e = tee->elements[k];

      ck_assert_int_eq (pls_network_element_kind (net, e), PLS_ELEMENT_FITTING);
      ck_assert_int_eq (pls_network_element_node (net, e, 0), tee->internal_node);
      ck_assert_int_eq (pls_network_element_node (net, e, 1), ends[k]);
      ck_assert_ptr_eq (pl_compiled_get_element_part (c, e), tee);
    }

  /* Back from solver indices to parts and ports. */
  {
    const char *port = NULL;
    const PlCompiledPart *owner = pl_compiled_get_node_part (c, n_tbr, &port);

    /* The first port in document order on that node: T.branch (the tee
     * was added before the applicator). */
    ck_assert_str_eq (owner->id, t.tee);
    ck_assert_str_eq (port, "branch");
  }
  ck_assert_int_eq (pl_compiled_get_port_node (c, t.tee, "no-such-port"), -1);
  ck_assert_int_eq (pl_compiled_get_port_node (c, "p999", "a"), -1);
  tee_line_clear (&t);
}
END_TEST

/* Mass balance at the tee centre and the direction convention of the legs. */
START_TEST (test_tee_legs_balance)
{
  TeeLine t;
  g_autoptr (PlCompiled) c = NULL;
  g_autoptr (PlResults) r = NULL;
  double q_h1, q_h2, q_leg[3], q_n1, q_n2;

  tee_line_init (&t);
  c = pl_compile (t.doc);
  r = pl_results_solve_fast (c);
  ck_assert (pl_results_get_converged (r, PL_CASE_STEADY_OPEN));
  ck_assert (pl_results_get_flow (r, t.h1, 0, PL_CASE_STEADY_OPEN, &q_h1));
  ck_assert (pl_results_get_flow (r, t.h2, 0, PL_CASE_STEADY_OPEN, &q_h2));
  ck_assert (pl_results_get_flow (r, t.n1, 0, PL_CASE_STEADY_OPEN, &q_n1));
  ck_assert (pl_results_get_flow (r, t.n2, 0, PL_CASE_STEADY_OPEN, &q_n2));
  for (guint k = 0; k < 3; k++)
    ck_assert (pl_results_get_flow (r, t.tee, k, PL_CASE_STEADY_OPEN, &q_leg[k]));
  ck_assert (!pl_results_get_flow (r, t.tee, 3, PL_CASE_STEADY_OPEN, &q_leg[0]));

  ck_assert_double_gt (q_h1, 0.0);
  /* Legs point out of the centre: leg a carries the inflow backwards.
   * Continuity; the solver's flow residual is below 1e-12 m^3/s, so 1e-9
   * of the flow (~1e-14 m^3/s) is well inside it. */
  ck_assert_double_eq_tol (q_leg[0], -q_h1, 1e-9 * q_h1);
  ck_assert_double_eq_tol (q_leg[1], q_h2, 1e-9 * q_h1);
  ck_assert_double_eq_tol (q_leg[2], q_n1, 1e-9 * q_h1);
  ck_assert_double_eq_tol (q_leg[0] + q_leg[1] + q_leg[2], 0.0, 1e-9 * q_h1);
  ck_assert_double_eq_tol (q_n1 + q_n2, q_h1, 1e-9 * q_h1);
  /* The two branches are not the same path, so they share unevenly. */
  ck_assert_double_gt (q_n1, q_n2);
  tee_line_clear (&t);
}
END_TEST

/* A hand-computable line: ratio pump, one laminar hose, one applicator with
 * a fixed Cd, Newtonian fluid, all at one height.  With every applicator
 * open the flow Q satisfies
 *   pump curve (PHYSICS.md, m = 1):   p1 = ps (1 - Q / Qf),
 *     ps = ratio x air pressure, Qf = displacement x cycle rate;
 *   Hagen-Poiseuille:                 p1 - p2 = 128 mu L Q / (pi D^4);
 *   orifice with passage:             p2 = R Q + rho Q^2 / (2 Cd^2 A^2),
 * so k Q^2 + (R_hp + R + ps / Qf) Q - ps = 0, solved in closed form. */
START_TEST (test_hand_computed_line)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autofree char *pump = add_part (doc, "pump");
  g_autofree char *hose = add_part (doc, "hose");
  g_autofree char *nozzle = add_part (doc, "applicator");
  g_autoptr (PlCompiled) c = NULL;
  g_autoptr (PlResults) r = NULL;
  const double mu = 0.1, rho = 1100.0, ratio = 30.0, air = 6e5, disp = 50e-6, rate = 1.0;
  const double len = 10.0, bore = 6.35e-3, d = 0.5e-3, cd = 0.7;
  const double drop = 2e5, ref_flow = 100e-6 / 60.0;
  double ps = ratio * air, qf = disp * rate, r_hp = 128.0 * mu * len / (G_PI * pow (bore, 4));
  double area = G_PI * d * d / 4.0, k = rho / (2.0 * cd * cd * area * area);
  double r_pass = drop / ref_flow, b = r_hp + r_pass + ps / qf;
  double q = (-b + sqrt (b * b + 4.0 * k * ps)) / (2.0 * k);
  double p1 = ps * (1.0 - q / qf), p2 = p1 - r_hp * q;
  double v, got;
  pls_line_result line;
  pls_pump_result pr;

  set_choice (doc, "scenario", "viscosity-law", "newtonian");
  set_number (doc, "scenario", "viscosity", mu);
  set_number (doc, "scenario", "density", rho);
  set_number (doc, "scenario", "air-pressure", air);
  set_number (doc, "scenario", "activation-temperature", 0.0);
  set_number (doc, pump, "ratio", ratio);
  set_number (doc, pump, "friction-offset", 0.0);
  set_number (doc, pump, "displacement", disp);
  set_number (doc, pump, "max-cycle-rate", rate);
  set_number (doc, pump, "curve-exponent", 1.0);
  set_number (doc, hose, "length", len);
  set_number (doc, hose, "bore", bore);
  set_number (doc, nozzle, "orifice-diameter", d);
  set_choice (doc, nozzle, "cd-model", "fixed");
  set_number (doc, nozzle, "discharge-coefficient", cd);
  set_number (doc, nozzle, "passage-drop", drop);
  set_number (doc, nozzle, "passage-flow", ref_flow);
  wire (doc, pump, "out", hose, "a");
  wire (doc, hose, "b", nozzle, "in");

  c = pl_compile (doc);
  r = pl_results_solve_fast (c);
  ck_assert (pl_results_get_converged (r, PL_CASE_IDLE));
  ck_assert (pl_results_get_converged (r, PL_CASE_STEADY_OPEN));

  /* Laminar by a wide margin (Re ~ 40), so Hagen-Poiseuille holds. */
  v = q / (G_PI * bore * bore / 4.0);
  ck_assert (pl_results_get_line (r, hose, PL_CASE_STEADY_OPEN, &line));
  ck_assert_int_eq (line.regime, PLS_FLOW_LAMINAR);
  ck_assert_double_lt (line.reynolds, 100.0);
  ck_assert_double_gt (rho * (q / (G_PI * d * d / 4.0)) * d / mu, 400.0);

  /* Tolerances: Newton stops at 1e-3 Pa and 1e-12 m^3/s (pls defaults) on
   * pressures of ~1e7 Pa and flows of ~1.8e-5 m^3/s, i.e. below 1e-7
   * relative.  The solver rounds the fixed-Cd orifice law off below an
   * orifice Reynolds number of 1 (pls-nozzle.c), which moves the orifice
   * drop by about (1/Re)^2 / 2 = 2e-6 at this orifice's Re ~ 500, and the
   * pump curve by 1e-6 of stall (pls-pump.c); 1e-5 relative covers both
   * and still fails for any wrong law (a 1 % error in any term). */
  ck_assert_double_eq_tol (line.flow, q, 1e-5 * q);
  ck_assert_double_eq_tol (line.velocity, v, 1e-5 * v);
  /* Newtonian Reynolds number rho V D / mu. */
  ck_assert_double_eq_tol (line.reynolds, rho * v * bore / mu, 1e-5 * line.reynolds);
  ck_assert (pl_results_get_flow (r, nozzle, 0, PL_CASE_STEADY_OPEN, &got));
  ck_assert_double_eq_tol (got, q, 1e-5 * q);
  ck_assert (pl_results_get_port_pressure (r, pump, "out", PL_PRESSURE_STEADY_OPEN, &got));
  ck_assert_double_eq_tol (got, p1, 1e-5 * p1);
  ck_assert (pl_results_get_port_pressure (r, hose, "a", PL_PRESSURE_STEADY_OPEN, &got));
  ck_assert_double_eq_tol (got, p1, 1e-5 * p1);
  ck_assert (pl_results_get_port_pressure (r, nozzle, "in", PL_PRESSURE_STEADY_OPEN, &got));
  ck_assert_double_eq_tol (got, p2, 1e-5 * p1);
  ck_assert (pl_results_get_pump (r, pump, PL_CASE_STEADY_OPEN, &pr));
  ck_assert_double_eq_tol (pr.stall_pressure, ps, 1e-9 * ps);
  ck_assert_double_eq_tol (pr.free_flow, qf, 1e-9 * qf);
  ck_assert_double_eq_tol (pr.flow, q, 1e-5 * q);

  /* Idle: every applicator shut, so the line stands at stall: ratio x air
   * pressure, 30 x 6 bar = 180 bar (PHYSICS.md, ratio pump). */
  ck_assert (pl_results_get_port_pressure (r, nozzle, "in", PL_PRESSURE_IDLE, &got));
  ck_assert_double_eq_tol (got, 180e5, 1e-6 * 180e5);

  /* Addressing: unknown parts and ports give nothing, never a crash; the
   * cycle has not run in a fast snapshot. */
  ck_assert (!pl_results_get_port_pressure (r, "p999", "in", PL_PRESSURE_IDLE, &got));
  ck_assert (!pl_results_get_port_pressure (r, nozzle, "out", PL_PRESSURE_IDLE, &got));
  ck_assert (!pl_results_get_port_pressure (r, nozzle, "in", PL_PRESSURE_CYCLE_MIN, &got));
  ck_assert (!pl_results_get_line (r, pump, PL_CASE_IDLE, &line));
  ck_assert_int_eq (pl_results_get_transient_state (r), PL_TRANSIENT_PENDING);
  ck_assert_uint_eq (pl_results_get_revision (r), pl_document_get_revision (doc));
}
END_TEST

/* A refused part is a finding naming its tag; the rest still compiles. */
START_TEST (test_refused_part_is_a_finding)
{
  TeeLine t;
  g_autoptr (PlCompiled) c = NULL;
  g_autoptr (PlResults) r = NULL;
  const PlFinding *f;
  const PlCompiledPart *h2;
  double p;

  tee_line_init (&t);
  /* Roughness above half the bore: each value passes alone, together they
   * are refused by the line's cross-field rule. */
  set_number (t.doc, t.h2, "bore", 4e-3);
  set_number (t.doc, t.h2, "roughness", 3e-3);
  c = pl_compile (t.doc);
  ck_assert_uint_eq (pl_compiled_get_n_findings (c), 1);
  ck_assert (pl_compiled_has_errors (c));
  f = pl_compiled_get_finding (c, 0);
  ck_assert_int_eq (f->severity, PLS_SEVERITY_ERROR);
  ck_assert_str_eq (f->code, "part-invalid");
  ck_assert_str_eq (f->part_id, t.h2);
  h2 = pl_compiled_find_part (c, t.h2);
  ck_assert_msg (strstr (f->message, h2->tag) != NULL, "message names the tag: %s",
                 f->message);
  ck_assert (!h2->compiled);

  /* The rest solves: N1 through the branch still gets flow; N2 sits behind
   * the refused hose on a capped node no source reaches. */
  r = pl_results_solve_fast (c);
  ck_assert (pl_results_get_port_pressure (r, t.n1, "in", PL_PRESSURE_STEADY_OPEN, &p));
  ck_assert_double_gt (p, 0.0);
  ck_assert (!pl_results_get_flow (r, t.h2, 0, PL_CASE_STEADY_OPEN, &p));
  ck_assert_uint_ge (pl_results_get_n_findings (r), 1);
  ck_assert_str_eq (pl_results_get_finding (r, 0)->code, "part-invalid");
  tee_line_clear (&t);
}
END_TEST

/* Drains are fixed nodes; a dump valve with no wire on its return goes to
 * its own drum; an empty document compiles to an empty network. */
START_TEST (test_fixed_nodes)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autofree char *pump = add_part (doc, "pump");
  g_autofree char *dump = add_part (doc, "dump-valve");
  g_autofree char *ball = add_part (doc, "ball-valve");
  g_autofree char *drain = add_part (doc, "drain");
  g_autoptr (PlCompiled) c = NULL;
  g_autoptr (PlDocument) empty = pl_document_new ();
  g_autoptr (PlCompiled) ce = NULL;
  g_autoptr (PlResults) re = NULL;
  const pls_network *net;
  const PlCompiledPart *dv;

  wire (doc, pump, "out", dump, "in");
  wire (doc, dump, "in", ball, "a");
  wire (doc, ball, "b", drain, "p");
  set_number (doc, drain, "elevation", -1.5);
  c = pl_compile (doc);
  net = pl_compiled_get_network (c);
  ck_assert_uint_eq (pl_compiled_get_n_findings (c), 0);
  ck_assert (pls_network_node_is_fixed (net, pl_compiled_get_port_node (c, drain, "p")));
  ck_assert (pls_network_node_is_fixed (net, pl_compiled_get_port_node (c, ball, "b")));
  ck_assert (!pls_network_node_is_fixed (net, pl_compiled_get_port_node (c, ball, "a")));
  dv = pl_compiled_find_part (c, dump);
  ck_assert_int_ge (dv->internal_node, 0);
  ck_assert (pls_network_node_is_fixed (net, dv->internal_node));
  ck_assert_int_eq (pls_network_element_node (net, dv->elements[0], 1), dv->internal_node);
  /* Three ports on one node (P.out, DV.in, BV.a), so no orphan nodes:
   * pump drum, that junction, the drain, the dump drum. */
  ck_assert_uint_eq (pls_network_node_count (net), 4);

  ce = pl_compile (empty);
  ck_assert_ptr_nonnull (pl_compiled_get_network (ce));
  ck_assert_uint_eq (pl_compiled_get_n_parts (ce), 0);
  re = pl_results_solve_fast (ce);
  ck_assert_int_eq (pl_results_get_transient_state (re), PL_TRANSIENT_SKIPPED);
  ck_assert_uint_eq (pl_results_count_findings (re, PLS_SEVERITY_WARNING), 0);
}
END_TEST

/* Fast solves with kept workspaces give the same figures bit for bit and,
 * across a parameter change (same parts and wires), reuse the symbolic
 * analysis: one analysis per case in all (pressline-solver.h). */
START_TEST (test_workspace_reuse)
{
  TeeLine t;
  pls_steady_workspace *ws[PL_N_CASES];

  tee_line_init (&t);
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      ws[c] = pls_steady_workspace_new (NULL, NULL);
      ck_assert_ptr_nonnull (ws[c]);
    }
  for (guint round = 0; round < 3; round++)
    {
      g_autoptr (PlCompiled) c = NULL;
      g_autoptr (PlResults) plain = NULL;
      g_autoptr (PlResults) reused = NULL;
      double a, b;

      set_number (t.doc, t.h1, "length", 5.0 + round);
      c = pl_compile (t.doc);
      plain = pl_results_solve_fast (c);
      reused = pl_results_solve_fast_with (c, ws);
      for (guint k = 0; k < PL_N_PRESSURES; k++)
        if (pl_results_get_port_pressure (plain, t.n2, "in", k, &a))
          {
            ck_assert (pl_results_get_port_pressure (reused, t.n2, "in", k, &b));
            ck_assert (a == b);
          }
      ck_assert (pl_results_get_flow (plain, t.n1, 0, PL_CASE_STEADY_OPEN, &a));
      ck_assert (pl_results_get_flow (reused, t.n1, 0, PL_CASE_STEADY_OPEN, &b));
      ck_assert (a == b);
    }
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      ck_assert_int_eq (pls_steady_workspace_analyses (ws[c]), 1);
      pls_steady_workspace_free (ws[c]);
    }
  tee_line_clear (&t);
}
END_TEST

static Suite *
compile_suite (void)
{
  Suite *s = suite_create ("compile");
  TCase *tc = tcase_create ("compile");

  tcase_add_test (tc, test_wired_ports_share_a_node);
  tcase_add_test (tc, test_tee_legs_balance);
  tcase_add_test (tc, test_hand_computed_line);
  tcase_add_test (tc, test_refused_part_is_a_finding);
  tcase_add_test (tc, test_fixed_nodes);
  tcase_add_test (tc, test_workspace_reuse);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (compile_suite ());
}
