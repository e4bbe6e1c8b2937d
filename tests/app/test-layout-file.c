/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Layout files: round trips (every sample, every good fixture, randomised
 * documents), units and numbers in files, locale independence, the atomic
 * save and its failures, file-level read errors, and concurrent loads.
 */

#include "config.h"

#include <errno.h>
#include <float.h>
#include <glib.h>
#include <glib/gstdio.h>
#include <locale.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <unistd.h>

#include "pl-check.h"

#include "pl-command.h"
#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-layout-writer.h"
#include "pl-part-type.h"
#include "pl-units.h"

/* Exact definitions, NIST SP 811 (2008), App. B.8 footnotes: the
 * international inch and foot, the avoirdupois pound and standard gravity
 * (written out here so the tests do not reuse the units module's macros). */
#define REF_INCH 0.0254
#define REF_FOOT 0.3048
#define REF_LBF (0.45359237 * 9.80665)
#define REF_PSI (REF_LBF / (REF_INCH * REF_INCH))

/* Check has no GError assertion. */
#define ck_assert_error(err, dom, code_)                                           \
  ck_assert_msg ((err) != NULL && (err)->domain == (dom) && (err)->code == (int) (code_), \
                 "expected error code %d, got %s", (int) (code_),                   \
                 (err) != NULL ? (err)->message : "no error")

static char *
source_path (const char *first, ...)
{
  const char *root = g_getenv ("PRESSLINE_SOURCE_ROOT");
  GPtrArray *parts = g_ptr_array_new ();
  va_list args;
  const char *p;
  char *path;

  ck_assert_msg (root != NULL, "PRESSLINE_SOURCE_ROOT is not set (run through meson test)");
  g_ptr_array_add (parts, (gpointer) root);
  va_start (args, first);
  for (p = first; p != NULL; p = va_arg (args, const char *))
    g_ptr_array_add (parts, (gpointer) p);
  va_end (args);
  g_ptr_array_add (parts, NULL);
  path = g_build_filenamev ((char **) parts->pdata);
  g_ptr_array_free (parts, TRUE);
  return path;
}

static void
apply_ok (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;
  gboolean ok = pl_command_apply (cmd, doc, &error);

  ck_assert_msg (ok, "command refused: %s", error != NULL ? error->message : "?");
  pl_command_unref (cmd);
}

/* Applies cmd if the model accepts it (random edits may be refused). */
static gboolean
apply_maybe (PlDocument *doc, PlCommand *cmd)
{
  gboolean ok = pl_command_apply (cmd, doc, NULL);

  pl_command_unref (cmd);
  return ok;
}

/* The core property: doc -> bytes -> doc2 equal to doc, and doc2 -> the
 * same bytes again. */
static void
assert_round_trip (PlDocument *doc, const char *what)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *first = NULL, *second = NULL;
  g_autoptr (PlDocument) back = NULL;
  gsize n1 = 0, n2 = 0;

  first = pl_layout_write_data (doc, &n1, &error);
  ck_assert_msg (first != NULL, "%s: write: %s", what, error ? error->message : "?");
  ck_assert_uint_eq (n1, strlen (first));
  back = pl_layout_read_data (first, n1, what, &error);
  if (back == NULL)
    fprintf (stderr, "%s\n", first);   /* Check's messages are short */
  ck_assert_msg (back != NULL, "%s: the written file does not load: %s", what,
                 error ? error->message : "?");
  ck_assert_msg (pl_document_equal (doc, back), "%s: the document changed in a round trip",
                 what);
  second = pl_layout_write_data (back, &n2, &error);
  ck_assert_msg (second != NULL, "%s: second write: %s", what, error ? error->message : "?");
  if (n1 != n2 || memcmp (first, second, n1) != 0)
    fprintf (stderr, "%s\n---\n%s\n", first, second);
  ck_assert_msg (n1 == n2 && memcmp (first, second, n1) == 0,
                 "%s: save, load, save gave other bytes", what);
}

/* Loads a file, then checks the round trip from the loaded document. */
static void
assert_file_round_trip (const char *path)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, &error);

  ck_assert_msg (doc != NULL, "%s does not load: %s", path, error ? error->message : "?");
  assert_round_trip (doc, path);
}

/* Every *.pline in dir (relative to the source root); the number found. */
static guint
round_trip_folder (const char *dir_name)
{
  g_autofree char *dir_path = source_path (dir_name, NULL);
  g_autoptr (GDir) dir = g_dir_open (dir_path, 0, NULL);
  const char *name;
  guint n = 0;

  if (dir == NULL)
    return 0;
  while ((name = g_dir_read_name (dir)) != NULL)
    {
      g_autofree char *path = NULL;

      if (!g_str_has_suffix (name, PL_LAYOUT_FILE_SUFFIX))
        continue;
      path = g_build_filename (dir_path, name, NULL);
      assert_file_round_trip (path);
      n++;
    }
  return n;
}

/* The demo layouts: whatever samples/ holds (it may be empty early on). */
START_TEST (test_samples_round_trip)
{
  round_trip_folder ("samples");
}
END_TEST

/* The good fixtures, written by hand in the style a person would use
 * (comments, other units, defaults left out): these must exist. */
START_TEST (test_good_fixtures_round_trip)
{
  guint n = round_trip_folder ("tests/data/layouts/good");

  ck_assert_uint_ge (n, 3);
}
END_TEST

/* --- randomised documents --- */

static const char *const random_texts[] = {
  "", "Line 3", "WO-2024-0117", "a & b < c > d \"q\" 'a'", "ü€𝄞 ∅ ½", "  lead and trail  ",
  "]]>", "&amp; is not an entity here", "<!-- not a comment -->", "x=\"1\" y='2'",
  "tab\there", "two\nlines", "trailing newline\n", "\n", "\t", "中文 日本語 한국어",
};

static const char *
random_text (GRand *rand)
{
  return random_texts[g_rand_int_range (rand, 0, G_N_ELEMENTS (random_texts))];
}

/* A number as a person would enter it (a short decimal in a common unit,
 * SI or US), or an arbitrary double, or an extreme one. */
static double
random_number (GRand *rand, const PlParamSpec *spec)
{
  static const PlUnitSystem systems[] = { PL_UNIT_SYSTEM_SI, PL_UNIT_SYSTEM_US };
  double lo = spec->min_bound != PL_BOUND_NONE ? spec->min : -1e6;
  double hi = spec->max_bound != PL_BOUND_NONE ? spec->max : 1e6;
  int mode = g_rand_int_range (rand, 0, 5);

  switch (mode)
    {
    case 0:   /* typed: "12.34" in the SI or US default unit */
      {
        PlUnitId unit = pl_unit_system_get_default (systems[g_rand_int_range (rand, 0, 2)],
                                                    spec->quantity);
        return pl_unit_to_si (unit, g_rand_int_range (rand, 0, 100000) / 100.0);
      }
    case 1:   /* inch fractions, as on a hose catalogue */
      return g_rand_int_range (rand, 1, 64) / 64.0 * REF_INCH;
    case 2:   /* anywhere in the range */
      return g_rand_double_range (rand, lo, hi);
    case 3:   /* any magnitude */
      return pow (10.0, g_rand_double_range (rand, -12.0, 12.0))
             * (g_rand_boolean (rand) ? 1.0 : -1.0);
    default:  /* at the edges */
      return g_rand_boolean (rand) ? lo : nextafter (hi, lo);
    }
}

static void
random_value (GRand *rand, const PlParamSpec *spec, PlValue *value)
{
  memset (value, 0, sizeof *value);
  value->kind = spec->kind;
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      value->number = random_number (rand, spec);
      break;
    case PL_PARAM_CHOICE:
      value->choice = (guint) g_rand_int_range (rand, 0, (gint32) spec->n_choices);
      break;
    case PL_PARAM_BOOLEAN:
      value->boolean = g_rand_boolean (rand);
      break;
    case PL_PARAM_TEXT:
    default:
      value->text = g_strdup (random_text (rand));
      break;
    }
}

/* Random values for some parameters of item_id (refused ones skipped). */
static void
randomise_values (GRand *rand, PlDocument *doc, const char *item_id, const PlPartType *type)
{
  for (guint i = 0; i < type->n_params; i++)
    {
      PlValue value;

      if (g_rand_int_range (rand, 0, 10) < 3)
        continue;   /* keep the default */
      random_value (rand, &type->params[i], &value);
      if (pl_param_spec_check_value (&type->params[i], &value, NULL, NULL))
        apply_maybe (doc, pl_command_new_set_value (item_id, type->params[i].key, &value));
      pl_value_clear (&value);
    }
}

static double
random_coordinate (GRand *rand)
{
  switch (g_rand_int_range (rand, 0, 4))
    {
    case 0:
      return g_rand_int_range (rand, -500, 500) * 5.0;     /* on a 5 mm grid */
    case 1:
      return g_rand_double_range (rand, -1e4, 1e4);
    case 2:
      return g_rand_int_range (rand, -300, 300) / 3.0;     /* not exact in binary */
    default:
      return g_rand_boolean (rand) ? -0.0 : 1e-300;
    }
}

static PlDocument *
random_document (guint32 seed)
{
  GRand *rand = g_rand_new_with_seed (seed);
  PlDocument *doc = pl_document_new ();
  guint n_parts = (guint) g_rand_int_range (rand, 0, 14);
  GPtrArray *ids = g_ptr_array_new_with_free_func (g_free);

  randomise_values (rand, doc, "title", pl_part_type_get (PL_PART_TITLE));
  randomise_values (rand, doc, "scenario", pl_part_type_get (PL_PART_SCENARIO));
  gint32 n_types = (gint32) pl_part_type_get_n_placeable ();

  for (guint i = 0; i < n_parts; i++)
    {
      const PlPartType *type =
        pl_part_type_get_placeable ((guint) g_rand_int_range (rand, 0, n_types));
      PlCommand *cmd = pl_command_new_add_part_full (type->key, NULL, NULL,
                                                     random_coordinate (rand),
                                                     random_coordinate (rand),
                                                     (guint) g_rand_int_range (rand, 0, 4),
                                                     g_rand_boolean (rand));
      char *id;

      ck_assert (pl_command_apply (cmd, doc, NULL));
      id = g_strdup (pl_command_get_created_id (cmd));
      pl_command_unref (cmd);
      g_ptr_array_add (ids, id);
      if (g_rand_int_range (rand, 0, 4) == 0)
        {
          /* Tags with characters that need escaping. */
          g_autofree char *tag = g_strdup_printf ("%s<&\"'>ü%u", type->tag_prefix, i);
          apply_maybe (doc, pl_command_new_set_tag (id, tag));
        }
      randomise_values (rand, doc, id, type);
    }
  /* A gap in the ids, as after a deletion. */
  if (ids->len > 2 && g_rand_boolean (rand))
    {
      const char *gone = g_ptr_array_index (ids, 1);

      apply_ok (doc, pl_command_new_remove (&gone, 1));
      g_ptr_array_remove_index (ids, 1);
    }
  for (guint i = 0; ids->len >= 2 && i < ids->len + 2; i++)
    {
      const char *a = g_ptr_array_index (ids, g_rand_int_range (rand, 0, (gint32) ids->len));
      const char *b = g_ptr_array_index (ids, g_rand_int_range (rand, 0, (gint32) ids->len));
      const PlPartType *ta = pl_part_get_part_type (pl_document_find_part (doc, a));
      const PlPartType *tb = pl_part_get_part_type (pl_document_find_part (doc, b));
      PlPoint bends[4];
      guint n_bends = (guint) g_rand_int_range (rand, 0, 5);

      for (guint j = 0; j < n_bends; j++)
        {
          bends[j].x = random_coordinate (rand);
          bends[j].y = random_coordinate (rand);
        }
      apply_maybe (doc, pl_command_new_add_wire (
                          NULL, a, ta->ports[g_rand_int_range (rand, 0, (gint32) ta->n_ports)].key,
                          b, tb->ports[g_rand_int_range (rand, 0, (gint32) tb->n_ports)].key,
                          bends, n_bends));
    }
  for (guint i = 0, n = (guint) g_rand_int_range (rand, 0, 4); i < n; i++)
    apply_maybe (doc, pl_command_new_add_note (NULL, random_coordinate (rand),
                                               random_coordinate (rand), random_text (rand)));
  g_ptr_array_unref (ids);
  g_rand_free (rand);
  return doc;
}

/* 60 documents from fixed seeds (reproducible: a failure names its seed). */
START_TEST (test_random_round_trip)
{
  g_autoptr (PlDocument) doc = random_document (20240601u + (guint32) _i);
  g_autofree char *what = g_strdup_printf ("random document, seed %u", 20240601u + _i);

  assert_round_trip (doc, what);
}
END_TEST

/* The generator is not vacuous: over the 60 seeds it makes parts of every
 * type, wires with bends, notes, and moves values off their defaults
 * (random edits the model refuses are skipped, so this guards against a
 * generator whose edits are all refused). */
START_TEST (test_random_documents_are_rich)
{
  guint parts = 0, wires = 0, bends = 0, notes = 0, changed = 0;
  gboolean type_seen[PL_N_PART_KINDS] = { FALSE };

  for (guint i = 0; i < 60; i++)
    {
      g_autoptr (PlDocument) doc = random_document (20240601u + i);

      parts += pl_document_get_n_parts (doc);
      wires += pl_document_get_n_wires (doc);
      notes += pl_document_get_n_notes (doc);
      for (guint j = 0; j < pl_document_get_n_wires (doc); j++)
        {
          guint n = 0;

          pl_wire_get_bends (pl_document_get_wire (doc, j), &n);
          bends += n;
        }
      for (guint j = 0; j < pl_document_get_n_parts (doc); j++)
        {
          const PlPart *part = pl_document_get_part (doc, j);
          const PlPartType *type = pl_part_get_part_type (part);

          type_seen[type->kind] = TRUE;
          for (guint k = 0; k < type->n_params; k++)
            {
              PlValue def;

              pl_param_spec_default_value (&type->params[k], &def);
              if (!pl_value_equal (&def, pl_part_get_nth_value (part, k)))
                changed++;
              pl_value_clear (&def);
            }
        }
    }
  for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
    ck_assert_msg (type_seen[pl_part_type_get_placeable (i)->kind], "no %s",
                   pl_part_type_get_placeable (i)->key);
  ck_assert_uint_ge (parts, 200);
  ck_assert_uint_ge (wires, 100);
  ck_assert_uint_ge (bends, 100);
  ck_assert_uint_ge (notes, 40);
  ck_assert_uint_ge (changed, 500);
}
END_TEST

/* The empty document and one with every part type at its defaults. */
START_TEST (test_defaults_round_trip)
{
  g_autoptr (PlDocument) empty = pl_document_new ();
  g_autoptr (PlDocument) all = pl_document_new ();

  assert_round_trip (empty, "empty document");
  for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
    apply_ok (all, pl_command_new_add_part (pl_part_type_get_placeable (i)->key, NULL,
                                            10.0 * i, 0.0));
  assert_round_trip (all, "every part type");
}
END_TEST

/* --- units and numbers --- */

typedef struct
{
  const char *xml;        /* one <number> of a hose */
  const char *key;
  double expected_si;
  double rel_tol;
} UnitCase;

/* Tolerance: an exact factor times a short decimal is one rounded product,
 * so 2 ulp (4.4e-16 relative) covers it; the psi factor is exact too (built
 * from the exact inch, pound and g_n). */
static const UnitCase unit_cases[] = {
  /* 3/8 in bore: 0.375 x 0.0254 m (NIST SP 811 B.8, inch exact). */
  { "<number key=\"bore\" value=\"0.375\" unit=\"in\"/>", "bore", 0.375 * REF_INCH, 4.5e-16 },
  { "<number key=\"bore\" value=\"9.525\" unit=\"mm\"/>", "bore", 9.525e-3, 4.5e-16 },
  /* 25 ft of hose (NIST SP 811 B.8, foot exact). */
  { "<number key=\"length\" value=\"25\" unit=\"ft\"/>", "length", 25 * REF_FOOT, 4.5e-16 },
  /* 3000 psi rating: 3000 x 6894.757... Pa (NIST SP 811 B.8). */
  { "<number key=\"rated-pressure\" value=\"3000\" unit=\"psi\"/>", "rated-pressure",
    3000 * REF_PSI, 4.5e-16 },
  { "<number key=\"rated-pressure\" value=\"207\" unit=\"bar\"/>", "rated-pressure", 207e5,
    4.5e-16 },
  { "<number key=\"rated-pressure\" value=\"20.7\" unit=\"MPa\"/>", "rated-pressure", 20.7e6,
    4.5e-16 },
  { "<number key=\"elevation\" value=\"-1.5e3\" unit=\"mm\"/>", "elevation", -1.5, 4.5e-16 },
  { "<number key=\"elevation\" value=\"+.5\" unit=\"m\"/>", "elevation", 0.5, 4.5e-16 },
};

static const char unit_template[] =
  "<?xml version=\"1.0\"?>\n"
  "<layout xmlns=\"" PL_LAYOUT_NAMESPACE "\" version=\"1\" drawing-unit=\"mm\">\n"
  "  <parts>\n"
  "    <part id=\"p1\" type=\"hose\" tag=\"H1\" x=\"0\" y=\"0\">\n"
  "      %s\n"
  "    </part>\n"
  "  </parts>\n"
  "</layout>\n";

START_TEST (test_units_in_file)
{
  const UnitCase *c = &unit_cases[_i];
  g_autofree char *xml = g_strdup_printf (unit_template, c->xml);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_data (xml, strlen (xml), "units", &error);
  double v;

  ck_assert_msg (doc != NULL, "%s", error ? error->message : "?");
  v = pl_part_get_number (pl_document_find_part (doc, "p1"), c->key);
  ck_assert_double_eq_tol (v, c->expected_si, c->rel_tol * fabs (c->expected_si));
  assert_round_trip (doc, c->xml);
}
END_TEST

/* The drawing unit scales every coordinate; mm is taken as is. */
START_TEST (test_drawing_unit)
{
  static const char xml[] =
    "<layout xmlns=\"" PL_LAYOUT_NAMESPACE "\" version=\"1\" drawing-unit=\"in\">"
    "<parts><part id=\"p1\" type=\"pump\" tag=\"P1\" x=\"1\" y=\"-2.5\"/>"
    "<part id=\"p4\" type=\"hose\" tag=\"H1\" x=\"3\" y=\"0\" rotation=\"270\" "
    "mirrored=\"true\"/></parts>"
    "<wires><wire id=\"w2\" from=\"p1:out\" to=\"p4:a\"><bend x=\"2\" y=\"0.5\"/></wire>"
    "</wires><notes><note id=\"n7\" x=\"0.25\" y=\"0\">Hi</note></notes></layout>";
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_data (xml, strlen (xml), "inch", &error);
  const PlPart *pump, *hose;
  const PlWire *wire;
  const PlPoint *bends;
  guint n_bends = 0;

  ck_assert_msg (doc != NULL, "%s", error ? error->message : "?");
  pump = pl_document_find_part (doc, "p1");
  hose = pl_document_find_part (doc, "p4");
  /* 1 in = 25.4 mm exactly (NIST SP 811 B.8); one product, 2 ulp. */
  ck_assert_double_eq_tol (pl_part_get_x (pump), 25.4, 25.4 * 4.5e-16);
  ck_assert_double_eq_tol (pl_part_get_y (pump), -63.5, 63.5 * 4.5e-16);
  ck_assert_uint_eq (pl_part_get_rotation (hose), 3);
  ck_assert (pl_part_get_mirrored (hose));
  ck_assert (!pl_part_get_mirrored (pump));
  wire = pl_document_find_wire (doc, "w2");
  ck_assert_ptr_nonnull (wire);
  bends = pl_wire_get_bends (wire, &n_bends);
  ck_assert_uint_eq (n_bends, 1);
  ck_assert_double_eq_tol (bends[0].x, 50.8, 50.8 * 4.5e-16);
  ck_assert_double_eq_tol (pl_note_get_x (pl_document_find_note (doc, "n7")), 6.35,
                           6.35 * 4.5e-16);
  ck_assert_str_eq (pl_note_get_text (pl_document_find_note (doc, "n7")), "Hi");
  assert_round_trip (doc, "inch drawing");
}
END_TEST

static void
expect_in (const char *text, const char *needle)
{
  if (strstr (text, needle) == NULL)
    fprintf (stderr, "%s\n", text);
  ck_assert_msg (strstr (text, needle) != NULL, "not written: %s", needle);
}

/* What the writer puts in the file: readable units where they are exact,
 * the coherent SI unit where not, and always the shortest exact decimal. */
START_TEST (test_written_numbers)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autofree char *text = NULL;

  apply_ok (doc, pl_command_new_add_part_full ("hose", "p1", "H1", 12.5, -0.0, 1, FALSE));
  /* Typed "9.53 mm": the same product pl_unit_to_si forms. */
  apply_ok (doc, pl_command_new_set_number ("p1", "bore",
                                            pl_unit_to_si (PL_UNIT_MM, 9.53)));
  apply_ok (doc, pl_command_new_set_number ("p1", "rated-pressure",
                                            pl_unit_to_si (PL_UNIT_BAR, 250.0)));
  apply_ok (doc, pl_command_new_set_number ("p1", "length", 1.0 / 3.0));
  text = pl_layout_write_data (doc, NULL, NULL);
  ck_assert_ptr_nonnull (text);
  expect_in (text, "<number key=\"bore\" value=\"9.53\" unit=\"mm\"/>");
  expect_in (text, "<number key=\"rated-pressure\" value=\"250\" unit=\"bar\"/>");
  /* 1/3 m: in m (the SI default for a line length) with 16 or 17 digits. */
  expect_in (text, "<number key=\"length\" value=\"0.3333333333333333");
  expect_in (text, "x=\"12.5\" y=\"-0\" rotation=\"90\" mirrored=\"false\"");
  /* Room temperature as typed in degC is written as 20 degC. */
  apply_ok (doc, pl_command_new_set_number ("scenario", "temperature",
                                            pl_unit_to_si (PL_UNIT_DEG_C, 20.0)));
  g_free (text);
  text = pl_layout_write_data (doc, NULL, NULL);
  expect_in (text, "<number key=\"temperature\" value=\"20\" unit=\"degC\"/>");
  assert_round_trip (doc, "written numbers");
}
END_TEST

/* A comma locale changes neither the bytes written nor what is read.
 * Tried only where such a locale is installed (the check is skipped, and
 * says so, where none is). */
START_TEST (test_locale_independent)
{
  static const char *const locales[] = { "de_DE.UTF-8", "de_DE.utf8", "fr_FR.UTF-8",
                                         "nl_NL.UTF-8", "ru_RU.UTF-8" };
  g_autoptr (PlDocument) doc = random_document (7u);
  g_autofree char *c_text = pl_layout_write_data (doc, NULL, NULL);
  g_autofree char *old = g_strdup (setlocale (LC_NUMERIC, NULL));
  gboolean tried = FALSE;

  ck_assert_ptr_nonnull (c_text);
  for (guint i = 0; i < G_N_ELEMENTS (locales) && !tried; i++)
    {
      g_autofree char *text = NULL;
      g_autoptr (PlDocument) back = NULL;

      if (setlocale (LC_NUMERIC, locales[i]) == NULL)
        continue;
      tried = TRUE;
      ck_assert_str_eq (localeconv ()->decimal_point, ",");
      text = pl_layout_write_data (doc, NULL, NULL);
      back = pl_layout_read_data (c_text, strlen (c_text), "locale", NULL);
      setlocale (LC_NUMERIC, old);
      ck_assert_str_eq (text, c_text);
      ck_assert_ptr_nonnull (back);
      ck_assert (pl_document_equal (doc, back));
    }
  setlocale (LC_NUMERIC, old);
  if (!tried)
    fprintf (stderr, "test_locale_independent: no comma locale installed; only the C locale "
             "was checked\n");
  /* In any case: no value or coordinate in the file holds a comma. */
  for (const char *p = strstr (c_text, "=\""); p != NULL; p = strstr (p + 1, "=\""))
    {
      const char *start = p + 2, *end = strchr (start, '"');
      g_autofree char *value = g_strndup (start, (gsize) (end - start));

      if (g_ascii_isdigit (value[0]) || value[0] == '-')
        ck_assert_msg (strchr (value, ',') == NULL, "a decimal comma in %s", value);
    }
}
END_TEST

/* --- the atomic save --- */

static char *
make_temp_dir (void)
{
  g_autoptr (GError) error = NULL;
  char *dir = g_dir_make_tmp ("pressline-layout-XXXXXX", &error);

  ck_assert_msg (dir != NULL, "%s", error ? error->message : "?");
  return dir;
}

static guint
count_entries (const char *dir_path)
{
  g_autoptr (GDir) dir = g_dir_open (dir_path, 0, NULL);
  guint n = 0;

  ck_assert_ptr_nonnull (dir);
  while (g_dir_read_name (dir) != NULL)
    n++;
  return n;
}

static void
remove_tree (const char *path)
{
  GDir *dir = g_dir_open (path, 0, NULL);
  const char *name;

  if (dir != NULL)
    {
      while ((name = g_dir_read_name (dir)) != NULL)
        {
          g_autofree char *child = g_build_filename (path, name, NULL);
          struct stat st;

          if (lstat (child, &st) == 0 && S_ISDIR (st.st_mode))
            remove_tree (child);
          else
            g_unlink (child);
        }
      g_dir_close (dir);
    }
  g_rmdir (path);
}

static char *
file_text (const char *path)
{
  char *text = NULL;

  ck_assert_msg (g_file_get_contents (path, &text, NULL, NULL), "cannot read %s", path);
  return text;
}

START_TEST (test_save_replaces)
{
  g_autofree char *dir = make_temp_dir ();
  g_autofree char *path = g_build_filename (dir, "line.pline", NULL);
  g_autoptr (PlDocument) first = random_document (11u);
  g_autoptr (PlDocument) second = random_document (12u);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) back = NULL;
  g_autofree char *expected = NULL, *got = NULL;
  struct stat st;

  ck_assert_msg (pl_layout_write_file (first, path, &error), "%s",
                 error ? error->message : "?");
  ck_assert_uint_eq (count_entries (dir), 1);   /* no temporary file left */
  ck_assert_int_eq (chmod (path, 0640), 0);
  ck_assert_msg (pl_layout_write_file (second, path, &error), "%s",
                 error ? error->message : "?");
  ck_assert_uint_eq (count_entries (dir), 1);
  ck_assert_int_eq (stat (path, &st), 0);
  ck_assert_uint_eq (st.st_mode & 0777, 0640);   /* permissions kept */
  expected = pl_layout_write_data (second, NULL, NULL);
  got = file_text (path);
  ck_assert_str_eq (got, expected);
  back = pl_layout_read_file (path, &error);
  ck_assert_msg (back != NULL, "%s", error ? error->message : "?");
  ck_assert (pl_document_equal (back, second));
  remove_tree (dir);
}
END_TEST

/* Saving through a symbolic link replaces the target and keeps the link. */
START_TEST (test_save_through_link)
{
  g_autofree char *dir = make_temp_dir ();
  g_autofree char *target = g_build_filename (dir, "real.pline", NULL);
  g_autofree char *link = g_build_filename (dir, "link.pline", NULL);
  g_autoptr (PlDocument) doc = random_document (13u);
  g_autoptr (GError) error = NULL;
  g_autofree char *expected = NULL, *got = NULL;
  struct stat st;

  ck_assert (g_file_set_contents (target, "old", -1, NULL));
  ck_assert_int_eq (symlink ("real.pline", link), 0);
  ck_assert_msg (pl_layout_write_file (doc, link, &error), "%s", error ? error->message : "?");
  ck_assert_int_eq (lstat (link, &st), 0);
  ck_assert (S_ISLNK (st.st_mode));
  expected = pl_layout_write_data (doc, NULL, NULL);
  got = file_text (target);
  ck_assert_str_eq (got, expected);
  ck_assert_uint_eq (count_entries (dir), 2);
  remove_tree (dir);
}
END_TEST

/* Failed saves name the file, remove their temporary file and leave what
 * was there untouched. */
START_TEST (test_save_failures)
{
  g_autofree char *dir = make_temp_dir ();
  g_autofree char *missing = g_build_filename (dir, "no-such-folder", "x.pline", NULL);
  g_autofree char *folder = g_build_filename (dir, "a-folder.pline", NULL);
  g_autofree char *path = g_build_filename (dir, "kept.pline", NULL);
  g_autoptr (PlDocument) doc = random_document (14u);
  g_autoptr (PlDocument) odd = pl_document_new ();
  g_autoptr (GError) error = NULL;
  g_autofree char *before = NULL, *after = NULL;
  PlCommand *cmd;

  ck_assert (!pl_layout_write_file (doc, missing, &error));
  ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
  ck_assert_msg (g_str_has_prefix (error->message, missing), "%s", error->message);
  g_clear_error (&error);

  /* rename() cannot put a file over a folder. */
  ck_assert_int_eq (g_mkdir (folder, 0755), 0);
  ck_assert (!pl_layout_write_file (doc, folder, &error));
  ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
  ck_assert_msg (strstr (error->message, "a-folder.pline") != NULL, "%s", error->message);
  g_clear_error (&error);
  ck_assert (g_file_test (folder, G_FILE_TEST_IS_DIR));
  ck_assert_uint_eq (count_entries (dir), 1);   /* only the folder: no temporary file */

  /* A text XML cannot carry (U+FFFF is no XML Char, XML 1.0 production
   * [2]), if the model lets it in: refused before the disk is touched. */
  ck_assert (pl_layout_write_file (doc, path, &error));
  before = file_text (path);
  cmd = pl_command_new_add_note (NULL, 0.0, 0.0, "bad \xEF\xBF\xBF here");
  if (pl_command_apply (cmd, odd, NULL))
    {
      ck_assert (!pl_layout_write_file (odd, path, &error));
      ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_UNSAVABLE);
      ck_assert_msg (strstr (error->message, "U+FFFF") != NULL, "%s", error->message);
      ck_assert_msg (g_str_has_prefix (error->message, path), "%s", error->message);
      g_clear_error (&error);
      ck_assert_ptr_null (pl_layout_write_data (odd, NULL, &error));
      ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_UNSAVABLE);
      g_clear_error (&error);
    }
  pl_command_unref (cmd);
  after = file_text (path);
  ck_assert_str_eq (after, before);
  ck_assert_uint_eq (count_entries (dir), 2);
  remove_tree (dir);
}
END_TEST

/* A folder that may not be written: skipped when running as root, who may
 * write anywhere. */
START_TEST (test_save_read_only_folder)
{
  g_autofree char *dir = make_temp_dir ();
  g_autofree char *path = g_build_filename (dir, "x.pline", NULL);
  g_autoptr (PlDocument) doc = random_document (15u);
  g_autoptr (GError) error = NULL;
  g_autofree char *got = NULL;

  ck_assert (g_file_set_contents (path, "old text", -1, NULL));
  ck_assert_int_eq (chmod (dir, 0555), 0);
  if (geteuid () != 0)
    {
      ck_assert (!pl_layout_write_file (doc, path, &error));
      ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
      ck_assert_msg (g_str_has_prefix (error->message, path), "%s", error->message);
      got = file_text (path);
      ck_assert_str_eq (got, "old text");
    }
  ck_assert_int_eq (chmod (dir, 0755), 0);
  remove_tree (dir);
}
END_TEST

/* --- reading files --- */

START_TEST (test_read_file_errors)
{
  g_autofree char *dir = make_temp_dir ();
  g_autofree char *missing = g_build_filename (dir, "missing.pline", NULL);
  g_autofree char *fifo = g_build_filename (dir, "fifo.pline", NULL);
  g_autoptr (GError) error = NULL;

  ck_assert_ptr_null (pl_layout_read_file (missing, &error));
  ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
  ck_assert_msg (g_str_has_prefix (error->message, missing), "%s", error->message);
  g_clear_error (&error);

  /* A FIFO would block a plain open() and read(): refused at once. */
  ck_assert_int_eq (mkfifo (fifo, 0600), 0);
  ck_assert_ptr_null (pl_layout_read_file (fifo, &error));
  ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
  ck_assert_msg (strstr (error->message, "not a regular file") != NULL, "%s", error->message);
  g_clear_error (&error);

  ck_assert_ptr_null (pl_layout_read_file (dir, &error));
  ck_assert_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO);
  g_clear_error (&error);
  remove_tree (dir);
}
END_TEST

/* The embedded schema is the one in app/data/ (a stale build would
 * enforce another grammar than the one installed). */
START_TEST (test_schema_embedded)
{
  g_autofree char *path = source_path ("app", "data", "pressline-layout.rng", NULL);
  g_autofree char *on_disk = file_text (path);
  g_autoptr (GBytes) embedded = pl_layout_get_schema ();
  gsize size = 0;
  const char *data = g_bytes_get_data (embedded, &size);

  ck_assert_uint_eq (size, strlen (on_disk));
  ck_assert (memcmp (data, on_disk, size) == 0);
}
END_TEST

/* --- threads --- */

typedef struct
{
  const char *text;
  gsize length;
  PlDocument *expected;
  guint failures;
} ThreadJob;

static gpointer
load_many (gpointer data)
{
  ThreadJob *job = data;

  for (guint i = 0; i < 20; i++)
    {
      PlDocument *doc = pl_layout_read_data (job->text, job->length, "thread", NULL);

      /* pl_document_equal only reads both documents. */
      if (doc == NULL || !pl_document_equal (doc, job->expected))
        job->failures++;
      g_clear_object (&doc);
    }
  return NULL;
}

/* Loads in four threads at once give the same documents as one alone
 * (no shared parser state; under the sanitizers also no races on the
 * heap). */
START_TEST (test_concurrent_loads)
{
  g_autoptr (PlDocument) doc = random_document (99u);
  gsize length = 0;
  g_autofree char *text = pl_layout_write_data (doc, &length, NULL);
  ThreadJob jobs[4];
  GThread *threads[4];

  for (guint i = 0; i < 4; i++)
    {
      jobs[i] = (ThreadJob) { text, length, doc, 0 };
      threads[i] = g_thread_new ("load", load_many, &jobs[i]);
    }
  for (guint i = 0; i < 4; i++)
    {
      g_thread_join (threads[i]);
      ck_assert_uint_eq (jobs[i].failures, 0);
    }
}
END_TEST

static Suite *
layout_file_suite (void)
{
  Suite *s = suite_create ("layout-file");
  TCase *tc = tcase_create ("round-trip");

  tcase_add_test (tc, test_samples_round_trip);
  tcase_add_test (tc, test_good_fixtures_round_trip);
  tcase_add_loop_test (tc, test_random_round_trip, 0, 60);
  tcase_add_test (tc, test_random_documents_are_rich);
  tcase_add_test (tc, test_defaults_round_trip);
  suite_add_tcase (s, tc);

  tc = tcase_create ("numbers");
  tcase_add_loop_test (tc, test_units_in_file, 0, G_N_ELEMENTS (unit_cases));
  tcase_add_test (tc, test_drawing_unit);
  tcase_add_test (tc, test_written_numbers);
  tcase_add_test (tc, test_locale_independent);
  suite_add_tcase (s, tc);

  tc = tcase_create ("files");
  tcase_add_test (tc, test_save_replaces);
  tcase_add_test (tc, test_save_through_link);
  tcase_add_test (tc, test_save_failures);
  tcase_add_test (tc, test_save_read_only_folder);
  tcase_add_test (tc, test_read_file_errors);
  tcase_add_test (tc, test_schema_embedded);
  tcase_add_test (tc, test_concurrent_loads);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (layout_file_suite ());
}
