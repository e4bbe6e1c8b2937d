/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-line.c: pressure drop of a hose or rigid pipe in fully developed flow.
 *
 * Laminar: Hagen-Poiseuille for a Newtonian fluid; for the power law the
 * Rabinowitsch-Mooney closed form (see power_law_wall_state); for Carreau
 * the Rabinowitsch-Mooney integral
 *   Q = (pi R^3 / tau_w^3) int_0^tau_w tau^2 gamma(tau) dtau
 * (Chhabra & Richardson, Non-Newtonian Flow and Applied Rheology, 2nd ed.,
 * sec. 3.2), evaluated by Gauss-Legendre quadrature.  Turbulent: Colebrook-
 * White solved exactly (Newtonian; Carreau with the generalised Reynolds
 * number, see below) and Dodge-Metzner (power law).  Between them a C1
 * smoothstep blend in the generalised Reynolds number, with turbulent
 * friction never taken below laminar friction (see pls_line_drop).
 */
#include "config.h"

#include "pls-laws.h"

#include <float.h>
#include <math.h>

#define PLS_LN10 2.30258509299404568402  /* ln 10 (M_LN10 is not C11) */
/* Half-width of the smoothed positive part in the laminar-turbulent blend,
 * as a share of the laminar friction (see pls_line_drop). */
#define P_DELTA 0.05

/* 8-point Gauss-Legendre nodes and weights on [-1, 1], positive half
 * (Abramowitz & Stegun, Handbook of Mathematical Functions, table 25.4). */
static const double gl_node[4] = {
  0.183434642495649804939, 0.525532409916328985818,
  0.796666477413626739592, 0.960289856497536231684,
};
static const double gl_weight[4] = {
  0.362683783378361982965, 0.313706645877887287338,
  0.222381034453374470544, 0.101228536290376259153,
};

/* Integrand of the flow integral after the change of variable
 * tau = tau(gamma): int_0^tau_w tau^2 gamma dtau = int_0^gamma_w
 * gamma tau(gamma)^2 tau'(gamma) dgamma.  The substitution is exact and
 * needs no inner solve for gamma(tau) at each node: only gamma_w is solved
 * for (by the outer Newton iteration below). */
static double
flow_integrand (const pls_fluid_params *c, double gamma)
{
  double slope, tau = pls_fluid_shear_stress (c, gamma, &slope);

  return gamma * tau * tau * slope;
}

static double
gauss_legendre_8 (const pls_fluid_params *c, double a, double b)
{
  double mid = 0.5 * (a + b), half = 0.5 * (b - a), sum = 0.0;
  int i;

  for (i = 0; i < 4; i++)
    sum += gl_weight[i] * (flow_integrand (c, mid - half * gl_node[i])
                           + flow_integrand (c, mid + half * gl_node[i]));
  return half * sum;
}

/* int_0^gamma_w gamma tau^2 tau' dgamma on panels [g/2, g], [g/4, g/2],
 * ...: on a panel of ratio 2 the integrand (a power of gamma times a
 * function analytic at distance >= the panel's left end) is integrated by
 * 8-point Gauss-Legendre to about 1e-13.  The integrand grows at least as
 * gamma^(3n), so the panels stop once the rest, bounded by
 * a * integrand(a), is below 1e-17 of the sum; that rest is still added. */
static double
flow_integral (const pls_fluid_params *c, double gamma_w)
{
  double b = gamma_w, sum = 0.0;
  int k;

  for (k = 0; k < 1100; k++)
    {
      double a = 0.5 * b;

      sum += gauss_legendre_8 (c, a, b);
      if (a * flow_integrand (c, a) <= 1e-17 * sum || a == 0.0)
        {
          sum += gauss_legendre_8 (c, 0.0, a);
          break;
        }
      b = a;
    }
  return sum;
}

typedef struct
{
  double tau;        /* laminar wall shear stress, Pa        */
  double dtau_dq;    /* d tau / d q, Pa s/m^3                */
  double gamma;      /* true wall shear rate, 1/s            */
} laminar_wall;

/* Laminar wall state at flow aq >= 0 in a tube of radius r. */
static void
laminar_wall_state (const pls_fluid_params *c, int newtonian, double r, double aq,
                    laminar_wall *w)
{
  double k = PLS_PI * r * r * r;
  double mu0 = c->mu_zero;
  double gamma_app = 4.0 * aq / k;   /* 8V/D */
  double s, lo = -HUGE_VAL, hi = HUGE_VAL, gw = gamma_app, tau = 0.0, slope = mu0;
  double qq = 0.0, dq_dtau = k / (4.0 * mu0);
  int it;

  /* Hagen-Poiseuille; also the zero-shear limit of the other laws, used
   * below 1e-50 1/s where the plateau holds to round-off. */
  if (newtonian || gamma_app < 1e-50)
    {
      w->tau = mu0 * gamma_app;
      w->dtau_dq = 4.0 * mu0 / k;
      w->gamma = gamma_app;
      return;
    }
  /* Newton on s = ln gamma_w for ln Q(gamma_w) = ln q.  Q is close to
   * proportional to gamma_w for every law here, so it converges in a few
   * steps; a bracket with bisection guards it anyway.  Start from the
   * power-law wall rate (3n+1)/(4n) 8V/D, exact for the power law. */
  gw = gamma_app * (3.0 * c->flow_index + 1.0) / (4.0 * c->flow_index);
  s = log (gw);
  for (it = 0; it < 100; it++)
    {
      double integral, tau3, dq_dgw, resid, step, next;

      gw = exp (s);
      tau = pls_fluid_shear_stress (c, gw, &slope);
      integral = flow_integral (c, gw);
      tau3 = tau * tau * tau;
      qq = k * integral / tau3;
      /* Leibniz: dQ/dtau_w = pi R^3 gamma_w / tau_w - 3 Q / tau_w. */
      dq_dtau = k * gw / tau - 3.0 * qq / tau;
      dq_dgw = dq_dtau * slope;
      resid = log (qq / aq);
      if (resid > 0.0)
        hi = s;
      else
        lo = s;
      if (fabs (resid) <= 4.0 * DBL_EPSILON)
        break;
      step = resid * qq / (gw * dq_dgw);
      if (step > 3.0)
        step = 3.0;
      if (step < -3.0)
        step = -3.0;
      next = s - step;
      if (isfinite (lo) && isfinite (hi) && !(next > lo && next < hi))
        next = 0.5 * (lo + hi);
      if (fabs (next - s) <= 4.0 * DBL_EPSILON * fabs (s) + 1e-15)
        break;
      s = next;
    }
  /* The converged point meets Q(gamma_w) = q to round-off; a first-order
   * correction by the last (tiny) flow residual keeps h smooth in q at the
   * level of the finite-difference checks. */
  w->tau = tau + (aq - qq) / dq_dtau;
  w->dtau_dq = 1.0 / dq_dtau;
  w->gamma = gw;
}

/* Laminar wall state of a power-law fluid in closed form.  Rabinowitsch-
 * Mooney for K gamma^n (Chhabra & Richardson, 2nd ed., eq. 3.9):
 *   tau_w = K gamma_w^n,  gamma_w = s q,  s = (3n+1) / (pi n R^3),
 * i.e. h = (2L/R) K [(3n+1) q / (pi n R^3)]^n.  Its slope at q = 0 is zero
 * (n > 1) or infinite (n < 1), so below a corner wall rate gamma_c it is
 * regularised as
 *   tau_w = K gamma_w (gamma_w^2 + gamma_c^2)^((n-1)/2),
 * which is C-infinity, odd and strictly increasing for n > 0 (its slope is
 * K (gamma^2 + gamma_c^2)^((n-3)/2) (n gamma^2 + gamma_c^2) > 0).  gamma_c
 * comes from the fluid's own cut-off gc = PLS_POWER_LAW_PLATEAU_SHEAR: it is
 * chosen so that the slope at q = 0 is Hagen-Poiseuille with the fluid's
 * plateau viscosity K gc^(n-1), the same zero-flow limit as the fluid law
 * (pls_fluid_zero_shear_viscosity) and the quadrature used before:
 *   K s gamma_c^(n-1) = 4 K gc^(n-1) / (pi R^3)
 *   =>  gamma_c = gc [4n / (3n+1)]^(1/(n-1))   (-> gc e^(1/4) as n -> 1),
 * between 1 and 2.4 gc for 0.2 <= n <= 2.  Above the corner h differs from
 * the exact power law by (1-n)/2 (gamma_c/gamma_w)^2 relative: below 1e-5
 * above 1 1/s, ~1e-12 at 1000 1/s (a hose at 1 mL/min already sees ~1 1/s).
 * One pow call instead of a quadrature inside a Newton loop. */
static void
power_law_wall_state (const pls_fluid_params *f, double r, double aq, laminar_wall *w)
{
  double n = f->flow_index, k = f->consistency, s = (3.0 * n + 1.0) / (PLS_PI * n * r * r * r);
  double expo, gc, gamma, g2, base;

  /* (1/(n-1)) ln(4n/(3n+1)) = log1p((n-1)/(3n+1)) / (n-1), with its limit
   * 1/(3n+1) at n = 1. */
  expo = n == 1.0 ? 0.25 : log1p ((n - 1.0) / (3.0 * n + 1.0)) / (n - 1.0);
  gc = PLS_POWER_LAW_PLATEAU_SHEAR * exp (expo);
  gamma = s * aq;
  g2 = gamma * gamma + gc * gc;
  base = k * pow (g2, 0.5 * (n - 3.0));   /* K (gamma^2 + gc^2)^((n-3)/2) */
  w->tau = base * g2 * gamma;
  w->dtau_dq = s * base * (n * gamma * gamma + gc * gc);
  w->gamma = gamma;
}

double
pls_colebrook_darcy (double reynolds, double relative_roughness)
{
  double a, b, x, f0, t;
  int it;

  if (!(reynolds > 0.0) || !isfinite (reynolds))
    return 0.0;
  if (!(relative_roughness > 0.0))
    relative_roughness = 0.0;
  /* 1/sqrt(f) = -2 log10(e/(3.7 D) + 2.51/(Re sqrt f)) (Colebrook, J. ICE
   * 11, 1939).  Start from Swamee-Jain (J. Hydraul. Div. 102, 1976); F(x)
   * = x + 2 log10(a + b x) is increasing and concave in x = 1/sqrt(f), so
   * Newton converges monotonically after at most one step. */
  a = relative_roughness / 3.7;
  b = 2.51 / reynolds;
  t = log10 (a + 5.74 / pow (reynolds, 0.9));
  f0 = 0.25 / (t * t);
  x = 1.0 / sqrt (f0);
  for (it = 0; it < 60; it++)
    {
      double u = a + b * x;
      double fx = x + 2.0 * log10 (u);
      double dfx = 1.0 + 2.0 * b / (PLS_LN10 * u);
      double dx = fx / dfx;

      x -= dx;
      if (fabs (dx) <= 2.0 * DBL_EPSILON * x)
        break;
    }
  return 1.0 / (x * x);
}

/* Colebrook with d f / d Re (for the Jacobian). */
static double
colebrook_with_slope (double re, double rr, double *df_dre)
{
  double f = pls_colebrook_darcy (re, rr);
  double x = 1.0 / sqrt (f), a = rr / 3.7, b = 2.51 / re, u = a + b * x;
  double fx_x = 1.0 + 2.0 * b / (PLS_LN10 * u);
  double fx_re = -2.0 * b * x / (PLS_LN10 * u * re);
  double dx = -fx_re / fx_x;

  *df_dre = -2.0 * dx / (x * x * x);
  return f;
}

/* Dodge & Metzner, AIChE J. 5(2), 1959, eq. for smooth tubes:
 * 1/sqrt(f) = (4 / n^0.75) log10(Re f^(1 - n/2)) - 0.4 / n^1.2 (Fanning f).
 * In x = 1/sqrt(f): G(x) = x + A (2 - n) log10 x - A log10 Re + B = 0 with
 * G' > 0 and G'' < 0 for n < 2: one root, Newton from the right is
 * monotone. */
static double
dodge_metzner_with_slope (double re, double n, double *df_dre)
{
  double a = 4.0 / pow (n, 0.75), bb = 0.4 / pow (n, 1.2), x = 40.0, g1 = 1.0;
  int it;

  for (it = 0; it < 100; it++)
    {
      double g = x + a * (2.0 - n) * log10 (x) - a * log10 (re) + bb;
      double dx;

      g1 = 1.0 + a * (2.0 - n) / (x * PLS_LN10);
      dx = g / g1;
      if (x - dx <= 0.0)
        dx = 0.5 * x;
      x -= dx;
      if (fabs (dx) <= 2.0 * DBL_EPSILON * x)
        break;
    }
  g1 = 1.0 + a * (2.0 - n) / (x * PLS_LN10);
  if (df_dre != NULL)
    *df_dre = -2.0 / (x * x * x) * (a / (re * PLS_LN10)) / g1;
  return 1.0 / (x * x);
}

double
pls_dodge_metzner_fanning (double reynolds, double flow_index)
{
  if (!(reynolds > 0.0) || !isfinite (reynolds) || !(flow_index > 0.0 && flow_index < 2.0))
    return 0.0;
  return dodge_metzner_with_slope (reynolds, flow_index, NULL);
}

double
pls_ryan_johnson_reynolds (double n)
{
  /* Ryan & Johnson, AIChE J. 5(4), 1959 (Chhabra & Richardson eq. 3.25). */
  return 6464.0 * n * pow (2.0 + n, (2.0 + n) / (1.0 + n)) / ((1.0 + 3.0 * n) * (1.0 + 3.0 * n));
}

void
pls_line_transition_band (const pls_fluid_params *f, double *re_lower, double *re_upper)
{
  double lo = 2100.0, hi = 4000.0;

  /* Power law: Ryan-Johnson onset; the band keeps the Newtonian width
   * (1900) above it, so n = 1 gives 2099.25..3999.25 (a stated choice,
   * continuous in n). */
  if (f->law == PLS_VISCOSITY_POWER_LAW)
    {
      lo = pls_ryan_johnson_reynolds (f->flow_index);
      hi = lo + 1900.0;
    }
  if (re_lower != NULL)
    *re_lower = lo;
  if (re_upper != NULL)
    *re_upper = hi;
}

void
pls_line_drop (const pls_fluid_params *f, const pls_line_params *line,
               double q, pls_drop *out, pls_line_state *state)
{
  pls_fluid_params c;
  laminar_wall w;
  double d = line->bore, r = 0.5 * d, len = line->length, rho = f->density;
  double area = 0.25 * PLS_PI * d * d, aq = fabs (q), sg = q < 0.0 ? -1.0 : 1.0;
  double vel = aq / area, re = 0.0, re_lo, re_hi, h, dh, fd = 0.0, tau_act;
  int newtonian = pls_fluid_is_newtonian (f);
  pls_regime regime = PLS_REGIME_LAMINAR;

  if (newtonian)
    {
      /* Hagen-Poiseuille, as laminar_wall_state has it, without the copy
       * into the Carreau form (the common case of a large layout). */
      double k = PLS_PI * r * r * r, mu0 = pls_fluid_zero_shear_viscosity (f);

      w.tau = mu0 * (4.0 * aq / k);
      w.dtau_dq = 4.0 * mu0 / k;
      w.gamma = 4.0 * aq / k;
    }
  else if (f->law == PLS_VISCOSITY_POWER_LAW)
    power_law_wall_state (f, r, aq, &w);
  else
    {
      pls_fluid_carreau_form (f, &c);
      laminar_wall_state (&c, newtonian, r, aq, &w);
    }
  /* Laminar: tau_w = dp R / (2 L) (force balance). */
  h = 2.0 * len * w.tau / r;
  dh = 2.0 * len * w.dtau_dq / r;
  /* Generalised Reynolds number 8 rho V^2 / tau_w,laminar (Metzner & Reed,
   * AIChE J. 1, 1955): rho V D / mu for a Newtonian fluid, the Metzner-Reed
   * number for the power law, and Darcy f = 64 / Re in laminar flow. */
  if (aq > 0.0 && w.tau > 0.0)
    re = 8.0 * rho * vel * vel / w.tau;
  pls_line_transition_band (f, &re_lo, &re_hi);
  if (re > re_lo)
    {
      double dre_dq = re * (2.0 / aq - w.dtau_dq / w.tau);
      double df_dre, ht, dht, kq = len * rho / (2.0 * d * area * area), wt, dw;

      /* Turbulent friction.  Carreau: Colebrook-White with the generalised
       * Reynolds number, i.e. a Newtonian fluid of the apparent viscosity
       * tau_w / (8V/D) at the laminar wall state (a documented choice;
       * no turbulent Carreau correlation is used).  Power law: Dodge-
       * Metzner (smooth tubes; roughness is not used). */
      if (f->law == PLS_VISCOSITY_POWER_LAW)
        {
          fd = 4.0 * dodge_metzner_with_slope (re, f->flow_index, &df_dre);
          df_dre *= 4.0;
        }
      else
        fd = colebrook_with_slope (re, line->roughness / d, &df_dre);
      /* Darcy-Weisbach: h = f (L/D) rho V^2 / 2. */
      ht = kq * fd * aq * aq;
      dht = kq * (2.0 * aq * fd + aq * aq * df_dre * dre_dq);
      if (re >= re_hi)
        {
          wt = 1.0;
          dw = 0.0;
          regime = PLS_REGIME_TURBULENT;
        }
      else
        {
          /* Smoothstep w = 3s^2 - 2s^3: C1, with w' = 0 at both ends. */
          double s = (re - re_lo) / (re_hi - re_lo);

          wt = s * s * (3.0 - 2.0 * s);
          dw = 6.0 * s * (1.0 - s) / (re_hi - re_lo);
          regime = PLS_REGIME_TRANSITION;
        }
      /* h = h_lam [1 + w P(h_turb / h_lam - 1)], P a C1 positive part.
       * Where turbulent friction exceeds laminar by more than P_DELTA (every
       * Newtonian and Carreau case, and the power law for n >~ 0.3) this is
       * exactly the blend (1 - w) h_lam + w h_turb.  P keeps the turbulent
       * friction from falling below the laminar one at the same Re, which
       * Dodge-Metzner, extrapolated below its tested range (n >= 0.36),
       * does near the Ryan-Johnson onset for small n; a blend towards a
       * lower branch would make h fall as q rises.  With P >= 0 and
       * 0 <= P' <= 1 each term of dh/dq below is >= 0 (up to a share
       * P_DELTA/2 of the laminar slope, far below the turbulent one). */
      {
        double ratio = ht / h, dratio = (dht * h - ht * dh) / (h * h), pp, dpp;
        double x = ratio - 1.0;

        if (x >= P_DELTA)
          {
            pp = x;
            dpp = 1.0;
          }
        else if (x <= -P_DELTA)
          {
            pp = 0.0;
            dpp = 0.0;
          }
        else
          {
            pp = (x + P_DELTA) * (x + P_DELTA) / (4.0 * P_DELTA);
            dpp = (x + P_DELTA) / (2.0 * P_DELTA);
          }
        dh = dh * (1.0 + wt * pp) + h * (dw * dre_dq * pp + wt * dpp * dratio);
        h = h * (1.0 + wt * pp);
      }
    }
  out->h = sg * h;
  out->dh_dq = dh;
  if (state == NULL)
    return;
  tau_act = h * r / (2.0 * len);
  state->velocity = sg * vel;
  state->reynolds = re;
  state->wall_shear_stress = tau_act;
  state->wall_shear_rate = regime == PLS_REGIME_LAMINAR
                           ? w.gamma : pls_fluid_shear_rate (f, tau_act);
  state->darcy_friction = vel > 0.0 ? 8.0 * tau_act / (rho * vel * vel) : 0.0;
  state->regime = regime;
}
