/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-check.h: what every Check suite of the project shares.
 */
#pragma once

#include <check.h>
#include <stdlib.h>

/* Runs one suite (in the calling process when CK_FORK=no, as meson sets it
 * so that sanitizers see every test) and turns the result into an exit code. */
static inline int
pl_check_run (Suite *suite)
{
  SRunner *runner = srunner_create (suite);
  int failed;

  srunner_run_all (runner, CK_NORMAL);
  failed = srunner_ntests_failed (runner);
  srunner_free (runner);
  return failed == 0 ? EXIT_SUCCESS : EXIT_FAILURE;
}
