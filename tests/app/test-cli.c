/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include <glib.h>
#include <stdio.h>

#include "pl-check.h"

#include "pl-cli.h"

/* Runs pressline-cli's entry point with the given arguments and returns its
 * exit code; what it prints goes to the test log. */
static int
run_cli (const char *const *args)
{
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  int code;

  g_ptr_array_add (argv, (char *) "pressline-cli");
  for (const char *const *a = args; *a != NULL; a++)
    g_ptr_array_add (argv, (char *) *a);
  g_ptr_array_add (argv, NULL);

  code = pl_cli_run ((int) argv->len - 1, (char **) argv->pdata);
  fflush (stdout);
  return code;
}

typedef struct
{
  const char *args[4];
  int expected_exit;
} CliCase;

/* Exit codes as documented in pl-cli.c: 0 success, 2 unusable command line. */
static const CliCase cli_cases[] = {
  { { "--version", NULL }, 0 },
  { { "-V", NULL }, 0 },
  { { "--help", NULL }, 0 },
  { { NULL }, 2 },
  { { "no-such-command", NULL }, 2 },
  { { "--no-such-option", NULL }, 2 },
};

START_TEST (test_cli_exit_codes)
{
  const CliCase *c = &cli_cases[_i];

  ck_assert_int_eq (run_cli (c->args), c->expected_exit);
}
END_TEST

START_TEST (test_cli_version_text)
{
  g_autofree char *out = NULL;
  g_autofree char *err = NULL;
  g_autoptr (GError) error = NULL;
  g_autofree char *cli = g_build_filename (g_getenv ("PRESSLINE_BUILD_ROOT"), "app",
                                           "pressline-cli", NULL);
  const char *argv[] = { cli, "--version", NULL };
  int wait_status = 0;

  ck_assert_msg (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_DEFAULT, NULL, NULL,
                               &out, &err, &wait_status, &error),
                 "cannot run %s: %s", cli, error ? error->message : "");
  ck_assert (g_spawn_check_wait_status (wait_status, NULL));
  ck_assert_str_eq (out, "pressline-cli " PACKAGE_VERSION "\n");
}
END_TEST

static Suite *
cli_suite (void)
{
  Suite *s = suite_create ("cli");
  TCase *tc = tcase_create ("arguments");

  tcase_add_loop_test (tc, test_cli_exit_codes, 0, G_N_ELEMENTS (cli_cases));
  tcase_add_test (tc, test_cli_version_text);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (cli_suite ());
}
