/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-pump.c: air-driven reciprocating ratio pump with an outlet check valve.
 *
 * Stall pressure = ratio x air pressure - seal friction (the definition of
 * the pump ratio; common practice, no source).  Delivered flow falls to zero
 * at stall: Q = Q_free (1 - p / p_stall)^m, Q_free = cycle rate x
 * displacement.  As a drop law (h = p_in - p_out = -p at a zero inlet):
 *   h(q) = -p_stall [1 - (q / Q_free)^(1/m)].
 */
#include "config.h"

#include "pls-laws.h"

#include <math.h>

/* Regularisation of u^a, u = q/Q_free, a = 1/m (g below).  For m > 1
 * (a < 1) its slope is infinite at u = 0: below u1 = 1e-6 the curve is the
 * quadratic alpha u + beta u^2 that meets u^a with the same value and
 * slope at u1 (alpha = (2 - a) u1^(a-1), beta = (a - 1) u1^(a-2); its slope
 * falls linearly from alpha to a u1^(a-1) > 0).  Exact above u1, i.e. for
 * all but the last millionth of the flow range.  For m <= 1 (a >= 1) the
 * slope is zero at u = 0: g = (u^a + eps u) / (1 + eps), eps = 1e-6, exact
 * at stall and at free flow, off by at most 1e-6 of the stall pressure. */
#define PUMP_U1 1e-6
#define PUMP_EPS 1e-6
/* Check valve, reverse flow: the slope grows smoothly (over a flow scale of
 * 1e-3 Q_free) to 1e3 p_ref / Q_free, i.e. a leak of Q_free/1000 takes the
 * reference pressure.  Steep but finite, as the contract requires; the
 * figures are a modelling choice (common practice, no source). */
#define PUMP_CHECK_SLOPE 1e3
#define PUMP_CHECK_FLOW 1e-3
/* A tiny resistance in series, 1e-9 p_ref / Q_free, keeps dh/dq > 0 when the
 * pump is stopped (stall 0): forward flow then passes the open check
 * valves.  It shifts the free flow by 1e-9 of Q_free. */
#define PUMP_FLOOR 1e-9

/* g(u) and dg/du for u >= 0. */
static double
curve_shape (double a, double u, double *dg)
{
  if (a >= 1.0)
    {
      double ua1 = pow (u, a - 1.0);

      *dg = (a * ua1 + PUMP_EPS) / (1.0 + PUMP_EPS);
      return (u * ua1 + PUMP_EPS * u) / (1.0 + PUMP_EPS);
    }
  if (u < PUMP_U1)
    {
      double alpha = (2.0 - a) * pow (PUMP_U1, a - 1.0);
      double beta = (a - 1.0) * pow (PUMP_U1, a - 2.0);

      *dg = alpha + 2.0 * beta * u;
      return u * (alpha + beta * u);
    }
  *dg = a * pow (u, a - 1.0);
  return pow (u, a);
}

double
pls_pump_free_flow (const pls_pump_params *p)
{
  return p->max_cycle_rate * p->displacement;
}

double
pls_pump_stall_pressure (const pls_pump_params *p, double air_pressure)
{
  double ps;

  if (!(air_pressure > 0.0))
    air_pressure = 0.0;
  ps = p->ratio * air_pressure - p->friction_offset;
  return ps > 0.0 ? ps : 0.0;
}

void
pls_pump_drop (const pls_pump_params *p, double air_pressure, double q, pls_drop *out)
{
  double qf = pls_pump_free_flow (p), ps = pls_pump_stall_pressure (p, air_pressure);
  /* Reference pressure for the regularising slopes: the stall pressure, but
   * at least the stall at 1 bar of air so a stopped pump keeps a scale. */
  double pref = fmax (ps, p->ratio * 1e5);
  double a = 1.0 / p->curve_exponent, dg0;
  double floor_slope = PUMP_FLOOR * pref / qf;

  if (q >= 0.0)
    {
      double dg, g = curve_shape (a, q / qf, &dg);

      out->h = -ps * (1.0 - g) + floor_slope * q;
      out->dh_dq = ps * dg / qf + floor_slope;
    }
  else
    {
      /* h' = s_cv - (s_cv - s0) e^(q/qb): equal to the curve's slope s0 at
       * q = 0 (C1), s_cv for q << -qb, and > 0 in between. */
      double s0, scv = PUMP_CHECK_SLOPE * pref / qf, qb = PUMP_CHECK_FLOW * qf;
      double e = exp (q / qb);

      curve_shape (a, 0.0, &dg0);
      s0 = ps * dg0 / qf + floor_slope;
      /* Written without scv - s0, which would cancel when s0 << scv. */
      out->h = -ps + s0 * qb * expm1 (q / qb) + scv * (q - qb * expm1 (q / qb));
      out->dh_dq = s0 * e - scv * expm1 (q / qb);
    }
}
