/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include <glib.h>
#include <glib/gstdio.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pl-check.h"
#include "pl-json-parse.h"
#include "pl-spawn-cli.h"

#include "pl-cli.h"
#include "pl-compile.h"
#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-part-type.h"
#include "pl-results.h"
#include "pl-solve-scheduler.h"

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

/* --- the built program on the samples --- */

typedef struct
{
  const char *sample;
  int check_exit;       /* what `check` must return */
  gboolean has_error;   /* a finding of error severity */
} SampleCase;

/* The samples' comments say what each one shows; these are the exit codes
 * that follow from it (pl-cli.c: check exits 1 on an error finding). */
static const SampleCase samples[] = {
  { "demo-glue-line.pline", 0, FALSE },
  { "carton-sealer-starved.pline", 1, TRUE },
  { "carton-sealer-retrofit.pline", 0, FALSE },
};

START_TEST (test_cli_check_samples)
{
  const SampleCase *c = &samples[_i];
  g_autofree char *path = sample_path (c->sample);
  CliRun r = spawn_cli ("check", path, NULL, NULL, NULL);

  ck_assert_msg (r.status == c->check_exit, "check %s: exit %d, stdout: %s stderr: %s",
                 c->sample, r.status, r.out, r.err);
  /* An error finding is printed as "FILE: error: code: TAG: message". */
  ck_assert_int_eq (strstr (r.out, ": error: ") != NULL, c->has_error);
  if (c->has_error)
    ck_assert_ptr_nonnull (strstr (r.out, "pump-stall-short"));
  cli_run_clear (&r);
}
END_TEST

static void
assert_number_or_null (const TjValue *v, const char *what)
{
  ck_assert_msg (v != NULL, "%s is missing", what);
  ck_assert_msg (v->kind == TJ_NUMBER || v->kind == TJ_NULL, "%s is neither a number nor null",
                 what);
}

static void
assert_number (const TjValue *v, const char *what)
{
  ck_assert_msg (v != NULL && v->kind == TJ_NUMBER, "%s is not a number", what);
  ck_assert_msg (isfinite (v->number), "%s is not finite", what);
}

/* Equal to the solver's figure, as written (%.17g where %.15g would not
 * round-trip, pl-json-writer.c): the same double, bit for bit. */
static void
assert_json_equals (const TjValue *v, double expected, const char *what)
{
  assert_number (v, what);
  ck_assert_msg (v->number == expected, "%s: JSON %.17g, solver %.17g", what, v->number,
                 expected);
}

/* solve --format json on each sample: valid JSON with the documented keys
 * (app/data/report-json.md) for every part of the layout, and numbers equal
 * to what the solver gives the same document in-process. */
START_TEST (test_cli_json_samples)
{
  const SampleCase *c = &samples[_i];
  g_autofree char *path = sample_path (c->sample);
  CliRun r = spawn_cli ("solve", path, "--format", "json", NULL);
  g_autoptr (TjValue) root = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = NULL;
  g_autoptr (PlResults) res = NULL;
  const TjValue *parts, *findings, *v;
  PlCompiled *compiled;
  guint n_errors = 0;

  ck_assert_msg (r.status == 0, "solve %s: exit %d, stderr: %s", c->sample, r.status, r.err);
  root = tj_parse (r.out);
  ck_assert_msg (root != NULL, "solve %s: the output is not valid JSON", c->sample);
  ck_assert_str_eq (tj_get (root, "format")->string, "pressline-report");
  ck_assert_double_eq (tj_get (root, "format_version")->number, 1.0);
  ck_assert_str_eq (tj_get (root, "source")->string, path);
  ck_assert_int_eq (tj_path (root, "solves", "idle", "converged", NULL)->boolean, TRUE);
  ck_assert_int_eq (tj_path (root, "solves", "steady_open", "converged", NULL)->boolean, TRUE);
  ck_assert_str_eq (tj_path (root, "solves", "cycle", "state", NULL)->string, "done");
  ck_assert_str_eq (tj_path (root, "solves", "shutdown", "state", NULL)->string, "done");
  assert_number (tj_path (root, "solves", "shutdown", "time_to_safe", NULL),
                 "shutdown time to safe");

  doc = pl_layout_read_file (path, &error);
  ck_assert_msg (doc != NULL, "%s", error ? error->message : "");
  /* The steady figures are compared with an in-process solve of the same
   * file; the cycle's only for shape (a second cycle run would double
   * the test's time for the same code path, which test-scheduler.c already
   * shows is deterministic). */
  compiled = pl_compile (doc);
  res = pl_results_solve_fast (compiled);
  pl_compiled_unref (compiled);
  compiled = pl_results_get_compiled (res);

  parts = tj_get (root, "parts");
  ck_assert_ptr_nonnull (parts);
  ck_assert_uint_eq (parts->keys->len, pl_compiled_get_n_parts (compiled));
  for (guint i = 0; i < pl_compiled_get_n_parts (compiled); i++)
    {
      const PlCompiledPart *p = pl_compiled_get_part (compiled, i);
      const TjValue *jp = tj_get (parts, p->id);
      double want;

      ck_assert_msg (jp != NULL, "part %s (%s) is missing", p->id, p->tag);
      ck_assert_str_eq (tj_get (jp, "tag")->string, p->tag);
      ck_assert_str_eq (tj_get (jp, "type")->string, p->type->key);
      for (guint k = 0; k < p->n_ports; k++)
        {
          const char *port = p->type->ports[k].key;
          const TjValue *jport = tj_path (jp, "ports", port, NULL);

          ck_assert_msg (jport != NULL, "%s: port %s is missing", p->tag, port);
          for (guint kind = 0; kind < PL_N_PRESSURES; kind++)
            {
              const char *key = pl_pressure_kind_get_key (kind);

              assert_number_or_null (tj_get (jport, key), key);
              if (pl_results_get_port_pressure (res, p->id, port, kind, &want))
                assert_json_equals (tj_get (jport, key), want, key);
            }
          assert_number_or_null (tj_get (jport, "recovery_time"), "recovery_time");
        }
      switch (p->type->kind)
        {
        case PL_PART_HOSE:
        case PL_PART_PIPE:
          {
            pls_line_result l;

            ck_assert (pl_results_get_line (res, p->id, PL_CASE_STEADY_OPEN, &l));
            v = tj_path (jp, "line", "steady_open", NULL);
            assert_json_equals (tj_get (v, "flow"), l.flow, "line flow");
            assert_json_equals (tj_get (v, "velocity"), l.velocity, "line velocity");
            assert_json_equals (tj_get (v, "reynolds"), l.reynolds, "line Reynolds number");
            ck_assert_str_eq (tj_get (v, "regime")->string, "laminar");
            break;
          }
        case PL_PART_PUMP:
          {
            pls_pump_result pr;

            ck_assert (pl_results_get_pump (res, p->id, PL_CASE_STEADY_OPEN, &pr));
            v = tj_path (jp, "pump", "steady_open", NULL);
            assert_json_equals (tj_get (v, "flow"), pr.flow, "pump flow");
            assert_json_equals (tj_get (v, "outlet_pressure"), pr.outlet_pressure,
                                "pump pressure");
            assert_json_equals (tj_get (v, "stall_pressure"), pr.stall_pressure, "stall");
            assert_number (tj_path (jp, "pump", "cycle", "mean_flow", NULL), "pump mean flow");
            break;
          }
        case PL_PART_APPLICATOR:
          {
            ck_assert (pl_results_get_flow (res, p->id, 0, PL_CASE_STEADY_OPEN, &want));
            assert_json_equals (tj_path (jp, "flow", "steady_open", NULL), want, "nozzle flow");
            assert_number (tj_path (jp, "shot", "mass", NULL), "shot mass");
            assert_number (tj_path (jp, "shot", "deviation", NULL), "shot deviation");
            ck_assert_double_gt (tj_path (jp, "shot", "mass", NULL)->number, 0.0);
            /* A loose bound that catches a unit slip of 1000: one shot is
             * less than 1200 kg/m^3 (above every sample's density) times
             * the steady-open flow times 0.15 s, over three times the
             * longest on-time plus ramps of the samples (43 ms); a shot
             * starts from the idle pressure, so it can pass more than the
             * steady-open flow, but not three times more. */
            ck_assert_double_lt (tj_path (jp, "shot", "mass", NULL)->number,
                                 1200.0 * 0.05 * 3.0 * want);
            break;
          }
        case PL_PART_ACCUMULATOR:
          {
            pls_accumulator_result a;

            ck_assert (pl_results_get_accumulator (res, p->id, PL_CASE_IDLE, &a));
            assert_json_equals (tj_path (jp, "accumulator", "idle", "fluid_volume", NULL),
                                a.fluid_volume, "stored volume");
            v = tj_path (jp, "accumulator", "swing", NULL);
            assert_number (tj_get (v, "min_pressure"), "swing min");
            assert_number (tj_get (v, "max_pressure"), "swing max");
            ck_assert_double_le (tj_get (v, "min_pressure")->number,
                                 tj_get (v, "max_pressure")->number);
            break;
          }
        case PL_PART_TEE:
          for (guint k = 0; k < 3; k++)
            {
              static const char *const legs[3] = { "a", "b", "branch" };
              ck_assert (pl_results_get_flow (res, p->id, k, PL_CASE_STEADY_OPEN, &want));
              assert_json_equals (tj_path (jp, "legs", legs[k], "steady_open", NULL), want,
                                  "tee leg flow");
            }
          break;
        default:
          break;
        }
    }

  findings = tj_get (root, "findings");
  ck_assert (findings != NULL && findings->kind == TJ_ARRAY);
  /* The steady findings come first, in the same order (pl-results.h). */
  ck_assert_uint_ge (findings->items->len, pl_results_get_n_findings (res));
  for (guint i = 0; i < findings->items->len; i++)
    {
      const TjValue *f = g_ptr_array_index (findings->items, i);
      const char *sev = tj_get (f, "severity")->string;

      ck_assert (g_str_equal (sev, "info") || g_str_equal (sev, "warning")
                 || g_str_equal (sev, "error"));
      n_errors += g_str_equal (sev, "error");
      if (i < pl_results_get_n_findings (res))
        ck_assert_str_eq (tj_get (f, "code")->string, pl_results_get_finding (res, i)->code);
      ck_assert_ptr_nonnull (tj_get (f, "part"));
      ck_assert_ptr_nonnull (tj_get (f, "tag"));
      ck_assert_int_eq (tj_get (f, "message")->kind, TJ_STRING);
    }
  ck_assert_int_eq (n_errors > 0, c->has_error);
  ck_assert_int_eq (pl_results_count_findings (res, PLS_SEVERITY_ERROR) > 0, c->has_error);
  cli_run_clear (&r);
}
END_TEST

/* Bad command lines and unreadable files: exit 2, a message on stderr
 * naming the file (and its line for a broken file), never a crash. */
START_TEST (test_cli_unusable_input)
{
  g_autofree char *dir = g_dir_make_tmp ("pressline-cli-XXXXXX", NULL);
  g_autofree char *broken = g_build_filename (dir, "broken.pline", NULL);
  g_autofree char *missing = g_build_filename (dir, "missing.pline", NULL);
  g_autofree char *demo = sample_path ("carton-sealer-retrofit.pline");
  CliRun r;

  ck_assert (g_file_set_contents (broken,
                                  "<?xml version=\"1.0\"?>\n"
                                  "<layout xmlns=\"https://pressline.org/ns/layout\"\n"
                                  "  version=\"1\" drawing-unit=\"mm\">\n"
                                  "  <parts><part id=\"p1\"</parts>\n", -1, NULL));

  r = spawn_cli ("check", broken, NULL, NULL, NULL);
  ck_assert_int_eq (r.status, 2);
  ck_assert_msg (strstr (r.err, broken) != NULL, "stderr names the file: %s", r.err);
  ck_assert_msg (strstr (r.err, "broken.pline:4") != NULL, "stderr names the line: %s", r.err);
  cli_run_clear (&r);

  r = spawn_cli ("solve", broken, "--format", "json", NULL);
  ck_assert_int_eq (r.status, 2);
  ck_assert_str_eq (r.out, "");
  cli_run_clear (&r);

  r = spawn_cli ("check", missing, NULL, NULL, NULL);
  ck_assert_int_eq (r.status, 2);
  ck_assert_ptr_nonnull (strstr (r.err, "missing.pline"));
  cli_run_clear (&r);

  /* A directory is no layout either. */
  r = spawn_cli ("solve", dir, NULL, NULL, NULL);
  ck_assert_int_eq (r.status, 2);
  cli_run_clear (&r);

  {
    /* Arguments: each is refused before any file is read. */
    const char *const bad[][4] = {
      { "solve", NULL, NULL, NULL },
      { "solve", demo, "--format", "xml" },
      { "solve", demo, "--units", "imperial" },
      { "solve", demo, "--format", NULL },
      { "solve", demo, demo, NULL },
      { "solve", demo, "--frobnicate", NULL },
      { "check", NULL, NULL, NULL },
      { "check", demo, demo, NULL },
    };
    for (guint i = 0; i < G_N_ELEMENTS (bad); i++)
      {
        r = spawn_cli (bad[i][0], bad[i][1], bad[i][2], bad[i][3], NULL);
        ck_assert_msg (r.status == 2, "case %u: exit %d", i, r.status);
        ck_assert_msg (r.err[0] != '\0', "case %u: nothing on stderr", i);
        cli_run_clear (&r);
      }
  }

  g_unlink (broken);
  g_rmdir (dir);
}
END_TEST

/* Every malformed layout of the reader's fixtures (tests/data/layouts/bad):
 * exit 2 from both commands, a message on stderr, never a crash. */
START_TEST (test_cli_bad_fixtures)
{
  g_autofree char *dir_path = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "tests",
                                                "data", "layouts", "bad", NULL);
  g_autoptr (GDir) dir = g_dir_open (dir_path, 0, NULL);
  const char *name;
  guint n = 0;

  ck_assert_msg (dir != NULL, "no fixtures in %s", dir_path);
  while ((name = g_dir_read_name (dir)) != NULL)
    {
      g_autofree char *path = g_build_filename (dir_path, name, NULL);
      CliRun r = spawn_cli ("check", path, NULL, NULL, NULL);

      ck_assert_msg (r.status == 2, "check %s: exit %d", name, r.status);
      ck_assert_msg (strstr (r.err, name) != NULL, "check %s: stderr does not name it: %s",
                     name, r.err);
      cli_run_clear (&r);
      r = spawn_cli ("solve", path, "--format", "json", NULL);
      ck_assert_msg (r.status == 2, "solve %s: exit %d", name, r.status);
      ck_assert_str_eq (r.out, "");
      cli_run_clear (&r);
      n++;
    }
  ck_assert_uint_gt (n, 0);
}
END_TEST

/* Text and CSV in both unit systems: exit 0 and the shape each promises. */
START_TEST (test_cli_text_and_csv)
{
  g_autofree char *path = sample_path ("carton-sealer-starved.pline");
  CliRun r = spawn_cli ("solve", path, "--units", "us", NULL);
  g_auto (GStrv) lines = NULL;

  ck_assert_int_eq (r.status, 0);
  ck_assert_ptr_nonnull (strstr (r.out, "P1"));
  ck_assert_ptr_nonnull (strstr (r.out, " psi"));
  ck_assert_ptr_null (strstr (r.out, " bar"));
  cli_run_clear (&r);

  r = spawn_cli ("solve", "--format=csv", path, NULL, NULL);
  ck_assert_int_eq (r.status, 0);
  lines = g_strsplit (r.out, "\r\n", -1);
  ck_assert_str_eq (lines[0], "part_id,tag,type,item,quantity,case,value,unit,note");
  ck_assert_ptr_nonnull (strstr (r.out, ",pressure,idle,70,bar,"));
  cli_run_clear (&r);
}
END_TEST

static Suite *
cli_suite (void)
{
  Suite *s = suite_create ("cli");
  TCase *tc = tcase_create ("arguments");
  TCase *ts = tcase_create ("samples");

  tcase_add_loop_test (tc, test_cli_exit_codes, 0, G_N_ELEMENTS (cli_cases));
  tcase_add_test (tc, test_cli_version_text);
  tcase_add_test (tc, test_cli_unusable_input);
  tcase_add_test (tc, test_cli_bad_fixtures);
  suite_add_tcase (s, tc);

  /* Each sample is solved a few times over (cycle and shutdown included). */
  tcase_set_timeout (ts, 120);
  tcase_add_loop_test (ts, test_cli_check_samples, 0, G_N_ELEMENTS (samples));
  tcase_add_loop_test (ts, test_cli_json_samples, 0, G_N_ELEMENTS (samples));
  tcase_add_test (ts, test_cli_text_and_csv);
  suite_add_tcase (s, ts);
  return s;
}

int
main (void)
{
  return pl_check_run (cli_suite ());
}
