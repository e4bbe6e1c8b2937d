/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Replay clock: slow motion, pause, seek, speed changes without a jump,
 * looping of the cycle, the shutdown stopping at its end, bad input.
 *
 * References: the position is anchor + (now - then) * speed, worked by
 * hand in each check (times in microseconds, positions in seconds).
 */

#include "config.h"

#include <math.h>

#include "pl-check.h"
#include "pl-replay.h"

/* Positions are sums and products of a few exact binary fractions and
 * decimal speeds: 1e-12 s is far below anything a replay shows. */
#define TOL 1e-12

static PlReplay
ready (void)
{
  PlReplay r;

  pl_replay_init (&r);
  ck_assert (pl_replay_set_duration (&r, PL_RUN_CYCLE, 0.5, 0));
  ck_assert (pl_replay_set_duration (&r, PL_RUN_SHUTDOWN, 3.0, 0));
  return r;
}

START_TEST (test_slow_motion)
{
  PlReplay r = ready ();

  ck_assert (!pl_replay_is_playing (&r));
  ck_assert_double_eq (pl_replay_update (&r, 5000000), 0.0);   /* paused: stays */
  ck_assert (pl_replay_set_speed (&r, 0.01, 5000000));
  ck_assert (pl_replay_play (&r, 5000000));
  /* 1/100: 2 s of wall time are 20 ms of the cycle. */
  ck_assert_double_eq_tol (pl_replay_update (&r, 7000000), 0.02, TOL);
  pl_replay_pause (&r, 7000000);
  ck_assert_double_eq_tol (pl_replay_update (&r, 60000000), 0.02, TOL);
  ck_assert_double_eq_tol (pl_replay_get_position (&r), 0.02, TOL);
  /* Play on at 1/5 from where it paused: 0.5 s wall = 0.1 s more. */
  ck_assert (pl_replay_set_speed (&r, 0.2, 60000000));
  ck_assert (pl_replay_play (&r, 60000000));
  ck_assert_double_eq_tol (pl_replay_update (&r, 60500000), 0.12, TOL);
  /* A speed change while playing does not make the position jump. */
  ck_assert (pl_replay_set_speed (&r, 1.0, 60500000));
  ck_assert_double_eq_tol (pl_replay_get_position (&r), 0.12, TOL);
  ck_assert_double_eq_tol (pl_replay_update (&r, 60600000), 0.22, TOL);
}
END_TEST

/* The cycle loops: at 1x, 1.3 s after the start of a 0.5 s cycle is 0.3 s. */
START_TEST (test_cycle_loops)
{
  PlReplay r = ready ();

  ck_assert (pl_replay_set_speed (&r, 1.0, 0));
  ck_assert (pl_replay_play (&r, 0));
  ck_assert_double_eq_tol (pl_replay_update (&r, 1300000), 0.3, 1e-9);
  ck_assert (pl_replay_is_playing (&r));
}
END_TEST

/* The shutdown runs once: at 1x, 4 s after the air goes off a 3 s run has
 * ended at 3 s and paused; play starts it over. */
START_TEST (test_shutdown_ends)
{
  PlReplay r = ready ();

  ck_assert (pl_replay_set_run (&r, PL_RUN_SHUTDOWN, 0));
  ck_assert_double_eq (pl_replay_get_duration (&r), 3.0);
  ck_assert (pl_replay_set_speed (&r, 1.0, 0));
  ck_assert (pl_replay_play (&r, 0));
  ck_assert_double_eq_tol (pl_replay_update (&r, 1500000), 1.5, TOL);
  ck_assert_double_eq (pl_replay_update (&r, 4000000), 3.0);
  ck_assert (!pl_replay_is_playing (&r));
  ck_assert_double_eq (pl_replay_update (&r, 9000000), 3.0);
  ck_assert (pl_replay_play (&r, 9000000));
  ck_assert_double_eq_tol (pl_replay_update (&r, 9250000), 0.25, TOL);
  /* Back to the cycle: position 0, still playing. */
  ck_assert (pl_replay_set_run (&r, PL_RUN_CYCLE, 9250000));
  ck_assert (pl_replay_is_playing (&r));
  ck_assert_double_eq_tol (pl_replay_update (&r, 9350000), 0.1, TOL);
}
END_TEST

START_TEST (test_seek)
{
  PlReplay r = ready ();

  ck_assert (pl_replay_seek (&r, 0.37, 100));
  ck_assert_double_eq (pl_replay_update (&r, 1000000), 0.37);
  ck_assert (pl_replay_seek (&r, 7.0, 100));          /* clamped to the cycle */
  ck_assert_double_eq (pl_replay_get_position (&r), 0.5);
  ck_assert (pl_replay_seek (&r, -1.0, 100));
  ck_assert_double_eq (pl_replay_get_position (&r), 0.0);
  /* Seeking while playing plays on from there (1/20: 1 s wall = 50 ms). */
  ck_assert (pl_replay_play (&r, 0));
  ck_assert (pl_replay_seek (&r, 0.1, 2000000));
  ck_assert_double_eq_tol (pl_replay_update (&r, 3000000), 0.15, TOL);
}
END_TEST

/* Nothing to play (no results) and bad input: refused, state unchanged. */
START_TEST (test_bad_input)
{
  PlReplay r;

  pl_replay_init (&r);
  ck_assert (!pl_replay_play (&r, 0));
  ck_assert (!pl_replay_is_playing (&r));
  ck_assert_double_eq (pl_replay_update (&r, 10000000), 0.0);
  r = ready ();
  ck_assert (!pl_replay_set_speed (&r, 0.0, 0));
  ck_assert (!pl_replay_set_speed (&r, -1.0, 0));
  ck_assert (!pl_replay_set_speed (&r, NAN, 0));
  ck_assert_double_eq (r.speed, 0.05);
  ck_assert (!pl_replay_set_duration (&r, PL_RUN_CYCLE, NAN, 0));
  ck_assert (!pl_replay_set_duration (&r, PL_RUN_CYCLE, -1.0, 0));
  ck_assert (!pl_replay_set_duration (&r, PL_N_RUNS, 1.0, 0));
  ck_assert (!pl_replay_set_run (&r, (PlRun) 7, 0));
  ck_assert (!pl_replay_seek (&r, INFINITY, 0));
  ck_assert_double_eq (pl_replay_get_duration (&r), 0.5);
  /* Results gone: the run has no length, playing stops. */
  ck_assert (pl_replay_play (&r, 0));
  pl_replay_set_results (&r, NULL, 1000);
  ck_assert (!pl_replay_is_playing (&r));
  ck_assert_double_eq (pl_replay_get_duration (&r), 0.0);
}
END_TEST

/* The speeds offered are the ones a class sees: 1/100, 1/20, 1/5, 1. */
START_TEST (test_speed_table)
{
  ck_assert_double_eq (pl_replay_speeds[0], 0.01);
  for (int i = 1; i < PL_REPLAY_N_SPEEDS; i++)
    ck_assert_double_gt (pl_replay_speeds[i], pl_replay_speeds[i - 1]);
  ck_assert_double_eq (pl_replay_speeds[PL_REPLAY_N_SPEEDS - 1], 1.0);
}
END_TEST

static Suite *
replay_suite (void)
{
  Suite *s = suite_create ("replay");
  TCase *tc = tcase_create ("clock");

  tcase_add_test (tc, test_slow_motion);
  tcase_add_test (tc, test_cycle_loops);
  tcase_add_test (tc, test_shutdown_ends);
  tcase_add_test (tc, test_seek);
  tcase_add_test (tc, test_bad_input);
  tcase_add_test (tc, test_speed_table);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (replay_suite ());
}
