/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-fluid.c: viscosity laws (Newtonian, Ostwald-de Waele power law,
 * Carreau) and the Arrhenius temperature shift.
 *
 * All three laws are written in one Carreau form
 *   mu(gamma) = mu_inf + (mu_0 - mu_inf) (1 + (lambda gamma)^2)^((n - 1)/2)
 * (Carreau, Trans. Soc. Rheol. 16, 1972; Bird, Armstrong & Hassager,
 * Dynamics of Polymeric Liquids vol. 1, 2nd ed., sec. 4.4):
 *  - Newtonian: mu_0 = mu, lambda = 0;
 *  - power law: mu_inf = 0, lambda = 1/gc, mu_0 = K gc^(n-1), which is
 *    K (gamma^2 + gc^2)^((n-1)/2), the power law with a Newtonian plateau
 *    below gc = PLS_POWER_LAW_PLATEAU_SHEAR (see pls-laws.h).
 * tau(gamma) = mu gamma is strictly increasing for n > 0 and mu_inf <=
 * mu_0: its slope is mu_inf + (mu_0 - mu_inf) (1 + x^2)^((n-3)/2) (1 + n x^2)
 * with x = lambda gamma, which is > 0.
 */
#include "config.h"

#include "pls-laws.h"

#include <float.h>
#include <math.h>

typedef struct
{
  double mu_inf;  /* Pa s */
  double dmu;     /* mu_0 - mu_inf, Pa s */
  double lambda;  /* s */
  double n;
} carreau_form;

static void
carreau_of (const pls_fluid_params *f, carreau_form *c)
{
  switch (f->law)
    {
    case PLS_VISCOSITY_POWER_LAW:
      c->mu_inf = 0.0;
      c->dmu = f->consistency * pow (PLS_POWER_LAW_PLATEAU_SHEAR, f->flow_index - 1.0);
      c->lambda = 1.0 / PLS_POWER_LAW_PLATEAU_SHEAR;
      c->n = f->flow_index;
      break;
    case PLS_VISCOSITY_CARREAU:
      c->mu_inf = f->mu_infinity;
      c->dmu = f->mu_zero - f->mu_infinity;
      c->lambda = f->lambda;
      c->n = f->flow_index;
      break;
    case PLS_VISCOSITY_NEWTONIAN:
    default:
      c->mu_inf = 0.0;
      c->dmu = f->mu;
      c->lambda = 0.0;
      c->n = 1.0;
      break;
    }
}

int
pls_fluid_is_newtonian (const pls_fluid_params *f)
{
  carreau_form c;

  carreau_of (f, &c);
  return c.lambda == 0.0 || c.n == 1.0 || c.dmu == 0.0;
}

double
pls_fluid_zero_shear_viscosity (const pls_fluid_params *f)
{
  carreau_form c;

  carreau_of (f, &c);
  return c.mu_inf + c.dmu;
}

void
pls_fluid_at_temperature (const pls_fluid_params *in, pls_fluid_params *out)
{
  /* Arrhenius shift mu(T) = mu(Tref) exp[B (1/T - 1/Tref)] (Bird, Stewart
   * & Lightfoot, Transport Phenomena, 2nd ed., eq. 1.5-11 in the Andrade
   * form).  Applied as a vertical shift: the viscosity at every shear rate
   * scales by the same factor, so K, mu_0 and mu_inf scale and lambda does
   * not (a stated simplification of time-temperature superposition). */
  double a = 1.0;
  pls_fluid_params tmp = *in;

  if (in->activation_temperature > 0.0)
    a = exp (in->activation_temperature
             * (1.0 / in->temperature - 1.0 / in->reference_temperature));
  tmp.mu *= a;
  tmp.consistency *= a;
  tmp.mu_zero *= a;
  tmp.mu_infinity *= a;
  /* The result holds at its own temperature: applying it twice is a no-op. */
  tmp.reference_temperature = in->temperature;
  *out = tmp;
}

static double
carreau_stress (const carreau_form *c, double gamma, double *slope)
{
  double x2, base, mu, dtau;

  if (c->lambda == 0.0 || c->n == 1.0)
    {
      mu = c->mu_inf + c->dmu;
      if (slope != NULL)
        *slope = mu;
      return mu * gamma;
    }
  x2 = c->lambda * gamma * (c->lambda * gamma);
  base = pow (1.0 + x2, 0.5 * (c->n - 3.0));   /* (1 + x^2)^((n-3)/2) */
  mu = c->mu_inf + c->dmu * base * (1.0 + x2);
  dtau = c->mu_inf + c->dmu * base * (1.0 + c->n * x2);
  if (slope != NULL)
    *slope = dtau;
  return mu * gamma;
}

double
pls_fluid_viscosity (const pls_fluid_params *f, double shear_rate)
{
  carreau_form c;
  double x2;

  carreau_of (f, &c);
  if (!(shear_rate > 0.0) || c.lambda == 0.0 || c.n == 1.0)
    return c.mu_inf + c.dmu;
  x2 = c.lambda * shear_rate * (c.lambda * shear_rate);
  return c.mu_inf + c.dmu * pow (1.0 + x2, 0.5 * (c.n - 1.0));
}

double
pls_fluid_shear_stress (const pls_fluid_params *f, double shear_rate, double *slope)
{
  carreau_form c;

  carreau_of (f, &c);
  if (!(shear_rate > 0.0))
    shear_rate = 0.0;
  return carreau_stress (&c, shear_rate, slope);
}

double
pls_fluid_shear_rate (const pls_fluid_params *f, double stress)
{
  carreau_form c;
  double mu0, lo, hi, g, tau, dtau;
  int it;

  carreau_of (f, &c);
  mu0 = c.mu_inf + c.dmu;
  if (!(stress > 0.0))
    return 0.0;
  if (c.lambda == 0.0 || c.n == 1.0)
    return stress / mu0;
  /* Bracket the root of tau(gamma) = stress; tau is increasing.  The
   * Newtonian guess is a bound on one side (mu <= mu_0 for n < 1, >= for
   * n > 1); widen the other side by factors of 4. */
  g = stress / mu0;
  lo = 0.0;
  hi = g;
  if (carreau_stress (&c, hi, NULL) < stress)
    {
      lo = hi;
      for (it = 0; it < 2000 && carreau_stress (&c, hi, NULL) < stress; it++)
        {
          lo = hi;
          hi *= 4.0;
        }
    }
  g = 0.5 * (lo + hi);
  /* Newton in gamma with bisection whenever a step leaves the bracket. */
  for (it = 0; it < 200; it++)
    {
      double r, step, next;

      tau = carreau_stress (&c, g, &dtau);
      r = tau - stress;
      if (r > 0.0)
        hi = g;
      else
        lo = g;
      step = r / dtau;
      next = g - step;
      if (!(next > lo && next < hi))
        next = 0.5 * (lo + hi);
      if (fabs (next - g) <= 4.0 * DBL_EPSILON * next || hi - lo <= 4.0 * DBL_EPSILON * hi)
        {
          g = next;
          break;
        }
      g = next;
    }
  return g;
}

void
pls_fluid_carreau_form (const pls_fluid_params *in, pls_fluid_params *out)
{
  carreau_form c;
  pls_fluid_params tmp = *in;

  carreau_of (in, &c);
  tmp.law = PLS_VISCOSITY_CARREAU;
  tmp.mu_infinity = c.mu_inf;
  tmp.mu_zero = c.mu_inf + c.dmu;
  tmp.lambda = c.lambda;
  tmp.flow_index = c.n;
  *out = tmp;
}
