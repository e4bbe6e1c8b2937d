/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-newton.c: the Newton iterations of the steady solve.
 *
 * Global gradient algorithm (Todini & Pilati, "A gradient algorithm for the
 * analysis of pipe networks", 1988), written as Newton's method on the
 * link energy equations h_k(Q_k) = P_a - P_b and the nodal mass balance
 * B Q + d = 0, with P = p + rho g z the piezometric pressure (elevation
 * enters as rho g dz).  Eliminating dQ leaves the Schur complement
 * B D^-1 B^T (D = diag dh/dQ): a weighted graph Laplacian with the fixed
 * nodes removed, symmetric positive definite because every dh/dQ > 0 and
 * the topology pass keeps only parts that touch a fixed pressure.  CHOLMOD
 * factors it numerically at every iteration; its symbolic analysis is done
 * once per pattern and kept in a pls_steady_workspace (pls-workspace.c).
 *
 * Two drivers share the method: pls__newton on a pls_work (analysis per
 * call; kept for callers of that interface), and pls__newton_ws on a
 * workspace, which the steady solve uses.
 *
 * Globalisation: the first step is the plain GGA step (it does not depend
 * on the starting pressures); later steps are cut back by halving until
 * the weighted residual norm |W F|^2 falls (Armijo).  The Newton direction
 * is a descent direction of that norm for any fixed positive weights W,
 * and the Jacobian is never singular here, so the search always succeeds
 * for a small enough step.
 */

#include "config.h"

#include <math.h>
#include <string.h>
#include <time.h>

#include <cholmod.h>

#include "pls-network-private.h"

double
pls__now (void)
{
  struct timespec ts;

  if (timespec_get (&ts, TIME_UTC) == 0)
    return 0.0;
  return (double) ts.tv_sec + 1e-9 * (double) ts.tv_nsec;
}

void
pls__work_free (pls_work *w)
{
  const pls_allocator *a = w->alloc;

  pls__free (a, w->links);
  pls__free (a, w->col_node);
  pls__free (a, w->demand);
  pls__free (a, w->q);
  pls__free (a, w->qt);
  pls__free (a, w->h);
  pls__free (a, w->d);
  pls__free (a, w->ht);
  pls__free (a, w->dt);
  pls__free (a, w->dq);
  pls__free (a, w->p);
  pls__free (a, w->pt);
  pls__free (a, w->dp);
  pls__free (a, w->res);
  pls__free (a, w->ap);
  pls__free (a, w->ai);
}

/* Evaluates every link law at flows q into h, d; checks the laws' contract
 * so a misbehaving law is named instead of poisoning the factorisation. */
static pls_status
pls_eval (pls_work *w, const double *q, double *h, double *d, pls_error *err)
{
  size_t k;

  for (k = 0; k < w->m; k++)
    {
      const pls_element *e = &w->net->elements[w->links[k].elem];
      pls_drop dr;

      pls__element_drop (w->net, e, w->air, q[k], &dr);
      if (!isfinite (dr.h) || !isfinite (dr.dh_dq) || !(dr.dh_dq > 0.0))
        {
          char label[96];

          pls__element_label (w->net, w->links[k].elem, label, sizeof label);
          return pls__error (err, PLS_ERR_INVALID, w->links[k].elem, -1,
                             "%s: its law gave drop %g Pa, slope %g at flow %g m^3/s "
                             "(needs finite values and a positive slope)",
                             label, dr.h, dr.dh_dq, q[k]);
        }
      h[k] = dr.h;
      d[k] = dr.dh_dq;
    }
  return PLS_OK;
}

/* Energy residual of link k: e = h - (P_a - P_b). */
static double
pls_energy (const pls_work *w, size_t k, const double *p, const double *h)
{
  const pls_link *l = &w->links[k];
  double pa = l->ca >= 0 ? p[l->ca] : l->fa;
  double pb = l->cb >= 0 ? p[l->cb] : l->fb;

  return h[k] - (pa - pb);
}

/* Mass imbalance (outflow + withdrawal) at every column, into w->res. */
static void
pls_balance (pls_work *w, const double *q)
{
  size_t k;

  memcpy (w->res, w->demand, w->nf * sizeof *w->res);
  for (k = 0; k < w->m; k++)
    {
      if (w->links[k].ca >= 0)
        w->res[w->links[k].ca] += q[k];
      if (w->links[k].cb >= 0)
        w->res[w->links[k].cb] -= q[k];
    }
}

/* Weighted squared residual norm, and the two stopping figures. */
static double
pls_merit (pls_work *w, const double *q, const double *p, const double *h, const double *d,
           double we, double wr, double *flow_res)
{
  double sum = 0.0, worst = 0.0;
  size_t k, i;

  pls_balance (w, q);
  for (k = 0; k < w->m; k++)
    {
      double e = pls_energy (w, k, p, h);

      sum += (we * e) * (we * e);
      if (fabs (e) / d[k] > worst)
        worst = fabs (e) / d[k];
    }
  for (i = 0; i < w->nf; i++)
    {
      sum += (wr * w->res[i]) * (wr * w->res[i]);
      if (fabs (w->res[i]) > worst)
        worst = fabs (w->res[i]);
    }
  *flow_res = worst;
  return sum;
}

/* Pattern of the upper triangle of the Laplacian: rows sorted within each
 * column by a counting sort on rows first, duplicates (parallel links)
 * merged, and the place of every link's entries recorded. */
pls_status
pls__pattern (pls_work *w)
{
  const pls_allocator *a = w->alloc;
  size_t nf = w->nf, m = w->m, k, i;
  size_t *rstart = NULL, *byrow = NULL, *fill = NULL;
  long *slot_link = NULL, *diag = NULL;
  pls_status st = PLS_ERR_NOMEM;
  size_t total;

  rstart = pls__calloc (a, nf + 1, sizeof *rstart);
  fill = pls__calloc (a, nf + 1, sizeof *fill);
  byrow = pls__malloc (a, (m + 1) * sizeof *byrow);
  diag = pls__malloc (a, (nf + 1) * sizeof *diag);
  w->ap = pls__calloc (a, nf + 1, sizeof *w->ap);
  if (!rstart || !fill || !byrow || !diag || !w->ap)
    goto out;

  for (k = 0; k < m; k++)
    {
      pls_link *l = &w->links[k];

      l->pa = l->ca >= 0 ? -2 : -1;   /* -2: filled in below */
      l->pb = l->cb >= 0 ? -2 : -1;
      l->pab = -1;
      if (l->ca >= 0 && l->cb >= 0)
        {
          int lo = l->ca < l->cb ? l->ca : l->cb, hi = l->ca ^ l->cb ^ lo;

          rstart[lo + 1]++;
          w->ap[hi + 1]++;
        }
    }
  for (i = 0; i < nf; i++)
    {
      rstart[i + 1] += rstart[i];
      w->ap[i + 1] += w->ap[i] + 1;   /* + the diagonal */
    }
  total = (size_t) w->ap[nf];
  for (k = 0; k < m; k++)
    {
      const pls_link *l = &w->links[k];

      if (l->ca >= 0 && l->cb >= 0)
        {
          int lo = l->ca < l->cb ? l->ca : l->cb;

          byrow[rstart[lo] + fill[lo]++] = k;
        }
    }
  w->ai = pls__malloc (a, (total + 1) * sizeof *w->ai);
  slot_link = pls__malloc (a, (total + 1) * sizeof *slot_link);
  if (!w->ai || !slot_link)
    goto out;
  memset (fill, 0, (nf + 1) * sizeof *fill);
  for (i = 0; i < nf; i++)
    for (k = rstart[i]; k < rstart[i + 1]; k++)
      {
        const pls_link *l = &w->links[byrow[k]];
        int hi = l->ca > l->cb ? l->ca : l->cb;
        size_t s = (size_t) w->ap[hi] + fill[hi]++;

        w->ai[s] = (int) i;
        slot_link[s] = (long) byrow[k];
      }
  /* Diagonal last in each column (every row above is smaller), then merge
   * repeated rows in place. */
  {
    size_t out_pos = 0;
    int j;

    for (j = 0; j < (int) nf; j++)
      {
        size_t s = (size_t) w->ap[j], end = (size_t) w->ap[j] + fill[j], start = out_pos;

        for (; s < end; s++)
          {
            if (out_pos > start && w->ai[out_pos - 1] == w->ai[s])
              {
                w->links[slot_link[s]].pab = (long) out_pos - 1;
                continue;
              }
            w->ai[out_pos] = w->ai[s];
            w->links[slot_link[s]].pab = (long) out_pos;
            out_pos++;
          }
        w->ai[out_pos] = j;
        diag[j] = (long) out_pos++;
        w->ap[j] = (int) start;
      }
    w->ap[nf] = (int) out_pos;
    w->nnz = out_pos;
  }
  for (k = 0; k < m; k++)
    {
      pls_link *l = &w->links[k];

      if (l->ca >= 0)
        l->pa = diag[l->ca];
      if (l->cb >= 0)
        l->pb = diag[l->cb];
    }
  st = PLS_OK;

out:
  pls__free (a, rstart);
  pls__free (a, fill);
  pls__free (a, byrow);
  pls__free (a, diag);
  pls__free (a, slot_link);
  return st;
}

static pls_status
pls_cholmod_status (const cholmod_common *c, pls_error *err, const char *what)
{
  if (c->status == CHOLMOD_OUT_OF_MEMORY || c->status == CHOLMOD_TOO_LARGE)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the sparse %s", what);
  return pls__error (err, PLS_ERR_LINALG, -1, -1, "the sparse %s failed (CHOLMOD status %d)",
                     what, c->status);
}

pls_status
pls__newton (pls_work *w, const pls_steady_options *o, double pscale, double fscale,
            pls_steady_result *r, double *t_analyse, pls_error *err)
{
  cholmod_common c;
  cholmod_sparse *A = NULL;
  cholmod_factor *L = NULL;
  cholmod_dense *B = NULL, *X = NULL, *Y = NULL, *E = NULL;
  const pls_allocator *prev = pls__cholmod_enter (w->alloc);
  pls_status st = PLS_OK;
  double we = 1.0 / pscale, wr, merit, flow_res = 0.0, t0;
  size_t k, i;
  int it;

  cholmod_start (&c);
  c.print = 0;                         /* status codes, never printing */
  c.nmethods = 1;
  c.method[0].ordering = CHOLMOD_AMD;  /* no METIS: fast and repeatable */
  c.postorder = 1;
  c.supernodal = CHOLMOD_SIMPLICIAL;   /* Laplacians of line networks fill little */

  t0 = pls__now ();
  if (w->nf > 0)
    {
      A = cholmod_allocate_sparse (w->nf, w->nf, w->nnz, 1, 1, 1, CHOLMOD_REAL, &c);
      if (A == NULL)
        {
          st = pls_cholmod_status (&c, err, "matrix set-up");
          goto out;
        }
      memcpy (A->p, w->ap, (w->nf + 1) * sizeof (int));
      memcpy (A->i, w->ai, w->nnz * sizeof (int));
      memset (A->x, 0, w->nnz * sizeof (double));
      L = cholmod_analyze (A, &c);
      if (L == NULL)
        {
          st = pls_cholmod_status (&c, err, "analysis");
          goto out;
        }
      B = cholmod_zeros (w->nf, 1, CHOLMOD_REAL, &c);
      if (B == NULL)
        {
          st = pls_cholmod_status (&c, err, "matrix set-up");
          goto out;
        }
    }
  *t_analyse = pls__now () - t0;

  st = pls_eval (w, w->q, w->h, w->d, err);
  if (st != PLS_OK)
    goto out;
  wr = 1.0 / fscale;
  merit = pls_merit (w, w->q, w->p, w->h, w->d, we, wr, &flow_res);

  for (it = 1; it <= o->max_iterations; it++)
    {
      double alpha = 1.0, dpmax = 0.0, trial = 0.0;
      int cuts;

      /* Right side B D^-1 e - r and the Laplacian values. */
      if (w->nf > 0)
        {
          double *ax = A->x, *b = B->x;

          memset (ax, 0, w->nnz * sizeof *ax);
          for (i = 0; i < w->nf; i++)
            b[i] = -w->res[i];
          for (k = 0; k < w->m; k++)
            {
              const pls_link *l = &w->links[k];
              double inv = 1.0 / w->d[k], e = pls_energy (w, k, w->p, w->h);

              if (l->ca >= 0)
                {
                  ax[l->pa] += inv;
                  b[l->ca] += e * inv;
                }
              if (l->cb >= 0)
                {
                  ax[l->pb] += inv;
                  b[l->cb] -= e * inv;
                }
              if (l->pab >= 0)
                ax[l->pab] -= inv;
            }
          if (!cholmod_factorize (A, L, &c) || c.status < CHOLMOD_OK)
            {
              st = pls_cholmod_status (&c, err, "factorisation");
              goto out;
            }
          if (L->minor < L->n)
            {
              st = pls__error (err, PLS_ERR_LINALG, -1, w->col_node[L->minor],
                               "the nodal matrix lost positive definiteness near node %d",
                               w->col_node[L->minor]);
              goto out;
            }
          if (!cholmod_solve2 (CHOLMOD_A, L, B, NULL, &X, NULL, &Y, &E, &c))
            {
              st = pls_cholmod_status (&c, err, "solve");
              goto out;
            }
          memcpy (w->dp, X->x, w->nf * sizeof *w->dp);
        }
      for (k = 0; k < w->m; k++)
        {
          const pls_link *l = &w->links[k];
          double da = l->ca >= 0 ? w->dp[l->ca] : 0.0, db = l->cb >= 0 ? w->dp[l->cb] : 0.0;

          w->dq[k] = (da - db - pls_energy (w, k, w->p, w->h)) / w->d[k];
        }

      for (cuts = 0;; cuts++)
        {
          for (k = 0; k < w->m; k++)
            w->qt[k] = w->q[k] + alpha * w->dq[k];
          for (i = 0; i < w->nf; i++)
            w->pt[i] = w->p[i] + alpha * w->dp[i];
          st = pls_eval (w, w->qt, w->ht, w->dt, err);
          if (st != PLS_OK)
            goto out;
          trial = pls_merit (w, w->qt, w->pt, w->ht, w->dt, we, wr, &flow_res);
          if (it == 1 || trial <= (1.0 - 1e-4 * alpha) * merit || cuts >= 30)
            break;
          alpha *= 0.5;
        }
      for (i = 0; i < w->nf; i++)
        if (fabs (alpha * w->dp[i]) > dpmax)
          dpmax = fabs (alpha * w->dp[i]);
      /* Accept the step. */
      {
        double *t;

        t = w->q; w->q = w->qt; w->qt = t;
        t = w->p; w->p = w->pt; w->pt = t;
        t = w->h; w->h = w->ht; w->ht = t;
        t = w->d; w->d = w->dt; w->dt = t;
      }
      if (it == 1)
        {
          /* The flow scale of the merit: now that the first GGA step has
           * put flows where the laws want them, use their size. */
          double qmax = 0.0;

          for (k = 0; k < w->m; k++)
            if (fabs (w->q[k]) > qmax)
              qmax = fabs (w->q[k]);
          if (qmax > fscale)
            fscale = qmax;
          wr = 1.0 / fscale;
          trial = pls_merit (w, w->q, w->p, w->h, w->d, we, wr, &flow_res);
        }
      merit = trial;
      r->iterations = it;
      r->pressure_change = dpmax;
      r->flow_residual = flow_res;
      if (dpmax <= o->pressure_tolerance && flow_res <= o->flow_tolerance)
        {
          r->converged = 1;
          break;
        }
    }

out:
  cholmod_free_dense (&X, &c);
  cholmod_free_dense (&Y, &c);
  cholmod_free_dense (&E, &c);
  cholmod_free_dense (&B, &c);
  cholmod_free_factor (&L, &c);
  cholmod_free_sparse (&A, &c);
  cholmod_finish (&c);
  pls__cholmod_leave (prev);
  return st;
}


/* ---- the workspace's Newton core ----------------------------------------
 *
 * The same iteration as pls__newton, on a pls_steady_workspace (matrix in
 * the natural order of its factor, see pls-workspace.c).  One pass over the
 * links per trial point does what took five there: the Newton flow step
 * (on the first trial of an iteration), the trial flow, the element law,
 * the energy residual, the mass balance and the next iteration's matrix
 * and right side.  The last trial of a line search is always the accepted
 * point, so what it assembled is what the next iteration factors.  At 1e5
 * applicators the link data no longer fit in the cache, so passes over
 * memory, not arithmetic, set the time. */

/* Trial point q + alpha dq, p + alpha dp into qt, pt; slopes into d,
 * energy residuals into e, nodal imbalance into res, and the system of the
 * next Newton step at that point into A->x (Laplacian of 1/d) and B
 * (B D^-1 e - r).  With make_dq the flow step dq = (dp_a - dp_b - e) / d
 * is formed first from the accepted point's e, d, which the first trial of
 * an iteration then overwrites in place: later trials of the line search
 * need only dq, and the last trial is the accepted point.  *se: sum of
 * (we e)^2; *worst: largest |e| / d. */
static pls_status
pls_ws_trial (pls_steady_workspace *ws, const pls_network *net, double air, double alpha,
              int make_dq, double we, double *se, double *worst, pls_error *err)
{
  const pls__wlink *links = ws->links;
  const double *q = ws->q, *p = ws->p, *dp = ws->dp;
  double *qt = ws->qt, *pt = ws->pt, *d = ws->d, *e = ws->e;
  double *dq = ws->dq, *res = ws->res, sum = 0.0, big = 0.0, *ax = NULL, *b = NULL;
  size_t k, i, nf = ws->nf;

  for (i = 0; i < nf; i++)
    pt[i] = p[i] + alpha * dp[i];
  memcpy (res, ws->demand, nf * sizeof *res);
  if (nf > 0)
    {
      ax = ws->A->x;
      b = ws->B->x;
      memset (ax, 0, (size_t) ((const int *) ws->A->p)[nf] * sizeof *ax);
      for (i = 0; i < nf; i++)
        b[i] = -ws->demand[i];
    }
  for (k = 0; k < ws->m; k++)
    {
      const pls__wlink *l = &links[k];
      double qk, pa, pb, ek, inv;
      pls_drop dr;

      if (make_dq)
        {
          double da = l->ca >= 0 ? dp[l->ca] : 0.0, db = l->cb >= 0 ? dp[l->cb] : 0.0;

          dq[k] = (da - db - e[k]) / d[k];
        }
      qk = q[k] + alpha * dq[k];
      qt[k] = qk;
      pls__element_drop (net, &net->elements[l->elem], air, qk, &dr);
      if (!isfinite (dr.h) || !isfinite (dr.dh_dq) || !(dr.dh_dq > 0.0))
        {
          char label[96];

          pls__element_label (net, l->elem, label, sizeof label);
          return pls__error (err, PLS_ERR_INVALID, l->elem, -1,
                             "%s: its law gave drop %g Pa, slope %g at flow %g m^3/s "
                             "(needs finite values and a positive slope)",
                             label, dr.h, dr.dh_dq, qk);
        }
      d[k] = dr.dh_dq;
      /* e = h - (P_a - P_b): a fixed end's piezometric pressure is in
       * l->fixed (signed), a free end's in pt. */
      pa = l->ca >= 0 ? pt[l->ca] : 0.0;
      pb = l->cb >= 0 ? pt[l->cb] : 0.0;
      ek = dr.h - (pa - pb + l->fixed);
      e[k] = ek;
      sum += (we * ek) * (we * ek);
      if (fabs (ek) > big * dr.dh_dq)
        big = fabs (ek) / dr.dh_dq;
      inv = 1.0 / dr.dh_dq;
      if (l->ca >= 0)
        {
          res[l->ca] += qk;
          ax[l->pa] += inv;
          b[l->ca] += ek * inv - qk;
        }
      if (l->cb >= 0)
        {
          res[l->cb] -= qk;
          ax[l->pb] += inv;
          b[l->cb] -= ek * inv - qk;
        }
      if (l->pab >= 0)
        ax[l->pab] -= inv;
    }
  *se = sum;
  *worst = big;
  return PLS_OK;
}

/* Merit of the trial point: se + sum (wr res)^2; *flow_res: the larger of
 * the energy figure and the largest imbalance. */
static double
pls_ws_merit (const pls_steady_workspace *ws, double se, double worst, double wr,
              double *flow_res)
{
  double sum = se;
  size_t i;

  for (i = 0; i < ws->nf; i++)
    {
      double ri = ws->res[i];

      sum += (wr * ri) * (wr * ri);
      if (fabs (ri) > worst)
        worst = fabs (ri);
    }
  *flow_res = worst;
  return sum;
}

static void
pls_ws_swap (double **a, double **b)
{
  double *t = *a;

  *a = *b;
  *b = t;
}

/* Accept the trial point. */
static void
pls_ws_accept (pls_steady_workspace *ws)
{
  pls_ws_swap (&ws->q, &ws->qt);
  pls_ws_swap (&ws->p, &ws->pt);
}

pls_status
pls__newton_ws (pls_steady_workspace *ws, const pls_network *net, double air,
                const pls_steady_options *o, double pscale, double fscale,
                pls_steady_result *r, pls_error *err)
{
  cholmod_common *c = ws->c;
  const pls_allocator *prev = pls__cholmod_enter (&ws->alloc);
  pls_status st = PLS_OK;
  double we = 1.0 / pscale, wr = 1.0 / fscale, merit, se = 0.0, worst = 0.0;
  double flow_res = 0.0;
  size_t m = ws->m, nf = ws->nf, k, i;
  int it;

  /* The starting point: alpha = 0 with dq = 0 leaves q and p as they are
   * and evaluates the laws (and the first system) there. */
  memset (ws->dq, 0, m * sizeof *ws->dq);
  memset (ws->dp, 0, nf * sizeof *ws->dp);
  st = pls_ws_trial (ws, net, air, 0.0, 0, we, &se, &worst, err);
  if (st != PLS_OK)
    goto out;
  pls_ws_accept (ws);
  merit = pls_ws_merit (ws, se, worst, wr, &flow_res);

  for (it = 1; it <= o->max_iterations; it++)
    {
      double alpha = 1.0, dpmax = 0.0, trial = 0.0;
      int cuts;

      /* The system assembled at the accepted point: factor and solve. */
      if (nf > 0)
        {
          if (!cholmod_factorize (ws->A, ws->L, c) || c->status < CHOLMOD_OK)
            {
              st = pls_cholmod_status (c, err, "factorisation");
              goto out;
            }
          if (ws->L->minor < ws->L->n)
            {
              int node = ws->col_node[ws->L->minor];

              st = pls__error (err, PLS_ERR_LINALG, -1, node,
                               "the nodal matrix lost positive definiteness near node %d",
                               node);
              goto out;
            }
          if (!cholmod_solve2 (CHOLMOD_A, ws->L, ws->B, NULL, &ws->X, NULL, &ws->Y, &ws->E,
                               c))
            {
              st = pls_cholmod_status (c, err, "solve");
              goto out;
            }
          memcpy (ws->dp, ws->X->x, nf * sizeof *ws->dp);
        }

      for (cuts = 0;; cuts++)
        {
          st = pls_ws_trial (ws, net, air, alpha, cuts == 0, we, &se, &worst, err);
          if (st != PLS_OK)
            goto out;
          trial = pls_ws_merit (ws, se, worst, wr, &flow_res);
          if (it == 1 || trial <= (1.0 - 1e-4 * alpha) * merit || cuts >= 30)
            break;
          alpha *= 0.5;
        }
      for (i = 0; i < nf; i++)
        if (fabs (alpha * ws->dp[i]) > dpmax)
          dpmax = fabs (alpha * ws->dp[i]);
      pls_ws_accept (ws);
      if (it == 1)
        {
          /* The flow scale of the merit: now that the first GGA step has
           * put flows where the laws want them, use their size. */
          double qmax = 0.0;

          for (k = 0; k < m; k++)
            if (fabs (ws->q[k]) > qmax)
              qmax = fabs (ws->q[k]);
          if (qmax > fscale)
            fscale = qmax;
          wr = 1.0 / fscale;
          trial = pls_ws_merit (ws, se, worst, wr, &flow_res);
        }
      merit = trial;
      r->iterations = it;
      r->pressure_change = dpmax;
      r->flow_residual = flow_res;
      if (dpmax <= o->pressure_tolerance && flow_res <= o->flow_tolerance)
        {
          r->converged = 1;
          break;
        }
    }

out:
  pls__cholmod_leave (prev);
  return st;
}
