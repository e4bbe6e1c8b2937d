/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-solve-scheduler.h: keeps the results of a document up to date.
 *
 * On every "changed" of its document the scheduler compiles the document
 * and runs the fast solves (idle and steady-open) at once, on the calling
 * thread, and emits "fast-results".  The firing cycle and the shutdown run
 * in a worker thread (GTask) on the compiled network, which the worker
 * shares read-only; they end in "full-results".
 *
 * One worker at a time: a change while a worker runs cancels it (through
 * its GCancellable) and queues the newest state, which starts when the old
 * worker has returned; a result whose revision is no longer the newest is
 * dropped, never emitted.  The solver cannot be stopped inside a cycle run,
 * so a cancelled worker still finishes its current run before it returns;
 * queueing instead of starting a second worker keeps a burst of edits from
 * piling threads onto a small machine.
 *
 * Edits that change nothing the solver sees (PL_CHANGE_GEOMETRY alone: moves,
 * rotations, bend points) solve nothing: the last results are re-issued
 * under the new revision.
 *
 * Signals (main thread, the thread-default context of construction):
 *   "fast-results" (PlSolveScheduler *, PlResults *, gpointer)
 *   "full-results" (PlSolveScheduler *, PlResults *, gpointer)
 * Property "busy" (read-only, notify): a worker is running.
 */
#pragma once

#include <gio/gio.h>
#include <glib-object.h>

#include "pl-results.h"
#include "pl-types.h"

G_BEGIN_DECLS

#define PL_TYPE_SOLVE_SCHEDULER (pl_solve_scheduler_get_type ())
G_DECLARE_FINAL_TYPE (PlSolveScheduler, pl_solve_scheduler, PL, SOLVE_SCHEDULER, GObject)

/* Watches doc (a reference is kept) and solves its present state at once:
 * the fast results are there when this returns; the worker is started. */
PlSolveScheduler *pl_solve_scheduler_new (PlDocument *doc);

PlDocument *pl_solve_scheduler_get_document (PlSolveScheduler *self);
/* The newest fast results (their revision is the document's), or NULL
 * before the first solve.  Borrowed: ref it to keep it past the next change. */
PlResults *pl_solve_scheduler_get_fast_results (PlSolveScheduler *self);
/* The newest full results, possibly of an older revision than the
 * document's (compare pl_results_get_revision: then they are stale), or
 * NULL if none arrived yet.  Borrowed. */
PlResults *pl_solve_scheduler_get_full_results (PlSolveScheduler *self);
gboolean pl_solve_scheduler_get_busy (PlSolveScheduler *self);
/* Cancels the running worker and drops the queued one (a window closing). */
void pl_solve_scheduler_cancel (PlSolveScheduler *self);

/* Counters since construction: workers started, full results emitted,
 * worker results dropped (cancelled or stale).  Any pointer may be NULL. */
void pl_solve_scheduler_get_counts (PlSolveScheduler *self, guint *started,
                                    guint *delivered, guint *dropped);

/* Everything at once on the calling thread, by the same code path: compile,
 * fast solves, cycle and shutdown.  For pressline-cli and tests.  NULL only
 * with G_IO_ERROR_CANCELLED. */
PlResults *pl_solve_scheduler_solve_sync (PlDocument *doc, GCancellable *cancellable,
                                          GError **error);

G_END_DECLS
