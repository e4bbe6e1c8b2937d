/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-params.c: defaults and validators of the fluid and part parameters.
 *
 * Validators run once, when an element is added, never inside Newton.  They
 * stop at the first bad field and name it (by its struct field name, which
 * is also what the inspector and the file format call it) in `why`.
 */
#include "config.h"

#include "pls-laws.h"

#include <math.h>
#include <stdio.h>

void
pls_fluid_params_init (pls_fluid_params *params)
{
  if (params == NULL)
    return;
  /* A typical unfilled adhesive (a preset, not a published value). */
  params->density = 1100.0;
  params->bulk_modulus = 1.5e9;
  params->law = PLS_VISCOSITY_NEWTONIAN;
  params->mu = 1.0;
  params->consistency = 1.0;
  params->flow_index = 1.0;
  params->mu_zero = 1.0;
  params->mu_infinity = 0.0;
  params->lambda = 0.0;
  params->temperature = 293.15;
  params->reference_temperature = 293.15;
  params->activation_temperature = 0.0;
}

/* The first failure wins; later checks do nothing once one has failed. */
typedef struct
{
  char *why;
  size_t why_len;
  pls_status status;
} checker;

static void
checker_init (checker *c, char *why, size_t why_len)
{
  c->why = why;
  c->why_len = why_len;
  c->status = PLS_OK;
  if (why != NULL && why_len > 0)
    why[0] = '\0';
}

static void
checker_fail (checker *c, const char *field, const char *rule, double value)
{
  if (c->status != PLS_OK)
    return;
  c->status = PLS_ERR_INVALID;
  if (c->why != NULL && c->why_len > 0)
    snprintf (c->why, c->why_len, "%s must be %s (got %g)", field, rule, value);
}

static int
checker_ok (const checker *c)
{
  return c->status == PLS_OK;
}

static void
need_positive (checker *c, double v, const char *field, const char *what)
{
  if (checker_ok (c) && !(isfinite (v) && v > 0.0))
    checker_fail (c, field, what, v);
}

static void
need_nonnegative (checker *c, double v, const char *field, const char *what)
{
  if (checker_ok (c) && !(isfinite (v) && v >= 0.0))
    checker_fail (c, field, what, v);
}

static void
need_range (checker *c, double v, double lo, double hi, const char *field, const char *what)
{
  if (checker_ok (c) && !(isfinite (v) && v >= lo && v <= hi))
    checker_fail (c, field, what, v);
}

static void
need_enum (checker *c, int v, int count, const char *field)
{
  if (checker_ok (c) && (v < 0 || v >= count))
    checker_fail (c, field, "one of the listed kinds", (double) v);
}

static void
need_null_ok (checker *c, const void *p)
{
  if (checker_ok (c) && p == NULL)
    {
      c->status = PLS_ERR_INVALID;
      if (c->why != NULL && c->why_len > 0)
        snprintf (c->why, c->why_len, "parameters are missing (NULL)");
    }
}

/* The flow index is limited to (0, 2): beyond 2 the generalised Reynolds
 * number 8 rho V^2 / tau_w would fall as the flow rises, and the transition
 * blend would lose its monotonicity.  No adhesive comes near it. */
#define FLOW_INDEX_RULE "in (0, 2)"

pls_status
pls_fluid_params_check (const pls_fluid_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_positive (&c, p->density, "density", "a positive density (kg/m^3)");
  need_positive (&c, p->bulk_modulus, "bulk_modulus", "a positive modulus (Pa)");
  need_enum (&c, (int) p->law, 3, "law");
  if (checker_ok (&c))
    switch (p->law)
      {
      case PLS_VISCOSITY_NEWTONIAN:
        need_positive (&c, p->mu, "mu", "a positive viscosity (Pa s)");
        break;
      case PLS_VISCOSITY_POWER_LAW:
        need_positive (&c, p->consistency, "consistency", "a positive K (Pa s^n)");
        if (checker_ok (&c) && !(isfinite (p->flow_index) && p->flow_index > 0.0
                                 && p->flow_index < 2.0))
          checker_fail (&c, "flow_index", FLOW_INDEX_RULE, p->flow_index);
        break;
      case PLS_VISCOSITY_CARREAU:
        need_positive (&c, p->mu_zero, "mu_zero", "a positive viscosity (Pa s)");
        need_range (&c, p->mu_infinity, 0.0, checker_ok (&c) ? p->mu_zero : 0.0,
                    "mu_infinity", "between 0 and mu_zero (Pa s)");
        need_nonnegative (&c, p->lambda, "lambda", "a time constant >= 0 (s)");
        if (checker_ok (&c) && !(isfinite (p->flow_index) && p->flow_index > 0.0
                                 && p->flow_index < 2.0))
          checker_fail (&c, "flow_index", FLOW_INDEX_RULE, p->flow_index);
        break;
      default:
        break;
      }
  need_positive (&c, p->temperature, "temperature", "a positive absolute temperature (K)");
  need_positive (&c, p->reference_temperature, "reference_temperature",
                 "a positive absolute temperature (K)");
  need_nonnegative (&c, p->activation_temperature, "activation_temperature",
                    "a temperature >= 0 (K)");
  if (checker_ok (&c))
    {
      /* Keep the Arrhenius factor finite: e^50 is far beyond any real fluid. */
      double e = p->activation_temperature
                 * (1.0 / p->temperature - 1.0 / p->reference_temperature);
      if (!(fabs (e) <= 50.0))
        checker_fail (&c, "activation_temperature",
                      "small enough that the viscosity shift stays within e^50", e);
    }
  return c.status;
}

pls_status
pls_line_params_check (const pls_line_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_enum (&c, (int) p->kind, 2, "kind");
  need_positive (&c, p->length, "length", "a positive length (m)");
  need_positive (&c, p->bore, "bore", "a positive diameter (m)");
  need_nonnegative (&c, p->roughness, "roughness", "a roughness >= 0 (m)");
  if (checker_ok (&c) && !(p->roughness < 0.5 * p->bore))
    checker_fail (&c, "roughness", "smaller than half the bore (m)", p->roughness);
  /* Time-domain fields: 0 means "not given" (the transient side decides). */
  need_nonnegative (&c, p->volumetric_expansion, "volumetric_expansion",
                    "an expansion >= 0 (m^3 per m per Pa)");
  need_nonnegative (&c, p->wall_thickness, "wall_thickness", "a thickness >= 0 (m)");
  need_nonnegative (&c, p->youngs_modulus, "youngs_modulus", "a modulus >= 0 (Pa)");
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  return c.status;
}

pls_status
pls_fitting_params_check (const pls_fitting_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  /* K1 > 0: every real fitting has a viscous loss, and it is what keeps
   * dh/dq > 0 at zero flow. */
  need_positive (&c, p->k1, "k1", "a positive Hooper K1");
  need_nonnegative (&c, p->k_infinity, "k_infinity", "a Hooper Kinf >= 0");
  need_positive (&c, p->bore, "bore", "a positive diameter (m)");
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  return c.status;
}

pls_status
pls_nozzle_params_check (const pls_nozzle_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_positive (&c, p->orifice_diameter, "orifice_diameter", "a positive diameter (m)");
  need_nonnegative (&c, p->orifice_length, "orifice_length", "a length >= 0 (m)");
  need_enum (&c, (int) p->cd_model, 2, "cd_model");
  if (checker_ok (&c) && !(isfinite (p->discharge_coefficient)
                           && p->discharge_coefficient > 0.0
                           && p->discharge_coefficient <= 1.0))
    checker_fail (&c, "discharge_coefficient", "in (0, 1]", p->discharge_coefficient);
  /* l/d <= 100 keeps the Lichtarowicz 1/Cd positive (its bump term is
   * 0.005 l/d at most); the correlation was fitted for 2 <= l/d <= 10. */
  if (checker_ok (&c) && !(p->orifice_length <= 100.0 * p->orifice_diameter))
    checker_fail (&c, "orifice_length", "at most 100 orifice diameters (m)",
                  p->orifice_length);
  need_nonnegative (&c, p->passage_resistance, "passage_resistance",
                    "a resistance >= 0 (Pa s/m^3)");
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  return c.status;
}

pls_status
pls_valve_params_check (const pls_valve_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_enum (&c, (int) p->kind, 2, "kind");
  need_positive (&c, p->kv, "kv", "a positive flow coefficient ((m^3/h)/sqrt(bar))");
  need_positive (&c, p->bore, "bore", "a positive diameter (m)");
  if (checker_ok (&c) && p->open != 0 && p->open != 1)
    checker_fail (&c, "open", "0 or 1", (double) p->open);
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  return c.status;
}

pls_status
pls_pump_params_check (const pls_pump_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_positive (&c, p->ratio, "ratio", "a positive pressure ratio");
  need_nonnegative (&c, p->friction_offset, "friction_offset", "a pressure >= 0 (Pa)");
  need_positive (&c, p->displacement, "displacement", "a positive volume (m^3)");
  need_positive (&c, p->max_cycle_rate, "max_cycle_rate", "a positive rate (1/s)");
  /* m in [0.1, 10]: wider than any measured curve, and it keeps the
   * regularised curve's slopes within a sane range. */
  need_range (&c, p->curve_exponent, 0.1, 10.0, "curve_exponent", "in [0.1, 10]");
  need_nonnegative (&c, p->changeover_time, "changeover_time", "a time >= 0 (s)");
  if (checker_ok (&c) && !(p->changeover_time * p->max_cycle_rate < 0.5))
    checker_fail (&c, "changeover_time", "shorter than half a double stroke (s)",
                  p->changeover_time);
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  return c.status;
}

pls_status
pls_accumulator_params_check (const pls_accumulator_params *p, char *why, size_t why_len)
{
  checker c;

  checker_init (&c, why, why_len);
  need_null_ok (&c, p);
  if (!checker_ok (&c))
    return c.status;
  need_positive (&c, p->gas_volume, "gas_volume", "a positive volume (m^3)");
  need_positive (&c, p->precharge, "precharge", "a positive gauge pressure (Pa)");
  need_positive (&c, p->precharge_temperature, "precharge_temperature",
                 "a positive absolute temperature (K)");
  need_positive (&c, p->gas_temperature, "gas_temperature",
                 "a positive absolute temperature (K)");
  /* 1 (isothermal) to 1.67 (adiabatic monatomic gas). */
  need_range (&c, p->polytropic_exponent, 1.0, 1.67, "polytropic_exponent", "in [1, 1.67]");
  need_positive (&c, p->neck_diameter, "neck_diameter", "a positive diameter (m)");
  need_positive (&c, p->neck_length, "neck_length", "a positive length (m)");
  need_nonnegative (&c, p->rated_pressure, "rated_pressure", "a pressure >= 0 (Pa)");
  if (checker_ok (&c)
      && !((p->precharge + PLS_ATMOSPHERE) * p->gas_temperature / p->precharge_temperature
           > PLS_ATMOSPHERE))
    checker_fail (&c, "gas_temperature", "high enough that the precharge stays above "
                  "atmosphere (K)", p->gas_temperature);
  return c.status;
}
