/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-accumulator-fit.c: the accumulator a what-if fits to a layout
 * without one: the gas-law sizing, the feed node, the step it makes.
 */
#include "config.h"

#include <math.h>

#include "pl-accumulator-fit.h"
#include "pl-command.h"
#include "pl-compile.h"
#include "pl-sample-fixtures.h"
#include "pl-undo-stack.h"

#define ATM 101325.0

/* PHYSICS.md's check value (polytropic gas law): dV 5 L between p1 80
 * and p2 180 bar with p0 72 bar gives V0 10.000 L at n 1 and 12.261 L at
 * n 1.4.  Those are absolute pressures: the function takes gauge ones. */
START_TEST (test_gas_volume_gas_law)
{
  double v1 = pl_accumulator_fit_gas_volume (5e-3, 72e5 - ATM, 80e5 - ATM, 180e5 - ATM, 1.0);
  double v14 = pl_accumulator_fit_gas_volume (5e-3, 72e5 - ATM, 80e5 - ATM, 180e5 - ATM, 1.4);

  /* Four digits as the table gives them. */
  ck_assert_double_eq_tol (v1, 10.000e-3, 0.0005e-3);
  ck_assert_double_eq_tol (v14, 12.261e-3, 0.0005e-3);
  /* Nothing usable when the precharge is not below the lower pressure. */
  ck_assert (isnan (pl_accumulator_fit_gas_volume (5e-3, 80e5, 80e5, 180e5, 1.0)));
  ck_assert (isnan (pl_accumulator_fit_gas_volume (5e-3, 72e5, 180e5, 80e5, 1.0)));
  ck_assert (isnan (pl_accumulator_fit_gas_volume (0.0, 72e5, 80e5, 180e5, 1.0)));
}
END_TEST

/* The starved carton sealer: pump, hose H1, then the manifold T1-T2-T3
 * with pipe stubs.  Every path to the applicators passes the node of H1's
 * outlet and T1's inlet; T1's branch feeds only N1, so that node is the
 * one nearest the applicators that dominates them all. */
START_TEST (test_feed_node_of_end_fed_manifold)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample ("carton-sealer-starved.pline");
  const char *part_id = NULL, *port_key = NULL;
  g_autoptr (GError) error = NULL;
  const char *tag;

  ck_assert_msg (pl_accumulator_fit_find_feed (doc, &part_id, &port_key, &error), "%s",
                 error != NULL ? error->message : "");
  tag = pl_part_get_tag (pl_document_find_part (doc, part_id));
  ck_assert_msg ((g_str_equal (tag, "H1") && g_str_equal (port_key, "b"))
                 || (g_str_equal (tag, "T1") && g_str_equal (port_key, "a")),
                 "fed at %s:%s", tag, port_key);
}
END_TEST

/* A layout without a pump has no feed node: a clear refusal. */
START_TEST (test_feed_node_needs_a_pump)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) undo = pl_undo_stack_new (doc);
  g_autoptr (PlCommand) add = pl_command_new_add_part ("applicator", NULL, 0, 0);
  const char *part_id = NULL, *port_key = NULL;
  g_autoptr (GError) error = NULL;

  ck_assert (pl_undo_stack_push (undo, add, NULL));
  ck_assert (!pl_accumulator_fit_find_feed (doc, &part_id, &port_key, &error));
  ck_assert_ptr_nonnull (error);
  ck_assert_str_eq (error->message, "There is no pump to feed an accumulator.");
}
END_TEST

/* The plan for the starved line: sized from its own idle pressure, the
 * gas law holds for what it chose, and the step adds one wired accumulator
 * that lifts the lowest manifold pressure of the firing cycle; undo gives
 * the document back as it was. */
START_TEST (test_plan_and_fit_starved_line)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample ("carton-sealer-starved.pline");
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  g_autoptr (PlUndoStack) undo = pl_undo_stack_new (doc);
  g_autoptr (PlResults) full_before = pl_test_solve_full (doc);
  g_autoptr (PlCompiled) compiled = pl_compile (doc);
  g_autoptr (PlResults) fast = pl_results_solve_fast (compiled);
  g_autoptr (PlResults) full_after = NULL;
  g_autoptr (PlCommand) fit_cmd = NULL;
  g_autoptr (GError) error = NULL;
  PlAccumulatorFit fit;
  const PlPart *acc = NULL;
  double min_before, min_after, dv;

  ck_assert_msg (pl_accumulator_fit_plan (doc, fast, NAN, &fit, &error), "%s",
                 error != NULL ? error->message : "");
  /* The default precharge: half the idle pressure (common practice, no
   * source). */
  ck_assert_double_eq_tol (fit.precharge, 0.5 * fit.idle_pressure, 1e-9 * fit.idle_pressure);
  /* The gas law read back: the chosen volume gives the shot between idle
   * and 90 % of it (rounding only). */
  dv = fit.gas_volume
       * (pow ((fit.precharge + ATM) / (0.9 * fit.idle_pressure + ATM), 1.0 / 1.4)
          - pow ((fit.precharge + ATM) / (fit.idle_pressure + ATM), 1.0 / 1.4));
  ck_assert_double_eq_tol (dv, fit.shot_volume, 1e-9 * fit.shot_volume);
  /* The shot: 40 ms of at least the scenario's 2 L/min demand. */
  ck_assert (fit.shot_volume >= 0.040 * 2.0 / 60000.0 * (1.0 - 1e-12));

  ck_assert (pl_results_get_port_pressure (full_before, fit.part_id, fit.port_key,
                                           PL_PRESSURE_CYCLE_MIN, &min_before));
  fit_cmd = pl_accumulator_fit_command (doc, &fit);
  ck_assert (pl_undo_stack_push (undo, fit_cmd, NULL));
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    if (pl_part_get_part_type (pl_document_get_part (doc, i))->kind == PL_PART_ACCUMULATOR)
      acc = pl_document_get_part (doc, i);
  ck_assert_ptr_nonnull (acc);
  ck_assert_double_eq (pl_part_get_number (acc, "gas-volume"), fit.gas_volume);
  ck_assert_double_eq (pl_part_get_number (acc, "precharge"), fit.precharge);
  full_after = pl_test_solve_full (doc);
  ck_assert (pl_results_get_port_pressure (full_after, fit.part_id, fit.port_key,
                                           PL_PRESSURE_CYCLE_MIN, &min_after));
  ck_assert_msg (min_after > min_before, "cycle minimum %g Pa, was %g Pa", min_after,
                 min_before);
  ck_assert (pl_undo_stack_undo (undo));
  ck_assert (pl_document_equal (doc, before));
}
END_TEST

/* A precharge at or above 90 % of the idle pressure cannot give a shot. */
START_TEST (test_plan_refuses_high_precharge)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample ("carton-sealer-starved.pline");
  g_autoptr (PlCompiled) compiled = pl_compile (doc);
  g_autoptr (PlResults) fast = pl_results_solve_fast (compiled);
  g_autoptr (GError) error = NULL;
  PlAccumulatorFit fit;

  ck_assert (!pl_accumulator_fit_plan (doc, fast, 300e5, &fit, &error));
  ck_assert_ptr_nonnull (error);
  ck_assert (!pl_accumulator_fit_plan (doc, NULL, NAN, &fit, NULL));
}
END_TEST

static Suite *
accumulator_fit_suite (void)
{
  Suite *s = suite_create ("accumulator-fit");
  TCase *tc = tcase_create ("fit");

  tcase_add_test (tc, test_gas_volume_gas_law);
  tcase_add_test (tc, test_feed_node_of_end_fed_manifold);
  tcase_add_test (tc, test_feed_node_needs_a_pump);
  tcase_add_test (tc, test_plan_and_fit_starved_line);
  tcase_add_test (tc, test_plan_refuses_high_precharge);
  tcase_set_timeout (tc, 60);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (accumulator_fit_suite ());
}
