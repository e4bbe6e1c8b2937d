/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-report.c: the JSON writer, and the text, CSV and JSON reports of a
 * small solved layout.
 */

#include "config.h"

#include <locale.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pl-json-parse.h"

#include "pl-command.h"
#include "pl-document.h"
#include "pl-json-writer.h"
#include "pl-report.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"

/* --- the writer --- */

typedef struct
{
  double value;
  const char *text;
} NumberCase;

/* RFC 8259 sec. 6 has no NaN or infinity: null.  Shortest of %.15g and
 * %.17g that reads back to the same double (IEEE 754-2008 sec. 5.12.2:
 * 17 significant digits always round-trip a binary64). */
static const NumberCase number_cases[] = {
  { 0.0, "0" },
  { -0.0, "-0" },
  { 1.5, "1.5" },
  { 0.1, "0.1" },
  { 1e-7, "1e-07" },
  { 1e300, "1e+300" },
  { 6894.757293168, "6894.757293168" },      /* psi in Pa, NIST SP 811 B.8 */
  { 1.0 / 3.0, "0.33333333333333331" },
  { 9.9999999999999991e-05, "9.9999999999999991e-05" },
  { NAN, "null" },
  { INFINITY, "null" },
  { -INFINITY, "null" },
};

START_TEST (test_json_numbers)
{
  const NumberCase *c = &number_cases[_i];
  g_autoptr (GString) out = g_string_new (NULL);

  pl_json_append_number (out, c->value);
  ck_assert_str_eq (out->str, c->text);
}
END_TEST

typedef struct
{
  const char *in;
  const char *out;
} StringCase;

/* RFC 8259 sec. 7: quote, backslash and U+0000..U+001F escaped; the rest
 * of valid UTF-8 as is; invalid bytes replaced by U+FFFD. */
static const StringCase string_cases[] = {
  { "plain", "\"plain\"" },
  { "a\"b\\c", "\"a\\\"b\\\\c\"" },
  { "line\nnext\ttab\r", "\"line\\nnext\\ttab\\r\"" },
  { "\x01\x1f", "\"\\u0001\\u001f\"" },
  { "µ°·", "\"µ°·\"" },
  { "\xe2\x80\xa8", "\"\\u2028\"" },
  { "bad\xff" "byte", "\"bad\xef\xbf\xbd" "byte\"" },
  { "", "\"\"" },
};

START_TEST (test_json_strings)
{
  const StringCase *c = &string_cases[_i];
  g_autoptr (GString) out = g_string_new (NULL);
  g_autoptr (TjValue) back = NULL;

  pl_json_append_string (out, c->in);
  ck_assert_str_eq (out->str, c->out);
  /* And an independent reader takes it back. */
  back = tj_parse (out->str);
  ck_assert_ptr_nonnull (back);
  ck_assert_int_eq (back->kind, TJ_STRING);
}
END_TEST

START_TEST (test_json_structure)
{
  g_autoptr (PlJsonWriter) w = pl_json_writer_new (FALSE);
  g_autoptr (PlJsonWriter) open = pl_json_writer_new (TRUE);
  g_autoptr (PlJsonWriter) pretty = pl_json_writer_new (TRUE);
  g_autofree char *text = NULL;
  g_autofree char *none = NULL;
  g_autofree char *pretty_text = NULL;
  g_autoptr (TjValue) v = NULL;

  pl_json_writer_begin_object (w);
  pl_json_writer_key (w, "a");
  pl_json_writer_begin_array (w);
  pl_json_writer_integer (w, 1);
  pl_json_writer_boolean (w, TRUE);
  pl_json_writer_null (w);
  pl_json_writer_string (w, "x");
  pl_json_writer_number (w, NAN);
  pl_json_writer_end_array (w);
  pl_json_writer_key (w, "b");
  pl_json_writer_begin_object (w);
  pl_json_writer_end_object (w);
  pl_json_writer_member_string (w, "c", NULL);
  pl_json_writer_end_object (w);
  text = pl_json_writer_finish (w);
  ck_assert_str_eq (text, "{\"a\":[1,true,null,\"x\",null],\"b\":{},\"c\":null}\n");

  /* An unfinished document gives nothing rather than broken JSON. */
  pl_json_writer_begin_object (open);
  pl_json_writer_key (open, "a");
  none = pl_json_writer_finish (open);
  ck_assert_ptr_null (none);

  /* Pretty text is the same JSON. */
  pl_json_writer_begin_object (pretty);
  pl_json_writer_member_number (pretty, "x", 2.5);
  pl_json_writer_key (pretty, "y");
  pl_json_writer_begin_array (pretty);
  pl_json_writer_integer (pretty, -3);
  pl_json_writer_end_array (pretty);
  pl_json_writer_end_object (pretty);
  pretty_text = pl_json_writer_finish (pretty);
  ck_assert_str_eq (pretty_text, "{\n  \"x\": 2.5,\n  \"y\": [\n    -3\n  ]\n}\n");
  v = tj_parse (pretty_text);
  ck_assert_ptr_nonnull (v);
  ck_assert_double_eq (tj_get (v, "x")->number, 2.5);
}
END_TEST

/* Every double comes back bit for bit, whatever the locale's decimal mark
 * (de_DE uses ','; if the locale is not installed, the C locale runs the
 * same check). */
START_TEST (test_json_round_trip)
{
  guint64 state = 0x9e3779b97f4a7c15u;
  g_autofree char *old = g_strdup (setlocale (LC_NUMERIC, NULL));

  setlocale (LC_NUMERIC, "de_DE.UTF-8");
  for (int i = 0; i < 2000; i++)
    {
      g_autoptr (GString) out = g_string_new (NULL);
      g_autoptr (TjValue) back = NULL;
      double x;

      /* xorshift64 (Marsaglia 2003): random bit patterns over every
       * exponent; non-finite patterns are skipped. */
      state ^= state << 13;
      state ^= state >> 7;
      state ^= state << 17;
      memcpy (&x, &state, sizeof x);
      if (!isfinite (x))
        continue;
      pl_json_append_number (out, x);
      ck_assert_ptr_null (strchr (out->str, ','));
      back = tj_parse (out->str);
      ck_assert_msg (back != NULL && back->kind == TJ_NUMBER, "%s", out->str);
      ck_assert_msg (back->number == x, "%s read back as %.17g", out->str, back->number);
    }
  setlocale (LC_NUMERIC, old);
}
END_TEST

/* --- reports of a solved layout --- */

static char *
add_part (PlDocument *doc, const char *type)
{
  g_autoptr (PlCommand) cmd = pl_command_new_add_part (type, NULL, 0.0, 0.0);

  ck_assert (pl_command_apply (cmd, doc, NULL));
  return g_strdup (pl_command_get_created_id (cmd));
}

static void
apply (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "%s", error ? error->message : "");
  pl_command_unref (cmd);
}

typedef struct
{
  PlDocument *doc;
  char *pump, *hose, *nozzle;
  PlResults *results;
} Line;

/* Pump (30:1, no seal friction, 6 bar air: stall 180 bar), hose, and an
 * applicator whose tag holds a comma and a quote, to test the quoting. */
static void
line_init (Line *l)
{
  g_autoptr (GError) error = NULL;

  l->doc = pl_document_new ();
  l->pump = add_part (l->doc, "pump");
  l->hose = add_part (l->doc, "hose");
  l->nozzle = add_part (l->doc, "applicator");
  apply (l->doc, pl_command_new_set_number (l->pump, "ratio", 30.0));
  apply (l->doc, pl_command_new_set_number (l->pump, "friction-offset", 0.0));
  apply (l->doc, pl_command_new_set_number ("scenario", "air-pressure", 6e5));
  apply (l->doc, pl_command_new_set_tag (l->nozzle, "N\"1,left"));
  apply (l->doc, pl_command_new_add_wire (NULL, l->pump, "out", l->hose, "a", NULL, 0));
  apply (l->doc, pl_command_new_add_wire (NULL, l->hose, "b", l->nozzle, "in", NULL, 0));
  l->results = pl_solve_scheduler_solve_sync (l->doc, NULL, &error);
  ck_assert_ptr_nonnull (l->results);
}

static void
line_clear (Line *l)
{
  pl_results_unref (l->results);
  g_object_unref (l->doc);
  g_free (l->pump);
  g_free (l->hose);
  g_free (l->nozzle);
}

START_TEST (test_report_json)
{
  Line l;
  g_autofree char *text = NULL;
  g_autoptr (TjValue) root = NULL;
  const TjValue *nozzle, *v;
  double want;
  pls_line_result lr;

  line_init (&l);
  text = pl_report_write_json (l.results, "line.pline");
  root = tj_parse (text);
  ck_assert_msg (root != NULL, "not JSON:\n%s", text);
  ck_assert_str_eq (tj_get (root, "format")->string, "pressline-report");
  ck_assert_double_eq (tj_get (root, "format_version")->number, PL_REPORT_JSON_VERSION);
  ck_assert_double_eq (tj_get (root, "revision")->number,
                       (double) pl_document_get_revision (l.doc));
  nozzle = tj_path (root, "parts", l.nozzle, NULL);
  ck_assert_ptr_nonnull (nozzle);
  ck_assert_str_eq (tj_get (nozzle, "tag")->string, "N\"1,left");
  ck_assert_str_eq (tj_get (nozzle, "type")->string, "applicator");

  /* SI: the idle pressure is stall, 30 x 6e5 Pa = 1.8e7 Pa (ratio pump,
   * PHYSICS.md); Newton's 1e-3 Pa tolerance bounds the difference. */
  v = tj_path (nozzle, "ports", "in", "idle", NULL);
  ck_assert_int_eq (v->kind, TJ_NUMBER);
  ck_assert_double_eq_tol (v->number, 1.8e7, 1e-2);
  ck_assert (pl_results_get_port_pressure (l.results, l.nozzle, "in", PL_PRESSURE_CYCLE_MIN,
                                           &want));
  ck_assert (tj_path (nozzle, "ports", "in", "cycle_min", NULL)->number == want);
  ck_assert (pl_results_get_line (l.results, l.hose, PL_CASE_STEADY_OPEN, &lr));
  ck_assert (tj_path (root, "parts", l.hose, "line", "steady_open", "reynolds", NULL)->number
             == lr.reynolds);
  /* A port that has no node reads null, not a number. */
  ck_assert_int_eq (tj_path (root, "parts", l.pump, "pump", "idle", "running", NULL)->kind,
                    TJ_BOOL);
  ck_assert_int_eq (tj_path (root, "solves", "cycle", "periodic", NULL)->kind, TJ_BOOL);
  ck_assert_int_eq (tj_get (root, "findings")->kind, TJ_ARRAY);
  line_clear (&l);
}
END_TEST

/* Fields of one CSV record (RFC 4180: quotes around fields with a comma,
 * a quote doubled inside). */
static GPtrArray *
csv_split (const char *line)
{
  GPtrArray *fields = g_ptr_array_new_with_free_func (g_free);
  GString *f = g_string_new (NULL);
  gboolean quoted = FALSE;

  for (const char *p = line; *p != '\0'; p++)
    {
      if (quoted && *p == '"' && p[1] == '"')
        {
          g_string_append_c (f, '"');
          p++;
        }
      else if (*p == '"')
        quoted = !quoted;
      else if (*p == ',' && !quoted)
        {
          g_ptr_array_add (fields, g_string_free (f, FALSE));
          f = g_string_new (NULL);
        }
      else
        g_string_append_c (f, *p);
    }
  g_ptr_array_add (fields, g_string_free (f, FALSE));
  return fields;
}

START_TEST (test_report_csv_units)
{
  Line l;
  PlUnitPrefs si, us;
  g_autofree char *csv_si = NULL;
  g_autofree char *csv_us = NULL;
  g_auto (GStrv) rows_si = NULL;
  g_auto (GStrv) rows_us = NULL;
  gboolean found_si = FALSE, found_us = FALSE, found_tag = FALSE;

  line_init (&l);
  pl_unit_prefs_init (&si, PL_UNIT_SYSTEM_SI);
  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  csv_si = pl_report_write_csv (l.results, &si);
  csv_us = pl_report_write_csv (l.results, &us);
  ck_assert (g_str_has_suffix (csv_si, "\r\n"));
  rows_si = g_strsplit (csv_si, "\r\n", -1);
  rows_us = g_strsplit (csv_us, "\r\n", -1);
  ck_assert_str_eq (rows_si[0], "part_id,tag,type,item,quantity,case,value,unit,note");
  ck_assert_uint_eq (g_strv_length (rows_si), g_strv_length (rows_us));

  for (guint i = 1; rows_si[i] != NULL && rows_si[i][0] != '\0'; i++)
    {
      g_autoptr (GPtrArray) a = csv_split (rows_si[i]);
      g_autoptr (GPtrArray) b = csv_split (rows_us[i]);
      const char *const *fa = (const char *const *) a->pdata;
      const char *const *fb = (const char *const *) b->pdata;

      ck_assert_msg (a->len == 9, "row %u has %u fields: %s", i, a->len, rows_si[i]);
      ck_assert_uint_eq (b->len, 9);
      if (g_str_equal (fa[1], "N\"1,left"))
        found_tag = TRUE;
      /* The stall pressure at the applicator's inlet: 180 bar, and in
       * psi 1.8e7 / 6894.757293168 = 2610.68 (NIST SP 811, B.8, psi);
       * six significant digits are written. */
      if (g_str_equal (fa[0], l.nozzle) && g_str_equal (fa[3], "in")
          && g_str_equal (fa[4], "pressure") && g_str_equal (fa[5], "idle"))
        {
          ck_assert_str_eq (fa[7], "bar");
          ck_assert_double_eq_tol (g_ascii_strtod (fa[6], NULL), 180.0, 1e-4);
          ck_assert_str_eq (fb[7], "psi");
          ck_assert_double_eq_tol (g_ascii_strtod (fb[6], NULL), 2610.68, 0.01);
          found_si = found_us = TRUE;
        }
    }
  ck_assert (found_si && found_us && found_tag);
  line_clear (&l);
}
END_TEST

START_TEST (test_report_text)
{
  Line l;
  PlUnitPrefs us;
  g_autofree char *si = NULL;
  g_autofree char *text_us = NULL;

  line_init (&l);
  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  si = pl_report_write_text (l.results, NULL, "line.pline");
  text_us = pl_report_write_text (l.results, &us, NULL);
  ck_assert_ptr_nonnull (strstr (si, "line.pline"));
  ck_assert_ptr_nonnull (strstr (si, "N\"1,left"));
  ck_assert_ptr_nonnull (strstr (si, "180 bar"));
  /* 2610.68 psi to the four digits of the text report. */
  ck_assert_ptr_nonnull (strstr (text_us, "2611 psi"));
  /* Figures follow the units; the findings quote the solver's sentences,
   * which are in SI (this line has no dump valve: trapped pressure). */
  ck_assert_ptr_nonnull (strstr (text_us, "\nFindings\n"));
  *strstr (text_us, "\nFindings\n") = '\0';
  ck_assert_msg (strstr (text_us, " bar") == NULL, "%s", text_us);
  ck_assert_int_eq (pl_report_format_from_key ("json"), PL_REPORT_JSON);
  ck_assert_int_eq (pl_report_format_from_key ("xml"), PL_N_REPORT_FORMATS);
  ck_assert_int_eq (pl_report_format_from_key (NULL), PL_N_REPORT_FORMATS);
  line_clear (&l);
}
END_TEST

/* A fast snapshot (no cycle yet) reports its absent figures as null. */
START_TEST (test_report_pending)
{
  Line l;
  g_autoptr (PlCompiled) c = NULL;
  g_autoptr (PlResults) fast = NULL;
  g_autofree char *text = NULL;
  g_autoptr (TjValue) root = NULL;

  line_init (&l);
  c = pl_compile (l.doc);
  fast = pl_results_solve_fast (c);
  text = pl_report_write_json (fast, NULL);
  root = tj_parse (text);
  ck_assert_ptr_nonnull (root);
  ck_assert_int_eq (tj_get (root, "source")->kind, TJ_NULL);
  ck_assert_str_eq (tj_path (root, "solves", "cycle", "state", NULL)->string, "pending");
  ck_assert_int_eq (tj_path (root, "parts", l.nozzle, "shot", NULL)->kind, TJ_NULL);
  ck_assert_int_eq (tj_path (root, "parts", l.nozzle, "ports", "in", "cycle_max", NULL)->kind,
                    TJ_NULL);
  ck_assert_int_eq (tj_path (root, "solves", "shutdown", "time_to_safe", NULL)->kind, TJ_NULL);
  line_clear (&l);
}
END_TEST

static Suite *
report_suite (void)
{
  Suite *s = suite_create ("report");
  TCase *tw = tcase_create ("json-writer");
  TCase *tr = tcase_create ("reports");

  tcase_add_loop_test (tw, test_json_numbers, 0, G_N_ELEMENTS (number_cases));
  tcase_add_loop_test (tw, test_json_strings, 0, G_N_ELEMENTS (string_cases));
  tcase_add_test (tw, test_json_structure);
  tcase_add_test (tw, test_json_round_trip);
  suite_add_tcase (s, tw);

  tcase_add_test (tr, test_report_json);
  tcase_add_test (tr, test_report_csv_units);
  tcase_add_test (tr, test_report_text);
  tcase_add_test (tr, test_report_pending);
  suite_add_tcase (s, tr);
  return s;
}

int
main (void)
{
  return pl_check_run (report_suite ());
}
