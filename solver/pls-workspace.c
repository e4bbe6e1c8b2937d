/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-workspace.c: the reusable workspace of the steady solve: CHOLMOD's
 * common block, the symbolic factor, the matrix and every work array,
 * kept between calls while the pattern of the nodal matrix is unchanged.
 *
 * Symbolic analysis once per topology (PHYSICS.md, network solution): the
 * editor re-solves the same layout after every parameter edit, and at
 * 1e5 applicators the analysis is a tenth of a solve.
 *
 * No transposes per factorisation: cholmod_factorize_p (CHOLMOD 3,
 * Cholesky/cholmod_factorize.c) factors a simplicial LDL' of a matrix
 * stored as its upper triangle without any copy only when the factor's
 * ordering is CHOLMOD_NATURAL; with a fill-reducing permutation it builds
 * A(p,p) by two transposes on every call.  So, once per topology, AMD
 * (cholmod_amd) orders the pattern in the topology's numbering, the
 * columns are renumbered by that permutation, and the renumbered pattern
 * (the same matrix, P A P^T) is analysed with the natural ordering and no
 * postorder, which keeps the factor's ordering natural and the fill of
 * AMD.  (The etree postorder that cholmod_analyze would add changes no
 * fill, only the order of the columns.)
 */

#include "config.h"

#include <string.h>

#include <cholmod.h>

#include "pls-network-private.h"

static pls_status
pls_ws_cholmod_status (const cholmod_common *c, pls_error *err, const char *what)
{
  if (c->status == CHOLMOD_OUT_OF_MEMORY || c->status == CHOLMOD_TOO_LARGE)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the sparse %s", what);
  return pls__error (err, PLS_ERR_LINALG, -1, -1, "the sparse %s failed (CHOLMOD status %d)",
                     what, c->status);
}

/* Frees the matrix, the factor and the dense vectors (not the common). */
static void
pls_ws_free_linalg (pls_steady_workspace *ws)
{
  if (ws->c == NULL)
    return;
  cholmod_free_dense (&ws->X, ws->c);
  cholmod_free_dense (&ws->Y, ws->c);
  cholmod_free_dense (&ws->E, ws->c);
  cholmod_free_dense (&ws->B, ws->c);
  cholmod_free_factor (&ws->L, ws->c);
  cholmod_free_sparse (&ws->A, ws->c);
}

pls_steady_workspace *
pls_steady_workspace_new (const pls_allocator *alloc, pls_error *err)
{
  pls_allocator a = { 0 };
  pls_steady_workspace *ws;
  const pls_allocator *prev;

  pls__error_clear (err);
  if (alloc != NULL)
    a = *alloc;
  ws = pls__calloc (&a, 1, sizeof *ws);
  if (ws == NULL)
    {
      pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory for the steady workspace");
      return NULL;
    }
  ws->alloc = a;
  ws->c = pls__malloc (&ws->alloc, sizeof *ws->c);
  if (ws->c == NULL)
    {
      pls__free (&a, ws);
      pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory for the steady workspace");
      return NULL;
    }
  prev = pls__cholmod_enter (&ws->alloc);
  cholmod_start (ws->c);
  pls__cholmod_leave (prev);
  ws->c->print = 0;                       /* status codes, never printing  */
  ws->c->supernodal = CHOLMOD_SIMPLICIAL; /* Laplacians of line networks
                                             fill little                   */
  return ws;
}

static void
pls_ws_free_arrays (pls_steady_workspace *ws)
{
  const pls_allocator *a = &ws->alloc;

  pls__free (a, ws->key_ca);
  pls__free (a, ws->key_cb);
  pls__free (a, ws->links);
  pls__free (a, ws->q);
  pls__free (a, ws->qt);
  pls__free (a, ws->d);
  pls__free (a, ws->dq);
  pls__free (a, ws->e);
  ws->key_ca = ws->key_cb = NULL;
  ws->links = NULL;
  ws->q = ws->qt = ws->d = ws->dq = ws->e = NULL;
  ws->cap_m = 0;
}

static void
pls_ws_free_columns (pls_steady_workspace *ws)
{
  const pls_allocator *a = &ws->alloc;

  pls__free (a, ws->colmap);
  pls__free (a, ws->col_node);
  pls__free (a, ws->demand);
  pls__free (a, ws->p);
  pls__free (a, ws->pt);
  pls__free (a, ws->dp);
  pls__free (a, ws->res);
  ws->colmap = ws->col_node = NULL;
  ws->demand = ws->p = ws->pt = ws->dp = ws->res = NULL;
  ws->cap_nf = 0;
}

void
pls_steady_workspace_free (pls_steady_workspace *ws)
{
  pls_allocator a;

  if (ws == NULL)
    return;
  a = ws->alloc;
  if (ws->c != NULL)
    {
      const pls_allocator *prev = pls__cholmod_enter (&ws->alloc);

      pls_ws_free_linalg (ws);
      cholmod_finish (ws->c);
      pls__cholmod_leave (prev);
      pls__free (&a, ws->c);
    }
  pls_ws_free_arrays (ws);
  pls_ws_free_columns (ws);
  pls__free (&a, ws->active);
  pls__free (&a, ws->pumped);
  pls__free (&a, ws->comp);
  pls__free (&a, ws->col);
  pls__free (&a, ws);
}

long
pls_steady_workspace_analyses (const pls_steady_workspace *ws)
{
  return ws != NULL ? ws->analyses : 0;
}

pls_status
pls__ws_reserve (pls_steady_workspace *ws, size_t m, size_t nf, size_t n, size_t ne)
{
  const pls_allocator *a = &ws->alloc;

  /* m = 0 reserves the per-call scratch only.  One spare slot each: sizes
   * of 0 stay valid pointers. */
  if (m > 0 && m + 1 > ws->cap_m)
    {
      size_t c = m + 1;

      ws->valid = 0;
      pls_ws_free_arrays (ws);
      ws->key_ca = pls__malloc (a, c * sizeof *ws->key_ca);
      ws->key_cb = pls__malloc (a, c * sizeof *ws->key_cb);
      ws->links = pls__malloc (a, c * sizeof *ws->links);
      ws->q = pls__malloc (a, c * sizeof (double));
      ws->qt = pls__malloc (a, c * sizeof (double));
      ws->d = pls__malloc (a, c * sizeof (double));
      ws->dq = pls__malloc (a, c * sizeof (double));
      ws->e = pls__malloc (a, c * sizeof (double));
      if (!ws->key_ca || !ws->key_cb || !ws->links || !ws->q || !ws->qt || !ws->d || !ws->dq
          || !ws->e)
        {
          pls_ws_free_arrays (ws);
          return PLS_ERR_NOMEM;
        }
      ws->cap_m = c;
    }
  if (m > 0 && nf + 1 > ws->cap_nf)
    {
      size_t c = nf + 1;

      ws->valid = 0;
      pls_ws_free_columns (ws);
      ws->colmap = pls__malloc (a, c * sizeof *ws->colmap);
      ws->col_node = pls__malloc (a, c * sizeof *ws->col_node);
      ws->demand = pls__malloc (a, c * sizeof (double));
      ws->p = pls__malloc (a, c * sizeof (double));
      ws->pt = pls__malloc (a, c * sizeof (double));
      ws->dp = pls__malloc (a, c * sizeof (double));
      ws->res = pls__malloc (a, c * sizeof (double));
      if (!ws->colmap || !ws->col_node || !ws->demand || !ws->p || !ws->pt || !ws->dp
          || !ws->res)
        {
          pls_ws_free_columns (ws);
          return PLS_ERR_NOMEM;
        }
      ws->cap_nf = c;
    }
  if (n + 1 > ws->cap_nodes)
    {
      pls__free (a, ws->pumped);
      pls__free (a, ws->comp);
      pls__free (a, ws->col);
      ws->cap_nodes = 0;
      ws->pumped = pls__malloc (a, n + 1);
      ws->comp = pls__malloc (a, (n + 1) * sizeof *ws->comp);
      ws->col = pls__malloc (a, (n + 1) * sizeof *ws->col);
      if (!ws->pumped || !ws->comp || !ws->col)
        return PLS_ERR_NOMEM;
      ws->cap_nodes = n + 1;
    }
  if (ne + 1 > ws->cap_elems)
    {
      pls__free (a, ws->active);
      ws->cap_elems = 0;
      ws->active = pls__malloc (a, ne + 1);
      if (ws->active == NULL)
        return PLS_ERR_NOMEM;
      ws->cap_elems = ne + 1;
    }
  return PLS_OK;
}

/* The upper triangle of the Laplacian of ws->links (columns ca, cb as they
 * are now) into a new CHOLMOD matrix *out: rows sorted within each column
 * by a counting sort on rows, parallel links merged, the diagonal last,
 * and every link's places (pa, pb, pab) recorded.  Values zero. */
static pls_status
pls_ws_pattern (pls_steady_workspace *ws, cholmod_sparse **out, pls_error *err)
{
  const pls_allocator *a = &ws->alloc;
  size_t nf = ws->nf, m = ws->m, k, i, total, pos = 0;
  int *rstart = NULL, *fill = NULL, *byrow = NULL, *diag = NULL, *slot_link = NULL;
  int *ap, *ai;
  cholmod_sparse *A = NULL;
  pls_status st = PLS_ERR_NOMEM;
  size_t off = 0;

  *out = NULL;
  for (k = 0; k < m; k++)
    off += ws->links[k].ca >= 0 && ws->links[k].cb >= 0;
  total = off + nf;
  rstart = pls__calloc (a, nf + 1, sizeof *rstart);
  fill = pls__calloc (a, nf + 1, sizeof *fill);
  byrow = pls__malloc (a, (off + 1) * sizeof *byrow);
  diag = pls__malloc (a, (nf + 1) * sizeof *diag);
  slot_link = pls__malloc (a, (total + 1) * sizeof *slot_link);
  if (!rstart || !fill || !byrow || !diag || !slot_link)
    {
      pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the sparse matrix set-up");
      goto out;
    }
  A = cholmod_allocate_sparse (nf, nf, total, 1, 1, 1, CHOLMOD_REAL, ws->c);
  if (A == NULL)
    {
      st = pls_ws_cholmod_status (ws->c, err, "matrix set-up");
      goto out;
    }
  ap = A->p;
  ai = A->i;
  memset (ap, 0, (nf + 1) * sizeof *ap);
  for (k = 0; k < m; k++)
    {
      pls__wlink *l = &ws->links[k];

      l->pab = -1;
      if (l->ca >= 0 && l->cb >= 0)
        {
          int lo = l->ca < l->cb ? l->ca : l->cb, hi = l->ca ^ l->cb ^ lo;

          rstart[lo + 1]++;
          ap[hi + 1]++;
        }
    }
  for (i = 0; i < nf; i++)
    {
      rstart[i + 1] += rstart[i];
      ap[i + 1] += ap[i] + 1;   /* + the diagonal */
    }
  for (k = 0; k < m; k++)
    {
      const pls__wlink *l = &ws->links[k];

      if (l->ca >= 0 && l->cb >= 0)
        {
          int lo = l->ca < l->cb ? l->ca : l->cb;

          byrow[rstart[lo] + fill[lo]++] = (int) k;
        }
    }
  memset (fill, 0, (nf + 1) * sizeof *fill);
  for (i = 0; i < nf; i++)
    for (k = (size_t) rstart[i]; k < (size_t) rstart[i + 1]; k++)
      {
        const pls__wlink *l = &ws->links[byrow[k]];
        int hi = l->ca > l->cb ? l->ca : l->cb;
        size_t s = (size_t) ap[hi] + (size_t) fill[hi]++;

        ai[s] = (int) i;
        slot_link[s] = byrow[k];
      }
  /* Diagonal last in each column (every row above is smaller), repeated
   * rows merged in place. */
  for (i = 0; i < nf; i++)
    {
      size_t s = (size_t) ap[i], end = (size_t) ap[i] + (size_t) fill[i], start = pos;

      for (; s < end; s++)
        {
          if (pos > start && ai[pos - 1] == ai[s])
            {
              ws->links[slot_link[s]].pab = (int) pos - 1;
              continue;
            }
          ai[pos] = ai[s];
          ws->links[slot_link[s]].pab = (int) pos;
          pos++;
        }
      ai[pos] = (int) i;
      diag[i] = (int) pos++;
      ap[i] = (int) start;
    }
  ap[nf] = (int) pos;
  memset (A->x, 0, total * sizeof (double));
  for (k = 0; k < m; k++)
    {
      pls__wlink *l = &ws->links[k];

      l->pa = l->ca >= 0 ? diag[l->ca] : -1;
      l->pb = l->cb >= 0 ? diag[l->cb] : -1;
    }
  *out = A;
  A = NULL;
  st = PLS_OK;

out:
  cholmod_free_sparse (&A, ws->c);
  pls__free (a, rstart);
  pls__free (a, fill);
  pls__free (a, byrow);
  pls__free (a, diag);
  pls__free (a, slot_link);
  return st;
}

/* Ordering, renumbering and analysis (see the top of the file); links
 * arrive in the topology's columns and leave in the matrix's. */
static pls_status
pls_ws_analyse (pls_steady_workspace *ws, pls_error *err)
{
  cholmod_common *c = ws->c;
  cholmod_sparse *A0 = NULL;
  int *perm = NULL;
  size_t nf = ws->nf, k;
  pls_status st;

  pls_ws_free_linalg (ws);
  if (nf == 0)
    {
      for (k = 0; k < ws->m; k++)
        ws->links[k].pa = ws->links[k].pb = ws->links[k].pab = -1;
      return PLS_OK;
    }
  st = pls_ws_pattern (ws, &A0, err);
  if (st != PLS_OK)
    goto out;
  perm = pls__malloc (&ws->alloc, nf * sizeof *perm);
  if (perm == NULL)
    {
      st = pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the sparse analysis");
      goto out;
    }
  /* AMD, not METIS: fast and repeatable. */
  if (!cholmod_amd (A0, NULL, 0, perm, c))
    {
      st = pls_ws_cholmod_status (c, err, "ordering");
      goto out;
    }
  for (k = 0; k < nf; k++)
    ws->colmap[perm[k]] = (int) k;
  for (k = 0; k < ws->m; k++)
    {
      pls__wlink *l = &ws->links[k];

      l->ca = l->ca >= 0 ? ws->colmap[l->ca] : -1;
      l->cb = l->cb >= 0 ? ws->colmap[l->cb] : -1;
    }
  st = pls_ws_pattern (ws, &ws->A, err);
  if (st != PLS_OK)
    goto out;
  c->nmethods = 1;
  c->method[0].ordering = CHOLMOD_NATURAL;
  c->postorder = 0;
  ws->L = cholmod_analyze (ws->A, c);
  if (ws->L == NULL)
    {
      st = pls_ws_cholmod_status (c, err, "analysis");
      goto out;
    }
  if (ws->L->ordering != CHOLMOD_NATURAL)
    {
      /* Would bring the transposes back; never seen, but say so. */
      st = pls__error (err, PLS_ERR_LINALG, -1, -1,
                       "the sparse analysis did not keep the natural ordering");
      goto out;
    }
  ws->B = cholmod_zeros (nf, 1, CHOLMOD_REAL, c);
  if (ws->B == NULL)
    {
      st = pls_ws_cholmod_status (c, err, "matrix set-up");
      goto out;
    }
  st = PLS_OK;

out:
  pls__free (&ws->alloc, perm);
  cholmod_free_sparse (&A0, c);
  if (st != PLS_OK)
    pls_ws_free_linalg (ws);
  return st;
}

pls_status
pls__ws_prepare (pls_steady_workspace *ws, double *t_analyse, pls_error *err)
{
  size_t m = ws->m, k;
  int same = ws->valid && ws->key_m == m && ws->key_nf == ws->nf;
  const pls_allocator *prev;
  pls_status st;
  double t0;

  *t_analyse = 0.0;
  for (k = 0; k < m; k++)
    {
      const pls__wlink *l = &ws->links[k];

      if (same && (ws->key_ca[k] != l->ca || ws->key_cb[k] != l->cb))
        same = 0;
      ws->key_ca[k] = l->ca;
      ws->key_cb[k] = l->cb;
    }
  if (same)
    {
      /* Same pattern: the places pa, pb, pab from the last analysis hold
       * (the driver writes only elem, fixed, ca and cb). */
      for (k = 0; k < m; k++)
        {
          pls__wlink *l = &ws->links[k];

          l->ca = l->ca >= 0 ? ws->colmap[l->ca] : -1;
          l->cb = l->cb >= 0 ? ws->colmap[l->cb] : -1;
        }
      return PLS_OK;
    }
  ws->valid = 0;
  t0 = pls__now ();
  prev = pls__cholmod_enter (&ws->alloc);
  st = pls_ws_analyse (ws, err);
  pls__cholmod_leave (prev);
  *t_analyse = pls__now () - t0;
  if (st != PLS_OK)
    return st;
  ws->key_m = m;
  ws->key_nf = ws->nf;
  ws->valid = 1;
  ws->analyses++;
  return PLS_OK;
}
