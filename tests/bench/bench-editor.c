/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-editor: the editor's live figures, measured in the whole window
 * with the frame clock running (needs a display: run it under Xvfb).
 *
 * For the largest sample and for the generated 500-part layout:
 *
 * - edit to fresh fast results: the time from pushing a parameter edit
 *   (a hose bore) on the undo stack until the scheduler holds idle and
 *   steady-open results of the new revision, canvas, inspector and results
 *   panel told; each edit is followed by a frame;
 * - a part dragged across the drawing, one motion event a frame, and a
 *   bore "dragged" (a new value a frame, as a spin button held down does):
 *   the longest interval between two frame-clock ticks of the window and
 *   the longest single main-loop block (an event handler or one dispatch).
 *
 * The results panel shows its "points" table throughout, the costliest
 * page; its own update (new figures for the same parts, until the visible
 * table reads them) is timed on its own too.  Prints the best and the median of each figure over N runs; the
 * targets are 2 ms for an edit and 16 ms for a frame.
 *
 *   xvfb-run -a -s "-screen 0 1600x1000x24" bench-editor [N]   (default 5)
 */
#include "config.h"

#include <glib/gstdio.h>
#include <gtk/gtk.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#include "bench-layout.h"
#include "pl-application.h"
#include "pl-canvas.h"
#include "pl-layout-reader.h"
#include "pl-layout-writer.h"
#include "pl-results-panel.h"
#include "pl-window.h"

#define N_STEPS 60

typedef struct
{
  gint64 last_tick;
  gint64 max_interval;
  guint n_ticks;
} FrameStats;

static gboolean
tick_cb (GtkWidget *widget, GdkFrameClock *clock, gpointer data)
{
  FrameStats *fs = data;
  gint64 now = g_get_monotonic_time ();

  if (fs->last_tick != 0 && now - fs->last_tick > fs->max_interval)
    fs->max_interval = now - fs->last_tick;
  fs->last_tick = now;
  fs->n_ticks++;
  return G_SOURCE_CONTINUE;
}

/* Runs the main loop for ms, returning the longest single dispatch. */
static gint64
run_for (guint ms)
{
  gint64 end = g_get_monotonic_time () + (gint64) ms * 1000, worst = 0;

  while (g_get_monotonic_time () < end)
    {
      gint64 t0 = g_get_monotonic_time ();

      if (!g_main_context_iteration (NULL, FALSE))
        g_usleep (500);
      else
        worst = MAX (worst, g_get_monotonic_time () - t0);
    }
  return worst;
}

/* One measured run: frame-clock ticks of the window and the longest
 * main-loop block, from start to stop. */
typedef struct
{
  FrameStats fs;
  guint tick;
  gint64 worst;
} Measure;

static void
measure_start (Measure *m, PlWindow *window)
{
  *m = (Measure) { 0 };
  m->tick = gtk_widget_add_tick_callback (GTK_WIDGET (window), tick_cb, &m->fs, NULL);
  run_for (50);
  m->fs.max_interval = 0;
}

/* Runs ms of main loop, counting it and since (a handler's start) in the
 * longest block. */
static void
measure_frame (Measure *m, gint64 since, guint ms)
{
  m->worst = MAX (m->worst, g_get_monotonic_time () - since);
  m->worst = MAX (m->worst, run_for (ms));
}

static void
measure_stop (Measure *m, PlWindow *window, double *frame, double *block)
{
  gtk_widget_remove_tick_callback (GTK_WIDGET (window), m->tick);
  *frame = m->fs.max_interval / 1000.0;
  *block = m->worst / 1000.0;
}

static void
wait_for_full (PlWindow *window)
{
  PlSolveScheduler *sched = pl_window_get_scheduler (window);
  gint64 end = g_get_monotonic_time () + 60 * G_USEC_PER_SEC;

  while (g_get_monotonic_time () < end && pl_solve_scheduler_get_busy (sched))
    run_for (5);
  run_for (50);
}

static int
cmp_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static void
print_figure (const char *what, double *v, int n)
{
  qsort (v, (size_t) n, sizeof *v, cmp_double);
  printf ("  %-44s best %7.2f ms  median %7.2f ms  worst %7.2f ms\n", what, v[0], v[n / 2],
          v[n - 1]);
}

static const char *
first_of_type (PlDocument *doc, const char *type)
{
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);

      if (g_str_equal (pl_part_get_part_type (part)->key, type))
        return pl_part_get_id (part);
    }
  return NULL;
}

/* Mean time of one edit to fresh fast results over N_STEPS edits. */
static double
edit_to_fast (PlWindow *window, const char *hose)
{
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlDocument *doc = pl_window_get_document (window);
  double bore = pl_part_get_number (pl_document_find_part (doc, hose), "bore");
  double best = INFINITY;

  for (int i = 0; i < N_STEPS; i++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_set_number (hose, "bore",
                                                             bore * (1.0 + 0.002 * (i + 1)));
      gint64 t0 = g_get_monotonic_time ();
      PlResults *fast;

      pl_undo_stack_push (undo, cmd, NULL);
      fast = pl_solve_scheduler_get_fast_results (pl_window_get_scheduler (window));
      if (fast == NULL || pl_results_get_revision (fast) != pl_document_get_revision (doc))
        {
          fprintf (stderr, "bench-editor: no fresh fast results after an edit\n");
          exit (EXIT_FAILURE);
        }
      best = MIN (best, (g_get_monotonic_time () - t0) / 1000.0);
      run_for (16);
    }
  return best;
}

/* The frame clock with nothing to do but redraw the canvas each frame: what
 * the display itself adds to a frame interval. */
static void
redraw_only (PlWindow *window, double *frame, double *block)
{
  GtkWidget *canvas = pl_window_get_canvas (window);
  Measure m;

  measure_start (&m, window);
  for (int i = 1; i <= N_STEPS; i++)
    {
      gtk_widget_queue_draw (canvas);
      measure_frame (&m, g_get_monotonic_time (), 16);
    }
  measure_stop (&m, window, frame, block);
}

/* A part dragged 60 frames; returns the longest frame interval and the
 * longest main-loop block (both ms). */
static void
drag_part (PlWindow *window, const char *part_id, double *frame, double *block)
{
  PlCanvas *canvas = PL_CANVAS (pl_window_get_canvas (window));
  PlDocument *doc = pl_window_get_document (window);
  const PlPart *part = pl_document_find_part (doc, part_id);
  PlPoint w = { pl_part_get_x (part), pl_part_get_y (part) }, s;
  double scale;
  Measure m;

  pl_viewport_world_to_screen (pl_canvas_get_viewport (canvas), w, &s);
  scale = pl_viewport_get_scale (pl_canvas_get_viewport (canvas));
  measure_start (&m, window);
  pl_canvas_pointer_press (canvas, s.x, s.y, 0);
  for (int i = 1; i <= N_STEPS; i++)
    {
      gint64 t0 = g_get_monotonic_time ();

      /* Back and forth over 40 mm, so every step moves it a grid step. */
      pl_canvas_pointer_motion (canvas, s.x + scale * 5.0 * (i % 16 < 8 ? i % 8 : 8 - i % 8),
                                s.y + scale * 5.0 * (i % 3));
      measure_frame (&m, t0, 16);
    }
  pl_canvas_pointer_release (canvas, s.x, s.y);
  measure_frame (&m, g_get_monotonic_time (), 30);
  measure_stop (&m, window, frame, block);
}

/* A bore changed every frame, as a spin button held down changes it. */
static void
sweep_bore (PlWindow *window, const char *hose, double *frame, double *block)
{
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlDocument *doc = pl_window_get_document (window);
  double bore = pl_part_get_number (pl_document_find_part (doc, hose), "bore");
  Measure m;

  measure_start (&m, window);
  for (int i = 1; i <= N_STEPS; i++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_set_number (hose, "bore",
                                                             bore * (1.0 - 0.003 * i));
      gint64 t0 = g_get_monotonic_time ();

      pl_undo_stack_push (undo, cmd, NULL);
      measure_frame (&m, t0, 16);
    }
  measure_stop (&m, window, frame, block);
}

/* The results panel told of new figures for the same parts, 20 times,
 * alternating two solutions, until its visible table reads the new ones:
 * the best time (ms) of one update. */
static double
panel_update (PlWindow *window, const char *hose)
{
  PlSolveScheduler *sched = pl_window_get_scheduler (window);
  PlResultsPanel *panel = PL_RESULTS_PANEL (pl_window_get_results_panel (window));
  PlDocument *doc = pl_window_get_document (window);
  g_autoptr (PlCommand) cmd = pl_command_new_set_number (
    hose, "bore", 1.1 * pl_part_get_number (pl_document_find_part (doc, hose), "bore"));
  PlResults *a = pl_results_ref (pl_solve_scheduler_get_fast_results (sched)), *b;
  double best = INFINITY;

  pl_undo_stack_push (pl_window_get_undo_stack (window), cmd, NULL);
  b = pl_results_ref (pl_solve_scheduler_get_fast_results (sched));
  for (int i = 0; i < 20; i++)
    {
      gint64 t0 = g_get_monotonic_time ();

      pl_results_panel_set_results (panel, i % 2 ? b : a, NULL, FALSE);
      /* Asking for a cell brings the visible table up to date. */
      if (pl_results_panel_get_cell (panel, PL_RESULTS_TABLE_POINTS, 0, 3) == NULL)
        fprintf (stderr, "bench-editor: the points table is empty\n");
      best = MIN (best, (g_get_monotonic_time () - t0) / 1000.0);
      run_for (16);
    }
  pl_results_unref (a);
  pl_results_unref (b);
  pl_undo_stack_undo (pl_window_get_undo_stack (window));
  return best;
}

static gboolean
run_layout (PlApplication *app, const char *label, const char *path, int n)
{
  PlWindow *window = pl_window_new (app);
  g_autoptr (GFile) file = g_file_new_for_path (path);
  g_autoptr (GError) error = NULL;
  g_autofree double *edit = g_new (double, n), *panel = g_new (double, n);
  g_autofree double *idle_frame = g_new (double, n), *idle_block = g_new (double, n);
  g_autofree double *drag_frame = g_new (double, n), *drag_block = g_new (double, n);
  g_autofree double *sweep_frame = g_new (double, n), *sweep_block = g_new (double, n);
  PlDocument *doc;
  const char *hose, *mover;

  gtk_window_set_default_size (GTK_WINDOW (window), 1600, 1000);
  gtk_window_present (GTK_WINDOW (window));
  while (!gtk_widget_get_mapped (GTK_WIDGET (window)))
    g_main_context_iteration (NULL, TRUE);
  if (!pl_window_load_file (window, file, &error))
    {
      fprintf (stderr, "bench-editor: %s\n", error->message);
      return FALSE;
    }
  doc = pl_window_get_document (window);
  hose = first_of_type (doc, "hose");
  mover = first_of_type (doc, "gauge");
  if (hose == NULL || mover == NULL)
    {
      fprintf (stderr, "bench-editor: %s has no hose or gauge\n", path);
      return FALSE;
    }
  pl_results_panel_show_page (PL_RESULTS_PANEL (pl_window_get_results_panel (window)),
                              "points");
  /* Zoomed in on the part that moves, as someone dragging it would be. */
  {
    PlCanvas *canvas = PL_CANVAS (pl_window_get_canvas (window));
    const PlPart *part = pl_document_find_part (doc, mover);
    PlPoint s;
    const PlViewport *vp = pl_canvas_get_viewport (canvas);

    pl_viewport_world_to_screen (vp, (PlPoint) { pl_part_get_x (part), pl_part_get_y (part) },
                                 &s);
    pl_canvas_zoom_at (canvas, 0.5 / vp->zoom, s.x, s.y);
  }
  wait_for_full (window);
  for (int r = 0; r < n; r++)
    {
      redraw_only (window, &idle_frame[r], &idle_block[r]);
      edit[r] = edit_to_fast (window, hose);
      wait_for_full (window);
      drag_part (window, mover, &drag_frame[r], &drag_block[r]);
      wait_for_full (window);
      sweep_bore (window, hose, &sweep_frame[r], &sweep_block[r]);
      wait_for_full (window);
      panel[r] = panel_update (window, hose);
      wait_for_full (window);
    }
  printf ("%s: %u parts, %u wires, %d runs\n", label, pl_document_get_n_parts (doc),
          pl_document_get_n_wires (doc), n);
  print_figure ("edit to fresh fast results (best of 60)", edit, n);
  print_figure ("results panel: one update (best of 20)", panel, n);
  print_figure ("redraw only: longest frame interval", idle_frame, n);
  print_figure ("redraw only: longest main-loop block", idle_block, n);
  print_figure ("part drag: longest frame interval", drag_frame, n);
  print_figure ("part drag: longest main-loop block", drag_block, n);
  print_figure ("bore held down: longest frame interval", sweep_frame, n);
  print_figure ("bore held down: longest main-loop block", sweep_block, n);
  pl_undo_stack_mark_clean (pl_window_get_undo_stack (window));
  gtk_window_destroy (GTK_WINDOW (window));
  run_for (20);
  return TRUE;
}

/* The sample with the most parts. */
static char *
largest_sample (void)
{
  g_autofree char *dir = g_build_filename (SOURCE_ROOT, "samples", NULL);
  g_autoptr (GDir) d = g_dir_open (dir, 0, NULL);
  const char *name;
  char *best = NULL;
  guint most = 0;

  while (d != NULL && (name = g_dir_read_name (d)) != NULL)
    {
      g_autofree char *path = NULL;
      g_autoptr (PlDocument) doc = NULL;

      if (!g_str_has_suffix (name, ".pline"))
        continue;
      path = g_build_filename (dir, name, NULL);
      doc = pl_layout_read_file (path, NULL);
      if (doc != NULL && pl_document_get_n_parts (doc) > most)
        {
          most = pl_document_get_n_parts (doc);
          g_free (best);
          best = g_steal_pointer (&path);
        }
    }
  return best;
}

int
main (int argc, char **argv)
{
  int n = argc > 1 ? atoi (argv[1]) : 5;
  g_autoptr (PlApplication) app = NULL;
  g_autoptr (PlDocument) big = bench_layout_new ();
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = NULL, *big_path = NULL, *sample = NULL, *label = NULL;
  gboolean ok;

  if (n < 1)
    n = 1;
  /* Runs from the build tree without touching the user's settings. */
  g_setenv ("GSETTINGS_SCHEMA_DIR", BUILD_ROOT "/ui/data", FALSE);
  g_setenv ("GSETTINGS_BACKEND", "memory", TRUE);
  gtk_init ();
  app = pl_application_new ();
  g_application_set_flags (G_APPLICATION (app), G_APPLICATION_NON_UNIQUE);
  if (big == NULL || !g_application_register (G_APPLICATION (app), NULL, &error))
    {
      fprintf (stderr, "bench-editor: %s\n", error != NULL ? error->message : "no layout");
      return EXIT_FAILURE;
    }
  dir = g_dir_make_tmp ("pressline-bench-XXXXXX", &error);
  if (dir == NULL)
    {
      fprintf (stderr, "bench-editor: %s\n", error->message);
      return EXIT_FAILURE;
    }
  big_path = g_build_filename (dir, "generated-500.pline", NULL);
  if (!pl_layout_write_file (big, big_path, &error))
    {
      fprintf (stderr, "bench-editor: %s\n", error->message);
      return EXIT_FAILURE;
    }
  sample = largest_sample ();
  label = g_path_get_basename (sample != NULL ? sample : "none");
  ok = sample != NULL && run_layout (app, label, sample, n)
       && run_layout (app, "generated 500-part layout", big_path, n);
  g_remove (big_path);
  g_rmdir (dir);
  return ok ? EXIT_SUCCESS : EXIT_FAILURE;
}
