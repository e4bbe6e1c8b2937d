/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-nozzle.c: applicator (valve + passage + orifice to atmosphere), open.
 *
 *   dp = R_passage Q + rho U^2 / 2,  U = V / Cd,
 * with V = Q / A the mean orifice velocity and U the ideal jet velocity
 * sqrt(2 dp_orifice / rho), i.e. dp_orifice = rho Q^2 / (2 Cd^2 A^2).
 */
#include "config.h"

#include "pls-laws.h"

#include <float.h>
#include <math.h>

#define PLS_INV_LN10 0.43429448190325182765  /* 1 / ln 10 (M_LOG10E is not C11) */

/* Lichtarowicz, Duggins & Markland, J. Mech. Eng. Sci. 7(2), 1965, eq. for
 * long orifices (coefficients from memory; they reproduce the check value
 * l/d 2, Re 1e3 -> Cd 0.7446 of PHYSICS.md, see test-nozzle.c):
 *   1/Cd = 1/Cd_u + 20 (1 + 2.25 l/d) / Re
 *          - 0.005 (l/d) / (1 + 7.5 [log10(0.00015 Re)]^2),
 * Cd_u the high-Re value (they fit Cd_u = 0.827 - 0.0085 l/d; here it is
 * the user's discharge_coefficient).  Re is built on the ideal jet velocity
 * U = sqrt(2 dp / rho): only that definition gives what the paper and
 * PHYSICS.md state, Q proportional to dp as Re -> 0 (with the mean velocity
 * the first two terms alone would give a constant dp as Q -> 0).
 * The two-term form without the last term gives 0.7580 (Cd_u 0.827) or
 * 0.7437 (Cd_u 0.810) at the check point, so the third term is kept. */
static double
bump (double ld, double re, double *re_dbump, double *re2_dbump2)
{
  double l, den;   /* den: 1 / (1 + 7.5 l^2) */

  if (!(re > 0.0) || ld == 0.0)
    {
      *re_dbump = 0.0;
      if (re2_dbump2 != NULL)
        *re2_dbump2 = 0.0;
      return 0.0;
    }
  /* log10 through log: glibc's log10 is log plus a scaling, and this is
   * the hot spot of a large layout. */
  l = PLS_INV_LN10 * log (1.5e-4 * re);
  den = 1.0 / (1.0 + 7.5 * l * l);   /* its reciprocal: one division */
  /* dT/d ln Re = -0.005 (l/d) 15 l / (ln10 den^2), finite as Re -> 0 (tends
   * to 0); d2T/d(ln Re)^2 = -0.005 (l/d) 15 (1 - 22.5 l^2) / (ln10^2 den^3)
   * (differentiating once more: dl/d ln Re = 1/ln10). */
  *re_dbump = -0.005 * ld * 15.0 * l * PLS_INV_LN10 * den * den;
  if (re2_dbump2 != NULL)
    *re2_dbump2 = -0.005 * ld * 15.0 * (1.0 - 22.5 * l * l) * PLS_INV_LN10 * PLS_INV_LN10
                  * den * den * den;
  return 0.005 * ld * den;
}

double
pls_nozzle_discharge_coefficient (const pls_nozzle_params *p, double reynolds)
{
  double ld = p->orifice_length / p->orifice_diameter, dummy;

  if (p->cd_model == PLS_CD_FIXED)
    return p->discharge_coefficient;
  if (!(reynolds > 0.0))
    return 0.0;
  return 1.0 / (1.0 / p->discharge_coefficient + 20.0 * (1.0 + 2.25 * ld) / reynolds
                - bump (ld, reynolds, &dummy, NULL));
}

/* Fixed Cd: rho Q |Q| has a zero slope at Q = 0.  Below the orifice
 * Reynolds number 1 (mean velocity, apparent viscosity at 8V/d), where a
 * constant Cd has no meaning anyway, Q |Q| becomes Q sqrt(Q^2 + Qs^2) with
 * Qs the flow at Re = 1; at Re 10 this changes dp by 0.5 %, at Re 100 by
 * 5e-5.  Qs solves 8 rho V^2 = tau(8 V / d) (Re = rho V d / mu_app = 1). */
static double
unit_reynolds_velocity (const pls_fluid_params *f, double d)
{
  double v = pls_fluid_zero_shear_viscosity (f) / (f->density * d), s = log (v);
  int it;

  if (pls_fluid_is_newtonian (f))
    return v;
  /* Newton on ln: phi(s) = ln(8 rho) + 2 s - ln tau(8 e^s / d), phi' = 2 -
   * gamma tau'/tau >= 2 - max(1, n) > 0 for n < 2. */
  for (it = 0; it < 100; it++)
    {
      double slope, g = 8.0 * v / d, tau = pls_fluid_shear_stress (f, g, &slope);
      double phi = log (8.0 * f->density * v * v / tau), dphi = 2.0 - g * slope / tau;
      double step = phi / dphi;

      if (step > 5.0)
        step = 5.0;
      if (step < -5.0)
        step = -5.0;
      s -= step;
      v = exp (s);
      if (fabs (step) < 1e-14)
        break;
    }
  return v;
}

void
pls_nozzle_drop (const pls_fluid_params *f, const pls_nozzle_params *p,
                 double q, pls_drop *out)
{
  /* Reciprocals once: this law runs for every applicator at every Newton
   * trial, and divisions, not the logarithm, dominate its cost. */
  double d = p->orifice_diameter, inv_d = 1.0 / d, area = 0.25 * PLS_PI * d * d;
  double inv_area = 1.0 / area, rho = f->density;
  double aq = fabs (q), sg = q < 0.0 ? -1.0 : 1.0, vel = aq * inv_area;
  double ld = p->orifice_length * inv_d, cdi = p->discharge_coefficient;
  double h, dh_dv;

  if (p->cd_model == PLS_CD_FIXED)
    {
      double vs = unit_reynolds_velocity (f, d), rt = sqrt (vel * vel + vs * vs);
      double k = rho / (2.0 * cdi * cdi);

      h = k * vel * rt;
      dh_dv = k * (2.0 * vel * vel + vs * vs) / rt;
    }
  else
    {
      /* Lichtarowicz: with beta = 1/Cd_u - T(Re) and g = c nu V / d
       * = c tau(8V/d) / (8 rho), c = 20 (1 + 2.25 l/d), the ideal velocity
       * solves H(U) = U^2 - V beta U - g = 0.  Re = U d / nu = 8 rho U V /
       * tau(8V/d) (apparent viscosity at the nominal shear rate). */
      double c = 20.0 * (1.0 + 2.25 * ld), gamma = 8.0 * vel * inv_d, slope;
      double tau = pls_fluid_shear_stress (f, gamma, &slope), inv_rho = 1.0 / rho;
      double g = 0.125 * c * tau * inv_rho, dg = c * slope * inv_rho * inv_d;

      if (vel == 0.0)
        {
          /* Limit V -> 0: U ~ sqrt(g), dh/dV = rho g'(0) / 2. */
          h = 0.0;
          dh_dv = 0.5 * rho * dg;
        }
      else
        {
          double beta_u = 1.0 / cdi, beta = beta_u, inv_tau = 1.0 / tau, u, t = 0.0;
          double kre = 8.0 * rho * vel * inv_tau, ret = 0.0, ret2 = 0.0;
          double nloc = gamma * slope * inv_tau, du;
          int it;

          /* Start from T = 0 (closed form), then Halley's method on H(U)
           * (cubic convergence; H'' costs no extra logarithm).  T is a
           * small bump (<= 0.005 l/d): from the start's error of at most
           * ~T/beta (3 % for l/d 10) two steps bring U to round-off.  Once
           * a step is below 1e-6 U the next would be below ~1e-18 U, so it
           * stops there and carries T and T' to the accepted U by Taylor
           * (the error is O(step^3) in T, O(step^2) in T'), saving the
           * logarithm of one more evaluation. */
          u = 0.5 * (vel * beta + sqrt (vel * beta * vel * beta + 4.0 * g));
          for (it = 0; it < 50; it++)
            {
              double hh, d1, d2, next, rel, inv_u = 1.0 / u;

              t = bump (ld, kre * u, &ret, &ret2);
              beta = beta_u - t;
              hh = u * u - vel * beta * u - g;
              /* With T1 = dT/d ln Re and T2 = d2T/d(ln Re)^2 (bump) and
               * d ln Re / dU = 1/U: H' = 2U - V beta + V T1 and
               * H'' = 2 + V (T1 + T2) / U. */
              d1 = 2.0 * u - vel * beta + vel * ret;
              d2 = 2.0 + vel * (ret + ret2) * inv_u;
              next = u - 2.0 * hh * d1 / (2.0 * d1 * d1 - hh * d2);
              if (!(next > 0.0))
                next = 0.5 * u;
              rel = (next - u) * inv_u;
              if (fabs (rel) <= 1e-6)
                {
                  /* ln(1 + rel) = rel - rel^2/2 + O(rel^3). */
                  double dl = rel - 0.5 * rel * rel;

                  t += ret * dl + 0.5 * ret2 * dl * dl;
                  ret += ret2 * dl;
                  u = next;
                  break;
                }
              u = next;
            }
          beta = beta_u - t;
          /* Implicit derivative; Re depends on V through V and tau(8V/d):
           * dU/dV = [beta U + g' - U (Re T')(1 - n_loc)]
           *         / [2U - V beta + V (Re T')], n_loc = gamma tau'/tau. */
          du = (beta * u + dg - u * ret * (1.0 - nloc))
               / (2.0 * u - vel * beta + vel * ret);
          h = 0.5 * rho * u * u;
          dh_dv = rho * u * du;
        }
    }
  out->h = p->passage_resistance * q + sg * h;
  out->dh_dq = p->passage_resistance + dh_dv * inv_area;
}
