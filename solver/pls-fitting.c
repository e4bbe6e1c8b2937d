/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-fitting.c: tee, elbow and other fitting losses by Hooper's 2-K method
 * (W. B. Hooper, "The two-K method predicts head losses in pipe fittings",
 * Chem. Eng., Aug. 24, 1981):
 *   K = K1 / Re + Kinf (1 + 1 / D_inch),  dp = K rho V |V| / 2.
 * The 1/Re term is what makes the method fit the Re 1..100 of adhesives,
 * where a fixed K is wrong by orders of magnitude.
 */
#include "config.h"

#include "pls-laws.h"

#include <math.h>

/* Non-Newtonian fluids: Re = rho V D / mu_app with the apparent viscosity
 * at the nominal shear rate 8V/D (a stated choice; Hooper's data are for
 * Newtonian fluids).  Then K1/Re rho V^2/2 = K1 mu_app V / (2 D)
 * = K1 tau(8V/D) / 16, which is smooth and strictly increasing in V and
 * gives the finite slope K1 mu_0 / (2 D A) at q = 0. */
void
pls_fitting_drop (const pls_fluid_params *f, const pls_fitting_params *p,
                  double q, pls_drop *out)
{
  double d = p->bore, area = 0.25 * PLS_PI * d * d, aq = fabs (q);
  double sg = q < 0.0 ? -1.0 : 1.0, gamma = 8.0 * aq / (area * d), slope, tau;
  /* 1 / D_inch = 0.0254 m / D: Hooper's size correction, D in inches. */
  double kt = p->k_infinity * (1.0 + 0.0254 / d);
  double kq = f->density / (2.0 * area * area);

  tau = pls_fluid_shear_stress (f, gamma, &slope);
  out->h = sg * (p->k1 * tau / 16.0 + kt * kq * aq * aq);
  out->dh_dq = p->k1 * slope / (2.0 * d * area) + 2.0 * kt * kq * aq;
}
