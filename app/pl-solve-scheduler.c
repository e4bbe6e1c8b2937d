/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-solve-scheduler.c: fast solves at once, the cycle and shutdown in a
 * GTask worker, the newest revision wins.
 */

#include "config.h"

#include "pl-solve-scheduler.h"

#include "pl-compile.h"
#include "pl-document.h"

struct _PlSolveScheduler
{
  GObject parent_instance;

  PlDocument *doc;
  gulong changed_id;
  PlResults *fast;               /* newest fast results, or NULL */
  PlResults *full;               /* newest full results, or NULL */
  GCancellable *cancellable;     /* of the running worker, or NULL */
  gboolean queued;               /* a newer state waits for the worker to return */
  /* Fast solves run on the main thread, one at a time: their symbolic
   * analyses are kept across edits (NULL if none could be made). */
  pls_steady_workspace *workspaces[PL_N_CASES];
  guint started, delivered, dropped;
};

enum
{
  PROP_0,
  PROP_DOCUMENT,
  PROP_BUSY,
  N_PROPS
};

enum
{
  SIGNAL_FAST_RESULTS,
  SIGNAL_FULL_RESULTS,
  N_SIGNALS
};

static GParamSpec *properties[N_PROPS];
static guint signals[N_SIGNALS];

G_DEFINE_FINAL_TYPE (PlSolveScheduler, pl_solve_scheduler, G_TYPE_OBJECT)

static void pl_solve_scheduler_start_worker (PlSolveScheduler *self);

static void
pl_solve_scheduler_worker (GTask *task, gpointer source, gpointer task_data,
                           GCancellable *cancellable)
{
  GError *error = NULL;
  PlResults *full = pl_results_solve_full (task_data, cancellable, &error);

  if (full == NULL)
    g_task_return_error (task, error);
  else
    g_task_return_pointer (task, full, (GDestroyNotify) pl_results_unref);
}

/* Same content: results made from one compile (retagged ones share it). */
static gboolean
pl_solve_scheduler_same_content (PlResults *a, PlResults *b)
{
  return a != NULL && b != NULL && pl_results_get_compiled (a) == pl_results_get_compiled (b);
}

static void
pl_solve_scheduler_worker_done_cb (GObject *source, GAsyncResult *result, gpointer user_data)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (source);
  GTask *task = G_TASK (result);
  g_autoptr (PlResults) full = NULL;
  g_autoptr (GError) error = NULL;

  /* The task checks its cancellable first: a cancelled worker's result is
   * freed here unseen. */
  full = g_task_propagate_pointer (task, &error);
  g_clear_object (&self->cancellable);

  if (full != NULL && self->doc != NULL && pl_solve_scheduler_same_content (full, self->fast))
    {
      guint64 now = pl_document_get_revision (self->doc);

      g_clear_pointer (&self->full, pl_results_unref);
      /* Only moves since: the same content under today's revision. */
      self->full = pl_results_get_revision (full) == now ? pl_results_ref (full)
                                                         : pl_results_retag (full, now);
      self->delivered++;
      g_signal_emit (self, signals[SIGNAL_FULL_RESULTS], 0, self->full);
    }
  else
    self->dropped++;

  if (self->queued && self->doc != NULL)
    {
      self->queued = FALSE;
      pl_solve_scheduler_start_worker (self);
    }
  if (self->cancellable == NULL)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_BUSY]);
}

static void
pl_solve_scheduler_start_worker (PlSolveScheduler *self)
{
  g_autoptr (GTask) task = NULL;
  gboolean pending = self->fast != NULL
                     && pl_results_get_transient_state (self->fast) == PL_TRANSIENT_PENDING;

  if (self->cancellable != NULL)
    {
      /* One worker at a time: stop the old one and come back when it has. */
      g_cancellable_cancel (self->cancellable);
      self->queued = pending;
      return;
    }
  if (!pending)
    return;
  self->cancellable = g_cancellable_new ();
  task = g_task_new (self, self->cancellable, pl_solve_scheduler_worker_done_cb, NULL);
  g_task_set_source_tag (task, pl_solve_scheduler_start_worker);
  g_task_set_name (task, "pressline transient solve");
  g_task_set_task_data (task, pl_results_ref (self->fast), (GDestroyNotify) pl_results_unref);
  self->started++;
  g_task_run_in_thread (task, pl_solve_scheduler_worker);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_BUSY]);
}

static void
pl_solve_scheduler_solve_now (PlSolveScheduler *self)
{
  g_autoptr (PlCompiled) compiled = pl_compile (self->doc);

  g_clear_pointer (&self->fast, pl_results_unref);
  self->fast = pl_results_solve_fast_with (compiled, self->workspaces);
  g_signal_emit (self, signals[SIGNAL_FAST_RESULTS], 0, self->fast);
  /* The signal handler may have cancelled or dropped the document. */
  if (self->doc != NULL)
    pl_solve_scheduler_start_worker (self);
}

static void
pl_solve_scheduler_changed_cb (PlDocument *doc, guint change, gpointer user_data)
{
  PlSolveScheduler *self = user_data;
  guint64 now = pl_document_get_revision (doc);
  PlResults *old;

  if ((change & ~(guint) PL_CHANGE_GEOMETRY) != 0 || self->fast == NULL)
    {
      pl_solve_scheduler_solve_now (self);
      return;
    }

  /* Nothing the solver sees changed: re-issue under the new revision.  A
   * worker still running on this content stays valid. */
  old = self->fast;
  self->fast = pl_results_retag (old, now);
  pl_results_unref (old);
  g_signal_emit (self, signals[SIGNAL_FAST_RESULTS], 0, self->fast);
  if (self->full != NULL && pl_solve_scheduler_same_content (self->full, self->fast))
    {
      old = self->full;
      self->full = pl_results_retag (old, now);
      pl_results_unref (old);
      g_signal_emit (self, signals[SIGNAL_FULL_RESULTS], 0, self->full);
    }
}

static void
pl_solve_scheduler_set_document (PlSolveScheduler *self, PlDocument *doc)
{
  g_return_if_fail (PL_IS_DOCUMENT (doc));
  self->doc = g_object_ref (doc);
  self->changed_id = g_signal_connect (doc, "changed",
                                       G_CALLBACK (pl_solve_scheduler_changed_cb), self);
}

static void
pl_solve_scheduler_constructed (GObject *object)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (object);

  G_OBJECT_CLASS (pl_solve_scheduler_parent_class)->constructed (object);
  if (self->doc != NULL)
    pl_solve_scheduler_solve_now (self);
}

static void
pl_solve_scheduler_dispose (GObject *object)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (object);

  /* A running worker holds a reference to self (the task's source), so
   * dispose runs only once it has returned or on an explicit run_dispose. */
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  self->queued = FALSE;
  if (self->doc != NULL)
    {
      g_clear_signal_handler (&self->changed_id, self->doc);
      g_clear_object (&self->doc);
    }
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  G_OBJECT_CLASS (pl_solve_scheduler_parent_class)->dispose (object);
}

static void
pl_solve_scheduler_finalize (GObject *object)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (object);

  for (guint c = 0; c < PL_N_CASES; c++)
    pls_steady_workspace_free (self->workspaces[c]);
  G_OBJECT_CLASS (pl_solve_scheduler_parent_class)->finalize (object);
}

static void
pl_solve_scheduler_get_property (GObject *object, guint prop_id, GValue *value,
                                 GParamSpec *pspec)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (object);

  switch (prop_id)
    {
    case PROP_DOCUMENT:
      g_value_set_object (value, self->doc);
      break;
    case PROP_BUSY:
      g_value_set_boolean (value, self->cancellable != NULL);
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
pl_solve_scheduler_set_property (GObject *object, guint prop_id, const GValue *value,
                                 GParamSpec *pspec)
{
  PlSolveScheduler *self = PL_SOLVE_SCHEDULER (object);

  switch (prop_id)
    {
    case PROP_DOCUMENT:
      pl_solve_scheduler_set_document (self, g_value_get_object (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
pl_solve_scheduler_class_init (PlSolveSchedulerClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->constructed = pl_solve_scheduler_constructed;
  object_class->dispose = pl_solve_scheduler_dispose;
  object_class->finalize = pl_solve_scheduler_finalize;
  object_class->get_property = pl_solve_scheduler_get_property;
  object_class->set_property = pl_solve_scheduler_set_property;

  properties[PROP_DOCUMENT] =
    g_param_spec_object ("document", NULL, NULL, PL_TYPE_DOCUMENT,
                         G_PARAM_READWRITE | G_PARAM_CONSTRUCT_ONLY | G_PARAM_STATIC_STRINGS);
  properties[PROP_BUSY] =
    g_param_spec_boolean ("busy", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  signals[SIGNAL_FAST_RESULTS] =
    g_signal_new ("fast-results", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 1, PL_TYPE_RESULTS | G_SIGNAL_TYPE_STATIC_SCOPE);
  signals[SIGNAL_FULL_RESULTS] =
    g_signal_new ("full-results", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 1, PL_TYPE_RESULTS | G_SIGNAL_TYPE_STATIC_SCOPE);
}

static void
pl_solve_scheduler_init (PlSolveScheduler *self)
{
  /* Out of memory here only costs the reuse: plain solves instead. */
  for (guint c = 0; c < PL_N_CASES; c++)
    self->workspaces[c] = pls_steady_workspace_new (NULL, NULL);
}

PlSolveScheduler *
pl_solve_scheduler_new (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return g_object_new (PL_TYPE_SOLVE_SCHEDULER, "document", doc, NULL);
}

PlDocument *
pl_solve_scheduler_get_document (PlSolveScheduler *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_SCHEDULER (self), NULL);
  return self->doc;
}

PlResults *
pl_solve_scheduler_get_fast_results (PlSolveScheduler *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_SCHEDULER (self), NULL);
  return self->fast;
}

PlResults *
pl_solve_scheduler_get_full_results (PlSolveScheduler *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_SCHEDULER (self), NULL);
  return self->full;
}

gboolean
pl_solve_scheduler_get_busy (PlSolveScheduler *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_SCHEDULER (self), FALSE);
  return self->cancellable != NULL;
}

void
pl_solve_scheduler_cancel (PlSolveScheduler *self)
{
  g_return_if_fail (PL_IS_SOLVE_SCHEDULER (self));
  self->queued = FALSE;
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
}

void
pl_solve_scheduler_get_counts (PlSolveScheduler *self, guint *started, guint *delivered,
                               guint *dropped)
{
  g_return_if_fail (PL_IS_SOLVE_SCHEDULER (self));
  if (started != NULL)
    *started = self->started;
  if (delivered != NULL)
    *delivered = self->delivered;
  if (dropped != NULL)
    *dropped = self->dropped;
}

PlResults *
pl_solve_scheduler_solve_sync (PlDocument *doc, GCancellable *cancellable, GError **error)
{
  g_autoptr (PlCompiled) compiled = NULL;
  g_autoptr (PlResults) fast = NULL;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  compiled = pl_compile (doc);
  fast = pl_results_solve_fast (compiled);
  return pl_results_solve_full (fast, cancellable, error);
}
