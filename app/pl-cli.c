/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-cli.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <stdio.h>

#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-report.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"
#include "pl-units.h"

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

/* The one place to add a command. */
static const PlCliCommand pl_cli_commands[] = {
  { "solve", N_("Solve a layout and print every result "
                "(FILE [--format text|csv|json] [--units si|us])"), pl_cli_solve },
  { "check", N_("Check a layout; exit 1 if a finding of error severity exists (FILE)"),
    pl_cli_check },
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
      gboolean is_format = g_str_has_prefix (arg, "--format");
      gboolean is_units = g_str_has_prefix (arg, "--units");

      if (is_format || is_units)
        {
          const char *rest = arg + (is_format ? 8 : 7);

          if (*rest == '=')
            value = rest + 1;
          else if (*rest == '\0' && i + 1 < argc)
            value = argv[++i];
          else if (*rest != '\0')
            is_format = is_units = FALSE;   /* "--formats": an unknown option */
        }
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
      else if (arg[0] == '-' && arg[1] != '\0')
        {
          g_autofree char *msg = g_strdup_printf (_("unknown option “%s”."), arg);

          pl_cli_usage_error (argv[0], msg);
          return 2;
        }
      else if (filename == NULL)
        filename = arg;
      else
        {
          pl_cli_usage_error (argv[0], _("only one FILE may be given."));
          return 2;
        }
    }
  if (filename == NULL)
    {
      pl_cli_usage_error (argv[0], _("a layout FILE is needed."));
      return 2;
    }

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
