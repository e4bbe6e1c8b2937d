/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-scheduler.c: fast results at once, full results from the worker,
 * revisions, cancellation and dropped stale results, on a main loop.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pl-check.h"

#include "pl-command.h"
#include "pl-document.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"

/* Longest wait for a worker: the layout's cycle takes some 10 ms; 20 s
 * only guards against a hang (a timeout fails the test). */
#define WAIT_SECONDS 20

typedef struct
{
  PlDocument *doc;
  char *pump, *hose, *nozzle;
  PlSolveScheduler *sched;
  GMainLoop *loop;
  guint n_fast, n_full;
  guint64 last_fast_revision, last_full_revision;
  gboolean stale_emitted;         /* a result of an old revision came out */
  gboolean timed_out;
} Fixture;

static char *
add_part (PlDocument *doc, const char *type)
{
  g_autoptr (PlCommand) cmd = pl_command_new_add_part (type, NULL, 0.0, 0.0);

  ck_assert (pl_command_apply (cmd, doc, NULL));
  return g_strdup (pl_command_get_created_id (cmd));
}

static void
apply (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "%s", error ? error->message : "");
  pl_command_unref (cmd);
}

static void
fast_results_cb (PlSolveScheduler *sched, PlResults *r, gpointer user_data)
{
  Fixture *f = user_data;

  f->n_fast++;
  f->last_fast_revision = pl_results_get_revision (r);
  if (pl_results_get_revision (r) != pl_document_get_revision (f->doc))
    f->stale_emitted = TRUE;
}

static void
full_results_cb (PlSolveScheduler *sched, PlResults *r, gpointer user_data)
{
  Fixture *f = user_data;

  f->n_full++;
  f->last_full_revision = pl_results_get_revision (r);
  if (pl_results_get_revision (r) != pl_document_get_revision (f->doc))
    f->stale_emitted = TRUE;
  ck_assert_int_eq (pl_results_get_transient_state (r), PL_TRANSIENT_DONE);
}

static gboolean
timeout_cb (gpointer user_data)
{
  Fixture *f = user_data;

  f->timed_out = TRUE;
  g_main_loop_quit (f->loop);
  return G_SOURCE_REMOVE;
}

static void
busy_cb (GObject *object, GParamSpec *pspec, gpointer user_data)
{
  Fixture *f = user_data;

  if (!pl_solve_scheduler_get_busy (PL_SOLVE_SCHEDULER (object)))
    g_main_loop_quit (f->loop);
}

/* Runs the main loop until the scheduler is idle. */
static void
wait_idle (Fixture *f)
{
  guint timeout;

  if (!pl_solve_scheduler_get_busy (f->sched))
    return;
  timeout = g_timeout_add_seconds (WAIT_SECONDS, timeout_cb, f);
  g_main_loop_run (f->loop);
  if (!f->timed_out)
    g_source_remove (timeout);
  ck_assert_msg (!f->timed_out, "the worker did not return within %d s", WAIT_SECONDS);
}

/* Pump, hose, one applicator: a line whose cycle is quick. */
static void
fixture_init (Fixture *f)
{
  memset (f, 0, sizeof *f);
  f->doc = pl_document_new ();
  f->pump = add_part (f->doc, "pump");
  f->hose = add_part (f->doc, "hose");
  f->nozzle = add_part (f->doc, "applicator");
  apply (f->doc, pl_command_new_add_wire (NULL, f->pump, "out", f->hose, "a", NULL, 0));
  apply (f->doc, pl_command_new_add_wire (NULL, f->hose, "b", f->nozzle, "in", NULL, 0));
  f->loop = g_main_loop_new (NULL, FALSE);
  f->sched = pl_solve_scheduler_new (f->doc);
  g_signal_connect (f->sched, "fast-results", G_CALLBACK (fast_results_cb), f);
  g_signal_connect (f->sched, "full-results", G_CALLBACK (full_results_cb), f);
  g_signal_connect (f->sched, "notify::busy", G_CALLBACK (busy_cb), f);
}

static void
fixture_clear (Fixture *f)
{
  wait_idle (f);
  g_object_unref (f->sched);
  g_object_unref (f->doc);
  g_main_loop_unref (f->loop);
  g_free (f->pump);
  g_free (f->hose);
  g_free (f->nozzle);
}

/* Results carry the revision they were solved for, fast ones at once. */
START_TEST (test_revision_tagging)
{
  Fixture f;
  PlResults *fast, *full;
  guint started, delivered, dropped;
  double p;

  fixture_init (&f);
  /* Made in the constructor, before any handler was connected. */
  fast = pl_solve_scheduler_get_fast_results (f.sched);
  ck_assert_ptr_nonnull (fast);
  ck_assert_uint_eq (pl_results_get_revision (fast), pl_document_get_revision (f.doc));
  ck_assert_int_eq (pl_results_get_transient_state (fast), PL_TRANSIENT_PENDING);
  ck_assert (pl_solve_scheduler_get_busy (f.sched));
  ck_assert (pl_results_get_port_pressure (fast, f.nozzle, "in", PL_PRESSURE_IDLE, &p));

  wait_idle (&f);
  ck_assert_uint_eq (f.n_full, 1);
  full = pl_solve_scheduler_get_full_results (f.sched);
  ck_assert_ptr_nonnull (full);
  ck_assert_uint_eq (pl_results_get_revision (full), pl_document_get_revision (f.doc));
  /* The full snapshot shares the fast one's compile and adds the cycle. */
  ck_assert_ptr_eq (pl_results_get_compiled (full), pl_results_get_compiled (fast));
  ck_assert (pl_results_get_port_pressure (full, f.nozzle, "in", PL_PRESSURE_CYCLE_MIN, &p));
  ck_assert (pl_results_get_port_pressure (full, f.nozzle, "in", PL_PRESSURE_CYCLE_MAX, &p));
  ck_assert (pl_results_get_shot (full, f.nozzle, &p, NULL, NULL));
  ck_assert_double_gt (p, 0.0);

  /* A parameter change: new fast results at once, for the new revision. */
  apply (f.doc, pl_command_new_set_number (f.hose, "length", 12.0));
  ck_assert_uint_eq (f.n_fast, 1);
  ck_assert_uint_eq (f.last_fast_revision, pl_document_get_revision (f.doc));
  ck_assert (pl_results_get_revision (pl_solve_scheduler_get_full_results (f.sched))
             < pl_document_get_revision (f.doc));     /* stale until the worker is back */
  wait_idle (&f);
  ck_assert_uint_eq (f.n_full, 2);
  ck_assert_uint_eq (f.last_full_revision, pl_document_get_revision (f.doc));
  ck_assert (!f.stale_emitted);
  pl_solve_scheduler_get_counts (f.sched, &started, &delivered, &dropped);
  ck_assert_uint_eq (started, 2);
  ck_assert_uint_eq (delivered, 2);
  ck_assert_uint_eq (dropped, 0);
  fixture_clear (&f);
}
END_TEST

/* A burst of edits: the running worker is cancelled, one worker for the
 * newest state follows, and nothing of an older revision is emitted. */
START_TEST (test_newer_change_cancels_older)
{
  Fixture f;
  guint started, delivered, dropped;

  fixture_init (&f);
  /* The constructor's worker is running; three edits before the loop runs
   * again (so before any worker result can be delivered). */
  apply (f.doc, pl_command_new_set_number (f.hose, "length", 11.0));
  apply (f.doc, pl_command_new_set_number (f.hose, "length", 13.0));
  apply (f.doc, pl_command_new_set_number (f.hose, "length", 17.0));
  ck_assert_uint_eq (f.n_fast, 3);
  ck_assert (pl_solve_scheduler_get_busy (f.sched));

  wait_idle (&f);
  pl_solve_scheduler_get_counts (f.sched, &started, &delivered, &dropped);
  /* The first worker was cancelled and dropped; the queue held one state,
   * the newest, however many edits came in. */
  ck_assert_uint_eq (started, 2);
  ck_assert_uint_eq (dropped, 1);
  ck_assert_uint_eq (delivered, 1);
  ck_assert_uint_eq (f.n_full, 1);
  ck_assert_uint_eq (f.last_full_revision, pl_document_get_revision (f.doc));
  ck_assert (!f.stale_emitted);
  fixture_clear (&f);
}
END_TEST

/* A move changes nothing the solver sees: the same results come back
 * under the new revision, no worker starts. */
START_TEST (test_geometry_only_retags)
{
  Fixture f;
  PlResults *before, *after;
  guint started;
  const char *ids[1];

  fixture_init (&f);
  wait_idle (&f);
  before = pl_solve_scheduler_get_full_results (f.sched);
  ck_assert_ptr_nonnull (before);
  ids[0] = f.hose;
  apply (f.doc, pl_command_new_move (ids, 1, 10.0, 5.0));
  after = pl_solve_scheduler_get_full_results (f.sched);
  ck_assert_ptr_ne (after, before);
  ck_assert_uint_eq (pl_results_get_revision (after), pl_document_get_revision (f.doc));
  ck_assert_ptr_eq (pl_results_get_cycle (after),
                    pl_results_get_cycle (pl_solve_scheduler_get_full_results (f.sched)));
  ck_assert_uint_eq (f.last_fast_revision, pl_document_get_revision (f.doc));
  ck_assert (!pl_solve_scheduler_get_busy (f.sched));
  pl_solve_scheduler_get_counts (f.sched, &started, NULL, NULL);
  ck_assert_uint_eq (started, 1);
  fixture_clear (&f);
}
END_TEST

/* Dropping the scheduler while its worker runs: the task keeps it alive
 * until the worker is back, then it goes without a leak or a late signal. */
START_TEST (test_unref_while_busy)
{
  Fixture f;
  PlSolveScheduler *weak;
  gint64 deadline = g_get_monotonic_time () + WAIT_SECONDS * G_USEC_PER_SEC;

  fixture_init (&f);
  ck_assert (pl_solve_scheduler_get_busy (f.sched));
  pl_solve_scheduler_cancel (f.sched);
  weak = f.sched;
  g_object_add_weak_pointer (G_OBJECT (weak), (gpointer *) &weak);
  g_signal_handlers_disconnect_by_data (f.sched, &f);
  g_object_unref (f.sched);
  f.sched = NULL;
  /* Polls rather than blocks, so a missing wake-up fails at the deadline
   * instead of hanging the suite. */
  while (weak != NULL && g_get_monotonic_time () < deadline)
    if (!g_main_context_iteration (NULL, FALSE))
      g_usleep (1000);
  ck_assert_ptr_null (weak);
  ck_assert_uint_eq (f.n_full, 0);
  g_object_unref (f.doc);
  g_main_loop_unref (f.loop);
  g_free (f.pump);
  g_free (f.hose);
  g_free (f.nozzle);
}
END_TEST

/* solve_sync: the same path, everything at once. */
START_TEST (test_solve_sync)
{
  Fixture f;
  g_autoptr (PlResults) sync = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (GCancellable) cancelled = g_cancellable_new ();
  PlResults *full;
  double a, b;

  fixture_init (&f);
  wait_idle (&f);
  sync = pl_solve_scheduler_solve_sync (f.doc, NULL, &error);
  ck_assert_ptr_nonnull (sync);
  full = pl_solve_scheduler_get_full_results (f.sched);
  ck_assert_uint_eq (pl_results_get_revision (sync), pl_results_get_revision (full));
  /* Same inputs, same code: bit-for-bit the same figures. */
  ck_assert (pl_results_get_port_pressure (sync, f.nozzle, "in", PL_PRESSURE_CYCLE_MIN, &a));
  ck_assert (pl_results_get_port_pressure (full, f.nozzle, "in", PL_PRESSURE_CYCLE_MIN, &b));
  ck_assert (a == b);

  g_cancellable_cancel (cancelled);
  ck_assert_ptr_null (pl_solve_scheduler_solve_sync (f.doc, cancelled, &error));
  ck_assert (g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED));
  fixture_clear (&f);
}
END_TEST

static Suite *
scheduler_suite (void)
{
  Suite *s = suite_create ("scheduler");
  TCase *tc = tcase_create ("scheduler");

  tcase_set_timeout (tc, 60);
  tcase_add_test (tc, test_revision_tagging);
  tcase_add_test (tc, test_newer_change_cancels_older);
  tcase_add_test (tc, test_geometry_only_retags);
  tcase_add_test (tc, test_unref_while_busy);
  tcase_add_test (tc, test_solve_sync);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (scheduler_suite ());
}
