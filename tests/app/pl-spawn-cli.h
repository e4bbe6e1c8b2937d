/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-spawn-cli.h: running the built pressline-cli from a test, and where
 * the samples are.  Header-only, tests only; needs check.h and glib.h.
 */
#pragma once

#include <check.h>
#include <glib.h>
#include <sys/wait.h>

typedef struct
{
  int status;          /* exit code */
  char *out;
  char *err;
} CliRun;

static inline void
cli_run_clear (CliRun *r)
{
  g_free (r->out);
  g_free (r->err);
}

/* Runs build/app/pressline-cli with the NULL-ended arguments (at most 14). */
static inline CliRun
spawn_cli_argv (const char *const *args)
{
  g_autofree char *cli = g_build_filename (g_getenv ("PRESSLINE_BUILD_ROOT"), "app",
                                           "pressline-cli", NULL);
  const char *argv[16] = { cli };
  g_autoptr (GError) error = NULL;
  CliRun r = { 0 };
  int wait_status = 0;

  for (guint i = 0; args[i] != NULL && i < 14; i++)
    argv[i + 1] = args[i];
  ck_assert_msg (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_DEFAULT, NULL, NULL,
                               &r.out, &r.err, &wait_status, &error),
                 "cannot run %s: %s", cli, error ? error->message : "");
  ck_assert_msg (WIFEXITED (wait_status), "pressline-cli did not exit normally (crash?)");
  r.status = WEXITSTATUS (wait_status);
  return r;
}

/* The same with up to five arguments (the rest NULL). */
static inline CliRun
spawn_cli (const char *a0, const char *a1, const char *a2, const char *a3, const char *a4)
{
  const char *args[] = { a0, a1, a2, a3, a4, NULL };

  return spawn_cli_argv (args);
}

static inline char *
sample_path (const char *name)
{
  return g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "samples", name, NULL);
}

