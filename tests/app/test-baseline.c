/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Baseline: pin the results of a sample, make a real edit, compare.
 *
 * References: the sign of each difference follows from the physics of the
 * line, not from stored numbers.  A wider hose bore lowers the hose's
 * friction drop at a given flow (laminar power-law flow: the drop goes
 * with the bore to the power -(3n+1), Rabinowitsch-Mooney; Chhabra &
 * Richardson, Non-Newtonian Flow in the Process Industries, eq. 2.8 and
 * 3.9), so every pressure downstream of it rises while flow passes, and
 * the shots grow; at idle nothing flows and the idle pressures stay
 * (hydrostatics only, unchanged by a bore).
 */

#include "config.h"

#include <math.h>

#include "pl-baseline.h"
#include "pl-check.h"
#include "pl-command.h"
#include "pl-sample-fixtures.h"

static void
apply (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (PlCommand) owned = cmd;
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (owned, doc, &error), "%s", error ? error->message : "?");
}

static const PlBaselineRow *
row_of (GArray *rows, const char *part_id)
{
  for (guint i = 0; i < rows->len; i++)
    if (g_strcmp0 (g_array_index (rows, PlBaselineRow, i).part_id, part_id) == 0)
      return &g_array_index (rows, PlBaselineRow, i);
  ck_abort_msg ("no row for %s", part_id);
  return NULL;
}

/* Each sample's supply hose H1 (p3) and its far applicator N4 (p13),
 * the bore widened to 1.5 times (1/4 in to 3/8 in, and 3/8 to 9/16). */
static const struct
{
  const char *sample;
  double bore_before;      /* m, the sample's (1/4 and 3/8 in) */
} wider_rows[] = {
  { "carton-sealer-starved.pline", 0.25 * 0.0254 },
  { "carton-sealer-retrofit.pline", 0.375 * 0.0254 },
};

START_TEST (test_wider_hose)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample (wider_rows[_i].sample);
  g_autoptr (PlResults) before = pl_test_solve_full (doc);
  g_autoptr (PlBaseline) baseline = pl_baseline_new (doc, before);
  g_autoptr (PlResults) after = NULL;
  g_autoptr (GArray) rows = NULL;
  const PlBaselineRow *far;
  guint n_app = 0;

  ck_assert_double_eq_tol (pl_part_get_number (pl_document_find_part (doc, "p3"), "bore"),
                           wider_rows[_i].bore_before, 1e-9);
  apply (doc, pl_command_new_set_number ("p3", "bore", 1.5 * wider_rows[_i].bore_before));
  after = pl_test_solve_full (doc);
  rows = pl_baseline_compare (baseline, doc, after);
  ck_assert_uint_gt (rows->len, 0);

  far = row_of (rows, "p13");
  ck_assert_str_eq (far->tag, "N4");
  ck_assert_int_eq (far->kind, PL_PART_APPLICATOR);
  ck_assert_int_eq (far->change, PL_BASELINE_KEPT);
  /* Wider bore -> higher far-applicator pressure while flowing. */
  ck_assert_double_gt (far->difference[PL_BASELINE_CYCLE_MIN], 0.0);
  ck_assert_double_gt (far->difference[PL_BASELINE_STEADY_OPEN], 0.0);
  ck_assert_double_gt (far->difference[PL_BASELINE_SHOT_MASS], 0.0);
  ck_assert_double_eq_tol (far->difference[PL_BASELINE_CYCLE_MIN],
                           far->after[PL_BASELINE_CYCLE_MIN]
                           - far->before[PL_BASELINE_CYCLE_MIN], 1e-9);
  for (guint i = 0; i < rows->len; i++)
    {
      const PlBaselineRow *r = &g_array_index (rows, PlBaselineRow, i);

      if (r->kind != PL_PART_APPLICATOR)
        continue;
      n_app++;
      /* Idle: no flow, no friction: the same pressure to 0.1 % (the
       * steady solve's tolerance is far tighter). */
      ck_assert_double_eq_tol (r->after[PL_BASELINE_IDLE], r->before[PL_BASELINE_IDLE],
                               1e-3 * r->before[PL_BASELINE_IDLE]);
      ck_assert_double_gt (r->difference[PL_BASELINE_CYCLE_MIN], 0.0);
    }
  ck_assert_uint_eq (n_app, 4);
}
END_TEST

/* A removed applicator keeps its row with its before; an added gauge has
 * no before; pinned parts that stay have both. */
START_TEST (test_added_and_removed)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample ("demo-glue-line.pline");
  g_autoptr (PlResults) before = pl_test_solve_full (doc);
  g_autoptr (PlBaseline) baseline = pl_baseline_new (doc, before);
  g_autoptr (PlResults) after = NULL;
  g_autoptr (GArray) rows = NULL;
  g_autoptr (PlCommand) add = pl_command_new_add_part ("gauge", NULL, 500.0, 500.0);
  const char *ids[] = { "p15" };
  const char *added_id;
  const PlBaselineRow *gone, *added, *gauge;
  g_autofree char *gone_tag = g_strdup (pl_part_get_tag (pl_document_find_part (doc, "p15")));

  ck_assert_ptr_eq (pl_baseline_get_results (baseline), before);
  apply (doc, pl_command_new_remove (ids, 1));
  ck_assert (pl_command_apply (add, doc, NULL));
  added_id = pl_command_get_created_id (add);
  after = pl_test_solve_full (doc);
  rows = pl_baseline_compare (baseline, doc, after);

  gone = row_of (rows, "p15");
  ck_assert_int_eq (gone->change, PL_BASELINE_REMOVED);
  ck_assert_str_eq (gone->tag, gone_tag);
  ck_assert (isfinite (gone->before[PL_BASELINE_CYCLE_MIN]));
  ck_assert (isfinite (gone->before[PL_BASELINE_SHOT_MASS]));
  ck_assert (isnan (gone->after[PL_BASELINE_CYCLE_MIN]));
  ck_assert (isnan (gone->difference[PL_BASELINE_CYCLE_MIN]));
  /* Removed parts come last. */
  ck_assert_ptr_eq (gone, &g_array_index (rows, PlBaselineRow, rows->len - 1));

  added = row_of (rows, added_id);
  ck_assert_int_eq (added->change, PL_BASELINE_ADDED);
  ck_assert_int_eq (added->kind, PL_PART_GAUGE);
  for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
    {
      ck_assert (isnan (added->before[f]));
      ck_assert (isnan (added->difference[f]));
    }

  /* The line's gauge G1 (p7): kept, no shot figure. */
  gauge = row_of (rows, "p7");
  ck_assert_int_eq (gauge->change, PL_BASELINE_KEPT);
  ck_assert (isfinite (gauge->before[PL_BASELINE_IDLE]));
  ck_assert (isfinite (gauge->after[PL_BASELINE_IDLE]));
  ck_assert (isnan (gauge->before[PL_BASELINE_SHOT_MASS]));
}
END_TEST

/* Results of another revision are not "after": every after is NaN. */
START_TEST (test_stale_results)
{
  g_autoptr (PlDocument) doc = pl_test_load_sample ("carton-sealer-starved.pline");
  g_autoptr (PlResults) before = pl_test_solve_full (doc);
  g_autoptr (PlBaseline) baseline = pl_baseline_new (doc, before);
  g_autoptr (GArray) rows = NULL;

  apply (doc, pl_command_new_set_number ("p3", "length", 9.0));
  rows = pl_baseline_compare (baseline, doc, before);
  ck_assert_uint_eq (rows->len, 4);
  for (guint i = 0; i < rows->len; i++)
    for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
      {
        ck_assert (isfinite (g_array_index (rows, PlBaselineRow, i).before[f]));
        ck_assert (isnan (g_array_index (rows, PlBaselineRow, i).after[f]));
      }
  g_clear_pointer (&rows, g_array_unref);
  rows = pl_baseline_compare (baseline, doc, NULL);
  ck_assert_uint_eq (rows->len, 4);
  ck_assert_str_eq (pl_baseline_figure_get_key (PL_BASELINE_CYCLE_MIN), "cycle_min");
  ck_assert_ptr_null (pl_baseline_figure_get_key (PL_BASELINE_N_FIGURES));
}
END_TEST

static Suite *
baseline_suite (void)
{
  Suite *s = suite_create ("baseline");
  TCase *tc = tcase_create ("compare");

  tcase_set_timeout (tc, 60);
  tcase_add_loop_test (tc, test_wider_hose, 0, G_N_ELEMENTS (wider_rows));
  tcase_add_test (tc, test_added_and_removed);
  tcase_add_test (tc, test_stale_results);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (baseline_suite ());
}
