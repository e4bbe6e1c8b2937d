/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-undo-stack.h: the history of edits of one document.
 *
 * Knows nothing of widgets: a gesture pushes commands, menus call undo and
 * redo, the title bar watches "clean".
 *  - push applies a command and records it as one step; a refused command is
 *    not recorded, the document stays as it was, and the redo steps survive.
 *    A recorded push drops the redo steps.
 *  - begin_group / end_group (nestable) fold every command pushed in between
 *    into one step (one drag is one step); the outermost pair counts.  An
 *    empty group records nothing.  abort_group reverts what the innermost
 *    open group applied so far (a drag cancelled with Escape).  The redo
 *    steps are dropped when a group is recorded, so a group aborted as a
 *    whole keeps them.
 *  - push_merge folds a command into the previous step when
 *    pl_command_merge() agrees and nothing happened in between (no undo,
 *    redo, mark_clean, barrier or group boundary): a spin button dragged
 *    through a hundred values is one step.
 *  - barrier drops the whole history and makes the present state clean
 *    (file load, new document).
 *  - mark_clean remembers the present state as saved; undoing or redoing
 *    back to it makes the stack clean again; a push after undoing past it
 *    makes that state unreachable (dirty until the next mark_clean).
 *
 * Properties (read-only, with notify): "can-undo", "can-redo", "clean",
 * "undo-label", "redo-label" (translated, NULL when nothing to undo/redo).
 */
#pragma once

#include <glib-object.h>

#include "pl-types.h"

G_BEGIN_DECLS

#define PL_TYPE_UNDO_STACK (pl_undo_stack_get_type ())
G_DECLARE_FINAL_TYPE (PlUndoStack, pl_undo_stack, PL, UNDO_STACK, GObject)

/* A stack for doc (a reference is kept); clean, empty. */
PlUndoStack *pl_undo_stack_new (PlDocument *doc);
PlDocument *pl_undo_stack_get_document (PlUndoStack *stack);

/* Applies cmd (the stack takes its own reference) and records it.  FALSE
 * with error set if the command was refused. */
gboolean pl_undo_stack_push (PlUndoStack *stack, PlCommand *cmd, GError **error);
gboolean pl_undo_stack_push_merge (PlUndoStack *stack, PlCommand *cmd, GError **error);

/* FALSE (nothing changed) when there is nothing to undo or redo, or a
 * group is open. */
gboolean pl_undo_stack_undo (PlUndoStack *stack);
gboolean pl_undo_stack_redo (PlUndoStack *stack);
gboolean pl_undo_stack_can_undo (PlUndoStack *stack);
gboolean pl_undo_stack_can_redo (PlUndoStack *stack);
/* Translated labels of the next undo / redo step, or NULL. */
const char *pl_undo_stack_get_undo_label (PlUndoStack *stack);
const char *pl_undo_stack_get_redo_label (PlUndoStack *stack);
/* The same labels with the parts the step acts on, by the tags they show
 * now: "Change Bore H2", "Move 3 Parts" (wires and notes are counted,
 * "Delete 2 Items", only when no part is among them; translated, free with g_free;
 * NULL when nothing to undo / redo).  Nothing notifies when only a tag
 * changes by other means than a push; a push of a rename does notify. */
char *pl_undo_stack_describe_undo (PlUndoStack *stack);
char *pl_undo_stack_describe_redo (PlUndoStack *stack);
/* Steps that undo / redo can take now (0 while a group is open). */
guint pl_undo_stack_get_n_undo (PlUndoStack *stack);
guint pl_undo_stack_get_n_redo (PlUndoStack *stack);

/* label (translated, may be NULL: the first command's label) names the
 * step; only the outermost group's label is kept. */
void pl_undo_stack_begin_group (PlUndoStack *stack, const char *label);
void pl_undo_stack_end_group (PlUndoStack *stack);
void pl_undo_stack_abort_group (PlUndoStack *stack);
guint pl_undo_stack_get_group_depth (PlUndoStack *stack);

/* FALSE (and nothing done) while a group is open. */
gboolean pl_undo_stack_barrier (PlUndoStack *stack);
/* Does nothing while a group is open (its state is not a step yet). */
void pl_undo_stack_mark_clean (PlUndoStack *stack);
gboolean pl_undo_stack_is_clean (PlUndoStack *stack);

G_END_DECLS
