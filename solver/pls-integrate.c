/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-integrate.c: the implicit integrator of the lumped model.
 *
 * TR-BDF2 (Bank, Coughran, Fichtner, Grosse, Rose & Smith, "Transient
 * simulation of silicon devices and circuits", IEEE Trans. CAD 4(4), 1985;
 * Hosea & Shampine, "Analysis and implementation of TR-BDF2", Appl. Numer.
 * Math. 20, 1996) with gamma = 2 - sqrt 2: a trapezoidal stage to
 * t + gamma h, then a BDF2 stage to t + h.  It is one-step (restarts at
 * every valve event cost nothing), L-stable, second order, and with this
 * gamma both stages have the same coefficient kappa = gamma h / 2 =
 * (1 - gamma) h / (2 - gamma), so both use the same kind of nodal matrix.
 *
 * Written on the conserved quantities m(y) (stored volume V(p) of a node,
 * I q of an inertial link) with the force f(y) (inflow of a node, P_a - P_b
 * - h(q) of a link), each stage solves m(y) - kappa f(y) = m_hist by
 * Newton.  Eliminating each link's flow update from its linearised stage
 * equation, dq = g (dP_a - dP_b - r), g = 1 / (I/kappa + dh/dq), leaves the
 * nodal system (C/kappa + B G B^T) dp = rhs: SPD, with the pattern of the
 * steady solve, analysed once by CHOLMOD and factored numerically at each
 * Newton iteration.  Algebraic links (I = 0) enter the same way.
 *
 * Because the node equations are written on V(p) (conservative form) and
 * every flow's integral is accumulated with the method's own quadrature
 * weights (V_{n+1} - V_n = h [w (f_n + f_g) + w1 f_{n+1}]), the volume
 * balance of the discrete solution holds to the Newton tolerance.
 *
 * Local error: the estimate of Bank et al. (1985), eq. 30,
 *   e = 2 C h [f_n / gamma - f_g / (gamma (1 - gamma)) + f_{n+1} / (1 - gamma)],
 *   C = (-3 gamma^2 + 4 gamma - 2) / (12 (2 - gamma)),
 * filtered through the stage matrix, e <- (M - kappa J)^-1 M e, as Hairer &
 * Wanner do for stiff problems (Solving ODEs II, 2nd ed., sec. IV.8, eq.
 * 8.20) so that stiff, fast-decaying components do not force tiny steps.
 * Steps are accepted when the largest scaled error is <= 1 and resized by
 * 0.9 err^(-1/3) within [0.2, 4].
 */

#include "config.h"

#include <float.h>
#include <math.h>
#include <string.h>

#include "pls-transient-private.h"

#define PLS_GAMMA (2.0 - 1.41421356237309504880)
/* The larger of two numbers without a call into libm (fmax is one here);
 * for the scales of the error norms, which are never NaN. */
#define PLS_MAX(a, b) ((a) > (b) ? (a) : (b))
#define PLS_NEWTON_MAX 12
/* Newton stops when the update is below this fraction of the local error
 * tolerance (Hairer & Wanner sec. IV.8 suggest 0.01 to 0.1; smaller keeps
 * the volume balance tighter at a small cost). */
#define PLS_NEWTON_FRACTION 1e-3
/* A step that could grow by less than this keeps its length instead, so
 * that the next step reuses the factor of its stage matrix, which depends
 * on h (Hairer & Wanner, sec. IV.8, suggest holding h for ratios up to
 * about 1.2). */
#define PLS_HOLD_RATIO 1.2
/* A Newton iteration contracting slower than this asks for a fresh
 * Jacobian.  The nodal matrix is sparse and cheap to factor next to the
 * law evaluations of an iteration (a factorisation is about a quarter of
 * one on the shipped samples), so an aged factor is not kept for long
 * (Hairer & Wanner's RADAU5 recomputes for small systems above a rate of
 * 0.001, from memory; 0.03 did best here, 0.3 took 4 % more work). */
#define PLS_NEWTON_REFRESH 0.03
/* The rate-based test is trusted only while the iteration contracts at
 * least this fast (a rate measured on two iterates is rough). */
#define PLS_NEWTON_RATE 0.5
/* A stage may stop after its first update when the contraction rate
 * measured in an earlier stage says the error left is small enough, and
 * that update is at most PLS_NEWTON_FIRST times the tolerance
 * (pls_stage); rates above PLS_NEWTON_RATE_FIRST are not trusted for it.
 * At 5 tolerances the shipped samples' pressures and shot masses moved
 * by 2e-5 at most and their safe times by 2e-4, a tenth of what
 * tightening rtol from 1e-3 to 1e-4 moves them; at 20 a starved line's
 * lowest model pressure moved by 3 %, away from its value at rtol 1e-4
 * (found by running them). */
#define PLS_NEWTON_RATE_FIRST 0.2
#define PLS_NEWTON_FIRST 5.0
/* ... and every gas chamber's volume balance holds to this fraction of
 * its pressure tolerance's volume (pls_curved_nodes_balanced). */
#define PLS_CHAMBER_BALANCE 1e-6
/* Secant retries of a step to locate a bladder port's switch. */
#define PLS_EVENT_TRIES 8

static double
pls_delta_p (const pls__model *m, const pls__tlink *l, const double *p)
{
  double pa = p[l->a] + m->head[l->a];
  double pb = l->b >= 0 ? p[l->b] + m->head[l->b] : m->head[l->a];

  return pa - pb;
}

/* Law of an element link (pls__element_drop, with the fluid's Carreau
 * form where a law takes the fluid through its viscosity). */
static void
pls_element_law (const pls__model *m, const pls_element *e, double q, pls_drop *d)
{
  switch (e->kind)
    {
    case PLS_ELEMENT_FITTING:
      pls_fitting_drop (&m->fluid_c, &e->u.fitting, q, d);
      break;
    case PLS_ELEMENT_VALVE:
      pls_valve_drop (&m->fluid_c, &e->u.valve, q, d);
      break;
    case PLS_ELEMENT_NOZZLE:
      pls_nozzle_drop (&m->fluid_c, &e->u.nozzle, q, d);
      break;
    default:
      pls__element_drop (m->net, e, m->air_pressure, q, d);
      break;
    }
}

/* Law of link k at flow q. */
void
pls__link_law (const pls__model *m, size_t k, double q, pls_drop *d)
{
  const pls__tlink *l = &m->links[k];
  const pls_element *e = &m->net->elements[l->elem];

  if (fabs (q) < l->lam_qmax)
    {
      /* Laminar Newtonian: the branch pls_line_drop would take. */
      d->h = l->lam_r * q;
      d->dh_dq = l->lam_r;
      return;
    }
  if (l->pl_on)
    {
      /* Laminar power law (pls_power_law_shortcut in pls-lumped.c):
       * pls_line_drop's closed form with its flow-independent factors
       * folded into pl_h (the drop per wall stress, segment share
       * included) and pl_re (the Metzner-Reed number times the wall
       * stress per squared flow), so no division is left. */
      const pls_fluid_params *f = &m->net->fluid;
      double aq = fabs (q), n = f->flow_index, gc = l->pl_gc;
      double gamma = l->pl_s * aq, g2 = gamma * gamma + gc * gc;
      /* g2^((n-3)/2) as exp of its logarithm: a quarter cheaper than
       * pow in glibc, within |(n-3)/2 ln g2| + 2 units in the last place
       * of it (some 1e-14 relative), where pow rounds correctly. */
      double base = f->consistency * exp (0.5 * (n - 3.0) * log (g2)), tau = base * g2 * gamma;

      if (!(aq > 0.0 && tau > 0.0 && l->pl_re * aq * aq > l->pl_re_lo * tau))
        {
          double dtau = l->pl_s * base * (n * gamma * gamma + gc * gc);

          d->h = (q < 0.0 ? -l->pl_h : l->pl_h) * tau;
          d->dh_dq = l->pl_h * dtau;
          return;
        }
    }
  switch (l->kind)
    {
    case PLS__LINK_SEGMENT:
      pls_line_drop (&m->net->fluid, &e->u.line, q, d, NULL);
      d->h *= l->scale;
      d->dh_dq *= l->scale;
      break;
    case PLS__LINK_NECK:
      pls_line_drop (&m->net->fluid, &l->neck, q, d, NULL);
      break;
    case PLS__LINK_NOZZLE:
      {
        /* Valve opening s as a fraction of the flow area: q = s Q_open(dp),
         * h_s(q) = h_open(q / s). */
        double s = m->open[l->app];

        pls_element_law (m, e, q / s, d);
        d->dh_dq /= s;
      }
      break;
    case PLS__LINK_ELEMENT:
    default:
      pls_element_law (m, e, q, d);
      break;
    }
}

/* A link that carries flow now: active in the air state, for an
 * applicator a valve that is not shut, for a neck a bladder port that is
 * open. */
static int
pls_link_on (const pls__model *m, size_t k)
{
  const pls__tlink *l = &m->links[k];

  if (!m->active[k])
    return 0;
  if (l->kind == PLS__LINK_NOZZLE && !(m->open[l->app] > 0.0))
    return 0;
  if (m->shut[k])
    return 0;
  return 1;
}

static pls_status
pls_law_error (const pls__model *m, size_t k, double q, const pls_drop *d, pls_error *err)
{
  char label[96];
  int elem = m->links[k].elem;

  pls__element_label (m->net, elem, label, sizeof label);
  return pls__error (err, PLS_ERR_INVALID, elem, -1,
                     "%s: its law gave drop %g Pa, slope %g at flow %g m^3/s "
                     "(needs finite values and a positive slope)", label, d->h, d->dh_dq, q);
}

/* Forces at state (p, q): fv = inflow of each node (m^3/s), fq = P_a - P_b
 * - h(q) of each inertial link (Pa).  kappa > 0: (p, q) is the solution of
 * a stage with that kappa and the links' history in m->hist_q, and fq is
 * taken from the stage equation itself, I (q - hist_q) / kappa, which
 * equals P_a - P_b - h(q) to the Newton tolerance, without evaluating the
 * laws once more (taking f at the stages from the stage equation is the
 * usual practice for stiff stage methods, as Hosea & Shampine 1996 do,
 * from memory; it also keeps the error estimate clean of the stiff
 * components' Newton residuals); the nodes' inflows are summed from the
 * flows either way, which keeps the volume balance. */
static pls_status
pls_forces (const pls__model *m, const double *p, const double *q, double kappa, double *fv,
            double *fq, pls_error *err)
{
  const double inv_kappa = kappa > 0.0 ? 1.0 / kappa : 0.0;
  size_t k;

  memset (fv, 0, m->n_nodes * sizeof *fv);
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];

      fq[k] = 0.0;
      /* Right after a stage (kappa > 0) its record of the flowing links
       * holds; a fresh start asks the links themselves. */
      if (!(kappa > 0.0 ? m->on[k] : pls_link_on (m, k)))
        continue;
      fv[l->a] -= q[k];
      if (l->b >= 0)
        fv[l->b] += q[k];
      if (l->inertance > 0.0 && kappa > 0.0)
        fq[k] = l->inertance * (q[k] - m->hist_q[k]) * inv_kappa;
      else if (l->inertance > 0.0)
        {
          pls_drop d;

          pls__link_law (m, k, q[k], &d);
          if (!isfinite (d.h) || !isfinite (d.dh_dq) || !(d.dh_dq > 0.0))
            return pls_law_error (m, k, q[k], &d, err);
          fq[k] = pls_delta_p (m, l, p) - d.h;
        }
    }
  return PLS_OK;
}

static pls_status
pls_cholmod_failed (pls__model *m, pls_error *err, const char *what)
{
  if (m->c.status == CHOLMOD_OUT_OF_MEMORY || m->c.status == CHOLMOD_TOO_LARGE)
    return pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory in the sparse %s", what);
  return pls__error (err, PLS_ERR_LINALG, -1, -1,
                     "the sparse %s failed (CHOLMOD status %d)", what, m->c.status);
}

/* Factors the nodal matrix C/kappa + B G B^T with m->g and the node
 * slopes in m->ev (per column). */
static pls_status
pls_factor (pls__model *m, double kappa, pls_error *err)
{
  double *ax;
  size_t k, j;

  if (m->nf == 0)
    return PLS_OK;
  ax = m->A->x;
  memset (ax, 0, m->w.nnz * sizeof *ax);
  for (j = 0; j < m->nf; j++)
    ax[m->w.ap[j + 1] - 1] = m->ev[j] / kappa;   /* diagonal: last in column */
  for (k = 0; k < m->n_links; k++)
    {
      const pls_link *pl = &m->w.links[k];
      double g = m->g[k];

      if (g == 0.0)
        continue;
      if (pl->ca >= 0)
        ax[pl->pa] += g;
      if (pl->cb >= 0)
        ax[pl->pb] += g;
      if (pl->pab >= 0)
        ax[pl->pab] -= g;
    }
  m->factorisations++;
  if (!cholmod_factorize (m->A, m->L, &m->c) || m->c.status < CHOLMOD_OK)
    return pls_cholmod_failed (m, err, "factorisation");
  if (m->L->minor < m->L->n)
    return pls__error (err, PLS_ERR_LINALG, -1, m->col_node[m->L->minor],
                       "the time-domain nodal matrix lost positive definiteness "
                       "near model node %d", m->col_node[m->L->minor]);
  return PLS_OK;
}

/* Solves the linearised stage system with node residuals m->rn (per model
 * node, flow units) and link residuals m->rl (pressure units), on the
 * factor and conductances in place: into m->dp (per model node, 0 at
 * fixed ones) and, with link_updates, m->dq (pls_stage takes each link's
 * update in its own pass over the links instead). */
/* The flow update of link k from the node updates x (per matrix column,
 * NULL when there is none), by the link's columns in the pattern's
 * compact records: a fixed end or the atmosphere has no column and no
 * update. */
static inline double
pls_link_update (const pls__model *m, const double *x, size_t k)
{
  const pls_link *pl = &m->w.links[k];
  double da = pl->ca >= 0 ? x[pl->ca] : 0.0, db = pl->cb >= 0 ? x[pl->cb] : 0.0;

  return m->g[k] * (da - db - m->rl[k]);
}

static pls_status
pls_linear_solve (pls__model *m, int link_updates, pls_error *err)
{
  size_t k, j;

  /* m->dp of the fixed nodes is 0 from the model's allocation on, and
   * only the free nodes' entries are written below. */
  if (m->nf > 0)
    {
      double *b = m->B->x;

      for (j = 0; j < m->nf; j++)
        b[j] = -m->rn[m->col_node[j]];
      for (k = 0; k < m->n_links; k++)
        {
          const pls_link *pl = &m->w.links[k];
          double gr = m->g[k] * m->rl[k];

          if (gr == 0.0)
            continue;
          if (pl->ca >= 0)
            b[pl->ca] += gr;
          if (pl->cb >= 0)
            b[pl->cb] -= gr;
        }
      if (!cholmod_solve2 (CHOLMOD_A, m->L, m->B, NULL, &m->X, NULL, &m->Y, &m->E, &m->c))
        return pls_cholmod_failed (m, err, "solve");
      for (j = 0; j < m->nf; j++)
        m->dp[m->col_node[j]] = ((double *) m->X->x)[j];
    }
  if (link_updates)
    {
      const double *x = m->nf > 0 ? m->X->x : NULL;

      for (k = 0; k < m->n_links; k++)
        m->dq[k] = pls_link_update (m, x, k);
    }
  return PLS_OK;
}

static pls_status pls_algebraic_flow (const pls__model *m, size_t k, double dp, double *q,
                                      pls_error *err);

/* After an update: 1 if the balance V(p) - hist_v = kappa * inflow of
 * every accumulator's gas chamber holds to PLS_CHAMBER_BALANCE of the
 * volume its pressure tolerance stands for, and no liquid node's gas
 * pocket takes part.  A liquid node's stored volume is linear in the
 * pressure while its pocket is empty (above one atmosphere absolute) and
 * the factored slope is that line's, so its balance holds exactly after
 * every linear update (and after pls_pocket_update's, which keeps the
 * linear volume change, but not between the two); a chamber's is off by
 * the curvature of its gas law over the update, which only a further
 * update removes. */
static int
pls_curved_nodes_balanced (const pls__model *m, double kappa, double pscale)
{
  const pls__tolerances *tol = &m->tol;
  size_t j;

  for (j = 0; j < m->nf; j++)
    {
      const pls__tnode *nd = &m->nodes[m->col_node[j]];

      if (nd->pocket_g > 0.0
          && (m->p[m->col_node[j]] - PLS_CAVITATION_PRESSURE < PLS_ATMOSPHERE
              || m->ev[j] != nd->compliance))
        return 0;
    }

  for (j = 0; j < m->n_chambers; j++)
    {
      int n = m->chamber_node[j], k = m->elem_link[m->nodes[n].acc];
      double slope, v, inflow = 0.0;

      if (k >= 0 && m->on[k])
        inflow = m->links[k].b == n ? m->q[k] : -m->q[k];
      v = pls__node_volume (m, (size_t) n, m->p[n], &slope);
      if (!(fabs (v - m->hist_v[n] - kappa * inflow)
            <= PLS_CHAMBER_BALANCE * slope
               * (tol->atol_p + tol->rtol * PLS_MAX (pscale, fabs (m->p[n])))))
        return 0;
    }
  return 1;
}

/* The Newton update of a node with a gas pocket, taken on its stored
 * volume: the node's equation is linear in V, and V(p) goes as -1 / p_abs
 * near vacuum, so a step on p itself overshoots far beyond vacuum from
 * above and crawls back from below.  The volume change of the linear
 * system solved, slope * dp (slope: the node's slope in the factored
 * matrix), is kept and p follows from V exactly (pls__pocket_pressure).
 * Where the pocket is negligible it is the plain step. */
static void
pls_pocket_update (pls__model *m, size_t n, double slope)
{
  const double near = PLS_CAVITATION_PRESSURE + PLS_POCKET_NEAR * PLS_ATMOSPHERE;
  double p = m->p[n];

  if (p > near && p + m->dp[n] > near)
    return;
  m->dp[n] = pls__pocket_pressure (&m->nodes[n], pls__node_volume (m, n, p, NULL)
                                                   + slope * m->dp[n])
             - p;
}

/* Newton on one stage: V(p) - hist_v = kappa * inflow at the free nodes,
 * I (q - hist_q) / kappa + h(q) = dP on the links (I = 0: algebraic).
 * Starts from m->p, m->q; leaves the solution there.  *converged = 0 if
 * the iteration stalled or diverged. */
static pls_status
pls_stage (pls__model *m, double kappa, int *converged, pls_error *err)
{
  const pls__tolerances *tol = &m->tol;
  const double inv_kappa = 1.0 / kappa;
  double prev = INFINITY, prev_fresh = INFINITY, pscale = 0.0, qscale = 0.0;
  double inv_pfloor, inv_qfloor;
  pls_status st;
  size_t k, i;
  int it, slow = 0;

  *converged = 0;
  /* The updates are measured as the local error is (pls_step): flows
   * against the largest flow as well as their own, pressures against the
   * largest pressure too where the tolerances say so. */
  for (k = 0; k < m->n_links; k++)
    qscale = PLS_MAX (qscale, fabs (m->q[k]));
  if (tol->p_scale_global)
    for (i = 0; i < m->nf; i++)
      pscale = PLS_MAX (pscale, fabs (m->p[m->col_node[i]]));
  /* A node's updates are measured against its own size at the step's
   * start: an iterate (or a predicted start) far out on a gas pocket's law
   * must not widen its own tolerance. */
  for (i = 0; i < m->nf; i++)
    {
      size_t n = (size_t) m->col_node[i];

      pls__node_measure (m, n, m->p0[n], 0.0, 0.0, &m->xs[n]);
      m->xs[n] = fabs (m->xs[n]);
    }
  for (k = 0; k < m->n_links; k++)
    m->on[k] = (unsigned char) pls_link_on (m, k);
  /* Every update's scale below is at least the scale of pscale or qscale
   * alone: an update whose ratio to that, a little inflated to cover
   * rounding, does not exceed the worst so far cannot raise it, and needs
   * no division. */
  inv_pfloor = (1.0 + 1e-12) / (tol->atol_p + tol->rtol * pscale);
  inv_qfloor = (1.0 + 1e-12) / (tol->atol_q + tol->rtol * qscale);
  for (it = 0; it < PLS_NEWTON_MAX; it++)
    {
      double worst = 0.0;
      const double *x;
      int refactor = !m->fact_valid || m->fact_kappa != kappa || slow, off_tangent = 0;

      m->newton_iterations++;
      for (i = 0; i < m->n_nodes; i++)
        m->rn[i] = 0.0;
      for (k = 0; k < m->n_links; k++)
        {
          const pls__tlink *l = &m->links[k];
          pls_drop d;

          m->rl[k] = 0.0;
          m->dh[k] = 0.0;   /* the law's slope, 0 for a link that is off */
          if (!m->on[k])
            {
              m->q[k] = 0.0;
              if (m->g[k] != 0.0)
                refactor = 1;
              continue;
            }
          if (fabs (m->q[k]) < l->lam_qmax)
            {
              /* pls__link_law's laminar Newtonian branch, inline: most
               * links of a large manifold of a Newtonian fluid take it. */
              d.h = l->lam_r * m->q[k];
              d.dh_dq = l->lam_r;
            }
          else
            {
              pls__link_law (m, k, m->q[k], &d);
              if (!isfinite (d.h) || !isfinite (d.dh_dq) || !(d.dh_dq > 0.0))
                return pls_law_error (m, k, m->q[k], &d, err);
            }
          m->rl[k] = d.h - pls_delta_p (m, l, m->p);
          if (l->inertance > 0.0)
            m->rl[k] += l->inertance * (m->q[k] - m->hist_q[k]) * inv_kappa;
          m->dh[k] = d.dh_dq;
          if (m->g[k] == 0.0)
            refactor = 1;
          m->rn[l->a] += m->q[k];
          if (l->b >= 0)
            m->rn[l->b] -= m->q[k];
        }
      for (i = 0; i < m->nf; i++)
        {
          int n = m->col_node[i];
          double slope, v = pls__node_volume (m, (size_t) n, m->p[n], &slope);

          m->rn[n] += (v - m->hist_v[n]) * inv_kappa;
          if (refactor)
            m->ev[i] = slope;
        }
      /* Simplified Newton (Hairer & Wanner, sec. IV.8): the factor of an
       * earlier iterate is kept while the iteration contracts fast and
       * kappa and the set of flowing links are unchanged. */
      if (refactor)
        {
          /* The conductances of a fresh Jacobian, 1 / (I / kappa + dh/dq),
           * computed only when it is factored. */
          for (k = 0; k < m->n_links; k++)
            m->g[k] = m->dh[k] > 0.0
                      ? 1.0 / (m->links[k].inertance * inv_kappa + m->dh[k]) : 0.0;
          st = pls_factor (m, kappa, err);
          if (st != PLS_OK)
            {
              m->fact_valid = 0;
              return st;
            }
          m->fact_valid = 1;
          m->fact_kappa = kappa;
          slow = 0;
        }
      st = pls_linear_solve (m, 0, err);
      if (st != PLS_OK)
        return st;
      x = m->nf > 0 ? m->X->x : NULL;
      for (i = 0; i < m->nf; i++)
        {
          int n = m->col_node[i];
          double xn, d;

          d = pls__node_measure (m, (size_t) n, m->p[n], m->dp[n], m->ev[i], &xn);
          if (m->nodes[n].pocket_g > 0.0)
            pls_pocket_update (m, (size_t) n, m->ev[i]);
          if (fabs (d) * inv_pfloor > worst)
            {
              double s = fabs (d) / (tol->atol_p + tol->rtol * PLS_MAX (pscale, m->xs[n]));

              worst = s > worst ? s : worst;
            }
          m->p[n] += m->dp[n];
        }
      for (k = 0; k < m->n_links; k++)
        {
          double s;

          if (m->g[k] == 0.0)
            continue;
          m->dq[k] = pls_link_update (m, x, k);
          /* An algebraic link (no inertance) whose linearised update would
           * more than double its flow or turn it round is far from its law's
           * straight part: a quadratic orifice or a shear-thinning passage
           * near zero flow, where the tangent overshoots and Newton swings
           * from side to side.  There its flow is taken from the law itself
           * at the new pressures (the link's own equation solved exactly),
           * which keeps the iteration on the law's graph; near convergence
           * the steps are small and the plain update stands. */
          if (m->algebraic[k] && fabs (m->dq[k]) > fabs (m->q[k]))
            {
              double q = m->q[k] + m->dq[k];

              st = pls_algebraic_flow (m, k, pls_delta_p (m, &m->links[k], m->p), &q, err);
              if (st != PLS_OK)
                return st;
              m->dq[k] = q - m->q[k];
              off_tangent = 1;
            }
          if (fabs (m->dq[k]) * inv_qfloor > worst)
            {
              s = fabs (m->dq[k])
                  / (tol->atol_q + tol->rtol * PLS_MAX (qscale, fabs (m->q[k])));
              worst = s > worst ? s : worst;
            }
          m->q[k] += m->dq[k];
        }
      if (!isfinite (worst))
        return PLS_OK;   /* not converged: the caller cuts the step */
      /* Converged when the update, or the error left after it as the
       * contraction rate theta = |dx_k| / |dx_k-1| bounds it,
       * theta / (1 - theta) |dx_k| (Hairer & Wanner, sec. IV.8, eq. 8.12),
       * is below the fraction of the tolerance. */
      if (worst <= PLS_NEWTON_FRACTION
          || (it > 0 && worst < PLS_NEWTON_RATE * prev
              && worst * worst / (prev - worst) <= PLS_NEWTON_FRACTION))
        {
          if (it > 0)
            m->newton_rate = worst / prev;
          *converged = 1;
          return PLS_OK;
        }
      /* The first update has no rate of its own: as Hairer & Wanner do
       * (sec. IV.8, the stopping criterion after eq. 8.12), the rate theta
       * of an earlier stage stands in, as eta = max(theta, uround)^0.8,
       * and the stage stops when eta / (1 - eta) |dx_0| is below the
       * fraction of the tolerance.  Only for an update of at most
       * PLS_NEWTON_FIRST tolerances (a rate measured elsewhere says little
       * about an iterate that far off, as on the sharp swings of a
       * starved line); not when a link's flow was taken from its law
       * instead of the linear update (above), nor while a gas chamber's
       * balance is not met: the node balances hold after a further
       * update only then. */
      if (it == 0 && !off_tangent && worst <= PLS_NEWTON_FIRST && m->newton_rate > 0.0
          && m->newton_rate <= PLS_NEWTON_RATE_FIRST)
        {
          double eta = pow (PLS_MAX (m->newton_rate, 1e-16), 0.8);

          if (eta / (1.0 - eta) * worst <= PLS_NEWTON_FRACTION
              && pls_curved_nodes_balanced (m, kappa, pscale))
            {
              *converged = 1;
              return PLS_OK;
            }
        }
      if (refactor && it >= 2 && worst > prev_fresh)
        return PLS_OK;   /* diverging with a fresh Jacobian */
      if (refactor)
        prev_fresh = worst;
      /* Contraction slower than PLS_NEWTON_REFRESH an iteration: a fresh
       * Jacobian next. */
      if (worst > PLS_NEWTON_REFRESH * prev)
        slow = 1;
      prev = worst;
    }
  return PLS_OK;
}

/* A predicted pressure p of node i, or the known one when p would be near
 * vacuum on a gas pocket's law, where an extrapolation in p is a poor
 * guess and may land far beyond vacuum (pls_pocket_update). */
static double
pls_pocket_guess (const pls__model *m, size_t i, double p, double known)
{
  if (m->nodes[i].pocket_g > 0.0
      && p < PLS_CAVITATION_PRESSURE + PLS_POCKET_NEAR * PLS_ATMOSPHERE)
    return known;
  return p;
}

/* Predictor of the first stage: the quadratic through the last accepted
 * step's three points (its dense output, as pls-cycle.c samples it),
 * extrapolated to tp.  The stage starts from y_n otherwise, an O(h)
 * guess; this one is O(h^3) while the solution is smooth, so Newton needs
 * fewer iterations (Hairer & Wanner, sec. IV.8, "starting values").  Not
 * used after a restart, nor for extrapolation beyond twice the last step,
 * where a quadratic is no better than y_n. */
static void
pls_predict (pls__model *m, double tp)
{
  const double t0 = m->pred_t[0], tg = m->pred_t[1], t1 = m->pred_t[2];
  double l0, lg, l1;
  size_t i, k;

  if (!m->pred_valid || !(tp - t1 <= 2.0 * (t1 - t0)) || !(tg > t0 && t1 > tg))
    return;
  l0 = (tp - tg) * (tp - t1) / ((t0 - tg) * (t0 - t1));
  lg = (tp - t0) * (tp - t1) / ((tg - t0) * (tg - t1));
  l1 = (tp - t0) * (tp - tg) / ((t1 - t0) * (t1 - tg));
  for (i = 0; i < m->n_nodes; i++)
    if (!m->nodes[i].fixed)
      m->p[i] = pls_pocket_guess (m, i, l0 * m->pred_p0[i] + lg * m->pred_pg[i] + l1 * m->p0[i],
                                  m->p0[i]);
  for (k = 0; k < m->n_links; k++)
    m->q[k] = l0 * m->pred_q0[k] + lg * m->pred_qg[k] + l1 * m->q0[k];
}

/* One TR-BDF2 step of length h from (m->p, m->q) at t.  On return
 * *converged says whether both stages converged; *errnorm is the scaled
 * local error (only when converged).  m->p, m->q hold the new state;
 * m->p0, m->q0 the old one (restored by the caller on rejection). */
static pls_status
pls_step (pls__model *m, const pls__schedule *s, double t, double h, int *converged,
          double *errnorm, pls_error *err)
{
  const double gam = PLS_GAMMA, kappa = 0.5 * gam * h;
  const double a = 1.0 / (gam * (2.0 - gam)), b = (1.0 - gam) * (1.0 - gam) / (gam * (2.0 - gam));
  const double cerr = (-3.0 * gam * gam + 4.0 * gam - 2.0) / (12.0 * (2.0 - gam));
  size_t n = m->n_nodes, l = m->n_links, i, k;
  double worst = 0.0, qscale = 0.0, pscale = 0.0;
  pls_status st;

  /* Stage 1: trapezoidal rule to t + gamma h. */
  for (i = 0; i < n; i++)
    m->hist_v[i] = pls__node_volume (m, i, m->p0[i], NULL) + kappa * m->fv0[i];
  for (k = 0; k < l; k++)
    {
      const pls__tlink *lk = &m->links[k];

      m->hist_q[k] = lk->inertance > 0.0 ? m->q0[k] + kappa * m->fq0[k] / lk->inertance
                                         : 0.0;
    }
  pls__schedule_apply (m, s, t + gam * h);
  pls_predict (m, t + gam * h);
  st = pls_stage (m, kappa, converged, err);
  if (st != PLS_OK || !*converged)
    return st;
  memcpy (m->pg, m->p, n * sizeof *m->p);
  memcpy (m->qg, m->q, l * sizeof *m->q);
  st = pls_forces (m, m->pg, m->qg, kappa, m->fvg, m->fqg, err);
  if (st != PLS_OK)
    return st;

  /* Stage 2: BDF2 through t, t + gamma h, t + h. */
  /* V(p_n) is stage 1's history less kappa f_n. */
  for (i = 0; i < n; i++)
    m->hist_v[i] = a * pls__node_volume (m, i, m->pg[i], NULL)
                   - b * (m->hist_v[i] - kappa * m->fv0[i]);
  for (k = 0; k < l; k++)
    m->hist_q[k] = a * m->qg[k] - b * m->q0[k];
  /* Predictor: the line through the two known points. */
  for (i = 0; i < n; i++)
    if (!m->nodes[i].fixed)
      m->p[i] = pls_pocket_guess (m, i, m->pg[i] + (m->pg[i] - m->p0[i]) * (1.0 - gam) / gam,
                                  m->pg[i]);
  for (k = 0; k < l; k++)
    m->q[k] = m->qg[k] + (m->qg[k] - m->q0[k]) * (1.0 - gam) / gam;
  pls__schedule_apply (m, s, t + h);
  st = pls_stage (m, kappa, converged, err);
  if (st != PLS_OK || !*converged)
    return st;
  st = pls_forces (m, m->p, m->q, kappa, m->fv1, m->fq1, err);
  if (st != PLS_OK)
    return st;

  /* Error estimate in m-space, filtered through the last stage matrix:
   * solve with residuals -e/kappa (the factor holds C/kappa + B G B^T). */
  {
    /* -e / kappa = e0 f_n + eg f_g + e1 f_{n+1} */
    const double e0 = -2.0 * cerr * h / (gam * kappa);
    const double eg = 2.0 * cerr * h / (gam * (1.0 - gam) * kappa);
    const double e1 = -2.0 * cerr * h / ((1.0 - gam) * kappa);

    /* (The fixed nodes' entries are never read: the solve takes the
     * free nodes' only.) */
    for (i = 0; i < n; i++)
      m->rn[i] = e0 * m->fv0[i] + eg * m->fvg[i] + e1 * m->fv1[i];
    for (k = 0; k < l; k++)
      m->rl[k] = !m->algebraic[k] && m->g[k] != 0.0
                 ? e0 * m->fq0[k] + eg * m->fqg[k] + e1 * m->fq1[k] : 0.0;
  }
  st = pls_linear_solve (m, 1, err);
  if (st != PLS_OK)
    return st;
  /* The scales as the largest of their parts; a NaN anywhere makes the
   * norm NaN (the comparisons are written so), which rejects the step. */
  if (m->tol.p_scale_global)
    for (i = 0; i < m->nf; i++)
      {
        int c = m->col_node[i];

        pscale = PLS_MAX (pscale, PLS_MAX (fabs (m->p0[c]), fabs (m->p[c])));
      }
  for (i = 0; i < m->nf; i++)
    {
      int c = m->col_node[i];
      double x0, x1, d = pls__node_measure (m, (size_t) c, m->p[c], m->dp[c], m->ev[i], &x1);
      double sc, r;

      /* A pocket is measured against its size at the start alone (x0, not
       * x1): one that the step blew up must not pass on its own new size. */
      pls__node_measure (m, (size_t) c, m->p0[c], 0.0, 0.0, &x0);
      sc = m->tol.atol_p + m->tol.rtol * PLS_MAX (pscale, PLS_MAX (fabs (x0), fabs (m->p[c])));
      r = fabs (d) / sc;

      if (!(r <= worst))
        {
          worst = r;
          m->worst = (long) c;
        }
    }
  /* Flows are measured against the largest flow of the network as well as
   * their own: an almost stagnant branch must not hold the step to
   * resolving flows far below anything that matters elsewhere. */
  for (k = 0; k < l; k++)
    qscale = PLS_MAX (qscale, PLS_MAX (fabs (m->q0[k]), fabs (m->q[k])));
  {
    const double inv_sc = 1.0 / (m->tol.atol_q + m->tol.rtol * qscale);

    for (k = 0; k < l; k++)
      {
        double r;

        if (m->algebraic[k] || m->g[k] == 0.0)
          continue;
        r = fabs (m->dq[k]) * inv_sc;
        if (!(r <= worst))
          {
            worst = r;
            m->worst = -1 - (long) k;
          }
      }
  }
  *errnorm = isfinite (worst) ? worst : INFINITY;
  return PLS_OK;
}

/* Flows of the algebraic links from their laws at the present pressures,
 * so that a run starts on a consistent state (after a change of the air
 * state, a dump valve that opens starts at its real flow, not at 0, which
 * Newton would have to reach from far away on a quadratic law). */
static pls_status
pls_consistent_flows (pls__model *m, pls_error *err)
{
  size_t k;

  for (k = 0; k < m->n_links; k++)
    {
      pls_status st;

      if (m->links[k].inertance > 0.0)
        continue;
      if (!pls_link_on (m, k))
        {
          m->q[k] = 0.0;
          continue;
        }
      st = pls_algebraic_flow (m, k, pls_delta_p (m, &m->links[k], m->p), &m->q[k], err);
      if (st != PLS_OK)
        return st;
    }
  return PLS_OK;
}

static void
pls_swap (double **a, double **b)
{
  double *t = *a;

  *a = *b;
  *b = t;
}

static const pls_allocator *
pls_enter (pls__model *m)
{
  return pls__cholmod_enter (m->alloc);
}

/* Pump changeover (PHYSICS.md, pump): a reciprocating pump delivers
 * nothing for changeover_time at each stroke end, i.e. after every half
 * displacement of delivered volume.  The stroke end is a state event; it
 * is taken at the end of the step in which the stroke's volume is reached
 * (late by at most one step, the excess volume carried into the next
 * stroke so the mean delivery is kept); the gap's end is a time event the
 * steps land on.  Returns 1 if a pump stopped or restarted at t. */
static int
pls_changeover (pls__model *m, double t)
{
  size_t k;
  int changed = 0;

  if (!m->air_on || !m->has_changeover)
    return 0;   /* (the scan below reads every element: skip it when idle) */
  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];
      const pls_element *e = &m->net->elements[l->elem];
      double half;

      if (l->kind != PLS__LINK_ELEMENT || e->kind != PLS_ELEMENT_PUMP
          || !(e->u.pump.changeover_time > 0.0))
        continue;
      half = 0.5 * e->u.pump.displacement;
      if (m->gap_end[k] > 0.0)
        {
          if (t >= m->gap_end[k] - 1e-12 * (1.0 + fabs (t)))
            {
              m->gap_end[k] = 0.0;
              m->active[k] = 1;
              changed = 1;
            }
        }
      else if (m->stroke[k] >= half)
        {
          m->stroke[k] = fmod (m->stroke[k], half);
          m->gap_end[k] = t + e->u.pump.changeover_time;
          m->active[k] = 0;
          m->q[k] = 0.0;
          changed = 1;
        }
    }
  return changed;
}

/* Earliest end of a changeover gap after t (INFINITY if none). */
static double
pls_gap_end (const pls__model *m, double t)
{
  double best = INFINITY;
  size_t k;

  for (k = 0; k < m->n_links; k++)
    if (m->gap_end[k] > t && m->gap_end[k] < best)
      best = m->gap_end[k];
  return best;
}

pls_status
pls__integrate (pls__model *m, const pls__schedule *s, double t0, double t1,
                pls__step_fn fn, void *user_data, pls_error *err)
{
  const double gam = PLS_GAMMA;
  const double w = 1.0 / (2.0 * (2.0 - gam)), w1 = (1.0 - gam) / (2.0 - gam);
  const pls_allocator *prev = pls_enter (m);
  size_t n = m->n_nodes, l = m->n_links, k;
  double t = t0, h = m->h_next;
  pls_status st;
  int event_tries = 0;
  double h_pre_event = 0.0;   /* step before an event's secant retries */

  m->stop = 0;
  m->pred_valid = 0;
  /* A run depends on its starting state alone, not on an earlier run's
   * contraction rate. */
  m->newton_rate = 0.0;
  if (!(h > 0.0))
    h = fmin (1e-4, 0.01 * (t1 - t0));
  pls__schedule_apply (m, s, t);
  st = pls_consistent_flows (m, err);
  if (st == PLS_OK)
    st = pls_forces (m, m->p, m->q, 0.0, m->fv0, m->fq0, err);
  if (st != PLS_OK)
    goto out;
  while (t < t1)
    {
      double te = fmin (fmin (pls__schedule_next_event (m, s, t), pls_gap_end (m, t)), t1);
      double hs = h, errn = 0.0, frac = 1.0;
      int conv = 0, landing = 0, port = 0;

      if (hs > m->tol.h_max)
        hs = m->tol.h_max;
      /* Land exactly on the next event; stretch by up to 20 % rather than
       * leave a sliver. */
      if (t + 1.2 * hs >= te)
        {
          hs = te - t;
          landing = 1;
        }
      memcpy (m->p0, m->p, n * sizeof *m->p);
      memcpy (m->q0, m->q, l * sizeof *m->q);
      st = pls_step (m, s, t, hs, &conv, &errn, err);
      if (st != PLS_OK)
        goto out;
      if (!conv || errn > 1.0)
        {
          /* Reject: restore, shrink. */
          memcpy (m->p, m->p0, n * sizeof *m->p);
          memcpy (m->q, m->q0, l * sizeof *m->q);
          m->rejected++;
          /* At most 0.8 hs, so the landing rule (which stretches by up to
           * 20 %) cannot hand back the step just rejected. */
          h = conv ? hs * fmin (0.8, fmax (0.2, 0.9 * pow (errn, -1.0 / 3.0))) : 0.25 * hs;
          if (h < m->tol.h_min)
            {
              st = pls__error (err, PLS_ERR_NO_CONVERGENCE, -1, -1,
                               "the time-domain integration needed a step below %g s "
                               "at t = %g s", m->tol.h_min, t);
              goto out;
            }
          continue;
        }
      port = pls__bladder_scan (m, &frac);
      if (port < 0 && event_tries < PLS_EVENT_TRIES)
        {
          /* A bladder port switched inside the step: take it again up to
           * the crossing (pls-bladder.c). */
          memcpy (m->p, m->p0, n * sizeof *m->p);
          memcpy (m->q, m->q0, l * sizeof *m->q);
          m->rejected++;
          if (event_tries++ == 0)
            h_pre_event = hs;
          h = hs * fmin (0.999, fmax (0.01, frac));
          continue;
        }
      event_tries = 0;
      m->steps++;
      m->pred_t[0] = t;
      m->pred_t[1] = t + gam * hs;
      m->pred_t[2] = landing ? te : t + hs;
      m->pred_valid = 1;
      for (k = 0; k < l; k++)
        {
          double dv = hs * (w * (m->q0[k] + m->qg[k]) + w1 * m->q[k]);

          m->qint[k] += dv;
          m->stroke[k] += dv;
        }
      if (fn != NULL)
        {
          st = fn (user_data, m, t, t + gam * hs, landing ? te : t + hs);
          if (st != PLS_OK)
            goto out;
        }
      /* The step's start and inner stage become the predictor's; the
       * arrays trade places (the next step overwrites p0, pg first). */
      pls_swap (&m->pred_p0, &m->p0);
      pls_swap (&m->pred_pg, &m->pg);
      pls_swap (&m->pred_q0, &m->q0);
      pls_swap (&m->pred_qg, &m->qg);
      t = landing ? te : t + hs;
      if (m->stop)
        break;
      if (pls_changeover (m, t) | (port != 0 && pls__bladder_switch (m, 0)))
        {
          /* A pump stopped or restarted, or a bladder port switched: a
           * flow jumps, so f_n is taken afresh from consistent algebraic
           * flows. */
          m->pred_valid = 0;
          st = pls_consistent_flows (m, err);
          if (st == PLS_OK)
            st = pls_forces (m, m->p, m->q, 0.0, m->fv0, m->fq0, err);
          if (st != PLS_OK)
            goto out;
        }
      else
        {
          /* f at the new point is the next step's f_n. */
          pls_swap (&m->fv0, &m->fv1);
          pls_swap (&m->fq0, &m->fq1);
        }
      {
        double grow = errn > 0.0 ? fmin (4.0, fmax (0.2, 0.9 * pow (errn, -1.0 / 3.0))) : 4.0;

        /* A landing step cut short by an event says little about the step
         * the error allows: keep the controller's earlier figure then. */
        if (landing && hs < h)
          h = fmax (h, hs * grow);
        else if (grow >= 1.0 && grow <= PLS_HOLD_RATIO && m->fact_valid)
          h = hs;   /* hold: the factor of this step serves the next one */
        else
          h = hs * grow;
        /* A step cut short to meet a port's switch passed its error test
         * at full length: the next one may take that length again. */
        if (h_pre_event > 0.0)
          {
            h = fmax (h, h_pre_event);
            h_pre_event = 0.0;
          }
      }
    }
  m->h_next = h;
  st = PLS_OK;

out:
  pls__cholmod_leave (prev);
  return st;
}

/* Implicit Euler steps of growing length until the state stops moving. */
static pls_status
pls_settle_once (pls__model *m, double *pscale, pls_error *err)
{
  size_t n = m->n_nodes, l = m->n_links, i;
  double h = 1e-4;
  pls_status st;
  int tries, quiet = 0;

  for (tries = 0; tries < 200 && quiet < 2; tries++)
    {
      double change = 0.0;
      int conv = 0;

      /* Implicit Euler: V(p) - V(p_n) = h inflow, I (q - q_n) / h = dP - h(q). */
      memcpy (m->p0, m->p, n * sizeof *m->p);
      memcpy (m->q0, m->q, l * sizeof *m->q);
      for (i = 0; i < n; i++)
        m->hist_v[i] = pls__node_volume (m, i, m->p0[i], NULL);
      memcpy (m->hist_q, m->q0, l * sizeof *m->q0);
      st = pls_stage (m, h, &conv, err);
      if (st != PLS_OK)
        return st;
      if (!conv)
        {
          memcpy (m->p, m->p0, n * sizeof *m->p);
          memcpy (m->q, m->q0, l * sizeof *m->q);
          h *= 0.1;
          if (h < 1e-12)
            return pls__error (err, PLS_ERR_NO_CONVERGENCE, -1, -1,
                               "the starting state of the time-domain model "
                               "could not be found");
          continue;
        }
      for (i = 0; i < n; i++)
        {
          change = fmax (change, fabs (m->p[i] - m->p0[i]));
          *pscale = fmax (*pscale, fabs (m->p[i]));
        }
      quiet = (h >= 1e5 && change <= 1e-10 * *pscale) ? quiet + 1 : 0;
      h = fmin (h * 10.0, 1e8);
    }
  return PLS_OK;
}

pls_status
pls__settle (pls__model *m, const pls__schedule *s, double t, pls_error *err)
{
  const pls_allocator *prev = pls_enter (m);
  double pscale = 1.0;
  pls_status st = PLS_OK;
  size_t i, k;
  int round;

  pls__schedule_apply (m, s, t);
  for (i = 0; i < m->n_nodes; i++)
    pscale = fmax (pscale, fabs (m->p[i]));
  /* A state settled with a bladder port in the wrong state (open below its
   * precharge, shut below the line's pressure) is settled again with the
   * port switched. */
  for (round = 0; round < 4 && st == PLS_OK; round++)
    if (round == 0 || pls__bladder_switch (m, 1))
      st = pls_settle_once (m, &pscale, err);
  for (k = 0; k < m->n_links; k++)
    m->qint[k] = 0.0;
  m->h_next = 0.0;
  pls__cholmod_leave (prev);
  return st;
}

/* ---- the ODE form, for the tests' independent integrator ---------------- */

size_t
pls__ode_size (const pls__model *m)
{
  size_t k, n = m->nf;

  for (k = 0; k < m->n_links; k++)
    if (m->links[k].inertance > 0.0)
      n++;
  return n;
}

void
pls__ode_pack (const pls__model *m, double *y)
{
  size_t k, j, n = 0;

  for (j = 0; j < m->nf; j++)
    y[n++] = m->p[m->col_node[j]];
  for (k = 0; k < m->n_links; k++)
    if (m->links[k].inertance > 0.0)
      y[n++] = m->q[k];
}

void
pls__ode_unpack (pls__model *m, const double *y)
{
  size_t k, j, n = 0;

  for (j = 0; j < m->nf; j++)
    m->p[m->col_node[j]] = y[n++];
  for (k = 0; k < m->n_links; k++)
    if (m->links[k].inertance > 0.0)
      m->q[k] = y[n++];
}

/* Flow of an algebraic link at a pressure difference dp: the root of
 * h(q) = dp by Newton's method safeguarded with bisection (h is strictly
 * increasing, so the root is unique). */
static pls_status
pls_algebraic_flow (const pls__model *m, size_t k, double dp, double *q, pls_error *err)
{
  double lo, hi, x = *q, step = fmax (1e-9, fabs (x));
  pls_drop d;
  int it;

  pls__link_law (m, k, x, &d);
  if (!isfinite (d.h))
    return pls_law_error (m, k, x, &d, err);
  /* Bracket. */
  lo = hi = x;
  if (d.h > dp)
    for (it = 0; it < 200; it++)
      {
        lo -= step;
        step *= 2.0;
        pls__link_law (m, k, lo, &d);
        if (d.h <= dp)
          break;
      }
  else
    for (it = 0; it < 200; it++)
      {
        hi += step;
        step *= 2.0;
        pls__link_law (m, k, hi, &d);
        if (d.h >= dp)
          break;
      }
  for (it = 0; it < 200; it++)
    {
      double nx;

      pls__link_law (m, k, x, &d);
      /* Solved to rounding: the drop meets dp within a few units in the
       * last place (near zero flow the bracket would otherwise be halved
       * on for dozens of steps, every one of them a root as good as x). */
      if (fabs (d.h - dp) <= 4.0 * DBL_EPSILON * fabs (dp))
        break;
      if (d.h > dp)
        hi = x;
      else
        lo = x;
      nx = x - (d.h - dp) / d.dh_dq;
      if (!(nx > lo && nx < hi))
        nx = 0.5 * (lo + hi);
      if (fabs (nx - x) <= 1e-15 * fmax (fabs (nx), 1e-20) || hi - lo <= 1e-15 * fabs (hi))
        {
          x = nx;
          break;
        }
      x = nx;
    }
  *q = x;
  return PLS_OK;
}

pls_status
pls__ode_rhs (pls__model *m, double t, const pls__schedule *s, const double *y,
              double *ydot)
{
  size_t k, j, n = 0;
  pls_status st;

  pls__ode_unpack (m, y);
  pls__schedule_apply (m, s, t);
  for (k = 0; k < m->n_links; k++)
    {
      if (!pls_link_on (m, k))
        {
          m->q[k] = 0.0;
          continue;
        }
      if (m->links[k].inertance > 0.0)
        continue;
      st = pls_algebraic_flow (m, k, pls_delta_p (m, &m->links[k], m->p), &m->q[k], NULL);
      if (st != PLS_OK)
        return st;
    }
  st = pls_forces (m, m->p, m->q, 0.0, m->fv1, m->fq1, NULL);
  if (st != PLS_OK)
    return st;
  for (j = 0; j < m->nf; j++)
    {
      int i = m->col_node[j];
      double slope;

      pls__node_volume (m, (size_t) i, m->p[i], &slope);
      ydot[n++] = m->fv1[i] / slope;
    }
  for (k = 0; k < m->n_links; k++)
    if (m->links[k].inertance > 0.0)
      ydot[n++] = m->fq1[k] / m->links[k].inertance;
  return PLS_OK;
}
