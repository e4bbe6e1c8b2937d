/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * law-fixtures.h: what the element-law suites share: fluids and lines built
 * from a few numbers, and the sweep that checks a law keeps the contract
 * of pls-laws.h (the Newton solvers rely on it).
 */
#pragma once

#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pls-laws.h"

static inline pls_line_params
fixture_hose (double length, double bore, double roughness)
{
  pls_line_params l;

  memset (&l, 0, sizeof l);
  l.kind = PLS_LINE_HOSE;
  l.length = length;
  l.bore = bore;
  l.roughness = roughness;
  return l;
}

static inline pls_fluid_params
fixture_newtonian (double mu, double rho)
{
  pls_fluid_params f;

  pls_fluid_params_init (&f);
  f.mu = mu;
  f.density = rho;
  return f;
}

static inline pls_fluid_params
fixture_power_law (double k, double n, double rho)
{
  pls_fluid_params f;

  pls_fluid_params_init (&f);
  f.law = PLS_VISCOSITY_POWER_LAW;
  f.consistency = k;
  f.flow_index = n;
  f.density = rho;
  return f;
}

static inline pls_fluid_params
fixture_carreau (double mu0, double muinf, double lambda, double n, double rho)
{
  pls_fluid_params f;

  pls_fluid_params_init (&f);
  f.law = PLS_VISCOSITY_CARREAU;
  f.mu_zero = mu0;
  f.mu_infinity = muinf;
  f.lambda = lambda;
  f.flow_index = n;
  f.density = rho;
  return f;
}

/* A two-port law seen through one signature. */
typedef void (*fixture_law) (const pls_fluid_params *f, const void *params, double q,
                             pls_drop *out);

/* The contract of pls-laws.h for a law that is odd in q: h(0) = 0 with a
 * finite positive slope; over q_from .. q_to (growing by factor) h strictly
 * increasing, h(-q) = -h(q), dh/dq finite, > 0 and equal to a central
 * difference of step 1e-6 q within fd_tol (relative; the caller justifies
 * it from the law's smoothness). */
static inline void
fixture_check_odd_law (fixture_law law, const pls_fluid_params *f, const void *p,
                       double q_from, double q_to, double factor, double fd_tol)
{
  double q, prev = 0.0;
  pls_drop d0;

  law (f, p, 0.0, &d0);
  ck_assert_double_eq (d0.h, 0.0);
  ck_assert (d0.dh_dq > 0.0 && isfinite (d0.dh_dq));
  for (q = q_from; q < q_to; q *= factor)
    {
      pls_drop d, dp, dm, dn;
      double dq = 1e-6 * q, fd;

      law (f, p, q, &d);
      law (f, p, q + dq, &dp);
      law (f, p, q - dq, &dm);
      law (f, p, -q, &dn);
      fd = (dp.h - dm.h) / (2.0 * dq);
      ck_assert (isfinite (d.h) && d.dh_dq > 0.0 && isfinite (d.dh_dq));
      ck_assert (d.h > prev);
      ck_assert_msg (fabs (fd / d.dh_dq - 1.0) <= fd_tol, "q %g: difference %g, dh/dq %g",
                     q, fd, d.dh_dq);
      ck_assert_double_eq (dn.h, -d.h);
      ck_assert_double_eq (dn.dh_dq, d.dh_dq);
      prev = d.h;
    }
}
