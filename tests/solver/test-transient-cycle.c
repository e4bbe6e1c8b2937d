/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-transient-cycle.c: the firing cycle on dispensing layouts: what it
 * reports, its invariants (volume balance, numbering, order of
 * convergence), its findings and the highest-rate search.
 */

#include "config.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "pl-check.h"
#include "pressline-solver.h"
#include "pls-transient-private.h"
#include "test-transient-layouts.h"

static pls_cycle_result *
run (const pls_network *net, const pls_transient_options *o)
{
  pls_cycle_result *r = NULL;
  pls_error err;

  ck_assert_msg (pls_solve_cycle (net, o, &r, &err) == PLS_OK, "%s", err.message);
  ck_assert_ptr_nonnull (r);
  return r;
}

static int
has_code (const pls_cycle_result *r, const char *code)
{
  size_t i;

  for (i = 0; i < pls_cycle_finding_count (r); i++)
    if (strcmp (pls_cycle_finding (r, i)->code, code) == 0)
      return 1;
  return 0;
}

/* What a cycle reports, on a 4-station layout. */
START_TEST (test_cycle_reports)
{
  pls_test_layout l = pls_test_layout_new (4, 0, 10e-3);
  pls_transient_options o;
  pls_cycle_result *r;
  pls_line_params hose = pls_test_hose (10.0, 12.7e-3);
  pls_fluid_params f;
  pls_cycle_accumulator acc;
  pls_cycle_pump pump;
  double area = 0.25 * PLS_PI_TEST * 12.7e-3 * 12.7e-3, c, n_expect;
  size_t s, ns;
  int i;

  pls_transient_options_init (&o);
  r = run (l.net, &o);
  ck_assert (pls_cycle_result_periodic (r));
  ck_assert_int_ge (pls_cycle_result_cycles (r), 2);
  ck_assert_double_lt (pls_cycle_result_change (r), o.periodic_tolerance);

  /* Segments of the supply hose: hose wave speed c = sqrt(A / (rho C')),
   * C' = A / K + expansion (a hose by its datasheet figure), N =
   * ceil(13 L / (c t_ramp)) capped at max_segments. */
  pls_fluid_params_init (&f);
  c = sqrt (area / (f.density * (area / f.bulk_modulus + hose.volumetric_expansion)));
  n_expect = fmin (ceil (13.0 * hose.length / (c * o.open_ramp)), o.max_segments);
  ck_assert_int_eq (pls_cycle_result_segments (r, l.supply), (int) n_expect);
  ck_assert_int_eq (pls_cycle_result_segments (r, l.acc), 0);

  /* Pressures: ordered, and no node above the pump's stall at idle. */
  for (i = 0; i < (int) pls_network_node_count (l.net); i++)
    {
      double lo = pls_cycle_node_min (r, i), hi = pls_cycle_node_max (r, i);
      double mean = pls_cycle_node_mean (r, i);

      ck_assert_double_le (lo, mean + 1e-6 * fabs (mean) + 1e-9);
      ck_assert_double_le (mean, hi + 1e-6 * fabs (hi) + 1e-9);
      ck_assert_double_le (hi, 1.02 * 18e6);
    }
  ck_assert_double_eq_tol (pls_cycle_node_idle (r, l.head), 18e6, 1e3);
  ck_assert_double_lt (pls_cycle_node_min (r, l.head), 18e6);

  /* The series starts and ends the periodic cycle at the same state. */
  ns = pls_cycle_sample_count (r);
  ck_assert_uint_eq (ns, (size_t) o.samples);
  ck_assert_double_eq_tol (pls_cycle_sample_time (r, ns - 1), 1.0 / o.cycle_rate, 1e-12);
  ck_assert_double_eq_tol (pls_cycle_sample_pressure (r, l.head, 0),
                           pls_cycle_sample_pressure (r, l.head, ns - 1),
                           10.0 * o.periodic_tolerance * 18e6);
  for (s = 0; s < ns; s++)
    {
      double p = pls_cycle_sample_pressure (r, l.head, s);

      ck_assert_double_ge (p, pls_cycle_node_min (r, l.head) - 1e3);
      ck_assert_double_le (p, pls_cycle_node_max (r, l.head) + 1e3);
    }

  /* Shots: positive, deviations summing to zero about the mean; the
   * station nearest the head shoots most. */
  {
    double sum = 0.0;

    for (i = 0; i < l.n_app; i++)
      {
        int e = l.first_app + i * l.app_stride;

        ck_assert_double_gt (pls_cycle_shot_mass (r, e), 0.0);
        sum += pls_cycle_shot_deviation (r, e);
      }
    ck_assert_double_eq_tol (sum, 0.0, 1e-12);
    ck_assert_double_gt (pls_cycle_shot_mass (r, l.first_app),
                         pls_cycle_shot_mass (r, l.first_app + (l.n_app - 1) * l.app_stride));
  }

  /* Accumulator swing and pump flow are consistent with each other. */
  ck_assert_int_eq (pls_cycle_accumulator_swing (r, l.acc, &acc), PLS_OK);
  ck_assert_double_lt (acc.min_pressure, acc.max_pressure);
  ck_assert_double_lt (acc.min_fluid_volume, acc.max_fluid_volume);
  ck_assert_int_eq (pls_cycle_pump_flow (r, l.pump, &pump), PLS_OK);
  ck_assert_double_gt (pump.volume, 0.0);
  ck_assert_double_le (pump.min_flow, pump.mean_flow);
  ck_assert_double_ge (pump.max_flow, pump.mean_flow);
  ck_assert_double_eq_tol (pump.mean_flow * (1.0 / o.cycle_rate), pump.volume, 1e-15);
  ck_assert_int_eq (pls_cycle_accumulator_swing (r, l.pump, &acc), PLS_OK);
  ck_assert_int_ne (pls_cycle_accumulator_swing (r, -1, &acc), PLS_OK);

  pls_cycle_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* Over a cycle, pump delivery = shot volume + change of the stored
 * volume.  The integrator writes the node balances on V(p) and integrates
 * each flow with its own quadrature weights, so this holds to the Newton
 * tolerance: 1e-6 relative is demanded (a conservation law, no source
 * needed; the tolerance is the brief's). */
static const int balance_n[] = { 1, 4 };

START_TEST (test_volume_balance)
{
  pls_test_layout l = pls_test_layout_new (balance_n[_i], 0, 10e-3);
  pls_transient_options o;
  pls_cycle_result *r;
  double pumped, shot, stored;

  pls_transient_options_init (&o);
  r = run (l.net, &o);
  pls_cycle_result_volumes (r, &pumped, &shot, &stored);
  ck_assert_double_gt (shot, 0.0);
  ck_assert_double_eq_tol (pumped, shot + stored, 1e-6 * shot);
  pls_cycle_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* The same layout with its nodes added in the opposite order: other
 * matrix columns, another fill-reducing ordering, the same physics.  The
 * step sequence can differ by round-off in the error norm, so agreement
 * is asked to 1e-4 of the swing (the local error per step is 1e-4 of the
 * pressure at the default tolerances, and most of it cancels). */
START_TEST (test_numbering)
{
  pls_test_layout a = pls_test_layout_new (4, 0, 10e-3);
  pls_test_layout b = pls_test_layout_new (4, 1, 10e-3);
  pls_transient_options o;
  pls_cycle_result *ra, *rb;
  const char *names[] = { "N1", "head", "S1", "T1", "S4", "T4" };
  double swing;
  size_t i;
  int k;

  pls_transient_options_init (&o);
  ra = run (a.net, &o);
  rb = run (b.net, &o);
  swing = pls_cycle_node_idle (ra, a.head) - pls_cycle_node_min (ra, pls_test_node_named (a.net,
                                                                                          "T4"));
  ck_assert_double_gt (swing, 1e5);
  for (i = 0; i < sizeof names / sizeof names[0]; i++)
    {
      int na = pls_test_node_named (a.net, names[i]), nb = pls_test_node_named (b.net, names[i]);

      ck_assert_int_ge (na, 0);
      ck_assert_int_ge (nb, 0);
      ck_assert_double_eq_tol (pls_cycle_node_min (ra, na), pls_cycle_node_min (rb, nb),
                               1e-4 * swing);
      ck_assert_double_eq_tol (pls_cycle_node_max (ra, na), pls_cycle_node_max (rb, nb),
                               1e-4 * swing);
      ck_assert_double_eq_tol (pls_cycle_node_mean (ra, na), pls_cycle_node_mean (rb, nb),
                               1e-4 * swing);
    }
  for (k = 0; k < a.n_app; k++)
    {
      char name[16];
      double ma, mb;

      snprintf (name, sizeof name, "A%d", k + 1);
      ma = pls_cycle_shot_mass (ra, pls_test_element_named (a.net, name));
      mb = pls_cycle_shot_mass (rb, pls_test_element_named (b.net, name));
      ck_assert_double_eq_tol (ma, mb, 1e-4 * ma);
    }
  pls_cycle_result_free (ra);
  pls_cycle_result_free (rb);
  pls_network_free (a.net);
  pls_network_free (b.net);
}
END_TEST

/* Tightening the tolerance converges at the method's order: TR-BDF2 is
 * second order (Bank et al. 1985), so the global error of the first shot
 * falls as steps^-2.  The slope of log error over log steps, fitted over
 * rtol 1e-3 .. 1e-6 against a run at 1e-9, must lie in [-2.6, -1.5]
 * (event landings and the controller's safety factor make it noisy, an
 * order-1 method would give -1). */
START_TEST (test_order)
{
  pls_test_layout l = pls_test_layout_new (2, 0, 10e-3);
  pls_transient_options o;
  const double rtols[] = { 1e-3, 1e-4, 1e-5, 1e-6 };
  double ref, lx[4], ly[4], sx = 0.0, sy = 0.0, sxx = 0.0, sxy = 0.0, slope;
  pls_cycle_result *r;
  pls_transient_stats st;
  int i;

  pls_transient_options_init (&o);
  o.max_cycles = 1;
  o.max_segments = 4;     /* a smaller ladder: the order is what is tested */
  o.atol_pressure = 1e-6;
  o.atol_flow = 1e-16;
  o.rtol = 1e-9;
  r = run (l.net, &o);
  ref = pls_cycle_shot_mass (r, l.first_app);
  pls_cycle_result_free (r);
  for (i = 0; i < 4; i++)
    {
      o.rtol = rtols[i];
      r = run (l.net, &o);
      pls_cycle_result_stats (r, &st);
      lx[i] = log ((double) st.steps);
      ly[i] = log (fabs (pls_cycle_shot_mass (r, l.first_app) - ref) / ref + 1e-300);
      pls_cycle_result_free (r);
    }
  for (i = 0; i < 4; i++)
    {
      sx += lx[i];
      sy += ly[i];
      sxx += lx[i] * lx[i];
      sxy += lx[i] * ly[i];
    }
  slope = (4.0 * sxy - sx * sy) / (4.0 * sxx - sx * sx);
  ck_assert_msg (slope > -2.6 && slope < -1.5, "convergence slope %g", slope);
  pls_network_free (l.net);
}
END_TEST

/* Findings.  Eight stations on the 40 mL, 2 /s pump: the pump's curve
 * (Q falls linearly to 0 at stall) cannot refill the accumulator before
 * the next shot, so the line does not recover.  Eight stations on a thin
 * 4 mm manifold: the far stations starve, outside the 2 % uniformity. */
START_TEST (test_findings)
{
  pls_test_layout weak = pls_test_layout_new (8, 0, 10e-3);
  pls_test_layout thin = pls_test_layout_new (8, 0, 4e-3);
  pls_test_layout fine = pls_test_layout_new (1, 0, 10e-3);
  pls_transient_options o;
  pls_cycle_result *r;

  pls_transient_options_init (&o);
  /* Three cycles show both from the first shot on (kept short for the
   * sanitizer runs); the fine layout below runs to its periodic state. */
  o.max_cycles = 3;
  r = run (weak.net, &o);
  ck_assert (has_code (r, "no-recovery"));
  ck_assert (!has_code (r, "shot-uniformity"));
  ck_assert_double_lt (pls_cycle_node_recovery (r, weak.head), 0.0);
  pls_cycle_result_free (r);

  r = run (thin.net, &o);
  ck_assert (has_code (r, "shot-uniformity"));
  pls_cycle_result_free (r);

  o.cycle_rate = 0.5;
  o.max_cycles = 200;
  r = run (fine.net, &o);
  ck_assert (!has_code (r, "no-recovery"));
  ck_assert (!has_code (r, "not-periodic"));
  ck_assert_double_ge (pls_cycle_node_recovery (r, fine.head), 0.0);
  ck_assert_double_lt (pls_cycle_node_recovery (r, fine.head), 2.0 - o.on_time);
  pls_cycle_result_free (r);

  pls_network_free (weak.net);
  pls_network_free (thin.net);
  pls_network_free (fine.net);
}
END_TEST

/* The highest rate: the shots at the rate found pass the criterion, 10 %
 * faster they do not (the search brackets to 1 %). */
START_TEST (test_max_rate)
{
  pls_test_layout l = pls_test_layout_new (1, 0, 10e-3);
  pls_transient_options o;
  pls_transient_stats st;
  pls_cycle_result *r;
  pls_error err;
  double rate = 0.0;
  int k, ok;

  pls_transient_options_init (&o);
  o.uniformity_tolerance = 0.05;
  ck_assert_msg (pls_cycle_max_rate (l.net, &o, 0.2, &rate, &st, &err) == PLS_OK, "%s",
                 err.message);
  ck_assert_double_gt (rate, 0.2);
  ck_assert_double_lt (rate, 1.0 / (o.on_time + o.close_ramp));
  ck_assert_int_gt (st.steps, 0);
  for (k = 0; k < 2; k++)
    {
      o.cycle_rate = k == 0 ? rate : 1.1 * rate;
      o.max_cycles = 200;
      if (o.cycle_rate >= 1.0 / (o.on_time + o.close_ramp))
        break;
      r = run (l.net, &o);
      ok = fabs (pls_cycle_shot_mass (r, l.first_app) - pls_cycle_first_shot_mass (r, l.first_app))
           <= o.uniformity_tolerance * pls_cycle_first_shot_mass (r, l.first_app);
      ck_assert_int_eq (ok, k == 0);
      pls_cycle_result_free (r);
    }
  pls_network_free (l.net);
}
END_TEST

/* Pump changeover: with a 30 ms gap at each stroke end the pump delivers
 * nothing for 30 ms after every half displacement (20 mL) of delivered
 * volume.  Over 16 firing cycles (about 27 mL shot) the integrator must
 * show exactly floor(delivered / 20 mL) gaps, each 30 ms long (to the
 * steps landing on its end), and keep the volume balance. */
typedef struct
{
  int link;
  int gaps, in_gap;
  double started, shortest, longest;
} gap_probe;

static pls_status
gap_step (void *user_data, pls__model *m, double t0, double tg, double t1)
{
  gap_probe *g = user_data;
  int off = !m->active[g->link];

  (void) tg;
  if (off && !g->in_gap)
    {
      g->gaps++;
      g->started = t0;
    }
  if (!off && g->in_gap)
    {
      g->shortest = fmin (g->shortest, t0 - g->started);
      g->longest = fmax (g->longest, t0 - g->started);
    }
  g->in_gap = off;
  return PLS_OK;
}

START_TEST (test_changeover)
{
  pls_test_layout l = pls_test_layout_new_full (8, 0, 10e-3, NULL, 0.03);
  pls_transient_options o;
  pls__model *m = NULL;
  pls__schedule s = { 0 };
  gap_probe g = { 0 };
  pls_error err;
  double delivered, v0, shot = 0.0;
  size_t k;

  pls_transient_options_init (&o);
  ck_assert_msg (pls__transient_start (l.net, &o, &m, &err) == PLS_OK, "%s", err.message);
  s.kind = PLS__SCHED_FIRING;
  s.period = 1.0 / o.cycle_rate;
  s.on_time = o.on_time;
  s.open_ramp = o.open_ramp;
  s.close_ramp = o.close_ramp;
  m->tol.h_max = s.period / 20.0;
  g.link = m->elem_link[l.pump];
  g.shortest = INFINITY;
  v0 = pls__stored_volume (m);
  ck_assert_msg (pls__integrate (m, &s, 0.0, 16.0 * s.period, gap_step, &g, &err) == PLS_OK,
                 "%s", err.message);
  delivered = m->qint[g.link];
  ck_assert_double_gt (delivered, 20e-6);
  /* A gap that starts at the very last step is seen by no callback. */
  if (m->gap_end[g.link] > 0.0 && !g.in_gap)
    g.gaps++;
  ck_assert_int_eq (g.gaps, (int) floor (delivered / 20e-6));
  ck_assert_double_eq_tol (g.shortest, 0.03, 1e-9);
  ck_assert_double_eq_tol (g.longest, 0.03, 1e-9);
  for (k = 0; k < m->n_app; k++)
    shot += m->qint[m->app_link[k]];
  ck_assert_double_eq_tol (delivered, shot + pls__stored_volume (m) - v0, 1e-6 * shot);
  pls__model_free (m);
  pls_network_free (l.net);
}
END_TEST

/* The periodic state found with extrapolation against plain repetition of
 * the cycle map ("brute-force" shooting) run far past the periodicity
 * tolerance.  The extrapolation is reduced rank extrapolation on the
 * end-of-cycle states (Smith, Ford & Sidi, SIAM Review 29(2), 1987); the
 * reference uses no extrapolation at all, only the integrator, so the two
 * share nothing but the model and the step rules.  Layouts: stations,
 * manifold bore (m). */
static const struct
{
  int stations;
  double bore;
} periodic_case[] = {
  { 1, 10e-3 },
  { 3, 6e-3 },
};

START_TEST (test_periodic_matches_brute_force)
{
  pls_test_layout l = pls_test_layout_new (periodic_case[_i].stations, 0,
                                           periodic_case[_i].bore);
  pls_transient_options o;
  pls_cycle_result *r;
  pls__model *m = NULL;
  pls__schedule s;
  pls_error err;
  double *pprev, pref = 1.0, t = 0.0, change = 1.0, last = 0.0, lambda = 0.0, tol;
  size_t i, n_net = pls_network_node_count (l.net);
  int c, brute = 0;

  pls_transient_options_init (&o);
  r = run (l.net, &o);
  ck_assert (pls_cycle_result_periodic (r));

  ck_assert_msg (pls__transient_start (l.net, &o, &m, &err) == PLS_OK, "%s", err.message);
  pprev = calloc (m->n_nodes, sizeof *pprev);
  ck_assert_ptr_nonnull (pprev);
  memset (&s, 0, sizeof s);
  s.kind = PLS__SCHED_FIRING;
  s.period = 1.0 / o.cycle_rate;
  s.on_time = o.on_time;
  s.open_ramp = o.open_ramp;
  s.close_ramp = o.close_ramp;
  s.delay = NULL;
  /* The step rules of the cycle run (pls-cycle.c). */
  m->tol.h_max = s.period / 20.0;
  m->tol.h_min = 1e-10 * s.period;
  for (i = 0; i < n_net; i++)
    pref = fmax (pref, fabs (m->p[i]));
  /* Three decades past the periodicity tolerance: what is left of the
   * reference's own distance to the fixed point is then negligible. */
  for (c = 1; c <= 3000 && change > 1e-3 * o.periodic_tolerance; c++)
    {
      memcpy (pprev, m->p, m->n_nodes * sizeof *pprev);
      ck_assert_msg (pls__integrate (m, &s, t, t + s.period, NULL, NULL, &err) == PLS_OK,
                     "%s", err.message);
      t += s.period;
      last = change;
      change = 0.0;
      for (i = 0; i < m->n_nodes; i++)
        if (!m->nodes[i].fixed)
          change = fmax (change, fabs (m->p[i] - pprev[i]) / pref);
      if (c > 1 && last > 0.0)
        lambda = change / last;
      brute = c;
    }
  ck_assert_double_lt (change, 1e-3 * o.periodic_tolerance);
  /* The reported cycle starts from x with |F(x) - x| < tol pref; for a
   * contraction whose slowest mode decays by lambda a cycle the distance
   * to the fixed point is |x - x*| <~ |F(x) - x| / (1 - lambda) (the
   * geometric series of the remaining changes).  lambda is measured on
   * the reference's last cycles (its ratio of successive changes). */
  ck_assert_double_gt (lambda, 0.0);
  ck_assert_double_lt (lambda, 1.0);
  tol = o.periodic_tolerance * pref / (1.0 - lambda);
  for (i = 0; i < n_net; i++)
    ck_assert_double_eq_tol (pls_cycle_sample_pressure (r, (int) i, 0), m->p[i], tol);
  /* The point of the extrapolation: far fewer cycles than repetition
   * needs to reach the same tolerance. */
  ck_assert_int_lt (pls_cycle_result_cycles (r), brute);
  free (pprev);
  pls__model_free (m);
  pls_cycle_result_free (r);
  pls_network_free (l.net);
}
END_TEST

/* The integrator's law of a line segment for a power-law fluid (its
 * laminar shortcut with the fluid's constants computed once) against the
 * line law itself, pls_line_drop (the Rabinowitsch-Mooney closed form,
 * Chhabra & Richardson, 2nd ed., eq. 3.9, checked in test-line.c; Dodge-
 * Metzner above the Ryan-Johnson onset), times the segment's share of the
 * length, over flows from creeping to turbulent and both directions.
 * The shortcut repeats the law's operations in its order, so the values
 * should be the same doubles; 1e-12 relative leaves room for a compiler
 * that contracts a multiply-add differently in the two places.
 * Fluids: flow index n, consistency K (Pa s^n). */
static const struct
{
  double n, k;
} segment_fluid[] = {
  { 0.7, 2.0 },
  { 0.4, 30.0 },
  { 1.3, 0.5 },
};

/* The lumped model of a small network for the law checks: valve events
 * of 2 ms, 13 segments a wavelength, 1 to max_segments a line, air on. */
static pls__model *
law_model (const pls_network *net, int max_segments)
{
  pls__model_options mo;
  pls__model *m = NULL;
  pls_error err;

  memset (&mo, 0, sizeof mo);
  mo.t_event = 2e-3;
  mo.per_wavelength = 13.0;
  mo.min_segments = 1;
  mo.max_segments = max_segments;
  mo.air_on = 1;
  ck_assert_msg (pls__model_new (net, &mo, &m, &err) == PLS_OK, "%s", err.message);
  return m;
}

START_TEST (test_segment_law_power_law)
{
  pls_fluid_params f;
  pls_line_params hose = pls_test_hose (10.0, 6.35e-3);
  pls__model *m;
  pls_network *net;
  size_t k, j;
  int a, b, checked = 0;

  pls_fluid_params_init (&f);
  f.law = PLS_VISCOSITY_POWER_LAW;
  f.flow_index = segment_fluid[_i].n;
  f.consistency = segment_fluid[_i].k;
  net = pls_network_new (&f, NULL, NULL);
  ck_assert_ptr_nonnull (net);
  a = pls_network_add_fixed_node (net, 0.0, 1e6, "in", NULL);
  b = pls_network_add_fixed_node (net, 0.0, 0.0, "out", NULL);
  pls_network_add_line (net, a, b, &hose, "H1", NULL);
  m = law_model (net, 8);
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];

      if (l->kind != PLS__LINK_SEGMENT)
        continue;
      for (j = 0; j <= 40; j++)
        {
          /* 1e-12 .. 1e-2 m^3/s, both signs: creeping, laminar, turbulent. */
          double q = (j % 2 ? -1.0 : 1.0) * pow (10.0, -12.0 + 10.0 * (double) j / 40.0);
          pls_drop d, ref;

          pls__link_law (m, k, q, &d);
          pls_line_drop (&f, &hose, q, &ref, NULL);
          ck_assert_double_eq_tol (d.h, l->scale * ref.h, 1e-12 * fabs (l->scale * ref.h));
          ck_assert_double_eq_tol (d.dh_dq, l->scale * ref.dh_dq,
                                   1e-12 * fabs (l->scale * ref.dh_dq));
          checked++;
        }
    }
  ck_assert_int_gt (checked, 0);
  pls__model_free (m);
  pls_network_free (net);
}
END_TEST

/* Fittings, valves and applicators take the fluid in its Carreau form
 * inside the model (pls__model fluid_c): the same viscosity law written
 * without the per-call conversion, so the model's law must be the
 * element's own law to the last bit (an identity of the two forms, no
 * source needed), for each viscosity law, both flow signs and from
 * creeping to fast flow. */
static const pls_viscosity_law element_law_fluid[] = {
  PLS_VISCOSITY_NEWTONIAN, PLS_VISCOSITY_POWER_LAW, PLS_VISCOSITY_CARREAU,
};

START_TEST (test_element_law_carreau_form)
{
  pls_fluid_params f;
  pls_fitting_params fp = { 200.0, 0.1, 6.35e-3, 0.0 };
  pls_valve_params vp = { PLS_VALVE_BALL, 2.0, 6.35e-3, 1, 0.0 };
  pls_nozzle_params np = { 0.5e-3, 1e-3, PLS_CD_LICHTAROWICZ, 0.7, 1e9, 0.0 };
  pls__model *m;
  pls_network *net;
  pls_error err;
  size_t k, j;
  int in, a, b, checked = 0;

  pls_fluid_params_init (&f);
  f.law = element_law_fluid[_i];
  f.mu = 2.0;
  f.consistency = 30.0;
  f.flow_index = 0.4;
  f.mu_zero = 50.0;
  f.mu_infinity = 0.5;
  f.lambda = 0.3;
  net = pls_network_new (&f, NULL, NULL);
  ck_assert_ptr_nonnull (net);
  in = pls_network_add_fixed_node (net, 0.0, 1e7, "in", NULL);
  a = pls_network_add_node (net, 0.0, "A", NULL);
  b = pls_network_add_node (net, 0.0, "B", NULL);
  ck_assert_int_ge (pls_network_add_fitting (net, in, a, &fp, "T1", &err), 0);
  ck_assert_int_ge (pls_network_add_valve (net, a, b, &vp, "BV1", &err), 0);
  ck_assert_int_ge (pls_network_add_nozzle (net, b, &np, "N1", &err), 0);
  np.cd_model = PLS_CD_FIXED;
  ck_assert_int_ge (pls_network_add_nozzle (net, b, &np, "N2", &err), 0);
  m = law_model (net, 1);
  for (j = 0; j < m->n_app; j++)
    m->open[j] = 1.0;
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];
      const pls_element *e = &net->elements[l->elem];

      if (l->kind != PLS__LINK_ELEMENT && l->kind != PLS__LINK_NOZZLE)
        continue;
      for (j = 0; j <= 30; j++)
        {
          /* 1e-12 .. 1e-3 m^3/s, both signs. */
          double q = (j % 2 ? -1.0 : 1.0) * pow (10.0, -12.0 + 9.0 * (double) j / 30.0);
          pls_drop d, ref;

          pls__link_law (m, k, q, &d);
          pls__element_drop (net, e, m->air_pressure, q, &ref);
          ck_assert_double_eq (d.h, ref.h);
          ck_assert_double_eq (d.dh_dq, ref.dh_dq);
          checked++;
        }
    }
  ck_assert_int_eq (checked, 4 * 31);
  pls__model_free (m);
  pls_network_free (net);
}
END_TEST

/* The model's matrix columns are renumbered in AMD's order so that
 * CHOLMOD factors with the natural ordering (pls-lumped.c): the factor
 * must say so, and the columns must stay a one-to-one numbering of the
 * free nodes (the reversed layout gives AMD other input). */
START_TEST (test_matrix_natural_order)
{
  pls_test_layout l = pls_test_layout_new (20, _i, 10e-3);
  pls_transient_options o;
  pls__model *m = NULL;
  pls_error err;
  size_t i, free_nodes = 0;

  pls_transient_options_init (&o);
  ck_assert_msg (pls__transient_start (l.net, &o, &m, &err) == PLS_OK, "%s", err.message);
  ck_assert_int_eq (m->L->ordering, CHOLMOD_NATURAL);
  for (i = 0; i < m->n_nodes; i++)
    {
      int c = m->nodes[i].col;

      if (m->nodes[i].fixed)
        {
          ck_assert_int_eq (c, -1);
          continue;
        }
      free_nodes++;
      ck_assert_int_ge (c, 0);
      ck_assert_int_lt (c, (int) m->nf);
      ck_assert_int_eq (m->col_node[c], (int) i);
    }
  ck_assert_uint_eq (free_nodes, m->nf);
  pls__model_free (m);
  pls_network_free (l.net);
}
END_TEST

static Suite *
transient_cycle_suite (void)
{
  Suite *s = suite_create ("transient-cycle");
  TCase *tc = tcase_create ("cycle");

  tcase_set_timeout (tc, 120);
  tcase_add_test (tc, test_cycle_reports);
  tcase_add_loop_test (tc, test_volume_balance, 0,
                       (int) (sizeof balance_n / sizeof balance_n[0]));
  tcase_add_test (tc, test_numbering);
  tcase_add_test (tc, test_order);
  tcase_add_test (tc, test_findings);
  tcase_add_test (tc, test_max_rate);
  tcase_add_test (tc, test_changeover);
  tcase_add_loop_test (tc, test_segment_law_power_law, 0,
                       (int) (sizeof segment_fluid / sizeof segment_fluid[0]));
  tcase_add_loop_test (tc, test_element_law_carreau_form, 0,
                       (int) (sizeof element_law_fluid / sizeof element_law_fluid[0]));
  tcase_add_loop_test (tc, test_matrix_natural_order, 0, 2);
  tcase_add_loop_test (tc, test_periodic_matches_brute_force, 0,
                       (int) (sizeof periodic_case / sizeof periodic_case[0]));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  pls_route_cholmod_allocations ();
  return pl_check_run (transient_cycle_suite ());
}
