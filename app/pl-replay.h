/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-replay.h: the clock of a slow-motion replay of the firing cycle or
 * the shutdown.
 *
 * A replay stands at a position (s of simulated time from the start of
 * its run) and, while playing, moves on by speed seconds of simulated
 * time per second of wall time.  The caller passes a monotonic wall time
 * (microseconds, g_get_monotonic_time() or a frame clock's frame time) to
 * every call that may move the position, so the logic needs no timer and
 * tests drive it with made-up times.  The firing cycle is periodic and
 * loops; the shutdown runs once and stops at its end.
 *
 * PlReplay is a plain value (copy it with =), like PlViewport.  Every
 * function keeps it valid whatever it is given: a NaN or negative
 * argument is ignored and the call returns FALSE.
 */
#pragma once

#include <glib.h>

#include "pl-results-series.h"

G_BEGIN_DECLS

/* The speeds offered to a class: simulated seconds per wall second. */
#define PL_REPLAY_N_SPEEDS 4
extern const double pl_replay_speeds[PL_REPLAY_N_SPEEDS];   /* 1/100, 1/20, 1/5, 1 */

typedef struct
{
  PlRun run;
  double duration[PL_N_RUNS];  /* length of each run (s), 0: none */
  double speed;                       /* > 0 */
  gboolean playing;
  double anchor_position;             /* position at anchor_time */
  gint64 anchor_time;                 /* wall time (us) of the last anchor */
  double position;                    /* as of the last update */
} PlReplay;

/* The cycle, paused at 0, speed 1/20, no durations (nothing to play). */
void pl_replay_init (PlReplay *replay);

/* The runs' lengths from a snapshot: the cycle's period and the shutdown's
 * sampled length (0 for a run that has not run).  Keeps the run, speed and
 * playing state; the position is clamped into the new length. */
void pl_replay_set_results (PlReplay *replay, PlResults *results, gint64 now);
gboolean pl_replay_set_duration (PlReplay *replay, PlRun run, double seconds,
                                 gint64 now);
double pl_replay_get_duration (const PlReplay *replay);   /* of the current run */

/* Switches run: position 0, playing state kept. */
gboolean pl_replay_set_run (PlReplay *replay, PlRun run, gint64 now);
/* A new speed from now on (the position does not jump). */
gboolean pl_replay_set_speed (PlReplay *replay, double speed, gint64 now);

/* Play from the current position (from the start if a shutdown has
 * ended); pause where it is now.  FALSE when there is nothing to play. */
gboolean pl_replay_play (PlReplay *replay, gint64 now);
void pl_replay_pause (PlReplay *replay, gint64 now);
/* Moves to a position (clamped into the run), playing on from there if
 * it was playing. */
gboolean pl_replay_seek (PlReplay *replay, double position, gint64 now);

/* Advances the clock to now and returns the position: wraps round the
 * cycle; stops (and pauses) at the end of the shutdown. */
double pl_replay_update (PlReplay *replay, gint64 now);
/* The position as of the last call (no clock read). */
double pl_replay_get_position (const PlReplay *replay);
gboolean pl_replay_is_playing (const PlReplay *replay);

G_END_DECLS
