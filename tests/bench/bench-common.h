/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-common.h: what the solver benchmarks share: an allocator hook that
 * counts peak memory, and a monotonic clock.
 */
#pragma once

#include <stdlib.h>
#include <string.h>
#include <time.h>

/* ---- counting allocator ------------------------------------------------ */

typedef struct
{
  size_t current, peak;
} counter;

#define HEADER 16   /* keeps malloc's alignment for doubles and pointers */

static void *
c_malloc (size_t size, void *data)
{
  counter *c = data;
  unsigned char *p = malloc (size + HEADER);

  if (p == NULL)
    return NULL;
  memcpy (p, &size, sizeof size);
  c->current += size;
  if (c->current > c->peak)
    c->peak = c->current;
  return p + HEADER;
}

static void
c_free (void *ptr, void *data)
{
  counter *c = data;
  unsigned char *p = ptr;
  size_t size;

  if (p == NULL)
    return;
  p -= HEADER;
  memcpy (&size, p, sizeof size);
  c->current -= size;
  free (p);
}

static void *
c_calloc (size_t count, size_t size, void *data)
{
  void *p = c_malloc (count * size, data);

  if (p != NULL)
    memset (p, 0, count * size);
  return p;
}

static void *
c_realloc (void *ptr, size_t size, void *data)
{
  unsigned char *p = ptr, *q;
  size_t old;

  if (p == NULL)
    return c_malloc (size, data);
  memcpy (&old, p - HEADER, sizeof old);
  q = c_malloc (size, data);
  if (q == NULL)
    return NULL;
  memcpy (q, p, old < size ? old : size);
  c_free (p, data);
  return q;
}

static double
now (void)
{
  struct timespec ts;

  clock_gettime (CLOCK_MONOTONIC, &ts);
  return (double) ts.tv_sec + 1e-9 * (double) ts.tv_nsec;
}
