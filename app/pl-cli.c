/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-cli.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <stdio.h>

/* A command of pressline-cli: its name, one line of help, and what runs it
 * (argv[0] is the command's name). */
typedef struct
{
  const char *name;
  const char *summary;
  int (*run) (int argc, char **argv);
} PlCliCommand;

/* Commands arrive with the document model and the solver; the table is the
 * one place to add them. */
static const PlCliCommand pl_cli_commands[] = {
  { NULL, NULL, NULL },
};

static void
pl_cli_print_usage (FILE *stream)
{
  fprintf (stream, "%s\n", _("Usage: pressline-cli [--version] [--help] COMMAND [ARGUMENTS…]"));
  fprintf (stream, "\n%s\n", _("Commands:"));
  for (const PlCliCommand *c = pl_cli_commands; c->name != NULL; c++)
    fprintf (stream, "  %-10s %s\n", c->name, _(c->summary));
  if (pl_cli_commands[0].name == NULL)
    fprintf (stream, "  %s\n", _("(none in this version)"));
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
