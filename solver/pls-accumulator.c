/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-accumulator.c: steady side of a gas-charged bladder accumulator.
 *
 * Polytropic gas p V^n = const on absolute pressures (e.g. Esposito, Fluid
 * Power with Applications, 7th ed., sec. 5.10).  The precharge p0 is set at
 * precharge_temperature; at gas_temperature it scales with absolute
 * temperature (ideal gas at constant volume, Gay-Lussac): p0' = p0 T/T0.
 */
#include "config.h"

#include "pls-laws.h"

#include <math.h>

static double
precharge_abs (const pls_accumulator_params *p)
{
  return (p->precharge + PLS_ATMOSPHERE) * p->gas_temperature / p->precharge_temperature;
}

double
pls_accumulator_effective_precharge (const pls_accumulator_params *p)
{
  return precharge_abs (p) - PLS_ATMOSPHERE;
}

double
pls_accumulator_gas_volume (const pls_accumulator_params *p, double pressure)
{
  double p0 = precharge_abs (p), pa = pressure + PLS_ATMOSPHERE;

  /* At or below precharge the bladder fills the shell: all gas, no fluid. */
  if (!(pa > p0))
    return p->gas_volume;
  return p->gas_volume * pow (p0 / pa, 1.0 / p->polytropic_exponent);
}

double
pls_accumulator_fluid_volume (const pls_accumulator_params *p, double pressure)
{
  double p0 = precharge_abs (p), pa = pressure + PLS_ATMOSPHERE;

  /* Vf = V0 [1 - (p0/p)^(1/n)]; -expm1 keeps it accurate just above p0. */
  if (!(pa > p0))
    return 0.0;
  return -p->gas_volume * expm1 (log (p0 / pa) / p->polytropic_exponent);
}

double
pls_accumulator_gas_energy (const pls_accumulator_params *p, double pressure)
{
  double p0 = precharge_abs (p), pa = pressure + PLS_ATMOSPHERE, n = p->polytropic_exponent;
  double v0 = p->gas_volume;

  if (!(pa > p0))
    return 0.0;
  /* Work done on the gas from (p0, V0) to (p, V): isothermal p0 V0 ln(p/p0);
   * polytropic (p V - p0 V0) / (n - 1), written as
   * p0 V0 [(p/p0)^((n-1)/n) - 1] / (n - 1) with expm1 so it tends smoothly
   * to the isothermal value as n -> 1. */
  if (n == 1.0)
    return p0 * v0 * log (pa / p0);
  return p0 * v0 * expm1 ((n - 1.0) / n * log (pa / p0)) / (n - 1.0);
}
