/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-reference.c: random layouts (trees and looped ones, all three
 * viscosity laws, hoses of random length and bore at random heights,
 * applicators, a pump) solved by the network solver and, independently,
 * by GSL's multiroot solver (gsl_multiroot_fdfsolver_hybridsj, Powell's
 * hybrid method with a dense Jacobian) on the nodal mass balance with the
 * same law functions, each link's flow found from its pressure difference
 * by GSL's Brent root finder.  Only the equations are shared, not the
 * method: a bug in the gradient algorithm, the topology or the sparse
 * assembly shows up as a disagreement.
 */

#include "config.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_multiroots.h>
#include <gsl/gsl_roots.h>
#include <gsl/gsl_vector.h>
#include <gsl/gsl_linalg.h>

#include "pressline-solver.h"
#include "pls-network-private.h"

#define MAX_FREE 16
#define N_SEEDS 60

/* Small deterministic generator (a 64-bit LCG, Knuth MMIX constants), so
 * every seed builds the same layout on every machine. */
static double
rnd (unsigned long long *s)
{
  *s = *s * 6364136223846793005ULL + 1442695040888963407ULL;
  return (double) (*s >> 11) / 9007199254740992.0;
}

typedef struct
{
  pls_network *net;
  double air;
  size_t n_free;
  int free_node[MAX_FREE];   /* network node of each unknown */
  int col[MAX_FREE + 1];     /* unknown of each network node, -1 fixed */
} ref_layout;

static void
build (unsigned long long seed, ref_layout *rl)
{
  unsigned long long s = seed * 7919ULL + 17ULL;
  pls_fluid_params f;
  pls_pump_params pp;
  pls_error err;
  int tank, i, n, law = (int) (seed % 3), loops = (seed / 3) % 2;

  pls_fluid_params_init (&f);
  if (law == 0)
    {
      f.law = PLS_VISCOSITY_NEWTONIAN;
      f.mu = 0.5 + 4.5 * rnd (&s);
    }
  else if (law == 1)
    {
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 2.0 + 18.0 * rnd (&s);
      f.flow_index = 0.3 + 0.6 * rnd (&s);
    }
  else
    {
      f.law = PLS_VISCOSITY_CARREAU;
      f.mu_zero = 1.0 + 9.0 * rnd (&s);
      f.mu_infinity = 0.01;
      f.lambda = 0.01 + rnd (&s);
      f.flow_index = 0.3 + 0.5 * rnd (&s);
    }
  rl->net = pls_network_new (&f, NULL, &err);
  ck_assert_msg (rl->net != NULL, "%s", err.message);
  rl->air = 4e5 + 3e5 * rnd (&s);
  n = 4 + (int) (10.0 * rnd (&s));
  tank = pls_network_add_fixed_node (rl->net, 0.0, 0.0, "tank", &err);
  rl->col[tank] = -1;
  for (i = 0; i < n; i++)
    {
      int nd = pls_network_add_node (rl->net, -2.0 + 4.0 * rnd (&s), NULL, &err);

      rl->col[nd] = i;
      rl->free_node[i] = nd;
    }
  rl->n_free = (size_t) n;
  memset (&pp, 0, sizeof pp);
  pp.ratio = 20.0 + 30.0 * rnd (&s);
  pp.displacement = 5e-6 + 2e-5 * rnd (&s);
  pp.max_cycle_rate = 0.5 + rnd (&s);
  pp.curve_exponent = 0.7 + 0.8 * rnd (&s);
  ck_assert_int_ge (pls_network_add_pump (rl->net, tank, rl->free_node[0], &pp, "P", &err), 0);
  for (i = 1; i < n + (loops ? n / 3 : 0); i++)
    {
      pls_line_params h;
      int a, b;

      memset (&h, 0, sizeof h);
      h.kind = PLS_LINE_HOSE;
      h.length = 0.5 + 9.5 * rnd (&s);
      h.bore = 3e-3 + 9e-3 * rnd (&s);
      if (i < n)
        {
          a = rl->free_node[(int) (rnd (&s) * i)];   /* a tree: parent < i */
          b = rl->free_node[i];
        }
      else
        {
          a = rl->free_node[(int) (rnd (&s) * n)];
          b = rl->free_node[(int) (rnd (&s) * n)];
          if (a == b)
            continue;
        }
      ck_assert_int_ge (pls_network_add_line (rl->net, a, b, &h, NULL, &err), 0);
    }
  for (i = 1; i < n; i++)
    if (i == n - 1 || rnd (&s) < 0.4)
      {
        pls_nozzle_params z;

        memset (&z, 0, sizeof z);
        z.orifice_diameter = 0.3e-3 + 0.7e-3 * rnd (&s);
        z.orifice_length = 2.0 * z.orifice_diameter;
        z.cd_model = rnd (&s) < 0.5 ? PLS_CD_FIXED : PLS_CD_LICHTAROWICZ;
        z.discharge_coefficient = 0.6 + 0.1 * rnd (&s);
        z.passage_resistance = 1e11 * rnd (&s);
        ck_assert_int_ge (pls_network_add_nozzle (rl->net, rl->free_node[i], &z, NULL, &err),
                          0);
      }
}

/* ---- the reference: nodal balance for GSL ----------------------------- */

typedef struct
{
  const ref_layout *rl;
  const pls_element *e;
  double target;
} inv_params;

static double
inv_f (double q, void *data)
{
  const inv_params *ip = data;
  pls_drop d;

  pls__element_drop (ip->rl->net, ip->e, ip->rl->air, q, &d);
  return d.h - ip->target;
}

/* Flow of element e at drop dp: bracket by doubling, then Brent to
 * round-off (h is monotone by the laws' contract). */
static double
invert (const ref_layout *rl, const pls_element *e, double dp, double *slope)
{
  inv_params ip = { rl, e, dp };
  gsl_function fn = { inv_f, &ip };
  gsl_root_fsolver *s = gsl_root_fsolver_alloc (gsl_root_fsolver_brent);
  double lo = 0.0, hi = 0.0, step = 1e-9, q;
  pls_drop d;
  int it;

  if (inv_f (0.0, &ip) < 0.0)
    {
      hi = step;
      while (inv_f (hi, &ip) < 0.0)
        {
          lo = hi;
          hi *= 2.0;
        }
    }
  else
    {
      lo = -step;
      while (inv_f (lo, &ip) > 0.0)
        {
          hi = lo;
          lo *= 2.0;
        }
    }
  q = 0.5 * (lo + hi);
  if (inv_f (lo, &ip) != 0.0 && inv_f (hi, &ip) != 0.0)
    {
      gsl_root_fsolver_set (s, &fn, lo, hi);
      for (it = 0; it < 200; it++)
        {
          gsl_root_fsolver_iterate (s);
          q = gsl_root_fsolver_root (s);
          lo = gsl_root_fsolver_x_lower (s);
          hi = gsl_root_fsolver_x_upper (s);
          if (gsl_root_test_interval (lo, hi, 0.0, 1e-15) == GSL_SUCCESS)
            break;
        }
    }
  else
    q = inv_f (lo, &ip) == 0.0 ? lo : hi;
  gsl_root_fsolver_free (s);
  pls__element_drop (rl->net, e, rl->air, q, &d);
  *slope = d.dh_dq;
  return q;
}

typedef struct
{
  const ref_layout *rl;
  double ps, qs;   /* scales: unknowns x = P / ps, residuals F / qs */
  double qnom;     /* nominal link flow for the start, m^3/s */
} sys_params;

static double
node_p (const sys_params *sp, const gsl_vector *x, int node, double rho_g)
{
  const pls_network *net = sp->rl->net;
  int c = sp->rl->col[node];

  if (c < 0)
    return net->nodes[node].pressure + rho_g * net->nodes[node].elevation;
  return gsl_vector_get (x, (size_t) c) * sp->ps;
}

static int
sys_fdf (const gsl_vector *x, void *data, gsl_vector *f, gsl_matrix *jac)
{
  const sys_params *sp = data;
  const pls_network *net = sp->rl->net;
  double rho_g = net->fluid.density * PLS_GRAVITY;
  size_t k;

  if (f != NULL)
    gsl_vector_set_zero (f);
  if (jac != NULL)
    gsl_matrix_set_zero (jac);
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      double pa = node_p (sp, x, e->a, rho_g), pb, q, slope;
      int ca = sp->rl->col[e->a], cb;

      if (e->b >= 0)
        {
          pb = node_p (sp, x, e->b, rho_g);
          cb = sp->rl->col[e->b];
        }
      else
        {
          pb = rho_g * net->nodes[e->a].elevation;   /* the atmosphere */
          cb = -1;
        }
      q = invert (sp->rl, e, pa - pb, &slope);
      if (f != NULL)
        {
          if (ca >= 0)
            gsl_vector_set (f, (size_t) ca, gsl_vector_get (f, (size_t) ca) + q / sp->qs);
          if (cb >= 0)
            gsl_vector_set (f, (size_t) cb, gsl_vector_get (f, (size_t) cb) - q / sp->qs);
        }
      if (jac != NULL)
        {
          double g = sp->ps / (slope * sp->qs);

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
sys_f (const gsl_vector *x, void *data, gsl_vector *f)
{
  return sys_fdf (x, data, f, NULL);
}

static int
sys_df (const gsl_vector *x, void *data, gsl_matrix *jac)
{
  return sys_fdf (x, data, NULL, jac);
}

/* The linear start: tangent at q = 0 of every law, in unknowns x = P/ps,
 * residuals in units of qs; jac x = rhs. */
static void
linear_start (const sys_params *sp, gsl_matrix *jac, gsl_vector *rhs)
{
  const pls_network *net = sp->rl->net;
  double rho_g = net->fluid.density * PLS_GRAVITY;
  size_t k;

  gsl_matrix_set_zero (jac);
  gsl_vector_set_zero (rhs);
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int ca = sp->rl->col[e->a], cb = e->b >= 0 ? sp->rl->col[e->b] : -1;
      double fa = 0.0, fb = 0.0, g, q0;
      pls_drop d;

      if (e->kind == PLS_ELEMENT_GAUGE || e->kind == PLS_ELEMENT_ACCUMULATOR)
        continue;
      if (e->kind == PLS_ELEMENT_PUMP)
        {
          /* Pump: its tangent at zero flow (stall, and the curve's slope). */
          pls__element_drop (net, e, sp->rl->air, 0.0, &d);
          g = 1.0 / d.dh_dq;
          q0 = -d.h * g;
        }
      else
        {
          /* Others: the secant through 0 and a nominal flow (the free flow
           * shared by the applicators): tangents at 0 of shear-thinning
           * laws are far too steep to start from. */
          pls__element_drop (net, e, sp->rl->air, sp->qnom, &d);
          g = sp->qnom / d.h;
          q0 = 0.0;
        }
      /* q = q0 + g (Pa - Pb): fixed ends go to the right side. */
      if (ca < 0)
        fa = net->nodes[e->a].pressure + rho_g * net->nodes[e->a].elevation;
      if (e->b < 0)
        fb = rho_g * net->nodes[e->a].elevation;
      else if (cb < 0)
        fb = net->nodes[e->b].pressure + rho_g * net->nodes[e->b].elevation;
      if (ca >= 0)
        {
          *gsl_matrix_ptr (jac, (size_t) ca, (size_t) ca) += g * sp->ps;
          *gsl_vector_ptr (rhs, (size_t) ca) -= q0 + g * (cb < 0 ? -fb : 0.0);
          if (cb >= 0)
            *gsl_matrix_ptr (jac, (size_t) ca, (size_t) cb) -= g * sp->ps;
        }
      if (cb >= 0)
        {
          *gsl_matrix_ptr (jac, (size_t) cb, (size_t) cb) += g * sp->ps;
          *gsl_vector_ptr (rhs, (size_t) cb) += q0 + g * (ca < 0 ? fa : 0.0);
          if (ca >= 0)
            *gsl_matrix_ptr (jac, (size_t) cb, (size_t) ca) -= g * sp->ps;
        }
    }
}

/* Solves the reference; pressures (Pa gauge) into p_ref[n_free]. */
static int
reference_solve (const ref_layout *rl, double stall, double qfree, const double *start,
                 double *p_ref)
{
  sys_params sp = { rl, stall, qfree, qfree };
  size_t k, nz = 0;

  for (k = 0; k < rl->net->n_elements; k++)
    nz += rl->net->elements[k].kind == PLS_ELEMENT_NOZZLE;
  sp.qnom = qfree / (double) (nz > 0 ? nz : 1);
  gsl_multiroot_function_fdf fdf = { sys_f, sys_df, sys_fdf, rl->n_free, &sp };
  gsl_multiroot_fdfsolver *s =
    gsl_multiroot_fdfsolver_alloc (gsl_multiroot_fdfsolver_hybridsj, rl->n_free);
  gsl_vector *x = gsl_vector_alloc (rl->n_free);
  double rho_g = rl->net->fluid.density * PLS_GRAVITY;
  int it, restart, status = GSL_CONTINUE;
  size_t i;

  /* Start: every link replaced by its tangent at zero flow, h(0) + h'(0) q
   * (a linear network, solved densely by GSL's LU); then Powell's hybrid
   * method, restarted from where it stalls if it stops making progress
   * (it keeps its trust region otherwise). */
  if (start != NULL)
    for (i = 0; i < rl->n_free; i++)
      gsl_vector_set (x, i, (start[i] + rho_g * rl->net->nodes[rl->free_node[i]].elevation)
                            / stall);
  else
  {
    gsl_matrix *jac = gsl_matrix_alloc (rl->n_free, rl->n_free);
    gsl_vector *rhs = gsl_vector_alloc (rl->n_free);
    gsl_permutation *perm = gsl_permutation_alloc (rl->n_free);
    int sign;

    linear_start (&sp, jac, rhs);
    gsl_linalg_LU_decomp (jac, perm, &sign);
    gsl_linalg_LU_solve (jac, perm, rhs, x);
    gsl_matrix_free (jac);
    gsl_vector_free (rhs);
    gsl_permutation_free (perm);
  }
  for (restart = 0; restart < 4 && status == GSL_CONTINUE; restart++)
    {
      gsl_multiroot_fdfsolver_set (s, &fdf, restart == 0 ? x : s->x);
      for (it = 0; it < 200 && status == GSL_CONTINUE; it++)
        {
          if (gsl_multiroot_fdfsolver_iterate (s) != GSL_SUCCESS)
            break;
          status = gsl_multiroot_test_residual (s->f, 1e-13);
          if (status == GSL_SUCCESS)
            status = gsl_multiroot_test_delta (s->dx, s->x, 0.0, 1e-14);
        }
    }
  for (i = 0; i < rl->n_free; i++)
    p_ref[i] = gsl_vector_get (s->x, i) * stall
               - rho_g * rl->net->nodes[rl->free_node[i]].elevation;
  gsl_vector_free (x);
  gsl_multiroot_fdfsolver_free (s);
  return status;
}

START_TEST (test_against_gsl)
{
  ref_layout rl;
  pls_steady_options o;
  pls_steady_result *r = NULL;
  pls_error err;
  double p_ref[MAX_FREE], stall, qfree;
  size_t i;
  int status;

  build ((unsigned long long) _i, &rl);
  pls_steady_options_init (&o);
  o.air_pressure = rl.air;
  o.applicators = PLS_APPLICATORS_ALL;
  o.pressure_tolerance = 1e-6;
  o.flow_tolerance = 1e-16;
  ck_assert_msg (pls_solve_steady (rl.net, &o, &r, &err) == PLS_OK, "seed %d: %s", _i,
                 err.message);
  stall = pls_pump_stall_pressure (&rl.net->elements[0].u.pump, rl.air);
  qfree = pls_pump_free_flow (&rl.net->elements[0].u.pump);
  status = reference_solve (&rl, stall, qfree, NULL, p_ref);
  if (status != GSL_SUCCESS)
    {
      /* Powell's method is local and some layouts defeat the linear start.
       * Then start it from the solver's pressures moved by up to +-30 %
       * each.  That cannot bias the check: the nodal balance is the
       * gradient of a strictly convex function (every law is strictly
       * increasing), so its root is unique and GSL can only converge to
       * the true one, wherever it starts. */
      unsigned long long s = (unsigned long long) _i + 99ULL;
      double start[MAX_FREE];

      for (i = 0; i < rl.n_free; i++)
        start[i] = pls_steady_node_pressure (r, rl.free_node[i]) * (0.7 + 0.6 * rnd (&s));
      status = reference_solve (&rl, stall, qfree, start, p_ref);
    }
  ck_assert_msg (status == GSL_SUCCESS, "seed %d: GSL reference did not converge (%s)", _i,
                 gsl_strerror (status));
  for (i = 0; i < rl.n_free; i++)
    {
      double p = pls_steady_node_pressure (r, rl.free_node[i]);

      /* 1e-8 relative (the target of the brief); the 1e-6 Pa floor covers
       * nodes near atmosphere, where 1e-8 relative is below round-off of
       * the pressures around them (1e-13 of stall). */
      ck_assert_msg (fabs (p - p_ref[i]) <= 1e-8 * fabs (p_ref[i]) + 1e-6,
                     "seed %d node %zu: solver %.12g, GSL %.12g", _i, i, p, p_ref[i]);
    }
  pls_steady_result_free (r);
  pls_network_free (rl.net);
}
END_TEST

static Suite *
reference_suite (void)
{
  Suite *s = suite_create ("reference");
  TCase *tc = tcase_create ("gsl-multiroot");

  tcase_add_loop_test (tc, test_against_gsl, 0, N_SEEDS);
  tcase_set_timeout (tc, 120);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  gsl_set_error_handler_off ();
  return pl_check_run (reference_suite ());
}
