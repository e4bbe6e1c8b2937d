/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-transient.c: figures of the time-domain side (a program, never a
 * test).  For manifolds of 10, 100 and 1000 applicators (the layouts of
 * tests/solver/test-transient-layouts.h): the firing cycle run to its
 * periodic state and the shutdown, with wall time, steps, Newton
 * iterations, factorisations and peak memory (a counting allocator that
 * also serves CHOLMOD); the typical layout of about 30 parts against its
 * 50 ms target; and on a layout of about 20 nodes one cycle by the
 * solver's TR-BDF2 against GSL's msbdf at equal accuracy.
 */

#include "config.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>

#include "pressline-solver.h"
#include "pls-transient-private.h"
#include "../solver/test-transient-layouts.h"

#include "bench-common.h"

static void
row (const char *what, int n, size_t parts, double ms, double cpu_ms,
     const pls_transient_stats *st, int cycles, size_t peak)
{
  printf ("%-9s %5d %6zu %9.1f %8.1f %7d %8ld %8ld %9ld %9ld %9.2f\n", what, n, parts, ms,
          cpu_ms, cycles, st->steps, st->rejected, st->newton_iterations, st->factorisations,
          (double) peak / 1048576.0);
}

/* Processor time of the process, s: a machine shared with other work
 * inflates it less than the wall time. */
static double
cpu_now (void)
{
  return (double) clock () / CLOCKS_PER_SEC;
}

/* ---- GSL reference on the same right side -------------------------------- */

typedef struct
{
  pls__model *m;
  const pls__schedule *s;
  size_t n;
  double *f0, *yp;
  long evals;
} ref_ode;

static int
ref_rhs (double t, const double y[], double dydt[], void *params)
{
  ref_ode *o = params;

  o->evals++;
  return pls__ode_rhs (o->m, t, o->s, y, dydt) == PLS_OK ? GSL_SUCCESS : GSL_EBADFUNC;
}

static int
ref_jac (double t, const double y[], double *dfdy, double dfdt[], void *params)
{
  ref_ode *o = params;
  size_t i, j, n = o->n;

  memcpy (o->yp, y, n * sizeof *y);
  for (j = 0; j < n; j++)
    {
      double h = 1e-7 * fmax (fabs (y[j]), j < o->m->nf ? 1e3 : 1e-9);

      o->yp[j] = y[j] + h;
      ref_rhs (t, o->yp, o->f0, o);
      for (i = 0; i < n; i++)
        dfdy[i * n + j] = o->f0[i];
      o->yp[j] = y[j] - h;
      ref_rhs (t, o->yp, o->f0, o);
      for (i = 0; i < n; i++)
        dfdy[i * n + j] = (dfdy[i * n + j] - o->f0[i]) / (2.0 * h);
      o->yp[j] = y[j];
    }
  for (i = 0; i < n; i++)
    dfdt[i] = 0.0;
  return GSL_SUCCESS;
}

/* One cycle by GSL msbdf at tolerance tol, event to event; y in/out. */
static int
gsl_cycle (pls__model *m, const pls__schedule *s, double period, double tol, double *y,
           long *evals)
{
  ref_ode ro;
  gsl_odeiv2_system sys;
  gsl_odeiv2_driver *drv;
  double t = 0.0;
  int status = GSL_SUCCESS;

  ro.m = m;
  ro.s = s;
  ro.n = pls__ode_size (m);
  ro.f0 = malloc (ro.n * sizeof (double));
  ro.yp = malloc (ro.n * sizeof (double));
  ro.evals = 0;
  sys.function = ref_rhs;
  sys.jacobian = ref_jac;
  sys.dimension = ro.n;
  sys.params = &ro;
  drv = gsl_odeiv2_driver_alloc_y_new (&sys, gsl_odeiv2_step_msbdf, 1e-6, tol, 0.0);
  gsl_odeiv2_driver_set_hmax (drv, period / 20.0);
  while (t < period && status == GSL_SUCCESS)
    {
      double te = fmin (pls__schedule_next_event (m, s, t), period);

      status = gsl_odeiv2_driver_apply (drv, &t, te, y);
      t = te;
      gsl_odeiv2_driver_reset (drv);
    }
  gsl_odeiv2_driver_free (drv);
  free (ro.f0);
  free (ro.yp);
  *evals = ro.evals;
  return status;
}

static double
max_diff_p (const pls__model *m, const double *a, const double *b)
{
  double w = 0.0;
  size_t j;

  for (j = 0; j < m->nf; j++)
    w = fmax (w, fabs (a[j] - b[j]));
  return w;
}

static void
bench_gsl (void)
{
  pls_test_layout l = pls_test_layout_new (3, 0, 10e-3);
  pls_transient_options to;
  pls__schedule s = { 0 };
  pls__model *m = NULL;
  pls_error err;
  double period, *y0, *yref, *ymine, *yg, t0, t_mine = 0.0, e_mine, tol, e_gsl = 0.0;
  double t_gsl = 0.0, best_tol = 0.0;
  size_t n;
  long evals = 0;
  int rep, reps = 20;

  pls_transient_options_init (&to);
  to.max_segments = 3;
  period = 1.0 / to.cycle_rate;
  if (pls__transient_start (l.net, &to, &m, &err) != PLS_OK)
    {
      printf ("gsl comparison: %s\n", err.message);
      return;
    }
  n = pls__ode_size (m);
  y0 = malloc (n * sizeof *y0);
  yref = malloc (n * sizeof *yref);
  ymine = malloc (n * sizeof *ymine);
  yg = malloc (n * sizeof *yg);
  pls__ode_pack (m, y0);
  s.kind = PLS__SCHED_FIRING;
  s.period = period;
  s.on_time = to.on_time;
  s.open_ramp = to.open_ramp;
  s.close_ramp = to.close_ramp;

  /* Reference: GSL at 1e-12. */
  memcpy (yref, y0, n * sizeof *y0);
  gsl_cycle (m, &s, period, 1e-12, yref, &evals);

  /* The solver at its default tolerance, timed over repetitions. */
  m->tol.h_max = period / 20.0;
  for (rep = 0; rep < reps; rep++)
    {
      pls__ode_unpack (m, y0);
      m->h_next = 0.0;
      t0 = now ();
      if (pls__integrate (m, &s, 0.0, period, NULL, NULL, &err) != PLS_OK)
        printf ("  TR-BDF2 run failed: %s\n", err.message);
      t_mine += now () - t0;
    }
  t_mine /= reps;
  pls__ode_pack (m, ymine);
  e_mine = max_diff_p (m, ymine, yref);

  /* GSL: the loosest tolerance (decades) that is at least as accurate. */
  for (tol = 1e-1; tol >= 1e-11; tol *= 0.1)
    {
      memcpy (yg, y0, n * sizeof *y0);
      t0 = now ();
      gsl_cycle (m, &s, period, tol, yg, &evals);
      t_gsl = now () - t0;
      e_gsl = max_diff_p (m, yg, yref);
      if (e_gsl <= e_mine)
        {
          best_tol = tol;
          break;
        }
    }
  printf ("\nOne firing cycle from idle, %zu nodes, %zu states (ODE size), error = largest "
          "node pressure\ndifference at the cycle's end from GSL msbdf at rtol 1e-12:\n",
          pls_network_node_count (l.net), n);
  printf ("  TR-BDF2 (rtol %g): %8.3f ms, error %8.3g Pa\n", to.rtol, 1e3 * t_mine, e_mine);
  printf ("  GSL msbdf (rtol %g, FD Jacobian): %8.3f ms, error %8.3g Pa, %ld rhs evals\n",
          best_tol, 1e3 * t_gsl, e_gsl, evals);
  printf ("  speed ratio at equal accuracy: %.1fx (target >= 10x)\n", t_gsl / t_mine);
  free (y0);
  free (yref);
  free (ymine);
  free (yg);
  pls__model_free (m);
  pls_network_free (l.net);
}

/* Usage: bench-transient [N ...]: without arguments the typical layout,
 * manifolds of 10, 100 and 1000 applicators and the GSL comparison; with
 * arguments only manifolds of those sizes (for side-by-side timing of one
 * size against another build). */
int
main (int argc, char **argv)
{
  int sizes[16] = { 8, 10, 100, 1000 };
  size_t i, n_sizes = 4;

  pls_route_cholmod_allocations ();
  printf ("Firing cycle to periodic state and shutdown (default options: 2 shots/s, 50 ms "
          "on,\n2 ms ramps, rtol 1e-3); peak memory through the network's allocator.\n\n");
  printf ("%-9s %5s %6s %9s %8s %7s %8s %8s %9s %9s %9s\n", "run", "apps", "parts", "wall ms",
          "cpu ms", "cycles", "steps", "rejected", "newton", "factor", "peak MiB");
  if (argc > 1)
    {
      n_sizes = 0;
      for (i = 1; i < (size_t) argc && n_sizes < sizeof sizes / sizeof sizes[0]; i++)
        {
          int n = atoi (argv[i]);

          if (n < 1)
            {
              fprintf (stderr, "bench-transient: not an applicator count: %s\n", argv[i]);
              return 2;
            }
          sizes[n_sizes++] = n;
        }
    }
  for (i = 0; i < n_sizes; i++)
    {
      int n = sizes[i];
      counter cnt = { 0, 0 };
      pls_allocator alloc = { c_malloc, c_calloc, c_realloc, c_free, &cnt };
      pls_test_layout l = pls_test_layout_new_with (n, 0, 10e-3, &alloc);
      pls_transient_options o;
      pls_cycle_result *cr = NULL;
      pls_shutdown_result *sr = NULL;
      pls_transient_stats st;
      pls_error err;
      size_t parts = pls_network_element_count (l.net);
      double t0, c0, t_cycle, t_shut, c_cycle, c_shut;

      pls_transient_options_init (&o);
      c0 = cpu_now ();
      t0 = now ();
      if (pls_solve_cycle (l.net, &o, &cr, &err) != PLS_OK)
        {
          printf ("cycle %d: %s\n", n, err.message);
          continue;
        }
      t_cycle = now () - t0;
      c_cycle = cpu_now () - c0;
      pls_cycle_result_stats (cr, &st);
      row ("cycle", n, parts, 1e3 * t_cycle, 1e3 * c_cycle, &st, pls_cycle_result_cycles (cr),
           cnt.peak);
      pls_cycle_result_free (cr);
      cnt.peak = cnt.current;
      c0 = cpu_now ();
      t0 = now ();
      if (pls_solve_shutdown (l.net, &o, &sr, &err) != PLS_OK)
        {
          printf ("shutdown %d: %s\n", n, err.message);
          continue;
        }
      t_shut = now () - t0;
      c_shut = cpu_now () - c0;
      pls_shutdown_result_stats (sr, &st);
      row ("shutdown", n, parts, 1e3 * t_shut, 1e3 * c_shut, &st, 0, cnt.peak);
      pls_shutdown_result_free (sr);
      if (n == 8)
        printf ("  typical layout (%zu parts): cycle + shutdown %.1f ms, cpu %.1f ms "
                "(target < 50 ms)\n", parts, 1e3 * (t_cycle + t_shut),
                1e3 * (c_cycle + c_shut));
      if (n == 1000)
        printf ("  1000 applicators: cycle + shutdown %.2f s, cpu %.2f s (target < 2 s)\n",
                t_cycle + t_shut, c_cycle + c_shut);
      pls_network_free (l.net);
    }
  if (argc <= 1)
    bench_gsl ();
  return 0;
}
