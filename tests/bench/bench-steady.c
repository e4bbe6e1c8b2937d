/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-steady: how the steady solve scales.  Builds manifolds of N
 * applicators (a pump, a feed hose, a header of N segments, a drop hose and
 * an applicator per station; "looped" adds a return hose from the header's
 * end to the pump and a cross-tie every 10 stations; "tree-pl" is the tree
 * with a power-law adhesive), solves them with all applicators open, and
 * prints per N: CHOLMOD set-up and analysis time of a fresh solve, the
 * whole fresh solve's time (pls_solve_steady: best and median of the
 * repetitions), the same re-solve with a warm workspace
 * (pls_solve_steady_with after a first solve of the same layout: the
 * analysis is reused), whether both gave bit-identical pressures, Newton
 * iterations, the peak memory of a fresh solve (a counting allocator that
 * CHOLMOD's workspace goes through too), and for N <= 300 the same solve
 * by a dense reference (GSL's hybridsj on the nodal balance) with the speed
 * ratio.  Then the growth from N = 10 000 to 100 000.  A program that
 * prints figures, not a test: run it from a release build.
 */

#include "config.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_linalg.h>
#include <gsl/gsl_multiroots.h>
#include <gsl/gsl_roots.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

#include "bench-common.h"

/* ---- the manifold ------------------------------------------------------ */

static pls_network *
manifold (int n, int looped, int power_law, const pls_allocator *alloc, int *n_parts)
{
  pls_fluid_params f;
  pls_pump_params pp;
  pls_line_params feed, header, drop;
  pls_nozzle_params z;
  pls_network *net;
  pls_error err;
  int tank, out, prev, i, first = -1;

  pls_fluid_params_init (&f);   /* Newtonian 1 Pa s adhesive */
  if (power_law)
    {
      /* A shear-thinning adhesive: K 5 Pa s^n, n 0.6 (a typical-looking
       * value for the benchmark, not a published one). */
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 5.0;
      f.flow_index = 0.6;
    }
  net = pls_network_new (&f, alloc, &err);
  memset (&pp, 0, sizeof pp);
  pp.ratio = 30.0;
  pp.displacement = 2e-6 * n;   /* 2 mL per station per double stroke */
  pp.max_cycle_rate = 1.0;
  pp.curve_exponent = 1.0;
  memset (&feed, 0, sizeof feed);
  feed.length = 10.0;
  feed.bore = 12.7e-3 * pow (n, 0.25);   /* sized with the demand */
  header = feed;
  header.length = 0.5;
  drop = feed;
  drop.length = 1.0;
  drop.bore = 6.35e-3;
  memset (&z, 0, sizeof z);
  z.orifice_diameter = 0.5e-3;
  z.orifice_length = 1e-3;
  z.cd_model = PLS_CD_LICHTAROWICZ;
  z.discharge_coefficient = 0.7;
  z.passage_resistance = 2e12;
  tank = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", &err);
  out = pls_network_add_node (net, 0.0, "out", &err);
  pls_network_add_pump (net, tank, out, &pp, "P", &err);
  prev = out;
  *n_parts = 1;
  for (i = 0; i < n; i++)
    {
      int h = pls_network_add_node (net, 0.0, NULL, &err);
      int s = pls_network_add_node (net, 0.0, NULL, &err);

      pls_network_add_line (net, prev, h, i == 0 ? &feed : &header, NULL, &err);
      pls_network_add_line (net, h, s, &drop, NULL, &err);
      pls_network_add_nozzle (net, s, &z, NULL, &err);
      *n_parts += 3;
      if (looped && i > 0 && i % 10 == 0)
        {
          pls_network_add_line (net, first, s, &drop, NULL, &err);   /* cross-tie */
          (*n_parts)++;
        }
      if (i == 0)
        first = s;
      prev = h;
    }
  if (looped)
    {
      pls_network_add_line (net, prev, out, &feed, NULL, &err);
      (*n_parts)++;
    }
  return net;
}

/* ---- dense reference (as in test-reference.c) -------------------------- */

typedef struct
{
  const pls_network *net;
  double air, ps, qs;
  int *col;
  size_t n;
  const pls_element *e;
  double target;
} ref;

static double
inv_f (double q, void *data)
{
  ref *r = data;
  pls_drop d;

  pls__element_drop (r->net, r->e, r->air, q, &d);
  return d.h - r->target;
}

static double
invert (ref *r, const pls_element *e, double dp, double *slope)
{
  gsl_function fn = { inv_f, r };
  gsl_root_fsolver *s = gsl_root_fsolver_alloc (gsl_root_fsolver_brent);
  double lo = 0.0, hi = 0.0, q;
  pls_drop d;
  int it;

  r->e = e;
  r->target = dp;
  if (inv_f (0.0, r) < 0.0)
    {
      hi = 1e-9;
      while (inv_f (hi, r) < 0.0)
        {
          lo = hi;
          hi *= 2.0;
        }
    }
  else
    {
      lo = -1e-9;
      while (inv_f (lo, r) > 0.0)
        {
          hi = lo;
          lo *= 2.0;
        }
    }
  q = 0.5 * (lo + hi);
  if (inv_f (lo, r) != 0.0 && inv_f (hi, r) != 0.0)
    {
      gsl_root_fsolver_set (s, &fn, lo, hi);
      for (it = 0; it < 200; it++)
        {
          gsl_root_fsolver_iterate (s);
          q = gsl_root_fsolver_root (s);
          if (gsl_root_test_interval (gsl_root_fsolver_x_lower (s),
                                      gsl_root_fsolver_x_upper (s), 0.0, 1e-14)
              == GSL_SUCCESS)
            break;
        }
    }
  gsl_root_fsolver_free (s);
  pls__element_drop (r->net, e, r->air, q, &d);
  *slope = d.dh_dq;
  return q;
}

static int
ref_fdf (const gsl_vector *x, void *data, gsl_vector *f, gsl_matrix *jac)
{
  ref *r = data;
  size_t k;

  if (f)
    gsl_vector_set_zero (f);
  if (jac)
    gsl_matrix_set_zero (jac);
  for (k = 0; k < r->net->n_elements; k++)
    {
      const pls_element *e = &r->net->elements[k];
      int ca = r->col[e->a], cb = e->b >= 0 ? r->col[e->b] : -1;
      double pa = ca >= 0 ? gsl_vector_get (x, (size_t) ca) * r->ps : 0.0;
      double pb = cb >= 0 ? gsl_vector_get (x, (size_t) cb) * r->ps : 0.0, slope, q;

      q = invert (r, e, pa - pb, &slope);
      if (f && ca >= 0)
        *gsl_vector_ptr (f, (size_t) ca) += q / r->qs;
      if (f && cb >= 0)
        *gsl_vector_ptr (f, (size_t) cb) -= q / r->qs;
      if (jac)
        {
          double g = r->ps / (slope * r->qs);

          if (ca >= 0)
            *gsl_matrix_ptr (jac, (size_t) ca, (size_t) ca) += g;
          if (cb >= 0)
            *gsl_matrix_ptr (jac, (size_t) cb, (size_t) cb) += g;
          if (ca >= 0 && cb >= 0)
            {
              *gsl_matrix_ptr (jac, (size_t) ca, (size_t) cb) -= g;
              *gsl_matrix_ptr (jac, (size_t) cb, (size_t) ca) -= g;
            }
        }
    }
  return GSL_SUCCESS;
}

static int
ref_f (const gsl_vector *x, void *d, gsl_vector *f)
{
  return ref_fdf (x, d, f, NULL);
}

static int
ref_df (const gsl_vector *x, void *d, gsl_matrix *j)
{
  return ref_fdf (x, d, NULL, j);
}

/* Start of the dense reference: the pump by its tangent at zero flow, every
 * other part by its secant through a nominal flow (the free flow shared by
 * the applicators): a linear network, solved by GSL's dense LU. */
static void
linear_start (ref *r, double qnom, gsl_vector *x)
{
  gsl_matrix *jac = gsl_matrix_calloc (r->n, r->n);
  gsl_vector *rhs = gsl_vector_calloc (r->n);
  gsl_permutation *perm = gsl_permutation_alloc (r->n);
  size_t k;
  int sign;

  for (k = 0; k < r->net->n_elements; k++)
    {
      const pls_element *e = &r->net->elements[k];
      int ca = r->col[e->a], cb = e->b >= 0 ? r->col[e->b] : -1;
      double g, q0 = 0.0;
      pls_drop d;

      if (e->kind == PLS_ELEMENT_PUMP)
        {
          pls__element_drop (r->net, e, r->air, 0.0, &d);
          g = 1.0 / d.dh_dq;
          q0 = -d.h * g;
        }
      else
        {
          pls__element_drop (r->net, e, r->air, qnom, &d);
          g = qnom / d.h;
        }
      /* q = q0 + g (Pa - Pb); all fixed pressures here are 0 at height 0. */
      if (ca >= 0)
        {
          *gsl_matrix_ptr (jac, (size_t) ca, (size_t) ca) += g * r->ps;
          *gsl_vector_ptr (rhs, (size_t) ca) -= q0;
          if (cb >= 0)
            *gsl_matrix_ptr (jac, (size_t) ca, (size_t) cb) -= g * r->ps;
        }
      if (cb >= 0)
        {
          *gsl_matrix_ptr (jac, (size_t) cb, (size_t) cb) += g * r->ps;
          *gsl_vector_ptr (rhs, (size_t) cb) += q0;
          if (ca >= 0)
            *gsl_matrix_ptr (jac, (size_t) cb, (size_t) ca) -= g * r->ps;
        }
    }
  gsl_linalg_LU_decomp (jac, perm, &sign);
  gsl_linalg_LU_solve (jac, perm, rhs, x);
  gsl_matrix_free (jac);
  gsl_vector_free (rhs);
  gsl_permutation_free (perm);
}

/* Dense reference solve from the linear start; returns seconds, or -1 if
 * it did not converge.  max_rel: largest relative pressure difference. */
static double
dense_reference (const pls_network *net, double air, double *max_rel,
                 const pls_steady_result *res)
{
  ref r;
  size_t i, n = 0;
  gsl_multiroot_function_fdf fdf;
  gsl_multiroot_fdfsolver *s;
  gsl_vector *x;
  double t0 = now (), t;
  int it, restart, status = GSL_CONTINUE;

  memset (&r, 0, sizeof r);
  r.net = net;
  r.air = air;
  r.col = malloc (net->n_nodes * sizeof *r.col);
  for (i = 0; i < net->n_nodes; i++)
    r.col[i] = net->nodes[i].fixed ? -1 : (int) n++;
  r.n = n;
  r.ps = pls_pump_stall_pressure (&net->elements[0].u.pump, air);
  r.qs = pls_pump_free_flow (&net->elements[0].u.pump);
  fdf = (gsl_multiroot_function_fdf) { ref_f, ref_df, ref_fdf, n, &r };
  s = gsl_multiroot_fdfsolver_alloc (gsl_multiroot_fdfsolver_hybridsj, n);
  x = gsl_vector_alloc (n);
  {
    size_t nz = 0;

    for (i = 0; i < net->n_elements; i++)
      nz += net->elements[i].kind == PLS_ELEMENT_NOZZLE;
    linear_start (&r, r.qs / (double) (nz ? nz : 1), x);
  }
  /* Restarted where it stops making progress, as in test-reference.c. */
  for (restart = 0; restart < 4 && status == GSL_CONTINUE; restart++)
    {
      gsl_multiroot_fdfsolver_set (s, &fdf, restart == 0 ? x : s->x);
      for (it = 0; it < 1000 && status == GSL_CONTINUE; it++)
        {
          if (gsl_multiroot_fdfsolver_iterate (s) != GSL_SUCCESS)
            break;
          /* Sum of |imbalance| below 1e-10 of the free flow: the flows
           * found by Brent carry noise near 1e-12 of it. */
          status = gsl_multiroot_test_residual (s->f, 1e-10);
        }
    }
  t = now () - t0;
  *max_rel = 0.0;
  for (i = 0; i < net->n_nodes; i++)
    if (r.col[i] >= 0)
      {
        double pr = gsl_vector_get (s->x, (size_t) r.col[i]) * r.ps;
        double d = fabs (pr - pls_steady_node_pressure (res, (int) i)) / fabs (pr);

        if (d > *max_rel)
          *max_rel = d;
      }
  gsl_vector_free (x);
  gsl_multiroot_fdfsolver_free (s);
  free (r.col);
  return status == GSL_SUCCESS ? t : -1.0;
}

static int
cmp_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static double
median (double *v, int n)
{
  qsort (v, (size_t) n, sizeof *v, cmp_double);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

#define MAX_REPS 200

typedef struct
{
  double fresh_best, fresh_med, reuse_best, reuse_med;
  int iterations;
} row_times;

/* One row: the layout solved fresh and with a warm workspace. */
static int
bench_row (const char *label, int n, int looped, int power_law, row_times *times)
{
  int parts, rep, reps = n <= 1000 ? 200 : n <= 10000 ? 15 : 5, same = 1;
  counter c = { 0, 0 };
  pls_allocator alloc = { c_malloc, c_calloc, c_realloc, c_free, &c };
  pls_network *net = manifold (n, looped, power_law, &alloc, &parts);
  pls_steady_workspace *ws = pls_steady_workspace_new (&alloc, NULL);
  pls_steady_options o;
  pls_steady_result *r = NULL, *rw = NULL;
  pls_error err;
  double fresh[MAX_REPS], reuse[MAX_REPS], best_an = INFINITY, peak;
  long analyses;
  size_t i;

  if (net == NULL || ws == NULL)
    {
      printf ("N %d: out of memory\n", n);
      return 0;
    }
  pls_steady_options_init (&o);
  o.applicators = PLS_APPLICATORS_ALL;
  c.peak = c.current;
  for (rep = 0; rep < reps; rep++)
    {
      double t0 = now ();
      pls_status st = pls_solve_steady (net, &o, &r, &err);

      fresh[rep] = now () - t0;
      if (st != PLS_OK)
        {
          printf ("N %d: %s\n", n, err.message);
          return 0;
        }
      if (r->t_analyse < best_an)
        best_an = r->t_analyse;
      if (rep + 1 < reps)
        {
          pls_steady_result_free (r);
          r = NULL;
        }
    }
  peak = (double) c.peak / 1048576.0;
  /* Warm the workspace (the one analysis), then time the re-solves. */
  if (pls_solve_steady_with (ws, net, &o, &rw, &err) != PLS_OK)
    {
      printf ("N %d: %s\n", n, err.message);
      return 0;
    }
  for (rep = 0; rep < reps; rep++)
    {
      double t0;
      pls_status st;

      pls_steady_result_free (rw);
      rw = NULL;
      t0 = now ();
      st = pls_solve_steady_with (ws, net, &o, &rw, &err);
      reuse[rep] = now () - t0;
      if (st != PLS_OK)
        {
          printf ("N %d: %s\n", n, err.message);
          return 0;
        }
    }
  analyses = pls_steady_workspace_analyses (ws);
  for (i = 0; i < net->n_nodes; i++)
    same &= pls_steady_node_pressure (r, (int) i) == pls_steady_node_pressure (rw, (int) i);
  times->fresh_best = fresh[0];
  times->reuse_best = reuse[0];
  for (rep = 1; rep < reps; rep++)
    {
      times->fresh_best = fmin (times->fresh_best, fresh[rep]);
      times->reuse_best = fmin (times->reuse_best, reuse[rep]);
    }
  times->iterations = pls_steady_result_iterations (r);
  times->fresh_med = median (fresh, reps);
  times->reuse_med = median (reuse, reps);
  printf ("%-7s %7d %7d %8.3f %9.3f %9.3f %9.3f %9.3f %3s %2ld %4d %8.2f", label, n, parts,
          1e3 * best_an, 1e3 * times->fresh_best, 1e3 * times->fresh_med,
          1e3 * times->reuse_best, 1e3 * times->reuse_med, same ? "yes" : "NO", analyses,
          pls_steady_result_iterations (r), peak);
  if (n <= 300)
    {
      double rel, td = dense_reference (net, o.air_pressure, &rel, r);

      if (td >= 0.0)
        printf (" %9.2f %6.0f %8.1e\n", 1e3 * td, td / times->fresh_best, rel);
      else
        printf (" %9s %6s %8s\n", "no conv.", "-", "-");
    }
  else
    printf (" %9s %6s %8s\n", "-", "-", "-");
  fflush (stdout);
  pls_steady_result_free (r);
  pls_steady_result_free (rw);
  pls_steady_workspace_free (ws);
  pls_network_free (net);
  return 1;
}

int
main (void)
{
  static const int sizes[] = { 10, 33, 100, 300, 1000, 10000, 100000 };
  enum { N_SIZES = sizeof sizes / sizeof sizes[0] };
  row_times t[2][N_SIZES], pl;
  size_t i;
  int looped;

  pls_route_cholmod_allocations ();
  gsl_set_error_handler_off ();
  printf ("times in ms; fresh: pls_solve_steady, reuse: pls_solve_steady_with on a warm "
          "workspace\n");
  printf ("%-7s %7s %7s %8s %9s %9s %9s %9s %3s %2s %4s %8s %9s %6s %8s\n", "feed", "N",
          "parts", "analyse", "fresh", "fresh_med", "reuse", "reuse_med", "id", "an", "iter",
          "peak_MiB", "dense_ms", "ratio", "dense_dp");
  for (looped = 0; looped < 2; looped++)
    for (i = 0; i < N_SIZES; i++)
      if (!bench_row (looped ? "looped" : "tree", sizes[i], looped, 0, &t[looped][i]))
        return EXIT_FAILURE;
  /* Power-law adhesive: 100 parts (N = 33) and 100 000 applicators. */
  if (!bench_row ("tree-pl", 33, 0, 1, &pl) || !bench_row ("tree-pl", 100000, 0, 1, &pl))
    return EXIT_FAILURE;
  /* Newton needs one more iteration for the tree at 1e5 (its last step is
   * just above the 1e-3 Pa tolerance), so the ratio per iteration is shown
   * beside the plain one. */
  printf ("\ngrowth 10 000 -> 100 000 applicators (best times; linear = 10x):\n");
  for (looped = 0; looped < 2; looped++)
    {
      const row_times *a = &t[looped][N_SIZES - 2], *b = &t[looped][N_SIZES - 1];
      double per = (double) a->iterations / (double) b->iterations;

      printf ("%-7s fresh %5.2fx   reuse %5.2fx   (iterations %d -> %d; per iteration: "
              "fresh %5.2fx, reuse %5.2fx)\n", looped ? "looped" : "tree",
              b->fresh_best / a->fresh_best, b->reuse_best / a->reuse_best, a->iterations,
              b->iterations, per * b->fresh_best / a->fresh_best,
              per * b->reuse_best / a->reuse_best);
    }
  return EXIT_SUCCESS;
}
