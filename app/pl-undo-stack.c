/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-undo-stack.c: the history of edits of one document.
 *
 * The history is a list of steps; pos steps are done (undo takes back step
 * pos - 1), the rest can be redone.  A step is the commands of one push or
 * of one outermost group, in the order applied.  The clean mark is the
 * value of pos at which the document was saved, or -1 once that state can
 * no longer be reached.
 */
#include "config.h"

#include "pl-undo-stack.h"
#include "pl-command.h"
#include "pl-document-private.h"

#include <glib/gi18n.h>

typedef struct
{
  char *label;
  GPtrArray *commands;   /* PlCommand *, owned */
} Step;

struct _PlUndoStack
{
  GObject parent_instance;

  PlDocument *doc;
  GPtrArray *steps;      /* Step *, owned */
  guint pos;
  gint64 clean_pos;      /* -1: the saved state is gone */
  Step *open;            /* the group being built, or NULL */
  GArray *marks;         /* per open group level: commands in open when it began */
  gboolean may_merge;    /* the last thing done was a push_merge */
};

enum
{
  PROP_0,
  PROP_CAN_UNDO,
  PROP_CAN_REDO,
  PROP_CLEAN,
  PROP_UNDO_LABEL,
  PROP_REDO_LABEL,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

G_DEFINE_FINAL_TYPE (PlUndoStack, pl_undo_stack, G_TYPE_OBJECT)

/* What the properties said before an operation, to notify only changes. */
typedef struct
{
  gboolean can_undo, can_redo, clean;
  const char *undo_label, *redo_label;
} State;

static Step *
step_new (const char *label)
{
  Step *step = g_new0 (Step, 1);

  step->label = g_strdup (label);
  step->commands = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_command_unref);
  return step;
}

static void
step_free (Step *step)
{
  if (step == NULL)
    return;
  g_free (step->label);
  g_ptr_array_unref (step->commands);
  g_free (step);
}

static State
state_get (PlUndoStack *self)
{
  State s;

  s.can_undo = pl_undo_stack_can_undo (self);
  s.can_redo = pl_undo_stack_can_redo (self);
  s.clean = pl_undo_stack_is_clean (self);
  s.undo_label = pl_undo_stack_get_undo_label (self);
  s.redo_label = pl_undo_stack_get_redo_label (self);
  return s;
}

static void
state_notify (PlUndoStack *self, const State *before)
{
  State now = state_get (self);

  g_object_freeze_notify (G_OBJECT (self));
  if (now.can_undo != before->can_undo)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_CAN_UNDO]);
  if (now.can_redo != before->can_redo)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_CAN_REDO]);
  if (now.clean != before->clean)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_CLEAN]);
  /* Labels are owned by steps that may have been replaced: compare the
   * pointers, which is enough to know when to tell. */
  if (now.undo_label != before->undo_label)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_UNDO_LABEL]);
  if (now.redo_label != before->redo_label)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_REDO_LABEL]);
  g_object_thaw_notify (G_OBJECT (self));
}

/* A new step is about to be recorded at pos: the redo steps go, and with
 * them a clean mark among them. */
static void
drop_redo (PlUndoStack *self)
{
  if (self->pos < self->steps->len)
    g_ptr_array_remove_range (self->steps, self->pos, self->steps->len - self->pos);
  if (self->clean_pos > (gint64) self->pos)
    self->clean_pos = -1;
}

static void
record (PlUndoStack *self, Step *step)
{
  drop_redo (self);
  g_ptr_array_add (self->steps, step);
  self->pos++;
}

/* --- GObject --- */

static void
pl_undo_stack_get_property (GObject *object, guint prop_id, GValue *value,
                            GParamSpec *pspec)
{
  PlUndoStack *self = PL_UNDO_STACK (object);

  switch (prop_id)
    {
    case PROP_CAN_UNDO:
      g_value_set_boolean (value, pl_undo_stack_can_undo (self));
      break;
    case PROP_CAN_REDO:
      g_value_set_boolean (value, pl_undo_stack_can_redo (self));
      break;
    case PROP_CLEAN:
      g_value_set_boolean (value, pl_undo_stack_is_clean (self));
      break;
    case PROP_UNDO_LABEL:
      g_value_set_string (value, pl_undo_stack_get_undo_label (self));
      break;
    case PROP_REDO_LABEL:
      g_value_set_string (value, pl_undo_stack_get_redo_label (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
      break;
    }
}

static void
pl_undo_stack_finalize (GObject *object)
{
  PlUndoStack *self = PL_UNDO_STACK (object);

  g_ptr_array_unref (self->steps);
  step_free (self->open);
  g_array_unref (self->marks);
  g_clear_object (&self->doc);
  G_OBJECT_CLASS (pl_undo_stack_parent_class)->finalize (object);
}

static void
pl_undo_stack_class_init (PlUndoStackClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GParamFlags flags = G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY;

  object_class->get_property = pl_undo_stack_get_property;
  object_class->finalize = pl_undo_stack_finalize;

  properties[PROP_CAN_UNDO] = g_param_spec_boolean ("can-undo", NULL, NULL, FALSE, flags);
  properties[PROP_CAN_REDO] = g_param_spec_boolean ("can-redo", NULL, NULL, FALSE, flags);
  properties[PROP_CLEAN] = g_param_spec_boolean ("clean", NULL, NULL, TRUE, flags);
  properties[PROP_UNDO_LABEL] = g_param_spec_string ("undo-label", NULL, NULL, NULL, flags);
  properties[PROP_REDO_LABEL] = g_param_spec_string ("redo-label", NULL, NULL, NULL, flags);
  g_object_class_install_properties (object_class, N_PROPS, properties);
}

static void
pl_undo_stack_init (PlUndoStack *self)
{
  self->steps = g_ptr_array_new_with_free_func ((GDestroyNotify) step_free);
  self->marks = g_array_new (FALSE, FALSE, sizeof (guint));
  self->clean_pos = 0;
}

/* --- public --- */

PlUndoStack *
pl_undo_stack_new (PlDocument *doc)
{
  PlUndoStack *self;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  self = g_object_new (PL_TYPE_UNDO_STACK, NULL);
  self->doc = g_object_ref (doc);
  return self;
}

PlDocument *
pl_undo_stack_get_document (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), NULL);
  return stack->doc;
}

static gboolean
push_internal (PlUndoStack *self, PlCommand *cmd, gboolean merge, GError **error)
{
  State before = state_get (self);
  GPtrArray *target = NULL;   /* where a merge would fold cmd in */
  guint fixed = 0;            /* commands of target that a merge may not touch */

  if (!pl_command_apply (cmd, self->doc, error))
    return FALSE;

  if (self->open != NULL)
    {
      target = self->open->commands;
      fixed = self->marks->len > 0
              ? g_array_index (self->marks, guint, self->marks->len - 1) : 0;
    }
  else if (self->pos > 0 && self->pos == self->steps->len)
    {
      Step *top = g_ptr_array_index (self->steps, self->pos - 1);

      /* Only a step that is one merged command may grow. */
      if (top->commands->len == 1)
        target = top->commands;
    }
  if (merge && self->may_merge && target != NULL && target->len > fixed
      && pl_command_merge (g_ptr_array_index (target, target->len - 1), cmd))
    {
      state_notify (self, &before);
      return TRUE;
    }

  if (self->open != NULL)
    {
      /* The redo steps go when the group is recorded, not before: a group
       * aborted as a whole leaves the document where redo expects it. */
      if (self->open->label == NULL)
        self->open->label = g_strdup (pl_command_get_label (cmd));
      g_ptr_array_add (self->open->commands, pl_command_ref (cmd));
    }
  else
    {
      Step *step = step_new (pl_command_get_label (cmd));

      g_ptr_array_add (step->commands, pl_command_ref (cmd));
      record (self, step);
    }
  self->may_merge = merge;
  state_notify (self, &before);
  return TRUE;
}

gboolean
pl_undo_stack_push (PlUndoStack *stack, PlCommand *cmd, GError **error)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  g_return_val_if_fail (cmd != NULL, FALSE);
  return push_internal (stack, cmd, FALSE, error);
}

gboolean
pl_undo_stack_push_merge (PlUndoStack *stack, PlCommand *cmd, GError **error)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  g_return_val_if_fail (cmd != NULL, FALSE);
  return push_internal (stack, cmd, TRUE, error);
}

gboolean
pl_undo_stack_undo (PlUndoStack *stack)
{
  State before;
  Step *step;

  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  if (stack->open != NULL || stack->pos == 0)
    return FALSE;
  before = state_get (stack);
  step = g_ptr_array_index (stack->steps, stack->pos - 1);
  /* One "changed" for the whole step. */
  pl_document_freeze (stack->doc);
  for (guint i = step->commands->len; i-- > 0;)
    pl_command_revert (g_ptr_array_index (step->commands, i), stack->doc);
  pl_document_thaw (stack->doc);
  stack->pos--;
  stack->may_merge = FALSE;
  state_notify (stack, &before);
  return TRUE;
}

gboolean
pl_undo_stack_redo (PlUndoStack *stack)
{
  State before;
  Step *step;
  guint i;
  gboolean ok = TRUE;

  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  if (stack->open != NULL || stack->pos >= stack->steps->len)
    return FALSE;
  before = state_get (stack);
  step = g_ptr_array_index (stack->steps, stack->pos);
  pl_document_freeze (stack->doc);
  for (i = 0; i < step->commands->len && ok; i++)
    ok = pl_command_apply (g_ptr_array_index (step->commands, i), stack->doc, NULL);
  if (!ok)
    {
      /* Cannot happen while every change goes through this stack (the
       * document is exactly as it was after the step was undone).  Should
       * it happen anyway, leave the document as it is now and drop the
       * steps that no longer fit it, rather than half-apply one. */
      for (i--; i-- > 0;)
        pl_command_revert (g_ptr_array_index (step->commands, i), stack->doc);
      drop_redo (stack);
    }
  else
    stack->pos++;
  pl_document_thaw (stack->doc);
  stack->may_merge = FALSE;
  state_notify (stack, &before);
  return ok;
}

gboolean
pl_undo_stack_can_undo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  return stack->open == NULL && stack->pos > 0;
}

gboolean
pl_undo_stack_can_redo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  return stack->open == NULL && stack->pos < stack->steps->len;
}

const char *
pl_undo_stack_get_undo_label (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), NULL);
  if (!pl_undo_stack_can_undo (stack))
    return NULL;
  return ((Step *) g_ptr_array_index (stack->steps, stack->pos - 1))->label;
}

const char *
pl_undo_stack_get_redo_label (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), NULL);
  if (!pl_undo_stack_can_redo (stack))
    return NULL;
  return ((Step *) g_ptr_array_index (stack->steps, stack->pos))->label;
}

/* A step's label with the parts it acted on: "Change Bore H2", "Delete
 * H2" for one part, "Move 3 Parts" for several (wires and notes that went with them
 * are not counted), "Delete 2 Items" for wires or notes alone; the bare
 * label when it names nothing, or one wire or note. */
static char *
step_describe (const Step *step)
{
  g_autoptr (GHashTable) subjects = g_hash_table_new_full (g_str_hash, g_str_equal,
                                                           g_free, g_free);
  GHashTableIter iter;
  gpointer tag;
  guint n, n_parts = 0;
  const char *only_tag = NULL;

  for (guint i = 0; i < step->commands->len; i++)
    pl_command_add_subjects (g_ptr_array_index (step->commands, i), subjects);
  n = g_hash_table_size (subjects);
  g_hash_table_iter_init (&iter, subjects);
  while (g_hash_table_iter_next (&iter, NULL, &tag))
    if (tag != NULL)
      {
        n_parts++;
        only_tag = tag;
      }
  if (n_parts == 1)
    /* Translators: an edit and the tag of the part it acted on, "Change Bore
     * H2", "Delete H2", "Move H2". */
    return g_strdup_printf (C_("edit and part", "%s %s"), step->label, only_tag);
  if (n_parts > 1)
    /* Translators: an edit and how many parts it changed, "Move 3 Parts". */
    return g_strdup_printf (ngettext ("%s %u Part", "%s %u Parts", n_parts), step->label,
                            n_parts);
  if (n > 1)
    /* Translators: an edit and how many wires and notes it changed,
     * "Delete 2 Items". */
    return g_strdup_printf (ngettext ("%s %u Item", "%s %u Items", n), step->label, n);
  return g_strdup (step->label);
}

char *
pl_undo_stack_describe_undo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), NULL);
  if (!pl_undo_stack_can_undo (stack))
    return NULL;
  return step_describe (g_ptr_array_index (stack->steps, stack->pos - 1));
}

char *
pl_undo_stack_describe_redo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), NULL);
  if (!pl_undo_stack_can_redo (stack))
    return NULL;
  return step_describe (g_ptr_array_index (stack->steps, stack->pos));
}

guint
pl_undo_stack_get_n_undo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), 0);
  return stack->open == NULL ? stack->pos : 0;
}

guint
pl_undo_stack_get_n_redo (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), 0);
  return stack->open == NULL ? stack->steps->len - stack->pos : 0;
}

void
pl_undo_stack_begin_group (PlUndoStack *stack, const char *label)
{
  State before;
  guint mark;

  g_return_if_fail (PL_IS_UNDO_STACK (stack));
  before = state_get (stack);
  if (stack->open == NULL)
    stack->open = step_new (label);
  mark = stack->open->commands->len;
  g_array_append_val (stack->marks, mark);
  stack->may_merge = FALSE;
  state_notify (stack, &before);
}

static void
close_level (PlUndoStack *self)
{
  g_array_set_size (self->marks, self->marks->len - 1);
  if (self->marks->len > 0)
    return;
  if (self->open->commands->len > 0)
    record (self, self->open);
  else
    step_free (self->open);
  self->open = NULL;
}

void
pl_undo_stack_end_group (PlUndoStack *stack)
{
  State before;

  g_return_if_fail (PL_IS_UNDO_STACK (stack));
  g_return_if_fail (stack->open != NULL);
  before = state_get (stack);
  close_level (stack);
  stack->may_merge = FALSE;
  state_notify (stack, &before);
}

void
pl_undo_stack_abort_group (PlUndoStack *stack)
{
  State before;
  GPtrArray *cmds;
  guint mark;

  g_return_if_fail (PL_IS_UNDO_STACK (stack));
  g_return_if_fail (stack->open != NULL);
  before = state_get (stack);
  cmds = stack->open->commands;
  mark = g_array_index (stack->marks, guint, stack->marks->len - 1);
  if (cmds->len > mark)
    {
      pl_document_freeze (stack->doc);
      for (guint i = cmds->len; i-- > mark;)
        pl_command_revert (g_ptr_array_index (cmds, i), stack->doc);
      pl_document_thaw (stack->doc);
      g_ptr_array_remove_range (cmds, mark, cmds->len - mark);
    }
  close_level (stack);
  stack->may_merge = FALSE;
  state_notify (stack, &before);
}

guint
pl_undo_stack_get_group_depth (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), 0);
  return stack->marks->len;
}

gboolean
pl_undo_stack_barrier (PlUndoStack *stack)
{
  State before;

  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  if (stack->open != NULL)
    return FALSE;
  before = state_get (stack);
  g_ptr_array_set_size (stack->steps, 0);
  stack->pos = 0;
  stack->clean_pos = 0;
  stack->may_merge = FALSE;
  state_notify (stack, &before);
  return TRUE;
}

void
pl_undo_stack_mark_clean (PlUndoStack *stack)
{
  State before;

  g_return_if_fail (PL_IS_UNDO_STACK (stack));
  /* Inside a group the state being built is not a step yet. */
  if (stack->open != NULL)
    return;
  before = state_get (stack);
  stack->clean_pos = stack->pos;
  stack->may_merge = FALSE;
  state_notify (stack, &before);
}

gboolean
pl_undo_stack_is_clean (PlUndoStack *stack)
{
  g_return_val_if_fail (PL_IS_UNDO_STACK (stack), FALSE);
  /* A group that has not changed anything yet leaves the state clean. */
  return (stack->open == NULL || stack->open->commands->len == 0)
         && stack->clean_pos == (gint64) stack->pos;
}
