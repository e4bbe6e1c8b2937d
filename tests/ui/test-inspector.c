/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The inspector under a display: typed values with units reach the
 * document in SI, refusals leave it untouched and say why, a spin run is
 * one undo step, the scenario shows with nothing selected, and the live
 * results follow a PlResults and show when they are stale.
 */

#include "config.h"

#include <gtk/gtk.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pl-command.h"
#include "pl-inspector.h"
#include "pl-layout-reader.h"
#include "pl-param-row.h"
#include "pl-solve-scheduler.h"
#include "pl-ui-test.h"

static PlDocument *doc;
static PlUndoStack *undo;
static GtkWidget *window;
static PlInspector *inspector;

static void
iterate (void)
{
  for (int i = 0; i < 50 && g_main_context_pending (NULL); i++)
    g_main_context_iteration (NULL, FALSE);
}

static void
setup (void)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "samples",
                                            "demo-glue-line.pline", NULL);

  doc = pl_layout_read_file (path, &error);
  ck_assert_msg (doc != NULL, "%s", error ? error->message : "");
  undo = pl_undo_stack_new (doc);
  window = gtk_window_new ();
  gtk_window_set_default_size (GTK_WINDOW (window), 380, 900);
  inspector = PL_INSPECTOR (pl_inspector_new ());
  gtk_window_set_child (GTK_WINDOW (window), GTK_WIDGET (inspector));
  pl_inspector_set_context (inspector, doc, undo, NULL);
  gtk_window_present (GTK_WINDOW (window));
  iterate ();
}

static void
teardown (void)
{
  gtk_window_destroy (GTK_WINDOW (window));
  iterate ();
  g_clear_object (&undo);
  g_clear_object (&doc);
}

static double
number_of (const char *id, const char *key)
{
  return pl_part_get_number (pl_document_find_part (doc, id), key);
}

static PlParamRow *
select_and_get_row (const char *id, const char *key)
{
  const char *ids[] = { id, NULL };
  GtkWidget *row;

  pl_inspector_set_selection (inspector, ids);
  row = pl_inspector_get_row (inspector, key);
  ck_assert_msg (row != NULL, "no row %s for %s", key, id);
  return PL_PARAM_ROW (row);
}

/* The window as BUILD/tests/ui/screenshots/NAME.png, for people to look at. */
static void
save_screenshot (const char *name)
{
  g_autofree char *file = g_strdup_printf ("%s.png", name);

  pl_ui_test_save_shot (GTK_WIDGET (window), file);
}

/* 1 in = 0.0254 m exactly (NIST SP 811, B.9), so 1/2 in = 0.0127 m; the
 * tolerance allows the last bit of the product only. */
START_TEST (test_bore_typed_in_inches)
{
  double before = number_of ("p3", "bore");
  PlParamRow *row = select_and_get_row ("p3", "bore");

  ck_assert_str_eq (pl_inspector_get_title (inspector), "H1");
  ck_assert (pl_param_row_commit_text (row, "1/2 in"));
  ck_assert_double_eq_tol (number_of ("p3", "bore"), 0.0127, 1e-15);
  ck_assert_ptr_null (pl_param_row_get_reason (row));
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 1);
  /* The field shows the value in the user's unit (SI: mm). */
  ck_assert_str_eq (gtk_editable_get_text (GTK_EDITABLE (pl_param_row_get_editor (row))),
                    "12.7");

  ck_assert (pl_undo_stack_undo (undo));
  ck_assert (number_of ("p3", "bore") == before);
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 0);
}
END_TEST

/* The same through the spin button itself: text typed, Enter pressed. */
START_TEST (test_bore_typed_into_spin_button)
{
  PlParamRow *row = select_and_get_row ("p3", "bore");
  GtkWidget *spin = pl_param_row_get_editor (row);

  ck_assert (GTK_IS_SPIN_BUTTON (spin));
  gtk_editable_set_text (GTK_EDITABLE (spin), "1/4 in");
  gtk_spin_button_update (GTK_SPIN_BUTTON (spin));
  iterate ();
  /* 1/4 in = 0.00635 m (NIST SP 811 factor, exact). */
  ck_assert_double_eq_tol (number_of ("p3", "bore"), 0.00635, 1e-15);
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 1);

  gtk_editable_set_text (GTK_EDITABLE (spin), "-3 mm");
  gtk_spin_button_update (GTK_SPIN_BUTTON (spin));
  iterate ();
  ck_assert_double_eq_tol (number_of ("p3", "bore"), 0.00635, 1e-15);
  ck_assert_ptr_nonnull (pl_param_row_get_reason (row));
  /* The refused text stays for the user to mend. */
  ck_assert_str_eq (gtk_editable_get_text (GTK_EDITABLE (spin)), "-3 mm");
}
END_TEST

typedef struct
{
  const char *key;
  const char *text;
  const char *expect;   /* part of the reason */
} Refusal;

/* Each refusal keeps the document as it was and says why. */
static const Refusal refusals[] = {
  { "bore", "-3 mm", "negative" },
  { "bore", "0 mm", "Bore" },          /* pl_param_spec_check_number: > 0 */
  { "length", "22 psi", NULL },        /* NULL: the quantity's phrase */
  { "bore", "12,5 mm", "12,5" },       /* '.' locale: a ',' is thousands only */
  { "bore", "", NULL },
};

START_TEST (test_refusals_leave_document)
{
  const Refusal *r = &refusals[_i];
  PlParamRow *row = select_and_get_row ("p3", r->key);
  double before = number_of ("p3", r->key);
  guint64 revision = pl_document_get_revision (doc);
  const char *reason;

  ck_assert (!pl_param_row_commit_text (row, r->text));
  ck_assert (number_of ("p3", r->key) == before);
  ck_assert_uint_eq (pl_document_get_revision (doc), revision);
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 0);
  reason = pl_param_row_get_reason (row);
  ck_assert_ptr_nonnull (reason);
  ck_assert (gtk_widget_has_css_class (pl_param_row_get_editor (row), "error"));
  if (r->expect != NULL)
    ck_assert_msg (strstr (reason, r->expect) != NULL, "%s", reason);
  else if (r->text[0] != '\0')
    ck_assert_msg (strstr (reason, pl_quantity_get_phrase (PL_QUANTITY_LINE_LENGTH)) != NULL,
                   "%s", reason);

  /* A good value afterwards clears the reason. */
  ck_assert (pl_param_row_commit_text (row, "10 mm"));
  ck_assert_ptr_null (pl_param_row_get_reason (row));
}
END_TEST

/* Holding the arrow: every step reaches the document, the run is one step. */
START_TEST (test_spin_run_is_one_undo_step)
{
  PlParamRow *row = select_and_get_row ("p3", "bore");
  GtkSpinButton *spin = GTK_SPIN_BUTTON (pl_param_row_get_editor (row));
  double before = number_of ("p3", "bore"), last = before;

  for (int i = 0; i < 5; i++)
    {
      gtk_spin_button_spin (spin, GTK_SPIN_STEP_FORWARD, 0.0);
      iterate ();
      ck_assert (number_of ("p3", "bore") > last);
      last = number_of ("p3", "bore");
    }
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 1);
  ck_assert (pl_undo_stack_undo (undo));
  ck_assert (number_of ("p3", "bore") == before);
}
END_TEST

START_TEST (test_scenario_without_selection)
{
  GtkWidget *law, *consistency, *viscosity;

  pl_inspector_set_selection (inspector, NULL);
  ck_assert_str_eq (pl_inspector_get_title (inspector), "Scenario");
  ck_assert_ptr_nonnull (pl_inspector_get_row (inspector, "density"));
  ck_assert_ptr_nonnull (pl_inspector_get_row (inspector, "air-pressure"));
  ck_assert_ptr_nonnull (pl_inspector_get_row (inspector, "cycle-rate"));
  ck_assert_ptr_nonnull (pl_inspector_get_row (inspector, "work-order"));
  ck_assert_ptr_null (pl_inspector_get_row (inspector, "tag"));

  /* Relevance follows the viscosity law: the drop-down is the editor. */
  law = pl_param_row_get_editor (PL_PARAM_ROW (pl_inspector_get_row (inspector,
                                                                     "viscosity-law")));
  consistency = pl_inspector_get_row (inspector, "consistency");
  viscosity = pl_inspector_get_row (inspector, "viscosity");
  gtk_drop_down_set_selected (GTK_DROP_DOWN (law), 0);
  iterate ();
  ck_assert (gtk_widget_get_visible (viscosity));
  ck_assert (!gtk_widget_get_visible (consistency));
  gtk_drop_down_set_selected (GTK_DROP_DOWN (law), 1);
  iterate ();
  ck_assert_str_eq (pl_part_get_choice_key (pl_document_get_scenario (doc), "viscosity-law"),
                    "power-law");
  ck_assert (!gtk_widget_get_visible (viscosity));
  ck_assert (gtk_widget_get_visible (consistency));
  /* Undo moves the drop-down back. */
  ck_assert (pl_undo_stack_undo (undo));
  iterate ();
  ck_assert_uint_eq (gtk_drop_down_get_selected (GTK_DROP_DOWN (law)),
                     pl_part_get_choice (pl_document_get_scenario (doc), "viscosity-law"));

  /* A title field is a text. */
  ck_assert (pl_param_row_commit_text (PL_PARAM_ROW (pl_inspector_get_row (inspector,
                                                                           "work-order")),
                                       "WO-77"));
  ck_assert_str_eq (pl_part_get_text (pl_document_get_title (doc), "work-order"), "WO-77");
}
END_TEST

START_TEST (test_tag_and_multiple_selection)
{
  PlParamRow *tag = select_and_get_row ("p9", "tag");
  const char *two[] = { "p3", "p9", NULL };

  ck_assert (!pl_param_row_commit_text (tag, "H1"));   /* p3 has it */
  ck_assert_ptr_nonnull (pl_param_row_get_reason (tag));
  ck_assert_str_eq (pl_part_get_tag (pl_document_find_part (doc, "p9")), "H3");
  ck_assert (pl_param_row_commit_text (tag, "H30"));
  ck_assert_str_eq (pl_inspector_get_title (inspector), "H30");

  pl_inspector_set_selection (inspector, two);
  ck_assert_str_eq (pl_inspector_get_title (inspector), "2 parts selected");
  ck_assert_ptr_null (pl_inspector_get_row (inspector, "bore"));
}
END_TEST

START_TEST (test_results_follow_and_go_stale)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  g_autofree char *text = NULL;
  g_autofree char *expect = NULL;
  double p = 0.0, mass = 0.0;
  const char *ids[] = { "p17", NULL };

  ck_assert_ptr_nonnull (results);
  pl_inspector_set_selection (inspector, ids);
  pl_inspector_set_results (inspector, results, FALSE);
  text = pl_inspector_dup_results_text (inspector);

  /* The applicator's idle pressure as the results give it, in bar. */
  ck_assert (pl_results_get_port_pressure (results, "p17", "in", PL_PRESSURE_IDLE, &p));
  expect = pl_unit_format_number (p, PL_QUANTITY_PRESSURE, NULL, PL_UNIT_DEFAULT_DIGITS, '.');
  ck_assert_msg (strstr (text, expect) != NULL, "%s not in\n%s", expect, text);
  /* The shot mass once the cycle has run; a dash while it has not (or if
   * the solver could not run it). */
  g_free (expect);
  if (pl_results_get_shot (results, "p17", &mass, NULL, NULL))
    {
      g_autofree char *m = pl_unit_format (mass, PL_QUANTITY_MASS, NULL,
                                           PL_UNIT_DEFAULT_DIGITS, '.');
      expect = g_strdup_printf ("Shot mass\t%s", m);
    }
  else
    expect = g_strdup ("Shot mass\t–");
  ck_assert_msg (strstr (text, expect) != NULL, "%s not in\n%s", expect, text);
  ck_assert (strstr (text, "Results out of date") == NULL);
  ck_assert (!pl_inspector_get_results_stale (inspector));
  save_screenshot ("inspector-applicator-light");

  pl_inspector_set_results (inspector, results, TRUE);
  g_free (text);
  text = pl_inspector_dup_results_text (inspector);
  ck_assert (pl_inspector_get_results_stale (inspector));
  ck_assert_msg (strstr (text, "Results out of date") != NULL, "%s", text);
  save_screenshot ("inspector-applicator-stale-light");

  /* No results at all: dashes, no crash. */
  pl_inspector_set_results (inspector, NULL, FALSE);
  g_free (text);
  text = pl_inspector_dup_results_text (inspector);
  ck_assert (strstr (text, "–") != NULL);
}
END_TEST

/* Screenshots of a hose with a refusal shown, and of the scenario, in both
 * styles and in US units. */
START_TEST (test_screenshots)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  GtkSettings *settings = gtk_settings_get_default ();
  PlUnitPrefs us;
  const char *ids[] = { "p3", NULL };

  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  for (int dark = 0; dark < 2; dark++)
    {
      g_autofree char *a = g_strdup_printf ("inspector-hose-%s", dark ? "dark" : "light");
      g_autofree char *b = g_strdup_printf ("inspector-scenario-%s", dark ? "dark" : "light");
      g_autofree char *c = g_strdup_printf ("inspector-hose-us-%s", dark ? "dark" : "light");

      g_object_set (settings, "gtk-application-prefer-dark-theme", dark, NULL);
      pl_inspector_set_context (inspector, doc, undo, NULL);
      pl_inspector_set_selection (inspector, ids);
      pl_inspector_set_results (inspector, results, FALSE);
      pl_param_row_commit_text (PL_PARAM_ROW (pl_inspector_get_row (inspector, "length")),
                                "22 psi");
      save_screenshot (a);
      pl_inspector_set_selection (inspector, NULL);
      save_screenshot (b);
      pl_inspector_set_context (inspector, doc, undo, &us);
      pl_inspector_set_selection (inspector, ids);
      pl_inspector_set_results (inspector, results, FALSE);
      save_screenshot (c);
    }
  g_object_set (settings, "gtk-application-prefer-dark-theme", FALSE, NULL);
}
END_TEST

static Suite *
inspector_suite (void)
{
  Suite *s = suite_create ("inspector");
  TCase *tc = tcase_create ("inspector");

  tcase_set_timeout (tc, 60);
  tcase_add_checked_fixture (tc, setup, teardown);
  tcase_add_test (tc, test_bore_typed_in_inches);
  tcase_add_test (tc, test_bore_typed_into_spin_button);
  tcase_add_loop_test (tc, test_refusals_leave_document, 0, G_N_ELEMENTS (refusals));
  tcase_add_test (tc, test_spin_run_is_one_undo_step);
  tcase_add_test (tc, test_scenario_without_selection);
  tcase_add_test (tc, test_tag_and_multiple_selection);
  tcase_add_test (tc, test_results_follow_and_go_stale);
  tcase_add_test (tc, test_screenshots);
  suite_add_tcase (s, tc);
  return s;
}

int
main (int argc, char **argv)
{
  gtk_init ();
  return pl_check_run (inspector_suite ());
}
