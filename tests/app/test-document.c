/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Document: ids and tags, the refusals of every command (each one leaves
 * the document equal to before and emits nothing), change flags, copies and
 * equality, port look-ups.
 *
 * The reference is the model's own specification (pl-document.h and
 * pl-command.h): which edits are allowed and what they must leave behind.
 */

#include "config.h"

#include <glib.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"

/* A GError of the given domain and code (not just any failure). */
#define ck_assert_error(err, dom, cod)                                          \
  ck_assert_msg ((err) != NULL && (err)->domain == (dom) && (err)->code == (int) (cod), \
                 "expected error code %d, got %s", (int) (cod),                 \
                 (err) != NULL ? (err)->message : "none")

#include "pl-command.h"
#include "pl-document.h"

static void
apply_ok (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "%s", error ? error->message : "");
  pl_command_unref (cmd);
}

/* A small line: pump p1 -> hose p2 -> tee p3 -> applicators p4, p5, a gauge
 * p6, wires w1..w4 and a note n1. */
static PlDocument *
small_line (void)
{
  PlDocument *doc = pl_document_new ();
  const PlPoint bends[] = { { 10, 10 }, { 20, 10 } };

  apply_ok (doc, pl_command_new_add_part ("pump", NULL, 0, 0));
  apply_ok (doc, pl_command_new_add_part ("hose", NULL, 60, 0));
  apply_ok (doc, pl_command_new_add_part ("tee", NULL, 120, 0));
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 160, 40));
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 200, 40));
  apply_ok (doc, pl_command_new_add_part ("gauge", NULL, 120, -40));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p1", "out", "p2", "a", bends, 2));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p2", "b", "p3", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p3", "branch", "p4", "in", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p3", "b", "p5", "in", NULL, 0));
  apply_ok (doc, pl_command_new_add_note (NULL, 0, -50, "Feed from drum 2"));
  return doc;
}

START_TEST (test_new_document)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  const PlPart *s = pl_document_get_scenario (doc);

  ck_assert_uint_eq (pl_document_get_n_parts (doc), 0);
  ck_assert_uint_eq (pl_document_get_n_wires (doc), 0);
  ck_assert_uint_eq (pl_document_get_n_notes (doc), 0);
  ck_assert_uint_eq (pl_document_get_revision (doc), 0);
  ck_assert_str_eq (pl_part_get_id (s), "scenario");
  ck_assert_ptr_eq (pl_document_find_part (doc, "scenario"), s);
  ck_assert_ptr_eq (pl_document_find_part (doc, "title"), pl_document_get_title (doc));
  /* Defaults of the solver (pls_fluid_params_init): 1100 kg/m^3, 1 Pa s. */
  ck_assert_double_eq (pl_part_get_number (s, "density"), 1100.0);
  ck_assert_double_eq (pl_part_get_number (s, "viscosity"), 1.0);
  ck_assert (pl_part_get_boolean (s, "air-on"));
  ck_assert_str_eq (pl_part_get_text (pl_document_get_title (doc), "work-order"), "");
  ck_assert (isnan (pl_part_get_number (s, "nope")));
  ck_assert (isnan (pl_part_get_number (s, "viscosity-law")));   /* a choice */
  ck_assert_ptr_null (pl_part_get_value (s, "nope"));
  ck_assert_ptr_null (pl_document_get_part (doc, 0));
  ck_assert_ptr_null (pl_document_find_part (doc, NULL));
  ck_assert_ptr_null (pl_document_find_wire (doc, "w1"));
  ck_assert_ptr_null (pl_document_find_note (doc, "n1"));
}
END_TEST

START_TEST (test_ids_and_tags)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autofree char *next = NULL;
  const char *h = "p2";
  g_autoptr (PlCommand) again = NULL;

  ck_assert_str_eq (pl_part_get_tag (pl_document_find_part (doc, "p4")), "N1");
  ck_assert_str_eq (pl_part_get_tag (pl_document_find_part (doc, "p5")), "N2");
  ck_assert_ptr_eq (pl_document_find_part_by_tag (doc, "N2"), pl_document_find_part (doc, "p5"));
  ck_assert_uint_eq (pl_document_get_next_part_number (doc), 7);
  ck_assert_uint_eq (pl_document_get_next_wire_number (doc), 5);
  ck_assert_uint_eq (pl_document_get_next_note_number (doc), 2);
  /* Remove the hose: its id is never given again, its tag is. */
  apply_ok (doc, pl_command_new_remove (&h, 1));
  ck_assert_uint_eq (pl_document_get_n_wires (doc), 2);   /* w1, w2 went with it */
  next = pl_document_next_tag (doc, pl_part_type_lookup ("hose"));
  ck_assert_str_eq (next, "H1");
  again = pl_command_new_add_part ("hose", NULL, 0, 0);
  ck_assert (pl_command_apply (again, doc, NULL));
  ck_assert_str_eq (pl_command_get_created_id (again), "p7");
  ck_assert_str_eq (pl_part_get_tag (pl_document_find_part (doc, "p7")), "H1");
  /* Gaps are filled from the lowest number. */
  apply_ok (doc, pl_command_new_set_tag ("p4", "N7"));
  g_free (next);
  next = pl_document_next_tag (doc, pl_part_type_lookup ("applicator"));
  ck_assert_str_eq (next, "N1");
  /* Tags that merely start with the prefix do not count. */
  apply_ok (doc, pl_command_new_set_tag ("p5", "N01"));
  g_free (next);
  next = pl_document_next_tag (doc, pl_part_type_lookup ("applicator"));
  ck_assert_str_eq (next, "N1");
}
END_TEST

typedef struct
{
  const char *id;
  gboolean ok;
  int code;
} IdCase;

static const IdCase id_cases[] = {
  { "p7", TRUE, 0 },
  { "p123456789", TRUE, 0 },
  { "p1", FALSE, PL_DOCUMENT_ERROR_DUPLICATE_ID },
  { "p0", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p01", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p1a", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "w9", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "P9", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p1000000000", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p99999999999999999999", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "scenario", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
  { "p\xff", FALSE, PL_DOCUMENT_ERROR_INVALID_ID },
};

START_TEST (test_explicit_ids)
{
  const IdCase *c = &id_cases[_i];
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  g_autoptr (PlCommand) cmd = pl_command_new_add_part ("gauge", c->id, 0, 0);
  g_autoptr (GError) error = NULL;

  ck_assert (pl_command_apply (cmd, doc, &error) == c->ok);
  if (c->ok)
    {
      g_autoptr (PlCommand) gen = pl_command_new_add_part ("gauge", NULL, 0, 0);
      guint n = (guint) g_ascii_strtoull (c->id + 1, NULL, 10);

      ck_assert_str_eq (pl_command_get_created_id (cmd), c->id);
      /* The counter moved past the explicit id. */
      ck_assert_uint_eq (pl_document_get_next_part_number (doc), n + 1);
      ck_assert (pl_command_apply (gen, doc, NULL));
      ck_assert_uint_eq (g_ascii_strtoull (pl_command_get_created_id (gen) + 1, NULL, 10),
                         n + 1);
    }
  else
    {
      ck_assert_error (error, PL_DOCUMENT_ERROR, c->code);
      ck_assert (g_utf8_validate (error->message, -1, NULL));
      ck_assert (pl_document_equal (doc, before));
      ck_assert_uint_eq (pl_document_get_next_part_number (doc), 7);
    }
}
END_TEST

/* --- refusals ---------------------------------------------------------- */

typedef struct
{
  const char *name;
  int code;
  const char *needle;   /* the message names this (tag, field), or NULL */
} BadCase;

static PlCommand *
bad_command (int i)
{
  static const PlPoint nan_bend[] = { { 0, NAN } };
  static const char *ids_unknown[] = { "p1", "zz" };
  static const char *ids_pseudo[] = { "title" };
  static const char *ids_p1[] = { "p1" };
  g_autofree char *long_tag = g_strnfill (PL_TAG_MAX_LENGTH + 1, 'T');
  g_autofree char *long_note = g_strnfill (PL_NOTE_MAX_LENGTH + 1, 'x');
  PlValue text_for_number = { .kind = PL_PARAM_TEXT, .text = (char *) "5" };

  switch (i)
    {
    case 0: return pl_command_new_add_part ("boiler", NULL, 0, 0);
    case 1: return pl_command_new_add_part ("scenario", NULL, 0, 0);
    case 2: return pl_command_new_add_part ("hose", NULL, NAN, 0);
    case 3: return pl_command_new_add_part ("hose", NULL, 0, 2 * PL_COORDINATE_MAX);
    case 4: return pl_command_new_add_part_full ("hose", NULL, NULL, 0, 0, 4, FALSE);
    case 5: return pl_command_new_add_part_full ("hose", NULL, "N1", 0, 0, 0, FALSE);
    case 6: return pl_command_new_add_part (NULL, NULL, 0, 0);
    case 7: return pl_command_new_remove (ids_unknown, 2);
    case 8: return pl_command_new_remove (ids_pseudo, 1);
    case 9: return pl_command_new_remove (NULL, 0);
    case 10: return pl_command_new_move (ids_unknown, 2, 1, 1);
    case 11: return pl_command_new_move (ids_p1, 1, INFINITY, 0);
    case 12: return pl_command_new_move (ids_p1, 1, 1.5 * PL_COORDINATE_MAX, 0);
    case 13: return pl_command_new_set_orientation ("p1", 7, FALSE);
    case 14: return pl_command_new_rotate ("title", 1);
    case 15: return pl_command_new_set_tag ("p1", "N1");
    case 16: return pl_command_new_set_tag ("p1", "");
    case 17: return pl_command_new_set_tag ("p1", " P1");
    case 18: return pl_command_new_set_tag ("p1", long_tag);
    case 19: return pl_command_new_set_tag ("p1", "P\t1");
    case 20: return pl_command_new_set_tag ("p1", "\xc3\x28");
    case 21: return pl_command_new_set_tag ("p1", NULL);
    case 22: return pl_command_new_set_number ("p2", "bore", 0.0);
    case 23: return pl_command_new_set_number ("p2", "bore", NAN);
    case 24: return pl_command_new_set_number ("p2", "colour", 1.0);
    case 25: return pl_command_new_set_number ("p2", "roughness", -1e-6);
    case 26: return pl_command_new_set_choice ("p4", "cd-model", "magic");
    case 27: return pl_command_new_set_number ("p4", "cd-model", 1.0);
    case 28: return pl_command_new_set_value ("p2", "bore", &text_for_number);
    case 29: return pl_command_new_set_text ("title", "site", "a\nb");
    case 30: return pl_command_new_set_text ("title", "site", NULL);
    case 31: return pl_command_new_set_text (NULL, "site", "x");
    case 32: return pl_command_new_set_scenario_number ("density", -1.0);
    case 33: return pl_command_new_add_wire (NULL, "p1", "out", "p1", "out", NULL, 0);
    case 34: return pl_command_new_add_wire (NULL, "p2", "a", "p1", "out", NULL, 0);
    case 35: return pl_command_new_add_wire (NULL, "p1", "in", "p6", "p", NULL, 0);
    case 36: return pl_command_new_add_wire (NULL, "p1", "out", "p66", "p", NULL, 0);
    case 37: return pl_command_new_add_wire (NULL, "p1", "out", "scenario", "p", NULL, 0);
    case 38: return pl_command_new_add_wire (NULL, "p1", "out", "p6", "p", nan_bend, 1);
    case 39: return pl_command_new_add_wire ("w1", "p1", "out", "p6", "p", NULL, 0);
    case 40: return pl_command_new_set_wire_bends ("w9", NULL, 0);
    case 41: return pl_command_new_set_wire_bends ("w1", nan_bend, 1);
    case 42: return pl_command_new_add_note (NULL, 0, 0, long_note);
    case 43: return pl_command_new_add_note (NULL, 0, 0, "bell\a");
    case 44: return pl_command_new_add_note (NULL, NAN, 0, "x");
    case 45: return pl_command_new_set_note_text ("n7", "x");
    case 46: return pl_command_new_set_note_text ("n1", "\xff");
    case 47: return pl_command_new_set_number ("p1", "ratio", 1001.0);
    default: return NULL;
    }
}

static const BadCase bad_cases[] = {
  { "unknown type", PL_DOCUMENT_ERROR_UNKNOWN_TYPE, "boiler" },
  { "pseudo type", PL_DOCUMENT_ERROR_NOT_PLACEABLE, "Scenario" },
  { "NaN position", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "far position", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "rotation 4", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "taken tag", PL_DOCUMENT_ERROR_DUPLICATE_TAG, "N1" },
  { "NULL type", PL_DOCUMENT_ERROR_UNKNOWN_TYPE, NULL },
  { "remove unknown", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, "zz" },
  { "remove title", PL_DOCUMENT_ERROR_NOT_PLACEABLE, NULL },
  { "remove nothing", PL_DOCUMENT_ERROR_EMPTY, NULL },
  { "move unknown", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, "zz" },
  { "move by infinity", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "move off the sheet", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "orientation 7", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "rotate title", PL_DOCUMENT_ERROR_NOT_PLACEABLE, NULL },
  { "duplicate tag", PL_DOCUMENT_ERROR_DUPLICATE_TAG, "N1" },
  { "empty tag", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "leading space", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "long tag", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "tab in tag", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "bad UTF-8 tag", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "NULL tag", PL_DOCUMENT_ERROR_INVALID_TAG, NULL },
  { "zero bore", PL_DOCUMENT_ERROR_OUT_OF_RANGE, "H1: Bore must be more than 0 mm." },
  { "NaN bore", PL_DOCUMENT_ERROR_INVALID_VALUE, "Bore" },
  { "unknown key", PL_DOCUMENT_ERROR_UNKNOWN_PARAM, "colour" },
  { "negative roughness", PL_DOCUMENT_ERROR_OUT_OF_RANGE, "Wall roughness" },
  { "unknown choice", PL_DOCUMENT_ERROR_INVALID_VALUE, "magic" },
  { "number for choice", PL_DOCUMENT_ERROR_WRONG_KIND, NULL },
  { "text for number", PL_DOCUMENT_ERROR_WRONG_KIND, "Bore" },
  { "line break in title", PL_DOCUMENT_ERROR_INVALID_VALUE, "Site" },
  { "NULL text", PL_DOCUMENT_ERROR_INVALID_VALUE, "Site" },
  { "NULL item", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, NULL },
  { "negative density", PL_DOCUMENT_ERROR_OUT_OF_RANGE, "Density" },
  { "self wire", PL_DOCUMENT_ERROR_SELF_WIRE, "P1" },
  { "duplicate wire reversed", PL_DOCUMENT_ERROR_DUPLICATE_WIRE, "P1" },
  { "unknown port", PL_DOCUMENT_ERROR_UNKNOWN_PORT, "in" },
  { "unknown part", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, "p66" },
  { "wire to scenario", PL_DOCUMENT_ERROR_NOT_PLACEABLE, NULL },
  { "NaN bend", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "taken wire id", PL_DOCUMENT_ERROR_DUPLICATE_ID, "w1" },
  { "bends of unknown wire", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, "w9" },
  { "NaN bends", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "long note", PL_DOCUMENT_ERROR_INVALID_VALUE, NULL },
  { "control character", PL_DOCUMENT_ERROR_INVALID_VALUE, NULL },
  { "NaN note", PL_DOCUMENT_ERROR_INVALID_GEOMETRY, NULL },
  { "unknown note", PL_DOCUMENT_ERROR_UNKNOWN_ITEM, "n7" },
  { "bad UTF-8 note", PL_DOCUMENT_ERROR_INVALID_VALUE, NULL },
  { "ratio too high", PL_DOCUMENT_ERROR_OUT_OF_RANGE, "P1: Pressure ratio must be at most 1000." },
};

static void
count_cb (PlDocument *doc, guint change, gpointer user_data)
{
  (*(guint *) user_data)++;
}

START_TEST (test_refusal)
{
  const BadCase *c = &bad_cases[_i];
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  g_autoptr (PlCommand) cmd = bad_command (_i);
  g_autoptr (GError) error = NULL;
  guint64 revision = pl_document_get_revision (doc);
  guint changed = 0;

  ck_assert_ptr_nonnull (cmd);
  g_signal_connect (doc, "changed", G_CALLBACK (count_cb), &changed);
  ck_assert_msg (!pl_command_apply (cmd, doc, &error), "%s was accepted", c->name);
  ck_assert_msg (error != NULL && error->domain == PL_DOCUMENT_ERROR && error->code == c->code,
                 "%s: code %d (%s)", c->name, error ? error->code : -1,
                 error ? error->message : "");
  ck_assert (g_utf8_validate (error->message, -1, NULL));
  if (c->needle != NULL)
    ck_assert_msg (strstr (error->message, c->needle) != NULL, "%s: \"%s\" lacks \"%s\"",
                   c->name, error->message, c->needle);
  ck_assert_msg (pl_document_equal (doc, before), "%s changed the document", c->name);
  ck_assert_uint_eq (pl_document_get_revision (doc), revision);
  ck_assert_uint_eq (pl_document_get_next_part_number (doc), 7);
  ck_assert_uint_eq (pl_document_get_next_wire_number (doc), 5);
  ck_assert_uint_eq (changed, 0);
  ck_assert_ptr_null (pl_command_get_created_id (cmd));
}
END_TEST

/* --- change flags ------------------------------------------------------ */

typedef struct
{
  int which;
  guint change;
} FlagCase;

static PlCommand *
flag_command (int i)
{
  static const char *p1[] = { "p1" };
  static const char *n1[] = { "n1" };
  static const char *both[] = { "p6", "n1" };
  static const PlPoint b[] = { { 1, 2 } };

  switch (i)
    {
    case 0: return pl_command_new_add_part ("drain", NULL, 0, 0);
    case 1: return pl_command_new_move (p1, 1, 5, 5);
    case 2: return pl_command_new_set_number ("p2", "length", 12.0);
    case 3: return pl_command_new_set_text ("title", "author", "K. Ng");
    case 4: return pl_command_new_set_tag ("p2", "Feed hose");
    case 5: return pl_command_new_add_wire (NULL, "p6", "p", "p1", "out", b, 1);
    case 6: return pl_command_new_remove (n1, 1);
    case 7: return pl_command_new_remove (both, 2);
    case 8: return pl_command_new_set_boolean ("scenario", "air-on", FALSE);
    case 9: return pl_command_new_flip ("p3");
    case 10: return pl_command_new_set_wire_bends ("w2", b, 1);
    case 11: return pl_command_new_set_note_text ("n1", "Drum 3");
    default: return NULL;
    }
}

static const FlagCase flag_cases[] = {
  { 0, PL_CHANGE_TOPOLOGY },
  { 1, PL_CHANGE_GEOMETRY },
  { 2, PL_CHANGE_PARAMETERS },
  { 3, PL_CHANGE_ANNOTATION },
  { 4, PL_CHANGE_ANNOTATION },
  { 5, PL_CHANGE_TOPOLOGY },
  { 6, PL_CHANGE_ANNOTATION },
  { 7, PL_CHANGE_TOPOLOGY | PL_CHANGE_ANNOTATION },
  { 8, PL_CHANGE_PARAMETERS },
  { 9, PL_CHANGE_GEOMETRY },
  { 10, PL_CHANGE_GEOMETRY },
  { 11, PL_CHANGE_ANNOTATION },
};

static void
flags_cb (PlDocument *doc, guint change, gpointer user_data)
{
  guint *acc = user_data;

  acc[0]++;
  acc[1] = change;
}

START_TEST (test_change_flags)
{
  const FlagCase *c = &flag_cases[_i];
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  g_autoptr (PlCommand) cmd = flag_command (c->which);
  guint seen[2] = { 0, 0 };

  g_signal_connect (doc, "changed", G_CALLBACK (flags_cb), seen);
  ck_assert (pl_command_apply (cmd, doc, NULL));
  ck_assert_uint_eq (seen[0], 1);
  ck_assert_uint_eq (seen[1], c->change);
  ck_assert (!pl_document_equal (doc, before));
  pl_command_revert (cmd, doc);
  ck_assert_uint_eq (seen[0], 2);
  ck_assert_uint_eq (seen[1], c->change);
  ck_assert (pl_document_equal (doc, before));
  /* A second apply (redo) is allowed and lands on the same state. */
  {
    g_autoptr (PlDocument) after = NULL;

    ck_assert (pl_command_apply (cmd, doc, NULL));
    after = pl_document_copy (doc);
    pl_command_revert (cmd, doc);
    ck_assert (pl_command_apply (cmd, doc, NULL));
    ck_assert (pl_document_equal (doc, after));
  }
}
END_TEST

/* --- copies, equality, look-ups ---------------------------------------- */

START_TEST (test_copy_equal)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_autoptr (PlDocument) other = small_line ();
  const char *p3[] = { "p3" };

  ck_assert (pl_document_equal (doc, copy));
  ck_assert (pl_document_equal (doc, other));   /* same edits, same document */
  ck_assert_uint_eq (pl_document_get_revision (copy), pl_document_get_revision (doc));
  ck_assert_uint_eq (pl_document_get_next_part_number (copy), 7);
  /* The copy is deep: changing it leaves the original alone. */
  apply_ok (copy, pl_command_new_move (p3, 1, 1e-9, 0));
  ck_assert (!pl_document_equal (doc, copy));
  ck_assert_double_eq (pl_part_get_x (pl_document_find_part (doc, "p3")), 120.0);
  ck_assert_ptr_ne (pl_part_get_tag (pl_document_find_part (doc, "p1")),
                    pl_part_get_tag (pl_document_find_part (copy, "p1")));
  /* Order matters: the same parts added in another order differ. */
  {
    g_autoptr (PlDocument) a = pl_document_new ();
    g_autoptr (PlDocument) b = pl_document_new ();

    apply_ok (a, pl_command_new_add_part ("hose", "p1", 0, 0));
    apply_ok (a, pl_command_new_add_part ("gauge", "p2", 0, 0));
    apply_ok (b, pl_command_new_add_part ("gauge", "p2", 0, 0));
    apply_ok (b, pl_command_new_add_part ("hose", "p1", 0, 0));
    ck_assert (!pl_document_equal (a, b));
  }
}
END_TEST

/* Every kind of content difference is seen by pl_document_equal. */
static PlCommand *
diff_command (int i)
{
  static const char *n1[] = { "n1" };
  static const char *w2[] = { "w2" };
  static const PlPoint b[] = { { 10, 10 }, { 20, 10.000000001 } };

  switch (i)
    {
    case 0: return pl_command_new_move (n1, 1, 0, 1);
    case 1: return pl_command_new_set_number ("p2", "bore", nextafter (6.35e-3, 1.0));
    case 2: return pl_command_new_set_tag ("p6", "G9");
    case 3: return pl_command_new_set_wire_bends ("w1", b, 2);
    case 4: return pl_command_new_set_note_text ("n1", "Feed from drum 3");
    case 5: return pl_command_new_set_title_field ("revision", "B");
    case 6: return pl_command_new_set_scenario_number ("cycle-rate", 3.0);
    case 7: return pl_command_new_set_orientation ("p6", 0, TRUE);
    case 8: return pl_command_new_rotate ("p6", 5);
    case 9: return pl_command_new_remove (w2, 1);
    case 10: return pl_command_new_set_boolean ("scenario", "air-on", FALSE);
    case 11: return pl_command_new_set_choice ("p4", "cd-model", "fixed");
    default: return NULL;
    }
}

START_TEST (test_equal_sees)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_autoptr (PlCommand) cmd = diff_command (_i);

  ck_assert (pl_command_apply (cmd, copy, NULL));
  ck_assert (!pl_document_equal (doc, copy));
  ck_assert (!pl_document_equal (copy, doc));
}
END_TEST

START_TEST (test_port_wires)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (GPtrArray) at_b = NULL;
  g_autoptr (GPtrArray) none = NULL;
  g_autoptr (GPtrArray) bad = NULL;
  guint n;
  const PlPoint *pts;

  /* A port may carry several wires: an ideal junction. */
  apply_ok (doc, pl_command_new_add_wire (NULL, "p6", "p", "p3", "b", NULL, 0));
  at_b = pl_document_get_port_wires (doc, "p3", "b");
  ck_assert_uint_eq (at_b->len, 2);
  ck_assert_str_eq (pl_wire_get_id (g_ptr_array_index (at_b, 0)), "w4");
  ck_assert_str_eq (pl_wire_get_id (g_ptr_array_index (at_b, 1)), "w5");
  none = pl_document_get_port_wires (doc, "p6", "zz");
  ck_assert_uint_eq (none->len, 0);
  bad = pl_document_get_port_wires (doc, NULL, NULL);
  ck_assert_uint_eq (bad->len, 0);
  pts = pl_wire_get_bends (pl_document_find_wire (doc, "w1"), &n);
  ck_assert_uint_eq (n, 2);
  ck_assert_double_eq (pts[1].x, 20.0);
  ck_assert_str_eq (pl_wire_get_part_id (pl_document_find_wire (doc, "w1"), 1), "p2");
  ck_assert_str_eq (pl_wire_get_port_key (pl_document_find_wire (doc, "w1"), 0), "out");
  ck_assert_str_eq (pl_note_get_text (pl_document_get_note (doc, 0)), "Feed from drum 2");
  ck_assert_double_eq (pl_note_get_y (pl_document_find_note (doc, "n1")), -50.0);
}
END_TEST

/* A command belongs to the document it was applied to, and apply/revert
 * alternate. */
START_TEST (test_command_protocol)
{
  g_autoptr (PlDocument) a = pl_document_new ();
  g_autoptr (PlDocument) b = pl_document_new ();
  g_autoptr (PlCommand) cmd = pl_command_new_add_part ("hose", NULL, 0, 0);
  g_autoptr (GError) error = NULL;

  ck_assert (pl_command_apply (cmd, a, NULL));
  ck_assert (!pl_command_apply (cmd, a, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_BUSY);
  g_clear_error (&error);
  pl_command_revert (cmd, a);
  ck_assert (!pl_command_apply (cmd, b, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_BUSY);
  ck_assert_uint_eq (pl_document_get_n_parts (b), 0);
  ck_assert (pl_command_apply (cmd, a, NULL));
  ck_assert_str_eq (pl_command_get_created_id (cmd), "p1");
  ck_assert_str_eq (pl_command_get_label (cmd), "Add Hose");
}
END_TEST

/* A sequence is all or nothing and announces itself once. */
START_TEST (test_sequence)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) before = pl_document_copy (doc);
  PlCommand *good[3] = { pl_command_new_set_number ("p2", "length", 9.0),
                         pl_command_new_set_tag ("p2", "H-main"),
                         pl_command_new_add_part ("drain", NULL, 0, 90) };
  PlCommand *bad[2] = { pl_command_new_set_number ("p2", "length", 9.0),
                        pl_command_new_set_tag ("p2", "N1") };
  g_autoptr (PlCommand) seq = pl_command_new_sequence (NULL, good, 3);
  g_autoptr (PlCommand) seq_bad = pl_command_new_sequence ("Bad", bad, 2);
  guint changed = 0;

  for (guint i = 0; i < 3; i++)
    pl_command_unref (good[i]);
  for (guint i = 0; i < 2; i++)
    pl_command_unref (bad[i]);
  g_signal_connect (doc, "changed", G_CALLBACK (count_cb), &changed);
  ck_assert (!pl_command_apply (seq_bad, doc, NULL));
  ck_assert (pl_document_equal (doc, before));
  ck_assert_uint_eq (changed, 0);
  ck_assert (pl_command_apply (seq, doc, NULL));
  ck_assert_uint_eq (changed, 1);
  ck_assert_str_eq (pl_command_get_label (seq), "Change Length");
  ck_assert_double_eq (pl_part_get_number (pl_document_find_part (doc, "p2"), "length"), 9.0);
  ck_assert_str_eq (pl_part_get_tag (pl_document_find_part (doc, "p2")), "H-main");
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 7);
  pl_command_revert (seq, doc);
  ck_assert_uint_eq (changed, 2);
  ck_assert (pl_document_equal (doc, before));
}
END_TEST

/* Workers read a copy in another thread while the original is edited. */
static gpointer
reader_thread (gpointer data)
{
  PlDocument *copy = data;
  double sum = 0.0;

  for (int k = 0; k < 200; k++)
    for (guint i = 0; i < pl_document_get_n_parts (copy); i++)
      sum += pl_part_get_x (pl_document_get_part (copy, i));
  return GINT_TO_POINTER (sum == 200.0 * (0 + 60 + 120 + 160 + 200 + 120));
}

START_TEST (test_copy_in_thread)
{
  g_autoptr (PlDocument) doc = small_line ();
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  GThread *t = g_thread_new ("reader", reader_thread, copy);
  const char *p1[] = { "p1" };

  for (int i = 0; i < 200; i++)
    apply_ok (doc, pl_command_new_move (p1, 1, 1, 0));
  ck_assert (GPOINTER_TO_INT (g_thread_join (t)));
}
END_TEST

static Suite *
document_suite (void)
{
  Suite *s = suite_create ("document");
  TCase *tc_basic = tcase_create ("basic");
  TCase *tc_refuse = tcase_create ("refusals");
  TCase *tc_changes = tcase_create ("changes");

  tcase_add_test (tc_basic, test_new_document);
  tcase_add_test (tc_basic, test_ids_and_tags);
  tcase_add_loop_test (tc_basic, test_explicit_ids, 0, G_N_ELEMENTS (id_cases));
  tcase_add_test (tc_basic, test_copy_equal);
  tcase_add_loop_test (tc_basic, test_equal_sees, 0, 12);
  tcase_add_test (tc_basic, test_port_wires);
  tcase_add_test (tc_basic, test_command_protocol);
  tcase_add_test (tc_basic, test_copy_in_thread);
  suite_add_tcase (s, tc_basic);

  tcase_add_loop_test (tc_refuse, test_refusal, 0, G_N_ELEMENTS (bad_cases));
  tcase_add_test (tc_refuse, test_sequence);
  suite_add_tcase (s, tc_refuse);

  tcase_add_loop_test (tc_changes, test_change_flags, 0, G_N_ELEMENTS (flag_cases));
  suite_add_tcase (s, tc_changes);
  return s;
}

int
main (void)
{
  return pl_check_run (document_suite ());
}
