/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-command.c: reversible edits.
 *
 * Every apply runs in two phases: check everything against the document,
 * then change it.  Nothing is changed before the last check has passed, so
 * a refused command leaves the document as it was.  What a command
 * replaces is kept (old values, removed items with their list positions),
 * and what it produced too (new positions, generated ids and tags), so
 * revert and redo restore states exactly instead of recomputing them with
 * rounding.
 */
#include "config.h"

#include "pl-command.h"
#include "pl-document-private.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

typedef enum
{
  CMD_ADD_PART,
  CMD_REMOVE,
  CMD_MOVE,
  CMD_ORIENT,      /* set orientation, rotate and flip */
  CMD_SET_TAG,
  CMD_SET_VALUE,
  CMD_ADD_WIRE,
  CMD_SET_BENDS,
  CMD_ADD_NOTE,
  CMD_SET_NOTE_TEXT,
  CMD_SEQUENCE,
} CmdKind;

typedef enum
{
  ORIENT_SET,
  ORIENT_ROTATE,
  ORIENT_FLIP,
} OrientMode;

typedef enum
{
  ITEM_PART,
  ITEM_WIRE,
  ITEM_NOTE,
} ItemKind;

/* One item taken out by a remove command, with its list position. */
typedef struct
{
  ItemKind kind;
  guint index;
  gpointer item;   /* PlPart *, PlWire * or PlNote *, owned */
} Removed;

/* The state of one moved item before and after the move. */
typedef struct
{
  ItemKind kind;
  char *id;
  PlPoint before, after;          /* parts and notes */
  PlPoint *bends_before;          /* wires */
  PlPoint *bends_after;
  guint n_bends;
} Moved;

struct _PlCommand
{
  grefcount ref;
  CmdKind kind;
  char *label;
  PlDocument *doc;            /* the document applied to (not a reference) */
  gboolean applied;

  /* Arguments. */
  char *type_key;
  char *id;                   /* explicit id, or the item acted on */
  char *tag;                  /* add part (explicit) and set tag */
  double x, y, dx, dy;
  guint rotation;
  gboolean mirrored;
  int turns;
  OrientMode orient_mode;
  char *key;
  PlValue value;
  char **ids;
  guint n_ids;
  char *ends_part[2];
  char *ends_port[2];
  PlPoint *bends;
  guint n_bends;
  char *text;
  GPtrArray *children;        /* PlCommand *, owned */

  /* Kept by apply for revert and redo. */
  char *created_id;
  char *created_tag;
  PlValue old_value;
  char *old_text;
  PlPoint *old_bends;
  guint old_n_bends;
  guint old_rotation, new_rotation;
  gboolean old_mirrored, new_mirrored;
  GArray *removed;            /* Removed, in the order taken out */
  GArray *moved;              /* Moved */
};

/* Notes take text up to PL_NOTE_MAX_LENGTH with line breaks and tabs; the
 * spec gives them the same checks as multi-line text parameters. */
static const PlParamSpec note_text_spec = {
  .key = "text", .label = N_("Note text"), .help = NULL, .kind = PL_PARAM_TEXT,
  .default_text = "", .max_length = PL_NOTE_MAX_LENGTH, .multiline = TRUE,
};

/* --- construction and lifetime --- */

static PlCommand *
cmd_new (CmdKind kind, const char *label)
{
  PlCommand *cmd = g_new0 (PlCommand, 1);

  g_ref_count_init (&cmd->ref);
  cmd->kind = kind;
  cmd->label = g_strdup (label);
  return cmd;
}

PlCommand *
pl_command_ref (PlCommand *cmd)
{
  g_return_val_if_fail (cmd != NULL, NULL);
  g_ref_count_inc (&cmd->ref);
  return cmd;
}

static void
removed_clear (gpointer data)
{
  Removed *r = data;

  switch (r->kind)
    {
    case ITEM_PART:
      pl_part_free (r->item);
      break;
    case ITEM_WIRE:
      pl_wire_free (r->item);
      break;
    case ITEM_NOTE:
      pl_note_free (r->item);
      break;
    default:
      break;
    }
}

static void
moved_clear (gpointer data)
{
  Moved *m = data;

  g_free (m->id);
  g_free (m->bends_before);
  g_free (m->bends_after);
}

void
pl_command_unref (PlCommand *cmd)
{
  if (cmd == NULL || !g_ref_count_dec (&cmd->ref))
    return;
  g_free (cmd->label);
  g_free (cmd->type_key);
  g_free (cmd->id);
  g_free (cmd->tag);
  g_free (cmd->key);
  pl_value_clear (&cmd->value);
  g_strfreev (cmd->ids);
  for (guint i = 0; i < 2; i++)
    {
      g_free (cmd->ends_part[i]);
      g_free (cmd->ends_port[i]);
    }
  g_free (cmd->bends);
  g_free (cmd->text);
  g_clear_pointer (&cmd->children, g_ptr_array_unref);
  g_free (cmd->created_id);
  g_free (cmd->created_tag);
  pl_value_clear (&cmd->old_value);
  g_free (cmd->old_text);
  g_free (cmd->old_bends);
  g_clear_pointer (&cmd->removed, g_array_unref);
  g_clear_pointer (&cmd->moved, g_array_unref);
  g_free (cmd);
}

const char *
pl_command_get_label (PlCommand *cmd)
{
  g_return_val_if_fail (cmd != NULL, NULL);
  if (cmd->label == NULL && cmd->kind == CMD_SEQUENCE)
    return cmd->children->len > 0 ? pl_command_get_label (g_ptr_array_index (cmd->children, 0))
                                  : _("Edit");
  return cmd->label;
}

/* The tag a part shows on the canvas now, or the one it had when this
 * command took it out or had not yet made it; NULL for anything but a
 * placed part (wires, notes, the pseudo parts). */
static const char *
subject_tag (PlCommand *cmd, const char *id)
{
  PlPart *part = cmd->doc != NULL ? pl_document_find_part_mut (cmd->doc, id, NULL) : NULL;

  if (part != NULL)
    return part->tag[0] != '\0' ? part->tag : NULL;
  for (guint i = 0; cmd->removed != NULL && i < cmd->removed->len; i++)
    {
      Removed *r = &g_array_index (cmd->removed, Removed, i);

      if (r->kind == ITEM_PART && g_strcmp0 (((PlPart *) r->item)->id, id) == 0)
        return ((PlPart *) r->item)->tag;
    }
  if (cmd->kind == CMD_ADD_PART && g_strcmp0 (cmd->created_id, id) == 0)
    return cmd->created_tag;
  return NULL;
}

static void
add_subject (PlCommand *cmd, const char *id, GHashTable *subjects)
{
  if (id == NULL || g_str_equal (id, "scenario") || g_str_equal (id, "title")
      || g_hash_table_contains (subjects, id))
    return;
  g_hash_table_insert (subjects, g_strdup (id), g_strdup (subject_tag (cmd, id)));
}

void
pl_command_add_subjects (PlCommand *cmd, GHashTable *subjects)
{
  g_return_if_fail (cmd != NULL);
  g_return_if_fail (subjects != NULL);
  switch (cmd->kind)
    {
    case CMD_ADD_PART:
    case CMD_ADD_WIRE:
    case CMD_ADD_NOTE:
      add_subject (cmd, cmd->created_id, subjects);
      break;
    case CMD_REMOVE:
    case CMD_MOVE:
      for (guint i = 0; i < cmd->n_ids; i++)
        add_subject (cmd, cmd->ids[i], subjects);
      break;
    case CMD_SEQUENCE:
      for (guint i = 0; i < cmd->children->len; i++)
        pl_command_add_subjects (g_ptr_array_index (cmd->children, i), subjects);
      break;
    case CMD_ORIENT:
    case CMD_SET_TAG:
    case CMD_SET_VALUE:
    case CMD_SET_BENDS:
    case CMD_SET_NOTE_TEXT:
    default:
      add_subject (cmd, cmd->id, subjects);
      break;
    }
}

const char *
pl_command_get_created_id (PlCommand *cmd)
{
  g_return_val_if_fail (cmd != NULL, NULL);
  return cmd->created_id;
}

/* --- checks shared by several commands --- */

static gboolean
check_coordinate (double v, GError **error)
{
  if (isfinite (v) && fabs (v) <= PL_COORDINATE_MAX)
    return TRUE;
  g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_GEOMETRY,
               _("A position must be a finite number within %g of the origin."),
               PL_COORDINATE_MAX);
  return FALSE;
}

static gboolean
check_bends (const PlPoint *bends, guint n_bends, GError **error)
{
  if (n_bends > PL_WIRE_MAX_BENDS)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_GEOMETRY,
                   _("A wire can have at most %d bend points."), PL_WIRE_MAX_BENDS);
      return FALSE;
    }
  for (guint i = 0; i < n_bends; i++)
    if (!check_coordinate (bends[i].x, error) || !check_coordinate (bends[i].y, error))
      return FALSE;
  return TRUE;
}

static void
set_unknown (GError **error, const char *id)
{
  g_autofree char *shown = pl_shown_text (id != NULL ? id : "");

  /* Translators: %s is the id of a part, wire or note, such as "p3". */
  g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_UNKNOWN_ITEM,
               _("There is no part, wire or note “%s”."), shown);
}

/* A placed part (not a pseudo part) by id. */
static PlPart *
need_placed_part (PlDocument *doc, const char *id, guint *index, GError **error)
{
  guint i = 0;
  PlPart *part = pl_document_find_part_mut (doc, id, &i);

  if (part == NULL)
    {
      set_unknown (error, id);
      return NULL;
    }
  if (!part->type->placeable)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_NOT_PLACEABLE,
                   /* Translators: %s is "Scenario" or "Title block". */
                   _("%s is not a part on the drawing."), _(part->type->name));
      return NULL;
    }
  if (index != NULL)
    *index = i;
  return part;
}

/* Explicit id, or the one generated at the first apply, or a new one. */
static gboolean
claim_or_generate (PlCommand *cmd, PlDocument *doc, char prefix, GError **error)
{
  const char *want = cmd->id != NULL ? cmd->id : cmd->created_id;

  if (want != NULL)
    {
      g_autofree char *copy = g_strdup (want);

      if (!pl_document_claim_id (doc, prefix, copy, error))
        return FALSE;
      g_free (cmd->created_id);
      cmd->created_id = g_steal_pointer (&copy);
      return TRUE;
    }
  cmd->created_id = pl_document_generate_id (doc, prefix);
  return TRUE;
}

/* Whether an id would be accepted by claim_or_generate, without claiming. */
static gboolean
check_new_id (PlCommand *cmd, PlDocument *doc, char prefix, GError **error)
{
  const char *want = cmd->id != NULL ? cmd->id : cmd->created_id;

  return want == NULL || pl_document_check_id (doc, prefix, want, error);
}

/* --- add part --- */

static gboolean
add_part_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  const PlPartType *type = pl_part_type_lookup (cmd->type_key);
  g_autofree char *tag = NULL;
  PlPart *part;

  if (type == NULL)
    {
      g_autofree char *shown = pl_shown_text (cmd->type_key ? cmd->type_key : "");

      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_UNKNOWN_TYPE,
                   /* Translators: %s is a part type's key such as "hose". */
                   _("There is no part type “%s”."), shown);
      return FALSE;
    }
  if (!type->placeable)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_NOT_PLACEABLE,
                   _("%s is not a part on the drawing."), _(type->name));
      return FALSE;
    }
  if (!check_coordinate (cmd->x, error) || !check_coordinate (cmd->y, error))
    return FALSE;
  if (cmd->rotation > 3)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_GEOMETRY,
                           _("A rotation must be 0 to 3 quarter turns."));
      return FALSE;
    }
  if (cmd->tag != NULL)
    tag = g_strdup (cmd->tag);
  else if (cmd->created_tag != NULL)
    tag = g_strdup (cmd->created_tag);
  else
    tag = pl_document_next_tag (doc, type);
  if (!pl_document_check_tag (doc, tag, NULL, error)
      || !check_new_id (cmd, doc, 'p', error))
    return FALSE;

  /* Checked: from here on nothing fails. */
  if (!claim_or_generate (cmd, doc, 'p', error))
    g_return_val_if_reached (FALSE);
  part = pl_part_new (type, cmd->created_id, tag);
  part->x = cmd->x;
  part->y = cmd->y;
  part->rotation = cmd->rotation;
  part->mirrored = cmd->mirrored;
  g_free (cmd->created_tag);
  cmd->created_tag = g_steal_pointer (&tag);
  g_ptr_array_add (pl_document_parts (doc), part);
  pl_document_changed (doc, PL_CHANGE_TOPOLOGY);
  return TRUE;
}

static void
add_part_revert (PlCommand *cmd, PlDocument *doc)
{
  guint index;

  if (pl_document_find_part_mut (doc, cmd->created_id, &index) == NULL)
    g_return_if_reached ();
  g_ptr_array_remove_index (pl_document_parts (doc), index);
  pl_document_changed (doc, PL_CHANGE_TOPOLOGY);
}

PlCommand *
pl_command_new_add_part_full (const char *type_key, const char *id, const char *tag,
                              double x, double y, guint rotation, gboolean mirrored)
{
  const PlPartType *type = pl_part_type_lookup (type_key);
  g_autofree char *label = NULL;
  PlCommand *cmd;

  /* Translators: %s is a part type's name, "Add Hose". */
  label = g_strdup_printf (_("Add %s"), type != NULL ? _(type->name) : _("Part"));
  cmd = cmd_new (CMD_ADD_PART, label);
  cmd->type_key = g_strdup (type_key);
  cmd->id = g_strdup (id);
  cmd->tag = g_strdup (tag);
  cmd->x = x;
  cmd->y = y;
  cmd->rotation = rotation;
  cmd->mirrored = mirrored;
  return cmd;
}

PlCommand *
pl_command_new_add_part (const char *type_key, const char *id, double x, double y)
{
  return pl_command_new_add_part_full (type_key, id, NULL, x, y, 0, FALSE);
}

/* --- remove --- */

static gboolean
id_listed (char **ids, guint n, const char *id)
{
  for (guint i = 0; i < n; i++)
    if (g_str_equal (ids[i], id))
      return TRUE;
  return FALSE;
}

static gint
compare_uint_desc (gconstpointer a, gconstpointer b)
{
  guint x = *(const guint *) a, y = *(const guint *) b;

  return x < y ? 1 : x > y ? -1 : 0;
}

/* Takes the items at the given indexes (any order) out of list, highest
 * index first so the recorded indexes stay right, into removed. */
static void
take_out (GArray *removed, GPtrArray *list, GArray *indexes, ItemKind kind)
{
  g_array_sort (indexes, compare_uint_desc);
  for (guint i = 0; i < indexes->len; i++)
    {
      Removed r;

      r.kind = kind;
      r.index = g_array_index (indexes, guint, i);
      r.item = g_ptr_array_steal_index (list, r.index);
      g_array_append_val (removed, r);
    }
}

static gboolean
remove_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  g_autoptr (GArray) part_ix = g_array_new (FALSE, FALSE, sizeof (guint));
  g_autoptr (GArray) wire_ix = g_array_new (FALSE, FALSE, sizeof (guint));
  g_autoptr (GArray) note_ix = g_array_new (FALSE, FALSE, sizeof (guint));
  GPtrArray *wires = pl_document_wires (doc);
  g_autoptr (GPtrArray) gone_parts = g_ptr_array_new ();   /* part ids, borrowed */

  if (cmd->n_ids == 0)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_EMPTY,
                           _("Nothing to delete."));
      return FALSE;
    }
  for (guint i = 0; i < cmd->n_ids; i++)
    {
      const char *id = cmd->ids[i];
      guint index;

      if (id_listed (cmd->ids, i, id))
        continue;   /* a duplicate */
      if (pl_document_find_part_mut (doc, id, NULL) != NULL)
        {
          if (need_placed_part (doc, id, &index, error) == NULL)
            return FALSE;
          g_array_append_val (part_ix, index);
          g_ptr_array_add (gone_parts, (gpointer) id);
        }
      else if (pl_document_find_wire_mut (doc, id, &index) != NULL)
        g_array_append_val (wire_ix, index);
      else if (pl_document_find_note_mut (doc, id, &index) != NULL)
        g_array_append_val (note_ix, index);
      else
        {
          set_unknown (error, id);
          return FALSE;
        }
    }
  /* Wires at removed parts go too, once each. */
  for (guint i = 0; i < wires->len; i++)
    {
      PlWire *w = g_ptr_array_index (wires, i);
      gboolean listed = FALSE;

      for (guint k = 0; k < wire_ix->len && !listed; k++)
        listed = g_array_index (wire_ix, guint, k) == i;
      if (listed)
        continue;
      for (guint k = 0; k < gone_parts->len; k++)
        if (g_str_equal (w->part[0], g_ptr_array_index (gone_parts, k))
            || g_str_equal (w->part[1], g_ptr_array_index (gone_parts, k)))
          {
            g_array_append_val (wire_ix, i);
            break;
          }
    }

  g_clear_pointer (&cmd->removed, g_array_unref);
  cmd->removed = g_array_new (FALSE, FALSE, sizeof (Removed));
  g_array_set_clear_func (cmd->removed, removed_clear);
  take_out (cmd->removed, wires, wire_ix, ITEM_WIRE);
  take_out (cmd->removed, pl_document_parts (doc), part_ix, ITEM_PART);
  take_out (cmd->removed, pl_document_notes (doc), note_ix, ITEM_NOTE);
  pl_document_changed (doc, (part_ix->len > 0 || wire_ix->len > 0 ? PL_CHANGE_TOPOLOGY : 0)
                            | (note_ix->len > 0 ? PL_CHANGE_ANNOTATION : 0));
  return TRUE;
}

static void
remove_revert (PlCommand *cmd, PlDocument *doc)
{
  gboolean topology = FALSE, notes = FALSE;

  /* In reverse: each item goes back to the index it had when taken out. */
  for (guint i = cmd->removed->len; i-- > 0;)
    {
      Removed *r = &g_array_index (cmd->removed, Removed, i);
      GPtrArray *list = r->kind == ITEM_PART ? pl_document_parts (doc)
                        : r->kind == ITEM_WIRE ? pl_document_wires (doc)
                        : pl_document_notes (doc);

      g_ptr_array_insert (list, (gint) r->index, g_steal_pointer (&r->item));
      if (r->kind == ITEM_NOTE)
        notes = TRUE;
      else
        topology = TRUE;
    }
  /* The items belong to the document again; keep nothing. */
  g_clear_pointer (&cmd->removed, g_array_unref);
  pl_document_changed (doc, (topology ? PL_CHANGE_TOPOLOGY : 0)
                            | (notes ? PL_CHANGE_ANNOTATION : 0));
}

static char **
copy_ids (const char *const *ids, guint n_ids)
{
  char **copy = g_new0 (char *, n_ids + 1);

  for (guint i = 0; i < n_ids; i++)
    copy[i] = g_strdup (ids[i] != NULL ? ids[i] : "");
  return copy;
}

PlCommand *
pl_command_new_remove (const char *const *ids, guint n_ids)
{
  PlCommand *cmd = cmd_new (CMD_REMOVE, _("Delete"));

  cmd->n_ids = ids != NULL ? n_ids : 0;
  cmd->ids = copy_ids (ids, cmd->n_ids);
  return cmd;
}

/* --- move --- */

static gboolean
move_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  gboolean redo = cmd->moved != NULL;
  g_autoptr (GArray) moved = NULL;

  if (cmd->n_ids == 0)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_EMPTY,
                           _("Nothing to move."));
      return FALSE;
    }
  if (!isfinite (cmd->dx) || !isfinite (cmd->dy))
    return check_coordinate (NAN, error);

  /* Phase one: where everything would go, refused if any item is unknown or
   * would leave the drawing.  A redo takes the recorded positions. */
  moved = g_array_new (FALSE, TRUE, sizeof (Moved));
  g_array_set_clear_func (moved, moved_clear);
  for (guint i = 0; i < cmd->n_ids; i++)
    {
      const char *id = cmd->ids[i];
      Moved m = { 0 };
      const Moved *last;
      PlPart *part;
      PlNote *note;
      PlWire *wire;

      if (id_listed (cmd->ids, i, id))
        continue;
      if ((part = pl_document_find_part_mut (doc, id, NULL)) != NULL)
        {
          if (need_placed_part (doc, id, NULL, error) == NULL)
            return FALSE;
          m.kind = ITEM_PART;
          m.before = (PlPoint) { part->x, part->y };
          m.after = (PlPoint) { part->x + cmd->dx, part->y + cmd->dy };
        }
      else if ((note = pl_document_find_note_mut (doc, id, NULL)) != NULL)
        {
          m.kind = ITEM_NOTE;
          m.before = (PlPoint) { note->x, note->y };
          m.after = (PlPoint) { note->x + cmd->dx, note->y + cmd->dy };
        }
      else if ((wire = pl_document_find_wire_mut (doc, id, NULL)) != NULL)
        {
          m.kind = ITEM_WIRE;
          m.n_bends = wire->n_bends;
          m.bends_before = g_memdup2 (wire->bends, wire->n_bends * sizeof (PlPoint));
          m.bends_after = g_memdup2 (wire->bends, wire->n_bends * sizeof (PlPoint));
          for (guint k = 0; k < m.n_bends; k++)
            {
              m.bends_after[k].x += cmd->dx;
              m.bends_after[k].y += cmd->dy;
            }
        }
      else
        {
          set_unknown (error, id);
          return FALSE;
        }
      m.id = g_strdup (id);
      /* A redo (or a merged move) goes exactly where the first apply went. */
      for (guint k = 0; redo && k < cmd->moved->len; k++)
        {
          const Moved *r = &g_array_index (cmd->moved, Moved, k);

          if (g_str_equal (r->id, id) && r->kind == m.kind && r->n_bends == m.n_bends)
            {
              m.after = r->after;
              if (m.n_bends > 0)
                memcpy (m.bends_after, r->bends_after, m.n_bends * sizeof (PlPoint));
              break;
            }
        }
      g_array_append_val (moved, m);   /* owned by moved from here on */
      last = &g_array_index (moved, Moved, moved->len - 1);
      if (last->kind == ITEM_WIRE
          ? !check_bends (last->bends_after, last->n_bends, error)
          : (!check_coordinate (last->after.x, error)
             || !check_coordinate (last->after.y, error)))
        return FALSE;
    }

  /* Phase two. */
  for (guint i = 0; i < moved->len; i++)
    {
      const Moved *m = &g_array_index (moved, Moved, i);

      if (m->kind == ITEM_PART)
        {
          PlPart *part = pl_document_find_part_mut (doc, m->id, NULL);

          part->x = m->after.x;
          part->y = m->after.y;
        }
      else if (m->kind == ITEM_NOTE)
        {
          PlNote *note = pl_document_find_note_mut (doc, m->id, NULL);

          note->x = m->after.x;
          note->y = m->after.y;
        }
      else if (m->n_bends > 0)
        {
          PlWire *wire = pl_document_find_wire_mut (doc, m->id, NULL);

          memcpy (wire->bends, m->bends_after, m->n_bends * sizeof (PlPoint));
        }
    }
  g_clear_pointer (&cmd->moved, g_array_unref);
  cmd->moved = g_steal_pointer (&moved);
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
  return TRUE;
}

static void
move_revert (PlCommand *cmd, PlDocument *doc)
{
  for (guint i = 0; i < cmd->moved->len; i++)
    {
      const Moved *m = &g_array_index (cmd->moved, Moved, i);

      if (m->kind == ITEM_PART)
        {
          PlPart *part = pl_document_find_part_mut (doc, m->id, NULL);

          part->x = m->before.x;
          part->y = m->before.y;
        }
      else if (m->kind == ITEM_NOTE)
        {
          PlNote *note = pl_document_find_note_mut (doc, m->id, NULL);

          note->x = m->before.x;
          note->y = m->before.y;
        }
      else if (m->n_bends > 0)
        {
          PlWire *wire = pl_document_find_wire_mut (doc, m->id, NULL);

          memcpy (wire->bends, m->bends_before, m->n_bends * sizeof (PlPoint));
        }
    }
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
}

PlCommand *
pl_command_new_move (const char *const *ids, guint n_ids, double dx, double dy)
{
  PlCommand *cmd = cmd_new (CMD_MOVE, _("Move"));

  cmd->n_ids = ids != NULL ? n_ids : 0;
  cmd->ids = copy_ids (ids, cmd->n_ids);
  cmd->dx = dx;
  cmd->dy = dy;
  return cmd;
}

/* --- orientation --- */

static gboolean
orient_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlPart *part = need_placed_part (doc, cmd->id, NULL, error);

  if (part == NULL)
    return FALSE;
  if (cmd->orient_mode == ORIENT_SET && cmd->rotation > 3)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_GEOMETRY,
                           _("A rotation must be 0 to 3 quarter turns."));
      return FALSE;
    }
  cmd->old_rotation = part->rotation;
  cmd->old_mirrored = part->mirrored;
  switch (cmd->orient_mode)
    {
    case ORIENT_SET:
      cmd->new_rotation = cmd->rotation;
      cmd->new_mirrored = cmd->mirrored;
      break;
    case ORIENT_ROTATE:
      cmd->new_rotation = (guint) ((((int) part->rotation + cmd->turns % 4) % 4 + 4) % 4);
      cmd->new_mirrored = part->mirrored;
      break;
    case ORIENT_FLIP:
    default:
      cmd->new_rotation = part->rotation;
      cmd->new_mirrored = !part->mirrored;
      break;
    }
  part->rotation = cmd->new_rotation;
  part->mirrored = cmd->new_mirrored;
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
  return TRUE;
}

static void
orient_revert (PlCommand *cmd, PlDocument *doc)
{
  PlPart *part = pl_document_find_part_mut (doc, cmd->id, NULL);

  g_return_if_fail (part != NULL);
  part->rotation = cmd->old_rotation;
  part->mirrored = cmd->old_mirrored;
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
}

PlCommand *
pl_command_new_set_orientation (const char *part_id, guint rotation, gboolean mirrored)
{
  PlCommand *cmd = cmd_new (CMD_ORIENT, _("Turn"));

  cmd->id = g_strdup (part_id);
  cmd->orient_mode = ORIENT_SET;
  cmd->rotation = rotation;
  cmd->mirrored = mirrored ? TRUE : FALSE;
  return cmd;
}

PlCommand *
pl_command_new_rotate (const char *part_id, int quarter_turns)
{
  PlCommand *cmd = cmd_new (CMD_ORIENT, _("Rotate"));

  cmd->id = g_strdup (part_id);
  cmd->orient_mode = ORIENT_ROTATE;
  cmd->turns = quarter_turns;
  return cmd;
}

PlCommand *
pl_command_new_flip (const char *part_id)
{
  PlCommand *cmd = cmd_new (CMD_ORIENT, _("Flip"));

  cmd->id = g_strdup (part_id);
  cmd->orient_mode = ORIENT_FLIP;
  return cmd;
}

/* --- tag --- */

static gboolean
set_tag_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlPart *part = need_placed_part (doc, cmd->id, NULL, error);

  if (part == NULL || !pl_document_check_tag (doc, cmd->tag, part, error))
    return FALSE;
  g_free (cmd->old_text);
  cmd->old_text = g_steal_pointer (&part->tag);
  part->tag = g_strdup (cmd->tag);
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
  return TRUE;
}

static void
set_tag_revert (PlCommand *cmd, PlDocument *doc)
{
  PlPart *part = pl_document_find_part_mut (doc, cmd->id, NULL);

  g_return_if_fail (part != NULL);
  g_free (part->tag);
  part->tag = g_steal_pointer (&cmd->old_text);
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
}

PlCommand *
pl_command_new_set_tag (const char *part_id, const char *tag)
{
  PlCommand *cmd = cmd_new (CMD_SET_TAG, _("Rename"));

  cmd->id = g_strdup (part_id);
  cmd->tag = g_strdup (tag);
  return cmd;
}

/* --- values --- */

static gboolean
set_value_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlPart *part = pl_document_find_part_mut (doc, cmd->id, NULL);
  const PlParamSpec *spec;
  guint index;

  if (part == NULL)
    {
      set_unknown (error, cmd->id);
      return FALSE;
    }
  spec = pl_part_type_find_param (part->type, cmd->key, &index);
  if (spec == NULL)
    {
      g_autofree char *shown = pl_shown_text (cmd->key != NULL ? cmd->key : "");
      const char *name = part->tag[0] != '\0' ? part->tag : _(part->type->name);

      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_UNKNOWN_PARAM,
                   /* Translators: the first %s is a part's tag, the second a key. */
                   _("%s has no parameter “%s”."), name, shown);
      return FALSE;
    }
  if (!pl_param_spec_check_value (spec, &cmd->value, NULL, error))
    {
      /* Name the part as well as the field: "H3: Bore must be more than 0 mm." */
      if (error != NULL && *error != NULL && part->tag[0] != '\0')
        g_prefix_error (error, "%s: ", part->tag);
      return FALSE;
    }
  g_free (cmd->label);
  /* Translators: %s is a parameter's label, "Change Bore". */
  cmd->label = g_strdup_printf (_("Change %s"), _(spec->label));
  pl_value_clear (&cmd->old_value);
  cmd->old_value = part->values[index];     /* takes the old text */
  pl_value_copy (&cmd->value, &part->values[index]);
  pl_document_changed (doc, part->type->kind == PL_PART_TITLE ? PL_CHANGE_ANNOTATION
                                                              : PL_CHANGE_PARAMETERS);
  return TRUE;
}

static void
set_value_revert (PlCommand *cmd, PlDocument *doc)
{
  PlPart *part = pl_document_find_part_mut (doc, cmd->id, NULL);
  guint index;

  g_return_if_fail (part != NULL);
  if (pl_part_type_find_param (part->type, cmd->key, &index) == NULL)
    g_return_if_reached ();
  pl_value_clear (&part->values[index]);
  part->values[index] = cmd->old_value;
  memset (&cmd->old_value, 0, sizeof cmd->old_value);
  pl_document_changed (doc, part->type->kind == PL_PART_TITLE ? PL_CHANGE_ANNOTATION
                                                              : PL_CHANGE_PARAMETERS);
}

PlCommand *
pl_command_new_set_value (const char *item_id, const char *key, const PlValue *value)
{
  PlCommand *cmd = cmd_new (CMD_SET_VALUE, _("Change Value"));

  g_return_val_if_fail (value != NULL, cmd);
  cmd->id = g_strdup (item_id);
  cmd->key = g_strdup (key);
  pl_value_copy (value, &cmd->value);
  return cmd;
}

PlCommand *
pl_command_new_set_number (const char *item_id, const char *key, double value)
{
  PlValue v = { .kind = PL_PARAM_NUMBER, .number = value };

  return pl_command_new_set_value (item_id, key, &v);
}

PlCommand *
pl_command_new_set_boolean (const char *item_id, const char *key, gboolean value)
{
  PlValue v = { .kind = PL_PARAM_BOOLEAN, .boolean = value ? TRUE : FALSE };

  return pl_command_new_set_value (item_id, key, &v);
}

PlCommand *
pl_command_new_set_text (const char *item_id, const char *key, const char *text)
{
  PlValue v = { .kind = PL_PARAM_TEXT, .text = (char *) text };
  PlCommand *cmd = pl_command_new_set_value (item_id, key, &v);

  /* NULL text stays NULL so the check refuses it instead of storing "". */
  if (text == NULL)
    g_clear_pointer (&cmd->value.text, g_free);
  return cmd;
}

/* A choice is stored as its key until apply, where the spec turns it into
 * an index; an unknown key is refused then. */
PlCommand *
pl_command_new_set_choice (const char *item_id, const char *key, const char *choice_key)
{
  PlCommand *cmd = cmd_new (CMD_SET_VALUE, _("Change Value"));

  cmd->id = g_strdup (item_id);
  cmd->key = g_strdup (key);
  cmd->value.kind = PL_PARAM_CHOICE;
  cmd->value.choice = G_MAXUINT;    /* resolved in choice_resolve() */
  cmd->text = g_strdup (choice_key != NULL ? choice_key : "");
  return cmd;
}

/* For set_choice: the index of the key named in cmd->text, or a refusal. */
static gboolean
choice_resolve (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlPart *part = pl_document_find_part_mut (doc, cmd->id, NULL);
  const PlParamSpec *spec;
  int index;

  if (cmd->text == NULL || part == NULL)
    return TRUE;   /* not a choice by key, or set_value_apply reports it */
  spec = pl_part_type_find_param (part->type, cmd->key, NULL);
  if (spec == NULL || spec->kind != PL_PARAM_CHOICE)
    return TRUE;
  index = pl_param_spec_find_choice (spec, cmd->text);
  if (index < 0)
    {
      g_autofree char *shown = pl_shown_text (cmd->text);

      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                   /* Translators: the first %s is a field's label, the second a key. */
                   _("%s has no choice “%s”."), _(spec->label), shown);
      return FALSE;
    }
  cmd->value.choice = (guint) index;
  return TRUE;
}

PlCommand *
pl_command_new_set_title_field (const char *key, const char *text)
{
  return pl_command_new_set_text ("title", key, text);
}

PlCommand *
pl_command_new_set_scenario_number (const char *key, double value)
{
  return pl_command_new_set_number ("scenario", key, value);
}

/* --- wires --- */

static gboolean
add_wire_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  GPtrArray *wires = pl_document_wires (doc);
  PlPart *parts[2];

  for (guint e = 0; e < 2; e++)
    {
      parts[e] = need_placed_part (doc, cmd->ends_part[e], NULL, error);
      if (parts[e] == NULL)
        return FALSE;
      if (pl_part_type_find_port (parts[e]->type, cmd->ends_port[e], NULL) == NULL)
        {
          g_autofree char *shown = pl_shown_text (cmd->ends_port[e] != NULL
                                                      ? cmd->ends_port[e] : "");

          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_UNKNOWN_PORT,
                       /* Translators: the first %s is a part's tag, the second a port. */
                       _("%s has no port “%s”."), parts[e]->tag, shown);
          return FALSE;
        }
    }
  if (parts[0] == parts[1])
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_SELF_WIRE,
                   _("A wire must join two different parts, not %s to itself."),
                   parts[0]->tag);
      return FALSE;
    }
  for (guint i = 0; i < wires->len; i++)
    {
      const PlWire *w = g_ptr_array_index (wires, i);

      for (guint flip = 0; flip < 2; flip++)
        if (g_str_equal (w->part[flip], cmd->ends_part[0])
            && g_str_equal (w->port[flip], cmd->ends_port[0])
            && g_str_equal (w->part[1 - flip], cmd->ends_part[1])
            && g_str_equal (w->port[1 - flip], cmd->ends_port[1]))
          {
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_DUPLICATE_WIRE,
                         /* Translators: the two %s are part tags. */
                         _("These ports of %s and %s are already joined."),
                         parts[0]->tag, parts[1]->tag);
            return FALSE;
          }
    }
  if (!check_bends (cmd->bends, cmd->n_bends, error) || !check_new_id (cmd, doc, 'w', error))
    return FALSE;
  if (!claim_or_generate (cmd, doc, 'w', error))
    g_return_val_if_reached (FALSE);
  g_ptr_array_add (wires, pl_wire_new (cmd->created_id, cmd->ends_part[0], cmd->ends_port[0],
                                       cmd->ends_part[1], cmd->ends_port[1], cmd->bends,
                                       cmd->n_bends));
  pl_document_changed (doc, PL_CHANGE_TOPOLOGY);
  return TRUE;
}

static void
add_wire_revert (PlCommand *cmd, PlDocument *doc)
{
  guint index;

  if (pl_document_find_wire_mut (doc, cmd->created_id, &index) == NULL)
    g_return_if_reached ();
  g_ptr_array_remove_index (pl_document_wires (doc), index);
  pl_document_changed (doc, PL_CHANGE_TOPOLOGY);
}

PlCommand *
pl_command_new_add_wire (const char *id, const char *part_a, const char *port_a,
                         const char *part_b, const char *port_b, const PlPoint *bends,
                         guint n_bends)
{
  PlCommand *cmd = cmd_new (CMD_ADD_WIRE, _("Connect"));

  cmd->id = g_strdup (id);
  cmd->ends_part[0] = g_strdup (part_a);
  cmd->ends_port[0] = g_strdup (port_a);
  cmd->ends_part[1] = g_strdup (part_b);
  cmd->ends_port[1] = g_strdup (port_b);
  cmd->n_bends = bends != NULL ? n_bends : 0;
  cmd->bends = cmd->n_bends > 0 ? g_memdup2 (bends, n_bends * sizeof *bends) : NULL;
  return cmd;
}

static gboolean
set_bends_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlWire *wire = pl_document_find_wire_mut (doc, cmd->id, NULL);

  if (wire == NULL)
    {
      set_unknown (error, cmd->id);
      return FALSE;
    }
  if (!check_bends (cmd->bends, cmd->n_bends, error))
    return FALSE;
  g_free (cmd->old_bends);
  cmd->old_bends = g_steal_pointer (&wire->bends);
  cmd->old_n_bends = wire->n_bends;
  wire->n_bends = cmd->n_bends;
  wire->bends = cmd->n_bends > 0 ? g_memdup2 (cmd->bends, cmd->n_bends * sizeof (PlPoint))
                                 : NULL;
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
  return TRUE;
}

static void
set_bends_revert (PlCommand *cmd, PlDocument *doc)
{
  PlWire *wire = pl_document_find_wire_mut (doc, cmd->id, NULL);

  g_return_if_fail (wire != NULL);
  g_free (wire->bends);
  wire->bends = g_steal_pointer (&cmd->old_bends);
  wire->n_bends = cmd->old_n_bends;
  pl_document_changed (doc, PL_CHANGE_GEOMETRY);
}

PlCommand *
pl_command_new_set_wire_bends (const char *wire_id, const PlPoint *bends, guint n_bends)
{
  PlCommand *cmd = cmd_new (CMD_SET_BENDS, _("Reroute Wire"));

  cmd->id = g_strdup (wire_id);
  cmd->n_bends = bends != NULL ? n_bends : 0;
  cmd->bends = cmd->n_bends > 0 ? g_memdup2 (bends, n_bends * sizeof *bends) : NULL;
  return cmd;
}

/* --- notes --- */

static gboolean
add_note_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  if (!check_coordinate (cmd->x, error) || !check_coordinate (cmd->y, error)
      || !pl_param_spec_check_text (&note_text_spec, cmd->text, error)
      || !check_new_id (cmd, doc, 'n', error))
    return FALSE;
  if (!claim_or_generate (cmd, doc, 'n', error))
    g_return_val_if_reached (FALSE);
  g_ptr_array_add (pl_document_notes (doc),
                   pl_note_new (cmd->created_id, cmd->x, cmd->y, cmd->text));
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
  return TRUE;
}

static void
add_note_revert (PlCommand *cmd, PlDocument *doc)
{
  guint index;

  if (pl_document_find_note_mut (doc, cmd->created_id, &index) == NULL)
    g_return_if_reached ();
  g_ptr_array_remove_index (pl_document_notes (doc), index);
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
}

PlCommand *
pl_command_new_add_note (const char *id, double x, double y, const char *text)
{
  PlCommand *cmd = cmd_new (CMD_ADD_NOTE, _("Add Note"));

  cmd->id = g_strdup (id);
  cmd->x = x;
  cmd->y = y;
  cmd->text = g_strdup (text);
  return cmd;
}

static gboolean
note_text_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  PlNote *note = pl_document_find_note_mut (doc, cmd->id, NULL);

  if (note == NULL)
    {
      set_unknown (error, cmd->id);
      return FALSE;
    }
  if (!pl_param_spec_check_text (&note_text_spec, cmd->text, error))
    return FALSE;
  g_free (cmd->old_text);
  cmd->old_text = g_steal_pointer (&note->text);
  note->text = g_strdup (cmd->text);
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
  return TRUE;
}

static void
note_text_revert (PlCommand *cmd, PlDocument *doc)
{
  PlNote *note = pl_document_find_note_mut (doc, cmd->id, NULL);

  g_return_if_fail (note != NULL);
  g_free (note->text);
  note->text = g_steal_pointer (&cmd->old_text);
  pl_document_changed (doc, PL_CHANGE_ANNOTATION);
}

PlCommand *
pl_command_new_set_note_text (const char *note_id, const char *text)
{
  PlCommand *cmd = cmd_new (CMD_SET_NOTE_TEXT, _("Edit Note"));

  cmd->id = g_strdup (note_id);
  cmd->text = g_strdup (text);
  return cmd;
}

/* --- sequence --- */

static gboolean apply_one (PlCommand *cmd, PlDocument *doc, GError **error);
static void revert_one (PlCommand *cmd, PlDocument *doc);

static gboolean
sequence_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  /* The flags gathered so far are set aside, so that a refusal (which
   * takes back what went in before it) leaves no change to announce. */
  PlChange saved = pl_document_swap_pending (doc, PL_CHANGE_NONE);
  PlChange mine;

  for (guint i = 0; i < cmd->children->len; i++)
    if (!apply_one (g_ptr_array_index (cmd->children, i), doc, error))
      {
        while (i-- > 0)
          revert_one (g_ptr_array_index (cmd->children, i), doc);
        pl_document_swap_pending (doc, saved);
        return FALSE;
      }
  mine = pl_document_swap_pending (doc, PL_CHANGE_NONE);
  pl_document_swap_pending (doc, saved | mine);
  return TRUE;
}

static void
sequence_revert (PlCommand *cmd, PlDocument *doc)
{
  for (guint i = cmd->children->len; i-- > 0;)
    revert_one (g_ptr_array_index (cmd->children, i), doc);
}

PlCommand *
pl_command_new_sequence (const char *label, PlCommand *const *commands, guint n_commands)
{
  PlCommand *cmd = cmd_new (CMD_SEQUENCE, label);

  cmd->children = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_command_unref);
  for (guint i = 0; commands != NULL && i < n_commands; i++)
    if (commands[i] != NULL)
      g_ptr_array_add (cmd->children, pl_command_ref (commands[i]));
  /* Without a label the first command's names the sequence; it is looked
   * up when asked for, since a value command knows its field's label only
   * once applied. */
  return cmd;
}

/* --- dispatch --- */

static gboolean
apply_one (PlCommand *cmd, PlDocument *doc, GError **error)
{
  gboolean ok = FALSE;

  if (cmd->applied)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_BUSY,
                           _("This edit has already been made."));
      return FALSE;
    }
  if (cmd->doc != NULL && cmd->doc != doc)
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_BUSY,
                           _("This edit belongs to another document."));
      return FALSE;
    }
  switch (cmd->kind)
    {
    case CMD_ADD_PART:
      ok = add_part_apply (cmd, doc, error);
      break;
    case CMD_REMOVE:
      ok = remove_apply (cmd, doc, error);
      break;
    case CMD_MOVE:
      ok = move_apply (cmd, doc, error);
      break;
    case CMD_ORIENT:
      ok = orient_apply (cmd, doc, error);
      break;
    case CMD_SET_TAG:
      ok = set_tag_apply (cmd, doc, error);
      break;
    case CMD_SET_VALUE:
      ok = choice_resolve (cmd, doc, error) && set_value_apply (cmd, doc, error);
      break;
    case CMD_ADD_WIRE:
      ok = add_wire_apply (cmd, doc, error);
      break;
    case CMD_SET_BENDS:
      ok = set_bends_apply (cmd, doc, error);
      break;
    case CMD_ADD_NOTE:
      ok = add_note_apply (cmd, doc, error);
      break;
    case CMD_SET_NOTE_TEXT:
      ok = note_text_apply (cmd, doc, error);
      break;
    case CMD_SEQUENCE:
      ok = sequence_apply (cmd, doc, error);
      break;
    default:
      g_assert_not_reached ();
    }
  if (ok)
    {
      cmd->applied = TRUE;
      cmd->doc = doc;
    }
  return ok;
}

static void
revert_one (PlCommand *cmd, PlDocument *doc)
{
  g_return_if_fail (cmd->applied && cmd->doc == doc);
  switch (cmd->kind)
    {
    case CMD_ADD_PART:
      add_part_revert (cmd, doc);
      break;
    case CMD_REMOVE:
      remove_revert (cmd, doc);
      break;
    case CMD_MOVE:
      move_revert (cmd, doc);
      break;
    case CMD_ORIENT:
      orient_revert (cmd, doc);
      break;
    case CMD_SET_TAG:
      set_tag_revert (cmd, doc);
      break;
    case CMD_SET_VALUE:
      set_value_revert (cmd, doc);
      break;
    case CMD_ADD_WIRE:
      add_wire_revert (cmd, doc);
      break;
    case CMD_SET_BENDS:
      set_bends_revert (cmd, doc);
      break;
    case CMD_ADD_NOTE:
      add_note_revert (cmd, doc);
      break;
    case CMD_SET_NOTE_TEXT:
      note_text_revert (cmd, doc);
      break;
    case CMD_SEQUENCE:
      sequence_revert (cmd, doc);
      break;
    default:
      g_assert_not_reached ();
    }
  cmd->applied = FALSE;
}

gboolean
pl_command_apply (PlCommand *cmd, PlDocument *doc, GError **error)
{
  gboolean ok;

  g_return_val_if_fail (cmd != NULL, FALSE);
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);
  /* One "changed" for the whole command, however many items it touched. */
  pl_document_freeze (doc);
  ok = apply_one (cmd, doc, error);
  pl_document_thaw (doc);
  return ok;
}

void
pl_command_revert (PlCommand *cmd, PlDocument *doc)
{
  g_return_if_fail (cmd != NULL);
  g_return_if_fail (PL_IS_DOCUMENT (doc));
  pl_document_freeze (doc);
  revert_one (cmd, doc);
  pl_document_thaw (doc);
}

/* --- merging --- */

static gboolean
same_ids (const PlCommand *a, const PlCommand *b)
{
  if (a->n_ids != b->n_ids)
    return FALSE;
  for (guint i = 0; i < a->n_ids; i++)
    if (!g_str_equal (a->ids[i], b->ids[i]))
      return FALSE;
  return TRUE;
}

gboolean
pl_command_merge (PlCommand *cmd, PlCommand *next)
{
  g_return_val_if_fail (cmd != NULL && next != NULL, FALSE);
  if (!cmd->applied || !next->applied || cmd->doc != next->doc || cmd->kind != next->kind)
    return FALSE;
  switch (cmd->kind)
    {
    case CMD_MOVE:
      if (!same_ids (cmd, next) || cmd->moved->len != next->moved->len)
        return FALSE;
      /* cmd keeps its "before", takes next's "after"; the items are the
       * same and in the same order, since the id lists are equal. */
      for (guint i = 0; i < cmd->moved->len; i++)
        {
          Moved *a = &g_array_index (cmd->moved, Moved, i);
          Moved *b = &g_array_index (next->moved, Moved, i);

          if (a->kind != b->kind || a->n_bends != b->n_bends)
            return FALSE;
        }
      for (guint i = 0; i < cmd->moved->len; i++)
        {
          Moved *a = &g_array_index (cmd->moved, Moved, i);
          Moved *b = &g_array_index (next->moved, Moved, i);

          a->after = b->after;
          if (a->n_bends > 0)
            memcpy (a->bends_after, b->bends_after, a->n_bends * sizeof (PlPoint));
        }
      cmd->dx += next->dx;
      cmd->dy += next->dy;
      return TRUE;
    case CMD_SET_VALUE:
      if (g_strcmp0 (cmd->id, next->id) != 0 || g_strcmp0 (cmd->key, next->key) != 0)
        return FALSE;
      pl_value_clear (&cmd->value);
      pl_value_copy (&next->value, &cmd->value);
      g_free (cmd->text);
      cmd->text = g_strdup (next->text);
      return TRUE;
    case CMD_SET_NOTE_TEXT:
      if (g_strcmp0 (cmd->id, next->id) != 0)
        return FALSE;
      g_free (cmd->text);
      cmd->text = g_strdup (next->text);
      return TRUE;
    case CMD_ADD_PART:
    case CMD_REMOVE:
    case CMD_ORIENT:
    case CMD_SET_TAG:
    case CMD_ADD_WIRE:
    case CMD_SET_BENDS:
    case CMD_ADD_NOTE:
    case CMD_SEQUENCE:
    default:
      return FALSE;
    }
}
