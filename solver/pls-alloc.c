/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-alloc.c: the allocator hook, error filling, and the bridge that lets
 * CHOLMOD's workspace go through the same hook.
 *
 * SuiteSparse 5.x keeps its allocator in one process-wide struct of
 * function pointers (SuiteSparse_config) whose functions take no user data.
 * The solver therefore never writes it on its own: the caller opts in once
 * with pls_route_cholmod_allocations (tests do; the program may), and each
 * solve brackets its CHOLMOD calls with pls__cholmod_enter/leave, which
 * set a thread-local pointer to the network's allocator.  Concurrent solves
 * on different threads each reach their own allocator; with no solve on
 * the thread the trampolines fall back to libc.  That thread-local pointer
 * is the only piece of state outside the network and result objects, and
 * it never outlives the call that set it.
 */

#include "config.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <cholmod.h>

#include "pls-network-private.h"

static _Thread_local const pls_allocator *pls_cholmod_current;

void *
pls__malloc (const pls_allocator *a, size_t size)
{
  if (size == 0)
    size = 1;
  if (a != NULL && a->malloc_fn != NULL)
    return a->malloc_fn (size, a->user_data);
  return malloc (size);
}

void *
pls__calloc (const pls_allocator *a, size_t count, size_t size)
{
  if (count == 0 || size == 0)
    {
      count = 1;
      size = 1;
    }
  if (a != NULL && a->calloc_fn != NULL)
    return a->calloc_fn (count, size, a->user_data);
  if (a != NULL && a->malloc_fn != NULL)
    {
      void *p;

      /* A hook with malloc but no calloc: zero it ourselves. */
      if (size != 0 && count > (size_t) -1 / size)
        return NULL;
      p = a->malloc_fn (count * size, a->user_data);
      if (p != NULL)
        memset (p, 0, count * size);
      return p;
    }
  return calloc (count, size);
}

void *
pls__realloc (const pls_allocator *a, void *ptr, size_t size)
{
  if (size == 0)
    size = 1;
  if (a != NULL && a->realloc_fn != NULL)
    return a->realloc_fn (ptr, size, a->user_data);
  return realloc (ptr, size);
}

void
pls__free (const pls_allocator *a, void *ptr)
{
  if (ptr == NULL)
    return;
  if (a != NULL && a->free_fn != NULL)
    a->free_fn (ptr, a->user_data);
  else
    free (ptr);
}

/* Trampolines with SuiteSparse's signatures. */
static void *
pls_cholmod_malloc (size_t size)
{
  return pls__malloc (pls_cholmod_current, size);
}

static void *
pls_cholmod_calloc (size_t count, size_t size)
{
  return pls__calloc (pls_cholmod_current, count, size);
}

static void *
pls_cholmod_realloc (void *ptr, size_t size)
{
  return pls__realloc (pls_cholmod_current, ptr, size);
}

static void
pls_cholmod_free (void *ptr)
{
  pls__free (pls_cholmod_current, ptr);
}

void
pls_route_cholmod_allocations (void)
{
  SuiteSparse_config.malloc_func = pls_cholmod_malloc;
  SuiteSparse_config.calloc_func = pls_cholmod_calloc;
  SuiteSparse_config.realloc_func = pls_cholmod_realloc;
  SuiteSparse_config.free_func = pls_cholmod_free;
}

const pls_allocator *
pls__cholmod_enter (const pls_allocator *a)
{
  const pls_allocator *previous = pls_cholmod_current;

  pls_cholmod_current = a;
  return previous;
}

void
pls__cholmod_leave (const pls_allocator *previous)
{
  pls_cholmod_current = previous;
}

void
pls__error_clear (pls_error *err)
{
  if (err == NULL)
    return;
  err->status = PLS_OK;
  err->element = -1;
  err->node = -1;
  err->message[0] = '\0';
}

pls_status
pls__error (pls_error *err, pls_status status, int element, int node, const char *fmt, ...)
{
  va_list ap;

  if (err == NULL)
    return status;
  err->status = status;
  err->element = element;
  err->node = node;
  va_start (ap, fmt);
  vsnprintf (err->message, sizeof err->message, fmt, ap);
  va_end (ap);
  return status;
}
