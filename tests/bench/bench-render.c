/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-render: time of a full redraw of the canvas renderer.
 *
 * Builds a 500-part layout through the document's commands (50 lines of a
 * pump, hoses, tees, a pipe, three applicators and a gauge, wired), solves
 * it once (idle and steady-open), and draws it into a 1600 x 1000 image
 * surface N times per case: fitted to the view (every part visible), at
 * 50 % and at 100 % zoom, with and without results.  Prints the mean and
 * the best milliseconds per full redraw.  The target is under 8 ms for the
 * whole layout fitted to the view.
 *
 * Replay frames (the presentation mode): the same layout and the largest
 * sample (samples/demo-glue-line.pline, PRESSLINE_SOURCE_ROOT overrides
 * the source tree) after the cycle and shutdown have run, drawn at an
 * instant of the cycle mid-shot and of the shutdown, fitted as the stage
 * draws it (13 px text floor); the implied frames per second beside.
 *
 *   bench-render [N]        (N redraws per case, default 50)
 */
#include "config.h"

#include <glib.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#include "bench-layout.h"
#include "pl-compile.h"
#include "pl-document.h"
#include "pl-geometry.h"
#include "pl-layout-reader.h"
#include "pl-render.h"
#include "pl-results.h"
#include "pl-viewport.h"

#define WIDTH 1600
#define HEIGHT 1000

static void
run_case_with (const char *label, PlDocument *doc, PlResults *results, double zoom, int n,
               const PlRenderOptions *base)
{
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, WIDTH, HEIGHT);
  PlViewport vp;
  PlRenderOptions opts;
  PlRect bounds;
  double best = INFINITY, total = 0.0;

  pl_viewport_init (&vp, WIDTH, HEIGHT);
  pl_geometry_document_bounds (doc, &bounds);
  pl_viewport_fit (&vp, &bounds, 20);
  if (zoom > 0.0)
    {
      /* Zoomed about the layout's top left part of the screen. */
      PlPoint corner;

      pl_viewport_world_to_screen (&vp, (PlPoint) { bounds.x0, bounds.y0 }, &corner);
      pl_viewport_set_zoom_at (&vp, zoom, corner.x, corner.y);
    }
  opts = *base;
  opts.viewport = &vp;
  for (int i = 0; i < n + 1; i++)
    {
      cairo_t *cr = cairo_create (surface);
      gint64 t0 = g_get_monotonic_time (), t1;

      pl_render_document (cr, doc, results, &opts);
      cairo_destroy (cr);
      cairo_surface_flush (surface);
      t1 = g_get_monotonic_time ();
      /* The first draw loads fonts and fills caches: not counted. */
      if (i > 0)
        {
          double ms = (double) (t1 - t0) / 1000.0;

          total += ms;
          best = MIN (best, ms);
        }
    }
  printf ("%-34s zoom %5.2f  mean %7.2f ms  best %7.2f ms  (%.0f fps at the mean)\n", label,
          vp.zoom, total / n, best, 1000.0 / (total / n));
  cairo_surface_destroy (surface);
}

static void
run_case (const char *label, PlDocument *doc, PlResults *results, double zoom, int n)
{
  PlRenderOptions opts;

  pl_render_options_init (&opts);
  run_case_with (label, doc, results, zoom, n, &opts);
}

/* Replay frames of a solved layout: mid-shot in the cycle, and a tenth
 * of the way into the shutdown. */
static void
run_replay (const char *what, PlDocument *doc, PlResults *full, int n)
{
  PlRenderOptions opts;
  double on_time = pl_part_get_number (pl_document_get_scenario (doc), "on-time"), length;
  g_autofree char *l1 = g_strdup_printf ("%s, replay mid-shot", what);
  g_autofree char *l2 = g_strdup_printf ("%s, replay shutdown", what);

  pl_render_options_init (&opts);
  opts.show_grid = FALSE;
  opts.min_text_px = 13.0;
  opts.replay_run = PL_RUN_CYCLE;
  opts.replay_time = 0.5 * on_time;
  run_case_with (l1, doc, full, 0.0, n, &opts);
  if (pl_results_get_run_length (full, PL_RUN_SHUTDOWN, &length))
    {
      opts.replay_run = PL_RUN_SHUTDOWN;
      opts.replay_time = 0.1 * length;
      run_case_with (l2, doc, full, 0.0, n, &opts);
    }
  else
    /* The 500-part layout has no dump valve: its pressure is trapped, the
     * shutdown has no decay to follow. */
    printf ("%s: no shutdown decay to replay\n", what);
}

static PlResults *
solve_full (PlDocument *doc, const char *what)
{
  g_autoptr (PlCompiled) compiled = pl_compile (doc);
  g_autoptr (PlResults) fast = pl_results_solve_fast (compiled);
  g_autoptr (GError) error = NULL;
  gint64 t0 = g_get_monotonic_time ();
  PlResults *full = pl_results_solve_full (fast, NULL, &error);

  if (full == NULL)
    fprintf (stderr, "bench-render: %s: %s\n", what, error->message);
  else
    printf ("%s: cycle + shutdown %.1f ms (not part of a frame)\n", what,
            (double) (g_get_monotonic_time () - t0) / 1000.0);
  return full;
}

int
main (int argc, char **argv)
{
  g_autoptr (PlDocument) doc = bench_layout_new ();
  g_autoptr (PlCompiled) compiled = NULL;
  g_autoptr (PlResults) results = NULL;
  int n = argc > 1 ? atoi (argv[1]) : 50;
  gint64 t0;

  if (n < 1)
    n = 1;
  if (doc == NULL)
    return EXIT_FAILURE;
  printf ("layout: %u parts, %u wires; %d redraws per case, %dx%d px\n",
          pl_document_get_n_parts (doc), pl_document_get_n_wires (doc), n, WIDTH, HEIGHT);
  t0 = g_get_monotonic_time ();
  compiled = pl_compile (doc);
  results = pl_results_solve_fast (compiled);
  printf ("compile + fast solve: %.1f ms (not part of a redraw)\n",
          (double) (g_get_monotonic_time () - t0) / 1000.0);

  run_case ("fit to view, no results", doc, NULL, 0.0, n);
  run_case ("fit to view, with results", doc, results, 0.0, n);
  run_case ("50 %, with results", doc, results, 0.5, n);
  run_case ("100 %, with results", doc, results, 1.0, n);

  {
    g_autoptr (PlResults) full = solve_full (doc, "500 parts");
    const char *root = g_getenv ("PRESSLINE_SOURCE_ROOT");
    g_autofree char *path = g_build_filename (root != NULL ? root : SOURCE_ROOT, "samples",
                                              "demo-glue-line.pline", NULL);
    g_autoptr (GError) error = NULL;
    g_autoptr (PlDocument) demo = pl_layout_read_file (path, &error);
    g_autoptr (PlResults) demo_full = NULL;

    if (full == NULL)
      return EXIT_FAILURE;
    run_replay ("500 parts", doc, full, n);
    if (demo == NULL)
      {
        fprintf (stderr, "bench-render: %s\n", error->message);
        return EXIT_FAILURE;
      }
    demo_full = solve_full (demo, "demo-glue-line");
    if (demo_full == NULL)
      return EXIT_FAILURE;
    run_replay ("demo-glue-line", demo, demo_full, n);
  }
  return EXIT_SUCCESS;
}
