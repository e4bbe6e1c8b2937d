/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-work-order.c: the work order as a technician gets it: the PDF's text
 * (pdftotext) holds the title block, every gauge with the solver's readings,
 * every finding and the cautions; the SVG parses and holds the same; the
 * PNG has the size paper and resolution imply; every paper and
 * orientation renders; bad arguments exit 2 and write nothing.
 */
#include "config.h"

#include <cairo.h>
#include <glib.h>
#include <glib/gstdio.h>
#include <libxml/parser.h>
#include <libxml/tree.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pl-json-parse.h"
#include "pl-spawn-cli.h"
#include "pl-tmpdir.h"

#include "pl-command.h"
#include "pl-compile.h"
#include "pl-finding-text.h"
#include "pl-layout-reader.h"
#include "pl-layout-writer.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"
#include "pl-undo-stack.h"
#include "pl-work-order.h"

/* White space of any kind and length as one space: pdftotext breaks lines
 * where the sheet wraps them. */
static char *
squeeze (const char *text)
{
  GString *out = g_string_new (NULL);
  gboolean space = FALSE;

  for (const char *p = text; *p != '\0'; p++)
    {
      if (g_ascii_isspace (*p))
        space = TRUE;
      else
        {
          if (space && out->len > 0)
            g_string_append_c (out, ' ');
          space = FALSE;
          g_string_append_c (out, *p);
        }
    }
  return g_string_free (out, FALSE);
}

static void
assert_holds (const char *haystack, const char *needle, const char *where)
{
  g_autofree char *h = squeeze (haystack);
  g_autofree char *n = squeeze (needle);

  ck_assert_msg (strstr (h, n) != NULL, "%s does not hold “%s”", where, n);
}

static char *
pdftotext (const char *pdf, gboolean layout)
{
  const char *argv[] = { "pdftotext", "-enc", "UTF-8", layout ? "-layout" : "-raw", pdf, "-",
                         NULL };
  g_autoptr (GError) error = NULL;
  char *out = NULL;
  int status = 0;

  ck_assert_msg (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL,
                               &out, NULL, &status, &error),
                 "pdftotext: %s", error ? error->message : "");
  ck_assert_msg (g_spawn_check_wait_status (status, NULL), "pdftotext failed on %s", pdf);
  return out;
}

/* --- the layouts checked --- */

/* The demo line with every title field filled in (one in Cyrillic and
 * Japanese, so that non-Latin text is shown to reach the sheet) and a
 * second gauge at the pump: a scenario of our own. */
static PlDocument *
filled_demo (void)
{
  g_autofree char *path = sample_path ("demo-glue-line.pline");
  g_autoptr (GError) error = NULL;
  PlDocument *doc = pl_layout_read_file (path, &error);
  static const char *const fields[][2] = {
    { "site", "Werk Süd, hall 3" },
    { "author", "Линия клея 接着剤" },
    { "date", "2026-11-30" },
    { "revision", "C" },
  };

  ck_assert_msg (doc != NULL, "%s", error ? error->message : "");
  for (guint i = 0; i < G_N_ELEMENTS (fields); i++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_set_title_field (fields[i][0], fields[i][1]);

      ck_assert (pl_command_apply (cmd, doc, NULL));
    }
  {
    g_autoptr (PlCommand) add = pl_command_new_add_part ("gauge", "p90", -160.0, 110.0);
    g_autoptr (PlCommand) wire = pl_command_new_add_wire (NULL, "p90", "p", "p1", "out", NULL,
                                                          0);

    ck_assert (pl_command_apply (add, doc, &error));
    ck_assert_msg (pl_command_apply (wire, doc, &error), "%s", error ? error->message : "");
  }
  return doc;
}

typedef struct
{
  const char *sample;    /* NULL: filled_demo () */
} LayoutCase;

static const LayoutCase layouts[] = {
  { "demo-glue-line.pline" },
  { "carton-sealer-starved.pline" },
  { "carton-sealer-retrofit.pline" },
  { NULL },
};

/* The layout of a case as a file the command line can read. */
static char *
layout_file (const LayoutCase *c)
{
  g_autoptr (PlDocument) doc = NULL;
  g_autoptr (GError) error = NULL;
  char *path;

  if (c->sample != NULL)
    return sample_path (c->sample);
  doc = filled_demo ();
  path = pl_tmpdir_path ("filled-demo.pline");
  ck_assert_msg (pl_layout_write_file (doc, path, &error), "%s", error ? error->message : "");
  return path;
}

static TjValue *
solve_json (const char *path)
{
  CliRun r = spawn_cli ("solve", path, "--format", "json", NULL);
  TjValue *root;

  ck_assert_msg (r.status == 0, "solve %s: exit %d: %s", path, r.status, r.err);
  root = tj_parse (r.out);
  ck_assert_msg (root != NULL, "solve %s: not JSON", path);
  cli_run_clear (&r);
  return root;
}

/* The title block's fields as the document has them; the file's name and
 * the program's version. */
static void
assert_title_block (const char *text, PlDocument *doc, const char *path, const char *where)
{
  static const char *const keys[] = { "work-order", "line", "site", "author", "date",
                                      "revision" };
  g_autofree char *base = g_path_get_basename (path);

  for (guint i = 0; i < G_N_ELEMENTS (keys); i++)
    {
      const char *value = pl_part_get_text (pl_document_get_title (doc), keys[i]);

      if (*value != '\0')
        assert_holds (text, value, where);
    }
  assert_holds (text, base, where);
  assert_holds (text, "Pressline " PACKAGE_VERSION, where);
}

/* The cautions the house rules ask for, in the sheet's words. */
static void
assert_cautions (const char *text, const char *where)
{
  static const char *const phrases[] = {
    "Injection hazard", "fluid at high pressure can pierce the skin",
    "accumulators and hoses hold fluid under pressure",
    "lock out the air and drain the line", "verify zero pressure on a gauge",
    "local codes and qualified practice govern",
  };

  for (guint i = 0; i < G_N_ELEMENTS (phrases); i++)
    assert_holds (text, phrases[i], where);
}

static void
assert_findings (const char *text, PlResults *results, const char *where)
{
  PlUnitPrefs si;

  pl_unit_prefs_init (&si, PL_UNIT_SYSTEM_SI);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      g_autofree char *sentence = pl_finding_format_sentence (
        pl_results_get_finding (results, i), results, &si);

      assert_holds (text, sentence, where);
    }
}

/* A printed reading agrees with the solver's figure to the four
 * significant digits the sheet prints: within half a unit of the fourth. */
static void
assert_reading (double printed_bar, const TjValue *json_pa, const char *what)
{
  double expected, tol;

  ck_assert_msg (json_pa != NULL && json_pa->kind == TJ_NUMBER, "%s: no figure in the JSON",
                 what);
  /* 1 bar = 1e5 Pa exactly (NIST SP 811, B.8). */
  expected = json_pa->number / 1e5;
  tol = fabs (expected) > 0.0 ? 0.5 * pow (10.0, floor (log10 (fabs (expected))) - 3.0)
                              : 1e-9;
  ck_assert_msg (fabs (printed_bar - expected) <= tol * (1.0 + 1e-9),
                 "%s: the sheet says %.6g bar, the solver %.6g bar", what, printed_bar,
                 expected);
}

/* Every gauge of the JSON has a row in the gauges table of the PDF
 * (pdftotext -layout keeps a row on a line) with four pressures: full
 * scale, idle, lowest while firing, after recovery (the cycle's highest),
 * in bar. */
static guint
assert_gauges (const char *layout_text, const TjValue *root)
{
  const TjValue *parts = tj_get (root, "parts");
  g_auto (GStrv) lines = g_strsplit (layout_text, "\n", -1);
  g_autoptr (GRegex) bar = g_regex_new ("(-?[0-9]+(?:\\.[0-9]+)?) bar", 0, 0, NULL);
  guint n = 0;

  for (guint i = 0; i < parts->keys->len; i++)
    {
      const TjValue *part = g_ptr_array_index (parts->items, i);
      const char *tag = tj_get (part, "tag")->string;
      const TjValue *port = tj_path (part, "ports", "p", NULL);
      g_autofree char *prefix = g_strconcat (tag, " ", NULL);
      gboolean found = FALSE;

      if (!g_str_equal (tj_get (part, "type")->string, "gauge"))
        continue;
      for (guint l = 0; lines[l] != NULL && !found; l++)
        {
          g_autoptr (GMatchInfo) m = NULL;
          double v[4];
          guint k = 0;

          if (!g_str_has_prefix (g_strchug (lines[l]), prefix)
              || strstr (lines[l], " bar") == NULL)
            continue;
          g_regex_match (bar, lines[l], 0, &m);
          while (g_match_info_matches (m) && k < 4)
            {
              g_autofree char *num = g_match_info_fetch (m, 1);

              v[k++] = g_ascii_strtod (num, NULL);
              g_match_info_next (m, NULL);
            }
          /* The parts list has a row for the gauge too, with one figure. */
          if (k < 4)
            continue;
          assert_reading (v[1], tj_get (port, "idle"), "idle");
          assert_reading (v[2], tj_get (port, "cycle_min"), "lowest while firing");
          assert_reading (v[3], tj_get (port, "cycle_max"), "after recovery");
          found = TRUE;
        }
      ck_assert_msg (found, "gauge %s has no row in the PDF", tag);
      n++;
    }
  return n;
}

START_TEST (test_pdf_text)
{
  const LayoutCase *c = &layouts[_i];
  g_autofree char *path = layout_file (c);
  g_autofree char *pdf = pl_tmpdir_path ("sheets.pdf");
  const char *args[] = { "export", path, "-o", pdf, NULL };
  CliRun r = spawn_cli_argv (args);
  g_autoptr (TjValue) root = solve_json (path);
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, NULL);
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
  g_autofree char *raw = NULL, *layout = NULL;
  guint gauges;

  ck_assert_msg (r.status == 0, "export %s: exit %d: %s", path, r.status, r.err);
  cli_run_clear (&r);
  raw = pdftotext (pdf, FALSE);
  layout = pdftotext (pdf, TRUE);
  assert_title_block (raw, doc, path, "the PDF");
  assert_findings (raw, results, "the PDF");
  assert_cautions (raw, "the PDF");
  gauges = assert_gauges (layout, root);
  /* The filled demo has two gauges, the plain demo one (its comment). */
  if (c->sample == NULL)
    ck_assert_uint_eq (gauges, 2);
  assert_holds (raw, "Pressures are gauge pressures in bar", "the PDF");
  assert_holds (raw, "Sheet 1 of", "the PDF");
}
END_TEST

/* The text of every SVG sheet's <desc>, after checking it parses. */
static char *
svg_texts (const char *first, guint *n_files)
{
  GString *all = g_string_new (NULL);

  *n_files = 0;
  for (guint i = 0;; i++)
    {
      g_autofree char *name = pl_work_order_sheet_filename (first, i);
      xmlDocPtr doc;
      xmlNodePtr root;

      if (!g_file_test (name, G_FILE_TEST_EXISTS))
        break;
      doc = xmlReadFile (name, NULL, XML_PARSE_NONET);
      ck_assert_msg (doc != NULL, "%s is not well-formed XML", name);
      root = xmlDocGetRootElement (doc);
      ck_assert_str_eq ((const char *) root->name, "svg");
      for (xmlNodePtr n = root->children; n != NULL; n = n->next)
        if (n->type == XML_ELEMENT_NODE && g_str_equal ((const char *) n->name, "desc"))
          {
            xmlChar *text = xmlNodeGetContent (n);

            g_string_append (all, (const char *) text);
            g_string_append_c (all, '\n');
            xmlFree (text);
          }
      xmlFreeDoc (doc);
      (*n_files)++;
    }
  return g_string_free (all, FALSE);
}

START_TEST (test_svg_sheets)
{
  const LayoutCase *c = &layouts[_i];
  g_autofree char *path = layout_file (c);
  g_autofree char *svg = pl_tmpdir_path ("sheets.svg");
  const char *args[] = { "export", path, "-o", svg, "--orientation", "landscape", NULL };
  CliRun r = spawn_cli_argv (args);
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, NULL);
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
  g_autofree char *text = NULL;
  guint n_files = 0;

  ck_assert_msg (r.status == 0, "export %s: exit %d: %s", path, r.status, r.err);
  cli_run_clear (&r);
  text = svg_texts (svg, &n_files);
  ck_assert_uint_ge (n_files, 2);
  assert_title_block (text, doc, path, "the SVG");
  assert_findings (text, results, "the SVG");
  assert_cautions (text, "the SVG");
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_GAUGE)
        assert_holds (text, pl_part_get_tag (part), "the SVG");
    }
  {
    g_autofree char *last = g_strdup_printf ("Sheet %u of %u", n_files, n_files);

    assert_holds (text, last, "the SVG");
  }
}
END_TEST

/* --- papers, orientations, resolutions --- */

typedef struct
{
  PlPaper paper;
  PlOrientation orientation;
  double dpi;
  int width, height;   /* pixels */
} PngCase;

/* ISO 216: A4 210 x 297 mm, A3 297 x 420 mm; ANSI/ASME Y14.1: Letter
 * 8.5 x 11 in; pixels = mm / 25.4 x dpi, to the nearest. */
static const PngCase pngs[] = {
  { PL_PAPER_A4, PL_ORIENTATION_PORTRAIT, 150, 1240, 1754 },
  { PL_PAPER_A4, PL_ORIENTATION_LANDSCAPE, 150, 1754, 1240 },
  { PL_PAPER_LETTER, PL_ORIENTATION_PORTRAIT, 100, 850, 1100 },
  { PL_PAPER_LETTER, PL_ORIENTATION_LANDSCAPE, 72, 792, 612 },
  { PL_PAPER_A3, PL_ORIENTATION_PORTRAIT, 72, 842, 1191 },
  { PL_PAPER_A3, PL_ORIENTATION_LANDSCAPE, 150, 2480, 1754 },
};

static PlResults *demo_results (PlDocument **doc);

START_TEST (test_png_size)
{
  const PngCase *c = &pngs[_i];
  PlDocument *doc = NULL;
  g_autoptr (PlResults) results = demo_results (&doc);
  g_autofree char *png = pl_tmpdir_path ("sheet.png");
  g_autoptr (GError) error = NULL;
  g_autoptr (PlWorkOrder) wo = NULL;
  PlWorkOrderOptions opts;

  pl_work_order_options_init (&opts);
  pl_paper_get_size (c->paper, c->orientation, &opts.width_mm, &opts.height_mm);
  wo = pl_work_order_new (doc, results, &opts);
  ck_assert_msg (pl_work_order_write (wo, PL_WORK_ORDER_PNG, c->dpi, png, &error), "%s",
                 error ? error->message : "");
  for (guint i = 0; i < pl_work_order_get_n_sheets (wo); i++)
    {
      g_autofree char *name = pl_work_order_sheet_filename (png, i);
      cairo_surface_t *s = cairo_image_surface_create_from_png (name);

      ck_assert_int_eq (cairo_surface_status (s), CAIRO_STATUS_SUCCESS);
      ck_assert_int_eq (cairo_image_surface_get_width (s), c->width);
      ck_assert_int_eq (cairo_image_surface_get_height (s), c->height);
      cairo_surface_destroy (s);
    }
  g_object_unref (doc);
}
END_TEST

static PlResults *
demo_results (PlDocument **doc)
{
  g_autofree char *path = sample_path ("demo-glue-line.pline");

  *doc = pl_layout_read_file (path, NULL);
  ck_assert_ptr_nonnull (*doc);
  return pl_solve_scheduler_solve_sync (*doc, NULL, NULL);
}

/* Every paper and orientation as PDF: one page per sheet at the paper's
 * size in points (72 per inch). */
START_TEST (test_pdf_papers)
{
  PlPaper paper = _i / PL_N_ORIENTATIONS;
  PlOrientation orientation = _i % PL_N_ORIENTATIONS;
  PlDocument *doc = NULL;
  g_autoptr (PlResults) results = demo_results (&doc);
  g_autofree char *pdf = pl_tmpdir_path ("paper.pdf");
  g_autoptr (GError) error = NULL;
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autofree char *info = NULL;
  const char *argv[] = { "pdfinfo", pdf, NULL };
  g_autofree char *pages = NULL, *size = NULL;
  PlWorkOrderOptions opts;
  double w, h;

  pl_work_order_options_init (&opts);
  pl_paper_get_size (paper, orientation, &w, &h);
  opts.width_mm = w;
  opts.height_mm = h;
  wo = pl_work_order_new (doc, results, &opts);
  ck_assert_uint_ge (pl_work_order_get_n_sheets (wo), 2);
  ck_assert (pl_work_order_write (wo, PL_WORK_ORDER_PDF, 0, pdf, &error));
  ck_assert (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL, &info,
                           NULL, NULL, NULL));
  pages = g_strdup_printf ("Pages:           %u", pl_work_order_get_n_sheets (wo));
  ck_assert_msg (strstr (info, pages) != NULL, "%s", info);
  size = g_strdup_printf ("Page size:       %.0f x %.0f pts", round (w * 72 / 25.4),
                          round (h * 72 / 25.4));
  {
    /* pdfinfo prints three decimals; compare to the point. */
    g_autoptr (GRegex) re = g_regex_new ("Page size: +([0-9.]+) x ([0-9.]+) pts", 0, 0, NULL);
    g_autoptr (GMatchInfo) m = NULL;
    g_autofree char *pw = NULL, *ph = NULL;

    ck_assert (g_regex_match (re, info, 0, &m));
    pw = g_match_info_fetch (m, 1);
    ph = g_match_info_fetch (m, 2);
    ck_assert_double_eq_tol (g_ascii_strtod (pw, NULL), w * 72 / 25.4, 0.01);
    ck_assert_double_eq_tol (g_ascii_strtod (ph, NULL), h * 72 / 25.4, 0.01);
  }
  g_object_unref (doc);
}
END_TEST

/* The page size pdfinfo reports for pdf, in points. */
static void
pdf_page_size (const char *pdf, double *w, double *h)
{
  const char *argv[] = { "pdfinfo", pdf, NULL };
  g_autofree char *info = NULL;
  g_autoptr (GRegex) re = g_regex_new ("Page size: +([0-9.]+) x ([0-9.]+) pts", 0, 0, NULL);
  g_autoptr (GMatchInfo) m = NULL;
  g_autofree char *pw = NULL, *ph = NULL;

  ck_assert (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL, &info,
                           NULL, NULL, NULL));
  ck_assert_msg (g_regex_match (re, info, 0, &m), "%s", info);
  pw = g_match_info_fetch (m, 1);
  ph = g_match_info_fetch (m, 2);
  *w = g_ascii_strtod (pw, NULL);
  *h = g_ascii_strtod (ph, NULL);
}

/* Runs the CLI with args (an export to pdf) and reads the page size. */
static void
export_page_size (const char *const *args, const char *pdf, double *w, double *h)
{
  CliRun r = spawn_cli_argv (args);

  ck_assert_msg (r.status == 0, "exit %d: %s", r.status, r.err);
  cli_run_clear (&r);
  pdf_page_size (pdf, w, h);
}

/* The starved line turned a quarter: every part at (y, x) instead of
 * (x, y), so the diagram stands taller than wide. */
static char *
tall_layout_file (void)
{
  g_autofree char *wide = sample_path ("carton-sealer-starved.pline");
  g_autoptr (PlDocument) doc = pl_layout_read_file (wide, NULL);
  g_autoptr (PlUndoStack) undo = NULL;
  char *path = pl_tmpdir_path ("tall.pline");

  ck_assert_ptr_nonnull (doc);
  undo = pl_undo_stack_new (doc);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      const char *ids[] = { pl_part_get_id (part) };
      double x = pl_part_get_x (part), y = pl_part_get_y (part);
      g_autoptr (PlCommand) move = pl_command_new_move (ids, 1, y - x, x - y);

      ck_assert (pl_undo_stack_push (undo, move, NULL));
    }
  ck_assert (pl_layout_write_file (doc, path, NULL));
  return path;
}

/* Orientation "auto", the export's default: the wide starved line (about
 * 480 x 100 mm, wider than A4's 297/210) goes landscape, the same line
 * turned to stand tall goes portrait; an orientation asked for is kept. */
START_TEST (test_auto_orientation)
{
  g_autofree char *wide = sample_path ("carton-sealer-starved.pline");
  g_autofree char *tall = tall_layout_file ();
  g_autofree char *pdf = pl_tmpdir_path ("auto.pdf");
  g_autoptr (PlDocument) wide_doc = pl_layout_read_file (wide, NULL);
  g_autoptr (PlDocument) tall_doc = pl_layout_read_file (tall, NULL);
  double w, h;

  ck_assert_int_eq (pl_orientation_resolve (PL_ORIENTATION_AUTO, PL_PAPER_A4, wide_doc),
                    PL_ORIENTATION_LANDSCAPE);
  ck_assert_int_eq (pl_orientation_resolve (PL_ORIENTATION_AUTO, PL_PAPER_A4, tall_doc),
                    PL_ORIENTATION_PORTRAIT);
  ck_assert_int_eq (pl_orientation_resolve (PL_ORIENTATION_PORTRAIT, PL_PAPER_A4, wide_doc),
                    PL_ORIENTATION_PORTRAIT);
  {
    g_autoptr (PlDocument) empty = pl_document_new ();

    ck_assert_int_eq (pl_orientation_resolve (PL_ORIENTATION_AUTO, PL_PAPER_A3, empty),
                      PL_ORIENTATION_PORTRAIT);
  }

  {
    const char *args[] = { "export", wide, "-o", pdf, NULL };

    /* A4 landscape: 297 x 210 mm = 841.89 x 595.28 pt (72 pt per inch). */
    export_page_size (args, pdf, &w, &h);
    ck_assert_double_eq_tol (w, 841.89, 0.01);
    ck_assert_double_eq_tol (h, 595.28, 0.01);
  }
  {
    const char *args[] = { "export", tall, "-o", pdf, "--orientation", "auto", NULL };

    export_page_size (args, pdf, &w, &h);
    ck_assert_double_eq_tol (w, 595.28, 0.01);
    ck_assert_double_eq_tol (h, 841.89, 0.01);
  }
  {
    const char *args[] = { "export", wide, "-o", pdf, "--orientation", "portrait", NULL };

    export_page_size (args, pdf, &w, &h);
    ck_assert_double_eq_tol (w, 595.28, 0.01);
  }
}
END_TEST

/* A work order of the demo with extra hoses, n_extra of them: more parts
 * rows, more sheets. */
static PlWorkOrder *
demo_work_order (guint n_extra)
{
  PlDocument *doc = NULL;
  g_autoptr (PlResults) results = demo_results (&doc);
  PlWorkOrderOptions opts;
  PlWorkOrder *wo;

  for (guint i = 0; i < n_extra; i++)
    {
      g_autoptr (PlCommand) add = pl_command_new_add_part ("hose", NULL, 400.0 + 70.0 * i,
                                                           400.0);

      ck_assert (pl_command_apply (add, doc, NULL));
    }
  if (n_extra > 0)
    {
      g_clear_pointer (&results, pl_results_unref);
      results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
    }
  pl_work_order_options_init (&opts);
  wo = pl_work_order_new (doc, results, &opts);
  g_object_unref (doc);
  return wo;
}

static const PlWorkOrderFormat stale_formats[] = { PL_WORK_ORDER_SVG, PL_WORK_ORDER_PNG };

/* Exporting again to the same name with fewer sheets removes the sheets
 * the first export left beyond the new count -- and only those: a gap in
 * the numbering ends the run, and a file without Pressline's generator
 * mark is never touched. */
START_TEST (test_stale_sheets_removed)
{
  PlWorkOrderFormat format = stale_formats[_i];
  const char *ext = pl_work_order_format_get_key (format);
  g_autofree char *base = g_strdup_printf ("again.%s", ext);
  g_autofree char *target = pl_tmpdir_path (base);
  g_autoptr (PlWorkOrder) long_wo = demo_work_order (60);
  g_autoptr (PlWorkOrder) short_wo = demo_work_order (0);
  guint n_long = pl_work_order_get_n_sheets (long_wo);
  guint n_short = pl_work_order_get_n_sheets (short_wo);
  g_autoptr (GPtrArray) removed = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) error = NULL;
  g_autofree char *gap_name = pl_work_order_sheet_filename (target, n_long + 1);
  g_autofree char *foreign_name = NULL;

  ck_assert_uint_ge (n_long, n_short + 2);
  ck_assert (pl_work_order_write (long_wo, format, 50.0, target, &error));
  /* One of ours beyond a gap: not part of the run. */
  {
    g_autofree char *last = pl_work_order_sheet_filename (target, n_long - 1);

    ck_assert (g_rename (last, gap_name) == 0);
  }
  ck_assert (pl_work_order_write_full (short_wo, format, 50.0, target, removed, &error));
  /* Sheets n_short + 1 .. n_long - 1 (the last one moved past the gap). */
  ck_assert_uint_eq (removed->len, n_long - 1 - n_short);
  for (guint k = 0; k < n_long - 1; k++)
    {
      g_autofree char *name = pl_work_order_sheet_filename (target, k);

      ck_assert_msg (g_file_test (name, G_FILE_TEST_EXISTS) == (k < n_short), "%s", name);
      if (k >= n_short)
        ck_assert_str_eq (g_ptr_array_index (removed, k - n_short), name);
    }
  ck_assert (g_file_test (gap_name, G_FILE_TEST_EXISTS));
  g_unlink (gap_name);

  /* A file of someone else's at the next number stays, and ends the run. */
  g_ptr_array_set_size (removed, 0);
  ck_assert (pl_work_order_write (long_wo, format, 50.0, target, &error));
  foreign_name = pl_work_order_sheet_filename (target, n_short);
  ck_assert (g_file_set_contents (foreign_name, "not a sheet of ours", -1, NULL));
  ck_assert (pl_work_order_write_full (short_wo, format, 50.0, target, removed, &error));
  ck_assert_uint_eq (removed->len, 0);
  ck_assert (g_file_test (foreign_name, G_FILE_TEST_EXISTS));
  {
    g_autofree char *next = pl_work_order_sheet_filename (target, n_short + 1);

    ck_assert (g_file_test (next, G_FILE_TEST_EXISTS));
  }
}
END_TEST

/* The generator marks themselves: an SVG sheet has the element in our
 * namespace under <metadata>, a PNG sheet a tEXt "Software" chunk whose
 * CRC is right by the PNG specification's own table-driven algorithm
 * (ISO/IEC 15948 Annex D), written here independently of the exporter's. */
static guint32
spec_crc (const guchar *buf, gsize len)
{
  guint32 table[256];
  guint32 c = 0xffffffffu;

  for (guint32 n = 0; n < 256; n++)
    {
      guint32 t = n;

      for (int k = 0; k < 8; k++)
        t = (t & 1) ? 0xedb88320u ^ (t >> 1) : t >> 1;
      table[n] = t;
    }
  for (gsize i = 0; i < len; i++)
    c = table[(c ^ buf[i]) & 0xff] ^ (c >> 8);
  return c ^ 0xffffffffu;
}

START_TEST (test_generator_marks)
{
  g_autoptr (PlWorkOrder) wo = demo_work_order (0);
  g_autofree char *svg = pl_tmpdir_path ("mark.svg");
  g_autofree char *png = pl_tmpdir_path ("mark.png");
  g_autofree char *data = NULL;
  gsize len = 0, pos = 8;
  gboolean found = FALSE;
  xmlDocPtr doc;

  ck_assert (pl_work_order_write (wo, PL_WORK_ORDER_SVG, 0, svg, NULL));
  ck_assert (g_file_get_contents (svg, &data, &len, NULL));
  doc = xmlReadMemory (data, (int) len, NULL, NULL, XML_PARSE_NONET);
  ck_assert_ptr_nonnull (doc);
  for (xmlNodePtr m = xmlDocGetRootElement (doc)->children; m != NULL; m = m->next)
    if (m->type == XML_ELEMENT_NODE && xmlStrEqual (m->name, (const xmlChar *) "metadata"))
      for (xmlNodePtr g = m->children; g != NULL; g = g->next)
        if (g->type == XML_ELEMENT_NODE && g->ns != NULL
            && xmlStrEqual (g->ns->href, (const xmlChar *) "https://pressline.org/ns/work-order"))
          {
            xmlChar *text = xmlNodeGetContent (g);

            found = g_str_equal ((const char *) text, "Pressline " PACKAGE_VERSION);
            xmlFree (text);
          }
  xmlFreeDoc (doc);
  ck_assert (found);
  g_clear_pointer (&data, g_free);

  found = FALSE;
  ck_assert (pl_work_order_write (wo, PL_WORK_ORDER_PNG, 50.0, png, NULL));
  ck_assert (g_file_get_contents (png, &data, &len, NULL));
  while (pos + 12 <= len && !found)
    {
      const guchar *p = (const guchar *) data + pos;
      guint32 n = ((guint32) p[0] << 24) | ((guint32) p[1] << 16) | ((guint32) p[2] << 8) | p[3];
      const guchar *crc = p + 8 + n;

      ck_assert (pos + 12 + n <= len);
      ck_assert_uint_eq (((guint32) crc[0] << 24) | ((guint32) crc[1] << 16)
                         | ((guint32) crc[2] << 8) | crc[3], spec_crc (p + 4, 4 + n));
      if (memcmp (p + 4, "tEXt", 4) == 0)
        {
          ck_assert_uint_eq (n, strlen ("Software") + 1 + strlen ("Pressline " PACKAGE_VERSION));
          ck_assert (memcmp (p + 8, "Software\0Pressline " PACKAGE_VERSION, n) == 0);
          found = TRUE;
        }
      pos += 12 + n;
    }
  ck_assert (found);
}
END_TEST

/* The CLI says which sheets it removed: a fourth sheet of ours left beside
 * a three-sheet export goes, by name. */
START_TEST (test_cli_reports_removed_sheets)
{
  g_autofree char *layout = sample_path ("carton-sealer-starved.pline");
  g_autofree char *svg = pl_tmpdir_path ("cli.svg");
  const char *args[] = { "export", layout, "-o", svg, NULL };
  CliRun r = spawn_cli_argv (args);
  g_autoptr (PlDocument) doc = pl_layout_read_file (layout, NULL);
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autofree char *last = NULL, *extra = NULL, *contents = NULL, *expected = NULL;
  PlWorkOrderOptions opts;
  gsize len = 0;
  guint n;

  ck_assert_msg (r.status == 0, "%s", r.err);
  cli_run_clear (&r);
  pl_work_order_options_init (&opts);
  pl_paper_get_size (PL_PAPER_A4, pl_orientation_resolve (PL_ORIENTATION_AUTO, PL_PAPER_A4,
                                                          doc), &opts.width_mm, &opts.height_mm);
  wo = pl_work_order_new (doc, results, &opts);
  n = pl_work_order_get_n_sheets (wo);
  last = pl_work_order_sheet_filename (svg, n - 1);
  extra = pl_work_order_sheet_filename (svg, n);
  ck_assert (g_file_get_contents (last, &contents, &len, NULL));
  ck_assert (g_file_set_contents (extra, contents, (gssize) len, NULL));
  r = spawn_cli_argv (args);
  ck_assert_msg (r.status == 0, "%s", r.err);
  expected = g_strdup_printf ("Removed %s, a sheet left from an earlier export with more "
                              "sheets.", extra);
  ck_assert_msg (r.out != NULL && strstr (r.out, expected) != NULL, "out: %s", r.out);
  ck_assert (!g_file_test (extra, G_FILE_TEST_EXISTS));
  ck_assert (g_file_test (last, G_FILE_TEST_EXISTS));
  cli_run_clear (&r);
}
END_TEST

/* --- long tables and missing figures --- */

/* Sixty extra hoses make the parts list run over a sheet: the rest comes
 * on the next under the repeated heading and header, every tag once. */
START_TEST (test_table_continues)
{
  PlDocument *doc = NULL;
  g_autoptr (PlResults) results = NULL;
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autoptr (GString) all = g_string_new (NULL);
  PlWorkOrderOptions opts;
  guint continued = 0;

  /* The demo's own results are of no use once the hoses are added. */
  results = demo_results (&doc);
  g_clear_pointer (&results, pl_results_unref);
  for (guint i = 0; i < 60; i++)
    {
      g_autoptr (PlCommand) add = pl_command_new_add_part ("hose", NULL, 400.0 + 70.0 * i,
                                                           400.0);

      ck_assert (pl_command_apply (add, doc, NULL));
    }
  results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
  pl_work_order_options_init (&opts);
  wo = pl_work_order_new (doc, results, &opts);
  ck_assert_uint_ge (pl_work_order_get_n_sheets (wo), 4);
  for (guint s = 1; s < pl_work_order_get_n_sheets (wo); s++)
    {
      g_autofree char *text = pl_work_order_get_sheet_text (wo, s);

      if (strstr (text, "Parts list (continued)") != NULL)
        {
          continued++;
          ck_assert_ptr_nonnull (strstr (text, "Tag | Part | Sizes and settings"));
        }
      g_string_append (all, text);
    }
  ck_assert_uint_ge (continued, 1);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      g_autofree char *row = g_strdup_printf ("\n%s | ",
                                              pl_part_get_tag (pl_document_get_part (doc, i)));
      const char *first = strstr (all->str, row);

      ck_assert_msg (first != NULL, "%s is not in the parts list", row + 1);
      /* Parts come once in the parts list; gauges and applicators once more
       * in their own tables. */
      if (pl_part_get_part_type (pl_document_get_part (doc, i))->kind == PL_PART_HOSE)
        ck_assert_ptr_null (strstr (first + 1, row));
    }
  g_object_unref (doc);
}
END_TEST

/* Fast results only (the cycle has not run): the sheet says so where the
 * readings while firing would be, and prints no number there. */
START_TEST (test_cycle_missing)
{
  g_autofree char *path = sample_path ("demo-glue-line.pline");
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, NULL);
  PlCompiled *compiled = pl_compile (doc);
  g_autoptr (PlResults) fast = pl_results_solve_fast (compiled);
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autofree char *text = NULL;
  PlWorkOrderOptions opts;

  pl_compiled_unref (compiled);
  pl_work_order_options_init (&opts);
  wo = pl_work_order_new (doc, fast, &opts);
  text = pl_work_order_get_sheet_text (wo, 1);
  /* G1: fitted at T1's branch, 400 bar full scale, idle known (pl-work-order-gauges.c). */
  ck_assert_msg (strstr (text, "G1 | T1 Branch | 400 bar | 176.8 bar | not solved yet | "
                               "not solved yet | not solved yet") != NULL, "%s", text);
  ck_assert_ptr_nonnull (strstr (text, "The firing cycle was not solved"));
  g_free (text);
  text = pl_work_order_get_sheet_text (wo, 0);
  ck_assert_ptr_nonnull (strstr (text, "The firing cycle was not solved, so no figure while "
                                       "firing is shown."));
}
END_TEST

/* A layout with no gauges gets suggested ones: at the pump's outlet and
 * at the inlet of the applicator lowest while firing (N4 on the starved
 * line, the far end), each with the solver's readings there, and a full
 * scale of the smallest standard range the design check accepts: 70 bar
 * (the highest reading) x 1.5 (the scenario's gauge factor) = 105 bar ->
 * 160 bar in the 1, 1.6, 2.5, 4, 6 series of EN 837-1 (from memory). */
START_TEST (test_suggested_gauges)
{
  static const struct { const char *part, *port, *place; } points[] = {
    { "P1", "out", "P1 Outlet" }, { "N4", "in", "N4 Inlet" },
  };
  g_autofree char *path = sample_path ("carton-sealer-starved.pline");
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, NULL);
  g_autoptr (PlResults) results = pl_solve_scheduler_solve_sync (doc, NULL, NULL);
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autofree char *text = NULL;
  PlWorkOrderOptions opts;

  ck_assert_ptr_nonnull (results);
  ck_assert_ptr_nonnull (pl_results_get_cycle (results));
  pl_work_order_options_init (&opts);
  wo = pl_work_order_new (doc, results, &opts);
  text = pl_work_order_get_sheet_text (wo, 1);
  for (guint i = 0; i < G_N_ELEMENTS (points); i++)
    {
      const PlPart *part = pl_document_find_part_by_tag (doc, points[i].part);
      double idle, low;
      g_autofree char *idle_text = NULL, *low_text = NULL, *row = NULL;

      ck_assert_ptr_nonnull (part);
      ck_assert (pl_results_get_port_pressure (results, pl_part_get_id (part), points[i].port,
                                               PL_PRESSURE_IDLE, &idle));
      ck_assert (pl_results_get_port_pressure (results, pl_part_get_id (part), points[i].port,
                                               PL_PRESSURE_CYCLE_MIN, &low));
      idle_text = pl_unit_format (idle, PL_QUANTITY_PRESSURE, NULL, 4,
                                  PL_UNIT_DECIMAL_FROM_LOCALE);
      low_text = pl_unit_format (low, PL_QUANTITY_PRESSURE, NULL, 4,
                                 PL_UNIT_DECIMAL_FROM_LOCALE);
      row = g_strdup_printf ("new | %s | 160 bar | %s | %s |", points[i].place, idle_text,
                             low_text);
      ck_assert_msg (strstr (text, row) != NULL, "no row “%s” in:\n%s", row, text);
    }
  /* No other applicator is suggested. */
  ck_assert_ptr_null (strstr (text, "N1 Inlet"));
  ck_assert_ptr_nonnull (strstr (text, "the new ones are suggested"));
}
END_TEST

/* --- the command line --- */

typedef struct
{
  const char *args[8];   /* after "export"; "IN" is the demo, "OUT:" a temp file */
} BadCase;

static const BadCase bad_cases[] = {
  { { "IN", NULL } },                                    /* no -o */
  { { "-o", "OUT:x.pdf", NULL } },                       /* no layout */
  { { "IN", "-o", NULL } },                              /* -o without a name */
  { { "IN", "-o", "OUT:x.txt", NULL } },                 /* unknown extension */
  { { "IN", "-o", "OUT:x.pdf", "--paper", "b5", NULL } },
  { { "IN", "-o", "OUT:x.pdf", "--orientation", "sideways", NULL } },
  { { "IN", "-o", "OUT:x.png", "--dpi", "10", NULL } },
  { { "IN", "-o", "OUT:x.png", "--dpi", "150dpi", NULL } },
  { { "IN", "-o", "OUT:x.pdf", "--dpi", "150", NULL } }, /* dpi is for PNG */
  { { "IN", "-o", "OUT:x.pdf", "--units", "metric", NULL } },
  { { "IN", "-o", "OUT:x.pdf", "--colour", NULL } },
  { { "IN", "IN", "-o", "OUT:x.pdf", NULL } },
  { { "no-such-layout.pline", "-o", "OUT:x.pdf", NULL } },
  { { "IN", "-o", "/no-such-directory/x.pdf", NULL } },
};

START_TEST (test_bad_arguments)
{
  const BadCase *c = &bad_cases[_i];
  g_autofree char *demo = sample_path ("demo-glue-line.pline");
  g_autoptr (GPtrArray) args = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GPtrArray) outputs = g_ptr_array_new_with_free_func (g_free);
  CliRun r;

  g_ptr_array_add (args, g_strdup ("export"));
  for (guint i = 0; c->args[i] != NULL; i++)
    {
      const char *a = c->args[i];

      if (g_str_equal (a, "IN"))
        g_ptr_array_add (args, g_strdup (demo));
      else if (g_str_has_prefix (a, "OUT:"))
        {
          g_ptr_array_add (args, pl_tmpdir_path (a + 4));
          g_ptr_array_add (outputs, pl_tmpdir_path (a + 4));
        }
      else
        g_ptr_array_add (args, g_strdup (a));
    }
  g_ptr_array_add (args, NULL);
  r = spawn_cli_argv ((const char *const *) args->pdata);
  ck_assert_msg (r.status == 2, "case %d: exit %d", _i, r.status);
  ck_assert_msg (r.err != NULL && strlen (r.err) > 10, "case %d: no message", _i);
  ck_assert_msg (strstr (r.err, "export") != NULL || strstr (r.err, "pressline-cli") != NULL,
                 "case %d: the message “%s” names nothing", _i, r.err);
  for (guint i = 0; i < outputs->len; i++)
    ck_assert_msg (!g_file_test (g_ptr_array_index (outputs, i), G_FILE_TEST_EXISTS),
                   "case %d left a file", _i);
  cli_run_clear (&r);
}
END_TEST

/* A refused export (a resolution out of range) leaves the file that was
 * there as it was. */
START_TEST (test_failed_write_keeps_old_file)
{
  PlDocument *doc = NULL;
  g_autoptr (PlResults) results = demo_results (&doc);
  g_autofree char *png = pl_tmpdir_path ("keep.png");
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autoptr (GError) error = NULL;
  g_autofree char *after = NULL;
  PlWorkOrderOptions opts;

  ck_assert (g_file_set_contents (png, "old", -1, NULL));
  pl_work_order_options_init (&opts);
  wo = pl_work_order_new (doc, results, &opts);
  ck_assert (!pl_work_order_write (wo, PL_WORK_ORDER_PNG, 5000.0, png, &error));
  ck_assert (g_file_get_contents (png, &after, NULL, NULL));
  ck_assert_str_eq (after, "old");
  g_object_unref (doc);
}
END_TEST

static Suite *
work_order_suite (void)
{
  Suite *s = suite_create ("work-order");
  TCase *tf = tcase_create ("files");
  TCase *tp = tcase_create ("papers");
  TCase *tc = tcase_create ("command line");

  tcase_add_checked_fixture (tf, pl_tmpdir_setup, pl_tmpdir_teardown);
  tcase_set_timeout (tf, 120);
  tcase_add_loop_test (tf, test_pdf_text, 0, G_N_ELEMENTS (layouts));
  tcase_add_loop_test (tf, test_svg_sheets, 0, G_N_ELEMENTS (layouts));
  tcase_add_test (tf, test_table_continues);
  tcase_add_test (tf, test_cycle_missing);
  tcase_add_test (tf, test_suggested_gauges);
  suite_add_tcase (s, tf);

  tcase_add_checked_fixture (tp, pl_tmpdir_setup, pl_tmpdir_teardown);
  tcase_set_timeout (tp, 120);
  tcase_add_loop_test (tp, test_png_size, 0, G_N_ELEMENTS (pngs));
  tcase_add_loop_test (tp, test_pdf_papers, 0, PL_N_PAPERS * PL_N_ORIENTATIONS);
  tcase_add_test (tp, test_failed_write_keeps_old_file);
  tcase_add_test (tp, test_auto_orientation);
  tcase_add_loop_test (tp, test_stale_sheets_removed, 0, G_N_ELEMENTS (stale_formats));
  tcase_add_test (tp, test_generator_marks);
  tcase_add_test (tp, test_cli_reports_removed_sheets);
  suite_add_tcase (s, tp);

  tcase_add_checked_fixture (tc, pl_tmpdir_setup, pl_tmpdir_teardown);
  tcase_set_timeout (tc, 120);
  tcase_add_loop_test (tc, test_bad_arguments, 0, G_N_ELEMENTS (bad_cases));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (work_order_suite ());
}
