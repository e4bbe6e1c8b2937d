/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Undo: scripts of commands and history operations, each line with the
 * document expected after it (as a canonical text, see describe()), the
 * depth of the undo and redo lists and the clean flag.  Besides the text,
 * every state reached is kept as a deep copy, and every later state that
 * the script says is the same text must be equal to it bit for bit
 * (pl_document_equal), which is what "undo restores exactly" means.
 *
 * The reference here is the specification of the history itself (the
 * header comment of pl-undo-stack.h): there is no published number to
 * compare with, so the expected states are written out by hand.
 */

#include "config.h"

#include <glib.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"

#include "pl-command.h"
#include "pl-document.h"
#include "pl-undo-stack.h"

/* --- the document as text ---------------------------------------------- */

static void
describe_values (GString *out, const PlPart *part)
{
  const PlPartType *t = pl_part_get_part_type (part);

  for (guint i = 0; i < t->n_params; i++)
    {
      const PlParamSpec *s = &t->params[i];
      const PlValue *v = pl_part_get_nth_value (part, i);
      PlValue def;

      pl_param_spec_default_value (s, &def);
      if (!pl_value_equal (v, &def))
        switch (v->kind)
          {
          case PL_PARAM_NUMBER:
            g_string_append_printf (out, " %s=%.15g", s->key, v->number);
            break;
          case PL_PARAM_CHOICE:
            g_string_append_printf (out, " %s=%s", s->key, s->choices[v->choice].key);
            break;
          case PL_PARAM_BOOLEAN:
            g_string_append_printf (out, " %s=%s", s->key, v->boolean ? "yes" : "no");
            break;
          case PL_PARAM_TEXT:
            g_string_append_printf (out, " %s='%s'", s->key, v->text);
            break;
          default:
            break;
          }
      pl_value_clear (&def);
    }
}

/* "p1 H1 hose 0,0 r0; p2 P1 pump 10,0 r1 m bore=...; w1 p1.b-p2.out [2];
 *  n1 5,5 'text'; scenario cycle-rate=3; title site='x'" with only the
 * values that differ from their defaults.  Numbers show 15 digits; the
 * bit-for-bit comparison of the test covers the rest. */
static char *
describe (PlDocument *doc)
{
  GString *out = g_string_new (NULL);
  GString *tail = g_string_new (NULL);

  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *p = pl_document_get_part (doc, i);

      g_string_append_printf (out, "%s%s %s %s %g,%g r%u%s", out->len ? "; " : "",
                              pl_part_get_id (p), pl_part_get_tag (p),
                              pl_part_get_part_type (p)->key, pl_part_get_x (p),
                              pl_part_get_y (p), pl_part_get_rotation (p),
                              pl_part_get_mirrored (p) ? " m" : "");
      describe_values (out, p);
    }
  for (guint i = 0; i < pl_document_get_n_wires (doc); i++)
    {
      const PlWire *w = pl_document_get_wire (doc, i);
      guint n;
      const PlPoint *b = pl_wire_get_bends (w, &n);

      g_string_append_printf (out, "%s%s %s.%s-%s.%s", out->len ? "; " : "",
                              pl_wire_get_id (w), pl_wire_get_part_id (w, 0),
                              pl_wire_get_port_key (w, 0), pl_wire_get_part_id (w, 1),
                              pl_wire_get_port_key (w, 1));
      for (guint k = 0; k < n; k++)
        g_string_append_printf (out, " %g,%g", b[k].x, b[k].y);
    }
  for (guint i = 0; i < pl_document_get_n_notes (doc); i++)
    {
      const PlNote *n = pl_document_get_note (doc, i);

      g_string_append_printf (out, "%s%s %g,%g '%s'", out->len ? "; " : "",
                              pl_note_get_id (n), pl_note_get_x (n), pl_note_get_y (n),
                              pl_note_get_text (n));
    }
  describe_values (tail, pl_document_get_scenario (doc));
  if (tail->len > 0)
    g_string_append_printf (out, "%sscenario%s", out->len ? "; " : "", tail->str);
  g_string_truncate (tail, 0);
  describe_values (tail, pl_document_get_title (doc));
  if (tail->len > 0)
    g_string_append_printf (out, "%stitle%s", out->len ? "; " : "", tail->str);
  g_string_free (tail, TRUE);
  return g_string_free (out, FALSE);
}

/* --- scripts ----------------------------------------------------------- */

typedef enum
{
  END = 0,
  /* commands, pushed */
  ADD,        /* a = type, x, y */
  DEL,        /* a, b = ids (b may be NULL) */
  MOVE,       /* a, b = ids, x = dx, y = dy */
  ROT,        /* a = id, n = quarter turns */
  FLIP,       /* a = id */
  TAG,        /* a = id, b = tag */
  NUM,        /* a = id, b = key, x = value */
  NUM_MERGE,  /* the same through push_merge */
  MOVE_MERGE, /* MOVE through push_merge */
  CHOICE,     /* a = id, b = key, c = choice key */
  TEXT,       /* a = id, b = key, c = text */
  WIRE,       /* a = part, b = port, c = part, d = port */
  BENDS,      /* a = wire, n = count, points (x, y), (x + 10, y) ... */
  NOTE,       /* x, y, c = text */
  NOTE_TEXT,  /* a = note, c = text */
  SEQ_BAD,    /* a sequence: move p1, then a refused value on p1 */
  /* history */
  UNDO,
  REDO,
  BEGIN,
  FINISH,     /* end_group */
  ABORT,
  BARRIER,
  CLEAN,
} Op;

typedef struct
{
  Op op;
  const char *a, *b, *c, *d;
  double x, y;
  int n;
  gboolean ok;          /* push accepted / undo, redo, barrier returned TRUE */
  const char *doc;      /* the document after this line */
  guint n_undo, n_redo;
  gboolean clean;
} Line;

#define OK TRUE
#define NO FALSE
#define YES TRUE

static PlCommand *
make_command (const Line *l)
{
  const char *ids[2] = { l->a, l->b };
  guint n_ids = l->b != NULL ? 2 : 1;

  switch (l->op)
    {
    case ADD:
      return pl_command_new_add_part (l->a, NULL, l->x, l->y);
    case DEL:
      return pl_command_new_remove (ids, n_ids);
    case MOVE:
    case MOVE_MERGE:
      return pl_command_new_move (ids, n_ids, l->x, l->y);
    case ROT:
      return pl_command_new_rotate (l->a, l->n);
    case FLIP:
      return pl_command_new_flip (l->a);
    case TAG:
      return pl_command_new_set_tag (l->a, l->b);
    case NUM:
    case NUM_MERGE:
      return pl_command_new_set_number (l->a, l->b, l->x);
    case CHOICE:
      return pl_command_new_set_choice (l->a, l->b, l->c);
    case TEXT:
      return pl_command_new_set_text (l->a, l->b, l->c);
    case WIRE:
      return pl_command_new_add_wire (NULL, l->a, l->b, l->c, l->d, NULL, 0);
    case BENDS:
      {
        PlPoint pts[8];

        for (int i = 0; i < l->n && i < 8; i++)
          pts[i] = (PlPoint) { l->x + 10.0 * i, l->y };
        return pl_command_new_set_wire_bends (l->a, pts, (guint) l->n);
      }
    case NOTE:
      return pl_command_new_add_note (NULL, l->x, l->y, l->c);
    case NOTE_TEXT:
      return pl_command_new_set_note_text (l->a, l->c);
    case SEQ_BAD:
      {
        const char *p1[] = { "p1" };
        PlCommand *parts[2] = { pl_command_new_move (p1, 1, 1.0, 1.0),
                                pl_command_new_set_number ("p1", "bore", -1.0) };
        PlCommand *seq = pl_command_new_sequence ("Two", parts, 2);

        pl_command_unref (parts[0]);
        pl_command_unref (parts[1]);
        return seq;
      }
    case END:
    case UNDO:
    case REDO:
    case BEGIN:
    case FINISH:
    case ABORT:
    case BARRIER:
    case CLEAN:
    default:
      return NULL;
    }
}

typedef struct
{
  const char *name;
  const Line *lines;
} Script;

/* Plain undo and redo; a push after undo drops the redo list; refused
 * commands leave everything as it was, including the redo list. */
static const Line script_basic[] = {
  { ADD, "hose", .x = 0, .y = 0, .ok = OK, .doc = "p1 H1 hose 0,0 r0", 1, 0, NO },
  { ADD, "pump", .x = -50, .y = 0, .ok = OK,
    .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0", 2, 0, NO },
  { WIRE, "p2", "out", "p1", "a", .ok = OK,
    .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0; w1 p2.out-p1.a", 3, 0, NO },
  { NUM, "p1", "bore", .x = 0.01, .ok = OK,
    .doc = "p1 H1 hose 0,0 r0 bore=0.01; p2 P1 pump -50,0 r0; w1 p2.out-p1.a", 4, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0; w1 p2.out-p1.a", 3, 1, NO },
  { UNDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0", 2, 2, NO },
  /* Refused: the redo list survives. */
  { NUM, "p1", "bore", .x = 0.0, .ok = NO, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0",
    2, 2, NO },
  { NUM, "p9", "bore", .x = 0.01, .ok = NO, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0",
    2, 2, NO },
  { WIRE, "p1", "a", "p1", "b", .ok = NO, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0",
    2, 2, NO },
  { REDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0; w1 p2.out-p1.a", 3, 1, NO },
  { UNDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0; p2 P1 pump -50,0 r0", 2, 2, NO },
  { UNDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0", 1, 3, NO },
  { UNDO, .ok = OK, .doc = "", 0, 4, YES },
  { UNDO, .ok = NO, .doc = "", 0, 4, YES },
  { REDO, .ok = OK, .doc = "p1 H1 hose 0,0 r0", 1, 3, NO },
  /* A new edit: the three redo steps go.  The id p2 was used once and is
   * never given again; the tag P1 is free again and is reused. */
  { ADD, "pump", .x = -60, .y = 0, .ok = OK, .doc = "p1 H1 hose 0,0 r0; p3 P1 pump -60,0 r0",
    2, 0, NO },
  { REDO, .ok = NO, .doc = "p1 H1 hose 0,0 r0; p3 P1 pump -60,0 r0", 2, 0, NO },
  { END },
};

/* One drag is one step: a group of moves; nested groups count once; an
 * empty group records nothing; abort takes back the innermost level. */
static const Line script_groups[] = {
  { ADD, "gauge", .x = 0, .y = 0, .ok = OK, .doc = "p1 G1 gauge 0,0 r0", 1, 0, NO },
  { BEGIN, .doc = "p1 G1 gauge 0,0 r0", 0, 0, NO },
  { MOVE, "p1", .x = 1, .y = 0, .ok = OK, .doc = "p1 G1 gauge 1,0 r0", 0, 0, NO },
  { MOVE, "p1", .x = 1, .y = 2, .ok = OK, .doc = "p1 G1 gauge 2,2 r0", 0, 0, NO },
  { BEGIN, .doc = "p1 G1 gauge 2,2 r0", 0, 0, NO },
  { ROT, "p1", .n = -1, .ok = OK, .doc = "p1 G1 gauge 2,2 r3", 0, 0, NO },
  { UNDO, .ok = NO, .doc = "p1 G1 gauge 2,2 r3", 0, 0, NO },
  { BARRIER, .ok = NO, .doc = "p1 G1 gauge 2,2 r3", 0, 0, NO },
  { FINISH, .doc = "p1 G1 gauge 2,2 r3", 0, 0, NO },
  { MOVE, "p1", .x = 0.5, .y = 0, .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3", 0, 0, NO },
  { FINISH, .doc = "p1 G1 gauge 2.5,2 r3", 2, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 G1 gauge 0,0 r0", 1, 1, NO },
  { REDO, .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3", 2, 0, NO },
  /* An empty group records nothing and keeps the redo list. */
  { UNDO, .ok = OK, .doc = "p1 G1 gauge 0,0 r0", 1, 1, NO },
  { BEGIN, .doc = "p1 G1 gauge 0,0 r0", 0, 0, NO },
  { NUM, "p1", "full-scale", .x = -1, .ok = NO, .doc = "p1 G1 gauge 0,0 r0", 0, 0, NO },
  { FINISH, .doc = "p1 G1 gauge 0,0 r0", 1, 1, NO },
  { REDO, .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3", 2, 0, NO },
  /* Abort: the inner level is taken back, the outer one stays. */
  { BEGIN, .doc = "p1 G1 gauge 2.5,2 r3", 0, 0, NO },
  { FLIP, "p1", .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3 m", 0, 0, NO },
  { BEGIN, .doc = "p1 G1 gauge 2.5,2 r3 m", 0, 0, NO },
  { MOVE, "p1", .x = 100, .y = 100, .ok = OK, .doc = "p1 G1 gauge 102.5,102 r3 m", 0, 0, NO },
  { TAG, "p1", "G-feed", .ok = OK, .doc = "p1 G-feed gauge 102.5,102 r3 m", 0, 0, NO },
  { ABORT, .doc = "p1 G1 gauge 2.5,2 r3 m", 0, 0, NO },
  { FINISH, .doc = "p1 G1 gauge 2.5,2 r3 m", 3, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3", 2, 1, NO },
  /* Aborting a whole group leaves no step and no change, and the redo
   * list is still there. */
  { BEGIN, .doc = "p1 G1 gauge 2.5,2 r3", 0, 0, NO },
  { MOVE, "p1", .x = 7, .y = 7, .ok = OK, .doc = "p1 G1 gauge 9.5,9 r3", 0, 0, NO },
  { ABORT, .doc = "p1 G1 gauge 2.5,2 r3", 2, 1, NO },
  { REDO, .ok = OK, .doc = "p1 G1 gauge 2.5,2 r3 m", 3, 0, NO },
  { END },
};

/* The clean mark: undoing back to the saved state is clean again; an edit
 * after undoing past it makes it unreachable; a barrier makes the present
 * clean and forgets the history. */
static const Line script_clean[] = {
  { ADD, "drain", .x = 0, .y = 0, .ok = OK, .doc = "p1 D1 drain 0,0 r0", 1, 0, NO },
  { CLEAN, .doc = "p1 D1 drain 0,0 r0", 1, 0, YES },
  { NUM, "p1", "elevation", .x = -2, .ok = OK, .doc = "p1 D1 drain 0,0 r0 elevation=-2",
    2, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 D1 drain 0,0 r0", 1, 1, YES },
  { UNDO, .ok = OK, .doc = "", 0, 2, NO },
  { REDO, .ok = OK, .doc = "p1 D1 drain 0,0 r0", 1, 1, YES },
  { REDO, .ok = OK, .doc = "p1 D1 drain 0,0 r0 elevation=-2", 2, 0, NO },
  /* A refused edit does not touch the mark. */
  { UNDO, .ok = OK, .doc = "p1 D1 drain 0,0 r0", 1, 1, YES },
  { CHOICE, "p1", "kind", "lake", .ok = NO, .doc = "p1 D1 drain 0,0 r0", 1, 1, YES },
  { CHOICE, "p1", "kind", "tank", .ok = OK, .doc = "p1 D1 drain 0,0 r0 kind=tank", 2, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 D1 drain 0,0 r0", 1, 1, YES },
  /* Undo past the mark, then edit: the saved state is gone for good. */
  { UNDO, .ok = OK, .doc = "", 0, 2, NO },
  { NOTE, .x = 5, .y = 6, .c = "drain here", .ok = OK, .doc = "n1 5,6 'drain here'", 1, 0, NO },
  { UNDO, .ok = OK, .doc = "", 0, 1, NO },
  { REDO, .ok = OK, .doc = "n1 5,6 'drain here'", 1, 0, NO },
  { NOTE_TEXT, "n1", .c = "drain\nhere", .ok = OK, .doc = "n1 5,6 'drain\nhere'", 2, 0, NO },
  { BARRIER, .ok = OK, .doc = "n1 5,6 'drain\nhere'", 0, 0, YES },
  { UNDO, .ok = NO, .doc = "n1 5,6 'drain\nhere'", 0, 0, YES },
  { TEXT, "title", "site", "Hall 2", .ok = OK, .doc = "n1 5,6 'drain\nhere'; title site='Hall 2'",
    1, 0, NO },
  { UNDO, .ok = OK, .doc = "n1 5,6 'drain\nhere'", 0, 1, YES },
  { END },
};

/* Merging: a spin button dragged through values is one step; merging
 * stops at anything else (another field, an undo, the clean mark). */
static const Line script_merge[] = {
  { ADD, "pump", .x = 0, .y = 0, .ok = OK, .doc = "p1 P1 pump 0,0 r0", 1, 0, NO },
  { NUM_MERGE, "p1", "ratio", .x = 31, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=31", 2, 0, NO },
  { NUM_MERGE, "p1", "ratio", .x = 32, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=32", 2, 0, NO },
  { NUM_MERGE, "p1", "ratio", .x = 45, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=45", 2, 0, NO },
  /* Refused values in between change nothing and do not break the run. */
  { NUM_MERGE, "p1", "ratio", .x = -1, .ok = NO, .doc = "p1 P1 pump 0,0 r0 ratio=45", 2, 0, NO },
  { NUM_MERGE, "p1", "ratio", .x = 46, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=46", 2, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 P1 pump 0,0 r0", 1, 1, NO },
  { REDO, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=46", 2, 0, NO },
  /* After a redo a merge starts a new step. */
  { NUM_MERGE, "p1", "ratio", .x = 20, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=20", 3, 0, NO },
  /* Another field: a new step. */
  { NUM_MERGE, "p1", "displacement", .x = 1e-4, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0 ratio=20 displacement=0.0001", 4, 0, NO },
  { CLEAN, .doc = "p1 P1 pump 0,0 r0 ratio=20 displacement=0.0001", 4, 0, YES },
  /* After the clean mark the saved step must stay as it is. */
  { NUM_MERGE, "p1", "displacement", .x = 2e-4, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0 ratio=20 displacement=0.0002", 5, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=20 displacement=0.0001", 4, 1, YES },
  /* Moves of the same item merge, and redo lands exactly where the merged
   * drag ended (0.1 + 0.2 is not 0.3 in binary: the recorded position is
   * used, not a recomputed one). */
  { MOVE_MERGE, "p1", .x = 0.1, .y = 0, .ok = OK,
    .doc = "p1 P1 pump 0.1,0 r0 ratio=20 displacement=0.0001", 5, 0, NO },
  { MOVE_MERGE, "p1", .x = 0.2, .y = 0, .ok = OK,
    .doc = "p1 P1 pump 0.3,0 r0 ratio=20 displacement=0.0001", 5, 0, NO },
  { UNDO, .ok = OK, .doc = "p1 P1 pump 0,0 r0 ratio=20 displacement=0.0001", 4, 1, YES },
  { REDO, .ok = OK, .doc = "p1 P1 pump 0.3,0 r0 ratio=20 displacement=0.0001", 5, 0, NO },
  /* A plain push never merges. */
  { NUM, "p1", "ratio", .x = 21, .ok = OK,
    .doc = "p1 P1 pump 0.3,0 r0 ratio=21 displacement=0.0001", 6, 0, NO },
  { NUM_MERGE, "p1", "ratio", .x = 22, .ok = OK,
    .doc = "p1 P1 pump 0.3,0 r0 ratio=22 displacement=0.0001", 7, 0, NO },
  { END },
};

/* Removing parts takes their wires; undo puts parts and wires back at their
 * places in the lists; a refused sequence changes nothing. */
static const Line script_remove[] = {
  { ADD, "pump", .x = 0, .y = 0, .ok = OK, .doc = "p1 P1 pump 0,0 r0", 1, 0, NO },
  { ADD, "tee", .x = 50, .y = 0, .ok = OK, .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0",
    2, 0, NO },
  { ADD, "applicator", .x = 100, .y = 0, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,0 r0", 3, 0, NO },
  { WIRE, "p1", "out", "p2", "a", .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,0 r0; "
           "w1 p1.out-p2.a", 4, 0, NO },
  { WIRE, "p2", "b", "p3", "in", .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,0 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in", 5, 0, NO },
  { WIRE, "p3", "in", "p2", "b", .ok = NO,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,0 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in", 5, 0, NO },
  { BENDS, "w2", .n = 2, .x = 60, .y = 5, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,0 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in 60,5 70,5", 6, 0, NO },
  /* Moving a wire shifts its bend points. */
  { MOVE, "w2", "p3", .x = 0, .y = 10, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in 60,15 70,15", 7, 0, NO },
  { DEL, "p2", .ok = OK, .doc = "p1 P1 pump 0,0 r0; p3 N1 applicator 100,10 r0", 8, 0, NO },
  { UNDO, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in 60,15 70,15", 7, 1, NO },
  { DEL, "w1", "p1", .ok = OK,
    .doc = "p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; w2 p2.b-p3.in 60,15 70,15",
    8, 0, NO },
  { DEL, "p9", .ok = NO,
    .doc = "p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; w2 p2.b-p3.in 60,15 70,15",
    8, 0, NO },
  { DEL, "scenario", .ok = NO,
    .doc = "p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; w2 p2.b-p3.in 60,15 70,15",
    8, 0, NO },
  { UNDO, .ok = OK,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in 60,15 70,15", 7, 1, NO },
  { SEQ_BAD, .ok = NO,
    .doc = "p1 P1 pump 0,0 r0; p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; "
           "w1 p1.out-p2.a; w2 p2.b-p3.in 60,15 70,15", 7, 1, NO },
  { REDO, .ok = OK,
    .doc = "p2 T1 tee 50,0 r0; p3 N1 applicator 100,10 r0; w2 p2.b-p3.in 60,15 70,15",
    8, 0, NO },
  { END },
};

static const Script scripts[] = {
  { "basic", script_basic },
  { "groups", script_groups },
  { "clean", script_clean },
  { "merge", script_merge },
  { "remove", script_remove },
};

typedef struct
{
  guint changed;
  guint notify_clean;
  guint notify_undo;
} Counters;

static void
changed_cb (PlDocument *doc, guint change, gpointer user_data)
{
  Counters *c = user_data;

  ck_assert_uint_ne (change, 0);
  c->changed++;
}

static void
notify_cb (GObject *object, GParamSpec *pspec, gpointer user_data)
{
  Counters *c = user_data;

  if (g_str_equal (pspec->name, "clean"))
    c->notify_clean++;
  else if (g_str_equal (pspec->name, "can-undo"))
    c->notify_undo++;
}

START_TEST (test_script)
{
  const Script *script = &scripts[_i];
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  /* text -> a deep copy of the first document seen with that text */
  g_autoptr (GHashTable) seen = g_hash_table_new_full (g_str_hash, g_str_equal, g_free,
                                                       g_object_unref);
  Counters counters = { 0 };

  g_signal_connect (doc, "changed", G_CALLBACK (changed_cb), &counters);
  g_signal_connect (stack, "notify", G_CALLBACK (notify_cb), &counters);
  g_hash_table_insert (seen, g_strdup (""), pl_document_copy (doc));

  for (const Line *l = script->lines; l->op != END; l++)
    {
      guint line = (guint) (l - script->lines) + 1;
      g_autoptr (PlCommand) cmd = make_command (l);
      g_autoptr (GError) error = NULL;
      g_autofree char *text = NULL;
      guint64 revision = pl_document_get_revision (doc);
      guint changed = counters.changed;
      gboolean was_clean = pl_undo_stack_is_clean (stack);
      guint clean_notes = counters.notify_clean;
      gboolean ok = TRUE;
      PlDocument *before;

      switch (l->op)
        {
        case NUM_MERGE:
        case MOVE_MERGE:
          ok = pl_undo_stack_push_merge (stack, cmd, &error);
          break;
        case UNDO:
          ok = pl_undo_stack_undo (stack);
          break;
        case REDO:
          ok = pl_undo_stack_redo (stack);
          break;
        case BEGIN:
          pl_undo_stack_begin_group (stack, "Drag");
          break;
        case FINISH:
          pl_undo_stack_end_group (stack);
          break;
        case ABORT:
          pl_undo_stack_abort_group (stack);
          break;
        case BARRIER:
          ok = pl_undo_stack_barrier (stack);
          break;
        case CLEAN:
          pl_undo_stack_mark_clean (stack);
          break;
        case END:
        default:
          ck_assert_ptr_nonnull (cmd);
          ok = pl_undo_stack_push (stack, cmd, &error);
          break;
        }
      if (cmd != NULL || l->op == UNDO || l->op == REDO || l->op == BARRIER)
        ck_assert_msg (ok == l->ok, "%s line %u: returned %d%s%s", script->name, line, ok,
                       error != NULL ? ": " : "", error != NULL ? error->message : "");
      if (cmd != NULL && !ok)
        {
          /* A refusal says why, changes nothing and tells nobody. */
          ck_assert_msg (error != NULL, "%s line %u: no error", script->name, line);
          ck_assert_ptr_eq (error->domain == PL_DOCUMENT_ERROR ? error : NULL, error);
          ck_assert_uint_eq (pl_document_get_revision (doc), revision);
          ck_assert_uint_eq (counters.changed, changed);
        }
      if (cmd != NULL && ok)
        {
          ck_assert_ptr_null (error);
          /* One "changed" per command, and the revision grows with it. */
          ck_assert_uint_eq (counters.changed, changed + 1);
          ck_assert_uint_eq (pl_document_get_revision (doc), revision + 1);
        }
      if ((l->op == UNDO || l->op == REDO) && ok)
        ck_assert_uint_eq (counters.changed, changed + 1);   /* once per step */

      text = describe (doc);
      ck_assert_msg (g_str_equal (text, l->doc), "%s line %u:\n  got  \"%s\"\n  want \"%s\"",
                     script->name, line, text, l->doc);
      before = g_hash_table_lookup (seen, text);
      if (before != NULL)
        ck_assert_msg (pl_document_equal (doc, before), "%s line %u: same text, other bits",
                       script->name, line);
      else
        g_hash_table_insert (seen, g_strdup (text), pl_document_copy (doc));
      ck_assert_msg (pl_undo_stack_get_n_undo (stack) == l->n_undo
                     && pl_undo_stack_get_n_redo (stack) == l->n_redo,
                     "%s line %u: undo %u redo %u, want %u %u", script->name, line,
                     pl_undo_stack_get_n_undo (stack), pl_undo_stack_get_n_redo (stack),
                     l->n_undo, l->n_redo);
      ck_assert_msg (!pl_undo_stack_is_clean (stack) == !l->clean, "%s line %u: clean %d",
                     script->name, line, pl_undo_stack_is_clean (stack));
      /* "clean" is announced exactly when it changes. */
      ck_assert_uint_eq (counters.notify_clean - clean_notes,
                         was_clean != pl_undo_stack_is_clean (stack) ? 1 : 0);
      ck_assert (pl_undo_stack_can_undo (stack) == (pl_undo_stack_get_n_undo (stack) > 0
                                                    && pl_undo_stack_get_group_depth (stack)
                                                       == 0));
    }
  ck_assert_uint_eq (pl_undo_stack_get_group_depth (stack), 0);
}
END_TEST

/* Labels for the menus: the command's, or the group's. */
START_TEST (test_labels)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  g_autoptr (PlCommand) add = pl_command_new_add_part ("hose", NULL, 0, 0);
  g_autoptr (PlCommand) bore = pl_command_new_set_number ("p1", "bore", 0.01);
  const char *ids[] = { "p1" };
  g_autoptr (PlCommand) move = pl_command_new_move (ids, 1, 1, 1);

  ck_assert_ptr_null (pl_undo_stack_get_undo_label (stack));
  ck_assert (pl_undo_stack_push (stack, add, NULL));
  ck_assert_str_eq (pl_undo_stack_get_undo_label (stack), "Add Hose");
  ck_assert_str_eq (pl_command_get_created_id (add), "p1");
  ck_assert (pl_undo_stack_push (stack, bore, NULL));
  ck_assert_str_eq (pl_undo_stack_get_undo_label (stack), "Change Bore");
  pl_undo_stack_begin_group (stack, "Drag Parts");
  ck_assert (pl_undo_stack_push (stack, move, NULL));
  pl_undo_stack_end_group (stack);
  ck_assert_str_eq (pl_undo_stack_get_undo_label (stack), "Drag Parts");
  ck_assert (pl_undo_stack_undo (stack));
  ck_assert_str_eq (pl_undo_stack_get_redo_label (stack), "Drag Parts");
  ck_assert_str_eq (pl_undo_stack_get_undo_label (stack), "Change Bore");
  ck_assert_ptr_eq (pl_undo_stack_get_document (stack), doc);
}
END_TEST

/* Tooltips name the parts a step acts on by the tags they show: one part
 * by its tag, several by their count; a delete that took wires with its
 * parts counts items; a redo of an undone add still knows the tag. */
START_TEST (test_descriptions_name_the_parts)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  g_autoptr (PlCommand) add_hose = pl_command_new_add_part ("hose", NULL, 0, 0);
  g_autoptr (PlCommand) add_gauge = pl_command_new_add_part ("gauge", NULL, 40, 0);
  g_autoptr (PlCommand) add_tee = pl_command_new_add_part ("tee", NULL, 80, 0);
  g_autoptr (PlCommand) bore = pl_command_new_set_number ("p1", "bore", 0.01);
  g_autoptr (PlCommand) rename = pl_command_new_set_tag ("p1", "Feed hose");
  const char *three[] = { "p1", "p2", "p3" };
  g_autoptr (PlCommand) move = pl_command_new_move (three, 3, 5, 0);
  g_autoptr (PlCommand) scenario = pl_command_new_set_scenario_number ("cycle-rate", 2.0);
  g_autofree char *text = NULL;
  g_autofree char *expected_add = NULL;
  g_autofree char *expected_bore = NULL;
  const char *hose_tag;

  ck_assert_ptr_null (pl_undo_stack_describe_undo (stack));
  ck_assert (pl_undo_stack_push (stack, add_hose, NULL));
  hose_tag = pl_part_get_tag (pl_document_find_part (doc, "p1"));
  text = pl_undo_stack_describe_undo (stack);
  expected_add = g_strdup_printf ("Add Hose %s", hose_tag);
  ck_assert_str_eq (text, expected_add);
  g_clear_pointer (&text, g_free);
  ck_assert (pl_undo_stack_push (stack, add_gauge, NULL));
  ck_assert (pl_undo_stack_push (stack, add_tee, NULL));
  ck_assert (pl_undo_stack_push (stack, bore, NULL));
  text = pl_undo_stack_describe_undo (stack);
  expected_bore = g_strdup_printf ("Change Bore %s", hose_tag);
  ck_assert_str_eq (text, expected_bore);
  g_clear_pointer (&text, g_free);

  /* The tag as shown now, after a rename. */
  ck_assert (pl_undo_stack_push (stack, rename, NULL));
  ck_assert (pl_undo_stack_undo (stack));
  ck_assert (pl_undo_stack_redo (stack));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Rename Feed hose");
  g_clear_pointer (&text, g_free);

  /* A drag of three parts is one step named by their count. */
  pl_undo_stack_begin_group (stack, "Move");
  ck_assert (pl_undo_stack_push (stack, move, NULL));
  pl_undo_stack_end_group (stack);
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Move 3 Parts");
  g_clear_pointer (&text, g_free);
  ck_assert (pl_undo_stack_undo (stack));
  text = pl_undo_stack_describe_redo (stack);
  ck_assert_str_eq (text, "Move 3 Parts");
  g_clear_pointer (&text, g_free);

  /* The scenario is no part: the bare label. */
  ck_assert (pl_undo_stack_push (stack, scenario, NULL));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, pl_undo_stack_get_undo_label (stack));
  g_clear_pointer (&text, g_free);
}
END_TEST

/* A delete names what it took out, and an undone add what it will make. */
START_TEST (test_descriptions_of_removed_parts)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  g_autoptr (PlCommand) add_a = pl_command_new_add_part_full ("hose", NULL, "HA", 0, 0, 0, FALSE);
  g_autoptr (PlCommand) add_b = pl_command_new_add_part_full ("hose", NULL, "HB", 60, 0, 0, FALSE);
  g_autoptr (PlCommand) wire = NULL;
  g_autoptr (PlCommand) remove_a = pl_command_new_remove ((const char *const[]) { "p1" }, 1);
  g_autoptr (PlCommand) remove_b = NULL;
  g_autoptr (PlCommand) second = NULL;
  g_autoptr (PlCommand) wires = NULL;
  const PlPartType *hose = pl_part_type_lookup ("hose");
  g_autofree char *text = NULL;

  ck_assert (pl_undo_stack_push (stack, add_a, NULL));
  ck_assert (pl_undo_stack_push (stack, add_b, NULL));
  ck_assert (pl_undo_stack_undo (stack));
  text = pl_undo_stack_describe_redo (stack);
  ck_assert_str_eq (text, "Add Hose HB");
  g_clear_pointer (&text, g_free);
  ck_assert (pl_undo_stack_redo (stack));

  wire = pl_command_new_add_wire (NULL, "p1", hose->ports[1].key, "p2", hose->ports[0].key,
                                  NULL, 0);
  ck_assert (pl_undo_stack_push (stack, wire, NULL));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Connect");
  g_clear_pointer (&text, g_free);

  ck_assert (pl_undo_stack_push (stack, remove_a, NULL));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Delete HA");
  g_clear_pointer (&text, g_free);
  ck_assert (pl_undo_stack_undo (stack));

  /* A part with its wire is named by the part. */
  remove_b = pl_command_new_remove ((const char *const[]) { "p2",
                                                            pl_command_get_created_id (wire) },
                                    2);
  ck_assert (pl_undo_stack_push (stack, remove_b, NULL));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Delete HB");
  g_clear_pointer (&text, g_free);
  ck_assert (pl_undo_stack_undo (stack));

  /* Two wires alone are counted as items. */
  second = pl_command_new_add_wire (NULL, "p1", hose->ports[0].key, "p2", hose->ports[1].key,
                                    NULL, 0);
  ck_assert (pl_undo_stack_push (stack, second, NULL));
  wires = pl_command_new_remove ((const char *const[]) { pl_command_get_created_id (wire),
                                                         pl_command_get_created_id (second) },
                                 2);
  ck_assert (pl_undo_stack_push (stack, wires, NULL));
  text = pl_undo_stack_describe_undo (stack);
  ck_assert_str_eq (text, "Delete 2 Items");
  g_clear_pointer (&text, g_free);
}
END_TEST

/* A group's undo emits one "changed", however many commands it holds. */
START_TEST (test_group_one_signal)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  Counters counters = { 0 };

  pl_undo_stack_begin_group (stack, NULL);
  for (int i = 0; i < 50; i++)
    {
      g_autoptr (PlCommand) add = pl_command_new_add_part ("gauge", NULL, i, 0);

      ck_assert (pl_undo_stack_push (stack, add, NULL));
    }
  pl_undo_stack_end_group (stack);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 50);
  ck_assert_str_eq (pl_undo_stack_get_undo_label (stack), "Add Gauge");
  g_signal_connect (doc, "changed", G_CALLBACK (changed_cb), &counters);
  ck_assert (pl_undo_stack_undo (stack));
  ck_assert_uint_eq (counters.changed, 1);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 0);
  ck_assert (pl_undo_stack_redo (stack));
  ck_assert_uint_eq (counters.changed, 2);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 50);
  /* Redo gives the same ids and tags as the first time. */
  ck_assert_str_eq (pl_part_get_id (pl_document_get_part (doc, 49)), "p50");
  ck_assert_str_eq (pl_part_get_tag (pl_document_get_part (doc, 49)), "G50");
}
END_TEST

/* A long session stays fast and exact: 2000 random edits, undone to the
 * start and redone to the end, compared with copies taken on the way. */
START_TEST (test_random_walk)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlUndoStack) stack = pl_undo_stack_new (doc);
  g_autoptr (GPtrArray) states = g_ptr_array_new_with_free_func (g_object_unref);
  g_autoptr (GRand) rand = g_rand_new_with_seed (20260101);
  const char *types[] = { "hose", "pump", "tee", "applicator", "gauge" };

  g_ptr_array_add (states, pl_document_copy (doc));
  for (int i = 0; i < 2000; i++)
    {
      g_autoptr (PlCommand) cmd = NULL;
      guint n = pl_document_get_n_parts (doc);
      const char *id = n > 0
        ? pl_part_get_id (pl_document_get_part (doc, g_rand_int_range (rand, 0, (gint) n)))
        : NULL;
      int what = n < 3 ? 0 : g_rand_int_range (rand, 0, 6);

      switch (what)
        {
        case 0:
          cmd = pl_command_new_add_part (types[g_rand_int_range (rand, 0, 5)], NULL,
                                         g_rand_double_range (rand, -500, 500),
                                         g_rand_double_range (rand, -500, 500));
          break;
        case 1:
          cmd = pl_command_new_move (&id, 1, g_rand_double_range (rand, -1, 1),
                                     g_rand_double_range (rand, -1, 1));
          break;
        case 2:
          cmd = pl_command_new_remove (&id, 1);
          break;
        case 3:
          cmd = pl_command_new_set_number (id, "elevation", g_rand_double_range (rand, -5, 5));
          break;
        case 4:
          {
            const char *other = pl_part_get_id (pl_document_get_part (doc, 0));
            const PlPart *a = pl_document_find_part (doc, id);
            const PlPart *b = pl_document_find_part (doc, other);

            cmd = pl_command_new_add_wire (NULL, id, pl_part_get_part_type (a)->ports[0].key,
                                           other, pl_part_get_part_type (b)->ports[0].key,
                                           NULL, 0);
          }
          break;
        default:
          cmd = pl_command_new_rotate (id, g_rand_int_range (rand, -3, 4));
          break;
        }
      /* Self wires and duplicates are refused; nothing else is. */
      if (pl_undo_stack_push (stack, cmd, NULL))
        g_ptr_array_add (states, pl_document_copy (doc));
      else
        ck_assert_int_eq (what, 4);
    }
  for (guint i = states->len - 1; i-- > 0;)
    {
      ck_assert (pl_undo_stack_undo (stack));
      ck_assert (pl_document_equal (doc, g_ptr_array_index (states, i)));
    }
  ck_assert (!pl_undo_stack_undo (stack));
  ck_assert (pl_undo_stack_is_clean (stack));
  for (guint i = 1; i < states->len; i++)
    {
      ck_assert (pl_undo_stack_redo (stack));
      ck_assert (pl_document_equal (doc, g_ptr_array_index (states, i)));
    }
}
END_TEST

static Suite *
undo_suite (void)
{
  Suite *s = suite_create ("undo");
  TCase *tc_scripts = tcase_create ("scripts");
  TCase *tc_more = tcase_create ("more");

  tcase_add_loop_test (tc_scripts, test_script, 0, G_N_ELEMENTS (scripts));
  suite_add_tcase (s, tc_scripts);
  tcase_add_test (tc_more, test_labels);
  tcase_add_test (tc_more, test_descriptions_name_the_parts);
  tcase_add_test (tc_more, test_descriptions_of_removed_parts);
  tcase_add_test (tc_more, test_group_one_signal);
  tcase_add_test (tc_more, test_random_walk);
  suite_add_tcase (s, tc_more);
  return s;
}

int
main (void)
{
  return pl_check_run (undo_suite ());
}
