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
#include "pl-render.h"
#include "pl-results.h"
#include "pl-viewport.h"

#define WIDTH 1600
#define HEIGHT 1000

static void
run_case (const char *label, PlDocument *doc, PlResults *results, double zoom, int n)
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
  pl_render_options_init (&opts);
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
  printf ("%-34s zoom %5.2f  mean %7.2f ms  best %7.2f ms\n", label, vp.zoom, total / n, best);
  cairo_surface_destroy (surface);
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
  return EXIT_SUCCESS;
}
