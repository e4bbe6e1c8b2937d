/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-laws.h: the element laws of the solver (internal header).
 *
 * Every two-port law maps a volumetric flow q (m^3/s, positive from the
 * element's first port to its second) to the pressure drop h = p_first -
 * p_second (Pa) that this flow needs, and its derivative dh/dq.  Network code
 * knows nothing of a law beyond this.
 *
 * Contract of every *_drop function, relied on by the Newton solvers:
 *  - h is odd or at least monotone increasing in q, continuous, and
 *    continuously differentiable (regime changes are blended);
 *  - dh_dq is finite and strictly positive for every finite q, including
 *    q = 0 (laws whose exact form has a zero or infinite slope at q = 0 are
 *    regularised by a physical low-flow limit, stated where it is done);
 *  - no NaN or Inf for finite inputs that passed the matching validator.
 * Validators are kept apart from the hot path: call pls_*_params_check once
 * when an element is added, never inside Newton.
 */
#pragma once

#include "pressline-solver.h"

#define PLS_PI 3.14159265358979323846
#define PLS_GRAVITY 9.80665          /* m/s^2, standard gravity (CGPM 1901)   */
#define PLS_ATMOSPHERE 101325.0      /* Pa, standard atmosphere               */

typedef struct
{
  double h;      /* pressure drop first -> second port at flow q, Pa   */
  double dh_dq;  /* d h / d q, Pa s/m^3, finite and > 0                  */
} pls_drop;

typedef enum
{
  PLS_REGIME_LAMINAR = 0,
  PLS_REGIME_TRANSITION,
  PLS_REGIME_TURBULENT,
} pls_regime;

/* What a line reports beside its drop, for results and design checks. */
typedef struct
{
  double velocity;         /* mean velocity q / A, m/s (signed)           */
  double reynolds;         /* generalised (Metzner-Reed) Reynolds number  */
  double wall_shear_rate;  /* |apparent wall shear rate| 8V/D corrected
                              to the true wall rate for the law, 1/s      */
  double wall_shear_stress;/* |tau_w|, Pa                                 */
  double darcy_friction;   /* Darcy friction factor (4x Fanning); 0 at
                              zero flow                                   */
  pls_regime regime;
} pls_line_state;

/* Validators: PLS_OK, or PLS_ERR_INVALID with a sentence naming the field
 * and the rule ("bore must be a positive length") written into why. */
pls_status pls_fluid_params_check (const pls_fluid_params *p, char *why, size_t why_len);
pls_status pls_line_params_check (const pls_line_params *p, char *why, size_t why_len);
pls_status pls_fitting_params_check (const pls_fitting_params *p, char *why, size_t why_len);
pls_status pls_nozzle_params_check (const pls_nozzle_params *p, char *why, size_t why_len);
pls_status pls_valve_params_check (const pls_valve_params *p, char *why, size_t why_len);
pls_status pls_pump_params_check (const pls_pump_params *p, char *why, size_t why_len);
pls_status pls_accumulator_params_check (const pls_accumulator_params *p, char *why, size_t why_len);

/* The fluid at its own temperature: the viscosity parameters with the
 * temperature shift applied (out may equal in). */
void pls_fluid_at_temperature (const pls_fluid_params *in, pls_fluid_params *out);

/* Apparent viscosity at a shear rate (1/s, >= 0), Pa s. */
double pls_fluid_viscosity (const pls_fluid_params *f, double shear_rate);

/* Power-law fluids: K gamma^(n-1) has no finite zero-shear limit for n < 1,
 * which would give a line an infinite dh/dq at q = 0.  The law used is
 * mu = K (gamma^2 + gc^2)^((n-1)/2) with gc below: a Newtonian plateau
 * K gc^(n-1) at shear rates far below any practical one (a hose at 1 mL/min
 * already sees ~1 1/s), within 1e-6 of K gamma^(n-1) above 1 1/s. */
#define PLS_POWER_LAW_PLATEAU_SHEAR 1e-3  /* gc, 1/s */

/* Shear stress tau = mu(gamma) gamma (Pa) at a shear rate (1/s, >= 0); the
 * slope dtau/dgamma (Pa s, finite and > 0 for every valid fluid) goes into
 * *slope unless it is NULL. */
double pls_fluid_shear_stress (const pls_fluid_params *f, double shear_rate, double *slope);
/* The inverse: shear rate (1/s) at a shear stress (Pa, >= 0), by a
 * safeguarded Newton iteration (tau(gamma) is strictly increasing). */
double pls_fluid_shear_rate (const pls_fluid_params *f, double stress);
/* The same fluid written in the Carreau form (out may equal in): the
 * power law becomes mu_0 = K gc^(n-1), mu_inf = 0, lambda = 1/gc; a
 * Newtonian fluid mu_0 = mu, lambda = 0.  Hot loops use it to skip the
 * per-call conversion. */
void pls_fluid_carreau_form (const pls_fluid_params *in, pls_fluid_params *out);
/* Viscosity as the shear rate goes to zero (Pa s, finite and > 0). */
double pls_fluid_zero_shear_viscosity (const pls_fluid_params *f);
/* Nonzero when the viscosity does not depend on the shear rate (Newtonian,
 * or Carreau with lambda = 0 or n = 1). */
int pls_fluid_is_newtonian (const pls_fluid_params *f);

/* Hooper 2-K constants (Hooper, Chem. Eng., Aug. 24, 1981, p. 97, table).
 * Written down from memory, then compared with the same table as
 * transcribed in the Python library `fluids` (C. Bell, fluids/fittings.py,
 * the `Hooper` dictionary), which agrees on every value below; not checked
 * against the paper itself.  Typical values: the user may override them. */
#define PLS_HOOPER_TEE_RUN_K1         200.0  /* tee, flow through run, threaded */
#define PLS_HOOPER_TEE_RUN_KINF       0.10
#define PLS_HOOPER_TEE_BRANCH_K1      500.0  /* tee used as elbow, threaded     */
#define PLS_HOOPER_TEE_BRANCH_KINF    0.70
#define PLS_HOOPER_ELBOW_90_K1        800.0  /* 90-degree elbow, r/D = 1, thr.  */
#define PLS_HOOPER_ELBOW_90_KINF      0.40
#define PLS_HOOPER_BALL_VALVE_K1      300.0  /* gate/ball valve, full line size */
#define PLS_HOOPER_BALL_VALVE_KINF    0.10
#define PLS_HOOPER_GLOBE_VALVE_K1     1500.0 /* globe (seat) valve, standard    */
#define PLS_HOOPER_GLOBE_VALVE_KINF   4.0

/* Lines: Hagen-Poiseuille / Rabinowitsch-Mooney / Carreau by quadrature in
 * laminar flow, Colebrook-White (exact) / Dodge-Metzner in turbulent flow,
 * blended through the transition band.  state may be NULL.  f must already
 * be at temperature (pls_fluid_at_temperature). */
void pls_line_drop (const pls_fluid_params *f, const pls_line_params *line,
                    double q, pls_drop *out, pls_line_state *state);

/* Exact Colebrook-White Darcy friction factor, to machine precision. */
double pls_colebrook_darcy (double reynolds, double relative_roughness);

/* Dodge-Metzner Fanning friction factor of a power-law fluid in a smooth
 * pipe at a Metzner-Reed Reynolds number (> 0), solved exactly. */
double pls_dodge_metzner_fanning (double reynolds, double flow_index);

/* Ryan-Johnson critical (generalised) Reynolds number of a power-law fluid:
 * Re_c = 6464 n (2 + n)^((2 + n)/(1 + n)) / (1 + 3 n)^2. */
double pls_ryan_johnson_reynolds (double flow_index);

/* The Reynolds band of the laminar-turbulent blend for a fluid:
 * Newtonian and Carreau 2100 to 4000, power law Re_c to Re_c + 1900. */
void pls_line_transition_band (const pls_fluid_params *f, double *re_lower, double *re_upper);

/* Hooper 2-K fitting loss. */
void pls_fitting_drop (const pls_fluid_params *f, const pls_fitting_params *p,
                       double q, pls_drop *out);

/* Applicator, open, discharging to atmosphere. */
void pls_nozzle_drop (const pls_fluid_params *f, const pls_nozzle_params *p,
                      double q, pls_drop *out);

/* Lichtarowicz et al. discharge coefficient at a Reynolds number (orifice
 * bore based) for the nozzle's l/d and its high-Re Cd.  The Reynolds number
 * is that of the ideal jet velocity sqrt(2 dp / rho), U d / nu, as in the
 * correlation (see pls-nozzle.c); 0 for reynolds <= 0.  A fixed-Cd nozzle
 * returns its Cd. */
double pls_nozzle_discharge_coefficient (const pls_nozzle_params *p, double reynolds);

/* Valve held open (a closed valve is not an element of the solve). */
void pls_valve_drop (const pls_fluid_params *f, const pls_valve_params *p,
                     double q, pls_drop *out);

/* Running pump: h = -(pressure gain) at flow q; for q < 0 the check valve
 * holds (a steep but finite slope).  Above stall (q -> 0+) the curve ends
 * with a finite slope too.  air_pressure in Pa gauge. */
void pls_pump_drop (const pls_pump_params *p, double air_pressure, double q, pls_drop *out);
double pls_pump_stall_pressure (const pls_pump_params *p, double air_pressure);
double pls_pump_free_flow (const pls_pump_params *p);

/* Accumulator at a node pressure (gauge, Pa): stored fluid volume (m^3, 0 at
 * or below precharge), gas volume (m^3) and gas energy relative to the
 * precharge state (J: isothermal p0 V0 ln(p/p0), else (p V - p0 V0)/(n - 1),
 * absolute pressures). */
double pls_accumulator_fluid_volume (const pls_accumulator_params *p, double pressure);
double pls_accumulator_gas_volume (const pls_accumulator_params *p, double pressure);
double pls_accumulator_gas_energy (const pls_accumulator_params *p, double pressure);
/* Precharge at the gas temperature (gauge, Pa). */
double pls_accumulator_effective_precharge (const pls_accumulator_params *p);
