/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-oom.c: out of memory at every allocation of a small build and solve.
 * An allocator hook fails the k-th call; for k = 1, 2, ... until the whole
 * run succeeds, every failure must come back as PLS_ERR_NOMEM (or a NULL
 * network / -1 index carrying it) with nothing left allocated.  CHOLMOD's
 * workspace is routed through the same hook (pls_route_cholmod_allocations),
 * so its failures are covered too.  The same for a reusable steady
 * workspace over several solves, each failed solve retried on the same
 * workspace.  The sanitizer build adds LeakSanitizer on top of the hook's
 * own count.
 */

#include "config.h"

#include "pl-check.h"
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"

typedef struct
{
  long calls;      /* allocations so far           */
  long fail_at;    /* the call that fails (1-based) */
  long live;       /* blocks not yet freed          */
  int failed;      /* the failure happened          */
} hook_state;

static int
should_fail (hook_state *h)
{
  if (++h->calls == h->fail_at)
    {
      h->failed = 1;
      return 1;
    }
  return 0;
}

static void *
hook_malloc (size_t size, void *data)
{
  hook_state *h = data;
  void *p;

  if (should_fail (h))
    return NULL;
  p = malloc (size);
  if (p != NULL)
    h->live++;
  return p;
}

static void *
hook_calloc (size_t count, size_t size, void *data)
{
  hook_state *h = data;
  void *p;

  if (should_fail (h))
    return NULL;
  p = calloc (count, size);
  if (p != NULL)
    h->live++;
  return p;
}

static void *
hook_realloc (void *ptr, size_t size, void *data)
{
  hook_state *h = data;
  void *p;

  if (should_fail (h))
    return NULL;
  p = realloc (ptr, size);
  if (p != NULL && ptr == NULL)
    h->live++;
  return p;
}

static void
hook_free (void *ptr, void *data)
{
  hook_state *h = data;

  if (ptr != NULL)
    h->live--;
  free (ptr);
}

/* Builds and solves a small layout with a closed branch (topology
 * findings), two applicators (spread) and a low-rated hose (rating), so
 * every allocating path runs.  Returns PLS_OK or the first failure. */
static pls_status
run (const pls_allocator *alloc, int open_all)
{
  pls_fluid_params f;
  pls_network *net;
  pls_steady_result *r = NULL;
  pls_steady_options o;
  pls_error err;
  pls_pump_params pp;
  pls_line_params h;
  pls_nozzle_params z;
  pls_gauge_params g = { 30e6 };
  pls_valve_params bv = { PLS_VALVE_BALL, 1.0, 6e-3, 0, 0.0 };
  pls_status st = PLS_OK;
  int t, a, b, c, d;

  pls_fluid_params_init (&f);
  memset (&pp, 0, sizeof pp);
  pp.ratio = 30.0;
  pp.displacement = 1e-5;
  pp.max_cycle_rate = 1.0;
  pp.curve_exponent = 1.0;
  memset (&h, 0, sizeof h);
  h.length = 5.0;
  h.bore = 6e-3;
  h.rated_pressure = 10e6;
  memset (&z, 0, sizeof z);
  z.orifice_diameter = 0.5e-3;
  z.discharge_coefficient = 0.65;
  z.passage_resistance = 1e12;

  net = pls_network_new (&f, alloc, &err);
  if (net == NULL)
    return err.status;
#define TRY(call)                                                            \
  do                                                                         \
    {                                                                        \
      if ((call) < 0)                                                        \
        {                                                                    \
          st = err.status;                                                   \
          goto out;                                                          \
        }                                                                    \
    }                                                                        \
  while (0)
  TRY (t = pls_network_add_fixed_node (net, 0.0, 0.0, "tank", &err));
  TRY (a = pls_network_add_node (net, 0.0, "N1", &err));
  TRY (b = pls_network_add_node (net, 1.0, "N2", &err));
  TRY (c = pls_network_add_node (net, 0.0, "N3", &err));
  TRY (d = pls_network_add_node (net, 0.0, "N4", &err));
  TRY (pls_network_add_pump (net, t, a, &pp, "P1", &err));
  TRY (pls_network_add_line (net, a, b, &h, "H1", &err));
  TRY (pls_network_add_line (net, b, a, &h, "H2", &err));
  TRY (pls_network_add_nozzle (net, b, &z, "A1", &err));
  TRY (pls_network_add_nozzle (net, a, &z, "A2", &err));
  TRY (pls_network_add_valve (net, b, c, &bv, "V1", &err));
  TRY (pls_network_add_line (net, c, d, &h, "H3", &err));
  TRY (pls_network_add_gauge (net, d, &g, "G1", &err));
#undef TRY
  pls_steady_options_init (&o);
  o.applicators = open_all ? PLS_APPLICATORS_ALL : PLS_APPLICATORS_NONE;
  st = pls_solve_steady (net, &o, &r, &err);
  if (st == PLS_OK)
    {
      ck_assert_ptr_nonnull (r);
      ck_assert (pls_steady_finding_count (r) > 0);
    }
  else
    ck_assert_ptr_null (r);
  pls_steady_result_free (r);

out:
  pls_network_free (net);
  return st;
}

START_TEST (test_every_allocation_fails_once)
{
  long k;
  int successes = 0;

  for (k = 1; k < 100000; k++)
    {
      hook_state hs = { 0, k, 0, 0 };
      pls_allocator alloc = { hook_malloc, hook_calloc, hook_realloc, hook_free, &hs };
      pls_status st = run (&alloc, _i);

      ck_assert_msg (hs.live == 0, "k = %ld: %ld blocks left", k, hs.live);
      if (!hs.failed)
        {
          ck_assert_int_eq (st, PLS_OK);
          successes = 1;
          break;
        }
      ck_assert_msg (st == PLS_ERR_NOMEM, "k = %ld: status %s", k, pls_status_string (st));
    }
  ck_assert_int_eq (successes, 1);
  ck_assert_int_gt (k, 40);
}
END_TEST

/* A workspace from the hook, used for a steady-open solve, steady-open
 * again on a second network of the same wiring with other figures (the
 * analysis reused), an idle solve (another pattern: redone) and
 * steady-open on the second network (redone), then freed.  Each failed
 * solve must say PLS_ERR_NOMEM and leave the workspace usable: the same
 * solve is retried at once (the hook fails one call only) and must
 * succeed.  Returns the first failure, or PLS_OK. */
static pls_status
run_workspace (const pls_allocator *alloc)
{
  pls_fluid_params f;
  pls_pump_params pp;
  pls_line_params h;
  pls_nozzle_params z;
  pls_steady_workspace *ws;
  pls_network *net[2] = { NULL, NULL };
  pls_steady_options o[4];
  pls_error err;
  pls_status first = PLS_OK;
  int k, i;

  pls_fluid_params_init (&f);
  memset (&pp, 0, sizeof pp);
  pp.ratio = 30.0;
  pp.displacement = 1e-5;
  pp.max_cycle_rate = 1.0;
  pp.curve_exponent = 1.0;
  memset (&h, 0, sizeof h);
  h.length = 5.0;
  h.bore = 6e-3;
  memset (&z, 0, sizeof z);
  z.orifice_diameter = 0.5e-3;
  z.orifice_length = 1e-3;
  z.cd_model = PLS_CD_LICHTAROWICZ;
  z.discharge_coefficient = 0.7;
  z.passage_resistance = 1e12;

  ws = pls_steady_workspace_new (alloc, &err);
  if (ws == NULL)
    {
      ck_assert_int_eq (err.status, PLS_ERR_NOMEM);
      return PLS_ERR_NOMEM;
    }
  for (k = 0; k < 2; k++)
    {
      int t, a, b, c;

      h.bore = k == 0 ? 6e-3 : 8e-3;   /* other figures, same wiring */
      net[k] = pls_network_new (&f, alloc, &err);
      if (net[k] == NULL
          || (t = pls_network_add_fixed_node (net[k], 0.0, 0.0, "tank", &err)) < 0
          || (a = pls_network_add_node (net[k], 0.0, "N1", &err)) < 0
          || (b = pls_network_add_node (net[k], 1.0, "N2", &err)) < 0
          || (c = pls_network_add_node (net[k], 0.0, "N3", &err)) < 0
          || pls_network_add_pump (net[k], t, a, &pp, "P1", &err) < 0
          || pls_network_add_line (net[k], a, b, &h, "H1", &err) < 0
          || pls_network_add_line (net[k], b, c, &h, "H2", &err) < 0
          || pls_network_add_line (net[k], c, a, &h, "H3", &err) < 0
          || pls_network_add_nozzle (net[k], b, &z, "A1", &err) < 0
          || pls_network_add_nozzle (net[k], c, &z, "A2", &err) < 0)
        {
          first = err.status;
          goto out;
        }
    }
  for (i = 0; i < 4; i++)
    {
      pls_steady_options_init (&o[i]);
      o[i].applicators = i == 2 ? PLS_APPLICATORS_NONE : PLS_APPLICATORS_ALL;
    }
  for (i = 0; i < 4; i++)
    {
      const pls_network *nt = net[i % 2];
      pls_steady_result *r = NULL;
      pls_status st = pls_solve_steady_with (ws, nt, &o[i], &r, &err);

      if (st != PLS_OK)
        {
          ck_assert_msg (st == PLS_ERR_NOMEM, "solve %d: %s", i, pls_status_string (st));
          ck_assert_ptr_null (r);
          if (first == PLS_OK)
            first = st;
          st = pls_solve_steady_with (ws, nt, &o[i], &r, &err);
          ck_assert_msg (st == PLS_OK, "solve %d retried: %s", i, err.message);
        }
      ck_assert_ptr_nonnull (r);
      ck_assert_int_eq (pls_steady_result_converged (r), 1);
      pls_steady_result_free (r);
    }
  /* Open, open reused, idle, open: three analyses, whatever failed on the
   * way (a failed analysis is redone and counted once). */
  ck_assert_int_eq (pls_steady_workspace_analyses (ws), 3);

out:
  pls_network_free (net[0]);
  pls_network_free (net[1]);
  pls_steady_workspace_free (ws);
  return first;
}

START_TEST (test_workspace_every_allocation_fails_once)
{
  long k;
  int successes = 0;

  for (k = 1; k < 100000; k++)
    {
      hook_state hs = { 0, k, 0, 0 };
      pls_allocator alloc = { hook_malloc, hook_calloc, hook_realloc, hook_free, &hs };
      pls_status st = run_workspace (&alloc);

      ck_assert_msg (hs.live == 0, "k = %ld: %ld blocks left", k, hs.live);
      if (!hs.failed)
        {
          ck_assert_int_eq (st, PLS_OK);
          successes = 1;
          break;
        }
      ck_assert_msg (st == PLS_ERR_NOMEM, "k = %ld: status %s", k, pls_status_string (st));
    }
  ck_assert_int_eq (successes, 1);
  ck_assert_int_gt (k, 60);
}
END_TEST

/* Runs first: routing CHOLMOD through the hook must add CHOLMOD's own
 * allocations to the count of a successful run (analysis, factor, solve
 * workspace: well over 5), proving the failures below reach them. */
START_TEST (test_cholmod_routed)
{
  hook_state before = { 0, -1, 0, 0 }, after = { 0, -1, 0, 0 };
  pls_allocator a1 = { hook_malloc, hook_calloc, hook_realloc, hook_free, &before };
  pls_allocator a2 = { hook_malloc, hook_calloc, hook_realloc, hook_free, &after };

  ck_assert_int_eq (run (&a1, 1), PLS_OK);
  /* Process-wide, once, before any other CHOLMOD use: see
   * pressline-solver.h. */
  pls_route_cholmod_allocations ();
  ck_assert_int_eq (run (&a2, 1), PLS_OK);
  ck_assert_int_eq (before.live, 0);
  ck_assert_int_eq (after.live, 0);
  ck_assert_int_gt (after.calls, before.calls + 5);
}
END_TEST

static Suite *
oom_suite (void)
{
  Suite *s = suite_create ("oom");
  TCase *tc = tcase_create ("oom");

  tcase_add_test (tc, test_cholmod_routed);
  tcase_add_loop_test (tc, test_every_allocation_fails_once, 0, 2);
  tcase_add_test (tc, test_workspace_every_allocation_fails_once);
  tcase_set_timeout (tc, 120);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (oom_suite ());
}
