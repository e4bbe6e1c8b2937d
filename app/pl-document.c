/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-document.c: the layout model.  Changes arrive only through
 * pl-command.c, which uses the private functions at the end of this file.
 */
#include "config.h"

#include "pl-document.h"
#include "pl-document-private.h"

#include <glib/gi18n.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

G_DEFINE_QUARK (pl-document-error-quark, pl_document_error)

struct _PlDocument
{
  GObject parent_instance;

  GPtrArray *parts;   /* PlPart * */
  GPtrArray *wires;   /* PlWire * */
  GPtrArray *notes;   /* PlNote * */
  PlPart *scenario;
  PlPart *title;
  guint next_part;
  guint next_wire;
  guint next_note;
  guint64 revision;
  guint freeze;
  PlChange pending;
};

enum
{
  SIGNAL_CHANGED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

G_DEFINE_FINAL_TYPE (PlDocument, pl_document, G_TYPE_OBJECT)

/* --- items --- */

PlPart *
pl_part_new (const PlPartType *type, const char *id, const char *tag)
{
  PlPart *part;

  g_return_val_if_fail (type != NULL && id != NULL, NULL);
  part = g_new0 (PlPart, 1);
  part->id = g_strdup (id);
  part->type = type;
  part->tag = g_strdup (tag != NULL ? tag : "");
  part->values = g_new0 (PlValue, MAX (type->n_params, 1));
  for (guint i = 0; i < type->n_params; i++)
    pl_param_spec_default_value (&type->params[i], &part->values[i]);
  return part;
}

PlPart *
pl_part_dup (const PlPart *part)
{
  PlPart *copy;

  g_return_val_if_fail (part != NULL, NULL);
  copy = g_new0 (PlPart, 1);
  *copy = *part;
  copy->id = g_strdup (part->id);
  copy->tag = g_strdup (part->tag);
  copy->values = g_new0 (PlValue, MAX (part->type->n_params, 1));
  for (guint i = 0; i < part->type->n_params; i++)
    pl_value_copy (&part->values[i], &copy->values[i]);
  return copy;
}

void
pl_part_free (PlPart *part)
{
  if (part == NULL)
    return;
  for (guint i = 0; i < part->type->n_params; i++)
    pl_value_clear (&part->values[i]);
  g_free (part->values);
  g_free (part->id);
  g_free (part->tag);
  g_free (part);
}

gboolean
pl_part_equal (const PlPart *a, const PlPart *b)
{
  if (a->type != b->type || g_strcmp0 (a->id, b->id) != 0
      || g_strcmp0 (a->tag, b->tag) != 0 || a->x != b->x || a->y != b->y
      || a->rotation != b->rotation || !a->mirrored != !b->mirrored)
    return FALSE;
  for (guint i = 0; i < a->type->n_params; i++)
    if (!pl_value_equal (&a->values[i], &b->values[i]))
      return FALSE;
  return TRUE;
}

PlWire *
pl_wire_new (const char *id, const char *part_a, const char *port_a, const char *part_b,
             const char *port_b, const PlPoint *bends, guint n_bends)
{
  PlWire *wire = g_new0 (PlWire, 1);

  wire->id = g_strdup (id);
  wire->part[0] = g_strdup (part_a);
  wire->port[0] = g_strdup (port_a);
  wire->part[1] = g_strdup (part_b);
  wire->port[1] = g_strdup (port_b);
  wire->n_bends = bends != NULL ? n_bends : 0;
  wire->bends = wire->n_bends > 0 ? g_memdup2 (bends, n_bends * sizeof *bends) : NULL;
  return wire;
}

PlWire *
pl_wire_dup (const PlWire *wire)
{
  g_return_val_if_fail (wire != NULL, NULL);
  return pl_wire_new (wire->id, wire->part[0], wire->port[0], wire->part[1], wire->port[1],
                      wire->bends, wire->n_bends);
}

void
pl_wire_free (PlWire *wire)
{
  if (wire == NULL)
    return;
  g_free (wire->id);
  for (guint i = 0; i < 2; i++)
    {
      g_free (wire->part[i]);
      g_free (wire->port[i]);
    }
  g_free (wire->bends);
  g_free (wire);
}

static gboolean
pl_wire_equal (const PlWire *a, const PlWire *b)
{
  if (g_strcmp0 (a->id, b->id) != 0 || a->n_bends != b->n_bends)
    return FALSE;
  for (guint i = 0; i < 2; i++)
    if (g_strcmp0 (a->part[i], b->part[i]) != 0 || g_strcmp0 (a->port[i], b->port[i]) != 0)
      return FALSE;
  for (guint i = 0; i < a->n_bends; i++)
    if (a->bends[i].x != b->bends[i].x || a->bends[i].y != b->bends[i].y)
      return FALSE;
  return TRUE;
}

PlNote *
pl_note_new (const char *id, double x, double y, const char *text)
{
  PlNote *note = g_new0 (PlNote, 1);

  note->id = g_strdup (id);
  note->x = x;
  note->y = y;
  note->text = g_strdup (text != NULL ? text : "");
  return note;
}

PlNote *
pl_note_dup (const PlNote *note)
{
  g_return_val_if_fail (note != NULL, NULL);
  return pl_note_new (note->id, note->x, note->y, note->text);
}

void
pl_note_free (PlNote *note)
{
  if (note == NULL)
    return;
  g_free (note->id);
  g_free (note->text);
  g_free (note);
}

static gboolean
pl_note_equal (const PlNote *a, const PlNote *b)
{
  return g_strcmp0 (a->id, b->id) == 0 && a->x == b->x && a->y == b->y
         && g_strcmp0 (a->text, b->text) == 0;
}

/* --- GObject --- */

static void
pl_document_finalize (GObject *object)
{
  PlDocument *self = PL_DOCUMENT (object);

  g_ptr_array_unref (self->parts);
  g_ptr_array_unref (self->wires);
  g_ptr_array_unref (self->notes);
  pl_part_free (self->scenario);
  pl_part_free (self->title);
  G_OBJECT_CLASS (pl_document_parent_class)->finalize (object);
}

static void
pl_document_class_init (PlDocumentClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->finalize = pl_document_finalize;

  /**
   * PlDocument::changed:
   * @change: PlChange flags of what the command touched
   *
   * Emitted once per applied or reverted command, after the revision grew.
   */
  signals[SIGNAL_CHANGED] = g_signal_new ("changed", G_TYPE_FROM_CLASS (klass),
                                          G_SIGNAL_RUN_LAST, 0, NULL, NULL, NULL,
                                          G_TYPE_NONE, 1, G_TYPE_UINT);
}

static void
pl_document_init (PlDocument *self)
{
  self->parts = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_part_free);
  self->wires = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_wire_free);
  self->notes = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_note_free);
  self->scenario = pl_part_new (pl_part_type_get (PL_PART_SCENARIO), "scenario", "");
  self->title = pl_part_new (pl_part_type_get (PL_PART_TITLE), "title", "");
  self->next_part = 1;
  self->next_wire = 1;
  self->next_note = 1;
}

/* --- public: document --- */

PlDocument *
pl_document_new (void)
{
  return g_object_new (PL_TYPE_DOCUMENT, NULL);
}

PlDocument *
pl_document_copy (PlDocument *doc)
{
  PlDocument *copy;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  copy = pl_document_new ();
  for (guint i = 0; i < doc->parts->len; i++)
    g_ptr_array_add (copy->parts, pl_part_dup (g_ptr_array_index (doc->parts, i)));
  for (guint i = 0; i < doc->wires->len; i++)
    g_ptr_array_add (copy->wires, pl_wire_dup (g_ptr_array_index (doc->wires, i)));
  for (guint i = 0; i < doc->notes->len; i++)
    g_ptr_array_add (copy->notes, pl_note_dup (g_ptr_array_index (doc->notes, i)));
  pl_part_free (copy->scenario);
  pl_part_free (copy->title);
  copy->scenario = pl_part_dup (doc->scenario);
  copy->title = pl_part_dup (doc->title);
  copy->next_part = doc->next_part;
  copy->next_wire = doc->next_wire;
  copy->next_note = doc->next_note;
  copy->revision = doc->revision;
  return copy;
}

gboolean
pl_document_equal (PlDocument *a, PlDocument *b)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (a) && PL_IS_DOCUMENT (b), FALSE);
  if (a->parts->len != b->parts->len || a->wires->len != b->wires->len
      || a->notes->len != b->notes->len)
    return FALSE;
  if (!pl_part_equal (a->scenario, b->scenario) || !pl_part_equal (a->title, b->title))
    return FALSE;
  for (guint i = 0; i < a->parts->len; i++)
    if (!pl_part_equal (g_ptr_array_index (a->parts, i), g_ptr_array_index (b->parts, i)))
      return FALSE;
  for (guint i = 0; i < a->wires->len; i++)
    if (!pl_wire_equal (g_ptr_array_index (a->wires, i), g_ptr_array_index (b->wires, i)))
      return FALSE;
  for (guint i = 0; i < a->notes->len; i++)
    if (!pl_note_equal (g_ptr_array_index (a->notes, i), g_ptr_array_index (b->notes, i)))
      return FALSE;
  return TRUE;
}

guint64
pl_document_get_revision (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->revision;
}

guint
pl_document_get_n_parts (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->parts->len;
}

const PlPart *
pl_document_get_part (PlDocument *doc, guint index)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return index < doc->parts->len ? g_ptr_array_index (doc->parts, index) : NULL;
}

const PlPart *
pl_document_find_part (PlDocument *doc, const char *id)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return pl_document_find_part_mut (doc, id, NULL);
}

const PlPart *
pl_document_find_part_by_tag (PlDocument *doc, const char *tag)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  if (tag == NULL)
    return NULL;
  for (guint i = 0; i < doc->parts->len; i++)
    {
      const PlPart *p = g_ptr_array_index (doc->parts, i);

      if (g_str_equal (p->tag, tag))
        return p;
    }
  return NULL;
}

char *
pl_document_next_tag (PlDocument *doc, const PlPartType *type)
{
  g_autoptr (GHashTable) used = NULL;
  size_t prefix_len;
  guint n;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc) && type != NULL, NULL);
  /* The numbers in use with this prefix; the lowest free one wins, so a
   * deleted H2 leaves its tag for the next hose (tags are for people; ids
   * are what never repeats). */
  used = g_hash_table_new (g_direct_hash, g_direct_equal);
  prefix_len = strlen (type->tag_prefix);
  for (guint i = 0; i < doc->parts->len; i++)
    {
      const PlPart *p = g_ptr_array_index (doc->parts, i);
      const char *rest;
      char *end;
      unsigned long v;

      if (strncmp (p->tag, type->tag_prefix, prefix_len) != 0)
        continue;
      rest = p->tag + prefix_len;
      if (!g_ascii_isdigit (rest[0]) || rest[0] == '0')
        continue;
      v = strtoul (rest, &end, 10);
      if (*end == '\0' && v > 0 && v <= G_MAXUINT / 2)
        g_hash_table_add (used, GUINT_TO_POINTER ((guint) v));
    }
  for (n = 1; g_hash_table_contains (used, GUINT_TO_POINTER (n)); n++)
    ;
  return g_strdup_printf ("%s%u", type->tag_prefix, n);
}

const PlPart *
pl_document_get_scenario (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return doc->scenario;
}

const PlPart *
pl_document_get_title (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return doc->title;
}

guint
pl_document_get_n_wires (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->wires->len;
}

const PlWire *
pl_document_get_wire (PlDocument *doc, guint index)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return index < doc->wires->len ? g_ptr_array_index (doc->wires, index) : NULL;
}

const PlWire *
pl_document_find_wire (PlDocument *doc, const char *id)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return pl_document_find_wire_mut (doc, id, NULL);
}

GPtrArray *
pl_document_get_port_wires (PlDocument *doc, const char *part_id, const char *port_key)
{
  GPtrArray *out;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  out = g_ptr_array_new ();
  if (part_id == NULL || port_key == NULL)
    return out;
  for (guint i = 0; i < doc->wires->len; i++)
    {
      const PlWire *w = g_ptr_array_index (doc->wires, i);

      for (guint e = 0; e < 2; e++)
        if (g_str_equal (w->part[e], part_id) && g_str_equal (w->port[e], port_key))
          {
            g_ptr_array_add (out, (gpointer) w);
            break;
          }
    }
  return out;
}

guint
pl_document_get_n_notes (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->notes->len;
}

const PlNote *
pl_document_get_note (PlDocument *doc, guint index)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return index < doc->notes->len ? g_ptr_array_index (doc->notes, index) : NULL;
}

const PlNote *
pl_document_find_note (PlDocument *doc, const char *id)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  return pl_document_find_note_mut (doc, id, NULL);
}

guint
pl_document_get_next_part_number (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->next_part;
}

guint
pl_document_get_next_wire_number (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->next_wire;
}

guint
pl_document_get_next_note_number (PlDocument *doc)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), 0);
  return doc->next_note;
}

gboolean
pl_document_check_part (PlDocument *doc, const PlPart *part, const PlUnitPrefs *prefs,
                        GError **error)
{
  g_return_val_if_fail (PL_IS_DOCUMENT (doc) && part != NULL, FALSE);
  return pl_part_check_consistency (part, doc->scenario, prefs, error);
}

/* --- public: part accessors --- */

const char *
pl_part_get_id (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, NULL);
  return part->id;
}

const PlPartType *
pl_part_get_part_type (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, NULL);
  return part->type;
}

const char *
pl_part_get_tag (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, "");
  return part->tag;
}

double
pl_part_get_x (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, 0.0);
  return part->x;
}

double
pl_part_get_y (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, 0.0);
  return part->y;
}

guint
pl_part_get_rotation (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, 0);
  return part->rotation;
}

gboolean
pl_part_get_mirrored (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, FALSE);
  return part->mirrored;
}

const PlValue *
pl_part_get_value (const PlPart *part, const char *key)
{
  guint index;

  g_return_val_if_fail (part != NULL, NULL);
  if (pl_part_type_find_param (part->type, key, &index) == NULL)
    return NULL;
  return &part->values[index];
}

const PlValue *
pl_part_get_nth_value (const PlPart *part, guint index)
{
  g_return_val_if_fail (part != NULL, NULL);
  return index < part->type->n_params ? &part->values[index] : NULL;
}

double
pl_part_get_number (const PlPart *part, const char *key)
{
  const PlValue *v = pl_part_get_value (part, key);

  return v != NULL && v->kind == PL_PARAM_NUMBER ? v->number : NAN;
}

guint
pl_part_get_choice (const PlPart *part, const char *key)
{
  const PlValue *v = pl_part_get_value (part, key);

  return v != NULL && v->kind == PL_PARAM_CHOICE ? v->choice : 0;
}

const char *
pl_part_get_choice_key (const PlPart *part, const char *key)
{
  const PlParamSpec *spec;
  guint index;

  g_return_val_if_fail (part != NULL, NULL);
  spec = pl_part_type_find_param (part->type, key, &index);
  if (spec == NULL || spec->kind != PL_PARAM_CHOICE || part->values[index].choice >= spec->n_choices)
    return NULL;
  return spec->choices[part->values[index].choice].key;
}

gboolean
pl_part_get_boolean (const PlPart *part, const char *key)
{
  const PlValue *v = pl_part_get_value (part, key);

  return v != NULL && v->kind == PL_PARAM_BOOLEAN ? v->boolean : FALSE;
}

const char *
pl_part_get_text (const PlPart *part, const char *key)
{
  const PlValue *v = pl_part_get_value (part, key);

  return v != NULL && v->kind == PL_PARAM_TEXT && v->text != NULL ? v->text : "";
}

gboolean
pl_part_param_is_relevant (const PlPart *part, const PlParamSpec *spec)
{
  const PlParamSpec *dep;
  guint index;

  g_return_val_if_fail (part != NULL && spec != NULL, FALSE);
  if (spec->depends_on == NULL)
    return TRUE;
  dep = pl_part_type_find_param (part->type, spec->depends_on, &index);
  if (dep == NULL || dep->kind != PL_PARAM_CHOICE || part->values[index].choice >= 32)
    return TRUE;
  return (spec->depends_mask & (1u << part->values[index].choice)) != 0;
}

/* Mirror across the part's vertical axis, then turn clockwise on the
 * drawing: with y downwards a quarter turn clockwise maps (x, y) to (-y, x). */
gboolean
pl_part_get_port_position (const PlPart *part, const char *port_key, PlPoint *out)
{
  const PlPortSpec *port;
  double x, y;

  g_return_val_if_fail (part != NULL && out != NULL, FALSE);
  port = pl_part_type_find_port (part->type, port_key, NULL);
  if (port == NULL)
    return FALSE;
  x = part->mirrored ? -port->x : port->x;
  y = port->y;
  for (guint r = 0; r < part->rotation % 4; r++)
    {
      double t = x;

      x = -y;
      y = t;
    }
  /* The turns may leave -0 for a port on an axis; keep it out of the sum
   * so a part at (-0, y) and one at (0, y) give the same port. */
  out->x = part->x + (x == 0.0 ? 0.0 : x);
  out->y = part->y + (y == 0.0 ? 0.0 : y);
  return TRUE;
}

PlSide
pl_part_get_port_side (const PlPart *part, const char *port_key)
{
  const PlPortSpec *port;
  guint side;

  g_return_val_if_fail (part != NULL, PL_SIDE_EAST);
  port = pl_part_type_find_port (part->type, port_key, NULL);
  if (port == NULL)
    return PL_SIDE_EAST;
  side = (guint) port->side;
  /* The sides are numbered clockwise, so mirroring swaps east and west and
   * a quarter turn adds one. */
  if (part->mirrored && (side == PL_SIDE_EAST || side == PL_SIDE_WEST))
    side = side == PL_SIDE_EAST ? PL_SIDE_WEST : PL_SIDE_EAST;
  return (PlSide) ((side + part->rotation) % 4);
}

double
pl_part_get_port_elevation (const PlPart *part, const char *port_key)
{
  double z;

  g_return_val_if_fail (part != NULL, 0.0);
  z = pl_part_get_number (part, "elevation");
  if (isnan (z))
    z = 0.0;
  if ((part->type->kind == PL_PART_HOSE || part->type->kind == PL_PART_PIPE)
      && g_strcmp0 (port_key, "b") == 0)
    z += pl_part_get_number (part, "rise");
  return z;
}

/* --- public: wires and notes --- */

const char *
pl_wire_get_id (const PlWire *wire)
{
  g_return_val_if_fail (wire != NULL, NULL);
  return wire->id;
}

const char *
pl_wire_get_part_id (const PlWire *wire, guint end)
{
  g_return_val_if_fail (wire != NULL && end < 2, NULL);
  return wire->part[end];
}

const char *
pl_wire_get_port_key (const PlWire *wire, guint end)
{
  g_return_val_if_fail (wire != NULL && end < 2, NULL);
  return wire->port[end];
}

const PlPoint *
pl_wire_get_bends (const PlWire *wire, guint *n_points)
{
  g_return_val_if_fail (wire != NULL && n_points != NULL, NULL);
  *n_points = wire->n_bends;
  return wire->bends;
}

const char *
pl_note_get_id (const PlNote *note)
{
  g_return_val_if_fail (note != NULL, NULL);
  return note->id;
}

double
pl_note_get_x (const PlNote *note)
{
  g_return_val_if_fail (note != NULL, 0.0);
  return note->x;
}

double
pl_note_get_y (const PlNote *note)
{
  g_return_val_if_fail (note != NULL, 0.0);
  return note->y;
}

const char *
pl_note_get_text (const PlNote *note)
{
  g_return_val_if_fail (note != NULL, "");
  return note->text;
}

/* --- private: for the commands --- */

char *
pl_shown_text (const char *text)
{
  char *valid = g_utf8_make_valid (text != NULL ? text : "", -1);

  /* Quoting a 10 MB string in an error helps nobody. */
  if (g_utf8_strlen (valid, -1) > 40)
    *g_utf8_offset_to_pointer (valid, 40) = '\0';
  return valid;
}

GPtrArray *
pl_document_parts (PlDocument *doc)
{
  return doc->parts;
}

GPtrArray *
pl_document_wires (PlDocument *doc)
{
  return doc->wires;
}

GPtrArray *
pl_document_notes (PlDocument *doc)
{
  return doc->notes;
}

PlPart *
pl_document_find_part_mut (PlDocument *doc, const char *id, guint *index)
{
  if (id == NULL)
    return NULL;
  if (g_str_equal (id, "scenario") || g_str_equal (id, "title"))
    {
      if (index != NULL)
        *index = G_MAXUINT;
      return id[0] == 's' ? doc->scenario : doc->title;
    }
  for (guint i = 0; i < doc->parts->len; i++)
    {
      PlPart *p = g_ptr_array_index (doc->parts, i);

      if (g_str_equal (p->id, id))
        {
          if (index != NULL)
            *index = i;
          return p;
        }
    }
  return NULL;
}

PlWire *
pl_document_find_wire_mut (PlDocument *doc, const char *id, guint *index)
{
  if (id == NULL)
    return NULL;
  for (guint i = 0; i < doc->wires->len; i++)
    {
      PlWire *w = g_ptr_array_index (doc->wires, i);

      if (g_str_equal (w->id, id))
        {
          if (index != NULL)
            *index = i;
          return w;
        }
    }
  return NULL;
}

PlNote *
pl_document_find_note_mut (PlDocument *doc, const char *id, guint *index)
{
  if (id == NULL)
    return NULL;
  for (guint i = 0; i < doc->notes->len; i++)
    {
      PlNote *n = g_ptr_array_index (doc->notes, i);

      if (g_str_equal (n->id, id))
        {
          if (index != NULL)
            *index = i;
          return n;
        }
    }
  return NULL;
}

static guint *
counter_for (PlDocument *doc, char prefix)
{
  switch (prefix)
    {
    case 'p':
      return &doc->next_part;
    case 'w':
      return &doc->next_wire;
    case 'n':
      return &doc->next_note;
    default:
      return NULL;
    }
}

gboolean
pl_document_id_in_use (PlDocument *doc, const char *id)
{
  return pl_document_find_part_mut (doc, id, NULL) != NULL
         || pl_document_find_wire_mut (doc, id, NULL) != NULL
         || pl_document_find_note_mut (doc, id, NULL) != NULL;
}

char *
pl_document_generate_id (PlDocument *doc, char prefix)
{
  guint *counter = counter_for (doc, prefix);
  char *id;

  g_return_val_if_fail (counter != NULL, NULL);
  /* Explicit ids raise the counter past themselves, so the loop runs once
   * unless ids were claimed out of order. */
  for (;;)
    {
      id = g_strdup_printf ("%c%u", prefix, (*counter)++);
      if (!pl_document_id_in_use (doc, id))
        return id;
      g_free (id);
    }
}

/* Ids stay below a billion: nobody draws that many parts, and the bound
 * keeps the counter far from wrapping. */
#define PL_ID_NUMBER_MAX 999999999u

/* The number of a well-formed id, or 0. */
static guint
id_number (char prefix, const char *id)
{
  guint64 n = 0;

  if (id == NULL || id[0] != prefix || id[1] < '1' || id[1] > '9' || strlen (id) > 10)
    return 0;
  for (const char *d = id + 1; *d != '\0'; d++)
    {
      if (!g_ascii_isdigit (*d))
        return 0;
      n = n * 10 + (guint64) (*d - '0');
    }
  return n <= PL_ID_NUMBER_MAX ? (guint) n : 0;
}

gboolean
pl_document_check_id (PlDocument *doc, char prefix, const char *id, GError **error)
{
  if (id_number (prefix, id) == 0)
    {
      g_autofree char *shown = pl_shown_text (id != NULL ? id : "");

      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_ID,
                   /* Translators: the first %s is an id as given, the second a letter. */
                   _("“%s” is not a valid id: it must be “%c” followed by a number "
                     "from 1."), shown, prefix);
      return FALSE;
    }
  if (pl_document_id_in_use (doc, id))
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_DUPLICATE_ID,
                   /* Translators: %s is an item's id such as "p3". */
                   _("The id “%s” is already in use."), id);
      return FALSE;
    }
  return TRUE;
}

gboolean
pl_document_claim_id (PlDocument *doc, char prefix, const char *id, GError **error)
{
  guint *counter = counter_for (doc, prefix);
  guint n;

  g_return_val_if_fail (counter != NULL, FALSE);
  if (!pl_document_check_id (doc, prefix, id, error))
    return FALSE;
  n = id_number (prefix, id);
  if (n >= *counter)
    *counter = n + 1;
  return TRUE;
}

gboolean
pl_document_check_tag (PlDocument *doc, const char *tag, const PlPart *part, GError **error)
{
  const PlPart *other;
  glong len;

  if (tag == NULL || !g_utf8_validate (tag, -1, NULL))
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_TAG,
                           _("A tag must be valid UTF-8 text."));
      return FALSE;
    }
  len = g_utf8_strlen (tag, -1);
  if (len == 0 || len > PL_TAG_MAX_LENGTH)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_TAG,
                   _("A tag must have 1 to %d characters."), PL_TAG_MAX_LENGTH);
      return FALSE;
    }
  for (const char *p = tag; *p != '\0'; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);
      gboolean edge = p == tag || *g_utf8_next_char (p) == '\0';

      if (g_unichar_iscntrl (c) || c == 0x2028 || c == 0x2029
          || (edge && g_unichar_isspace (c)))
        {
          g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_TAG,
                               _("A tag must not contain control characters nor begin "
                                 "or end with a space."));
          return FALSE;
        }
    }
  other = pl_document_find_part_by_tag (doc, tag);
  if (other != NULL && other != part)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_DUPLICATE_TAG,
                   /* Translators: %s is a tag such as "H3". */
                   _("Another part is already tagged “%s”."), tag);
      return FALSE;
    }
  return TRUE;
}

void
pl_document_freeze (PlDocument *doc)
{
  doc->freeze++;
}

void
pl_document_thaw (PlDocument *doc)
{
  g_return_if_fail (doc->freeze > 0);
  if (--doc->freeze == 0 && doc->pending != PL_CHANGE_NONE)
    {
      PlChange change = doc->pending;

      doc->pending = PL_CHANGE_NONE;
      doc->revision++;
      g_signal_emit (doc, signals[SIGNAL_CHANGED], 0, (guint) change);
    }
}

PlChange
pl_document_swap_pending (PlDocument *doc, PlChange pending)
{
  PlChange old = doc->pending;

  doc->pending = pending;
  return old;
}

void
pl_document_changed (PlDocument *doc, PlChange change)
{
  /* Even a command that changed nothing visible (a value set to itself)
   * counts as a change: it is one step of the history, and the revision
   * then says "something was done" without comparing contents. */
  doc->pending |= change == PL_CHANGE_NONE ? PL_CHANGE_PARAMETERS : change;
  if (doc->freeze == 0)
    {
      doc->freeze++;
      pl_document_thaw (doc);
    }
}
