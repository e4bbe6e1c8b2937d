/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Results at an instant of the firing cycle or the shutdown, and the
 * renderer's replay of both, on the demo sample.
 *
 * References: linear interpolation between evenly spaced samples (the
 * sampling of pressline-solver.h), worked at sample points (exact) and
 * half way (the mean of the two); the cycle's periodicity (t and t + T
 * give one state); the lowest sampled pressure cannot be below the
 * solver's cycle minimum, which it tracks at every step, and lies within
 * the swing over one sample step of it.
 */

#include "config.h"

#include <math.h>

#include "pl-check.h"
#include "pl-sample-fixtures.h"
#include "pl-render.h"
#include "pl-results-series.h"

static PlDocument *
load_demo (void)
{
  return pl_test_load_sample ("demo-glue-line.pline");
}

/* The gauge G1 (p7) and the applicator N2 (p15) of the demo. */
START_TEST (test_cycle_instants)
{
  g_autoptr (PlDocument) doc = load_demo ();
  g_autoptr (PlResults) r = pl_test_solve_full (doc);
  const pls_cycle_result *cy = pl_results_get_cycle (r);
  int node = pl_compiled_get_port_node (pl_results_get_compiled (r), "p7", "p");
  size_t n = pls_cycle_sample_count (cy);
  double period, p, q, t_min, p_min, cycle_min, cycle_max, mid;

  ck_assert (pl_results_get_run_length (r, PL_RUN_CYCLE, &period));
  ck_assert_double_eq_tol (period, 1.0 / 3.0, 1e-12);   /* 3 shots a second */
  /* At a sample point: the sample. */
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE,
                                              pls_cycle_sample_time (cy, 17), &p));
  ck_assert_double_eq_tol (p, pls_cycle_sample_pressure (cy, node, 17), 1e-6);
  /* Half way: the mean of the two around it. */
  mid = 0.5 * (pls_cycle_sample_time (cy, 17) + pls_cycle_sample_time (cy, 18));
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE, mid, &p));
  ck_assert_double_eq_tol (p, 0.5 * (pls_cycle_sample_pressure (cy, node, 17)
                                     + pls_cycle_sample_pressure (cy, node, 18)), 1e-6);
  /* Periodic: one period later (and earlier) is the same instant. */
  {
    double later, earlier;

    ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE, mid + period,
                                                &later));
    ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE, mid - period,
                                                &earlier));
    ck_assert_double_eq_tol (later, p, 1e-6 * fabs (p));
    ck_assert_double_eq_tol (earlier, p, 1e-6 * fabs (p));
  }
  /* The lowest sample against the solver's minimum. */
  ck_assert (pl_results_get_port_min_time (r, "p7", "p", PL_RUN_CYCLE, &t_min, &p_min));
  ck_assert (pl_results_get_port_pressure (r, "p7", "p", PL_PRESSURE_CYCLE_MIN, &cycle_min));
  ck_assert (pl_results_get_port_pressure (r, "p7", "p", PL_PRESSURE_CYCLE_MAX, &cycle_max));
  ck_assert_double_ge (p_min, cycle_min - 1e-6 * cycle_max);
  ck_assert_double_le (p_min - cycle_min, 0.05 * (cycle_max - cycle_min));
  ck_assert_double_ge (t_min, 0.0);
  ck_assert_double_le (t_min, period);
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE, t_min, &p));
  ck_assert_double_eq_tol (p, p_min, 1e-6 * cycle_max);
  /* An applicator sprays while open (first 25 ms) and not after. */
  ck_assert (pl_results_get_flow_at (r, "p15", 0, PL_RUN_CYCLE, 0.0125, &q));
  ck_assert_double_gt (q, 1e-7);
  ck_assert (pl_results_get_flow_at (r, "p15", 0, PL_RUN_CYCLE, 0.25, &q));
  ck_assert_double_lt (fabs (q), 1e-9);
  /* Unknown parts, ports, slots and times. */
  ck_assert (!pl_results_get_port_pressure_at (r, "p999", "p", PL_RUN_CYCLE, 0.1, &p));
  ck_assert (!pl_results_get_port_pressure_at (r, "p7", "nope", PL_RUN_CYCLE, 0.1, &p));
  ck_assert (!pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_CYCLE, NAN, &p));
  ck_assert (!pl_results_get_port_pressure_at (r, "p7", "p", PL_N_RUNS, 0.1, &p));
  ck_assert (!pl_results_get_flow_at (r, "p15", 5, PL_RUN_CYCLE, 0.1, &q));
  ck_assert (n >= 2);
  ck_assert_str_eq (pl_run_get_key (PL_RUN_SHUTDOWN), "shutdown");
  ck_assert_ptr_null (pl_run_get_key (PL_N_RUNS));
}
END_TEST

/* The shutdown starts at idle and is held at its ends. */
START_TEST (test_shutdown_instants)
{
  g_autoptr (PlDocument) doc = load_demo ();
  g_autoptr (PlResults) r = pl_test_solve_full (doc);
  double length, p0, p_end, p_after, idle, safe;

  ck_assert (pl_results_get_run_length (r, PL_RUN_SHUTDOWN, &length));
  ck_assert (pl_results_get_shutdown_safe_time (r, &safe));
  ck_assert_double_eq_tol (length, safe, 1e-9);
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_SHUTDOWN, 0.0, &p0));
  ck_assert (pl_results_get_port_pressure (r, "p7", "p", PL_PRESSURE_IDLE, &idle));
  ck_assert_double_eq_tol (p0, idle, 1e-3 * idle);
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_SHUTDOWN, length, &p_end));
  ck_assert (pl_results_get_port_pressure_at (r, "p7", "p", PL_RUN_SHUTDOWN, 10 * length,
                                              &p_after));
  ck_assert_double_eq (p_after, p_end);
  ck_assert_double_lt (p_end, p0);
}
END_TEST

/* How many pixels of a rectangle differ between two images. */
static guint
differing (cairo_surface_t *a, cairo_surface_t *b, int x0, int y0, int x1, int y1)
{
  const unsigned char *da = cairo_image_surface_get_data (a);
  const unsigned char *db = cairo_image_surface_get_data (b);
  int stride = cairo_image_surface_get_stride (a);
  guint n = 0;

  for (int y = y0; y < y1; y++)
    for (int x = x0; x < x1; x++)
      n += *(const guint32 *) (const void *) (da + y * stride + 4 * x)
           != *(const guint32 *) (const void *) (db + y * stride + 4 * x);
  return n;
}

/* The demo at 4 px/mm with applicator N1 (p14, at 140, 60 mm, upright)
 * at pixel (200, 200). */
static cairo_surface_t *
draw_at (PlDocument *doc, PlResults *r, PlRun run, double t)
{
  cairo_surface_t *s = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 400, 400);
  cairo_t *cr = cairo_create (s);
  PlRenderOptions opts;

  pl_render_options_init (&opts);
  opts.replay_run = run;
  opts.replay_time = t;
  cairo_translate (cr, 200, 200);
  cairo_scale (cr, 4, 4);
  cairo_translate (cr, -140, -60);
  ck_assert_int_eq (pl_render_document (cr, doc, r, &opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_flush (s);
  return s;
}

/* Mid-shot the applicator's jet is drawn below its tip, between shots
 * not; the shutdown's first and last instants colour the line apart. */
START_TEST (test_render_replay)
{
  g_autoptr (PlDocument) doc = load_demo ();
  g_autoptr (PlResults) r = pl_test_solve_full (doc);
  cairo_surface_t *shot = draw_at (doc, r, PL_RUN_CYCLE, 0.0125);
  cairo_surface_t *rest = draw_at (doc, r, PL_RUN_CYCLE, 0.3);
  cairo_surface_t *start = draw_at (doc, r, PL_RUN_SHUTDOWN, 0.0);
  cairo_surface_t *end = NULL;
  double length;

  ck_assert (pl_results_get_run_length (r, PL_RUN_SHUTDOWN, &length));
  end = draw_at (doc, r, PL_RUN_SHUTDOWN, length);
  /* Below the tip: world y 60 + 7 .. 60 + 19 mm, x 140 +- 4 mm. */
  ck_assert_uint_gt (differing (shot, rest, 184, 228, 216, 276), 200);
  ck_assert_uint_gt (differing (start, end, 0, 0, 400, 400), 1000);
  cairo_surface_destroy (shot);
  cairo_surface_destroy (rest);
  cairo_surface_destroy (start);
  cairo_surface_destroy (end);
}
END_TEST

/* A raised text floor (the presentation's stage): at 1 px/mm the tags
 * (3.4 mm) are below the renderer's 3.5 px cut and not drawn; with a
 * 13 px floor they are, so the two drawings differ by hundreds of
 * pixels. */
START_TEST (test_text_floor)
{
  g_autoptr (PlDocument) doc = load_demo ();
  cairo_surface_t *s[2];
  guint differ;

  for (int k = 0; k < 2; k++)
    {
      cairo_t *cr;
      PlRenderOptions opts;

      s[k] = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 400, 400);
      cr = cairo_create (s[k]);
      pl_render_options_init (&opts);
      opts.min_text_px = k == 0 ? 0.0 : 13.0;
      cairo_translate (cr, 200, 200);
      ck_assert_int_eq (pl_render_document (cr, doc, NULL, &opts), CAIRO_STATUS_SUCCESS);
      cairo_destroy (cr);
      cairo_surface_flush (s[k]);
    }
  differ = differing (s[0], s[1], 0, 0, 400, 400);
  ck_assert_uint_gt (differ, 500);
  cairo_surface_destroy (s[0]);
  cairo_surface_destroy (s[1]);
}
END_TEST

static Suite *
results_series_suite (void)
{
  Suite *s = suite_create ("results-series");
  TCase *tc = tcase_create ("instants");

  tcase_set_timeout (tc, 60);
  tcase_add_test (tc, test_cycle_instants);
  tcase_add_test (tc, test_shutdown_instants);
  tcase_add_test (tc, test_render_replay);
  tcase_add_test (tc, test_text_floor);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (results_series_suite ());
}
