/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-valve.c: ball valve and dump valve, held open.
 */
#include "config.h"

#include "pls-laws.h"

#include <math.h>

/* Flow coefficient (IEC 60534-1 / VDI/VDE 2173):
 *   Q [m^3/h] = Kv sqrt(dp / 1 bar * 1000 kg/m^3 / rho),
 * so dp = 1 bar (rho / 1000) (Q / Kv)^2 with Q in m^3/h.  Kv is measured in
 * turbulent water flow; a viscous adhesive at low Re sees a loss that grows
 * with viscosity, which the Kv law does not know.  The laminar floor adds
 * Hooper's viscous 2-K term K1/Re for the valve type (see pls-fitting.c),
 * K1 tau(8V/D) / 16 on the valve bore: it keeps dh/dq > 0 at q = 0 and is
 * negligible for water at the flows where Kv was measured. */
void
pls_valve_drop (const pls_fluid_params *f, const pls_valve_params *p,
                double q, pls_drop *out)
{
  double d = p->bore, area = 0.25 * PLS_PI * d * d, aq = fabs (q);
  double sg = q < 0.0 ? -1.0 : 1.0, gamma = 8.0 * aq / (area * d), slope, tau;
  double kv_si = p->kv / 3600.0;   /* (m^3/s) at 1 bar, water */
  double a = 1e5 * (f->density / 1000.0) / (kv_si * kv_si);
  /* Ball valve: full-bore ball; dump valve: a seat (globe-type) valve. */
  double k1 = p->kind == PLS_VALVE_DUMP ? PLS_HOOPER_GLOBE_VALVE_K1
                                        : PLS_HOOPER_BALL_VALVE_K1;

  tau = pls_fluid_shear_stress (f, gamma, &slope);
  out->h = sg * (k1 * tau / 16.0 + a * aq * aq);
  out->dh_dq = k1 * slope / (2.0 * d * area) + 2.0 * a * aq;
}
