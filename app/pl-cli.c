/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-cli.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-report.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"
#include "pl-units.h"
#include "pl-work-order.h"

/* A command of pressline-cli: its name, one line of help, and what runs it
 * (argv[0] is the command's name). */
typedef struct
{
  const char *name;
  const char *summary;
  int (*run) (int argc, char **argv);
} PlCliCommand;

static int pl_cli_solve (int argc, char **argv);
static int pl_cli_check (int argc, char **argv);
static int pl_cli_export (int argc, char **argv);

/* The one place to add a command. */
static const PlCliCommand pl_cli_commands[] = {
  { "solve", N_("Solve a layout and print every result "
                "(FILE [--format text|csv|json] [--units si|us])"), pl_cli_solve },
  { "check", N_("Check a layout; exit 1 if a finding of error severity exists (FILE)"),
    pl_cli_check },
  { "export", N_("Write the work order sheets of a layout (FILE -o OUT.pdf|OUT.svg|OUT.png "
                 "[--paper a4|letter|a3] [--orientation auto|portrait|landscape] [--dpi N] "
                 "[--units si|us]); SVG and PNG get a file per sheet, OUT-2.png and so on"),
    pl_cli_export },
  { NULL, NULL, NULL },
};

/* Reads and solves FILE (every solve, at once).  NULL with the reader's
 * message ("FILE:LINE:COLUMN: ...") printed on stderr. */
static PlResults *
pl_cli_load_and_solve (const char *filename)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_file (filename, &error);
  PlResults *results;

  if (doc == NULL)
    {
      fprintf (stderr, "pressline-cli: %s\n", error->message);
      return NULL;
    }
  results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  if (results == NULL)
    fprintf (stderr, "pressline-cli: %s: %s\n", filename, error->message);
  return results;
}

static void
pl_cli_usage_error (const char *command, const char *sentence)
{
  /* Translators: the first %s is a command ("solve"), the second a sentence
   * saying what was wrong with its arguments. */
  fprintf (stderr, _("pressline-cli %s: %s\n"), command, sentence);
}

/* Whether argv[*i] is the option name (or its short form, may be NULL),
 * given as "--name value" or "--name=value"; then *value is the value
 * (NULL when missing) and *i moves past it.  "--formats" is not
 * "--format". */
static gboolean
pl_cli_take_option (int argc, char **argv, int *i, const char *name, const char *short_name,
                    const char **value)
{
  const char *arg = argv[*i];
  size_t n = strlen (name);

  *value = NULL;
  if (short_name != NULL && g_str_equal (arg, short_name))
    {
      if (*i + 1 < argc)
        *value = argv[++*i];
      return TRUE;
    }
  if (strncmp (arg, name, n) != 0)
    return FALSE;
  if (arg[n] == '=')
    *value = arg + n + 1;
  else if (arg[n] != '\0')
    return FALSE;
  else if (*i + 1 < argc)
    *value = argv[++*i];
  return TRUE;
}

/* An argument no option took: an unknown option, the layout FILE, or one
 * FILE too many.  FALSE with the message printed when it cannot be used. */
static gboolean
pl_cli_take_file (const char *command, const char *arg, const char **filename)
{
  if (arg[0] == '-' && arg[1] != '\0')
    {
      g_autofree char *msg = g_strdup_printf (_("unknown option “%s”."), arg);

      pl_cli_usage_error (command, msg);
      return FALSE;
    }
  if (*filename != NULL)
    {
      pl_cli_usage_error (command, _("only one FILE may be given."));
      return FALSE;
    }
  *filename = arg;
  return TRUE;
}

static gboolean
pl_cli_have_file (const char *command, const char *filename)
{
  if (filename == NULL)
    pl_cli_usage_error (command, _("a layout FILE is needed."));
  return filename != NULL;
}

/* solve FILE [--format text|csv|json] [--units si|us]; options may come
 * before or after FILE, as "--format json" or "--format=json".
 * Exit 0 when the report was written (findings of any severity are in the
 * report), 2 when the arguments or the file cannot be used. */
static int
pl_cli_solve (int argc, char **argv)
{
  const char *filename = NULL;
  PlReportFormat format = PL_REPORT_TEXT;
  PlUnitPrefs prefs;
  g_autoptr (PlResults) results = NULL;
  g_autofree char *report = NULL;

  pl_unit_prefs_init (&prefs, PL_UNIT_SYSTEM_SI);
  for (int i = 1; i < argc; i++)
    {
      const char *arg = argv[i], *value = NULL;
      gboolean is_format = pl_cli_take_option (argc, argv, &i, "--format", NULL, &value);
      gboolean is_units = !is_format
                          && pl_cli_take_option (argc, argv, &i, "--units", NULL, &value);

      if (is_format)
        {
          format = pl_report_format_from_key (value);
          if (format == PL_N_REPORT_FORMATS)
            {
              pl_cli_usage_error (argv[0], _("--format takes text, csv or json."));
              return 2;
            }
        }
      else if (is_units)
        {
          PlUnitSystem system = pl_unit_system_from_key (value);

          if (system == PL_N_UNIT_SYSTEMS)
            {
              pl_cli_usage_error (argv[0], _("--units takes si or us."));
              return 2;
            }
          pl_unit_prefs_init (&prefs, system);
        }
      else if (!pl_cli_take_file (argv[0], arg, &filename))
        return 2;
    }
  if (!pl_cli_have_file (argv[0], filename))
    return 2;

  results = pl_cli_load_and_solve (filename);
  if (results == NULL)
    return 2;
  report = pl_report_write (results, format, &prefs, filename);
  fputs (report, stdout);
  return fflush (stdout) == 0 ? 0 : 2;
}

/* check FILE: the schema (on load) and every design check.  Exit 0 when no
 * finding is of error severity, 1 when one is, 2 when the file cannot be
 * read.  Findings go to stdout, one a line: "FILE: severity: code: TAG:
 * message"; a clean layout prints nothing. */
static int
pl_cli_check (int argc, char **argv)
{
  g_autoptr (PlResults) results = NULL;
  PlCompiled *compiled;

  if (argc != 2 || (argv[1][0] == '-' && argv[1][1] != '\0'))
    {
      pl_cli_usage_error (argv[0], _("exactly one layout FILE is needed."));
      return 2;
    }
  results = pl_cli_load_and_solve (argv[1]);
  if (results == NULL)
    return 2;
  compiled = pl_results_get_compiled (results);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      const PlCompiledPart *p = pl_compiled_find_part (compiled, f->part_id);

      printf ("%s: %s: %s: %s%s%s\n", argv[1], pl_severity_get_key (f->severity), f->code,
              p != NULL ? p->tag : "", p != NULL ? ": " : "", f->message);
    }
  fflush (stdout);
  return pl_results_count_findings (results, PLS_SEVERITY_ERROR) > 0 ? 1 : 0;
}

/* export FILE -o OUT [--paper a4|letter|a3] [--orientation auto|portrait|landscape]
 * [--dpi N] [--units si|us]: the work order, its format from OUT's
 * extension.  Every solve runs first (the cycle too), so the sheets can
 * give the readings while firing.  Exit 0 when written, 2 when the
 * arguments, the layout or the output cannot be used (nothing is left
 * half written). */
static int
pl_cli_export (int argc, char **argv)
{
  const char *filename = NULL, *output = NULL;
  PlPaper paper = PL_PAPER_A4;
  PlOrientation orientation = PL_ORIENTATION_AUTO;
  PlWorkOrderFormat format;
  PlWorkOrderOptions opts;
  double dpi = PL_WORK_ORDER_DEFAULT_DPI;
  gboolean dpi_given = FALSE;
  g_autoptr (PlDocument) doc = NULL;
  g_autoptr (PlResults) results = NULL;
  g_autoptr (PlWorkOrder) wo = NULL;
  g_autoptr (GPtrArray) removed = NULL;
  g_autoptr (GError) error = NULL;

  pl_work_order_options_init (&opts);
  for (int i = 1; i < argc; i++)
    {
      const char *arg = argv[i], *value = NULL;

      if (pl_cli_take_option (argc, argv, &i, "--output", "-o", &value))
        {
          if (value == NULL || *value == '\0')
            {
              pl_cli_usage_error (argv[0], _("-o needs the name of the file to write."));
              return 2;
            }
          output = value;
        }
      else if (pl_cli_take_option (argc, argv, &i, "--paper", NULL, &value))
        {
          paper = pl_paper_from_key (value);
          if (paper == PL_N_PAPERS)
            {
              pl_cli_usage_error (argv[0], _("--paper takes a4, letter or a3."));
              return 2;
            }
        }
      else if (pl_cli_take_option (argc, argv, &i, "--orientation", NULL, &value))
        {
          orientation = pl_orientation_from_key (value);
          if (orientation == PL_N_ORIENTATIONS)
            {
              pl_cli_usage_error (argv[0], _("--orientation takes auto, portrait or landscape."));
              return 2;
            }
        }
      else if (pl_cli_take_option (argc, argv, &i, "--dpi", NULL, &value))
        {
          char *end = NULL;

          dpi = value != NULL ? g_ascii_strtod (value, &end) : NAN;
          if (value == NULL || end == value || *end != '\0'
              || !(dpi >= PL_WORK_ORDER_MIN_DPI && dpi <= PL_WORK_ORDER_MAX_DPI))
            {
              g_autofree char *msg = g_strdup_printf (_("--dpi takes a number from %.0f to "
                                                        "%.0f."), PL_WORK_ORDER_MIN_DPI,
                                                      PL_WORK_ORDER_MAX_DPI);

              pl_cli_usage_error (argv[0], msg);
              return 2;
            }
          dpi_given = TRUE;
        }
      else if (pl_cli_take_option (argc, argv, &i, "--units", NULL, &value))
        {
          PlUnitSystem system = pl_unit_system_from_key (value);

          if (system == PL_N_UNIT_SYSTEMS)
            {
              pl_cli_usage_error (argv[0], _("--units takes si or us."));
              return 2;
            }
          pl_unit_prefs_init (&opts.units, system);
        }
      else if (!pl_cli_take_file (argv[0], arg, &filename))
        return 2;
    }
  if (!pl_cli_have_file (argv[0], filename))
    return 2;
  if (output == NULL)
    {
      pl_cli_usage_error (argv[0], _("-o OUT.pdf, OUT.svg or OUT.png is needed."));
      return 2;
    }
  format = pl_work_order_format_from_filename (output);
  if (format == PL_N_WORK_ORDER_FORMATS)
    {
      pl_cli_usage_error (argv[0], _("the output's name must end in .pdf, .svg or .png."));
      return 2;
    }
  if (dpi_given && format != PL_WORK_ORDER_PNG)
    {
      pl_cli_usage_error (argv[0], _("--dpi is only for PNG output."));
      return 2;
    }

  doc = pl_layout_read_file (filename, &error);
  if (doc == NULL)
    {
      fprintf (stderr, "pressline-cli: %s\n", error->message);
      return 2;
    }
  results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  if (results == NULL)
    {
      fprintf (stderr, "pressline-cli: %s: %s\n", filename, error->message);
      return 2;
    }
  pl_paper_get_size (paper, pl_orientation_resolve (orientation, paper, doc), &opts.width_mm,
                     &opts.height_mm);
  opts.file_name = filename;
  wo = pl_work_order_new (doc, results, &opts);
  removed = g_ptr_array_new_with_free_func (g_free);
  if (!pl_work_order_write_full (wo, format, dpi, output, removed, &error))
    {
      fprintf (stderr, "pressline-cli: %s\n", error->message);
      return 2;
    }
  for (guint i = 0; i < removed->len; i++)
    /* Translators: %s is a file name. */
    printf (_("Removed %s, a sheet left from an earlier export with more sheets.\n"),
            (const char *) g_ptr_array_index (removed, i));
  return 0;
}

static void
pl_cli_print_usage (FILE *stream)
{
  fprintf (stream, "%s\n", _("Usage: pressline-cli [--version] [--help] COMMAND [ARGUMENTS…]"));
  fprintf (stream, "\n%s\n", _("Commands:"));
  for (const PlCliCommand *c = pl_cli_commands; c->name != NULL; c++)
    fprintf (stream, "  %-10s %s\n", c->name, _(c->summary));
}

static const PlCliCommand *
pl_cli_find_command (const char *name)
{
  for (const PlCliCommand *c = pl_cli_commands; c->name != NULL; c++)
    if (g_str_equal (c->name, name))
      return c;
  return NULL;
}

/* Exit codes: 0 success, 1 the work found errors (a command's own meaning),
 * 2 the command line or a file could not be used. */
int
pl_cli_run (int argc, char **argv)
{
  const PlCliCommand *command;

  setlocale (LC_ALL, "");
  bindtextdomain (GETTEXT_PACKAGE, LOCALEDIR);
  bind_textdomain_codeset (GETTEXT_PACKAGE, "UTF-8");
  textdomain (GETTEXT_PACKAGE);

  if (argc < 2)
    {
      pl_cli_print_usage (stderr);
      return 2;
    }
  if (g_str_equal (argv[1], "--version") || g_str_equal (argv[1], "-V"))
    {
      printf ("pressline-cli %s\n", PACKAGE_VERSION);
      return 0;
    }
  if (g_str_equal (argv[1], "--help") || g_str_equal (argv[1], "-h"))
    {
      pl_cli_print_usage (stdout);
      return 0;
    }

  command = pl_cli_find_command (argv[1]);
  if (command == NULL)
    {
      /* Translators: %s is what the user typed as the command. */
      fprintf (stderr, _("pressline-cli: unknown command “%s”; "
                         "“pressline-cli --help” lists the commands.\n"), argv[1]);
      return 2;
    }
  return command->run (argc - 1, argv + 1);
}
