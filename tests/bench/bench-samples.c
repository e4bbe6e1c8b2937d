/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-samples: the whole solve path of every shipped sample layout, split
 * into its parts (compile, fast steady solves, firing cycle, shutdown), best
 * and median wall time of 5 runs and the best processor time (which a
 * machine shared with other work inflates less), with the integrator's
 * work counts.
 *
 * Usage: bench-samples [FILE.pline ...]; without arguments it reads every
 * samples/ *.pline of the source tree (PRESSLINE_SOURCE_ROOT overrides it).
 * A program that prints figures, not a timed test.
 */

#include "config.h"

#include <glib.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "pl-compile.h"
#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-results.h"

#define N_RUNS 5

enum
{
  T_COMPILE,
  T_FAST,
  T_CYCLE,
  T_SHUTDOWN,
  T_TOTAL,
  N_T
};

static int
cmp_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

/* g_ptr_array_sort hands pointers to the elements. */
static int
cmp_name (gconstpointer a, gconstpointer b)
{
  return g_strcmp0 (*(char *const *) a, *(char *const *) b);
}

static double
now_ms (void)
{
  return (double) g_get_monotonic_time () / 1e3;
}

/* Processor time of the process, ms. */
static double
cpu_ms (void)
{
  return 1e3 * (double) clock () / CLOCKS_PER_SEC;
}

/* One run of FILE; fills t[N_T] (ms) and the work counts.  FALSE on error. */
static gboolean
run_once (PlDocument *doc, double *t, double *cpu, int *cycles, int *periodic,
          pls_transient_stats *cs, pls_transient_stats *ss)
{
  g_autoptr (PlCompiled) compiled = NULL;
  g_autoptr (PlResults) fast = NULL;
  pls_cycle_result *cr = NULL;
  pls_shutdown_result *sr = NULL;
  const pls_network *net;
  const pls_transient_options *o;
  pls_error err = { 0 };
  gboolean ok = FALSE;
  double t0, t1, c0, c1;

  c0 = cpu_ms ();
  t0 = now_ms ();
  compiled = pl_compile (doc);
  t1 = now_ms ();
  c1 = cpu_ms ();
  t[T_COMPILE] = t1 - t0;
  cpu[T_COMPILE] = c1 - c0;
  net = pl_compiled_get_network (compiled);
  o = pl_compiled_get_transient_options (compiled);
  if (net == NULL || o == NULL)
    {
      fprintf (stderr, "bench-samples: the layout does not compile to a network\n");
      goto out;
    }
  fast = pl_results_solve_fast (compiled);
  t0 = now_ms ();
  c0 = cpu_ms ();
  t[T_FAST] = t0 - t1;
  cpu[T_FAST] = c0 - c1;
  if (pls_solve_cycle (net, o, &cr, &err) != PLS_OK)
    {
      fprintf (stderr, "bench-samples: cycle: %s\n", err.message);
      goto out;
    }
  t1 = now_ms ();
  c1 = cpu_ms ();
  t[T_CYCLE] = t1 - t0;
  cpu[T_CYCLE] = c1 - c0;
  if (pls_solve_shutdown (net, o, &sr, &err) != PLS_OK)
    {
      fprintf (stderr, "bench-samples: shutdown: %s\n", err.message);
      goto out;
    }
  t0 = now_ms ();
  c0 = cpu_ms ();
  t[T_SHUTDOWN] = t0 - t1;
  cpu[T_SHUTDOWN] = c0 - c1;
  t[T_TOTAL] = t[T_COMPILE] + t[T_FAST] + t[T_CYCLE] + t[T_SHUTDOWN];
  cpu[T_TOTAL] = cpu[T_COMPILE] + cpu[T_FAST] + cpu[T_CYCLE] + cpu[T_SHUTDOWN];
  *cycles = pls_cycle_result_cycles (cr);
  *periodic = pls_cycle_result_periodic (cr);
  pls_cycle_result_stats (cr, cs);
  pls_shutdown_result_stats (sr, ss);
  ok = TRUE;

out:
  pls_cycle_result_free (cr);
  pls_shutdown_result_free (sr);
  return ok;
}

static gboolean
bench_file (const char *filename)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_file (filename, &error);
  g_autofree char *base = g_path_get_basename (filename);
  double t[N_T][N_RUNS], c[N_T][N_RUNS];
  pls_transient_stats cs = { 0 }, ss = { 0 };
  int cycles = 0, periodic = 0;

  if (doc == NULL)
    {
      fprintf (stderr, "bench-samples: %s\n", error->message);
      return FALSE;
    }
  for (int r = 0; r < N_RUNS; r++)
    {
      double one[N_T], cpu[N_T];

      if (!run_once (doc, one, cpu, &cycles, &periodic, &cs, &ss))
        return FALSE;
      for (int k = 0; k < N_T; k++)
        {
          t[k][r] = one[k];
          c[k][r] = cpu[k];
        }
    }
  for (int k = 0; k < N_T; k++)
    {
      qsort (t[k], N_RUNS, sizeof (double), cmp_double);
      qsort (c[k], N_RUNS, sizeof (double), cmp_double);
    }
  printf ("%-32s %8s %8s %8s\n", base, "best ms", "median", "best cpu");
  printf ("  %-30s %8.2f %8.2f %8.2f\n", "compile", t[T_COMPILE][0], t[T_COMPILE][N_RUNS / 2],
          c[T_COMPILE][0]);
  printf ("  %-30s %8.2f %8.2f %8.2f\n", "fast solves", t[T_FAST][0], t[T_FAST][N_RUNS / 2],
          c[T_FAST][0]);
  printf ("  %-30s %8.2f %8.2f %8.2f   cycles %d%s, steps %ld (+%ld rejected), "
          "Newton %ld, factorisations %ld\n", "cycle", t[T_CYCLE][0],
          t[T_CYCLE][N_RUNS / 2], c[T_CYCLE][0], cycles, periodic ? "" : " (not periodic)",
          cs.steps, cs.rejected, cs.newton_iterations, cs.factorisations);
  printf ("  %-30s %8.2f %8.2f %8.2f   steps %ld (+%ld rejected), Newton %ld, "
          "factorisations %ld\n", "shutdown", t[T_SHUTDOWN][0], t[T_SHUTDOWN][N_RUNS / 2],
          c[T_SHUTDOWN][0], ss.steps, ss.rejected, ss.newton_iterations, ss.factorisations);
  printf ("  %-30s %8.2f %8.2f %8.2f\n", "total", t[T_TOTAL][0], t[T_TOTAL][N_RUNS / 2],
          c[T_TOTAL][0]);
  return TRUE;
}

int
main (int argc, char **argv)
{
  g_autoptr (GPtrArray) files = g_ptr_array_new_with_free_func (g_free);
  gboolean ok = TRUE;

  if (argc > 1)
    for (int i = 1; i < argc; i++)
      g_ptr_array_add (files, g_strdup (argv[i]));
  else
    {
      const char *root = g_getenv ("PRESSLINE_SOURCE_ROOT");
      g_autofree char *dir = g_build_filename (root != NULL ? root : SOURCE_ROOT, "samples",
                                               NULL);
      g_autoptr (GDir) d = g_dir_open (dir, 0, NULL);
      const char *name;

      if (d == NULL)
        {
          fprintf (stderr, "bench-samples: cannot open %s\n", dir);
          return EXIT_FAILURE;
        }
      while ((name = g_dir_read_name (d)) != NULL)
        if (g_str_has_suffix (name, ".pline"))
          g_ptr_array_add (files, g_build_filename (dir, name, NULL));
      g_ptr_array_sort (files, cmp_name);
    }
  printf ("bench-samples: %d runs each, wall and processor time\n", N_RUNS);
  for (guint i = 0; i < files->len; i++)
    ok = bench_file (g_ptr_array_index (files, i)) && ok;
  return ok ? EXIT_SUCCESS : EXIT_FAILURE;
}
