/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Malformed layout files: one fixture per mistake under
 * tests/data/layouts/bad/, each with the error code, the place
 * ("FILE:LINE:" or "FILE:LINE:COLUMN:") and a fragment of the sentence it
 * must produce.  The lines are those of the fixtures as committed; the
 * columns are libxml2's (where it gives one), counted from 1.  Fragments
 * of sentences the document model writes are kept short, so rewording
 * there does not break this table, but the place always comes from here.
 */

#include "config.h"

#include <glib.h>
#include <string.h>

#include "pl-check.h"

#include "pl-document.h"
#include "pl-layout-reader.h"

typedef struct
{
  const char *file;       /* in tests/data/layouts/bad/ */
  PlLayoutError code;
  const char *place;      /* after "PATH": ":4: ", ":5:11: ", ": " or " " (no line) */
  const char *fragment;   /* must occur in the message */
} BadCase;

static const BadCase bad_cases[] = {
  /* Not XML at all, or broken XML (libxml2's words after ours). */
  { "empty.pline", PL_LAYOUT_ERROR_NOT_WELL_FORMED, ": ", "the file is empty" },
  { "not-xml.pline", PL_LAYOUT_ERROR_NOT_WELL_FORMED, ":1: ", "holds no XML element" },
  { "unclosed.pline", PL_LAYOUT_ERROR_NOT_WELL_FORMED, ":5:11: ",
    "not well-formed XML: Opening and ending tag mismatch: part line 4 and parts" },
  { "trailing-garbage.pline", PL_LAYOUT_ERROR_NOT_WELL_FORMED, ":3:1: ",
    "Extra content at the end of the document" },
  { "undefined-entity.pline", PL_LAYOUT_ERROR_NOT_WELL_FORMED, ":3:42: ",
    "Entity 'nbsp' not defined" },
  { "latin1.pline", PL_LAYOUT_ERROR_ENCODING, ":1: ",
    "declares the encoding “ISO-8859-1”; layout files are UTF-8" },
  /* Not a layout, or a layout from the future. */
  { "wrong-root.pline", PL_LAYOUT_ERROR_NOT_A_LAYOUT, ":2: ",
    "the root element is <drawing>, expected <layout xmlns=\"" PL_LAYOUT_NAMESPACE "\">" },
  { "no-namespace.pline", PL_LAYOUT_ERROR_NOT_A_LAYOUT, ":2: ",
    "expected xmlns=\"" PL_LAYOUT_NAMESPACE "\"" },
  { "other-namespace.pline", PL_LAYOUT_ERROR_NOT_A_LAYOUT, ":2: ",
    "not in the namespace of Pressline layouts" },
  { "newer-version.pline", PL_LAYOUT_ERROR_NEWER_VERSION, " ",
    "was written by a newer Pressline (layout format 2); this version reads format 1." },
  /* Against the schema. */
  { "version-text.pline", PL_LAYOUT_ERROR_SCHEMA, ":2: ",
    "the attribute “version” of <layout> is “one”; expected the format version 1" },
  { "no-version.pline", PL_LAYOUT_ERROR_SCHEMA, ":2: ",
    "<layout> lacks the attribute “version”" },
  { "unknown-element.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "<pipe> is not allowed inside <parts>; expected one of <part>" },
  { "missing-tag.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ", "<part> lacks the attribute “tag”" },
  { "unknown-attribute.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "<part> has no attribute “colour”" },
  { "decimal-comma.pline", PL_LAYOUT_ERROR_SCHEMA, ":5: ",
    "the attribute “value” of <number> is “9,53”; expected a number with '.' as the "
    "decimal mark" },
  { "bad-rotation.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "“rotation” of <part> is “45”; expected 0, 90, 180 or 270" },
  { "bad-boolean.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "“value” of <boolean> is “yes”; expected “true” or “false”" },
  { "wire-bad-end.pline", PL_LAYOUT_ERROR_SCHEMA, ":7: ",
    "“from” of <wire> is “H1.a”; expected a part id and a port key" },
  { "text-in-parts.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "<parts> may not hold text (found “pump here”)" },
  { "element-in-note.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "<note> may hold only text, not the element <b>" },
  /* Only the validator's own sentence says what is wrong with the order. */
  { "sections-out-of-order.pline", PL_LAYOUT_ERROR_SCHEMA, ":4: ",
    "does not follow the layout schema: " },
  /* Valid XML, refused content. */
  { "drawing-unit-pressure.pline", PL_LAYOUT_ERROR_CONTENT, ":2: ",
    "the drawing unit “psi” is not a unit of length; expected one of: m, cm, mm, um, in, ft" },
  { "unknown-type.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ",
    "unknown part type “turbine”; expected one of: pump, hose" },
  { "scenario-as-part.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ", "unknown part type “scenario”" },
  { "unknown-param.pline", PL_LAYOUT_ERROR_CONTENT, ":5: ",
    "part “H1” has no parameter “colour”" },
  { "wrong-kind.pline", PL_LAYOUT_ERROR_CONTENT, ":5: ",
    "the parameter “open” of part “BV1” is written as <boolean>, not as <number>" },
  { "wrong-quantity.pline", PL_LAYOUT_ERROR_CONTENT, ":6: ",
    "the unit “psi” does not fit the parameter “bore” of part “H1”, which is a length" },
  { "unknown-unit.pline", PL_LAYOUT_ERROR_CONTENT, ":5: ",
    "the unit “furlong” does not fit the parameter “length”" },
  { "out-of-range.pline", PL_LAYOUT_ERROR_CONTENT, ":5: ", "part “H1”: Bore" },
  { "overflow.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ",
    "“1e999” is too large to be held as a number" },
  { "unknown-choice.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ",
    "“bingham” is not a choice of the parameter “viscosity-law” of the scenario; expected "
    "one of: newtonian, power-law, carreau" },
  { "duplicate-param.pline", PL_LAYOUT_ERROR_CONTENT, ":7: ",
    "part “H1” gives the parameter “bore” twice (first on line 5)" },
  { "duplicate-id.pline", PL_LAYOUT_ERROR_CONTENT, ":6: ",
    "the id “p1” is used twice (first on line 4)" },
  { "duplicate-tag.pline", PL_LAYOUT_ERROR_CONTENT, ":5: ",
    "the tag “H1” is used twice (first on line 4)" },
  { "wire-unknown-part.pline", PL_LAYOUT_ERROR_CONTENT, ":7: ",
    "the wire “w1” ends at the part “p9”, which the file does not have" },
  { "wire-unknown-port.pline", PL_LAYOUT_ERROR_CONTENT, ":8: ",
    "the wire “w1” ends at the port “in” of the part “p1”, but a part of type “pump” has "
    "only the ports: out" },
  /* Refused by the document's own commands; the line is the reader's. */
  { "wire-to-itself.pline", PL_LAYOUT_ERROR_CONTENT, ":7: ", "H1" },
  { "huge-coordinate.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ", "1e+07" },
  { "note-too-long.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ", "4000" },
  { "tag-control.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ", "control characters" },
  { "title-two-lines.pline", PL_LAYOUT_ERROR_CONTENT, ":4: ", "the title block: " },
};

static char *
bad_path (const char *file)
{
  const char *root = g_getenv ("PRESSLINE_SOURCE_ROOT");

  ck_assert_msg (root != NULL, "PRESSLINE_SOURCE_ROOT is not set (run through meson test)");
  return g_build_filename (root, "tests", "data", "layouts", "bad", file, NULL);
}

START_TEST (test_bad_file)
{
  const BadCase *c = &bad_cases[_i];
  g_autofree char *path = bad_path (c->file);
  g_autofree char *prefix = g_strconcat (path, c->place, NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, &error);

  ck_assert_msg (doc == NULL, "%s loaded", c->file);
  ck_assert_ptr_nonnull (error);
  ck_assert_msg (error->domain == PL_LAYOUT_ERROR && error->code == (int) c->code,
                 "%s: code %d, expected %d: %s", c->file, error->code, c->code,
                 error->message);
  ck_assert_msg (g_str_has_prefix (error->message, prefix), "%s: the place is not “%s”: %s",
                 c->file, c->place, error->message);
  ck_assert_msg (strstr (error->message, c->fragment) != NULL,
                 "%s: “%s” not in: %s", c->file, c->fragment, error->message);
  ck_assert (g_utf8_validate (error->message, -1, NULL));
}
END_TEST

/* The same bytes through the memory entry point: the same message with
 * the given name in place of the path. */
START_TEST (test_bad_data)
{
  const BadCase *c = &bad_cases[_i];
  g_autofree char *path = bad_path (c->file);
  g_autofree char *text = NULL;
  g_autofree char *prefix = g_strconcat ("in-memory", c->place, NULL);
  g_autoptr (GError) error = NULL;
  gsize length = 0;
  g_autoptr (PlDocument) doc = NULL;

  ck_assert (g_file_get_contents (path, &text, &length, NULL));
  doc = pl_layout_read_data (text, length, "in-memory", &error);
  ck_assert_ptr_null (doc);
  ck_assert_ptr_nonnull (error);
  ck_assert_int_eq (error->code, c->code);
  ck_assert_msg (g_str_has_prefix (error->message, prefix), "%s", error->message);
  ck_assert_msg (strstr (error->message, c->fragment) != NULL, "%s", error->message);
}
END_TEST

/* Every fixture in the folder is in the table (none goes untested). */
START_TEST (test_every_fixture_listed)
{
  g_autofree char *dir_path = bad_path ("");
  g_autoptr (GDir) dir = g_dir_open (dir_path, 0, NULL);
  const char *name;
  guint n = 0;

  ck_assert_ptr_nonnull (dir);
  while ((name = g_dir_read_name (dir)) != NULL)
    {
      gboolean listed = FALSE;

      for (guint i = 0; i < G_N_ELEMENTS (bad_cases); i++)
        listed = listed || strcmp (bad_cases[i].file, name) == 0;
      ck_assert_msg (listed, "%s is not in the table of bad_cases", name);
      n++;
    }
  ck_assert_uint_eq (n, G_N_ELEMENTS (bad_cases));
  ck_assert_uint_ge (n, 20);
}
END_TEST

static Suite *
layout_malformed_suite (void)
{
  Suite *s = suite_create ("layout-malformed");
  TCase *tc = tcase_create ("fixtures");

  tcase_add_loop_test (tc, test_bad_file, 0, G_N_ELEMENTS (bad_cases));
  tcase_add_loop_test (tc, test_bad_data, 0, G_N_ELEMENTS (bad_cases));
  tcase_add_test (tc, test_every_fixture_listed);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (layout_malformed_suite ());
}
