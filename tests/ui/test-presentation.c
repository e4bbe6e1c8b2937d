/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The presentation mode under Xvfb on the starved carton-sealing sample:
 * enter with the editor's action, play the firing cycle on the frame
 * clock, scrub to the moment of the far applicator's lowest pressure and
 * read its big readout against the solver's cycle minimum, pin a
 * baseline, widen the supply hose with the what-if slider (one undo step
 * for one drag) and check the before/after change has the physical sign,
 * replay the shutdown, leave with Escape's action.  Screenshots of each
 * state land in BUILD/tests/ui/screenshots.
 *
 * References: the readout shows three significant digits
 * (pl_unit_format), so it may differ from the sampled pressure by half a
 * unit of its last digit; the sampled minimum lies at or above the
 * solver's minimum (tracked at every step; pl-results-series.h).  The
 * sign: a wider bore lowers the hose's friction drop (Rabinowitsch-Mooney
 * for a power-law fluid; Chhabra & Richardson, Non-Newtonian Flow in the
 * Process Industries, eq. 3.9), so the far applicator's lowest pressure
 * rises.
 */

#include "config.h"

#include <gtk/gtk.h>
#include <math.h>
#include <string.h>

#include "pl-application.h"
#include "pl-check.h"
#include "pl-command.h"
#include "pl-presentation.h"
#include "pl-results-series.h"
#include "pl-ui-test.h"
#include "pl-window.h"

static PlWindow *
open_sample (const char *name)
{
  g_autofree char *path = g_build_filename ("samples", name, NULL);
  PlWindow *window = pl_ui_test_open_window (app, path);

  pl_ui_test_wait_for_full (window);
  return window;
}

/* Enters presentation mode through the editor's action (F5). */
static PlPresentation *
enter (PlWindow *window)
{
  PlPresentation *p = NULL;
  g_autoptr (GList) tops = NULL;

  ck_assert (gtk_widget_activate_action (GTK_WIDGET (window), "win.present", NULL));
  tops = gtk_window_list_toplevels ();
  for (GList *l = tops; l != NULL; l = l->next)
    if (PL_IS_PRESENTATION (l->data))
      p = l->data;
  ck_assert_ptr_nonnull (p);
  /* Xvfb has no window manager to honour full screen: the size the
   * presentation is designed for. */
  gtk_window_unfullscreen (GTK_WINDOW (p));
  gtk_window_set_default_size (GTK_WINDOW (p), 1600, 1000);
  for (int i = 0; i < 500 && !gtk_widget_get_mapped (GTK_WIDGET (p)); i++)
    g_main_context_iteration (NULL, TRUE);
  pl_ui_test_spin (150);
  return p;
}

/* Leaves presentation mode once the worker is done, and closes the
 * window without asking about the what-if edits. */
static void
leave_and_close (PlWindow *window, PlPresentation *p)
{
  pl_ui_test_wait_for_full (window);
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (p), "presentation.leave", NULL));
  pl_undo_stack_mark_clean (pl_window_get_undo_stack (window));
  gtk_window_destroy (GTK_WINDOW (window));
  pl_ui_test_spin (10);
}

/* The layout's first accumulator, or NULL. */
static const PlPart *
first_accumulator (PlDocument *doc)
{
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    if (pl_part_get_part_type (pl_document_get_part (doc, i))->kind == PL_PART_ACCUMULATOR)
      return pl_document_get_part (doc, i);
  return NULL;
}

static double
readout_si (PlPresentation *p, const char *part_id)
{
  const char *text = pl_presentation_get_readout (p, part_id);
  g_autoptr (GError) error = NULL;
  double v = NAN;

  ck_assert_ptr_nonnull (text);
  ck_assert_msg (pl_unit_parse (text, PL_QUANTITY_PRESSURE, NULL, PL_UNIT_DECIMAL_FROM_LOCALE,
                                &v, &error), "readout \"%s\": %s", text,
                 error ? error->message : "");
  return v;
}

/* Half a unit of the third significant digit of v. */
static double
display_rounding (double v)
{
  return 0.5 * pow (10.0, floor (log10 (fabs (v))) - 2.0);
}

START_TEST (test_teach_the_starved_line)
{
  PlWindow *window = open_sample ("carton-sealer-starved.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlPresentation *p = enter (window);
  const PlReplay *replay = pl_presentation_get_replay (p);
  GtkRange *scrubber = pl_presentation_get_scrubber (p);
  const char *far = pl_part_get_id (pl_document_find_part_by_tag (doc, "N4"));
  PlResults *full = pl_solve_scheduler_get_full_results (pl_window_get_scheduler (window));
  double t_min, p_min, cycle_min, shown, period, mean_us, bore0, on_time;
  gint64 max_us;
  guint n_frames, n_undo;
  GtkRange *bore;
  GArray *rows;

  /* Idle: the cycle's length is known, the clock stands at 0. */
  ck_assert (pl_results_get_run_length (full, PL_RUN_CYCLE, &period));
  ck_assert_double_eq_tol (pl_replay_get_duration (replay), period, 1e-12);
  ck_assert (!pl_replay_is_playing (replay));
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-idle.png");

  /* Play on the frame clock: time moves, frames come. */
  pl_presentation_reset_frame_stats (p);
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (p), "presentation.play-pause", NULL));
  ck_assert (pl_replay_is_playing (replay));
  pl_ui_test_spin (1500);
  n_frames = pl_presentation_get_frame_stats (p, &mean_us, &max_us);
  printf ("figure: replay on the frame clock: %u frames in 1.5 s, mean interval %.1f ms, "
          "longest %.1f ms (Xvfb, machine shared)\n", n_frames, mean_us / 1e3, max_us / 1e3);
  ck_assert_uint_gt (n_frames, 10);
  ck_assert_double_gt (pl_replay_get_position (replay), 0.0);
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (p), "presentation.play-pause", NULL));
  ck_assert (!pl_replay_is_playing (replay));

  /* Mid-shot. */
  on_time = pl_part_get_number (pl_document_get_scenario (doc), "on-time");
  gtk_range_set_value (scrubber, 0.5 * on_time);
  pl_ui_test_spin (100);
  ck_assert_double_eq_tol (pl_replay_get_position (replay), 0.5 * on_time, 1e-9);
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-mid-shot.png");

  /* Scrub to the far applicator's lowest pressure: the readout is the
   * solver's minimum within display rounding. */
  ck_assert (pl_results_get_port_min_time (full, far, "in", PL_RUN_CYCLE, &t_min, &p_min));
  ck_assert (pl_results_get_port_pressure (full, far, "in", PL_PRESSURE_CYCLE_MIN, &cycle_min));
  gtk_range_set_value (scrubber, t_min);
  pl_ui_test_spin (50);
  shown = readout_si (p, far);
  printf ("figure: N4 lowest: solver %.4g Pa, sampled %.4g Pa at %.4g s, readout \"%s\"\n",
          cycle_min, p_min, t_min, pl_presentation_get_readout (p, far));
  ck_assert_double_le (fabs (shown - cycle_min),
                       display_rounding (shown) + (p_min - cycle_min) + 1e-6 * fabs (cycle_min));

  /* Pin, then widen the hose by dragging the what-if slider: one step. */
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (p), "presentation.pin", NULL));
  ck_assert_ptr_nonnull (pl_presentation_get_baseline (p));
  bore = pl_what_if_get_control (pl_presentation_get_what_if (p), PL_WHAT_IF_HOSE_BORE);
  ck_assert_ptr_nonnull (bore);
  bore0 = pl_part_get_number (pl_document_find_part_by_tag (doc, "H1"), "bore");
  ck_assert_double_eq_tol (bore0, 6.35e-3, 1e-9);   /* 1/4 in */
  n_undo = pl_undo_stack_get_n_undo (undo);
  for (double d = 7e-3; d <= 9.6e-3; d += 0.8e-3)
    {
      gtk_range_set_value (bore, d);
      pl_ui_test_spin (30);
    }
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), n_undo + 1);
  ck_assert_double_gt (pl_part_get_number (pl_document_find_part_by_tag (doc, "H1"), "bore"),
                       9e-3);
  pl_ui_test_wait_for_full (window);
  pl_ui_test_spin (100);
  rows = pl_baseline_table_get_rows (pl_presentation_get_baseline_table (p));
  ck_assert_ptr_nonnull (rows);
  for (guint i = 0; i < rows->len; i++)
    {
      const PlBaselineRow *r = &g_array_index (rows, PlBaselineRow, i);

      if (g_strcmp0 (r->part_id, far) != 0)
        continue;
      printf ("figure: N4 lowest in cycle before %.4g Pa, after %.4g Pa, change \"%s\"\n",
              r->before[PL_BASELINE_CYCLE_MIN], r->after[PL_BASELINE_CYCLE_MIN],
              pl_baseline_table_get_change_text (pl_presentation_get_baseline_table (p), far,
                                                 PL_BASELINE_CYCLE_MIN));
      ck_assert_double_gt (r->difference[PL_BASELINE_CYCLE_MIN], 0.0);
      ck_assert_double_gt (r->difference[PL_BASELINE_SHOT_MASS], 0.0);
    }
  ck_assert (g_str_has_prefix (pl_baseline_table_get_change_text (
                                 pl_presentation_get_baseline_table (p), far,
                                 PL_BASELINE_CYCLE_MIN), "▲ +"));
  gtk_range_set_value (scrubber, 0.5 * on_time);
  pl_ui_test_spin (100);
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-baseline.png");

  /* The shutdown: its own length, the pressure falls from idle. */
  gtk_toggle_button_set_active (pl_presentation_get_run_button (p, PL_RUN_SHUTDOWN), TRUE);
  pl_ui_test_spin (50);
  ck_assert_int_eq (replay->run, PL_RUN_SHUTDOWN);
  {
    double length, idle, mid;

    full = pl_solve_scheduler_get_full_results (pl_window_get_scheduler (window));
    ck_assert (pl_results_get_run_length (full, PL_RUN_SHUTDOWN, &length));
    ck_assert_double_eq_tol (pl_replay_get_duration (replay), length, 1e-12);
    gtk_range_set_value (scrubber, 0.5 * length);
    pl_ui_test_spin (100);
    mid = readout_si (p, far);
    ck_assert (pl_results_get_port_pressure (full, far, "in", PL_PRESSURE_IDLE, &idle));
    ck_assert_double_lt (mid, idle);
  }
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-shutdown.png");

  /* The widening is one undo step back to 1/4 in. */
  ck_assert (pl_undo_stack_undo (undo));
  ck_assert_double_eq (pl_part_get_number (pl_document_find_part_by_tag (doc, "H1"), "bore"),
                       bore0);

  /* Leave (Escape and F5 are bound to this action). */
  ck_assert (gtk_widget_activate_action (GTK_WIDGET (p), "presentation.leave", NULL));
  pl_ui_test_spin (50);
  {
    g_autoptr (GList) tops = gtk_window_list_toplevels ();

    for (GList *l = tops; l != NULL; l = l->next)
      ck_assert (!PL_IS_PRESENTATION (l->data));
  }
  pl_undo_stack_mark_clean (undo);
  gtk_window_destroy (GTK_WINDOW (window));
  pl_ui_test_spin (10);
}
END_TEST

/* The accumulator switch removes and puts back the accumulator of the
 * demo as two undo steps, and the demo's gauge gets a readout. */
START_TEST (test_accumulator_switch_and_gauge)
{
  PlWindow *window = open_sample ("demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlPresentation *p = enter (window);
  GtkSwitch *sw = pl_what_if_get_accumulator_switch (pl_presentation_get_what_if (p));
  const char *gauge = pl_part_get_id (pl_document_find_part_by_tag (doc, "G1"));
  guint n_parts = pl_document_get_n_parts (doc), n_wires = pl_document_get_n_wires (doc);
  guint n_undo = pl_undo_stack_get_n_undo (undo);

  ck_assert_ptr_nonnull (pl_presentation_get_readout (p, gauge));
  ck_assert_str_ne (pl_presentation_get_readout (p, gauge), "–");
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-demo.png");
  ck_assert (gtk_switch_get_active (sw));
  gtk_switch_set_active (sw, FALSE);
  pl_ui_test_spin (20);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts - 1);
  ck_assert_ptr_null (pl_document_find_part_by_tag (doc, "A1"));
  gtk_switch_set_active (sw, TRUE);
  pl_ui_test_spin (20);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts);
  ck_assert_uint_eq (pl_document_get_n_wires (doc), n_wires);
  ck_assert_ptr_nonnull (pl_document_find_part_by_tag (doc, "A1"));
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), n_undo + 2);
  leave_and_close (window, p);
}
END_TEST

/* On the starved line, which has no accumulator, the switch fits one as
 * a what-if at the manifold's feed node with the precharge control's
 * value, says by which rule, lifts the lowest manifold pressure of the
 * firing cycle, and one undo takes it out again. */
START_TEST (test_fit_accumulator_to_starved_line)
{
  PlWindow *window = open_sample ("carton-sealer-starved.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlSolveScheduler *scheduler = pl_window_get_scheduler (window);
  PlPresentation *p = enter (window);
  PlWhatIf *what_if = pl_presentation_get_what_if (p);
  GtkSwitch *sw = pl_what_if_get_accumulator_switch (what_if);
  GtkRange *precharge = pl_what_if_get_control (what_if, PL_WHAT_IF_PRECHARGE);
  const char *feed = pl_part_get_id (pl_document_find_part_by_tag (doc, "H1"));
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  guint n_parts = pl_document_get_n_parts (doc), n_undo = pl_undo_stack_get_n_undo (undo);
  const PlPart *acc = NULL;
  double min_before, min_after;

  ck_assert (pl_results_get_port_pressure (pl_solve_scheduler_get_full_results (scheduler),
                                           feed, "b", PL_PRESSURE_CYCLE_MIN, &min_before));
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-starved-before-fit.png");
  ck_assert (!gtk_switch_get_active (sw));
  ck_assert (gtk_widget_get_sensitive (GTK_WIDGET (sw)));
  ck_assert (gtk_widget_get_sensitive (GTK_WIDGET (precharge)));
  /* 300 bar on the precharge control is far above the idle pressure: on
   * is refused with the reason, nothing is added, the control stays. */
  gtk_range_set_value (precharge, log10 (300e5));
  gtk_switch_set_active (sw, TRUE);
  pl_ui_test_spin (20);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts);
  ck_assert (!gtk_switch_get_active (sw));
  ck_assert_msg (strstr (pl_what_if_get_message (what_if), "precharge") != NULL, "message: %s",
                 pl_what_if_get_message (what_if));
  ck_assert (gtk_widget_get_sensitive (GTK_WIDGET (precharge)));
  /* 20 bar on the precharge control, then on. */
  gtk_range_set_value (precharge, log10 (20e5));
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), n_undo);
  gtk_switch_set_active (sw, TRUE);
  pl_ui_test_spin (20);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts + 1);
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), n_undo + 1);
  acc = first_accumulator (doc);
  ck_assert_ptr_nonnull (acc);
  ck_assert_double_eq_tol (pl_part_get_number (acc, "precharge"), 20e5, 1e3);
  ck_assert (gtk_switch_get_active (sw));
  ck_assert_msg (strstr (pl_what_if_get_fit_note (what_if), "common practice, no source")
                 != NULL, "note: %s", pl_what_if_get_fit_note (what_if));
  pl_ui_test_wait_for_full (window);
  ck_assert (pl_results_get_port_pressure (pl_solve_scheduler_get_full_results (scheduler),
                                           feed, "b", PL_PRESSURE_CYCLE_MIN, &min_after));
  ck_assert_msg (min_after > min_before, "%g Pa, was %g Pa", min_after, min_before);
  pl_ui_test_spin (300);
  pl_ui_test_save_shot (GTK_WIDGET (p), "presentation-starved-after-fit.png");
  ck_assert (pl_undo_stack_undo (undo));
  ck_assert (pl_document_equal (doc, before));
  ck_assert (!gtk_switch_get_active (sw));
  ck_assert_str_eq (pl_what_if_get_fit_note (what_if), "");
  leave_and_close (window, p);
}
END_TEST

/* The on-time slider ends where the document stops taking it: the firing
 * period less the closing time (the starved line: 4 shots a second, 3 ms
 * closing, no firing delays: 250 - 3 = 247 ms; arithmetic on the sample's
 * figures), follows a change of the firing rate, and says why in its
 * tooltip. */
START_TEST (test_on_time_capped_by_firing_period)
{
  PlWindow *window = open_sample ("carton-sealer-starved.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlPresentation *p = enter (window);
  PlWhatIf *what_if = pl_presentation_get_what_if (p);
  GtkRange *on_time = pl_what_if_get_control (what_if, PL_WHAT_IF_ON_TIME);
  GtkAdjustment *adj = gtk_range_get_adjustment (on_time);
  g_autoptr (PlCommand) faster = pl_command_new_set_scenario_number ("cycle-rate", 5.0);
  const PlPart *scenario = pl_document_get_scenario (doc);
  double top;

  /* Slider positions are log10 of seconds; the test reads them back. */
  top = pow (10.0, gtk_adjustment_get_upper (adj));
  ck_assert_double_eq_tol (top, 0.247, 1e-9);
  ck_assert_msg (strstr (gtk_widget_get_tooltip_text (GTK_WIDGET (on_time)), "0.247 s")
                 != NULL, "tooltip: %s", gtk_widget_get_tooltip_text (GTK_WIDGET (on_time)));
  gtk_range_set_value (on_time, log10 (0.3));
  pl_ui_test_spin (20);
  ck_assert_str_eq (pl_what_if_get_message (what_if), "");
  ck_assert_double_eq_tol (pl_part_get_number (scenario, "on-time"), 0.247, 1e-9);
  ck_assert (pl_undo_stack_undo (undo));

  /* 5 shots a second: 200 - 3 = 197 ms. */
  ck_assert (pl_undo_stack_push (undo, faster, NULL));
  pl_ui_test_spin (20);
  top = pow (10.0, gtk_adjustment_get_upper (adj));
  ck_assert_double_eq_tol (top, 0.197, 1e-9);
  gtk_range_set_value (on_time, log10 (0.3));
  pl_ui_test_spin (20);
  ck_assert_str_eq (pl_what_if_get_message (what_if), "");
  ck_assert_double_eq_tol (pl_part_get_number (scenario, "on-time"), 0.197, 1e-9);
  leave_and_close (window, p);
}
END_TEST

static Suite *
presentation_suite (void)
{
  Suite *s = suite_create ("presentation");
  TCase *tc = tcase_create ("teach");

  /* One application for the suite: a second one could not take the
   * first one's bus object while a window of it is still finalizing. */
  tcase_add_unchecked_fixture (tc, pl_ui_test_app_setup, pl_ui_test_app_teardown);
  tcase_set_timeout (tc, 200);
  tcase_add_test (tc, test_teach_the_starved_line);
  tcase_add_test (tc, test_accumulator_switch_and_gauge);
  tcase_add_test (tc, test_fit_accumulator_to_starved_line);
  tcase_add_test (tc, test_on_time_capped_by_firing_period);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  gtk_init ();
  return pl_check_run (presentation_suite ());
}
