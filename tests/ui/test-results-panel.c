/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The results panel under a display, fed by pl_solve_scheduler_solve_sync
 * on the samples: a row per port and per part with the figures the results
 * give, findings in the user's units that name their part when activated,
 * plots that draw, stale results dimmed, and no cycle figure beside a newer
 * steady solution.
 */

#include "config.h"

#include <gtk/gtk.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pl-command.h"
#include "pl-findings-list.h"
#include "pl-layout-reader.h"
#include "pl-plot.h"
#include "pl-results-panel.h"
#include "pl-solve-scheduler.h"
#include "pl-ui-test.h"
#include "pl-undo-stack.h"

static const char *const samples[] = {
  "demo-glue-line.pline",
  "carton-sealer-retrofit.pline",
  "carton-sealer-starved.pline",
};

static PlDocument *doc;
static PlResults *results;
static GtkWidget *window;
static PlResultsPanel *panel;

static void
iterate (void)
{
  for (int i = 0; i < 50 && g_main_context_pending (NULL); i++)
    g_main_context_iteration (NULL, FALSE);
}

static void
open_sample (const char *name)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "samples",
                                            name, NULL);

  doc = pl_layout_read_file (path, &error);
  ck_assert_msg (doc != NULL, "%s", error ? error->message : "");
  results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  ck_assert_msg (results != NULL, "%s", error ? error->message : "");
  window = gtk_window_new ();
  gtk_window_set_default_size (GTK_WINDOW (window), 1100, 420);
  panel = PL_RESULTS_PANEL (pl_results_panel_new ());
  gtk_window_set_child (GTK_WINDOW (window), GTK_WIDGET (panel));
  pl_results_panel_set_context (panel, doc, NULL);
  pl_results_panel_set_results (panel, results, results, FALSE);
  gtk_window_present (GTK_WINDOW (window));
  iterate ();
}

static void
close_sample (void)
{
  gtk_window_destroy (GTK_WINDOW (window));
  iterate ();
  g_clear_pointer (&results, pl_results_unref);
  g_clear_object (&doc);
}

/* The window as BUILD/tests/ui/screenshots/NAME.png, for people to look at. */
static void
save_screenshot (const char *name)
{
  g_autofree char *file = g_strdup_printf ("%s.png", name);

  pl_ui_test_save_shot (GTK_WIDGET (window), file);
}

START_TEST (test_tables_have_a_row_per_port_and_part)
{
  PlCompiled *compiled;
  guint ports = 0;

  open_sample (samples[_i]);
  compiled = pl_results_get_compiled (results);
  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    ports += pl_compiled_get_part (compiled, i)->type->n_ports;
  ck_assert_uint_eq (pl_compiled_get_n_parts (compiled), pl_document_get_n_parts (doc));
  ck_assert_uint_eq (pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_POINTS), ports);
  ck_assert_uint_eq (pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_PARTS),
                     pl_document_get_n_parts (doc));

  /* Every point row shows exactly what the results hold for it. */
  for (guint r = 0, k = 0; r < pl_compiled_get_n_parts (compiled); r++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, r);

      ck_assert_str_eq (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_PARTS, r, 0),
                        part->tag);
      ck_assert_str_eq (pl_results_panel_get_row_part_id (panel, PL_RESULTS_TABLE_PARTS, r),
                        part->id);
      for (guint p = 0; p < part->type->n_ports; p++, k++)
        {
          static const PlPressureKind kinds[] = { PL_PRESSURE_IDLE, PL_PRESSURE_STEADY_OPEN,
                                                  PL_PRESSURE_CYCLE_MIN,
                                                  PL_PRESSURE_CYCLE_MAX };

          ck_assert_str_eq (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, k, 0),
                            part->tag);
          for (guint c = 0; c < G_N_ELEMENTS (kinds); c++)
            {
              double v = NAN;
              g_autofree char *expect = NULL;

              if (!pl_results_get_port_pressure (results, part->id, part->type->ports[p].key,
                                                 kinds[c], &v))
                expect = g_strdup ("–");
              else
                expect = pl_unit_format_number (v, PL_QUANTITY_PRESSURE, NULL,
                                                PL_UNIT_DEFAULT_DIGITS, '.');
              ck_assert_str_eq (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, k,
                                                           2 + c), expect);
            }
        }
    }
  close_sample ();
}
END_TEST

static void
part_activated_cb (PlResultsPanel *p, const char *part_id, char **out)
{
  g_free (*out);
  *out = g_strdup (part_id);
}

START_TEST (test_finding_activation_names_part)
{
  g_autofree char *got = NULL;
  guint n;
  const PlFinding *first;

  open_sample ("carton-sealer-starved.pline");
  n = pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_FINDINGS);
  ck_assert_uint_eq (n, pl_results_get_n_findings (results));
  ck_assert_uint_gt (n, 0);
  first = pl_results_get_finding (results, 0);
  ck_assert_ptr_nonnull (first->part_id);

  g_signal_connect (panel, "part-activated", G_CALLBACK (part_activated_cb), &got);
  pl_results_panel_show_page (panel, "findings");
  iterate ();
  g_signal_emit_by_name (pl_results_panel_get_view (panel, PL_RESULTS_TABLE_FINDINGS),
                         "activate", 0u);
  ck_assert_ptr_nonnull (got);
  ck_assert_str_eq (got, first->part_id);

  /* A table row does the same. */
  g_clear_pointer (&got, g_free);
  g_signal_emit_by_name (pl_results_panel_get_view (panel, PL_RESULTS_TABLE_PARTS),
                         "activate", 2u);
  ck_assert_str_eq (got, pl_results_panel_get_row_part_id (panel, PL_RESULTS_TABLE_PARTS, 2));
  save_screenshot ("results-findings-light");
  close_sample ();
}
END_TEST

/* Sentences use the user's units: in US units no known pressure finding
 * keeps the solver's MPa, and every one names its part's tag. */
START_TEST (test_findings_in_user_units)
{
  PlUnitPrefs us;
  guint checked = 0;

  open_sample (samples[_i]);
  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      g_autofree char *s = pl_finding_format_sentence (f, results, &us);
      const PlCompiledPart *part = f->part_id != NULL
                                   ? pl_compiled_find_part (pl_results_get_compiled (results),
                                                            f->part_id)
                                   : NULL;

      ck_assert (s != NULL && s[0] != '\0');
      if (g_str_equal (f->code, "rating-exceeded") || g_str_equal (f->code, "gauge-range-low")
          || g_str_equal (f->code, "gauge-range-high")
          || g_str_equal (f->code, "precharge-too-low")
          || g_str_equal (f->code, "precharge-too-high")
          || g_str_equal (f->code, "trapped-pressure"))
        {
          ck_assert_msg (strstr (s, "MPa") == NULL && strstr (s, "psi") != NULL, "%s", s);
          checked++;
        }
      if (part != NULL)
        ck_assert_msg (strstr (s, part->tag) != NULL, "%s lacks %s", s, part->tag);
    }
  (void) checked;
  close_sample ();
}
END_TEST

/* Counts pixels near a colour (8-bit channels within tol). */
static guint
count_color (cairo_surface_t *surface, double r, double g, double b)
{
  const unsigned char *data = cairo_image_surface_get_data (surface);
  int stride = cairo_image_surface_get_stride (surface);
  guint n = 0;

  for (int y = 0; y < cairo_image_surface_get_height (surface); y++)
    for (int x = 0; x < cairo_image_surface_get_width (surface); x++)
      {
        const unsigned char *px = data + y * stride + 4 * x;   /* B G R A */

        if (abs (px[2] - (int) (r * 255)) < 24 && abs (px[1] - (int) (g * 255)) < 24
            && abs (px[0] - (int) (b * 255)) < 24 && px[3] > 200)
          n++;
      }
  return n;
}

START_TEST (test_plots_draw)
{
  PlPlot *cycle, *shut;
  guint expected = 0;
  PlCompiled *compiled;
  g_autofree char *dir = g_build_filename (g_getenv ("PRESSLINE_BUILD_ROOT"), "tests", "ui",
                                           "screenshots", NULL);

  /* This sample's cycle runs with every solver revision so far. */
  open_sample ("carton-sealer-retrofit.pline");
  ck_assert_ptr_nonnull (pl_results_get_cycle (results));
  compiled = pl_results_get_compiled (results);
  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *part = pl_compiled_get_part (compiled, i);

      if (part->type->kind == PL_PART_GAUGE || part->type->kind == PL_PART_APPLICATOR)
        expected++;
    }
  cycle = pl_results_panel_get_plot (panel, FALSE);
  shut = pl_results_panel_get_plot (panel, TRUE);
  ck_assert_uint_eq (pl_plot_get_n_series (cycle), expected);
  ck_assert_uint_eq (pl_plot_get_n_series (shut), expected);

  /* Drawn off screen: the first series' colour (Okabe-Ito blue on a light
   * background) must cover a line's worth of pixels. */
  {
    cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 800, 300);
    cairo_t *cr = cairo_create (surface);
    g_autofree char *file = NULL;

    cairo_set_source_rgb (cr, 1, 1, 1);
    cairo_paint (cr);
    pl_plot_draw (cycle, cr, 800, 300);
    cairo_destroy (cr);
    cairo_surface_flush (surface);
    g_mkdir_with_parents (dir, 0755);
    file = g_build_filename (dir, "plot-cycle-offscreen.png", NULL);
    ck_assert_int_eq (cairo_surface_write_to_png (surface, file), CAIRO_STATUS_SUCCESS);
    ck_assert_uint_gt (count_color (surface, 0.0, 0.447, 0.698), 150);
    cairo_surface_destroy (surface);
  }

  /* Only two chosen ports. */
  {
    const char *two[] = { "p1/out", "p13/in", NULL };

    pl_results_panel_set_plotted (panel, two);
    ck_assert_uint_eq (pl_plot_get_n_series (cycle), 2);
    pl_results_panel_set_plotted (panel, NULL);
    ck_assert_uint_eq (pl_plot_get_n_series (cycle), expected);
  }
  close_sample ();
}
END_TEST

/* A newer steady solution with the old full one: the cycle columns stay
 * empty rather than mixing revisions; stale dims the panel. */
START_TEST (test_no_mixed_revisions_and_stale)
{
  g_autoptr (PlUndoStack) undo = NULL;
  g_autoptr (PlCommand) cmd = pl_command_new_set_number ("p3", "bore", 0.0127);
  g_autoptr (PlCompiled) compiled = NULL;
  g_autoptr (PlResults) fast = NULL;
  g_autoptr (GError) error = NULL;

  open_sample ("demo-glue-line.pline");
  undo = pl_undo_stack_new (doc);
  ck_assert (pl_undo_stack_push (undo, cmd, &error));
  compiled = pl_compile (doc);
  fast = pl_results_solve_fast (compiled);
  pl_results_panel_set_results (panel, fast, results, FALSE);
  ck_assert_str_eq (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, 0, 4), "–");
  ck_assert_str_ne (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, 0, 2), "–");
  ck_assert (!pl_results_panel_get_stale (panel));

  pl_results_panel_set_results (panel, fast, results, TRUE);
  ck_assert (pl_results_panel_get_stale (panel));
  save_screenshot ("results-points-stale-light");

  pl_results_panel_set_results (panel, NULL, NULL, FALSE);
  ck_assert_uint_eq (pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_POINTS), 0);
  close_sample ();
}
END_TEST

/* Runs the main loop for ms, frames included. */
static void
run_frames (guint ms)
{
  gint64 end = g_get_monotonic_time () + (gint64) ms * 1000;

  while (g_get_monotonic_time () < end)
    if (!g_main_context_iteration (NULL, FALSE))
      g_usleep (1000);
}

/* Whether a label under widget reads text. */
static gboolean
shows_text (GtkWidget *widget, const char *text)
{
  if (GTK_IS_LABEL (widget) && g_strcmp0 (gtk_label_get_text (GTK_LABEL (widget)), text) == 0)
    return TRUE;
  for (GtkWidget *c = gtk_widget_get_first_child (widget); c != NULL;
       c = gtk_widget_get_next_sibling (c))
    if (shows_text (c, text))
      return TRUE;
  return FALSE;
}

static gpointer
first_row (PlResultsTable table)
{
  GtkColumnView *view = GTK_COLUMN_VIEW (pl_results_panel_get_view (panel, table));
  GListModel *model = G_LIST_MODEL (gtk_column_view_get_model (view));
  g_autoptr (GObject) item = g_list_model_get_item (model, 0);

  return item;
}

/* New figures for the same parts change the cells of the rows in place,
 * on screen within a frame; a new part makes new rows, for a hidden page
 * only once it is shown. */
START_TEST (test_updates_in_place)
{
  g_autoptr (PlCommand) bore = pl_command_new_set_number ("p3", "bore", 0.0127);
  g_autoptr (PlCommand) add = pl_command_new_add_part ("gauge", NULL, 0.0, -80.0);
  g_autoptr (PlResults) wider = NULL, more = NULL;
  g_autoptr (GError) error = NULL;
  g_autofree char *before = NULL;
  guint points_rebuilds, parts_rebuilds, n_points;
  gpointer row;

  open_sample ("demo-glue-line.pline");
  pl_results_panel_show_page (panel, "points");
  run_frames (100);
  n_points = pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_POINTS);
  points_rebuilds = pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_POINTS);
  parts_rebuilds = pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_PARTS);
  row = first_row (PL_RESULTS_TABLE_POINTS);
  before = g_strdup (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, 0, 3));

  /* A wider hose: the same rows, other figures. */
  ck_assert (pl_command_apply (bore, doc, &error));
  wider = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  ck_assert_msg (wider != NULL, "%s", error ? error->message : "");
  pl_results_panel_set_results (panel, wider, wider, FALSE);
  run_frames (100);
  ck_assert_uint_eq (pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_POINTS),
                     points_rebuilds);
  ck_assert_ptr_eq (first_row (PL_RESULTS_TABLE_POINTS), row);
  {
    const char *now = pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, 0, 3);
    double v;
    g_autofree char *expected = NULL;
    PlUnitPrefs si;

    /* Row 0 is the first part's first port, the pump's outlet. */
    pl_unit_prefs_init (&si, PL_UNIT_SYSTEM_SI);
    ck_assert (pl_results_get_port_pressure (wider, "p1", "out", PL_PRESSURE_STEADY_OPEN, &v));
    expected = pl_unit_format_number (v, PL_QUANTITY_PRESSURE, &si, PL_UNIT_DEFAULT_DIGITS,
                                      PL_UNIT_DECIMAL_FROM_LOCALE);
    ck_assert_str_eq (now, expected);
    ck_assert_str_ne (now, before);
    /* The widget showing it was told, without a new row. */
    ck_assert_msg (shows_text (pl_results_panel_get_view (panel, PL_RESULTS_TABLE_POINTS), now),
                   "no cell reads %s", now);
  }

  /* One more part: the visible table gets new rows within a frame, the
   * hidden parts table when it is shown. */
  ck_assert (pl_command_apply (add, doc, &error));
  more = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  ck_assert_msg (more != NULL, "%s", error ? error->message : "");
  pl_results_panel_set_results (panel, more, more, FALSE);
  run_frames (100);
  ck_assert_uint_eq (pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_POINTS),
                     points_rebuilds + 1);
  ck_assert_uint_eq (pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_PARTS),
                     parts_rebuilds);
  pl_results_panel_show_page (panel, "parts");
  ck_assert_uint_eq (pl_results_panel_get_n_rebuilds (panel, PL_RESULTS_TABLE_PARTS),
                     parts_rebuilds + 1);
  ck_assert_uint_eq (pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_POINTS),
                     n_points + 1);
  ck_assert_uint_eq (pl_results_panel_get_n_rows (panel, PL_RESULTS_TABLE_PARTS),
                     pl_document_get_n_parts (doc));
  close_sample ();
}
END_TEST

START_TEST (test_screenshots)
{
  static const char *const pages[] = { "points", "parts", "cycle", "shutdown", "findings" };
  GtkSettings *settings = gtk_settings_get_default ();
  PlUnitPrefs us;

  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  open_sample ("carton-sealer-starved.pline");
  for (int dark = 0; dark < 2; dark++)
    {
      g_object_set (settings, "gtk-application-prefer-dark-theme", dark, NULL);
      for (guint i = 0; i < G_N_ELEMENTS (pages); i++)
        {
          g_autofree char *name = g_strdup_printf ("results-%s-%s", pages[i],
                                                   dark ? "dark" : "light");

          pl_results_panel_show_page (panel, pages[i]);
          save_screenshot (name);
        }
    }
  pl_results_panel_set_context (panel, doc, &us);
  pl_results_panel_set_results (panel, results, results, FALSE);
  pl_results_panel_show_page (panel, "points");
  save_screenshot ("results-points-us-dark");
  pl_results_panel_show_page (panel, "cycle");
  save_screenshot ("results-cycle-us-dark");
  g_object_set (settings, "gtk-application-prefer-dark-theme", FALSE, NULL);
  close_sample ();
}
END_TEST

static Suite *
results_panel_suite (void)
{
  Suite *s = suite_create ("results-panel");
  TCase *tc = tcase_create ("results panel");

  tcase_set_timeout (tc, 60);
  tcase_add_loop_test (tc, test_tables_have_a_row_per_port_and_part, 0,
                       G_N_ELEMENTS (samples));
  tcase_add_test (tc, test_finding_activation_names_part);
  tcase_add_loop_test (tc, test_findings_in_user_units, 0, G_N_ELEMENTS (samples));
  tcase_add_test (tc, test_plots_draw);
  tcase_add_test (tc, test_no_mixed_revisions_and_stale);
  tcase_add_test (tc, test_updates_in_place);
  tcase_add_test (tc, test_screenshots);
  suite_add_tcase (s, tc);
  return s;
}

int
main (int argc, char **argv)
{
  gtk_init ();
  return pl_check_run (results_panel_suite ());
}
