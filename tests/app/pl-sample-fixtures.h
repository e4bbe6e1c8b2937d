/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-sample-fixtures.h: what the app suites that work on the shipped
 * samples share: loading one, and solving it all the way (steady, cycle
 * and shutdown) as the scheduler's worker does.
 */
#pragma once

#include "pl-check.h"
#include "pl-layout-reader.h"
#include "pl-results.h"

static inline PlDocument *
pl_test_load_sample (const char *name)
{
  g_autofree char *path = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "samples",
                                            name, NULL);
  g_autoptr (GError) error = NULL;
  PlDocument *doc = pl_layout_read_file (path, &error);

  ck_assert_msg (doc != NULL, "%s: %s", path, error ? error->message : "?");
  return doc;
}

static inline PlResults *
pl_test_solve_full (PlDocument *doc)
{
  g_autoptr (PlCompiled) compiled = pl_compile (doc);
  g_autoptr (PlResults) fast = pl_results_solve_fast (compiled);
  g_autoptr (GError) error = NULL;
  PlResults *full = pl_results_solve_full (fast, NULL, &error);

  ck_assert_msg (full != NULL, "%s", error ? error->message : "?");
  ck_assert_int_eq (pl_results_get_transient_state (full), PL_TRANSIENT_DONE);
  return full;
}
