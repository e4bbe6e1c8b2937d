/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-pocket.c: the trace of free gas in the liquid, which lets a column
 * part.
 *
 * A liquid cannot be pulled below its vapour pressure: there the column
 * separates and a cavity opens until the columns meet again, with a
 * pressure spike.  Without it the lumped model lets a rarefaction wave
 * (the dump valve opening on a long line, a shot drawing on a starved
 * manifold) swing a node tens of bars below vacuum.
 *
 * The model follows it as the discrete gas cavity model does (Provoost &
 * Wylie 1981; Wylie, "Simulation of vaporous and gaseous cavitation",
 * J. Fluids Eng. 106, 1984; Bergant, Simpson & Tijsseling, "Water hammer
 * with column separation: a historical review", J. Fluids Struct. 22,
 * 2006; all from memory): every liquid node holds a small free gas volume,
 * alpha V at one atmosphere, that follows Boyle's law on the pressure
 * above the vapour pressure, Vg = alpha V p_atm / (p - p_v).  At working
 * pressures it is nothing (alpha 1e-7: 1e-12 of the node at 100 bar), so
 * the model counts only its growth below one atmosphere, with a tangent
 * taken off that makes it vanish smoothly there (pls__pocket_volume);
 * near vacuum it grows without bound, so the pressure stays above p_v and
 * the node's volume balance goes into the pocket, which is then the
 * cavity.
 * Unlike a vapour cavity switched in and out as an event, the pocket is a
 * smooth part of the node's stored volume V(p), so the integrator's error
 * control and Newton see no corner and nodes that sit near vacuum in a
 * vaporous zone do not chatter in and out of a cavity.  The vapour
 * pressure is taken as absolute zero (PLS_CAVITATION_PRESSURE).
 */

#include "config.h"

#include <math.h>
#include <stdio.h>

#include "pls-transient-private.h"

/* alpha, the free gas volume fraction at one atmosphere: 1e-7, the value
 * Wylie (1984) found to reproduce vapour cavities closely (from memory). */
#define PLS_POCKET_FRACTION 1e-7
/* The pocket's law holds down to the pressure where it is this many times
 * the node's liquid volume; below, its tangent. */
#define PLS_POCKET_MAX_RATIO 1e3
/* A node "parts" (the finding) when its pocket has grown this many times
 * its size at one atmosphere: 1 kPa absolute, about the vapour pressure of
 * water at 7 degrees C (from memory). */
#define PLS_POCKET_PARTED_RATIO 100.0

/* A cavity of less than this share of its node's liquid volume is told as
 * information, not a warning: the liquid touched vacuum for a moment (a
 * modelling choice, common practice, no source). */
#define PLS_POCKET_WARN_SHARE 0.01

void
pls__pocket_init (pls__tnode *nd)
{
  nd->pocket_g = PLS_POCKET_FRACTION * nd->volume * PLS_ATMOSPHERE;
  nd->pocket_floor = PLS_POCKET_FRACTION * PLS_ATMOSPHERE / PLS_POCKET_MAX_RATIO;
}

void
pls__pocket_track (const pls__model *m, double *p_low)
{
  size_t i;

  /* Comparisons, not fmin: this runs over every node at every step, and
   * fmin is a call into libm here. */
  for (i = 0; i < m->n_nodes; i++)
    {
      double lo = m->pg[i] < m->p[i] ? m->pg[i] : m->p[i];

      if (lo < p_low[i])
        p_low[i] = lo;
    }
}

/* The network part a model node stands for: the node itself (*node), or
 * for a line's interior node the line (*element); its label in buf. */
static void
pls_model_node_part (const pls__model *m, size_t i, int *node, int *element, char *buf,
                     size_t len)
{
  size_t k;

  *node = *element = -1;
  if (i < m->n_net_nodes)
    {
      *node = (int) i;
      pls__node_label (m->net, *node, buf, len);
      return;
    }
  for (k = 0; k < m->n_links; k++)
    if (m->links[k].kind == PLS__LINK_SEGMENT && m->links[k].b == (int) i)
      {
        *element = m->links[k].elem;
        pls__element_label (m->net, *element, buf, len);
        return;
      }
  snprintf (buf, len, "model node %zu", i);
}

pls_status
pls__pocket_finding (pls_finding_list *list, const pls_allocator *a, const pls__model *m,
                     const double *p_low, const char *code, const char *run)
{
  size_t i, n_parted = 0, worst = 0;
  double worst_v = 0.0;
  char label[96];
  int node, element;

  for (i = 0; i < m->n_nodes; i++)
    {
      const pls__tnode *nd = &m->nodes[i];
      double sg, v;

      if (!(nd->pocket_g > 0.0))
        continue;
      v = pls__pocket_volume (nd, p_low[i], &sg);
      if (!(v >= PLS_POCKET_PARTED_RATIO * nd->pocket_g / PLS_ATMOSPHERE))
        continue;
      if (n_parted++ == 0 || v > worst_v)
        {
          worst = i;
          worst_v = v;
        }
    }
  if (n_parted == 0)
    return PLS_OK;
  pls_model_node_part (m, worst, &node, &element, label, sizeof label);
  return pls__finding_add (list, a,
                           worst_v >= PLS_POCKET_WARN_SHARE * m->nodes[worst].volume
                           ? PLS_SEVERITY_WARNING : PLS_SEVERITY_INFO,
                           code, element, node, worst_v,
                           PLS_CAVITATION_PRESSURE,
                           "the liquid parts at %s in the %s: a cavity of up to %.3g mL "
                           "opens near vacuum and the columns meet again with a pressure "
                           "spike (%zu model node%s in all)",
                           label, run, worst_v * 1e6, n_parted, n_parted == 1 ? "" : "s");
}

/* Below one atmosphere V = C p - g (t - pa)^2 / (pa t^2), pa = p - p_c,
 * t = p_atm, is (C - g / t^2) pa - g / pa = R with R = V - C p_c - 2 g / t:
 * the positive root of C' pa^2 - R pa - g = 0, written without
 * cancellation on either sign of R; above, V = C p; below the floor the
 * tangent's inverse. */
double
pls__pocket_pressure (const pls__tnode *nd, double v)
{
  const double c = nd->compliance, g = nd->pocket_g, f = nd->pocket_floor;
  const double t = PLS_ATMOSPHERE, c1 = c - g / (t * t);
  double r, disc, pa, slope, vf;

  if (v >= 0.0)
    return v / c;   /* at or above one atmosphere: no pocket */
  r = v - c * PLS_CAVITATION_PRESSURE - 2.0 * g / t;
  disc = sqrt (r * r + 4.0 * c1 * g);
  pa = r >= 0.0 ? (r + disc) / (2.0 * c1) : 2.0 * g / (disc - r);
  if (pa >= f)
    return PLS_CAVITATION_PRESSURE + pa;
  /* On the tangent below the floor: V = V(f) + slope(f) (pa - f). */
  vf = c * (PLS_CAVITATION_PRESSURE + f) - pls__pocket_volume (nd, PLS_CAVITATION_PRESSURE + f,
                                                                &slope);
  return PLS_CAVITATION_PRESSURE + f + (v - vf) / (c - slope);
}
