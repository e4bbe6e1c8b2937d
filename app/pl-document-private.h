/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-document-private.h: the document's insides, for pl-document.c,
 * pl-command.c and pl-part-types.c only.  Nothing outside the model may
 * include this: every change from outside is a command.
 */
#pragma once

#include "pl-document.h"

G_BEGIN_DECLS

struct _PlPart
{
  char *id;
  const PlPartType *type;
  char *tag;                 /* "" for the pseudo parts */
  double x, y;
  guint rotation;            /* 0..3 */
  gboolean mirrored;
  PlValue *values;           /* type->n_params entries, in the spec order */
};

struct _PlWire
{
  char *id;
  char *part[2];
  char *port[2];
  PlPoint *bends;            /* n_bends entries, or NULL */
  guint n_bends;
};

struct _PlNote
{
  char *id;
  double x, y;
  char *text;
};

/* Items.  *_new give the type's defaults; *_dup deep copies; *_free take
 * NULL. */
PlPart *pl_part_new (const PlPartType *type, const char *id, const char *tag);
PlPart *pl_part_dup (const PlPart *part);
void pl_part_free (PlPart *part);
gboolean pl_part_equal (const PlPart *a, const PlPart *b);

PlWire *pl_wire_new (const char *id, const char *part_a, const char *port_a,
                     const char *part_b, const char *port_b, const PlPoint *bends,
                     guint n_bends);
PlWire *pl_wire_dup (const PlWire *wire);
void pl_wire_free (PlWire *wire);

PlNote *pl_note_new (const char *id, double x, double y, const char *text);
PlNote *pl_note_dup (const PlNote *note);
void pl_note_free (PlNote *note);

/* The mutable lists (element types PlPart *, PlWire *, PlNote *; the arrays
 * own their items). */
GPtrArray *pl_document_parts (PlDocument *doc);
GPtrArray *pl_document_wires (PlDocument *doc);
GPtrArray *pl_document_notes (PlDocument *doc);
/* Mutable look-ups; index may be NULL.  find_part_mut also finds the
 * scenario and the title (index then G_MAXUINT). */
PlPart *pl_document_find_part_mut (PlDocument *doc, const char *id, guint *index);
PlWire *pl_document_find_wire_mut (PlDocument *doc, const char *id, guint *index);
PlNote *pl_document_find_note_mut (PlDocument *doc, const char *id, guint *index);

/* Ids.  prefix is 'p', 'w' or 'n'.  generate_id returns "p<N>" with the
 * counter's number and advances it; claim_id checks an explicit id's form
 * (prefix, then a number from 1 without leading zeros) and that no item of
 * any kind has it, and raises the counter past it. */
char *pl_document_generate_id (PlDocument *doc, char prefix);
gboolean pl_document_claim_id (PlDocument *doc, char prefix, const char *id, GError **error);
/* The checks of claim_id alone: nothing changes. */
gboolean pl_document_check_id (PlDocument *doc, char prefix, const char *id, GError **error);
/* Whether any part, wire or note, or a pseudo part, has this id. */
gboolean pl_document_id_in_use (PlDocument *doc, const char *id);

/* A tag that pl_command_new_set_tag may give part (NULL: a new part). */
gboolean pl_document_check_tag (PlDocument *doc, const char *tag, const PlPart *part,
                                GError **error);

/* Change notification: every change calls changed(); while frozen the flags
 * are gathered and thaw emits once (if anything changed). */
void pl_document_freeze (PlDocument *doc);
void pl_document_thaw (PlDocument *doc);
void pl_document_changed (PlDocument *doc, PlChange change);
/* Replaces the flags gathered while frozen and returns the old ones (a
 * sequence that fails takes its own back). */
PlChange pl_document_swap_pending (PlDocument *doc, PlChange pending);

/* Text the user gave, fit to quote in a message: valid UTF-8 (bad bytes
 * replaced) and at most 40 characters.  NULL reads as "".  Newly allocated. */
char *pl_shown_text (const char *text);

/* Cross-field rules of one part (pl-part-types.c); scenario (may be NULL)
 * for rules that involve the firing schedule. */
gboolean pl_part_check_consistency (const PlPart *part, const PlPart *scenario,
                                    const PlUnitPrefs *prefs, GError **error);

G_END_DECLS
