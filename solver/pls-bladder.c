/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-bladder.c: the accumulator's fluid port in the time domain, a
 * switched state.
 *
 * Above its precharge p0 the chamber holds the polytropic fluid volume
 * Vf(p) = V0 [1 - (p0/p)^(1/n)] (absolute pressures; PHYSICS.md,
 * accumulator).  When the fluid volume reaches zero the bladder seats on
 * the anti-extrusion poppet at the port and shuts it: the accumulator
 * then holds its precharge and no fluid, and the line no longer sees it.
 * The port opens again when the line's pressure at the neck rises back
 * above the chamber's.
 *
 * The model keeps the two regimes apart instead of joining them by a
 * smoothed corner: a corner in Vf(p) leaves the chamber with only the
 * neck's tiny compliance behind the neck's inertance, a stiff, lightly
 * damped oscillator whose passage through the corner forced steps of a
 * few microseconds for tens of milliseconds.  Shut, the neck carries no
 * flow and the chamber keeps the pressure and volume it had at closing
 * (so the volume balance holds exactly across the switch); open, Vf is
 * the exact law above p0 and its tangent at p0 below it (a C1 extension
 * that only the step crossing p0 and Newton's trial points see).
 *
 * Closing and opening are state events located by the secant rule on the
 * step: g = p_chamber - p0 while open and flowing out, g = P_node -
 * P_chamber while shut.  A step that crosses g = 0 by more than the
 * event tolerance is taken again, shortened to the secant estimate of the
 * crossing (event location as in Hairer, Norsett & Wanner, Solving ODEs
 * I, 2nd ed., sec. II.6 on discontinuous equations; the section from
 * memory); one that ends within the tolerance switches at its end.
 */

#include "config.h"

#include <math.h>

#include "pls-transient-private.h"

/* Event tolerance: this fraction of the local pressure error tolerance at
 * the precharge (a chamber shut that far below p0 holds a negative fluid
 * volume of slope(p0) times it, far below the step's own error). */
#define PLS_BLADDER_EVENT_FRACTION 0.1

static double
pls_precharge_abs (const pls_accumulator_params *p)
{
  return pls_accumulator_effective_precharge (p) + PLS_ATMOSPHERE;
}

double
pls__bladder_volume (const pls_accumulator_params *p, double pressure, double *slope)
{
  double p0 = pls_precharge_abs (p), pa = pressure + PLS_ATMOSPHERE;
  double n = p->polytropic_exponent;

  if (pa > p0)
    {
      double r = pow (p0 / pa, 1.0 / n);

      /* -expm1 keeps Vf accurate just above p0. */
      *slope = p->gas_volume * r / (n * pa);
      return -p->gas_volume * expm1 (log (p0 / pa) / n);
    }
  *slope = p->gas_volume / (n * p0);
  return *slope * (pa - p0);
}

static const pls_accumulator_params *
pls_neck_params (const pls__model *m, size_t k)
{
  return &m->net->elements[m->links[k].elem].u.accumulator;
}

static double
pls_event_tolerance (const pls__model *m, const pls_accumulator_params *ap)
{
  return m->tol.atol_p + PLS_BLADDER_EVENT_FRACTION * m->tol.rtol * pls_precharge_abs (ap);
}

/* Event function of neck k at state (p, q), and whether the port would
 * switch there: see the file comment. */
static double
pls_event_value (const pls__model *m, size_t k, const double *p)
{
  const pls__tlink *l = &m->links[k];

  if (m->shut[k])
    return p[l->a] - p[l->b];   /* chamber and node at the same elevation */
  return p[l->b] - pls_accumulator_effective_precharge (pls_neck_params (m, k));
}

int
pls__bladder_scan (const pls__model *m, double *frac)
{
  int found = 0;
  size_t k;

  *frac = 1.0;
  for (k = 0; k < m->n_links; k++)
    {
      double g0, g1, tol;

      if (m->links[k].kind != PLS__LINK_NECK)
        continue;
      tol = pls_event_tolerance (m, pls_neck_params (m, k));
      g0 = pls_event_value (m, k, m->p0);
      g1 = pls_event_value (m, k, m->p);
      if (m->shut[k])
        {
          /* Opens when the node rises above the chamber. */
          if (g1 > tol && g0 < 0.0)
            {
              *frac = fmin (*frac, -g0 / (g1 - g0));
              found = -1;
            }
          else if (g1 > 0.0 && found == 0)
            found = 1;
        }
      else if (m->q[k] < 0.0)
        {
          /* Shuts when the outflow empties it. */
          if (g1 < -tol && g0 > 0.0)
            {
              *frac = fmin (*frac, g0 / (g0 - g1));
              found = -1;
            }
          else if (g1 < tol && found == 0)
            found = 1;
        }
    }
  return found;
}

int
pls__bladder_switch (pls__model *m, int at_rest)
{
  int changed = 0;
  size_t k;

  for (k = 0; k < m->n_links; k++)
    {
      const pls__tlink *l = &m->links[k];
      double g;

      if (l->kind != PLS__LINK_NECK)
        continue;
      g = pls_event_value (m, k, m->p);
      if (m->shut[k] && g > 0.0)
        {
          m->shut[k] = 0;
          m->q[k] = 0.0;
          changed = 1;
        }
      else if (!m->shut[k] && (at_rest || m->q[k] < 0.0)
               && g < (at_rest ? 0.0 : pls_event_tolerance (m, pls_neck_params (m, k))))
        {
          m->shut[k] = 1;
          m->q[k] = 0.0;
          /* At rest (a starting state) the chamber holds its precharge and
           * no fluid; after an event it keeps the state it closed in. */
          if (at_rest)
            m->p[l->b] = pls_accumulator_effective_precharge (pls_neck_params (m, k));
          changed = 1;
        }
    }
  return changed;
}
