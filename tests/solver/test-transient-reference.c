/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-transient-reference.c: the integrator against an independent one.
 * Small layouts (about 30 states) are integrated over a full firing cycle
 * from idle by the solver's TR-BDF2 and by the GNU Scientific Library's
 * multistep BDF (gsl_odeiv2_step_msbdf, with its driver at a tight
 * tolerance) on the same ODE right-hand side (pls__ode_rhs: node
 * pressures and inertial flows, algebraic flows solved from their laws).
 * GSL is restarted at every valve event, where the right side has a kink.
 * Node pressures must agree within 0.1 % of the cycle's swing at every
 * step of the solver (the brief's figure; the solver runs at rtol 1e-6,
 * GSL at 1e-10, so the difference is the solver's own error).
 */

#include "config.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_matrix.h>
#include <gsl/gsl_odeiv2.h>

#include "pl-check.h"
#include "pressline-solver.h"
#include "pls-transient-private.h"
#include "test-transient-layouts.h"

typedef struct
{
  pls__model *m;
  const pls__schedule *s;
  size_t n;
  double *f0, *yp;
} ref_ode;

static int
ref_rhs (double t, const double y[], double dydt[], void *params)
{
  ref_ode *o = params;

  return pls__ode_rhs (o->m, t, o->s, y, dydt) == PLS_OK ? GSL_SUCCESS : GSL_EBADFUNC;
}

/* Jacobian by central differences (GSL's BDF needs one; a dense 30 x 30
 * is cheap).  Steps scaled to each state. */
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
      if (ref_rhs (t, o->yp, o->f0, o) != GSL_SUCCESS)
        return GSL_EBADFUNC;
      for (i = 0; i < n; i++)
        dfdy[i * n + j] = o->f0[i];
      o->yp[j] = y[j] - h;
      if (ref_rhs (t, o->yp, o->f0, o) != GSL_SUCCESS)
        return GSL_EBADFUNC;
      for (i = 0; i < n; i++)
        dfdy[i * n + j] = (dfdy[i * n + j] - o->f0[i]) / (2.0 * h);
      o->yp[j] = y[j];
    }
  for (i = 0; i < n; i++)
    dfdt[i] = 0.0;   /* the openings change in time: handled by restarts */
  return GSL_SUCCESS;
}

/* The solver's trajectory, recorded at its step ends. */
typedef struct
{
  size_t n_states, count, cap;
  double *t, *y;
} trajectory;

static pls_status
record_step (void *user_data, pls__model *m, double t0, double tg, double t1)
{
  trajectory *tr = user_data;

  (void) t0;
  (void) tg;
  if (tr->count == tr->cap)
    {
      tr->cap = tr->cap ? 2 * tr->cap : 1024;
      tr->t = realloc (tr->t, tr->cap * sizeof *tr->t);
      tr->y = realloc (tr->y, tr->cap * tr->n_states * sizeof *tr->y);
      ck_assert (tr->t != NULL && tr->y != NULL);
    }
  tr->t[tr->count] = t1;
  pls__ode_pack (m, tr->y + tr->count * tr->n_states);
  tr->count++;
  return PLS_OK;
}

static const int ref_apps[] = { 1, 3 };

START_TEST (test_against_msbdf)
{
  pls_test_layout l = pls_test_layout_new (ref_apps[_i], 0, 10e-3);
  pls_transient_options to;
  pls__model *m = NULL, *mg = NULL;
  pls__schedule s = { 0 };
  trajectory tr = { 0 };
  pls_error err;
  double delays[64] = { 0 }, *y, *y0, lo = INFINITY, hi = -INFINITY, worst = 0.0, t, period;
  size_t n, i, k;
  gsl_odeiv2_system sys;
  gsl_odeiv2_driver *drv;
  ref_ode ro;

  pls_transient_options_init (&to);
  to.max_segments = 3;
  to.rtol = 1e-6;
  to.atol_pressure = 1e-2;
  to.atol_flow = 1e-13;
  period = 1.0 / to.cycle_rate;
  /* Staggered firing: the last station 10 ms after the first. */
  for (k = 0; k < (size_t) l.n_app; k++)
    delays[l.first_app + (int) k * l.app_stride] = 0.01 * (double) k;
  ck_assert_msg (pls__transient_start (l.net, &to, &m, &err) == PLS_OK, "%s", err.message);
  ck_assert_msg (pls__transient_start (l.net, &to, &mg, &err) == PLS_OK, "%s", err.message);
  n = pls__ode_size (m);
  ck_assert_uint_ge (n, 10);
  ck_assert_uint_le (n, 45);

  s.kind = PLS__SCHED_FIRING;
  s.period = period;
  s.on_time = to.on_time;
  s.open_ramp = to.open_ramp;
  s.close_ramp = to.close_ramp;
  {
    double app_delay[8] = { 0 };

    for (k = 0; k < m->n_app; k++)
      app_delay[k] = delays[m->app_elem[k]];
    s.delay = app_delay;
    tr.n_states = n;
    y0 = malloc (n * sizeof *y0);
    pls__ode_pack (m, y0);
    m->tol.h_max = period / 20.0;
    ck_assert_msg (pls__integrate (m, &s, 0.0, period, record_step, &tr, &err) == PLS_OK,
                   "%s", err.message);

    /* GSL from the same start, event to event, through every step end. */
    ro.m = mg;
    ro.s = &s;
    ro.n = n;
    ro.f0 = malloc (n * sizeof *ro.f0);
    ro.yp = malloc (n * sizeof *ro.yp);
    y = malloc (n * sizeof *y);
    memcpy (y, y0, n * sizeof *y);
    sys.function = ref_rhs;
    sys.jacobian = ref_jac;
    sys.dimension = n;
    sys.params = &ro;
    drv = gsl_odeiv2_driver_alloc_y_new (&sys, gsl_odeiv2_step_msbdf, 1e-8, 1e-10, 0.0);
    ck_assert_ptr_nonnull (drv);
    gsl_odeiv2_driver_set_hmax (drv, period / 20.0);
    t = 0.0;
    for (i = 0; i < tr.count; i++)
      {
        double te = pls__schedule_next_event (mg, &s, t), target = tr.t[i];
        size_t j;

        while (te < target - 1e-12)
          {
            ck_assert_int_eq (gsl_odeiv2_driver_apply (drv, &t, te, y), GSL_SUCCESS);
            t = te;
            gsl_odeiv2_driver_reset (drv);
            te = pls__schedule_next_event (mg, &s, t);
          }
        ck_assert_int_eq (gsl_odeiv2_driver_apply (drv, &t, target, y), GSL_SUCCESS);
        t = target;
        if (fabs (te - target) <= 1e-12 * period)
          gsl_odeiv2_driver_reset (drv);
        for (j = 0; j < mg->nf; j++)
          {
            double mine = tr.y[i * n + j];

            lo = fmin (lo, fmin (mine, y[j]));
            hi = fmax (hi, fmax (mine, y[j]));
            worst = fmax (worst, fabs (mine - y[j]));
          }
      }
    ck_assert_double_gt (hi - lo, 1e5);
    ck_assert_msg (worst <= 1e-3 * (hi - lo), "largest difference %g Pa, swing %g Pa",
                   worst, hi - lo);
    gsl_odeiv2_driver_free (drv);
    free (ro.f0);
    free (ro.yp);
    free (y);
    free (y0);
  }
  free (tr.t);
  free (tr.y);
  pls__model_free (m);
  pls__model_free (mg);
  pls_network_free (l.net);
}
END_TEST

static Suite *
transient_reference_suite (void)
{
  Suite *s = suite_create ("transient-reference");
  TCase *tc = tcase_create ("msbdf");

  tcase_set_timeout (tc, 120);
  tcase_add_loop_test (tc, test_against_msbdf, 0, (int) (sizeof ref_apps / sizeof ref_apps[0]));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  pls_route_cholmod_allocations ();
  return pl_check_run (transient_reference_suite ());
}
