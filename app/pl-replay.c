/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-replay.c: the clock of a slow-motion replay.
 */
#include "config.h"

#include "pl-replay.h"

#include <math.h>

const double pl_replay_speeds[PL_REPLAY_N_SPEEDS] = { 0.01, 0.05, 0.2, 1.0 };

static gboolean
valid_run (PlRun run)
{
  return run >= PL_RUN_CYCLE && run < PL_N_RUNS;
}

/* The position after wall time now, wrapped or clamped into the run. */
static double
position_at (const PlReplay *r, gint64 now, gboolean *ended)
{
  double len = r->duration[r->run], pos = r->anchor_position;

  *ended = FALSE;
  if (r->playing && now > r->anchor_time)
    pos += (double) (now - r->anchor_time) * 1e-6 * r->speed;
  if (!(len > 0.0))
    return 0.0;
  if (r->run == PL_RUN_CYCLE)
    {
      pos = fmod (pos, len);
      return pos < 0.0 ? pos + len : pos;
    }
  if (pos >= len)
    {
      *ended = TRUE;
      return len;
    }
  return MAX (pos, 0.0);
}

static void
anchor (PlReplay *r, double position, gint64 now)
{
  r->anchor_position = position;
  r->anchor_time = now;
  r->position = position;
}

void
pl_replay_init (PlReplay *replay)
{
  g_return_if_fail (replay != NULL);
  *replay = (PlReplay) { .run = PL_RUN_CYCLE, .speed = 0.05 };
}

gboolean
pl_replay_set_duration (PlReplay *replay, PlRun run, double seconds, gint64 now)
{
  gboolean ended;

  g_return_val_if_fail (replay != NULL, FALSE);
  if (!valid_run (run) || !(isfinite (seconds) && seconds >= 0.0))
    return FALSE;
  anchor (replay, pl_replay_update (replay, now), now);
  replay->duration[run] = seconds;
  anchor (replay, position_at (replay, now, &ended), now);
  if (!(replay->duration[replay->run] > 0.0))
    replay->playing = FALSE;
  return TRUE;
}

void
pl_replay_set_results (PlReplay *replay, PlResults *results, gint64 now)
{
  g_return_if_fail (replay != NULL);
  for (PlRun run = PL_RUN_CYCLE; run < PL_N_RUNS; run++)
    {
      double length = 0.0;

      if (results == NULL || !pl_results_get_run_length (results, run, &length))
        length = 0.0;
      pl_replay_set_duration (replay, run, length, now);
    }
}

double
pl_replay_get_duration (const PlReplay *replay)
{
  g_return_val_if_fail (replay != NULL, 0.0);
  return replay->duration[replay->run];
}

gboolean
pl_replay_set_run (PlReplay *replay, PlRun run, gint64 now)
{
  g_return_val_if_fail (replay != NULL, FALSE);
  if (!valid_run (run))
    return FALSE;
  replay->run = run;
  anchor (replay, 0.0, now);
  if (!(replay->duration[run] > 0.0))
    replay->playing = FALSE;
  return TRUE;
}

gboolean
pl_replay_set_speed (PlReplay *replay, double speed, gint64 now)
{
  g_return_val_if_fail (replay != NULL, FALSE);
  if (!(isfinite (speed) && speed > 0.0))
    return FALSE;
  anchor (replay, pl_replay_update (replay, now), now);
  replay->speed = speed;
  return TRUE;
}

gboolean
pl_replay_play (PlReplay *replay, gint64 now)
{
  double pos;

  g_return_val_if_fail (replay != NULL, FALSE);
  if (!(replay->duration[replay->run] > 0.0))
    return FALSE;
  pos = pl_replay_update (replay, now);
  /* A shutdown that has run its course plays again from the air going off. */
  if (replay->run == PL_RUN_SHUTDOWN && pos >= replay->duration[replay->run])
    pos = 0.0;
  anchor (replay, pos, now);
  replay->playing = TRUE;
  return TRUE;
}

void
pl_replay_pause (PlReplay *replay, gint64 now)
{
  g_return_if_fail (replay != NULL);
  anchor (replay, pl_replay_update (replay, now), now);
  replay->playing = FALSE;
}

gboolean
pl_replay_seek (PlReplay *replay, double position, gint64 now)
{
  double len;

  g_return_val_if_fail (replay != NULL, FALSE);
  if (!isfinite (position))
    return FALSE;
  len = replay->duration[replay->run];
  anchor (replay, len > 0.0 ? CLAMP (position, 0.0, len) : 0.0, now);
  return TRUE;
}

double
pl_replay_update (PlReplay *replay, gint64 now)
{
  gboolean ended;
  double pos;

  g_return_val_if_fail (replay != NULL, 0.0);
  pos = position_at (replay, now, &ended);
  replay->position = pos;
  if (ended)
    {
      anchor (replay, pos, now);
      replay->playing = FALSE;
    }
  return pos;
}

double
pl_replay_get_position (const PlReplay *replay)
{
  g_return_val_if_fail (replay != NULL, 0.0);
  return replay->position;
}

gboolean
pl_replay_is_playing (const PlReplay *replay)
{
  g_return_val_if_fail (replay != NULL, FALSE);
  return replay->playing;
}
