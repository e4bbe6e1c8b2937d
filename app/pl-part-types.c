/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-part-types.c: the tables of part types (ports, parameters, defaults and
 * ranges) and the mapping from a part's values to the solver's parameter
 * structs.
 *
 * Ranges follow the solver's validators (solver/pls-params.c): where the
 * solver asks for > 0 the spec has an open lower bound at 0, where it asks
 * for >= 0 a closed one.  Rules that tie two fields together (roughness
 * against bore, ...) are checked in pl_part_check_consistency() below, not
 * per field, so that values can be typed in any order.
 *
 * Defaults are a plausible small glue line so that a part dropped on the
 * canvas solves at once; where a default is a trade habit or recalled
 * rather than looked up, the comment says so.
 */
#include "config.h"

#include "pl-part-type.h"
#include "pl-document-private.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-document.h"
#include "pls-laws.h"   /* PLS_HOOPER_* constants, PLS_ATMOSPHERE */

/* --- spec builders --- */

#define NUM(k, l, h, q, def, lob, lo, hib, hi, note)                     \
  { .key = (k), .label = (l), .help = (h), .kind = PL_PARAM_NUMBER,      \
    .quantity = (q), .default_number = (def), .min_bound = (lob),        \
    .min = (lo), .max_bound = (hib), .max = (hi), .range_note = (note) }

/* > 0, no upper limit. */
#define POS(k, l, h, q, def) \
  NUM (k, l, h, q, def, PL_BOUND_OPEN, 0.0, PL_BOUND_NONE, 0.0, NULL)
/* >= 0, no upper limit. */
#define NONNEG(k, l, h, q, def) \
  NUM (k, l, h, q, def, PL_BOUND_CLOSED, 0.0, PL_BOUND_NONE, 0.0, NULL)
/* Any finite value. */
#define ANY(k, l, h, q, def) \
  NUM (k, l, h, q, def, PL_BOUND_NONE, 0.0, PL_BOUND_NONE, 0.0, NULL)

#define CHOICE(k, l, h, list, def)                                        \
  { .key = (k), .label = (l), .help = (h), .kind = PL_PARAM_CHOICE,      \
    .quantity = PL_QUANTITY_RATIO, .choices = (list),                    \
    .n_choices = G_N_ELEMENTS (list), .default_choice = (def) }

#define BOOL(k, l, h, def)                                                \
  { .key = (k), .label = (l), .help = (h), .kind = PL_PARAM_BOOLEAN,     \
    .quantity = PL_QUANTITY_RATIO, .default_boolean = (def) }

#define TEXT(k, l, h, len)                                                \
  { .key = (k), .label = (l), .help = (h), .kind = PL_PARAM_TEXT,        \
    .quantity = PL_QUANTITY_RATIO, .default_text = "", .max_length = (len) }

/* Shared by every part that sits at a height. */
#define ELEVATION                                                        \
  ANY ("elevation", N_("Elevation"),                                     \
       N_("Height of the part above the layout's reference level; "      \
          "a height difference adds the weight of the fluid column."),  \
       PL_QUANTITY_LINE_LENGTH, 0.0)

/* Shared by every part that holds pressure. */
#define RATED_PRESSURE                                                   \
  NUM ("rated-pressure", N_("Rated working pressure"),                   \
       N_("Highest working pressure the maker allows for the part; "     \
          "0 if not known, which skips the rating check."),             \
       PL_QUANTITY_PRESSURE, 0.0, PL_BOUND_CLOSED, 0.0, PL_BOUND_NONE, 0.0, \
       N_("0 means not rated."))

/* Drawn tubing and smooth hose liners, about 1.5 µm (from memory; handbook
 * tables of absolute roughness list 0.0015 mm for drawn tubing). */
#define SMOOTH_ROUGHNESS 1.5e-6

/* 1/4 in bore, a common size for glue hoses (common practice, no source). */
#define QUARTER_INCH 6.35e-3

/* --- pump --- */

static const PlPortSpec pump_ports[] = {
  { "out", N_("Outlet"), 20.0, 0.0, PL_SIDE_EAST },
};

static const PlParamSpec pump_params[] = {
  NUM ("ratio", N_("Pressure ratio"),
       N_("Fluid pressure per unit of air pressure: the pump stalls at the ratio "
          "times the air pressure."),
       PL_QUANTITY_RATIO, 30.0, PL_BOUND_OPEN, 0.0, PL_BOUND_CLOSED, 1000.0,
       N_("Ratio pumps are built up to about 100:1; 1000 is the limit here.")),
  POS ("displacement", N_("Displacement"),
       N_("Fluid volume the pump delivers per double stroke."),
       PL_QUANTITY_VOLUME, 50e-6),
  POS ("max-cycle-rate", N_("Cycle rate at free flow"),
       N_("Double strokes per second when the outlet is open to the air."),
       PL_QUANTITY_FREQUENCY, 1.0),
  NUM ("curve-exponent", N_("Curve exponent"),
       N_("Shape of the flow against pressure curve: 1 is a straight line from "
          "free flow to stall."),
       PL_QUANTITY_RATIO, 1.0, PL_BOUND_CLOSED, 0.1, PL_BOUND_CLOSED, 10.0,
       N_("Measured pump curves fall well inside 0.1 to 10.")),
  NONNEG ("friction-offset", N_("Seal friction"),
          N_("Pressure lost to seal friction, taken off the stall pressure."),
          PL_QUANTITY_PRESSURE, 0.0),
  NONNEG ("changeover-time", N_("Changeover time"),
          N_("Gap in the flow at each end of the stroke while the pump reverses."),
          PL_QUANTITY_TIME, 0.0),
  RATED_PRESSURE,
  ELEVATION,
};

/* --- hose and pipe --- */

static const PlPortSpec line_ports[] = {
  { "a", N_("End A"), -30.0, 0.0, PL_SIDE_WEST },
  { "b", N_("End B"), 30.0, 0.0, PL_SIDE_EAST },
};

#define LINE_LENGTH_SPEC(def)                                            \
  POS ("length", N_("Length"), N_("Length of the line along its axis."), \
       PL_QUANTITY_LINE_LENGTH, def)
#define LINE_BORE_SPEC(def)                                              \
  POS ("bore", N_("Bore"), N_("Inner diameter of the line."),            \
       PL_QUANTITY_LENGTH, def)
#define LINE_ROUGHNESS_SPEC                                              \
  NONNEG ("roughness", N_("Wall roughness"),                             \
          N_("Absolute roughness of the inner wall; it matters only in " \
             "turbulent flow."),                                         \
          PL_QUANTITY_LENGTH, SMOOTH_ROUGHNESS)
#define LINE_RISE_SPEC                                                   \
  ANY ("rise", N_("Rise"),                                               \
       N_("How much higher end B is than end A."),                       \
       PL_QUANTITY_LINE_LENGTH, 0.0)

static const PlParamSpec hose_params[] = {
  LINE_LENGTH_SPEC (5.0),
  LINE_BORE_SPEC (QUARTER_INCH),
  LINE_ROUGHNESS_SPEC,
  NONNEG ("volumetric-expansion", N_("Volumetric expansion"),
          N_("Volume by which the hose swells per unit length and pressure, from the "
             "maker's data sheet; 0 counts only the fluid's compressibility."),
          PL_QUANTITY_HOSE_EXPANSION, 0.0),
  LINE_RISE_SPEC,
  RATED_PRESSURE,
  ELEVATION,
};

/* A 10 x 1 mm stainless tube; E = 193 GPa for type 316 stainless steel
 * (from memory). */
static const PlParamSpec pipe_params[] = {
  LINE_LENGTH_SPEC (1.0),
  LINE_BORE_SPEC (8e-3),
  LINE_ROUGHNESS_SPEC,
  NONNEG ("wall-thickness", N_("Wall thickness"),
          N_("Thickness of the pipe wall; with the modulus it sets how much the "
             "pipe swells under pressure (0: a rigid wall)."),
          PL_QUANTITY_LENGTH, 1e-3),
  NONNEG ("youngs-modulus", N_("Young's modulus"),
          N_("Elastic modulus of the wall material (0: a rigid wall)."),
          PL_QUANTITY_MODULUS, 193e9),
  LINE_RISE_SPEC,
  RATED_PRESSURE,
  ELEVATION,
};

/* --- tee --- */

static const PlPortSpec tee_ports[] = {
  { "a", N_("Run end A"), -20.0, 0.0, PL_SIDE_WEST },
  { "b", N_("Run end B"), 20.0, 0.0, PL_SIDE_EAST },
  { "branch", N_("Branch"), 0.0, 20.0, PL_SIDE_SOUTH },
};

static const PlParamSpec tee_params[] = {
  LINE_BORE_SPEC (QUARTER_INCH),
  POS ("run-k1", N_("Run K1"),
       N_("Hooper's laminar constant K1 for flow straight through the run."),
       PL_QUANTITY_RATIO, PLS_HOOPER_TEE_RUN_K1),
  NONNEG ("run-k-infinity", N_("Run K∞"),
          N_("Hooper's turbulent constant K∞ for flow straight through the run."),
          PL_QUANTITY_RATIO, PLS_HOOPER_TEE_RUN_KINF),
  POS ("branch-k1", N_("Branch K1"),
       N_("Hooper's laminar constant K1 for flow turning into or out of the branch."),
       PL_QUANTITY_RATIO, PLS_HOOPER_TEE_BRANCH_K1),
  NONNEG ("branch-k-infinity", N_("Branch K∞"),
          N_("Hooper's turbulent constant K∞ for flow turning into or out of the branch."),
          PL_QUANTITY_RATIO, PLS_HOOPER_TEE_BRANCH_KINF),
  RATED_PRESSURE,
  ELEVATION,
};

/* --- accumulator --- */

static const PlPortSpec one_port_south[] = {
  { "p", N_("Connection"), 0.0, 30.0, PL_SIDE_SOUTH },
};

/* Precharge near half the working pressure is common in glue manifolds
 * (common practice, no source); 50 bar suits a 30:1 pump at 4 to 6 bar. */
static const PlParamSpec accumulator_params[] = {
  POS ("gas-volume", N_("Gas volume"),
       N_("Volume of the gas charge at precharge, when the bladder is full."),
       PL_QUANTITY_VOLUME, 1e-3),
  POS ("precharge", N_("Precharge"),
       N_("Gas pressure with no fluid in the accumulator, at the precharge temperature."),
       PL_QUANTITY_PRESSURE, 50e5),
  POS ("precharge-temperature", N_("Precharge temperature"),
       N_("Temperature at which the precharge was set."),
       PL_QUANTITY_TEMPERATURE, 293.15),
  POS ("gas-temperature", N_("Gas temperature"),
       N_("Temperature of the gas in service; the precharge scales with it."),
       PL_QUANTITY_TEMPERATURE, 293.15),
  NUM ("polytropic-exponent", N_("Polytropic exponent"),
       N_("Exponent n of p V^n = const: 1 for slow (isothermal) changes, 1.4 for "
          "fast (adiabatic) ones such as firing."),
       PL_QUANTITY_RATIO, 1.4, PL_BOUND_CLOSED, 1.0, PL_BOUND_CLOSED, 1.67,
       N_("1 is isothermal; 1.67 is the adiabatic limit of a monatomic gas.")),
  POS ("neck-diameter", N_("Neck diameter"),
       N_("Inner diameter of the passage between the accumulator and the line."),
       PL_QUANTITY_LENGTH, 10e-3),
  POS ("neck-length", N_("Neck length"),
       N_("Length of the passage between the accumulator and the line."),
       PL_QUANTITY_LENGTH, 50e-3),
  RATED_PRESSURE,
  ELEVATION,
};

/* --- valves --- */

static const PlPortSpec dump_ports[] = {
  { "in", N_("Inlet"), -20.0, 0.0, PL_SIDE_WEST },
  { "out", N_("Return"), 20.0, 0.0, PL_SIDE_EAST },
};

static const PlPortSpec ball_ports[] = {
  { "a", N_("End A"), -20.0, 0.0, PL_SIDE_WEST },
  { "b", N_("End B"), 20.0, 0.0, PL_SIDE_EAST },
};

#define KV_SPEC(def)                                                     \
  POS ("kv", N_("Flow coefficient Kv"),                                  \
       N_("Flow in cubic metres per hour of water at 1 bar pressure "    \
          "drop across the open valve (IEC 60534)."),                   \
       PL_QUANTITY_RATIO, def)

/* Kv of small high-pressure valves, 0.5 for a dump valve and 2 for a 1/4 in
 * ball valve (from memory of data sheets). */
static const PlParamSpec dump_params[] = {
  KV_SPEC (0.5),
  LINE_BORE_SPEC (4e-3),
  RATED_PRESSURE,
  ELEVATION,
};

static const PlParamSpec ball_params[] = {
  BOOL ("open", N_("Open"),
        N_("Whether the valve is open; a closed valve can be locked out for work."),
        TRUE),
  KV_SPEC (2.0),
  LINE_BORE_SPEC (QUARTER_INCH),
  RATED_PRESSURE,
  ELEVATION,
};

/* --- applicator --- */

static const PlPortSpec applicator_ports[] = {
  { "in", N_("Inlet"), 0.0, -20.0, PL_SIDE_NORTH },
};

static const PlChoice cd_models[] = {
  { "fixed", N_("Fixed") },
  { "lichtarowicz", N_("Reynolds-dependent (Lichtarowicz)") },
};

static const PlParamSpec applicator_params[] = {
  POS ("orifice-diameter", N_("Orifice diameter"),
       N_("Diameter of the nozzle's orifice."),
       PL_QUANTITY_LENGTH, 0.5e-3),
  NONNEG ("orifice-length", N_("Orifice length"),
          N_("Length of the orifice's straight bore."),
          PL_QUANTITY_LENGTH, 1.0e-3),
  CHOICE ("cd-model", N_("Discharge coefficient model"),
          N_("Fixed, or falling with the Reynolds number as Lichtarowicz et al. "
             "measured, which suits viscous fluids."),
          cd_models, 1),
  NUM ("discharge-coefficient", N_("Discharge coefficient"),
       N_("Cd of the orifice, or its high-Reynolds limit for the "
          "Reynolds-dependent model."),
       PL_QUANTITY_RATIO, 0.7, PL_BOUND_OPEN, 0.0, PL_BOUND_CLOSED, 1.0, NULL),
  NONNEG ("passage-drop", N_("Passage pressure drop"),
          N_("Pressure lost in the valve and passages at the reference flow; it grows "
             "in proportion to the flow."),
          PL_QUANTITY_PRESSURE, 2e5),
  POS ("passage-flow", N_("Passage reference flow"),
       N_("Flow at which the passage pressure drop was measured."),
       PL_QUANTITY_FLOW, 100e-6 / 60.0),
  NONNEG ("firing-delay", N_("Firing delay"),
          N_("Time from the start of each cycle until this applicator starts to open."),
          PL_QUANTITY_TIME, 0.0),
  RATED_PRESSURE,
  ELEVATION,
};

/* --- gauge and drain --- */

static const PlPortSpec gauge_ports[] = {
  { "p", N_("Connection"), 0.0, 20.0, PL_SIDE_SOUTH },
};

static const PlParamSpec gauge_params[] = {
  POS ("full-scale", N_("Full scale"),
       N_("Highest reading of the gauge's dial."),
       PL_QUANTITY_PRESSURE, 250e5),
  ELEVATION,
};

static const PlPortSpec drain_ports[] = {
  { "p", N_("Connection"), 0.0, -15.0, PL_SIDE_NORTH },
};

static const PlChoice drain_kinds[] = {
  { "drain", N_("Drain") },
  { "tank", N_("Tank") },
};

static const PlParamSpec drain_params[] = {
  CHOICE ("kind", N_("Kind"),
          N_("A drain or an open tank: both hold the connection at atmospheric pressure."),
          drain_kinds, 0),
  ANY ("elevation", N_("Surface elevation"),
       N_("Height of the free surface above the layout's reference level."),
       PL_QUANTITY_LINE_LENGTH, 0.0),
};

/* --- scenario --- */

static const PlChoice viscosity_laws[] = {
  { "newtonian", N_("Newtonian") },
  { "power-law", N_("Power law") },
  { "carreau", N_("Carreau") },
};

#define LAW_NEWTONIAN (1u << 0)
#define LAW_POWER (1u << 1)
#define LAW_CARREAU (1u << 2)

/* The fluid defaults are those of pls_fluid_params_init(), the schedule and
 * check limits those of pls_transient_options_init() and
 * pls_steady_options_init() (each commented there; several are common
 * practice, no source). */
static const PlParamSpec scenario_params[] = {
  CHOICE ("viscosity-law", N_("Viscosity law"),
          N_("How the fluid's viscosity depends on the shear rate."),
          viscosity_laws, 0),
  POS ("density", N_("Density"), N_("Mass of the fluid per unit volume."),
       PL_QUANTITY_DENSITY, 1100.0),
  POS ("bulk-modulus", N_("Bulk modulus"),
       N_("Stiffness of the fluid against compression."),
       PL_QUANTITY_MODULUS, 1.5e9),
  { .key = "viscosity", .label = N_("Viscosity"),
    .help = N_("Dynamic viscosity of a Newtonian fluid."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_VISCOSITY, .default_number = 1.0,
    .min_bound = PL_BOUND_OPEN, .max_bound = PL_BOUND_NONE,
    .depends_on = "viscosity-law", .depends_mask = LAW_NEWTONIAN },
  /* K carries units of Pa s^n, shown as such; a viscosity unit typed or
   * stored for it reads as the n = 1 case (pl_unit_fits). */
  { .key = "consistency", .label = N_("Consistency K"),
    .help = N_("Power-law consistency K, in pascal seconds to the power n."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_CONSISTENCY, .default_number = 1.0,
    .min_bound = PL_BOUND_OPEN, .max_bound = PL_BOUND_NONE,
    .depends_on = "viscosity-law", .depends_mask = LAW_POWER },
  { .key = "flow-index", .label = N_("Flow index n"),
    .help = N_("Power-law or Carreau index: below 1 the fluid thins with shear."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_RATIO, .default_number = 1.0,
    .min_bound = PL_BOUND_OPEN, .min = 0.0, .max_bound = PL_BOUND_OPEN, .max = 2.0,
    .range_note = N_("Beyond 2 the flow would slow as the pressure rises."),
    .depends_on = "viscosity-law", .depends_mask = LAW_POWER | LAW_CARREAU },
  { .key = "zero-shear-viscosity", .label = N_("Zero-shear viscosity"),
    .help = N_("Carreau viscosity at rest."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_VISCOSITY, .default_number = 1.0,
    .min_bound = PL_BOUND_OPEN, .max_bound = PL_BOUND_NONE,
    .depends_on = "viscosity-law", .depends_mask = LAW_CARREAU },
  { .key = "infinite-shear-viscosity", .label = N_("Infinite-shear viscosity"),
    .help = N_("Carreau viscosity at very high shear rates."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_VISCOSITY, .default_number = 0.0,
    .min_bound = PL_BOUND_CLOSED, .max_bound = PL_BOUND_NONE,
    .depends_on = "viscosity-law", .depends_mask = LAW_CARREAU },
  { .key = "time-constant", .label = N_("Time constant"),
    .help = N_("Carreau time constant: its inverse is the shear rate where thinning starts."),
    .kind = PL_PARAM_NUMBER, .quantity = PL_QUANTITY_TIME, .default_number = 0.0,
    .min_bound = PL_BOUND_CLOSED, .max_bound = PL_BOUND_NONE,
    .depends_on = "viscosity-law", .depends_mask = LAW_CARREAU },
  POS ("temperature", N_("Fluid temperature"),
       N_("Temperature of the fluid in the line."), PL_QUANTITY_TEMPERATURE, 293.15),
  POS ("reference-temperature", N_("Reference temperature"),
       N_("Temperature at which the viscosity values above hold."),
       PL_QUANTITY_TEMPERATURE, 293.15),
  /* B = E_a / R is a temperature difference in kelvin; a temperature
   * quantity would add the 273.15 offset of degrees Celsius, so the plain
   * number is shown. */
  NONNEG ("activation-temperature", N_("Viscosity temperature coefficient (K)"),
          N_("B in mu(T) = mu(Tref) exp[B (1/T - 1/Tref)], in kelvin; 0 ignores "
             "the temperature."),
          PL_QUANTITY_RATIO, 0.0),
  BOOL ("air-on", N_("Air on"),
        N_("Whether the pumps have air: on, they run and the dump valves are shut; "
           "off, the pumps stop and the dump valves open."),
        TRUE),
  NONNEG ("air-pressure", N_("Air pressure"),
          N_("Gauge pressure of the air at the pumps' inlets."),
          PL_QUANTITY_PRESSURE, 6e5),
  POS ("cycle-rate", N_("Firing rate"), N_("Shots per second of each applicator."),
       PL_QUANTITY_FREQUENCY, 2.0),
  POS ("on-time", N_("On-time"),
       N_("Time from the start of opening to the start of closing of each shot."),
       PL_QUANTITY_TIME, 0.05),
  POS ("open-ramp", N_("Opening time"),
       N_("Time an applicator valve takes to open fully."), PL_QUANTITY_TIME, 2e-3),
  POS ("close-ramp", N_("Closing time"),
       N_("Time an applicator valve takes to shut."), PL_QUANTITY_TIME, 2e-3),
  NUM ("uniformity-tolerance", N_("Shot uniformity tolerance"),
       N_("Allowed deviation of each shot's mass from the mean of all shots."),
       PL_QUANTITY_RATIO, 0.02, PL_BOUND_OPEN, 0.0, PL_BOUND_CLOSED, 1.0, NULL),
  NUM ("recovery-fraction", N_("Recovery band"),
       N_("A node has recovered once it is back within this fraction of its idle "
          "pressure."),
       PL_QUANTITY_RATIO, 0.01, PL_BOUND_OPEN, 0.0, PL_BOUND_CLOSED, 1.0, NULL),
  NUM ("manifold-spread-tolerance", N_("Manifold spread tolerance"),
       N_("Allowed spread of the open applicators' pressures, as a fraction of the "
          "highest."),
       PL_QUANTITY_RATIO, 0.05, PL_BOUND_OPEN, 0.0, PL_BOUND_CLOSED, 1.0, NULL),
  POS ("safe-pressure", N_("Safe pressure"),
       N_("Pressure below which the line counts as safe to open after shutdown."),
       PL_QUANTITY_PRESSURE, 1e5),
  POS ("shutdown-time", N_("Shutdown time"),
       N_("How long the shutdown decay is followed at most."), PL_QUANTITY_TIME, 600.0),
  NONNEG ("demand-pressure", N_("Applicator demand pressure"),
          N_("Pressure the applicators need; 0 switches the check off."),
          PL_QUANTITY_PRESSURE, 0.0),
  NONNEG ("demand-flow", N_("Total demand flow"),
          N_("Total flow the applicators need; 0 switches the check off."),
          PL_QUANTITY_FLOW, 0.0),
  POS ("velocity-limit", N_("Velocity limit"),
       N_("Mean velocity in a line above which a warning is given."),
       PL_QUANTITY_VELOCITY, 3.0),
  POS ("shear-rate-limit", N_("Shear rate limit"),
       N_("Wall shear rate in a line above which a warning is given."),
       PL_QUANTITY_SHEAR_RATE, 2e4),
  NUM ("gauge-low-factor", N_("Gauge headroom factor"),
       N_("A gauge's full scale should be at least this many times its highest reading."),
       PL_QUANTITY_RATIO, 1.5, PL_BOUND_CLOSED, 1.0, PL_BOUND_NONE, 0.0, NULL),
  NUM ("gauge-high-factor", N_("Gauge resolution factor"),
       N_("A gauge's reading should be at least its full scale divided by this factor."),
       PL_QUANTITY_RATIO, 3.0, PL_BOUND_CLOSED, 1.0, PL_BOUND_NONE, 0.0, NULL),
  NUM ("precharge-low-fraction", N_("Lowest precharge fraction"),
       N_("An accumulator's precharge should be at least this fraction of the highest "
          "working pressure it sees."),
       PL_QUANTITY_RATIO, 0.25, PL_BOUND_CLOSED, 0.0, PL_BOUND_CLOSED, 1.0, NULL),
};

/* --- title block --- */

#define TITLE_LENGTH 200

static const PlParamSpec title_params[] = {
  TEXT ("work-order", N_("Work order"), N_("Number of the work order this sheet belongs to."),
        TITLE_LENGTH),
  TEXT ("line", N_("Line"), N_("Name of the production line."), TITLE_LENGTH),
  TEXT ("site", N_("Site"), N_("Plant or site where the line stands."), TITLE_LENGTH),
  TEXT ("author", N_("Author"), N_("Who drew the layout."), TITLE_LENGTH),
  TEXT ("date", N_("Date"), N_("Date of this revision."), TITLE_LENGTH),
  TEXT ("revision", N_("Revision"), N_("Revision mark of the layout."), TITLE_LENGTH),
};

/* --- the registry --- */

#define PARTS(p) (p), G_N_ELEMENTS (p)

/* Indexed by PlPartKind. */
static const PlPartType part_types[PL_N_PART_KINDS] = {
  { PL_PART_PUMP, "pump", N_("Pump"),
    N_("Air-driven ratio pump with a check valve, drawing from its own drum."),
    "P", TRUE, PARTS (pump_ports), PARTS (pump_params), 20.0, 20.0 },
  { PL_PART_HOSE, "hose", N_("Hose"), N_("Flexible high-pressure hose."),
    "H", TRUE, PARTS (line_ports), PARTS (hose_params), 30.0, 8.0 },
  { PL_PART_PIPE, "pipe", N_("Rigid pipe"), N_("Rigid tube or pipe with an elastic wall."),
    "R", TRUE, PARTS (line_ports), PARTS (pipe_params), 30.0, 6.0 },
  { PL_PART_TEE, "tee", N_("Tee"), N_("Tee fitting with a run and a branch."),
    "T", TRUE, PARTS (tee_ports), PARTS (tee_params), 20.0, 20.0 },
  { PL_PART_ACCUMULATOR, "accumulator", N_("Accumulator"),
    N_("Gas-charged bladder accumulator that stores fluid under pressure."),
    "A", TRUE, PARTS (one_port_south), PARTS (accumulator_params), 15.0, 30.0 },
  { PL_PART_DUMP_VALVE, "dump-valve", N_("Dump valve"),
    N_("Normally open valve, held shut by the air; it relieves the line when the air "
       "goes off."),
    "DV", TRUE, PARTS (dump_ports), PARTS (dump_params), 20.0, 15.0 },
  { PL_PART_BALL_VALVE, "ball-valve", N_("Ball valve"),
    N_("Manual shut-off valve, open or closed."),
    "BV", TRUE, PARTS (ball_ports), PARTS (ball_params), 20.0, 12.0 },
  { PL_PART_APPLICATOR, "applicator", N_("Applicator"),
    N_("Valve and nozzle that shoots fluid to the air on the firing schedule."),
    "N", TRUE, PARTS (applicator_ports), PARTS (applicator_params), 12.0, 20.0 },
  { PL_PART_GAUGE, "gauge", N_("Gauge"), N_("Pressure gauge; it reads, it takes no flow."),
    "G", TRUE, PARTS (gauge_ports), PARTS (gauge_params), 15.0, 20.0 },
  { PL_PART_DRAIN, "drain", N_("Drain or tank"),
    N_("Return to atmospheric pressure: a drain or an open tank."),
    "D", TRUE, PARTS (drain_ports), PARTS (drain_params), 20.0, 15.0 },
  { PL_PART_SCENARIO, "scenario", N_("Scenario"),
    N_("Fluid, air supply, firing schedule and the limits of the design checks."),
    "", FALSE, NULL, 0, PARTS (scenario_params), 0.0, 0.0 },
  { PL_PART_TITLE, "title", N_("Title block"),
    N_("Work order, line, site, author, date and revision of the layout."),
    "", FALSE, NULL, 0, PARTS (title_params), 0.0, 0.0 },
};

const PlPartType *
pl_part_type_get (PlPartKind kind)
{
  if ((int) kind < 0 || kind >= PL_N_PART_KINDS)
    return NULL;
  return &part_types[kind];
}

guint
pl_part_type_get_n_placeable (void)
{
  return PL_PART_DRAIN + 1;
}

const PlPartType *
pl_part_type_get_placeable (guint index)
{
  if (index > PL_PART_DRAIN)
    return NULL;
  return &part_types[index];
}

const PlPartType *
pl_part_type_lookup (const char *key)
{
  if (key == NULL)
    return NULL;
  for (guint i = 0; i < PL_N_PART_KINDS; i++)
    if (g_str_equal (part_types[i].key, key))
      return &part_types[i];
  return NULL;
}

/* --- cross-field rules --- */

/* The name a message gives a part: its tag, or the pseudo type's name. */
static const char *
part_name (const PlPart *part)
{
  const char *tag = pl_part_get_tag (part);

  if (tag != NULL && tag[0] != '\0')
    return tag;
  return _(pl_part_get_part_type (part)->name);
}

static char *
fmt (double value, PlQuantity quantity, const PlUnitPrefs *prefs)
{
  return pl_unit_format (value, quantity, prefs, 0, PL_UNIT_DECIMAL_FROM_LOCALE);
}

#define NUMBER(part, key) pl_part_get_number ((part), (key))

/* Returns FALSE with error set for the first rule broken.  The rules are
 * those of solver/pls-params.c and the firing-schedule checks of the
 * time-domain solver that involve two fields. */
gboolean
pl_part_check_consistency (const PlPart *part, const PlPart *scenario,
                           const PlUnitPrefs *prefs, GError **error)
{
  g_autofree char *limit = NULL;
  const char *name;
  gboolean ok = TRUE;

  g_return_val_if_fail (part != NULL, FALSE);
  name = part_name (part);

  switch (pl_part_get_part_type (part)->kind)
    {
    case PL_PART_HOSE:
    case PL_PART_PIPE:
      if (!(NUMBER (part, "roughness") < 0.5 * NUMBER (part, "bore")))
        {
          limit = fmt (0.5 * NUMBER (part, "bore"), PL_QUANTITY_LENGTH, prefs);
          /* Translators: the first %s is a part's tag, the second a length. */
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the wall roughness must be less than half the bore (%s)."),
                       name, limit);
          ok = FALSE;
        }
      break;
    case PL_PART_TEE:
      /* The branch leg of the star split gets branch - run / 2 (see
       * pl-part-type.h); K1 must stay positive, Kinf non-negative. */
      if (!(NUMBER (part, "branch-k1") > 0.5 * NUMBER (part, "run-k1")))
        {
          limit = fmt (0.5 * NUMBER (part, "run-k1"), PL_QUANTITY_RATIO, prefs);
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the branch K1 must be more than half the run K1 (%s)."),
                       name, limit);
          ok = FALSE;
        }
      else if (!(NUMBER (part, "branch-k-infinity")
                 >= 0.5 * NUMBER (part, "run-k-infinity")))
        {
          limit = fmt (0.5 * NUMBER (part, "run-k-infinity"), PL_QUANTITY_RATIO, prefs);
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the branch K∞ must be at least half the run K∞ (%s)."),
                       name, limit);
          ok = FALSE;
        }
      break;
    case PL_PART_PUMP:
      if (!(NUMBER (part, "changeover-time") * NUMBER (part, "max-cycle-rate") < 0.5))
        {
          limit = fmt (0.5 / NUMBER (part, "max-cycle-rate"), PL_QUANTITY_TIME, prefs);
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the changeover time must be shorter than half a double "
                         "stroke (%s)."), name, limit);
          ok = FALSE;
        }
      break;
    case PL_PART_ACCUMULATOR:
      /* Absolute precharge scaled to the gas temperature (Gay-Lussac) must
       * stay above the atmosphere, as pls_accumulator_params_check asks. */
      if (!((NUMBER (part, "precharge") + PLS_ATMOSPHERE) * NUMBER (part, "gas-temperature")
            / NUMBER (part, "precharge-temperature") > PLS_ATMOSPHERE))
        {
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the gas temperature must be high enough that the precharge "
                         "stays above atmospheric pressure."), name);
          ok = FALSE;
        }
      break;
    case PL_PART_APPLICATOR:
      if (!(NUMBER (part, "orifice-length") <= 100.0 * NUMBER (part, "orifice-diameter")))
        {
          limit = fmt (100.0 * NUMBER (part, "orifice-diameter"), PL_QUANTITY_LENGTH, prefs);
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                       _("%s: the orifice length must be at most 100 orifice diameters "
                         "(%s)."), name, limit);
          ok = FALSE;
        }
      else if (scenario != NULL)
        {
          double period = 1.0 / NUMBER (scenario, "cycle-rate");
          double end = NUMBER (part, "firing-delay") + NUMBER (scenario, "on-time")
                       + NUMBER (scenario, "close-ramp");

          /* The same slack as the time-domain solver's own check. */
          if (!(end <= period * (1.0 + 1e-12)))
            {
              limit = fmt (period, PL_QUANTITY_TIME, prefs);
              g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                           _("%s: the firing delay, the on-time and the closing time "
                             "together must fit in one firing cycle (%s)."), name, limit);
              ok = FALSE;
            }
        }
      break;
    case PL_PART_SCENARIO:
      {
        double b = NUMBER (part, "activation-temperature");
        double t = NUMBER (part, "temperature"), tref = NUMBER (part, "reference-temperature");
        double period = 1.0 / NUMBER (part, "cycle-rate");

        if (pl_part_get_choice (part, "viscosity-law") == 2
            && !(NUMBER (part, "infinite-shear-viscosity")
                 <= NUMBER (part, "zero-shear-viscosity")))
          {
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                         _("%s: the infinite-shear viscosity must not exceed the "
                           "zero-shear viscosity."), name);
            ok = FALSE;
          }
        /* The solver keeps the Arrhenius factor within e^50. */
        else if (!(fabs (b * (1.0 / t - 1.0 / tref)) <= 50.0))
          {
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                         _("%s: the viscosity temperature coefficient is too large for "
                           "the temperatures given."), name);
            ok = FALSE;
          }
        else if (!(NUMBER (part, "on-time") < period))
          {
            limit = fmt (period, PL_QUANTITY_TIME, prefs);
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                         _("%s: the on-time must be shorter than one firing cycle (%s)."),
                         name, limit);
            ok = FALSE;
          }
        else if (!(NUMBER (part, "open-ramp") <= NUMBER (part, "on-time")))
          {
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                         _("%s: the opening time must not exceed the on-time."), name);
            ok = FALSE;
          }
      }
      break;
    case PL_PART_DUMP_VALVE:
    case PL_PART_BALL_VALVE:
    case PL_PART_GAUGE:
    case PL_PART_DRAIN:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      break;
    }
  return ok;
}

/* --- solver parameter structs --- */

static gboolean
need_kind (const PlPart *part, PlPartKind a, PlPartKind b, GError **error)
{
  PlPartKind k;

  g_return_val_if_fail (part != NULL, FALSE);
  k = pl_part_get_part_type (part)->kind;
  if (k == a || k == b)
    return TRUE;
  g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND,
               /* Translators: %s is a part's tag. */
               _("%s is not a part of the kind asked for."), part_name (part));
  return FALSE;
}

gboolean
pl_part_get_line_params (const PlPart *part, pls_line_params *out, GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_HOSE, PL_PART_PIPE, error)
      || !pl_part_check_consistency (part, NULL, NULL, error))
    return FALSE;
  *out = (pls_line_params) { 0 };
  if (pl_part_get_part_type (part)->kind == PL_PART_HOSE)
    {
      out->kind = PLS_LINE_HOSE;
      out->volumetric_expansion = NUMBER (part, "volumetric-expansion");
    }
  else
    {
      out->kind = PLS_LINE_PIPE;
      out->wall_thickness = NUMBER (part, "wall-thickness");
      out->youngs_modulus = NUMBER (part, "youngs-modulus");
    }
  out->length = NUMBER (part, "length");
  out->bore = NUMBER (part, "bore");
  out->roughness = NUMBER (part, "roughness");
  out->rated_pressure = NUMBER (part, "rated-pressure");
  return TRUE;
}

gboolean
pl_part_get_tee_legs (const PlPart *part, pls_fitting_params legs[3], GError **error)
{
  double run_k1, run_kinf, bore, rated;

  g_return_val_if_fail (legs != NULL, FALSE);
  if (!need_kind (part, PL_PART_TEE, PL_PART_TEE, error)
      || !pl_part_check_consistency (part, NULL, NULL, error))
    return FALSE;
  run_k1 = NUMBER (part, "run-k1");
  run_kinf = NUMBER (part, "run-k-infinity");
  bore = NUMBER (part, "bore");
  rated = NUMBER (part, "rated-pressure");
  /* Star split, see pl-part-type.h: a -> b crosses two run legs (K_run),
   * a -> branch one run leg and the branch leg (K_branch). */
  for (guint i = 0; i < 2; i++)
    legs[i] = (pls_fitting_params) { 0.5 * run_k1, 0.5 * run_kinf, bore, rated };
  legs[2] = (pls_fitting_params) { NUMBER (part, "branch-k1") - 0.5 * run_k1,
                                   NUMBER (part, "branch-k-infinity") - 0.5 * run_kinf,
                                   bore, rated };
  return TRUE;
}

gboolean
pl_part_get_valve_params (const PlPart *part, pls_valve_params *out, GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_BALL_VALVE, PL_PART_DUMP_VALVE, error))
    return FALSE;
  *out = (pls_valve_params) { 0 };
  if (pl_part_get_part_type (part)->kind == PL_PART_BALL_VALVE)
    {
      out->kind = PLS_VALVE_BALL;
      out->open = pl_part_get_boolean (part, "open") ? 1 : 0;
    }
  else
    {
      out->kind = PLS_VALVE_DUMP;
      out->open = 1;   /* ignored by the solver for a dump valve */
    }
  out->kv = NUMBER (part, "kv");
  out->bore = NUMBER (part, "bore");
  out->rated_pressure = NUMBER (part, "rated-pressure");
  return TRUE;
}

gboolean
pl_part_get_pump_params (const PlPart *part, pls_pump_params *out, GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_PUMP, PL_PART_PUMP, error)
      || !pl_part_check_consistency (part, NULL, NULL, error))
    return FALSE;
  *out = (pls_pump_params) { 0 };
  out->ratio = NUMBER (part, "ratio");
  out->friction_offset = NUMBER (part, "friction-offset");
  out->displacement = NUMBER (part, "displacement");
  out->max_cycle_rate = NUMBER (part, "max-cycle-rate");
  out->curve_exponent = NUMBER (part, "curve-exponent");
  out->changeover_time = NUMBER (part, "changeover-time");
  out->rated_pressure = NUMBER (part, "rated-pressure");
  return TRUE;
}

gboolean
pl_part_get_nozzle_params (const PlPart *part, pls_nozzle_params *out, GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_APPLICATOR, PL_PART_APPLICATOR, error)
      || !pl_part_check_consistency (part, NULL, NULL, error))
    return FALSE;
  *out = (pls_nozzle_params) { 0 };
  out->orifice_diameter = NUMBER (part, "orifice-diameter");
  out->orifice_length = NUMBER (part, "orifice-length");
  out->cd_model = pl_part_get_choice (part, "cd-model") == 0 ? PLS_CD_FIXED
                                                              : PLS_CD_LICHTAROWICZ;
  out->discharge_coefficient = NUMBER (part, "discharge-coefficient");
  /* A linear passage: R = dp_ref / Q_ref (passage-flow > 0 by its range). */
  out->passage_resistance = NUMBER (part, "passage-drop") / NUMBER (part, "passage-flow");
  out->rated_pressure = NUMBER (part, "rated-pressure");
  return TRUE;
}

gboolean
pl_part_get_accumulator_params (const PlPart *part, pls_accumulator_params *out,
                                GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_ACCUMULATOR, PL_PART_ACCUMULATOR, error)
      || !pl_part_check_consistency (part, NULL, NULL, error))
    return FALSE;
  *out = (pls_accumulator_params) { 0 };
  out->gas_volume = NUMBER (part, "gas-volume");
  out->precharge = NUMBER (part, "precharge");
  out->precharge_temperature = NUMBER (part, "precharge-temperature");
  out->gas_temperature = NUMBER (part, "gas-temperature");
  out->polytropic_exponent = NUMBER (part, "polytropic-exponent");
  out->neck_diameter = NUMBER (part, "neck-diameter");
  out->neck_length = NUMBER (part, "neck-length");
  out->rated_pressure = NUMBER (part, "rated-pressure");
  return TRUE;
}

gboolean
pl_part_get_gauge_params (const PlPart *part, pls_gauge_params *out, GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (part, PL_PART_GAUGE, PL_PART_GAUGE, error))
    return FALSE;
  out->full_scale = NUMBER (part, "full-scale");
  return TRUE;
}

double
pl_part_get_firing_delay (const PlPart *part)
{
  g_return_val_if_fail (part != NULL, 0.0);
  if (pl_part_get_part_type (part)->kind != PL_PART_APPLICATOR)
    return 0.0;
  return NUMBER (part, "firing-delay");
}

gboolean
pl_scenario_get_fluid_params (const PlPart *scenario, pls_fluid_params *out, GError **error)
{
  static const pls_viscosity_law laws[] = {
    PLS_VISCOSITY_NEWTONIAN, PLS_VISCOSITY_POWER_LAW, PLS_VISCOSITY_CARREAU,
  };

  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (scenario, PL_PART_SCENARIO, PL_PART_SCENARIO, error)
      || !pl_part_check_consistency (scenario, NULL, NULL, error))
    return FALSE;
  pls_fluid_params_init (out);
  out->law = laws[MIN (pl_part_get_choice (scenario, "viscosity-law"),
                       G_N_ELEMENTS (laws) - 1)];
  out->density = NUMBER (scenario, "density");
  out->bulk_modulus = NUMBER (scenario, "bulk-modulus");
  out->mu = NUMBER (scenario, "viscosity");
  out->consistency = NUMBER (scenario, "consistency");
  out->flow_index = NUMBER (scenario, "flow-index");
  out->mu_zero = NUMBER (scenario, "zero-shear-viscosity");
  out->mu_infinity = NUMBER (scenario, "infinite-shear-viscosity");
  out->lambda = NUMBER (scenario, "time-constant");
  out->temperature = NUMBER (scenario, "temperature");
  out->reference_temperature = NUMBER (scenario, "reference-temperature");
  out->activation_temperature = NUMBER (scenario, "activation-temperature");
  return TRUE;
}

gboolean
pl_scenario_get_steady_options (const PlPart *scenario, pls_steady_options *out,
                                GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (scenario, PL_PART_SCENARIO, PL_PART_SCENARIO, error))
    return FALSE;
  pls_steady_options_init (out);
  out->air_on = pl_part_get_boolean (scenario, "air-on") ? 1 : 0;
  out->air_pressure = NUMBER (scenario, "air-pressure");
  out->demand_pressure = NUMBER (scenario, "demand-pressure");
  out->demand_flow = NUMBER (scenario, "demand-flow");
  out->manifold_spread_tolerance = NUMBER (scenario, "manifold-spread-tolerance");
  out->velocity_limit = NUMBER (scenario, "velocity-limit");
  out->shear_rate_limit = NUMBER (scenario, "shear-rate-limit");
  out->gauge_low_factor = NUMBER (scenario, "gauge-low-factor");
  out->gauge_high_factor = NUMBER (scenario, "gauge-high-factor");
  out->precharge_low_fraction = NUMBER (scenario, "precharge-low-fraction");
  return TRUE;
}

gboolean
pl_scenario_get_transient_options (const PlPart *scenario, pls_transient_options *out,
                                   GError **error)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (!need_kind (scenario, PL_PART_SCENARIO, PL_PART_SCENARIO, error)
      || !pl_part_check_consistency (scenario, NULL, NULL, error))
    return FALSE;
  pls_transient_options_init (out);
  out->air_pressure = NUMBER (scenario, "air-pressure");
  out->cycle_rate = NUMBER (scenario, "cycle-rate");
  out->on_time = NUMBER (scenario, "on-time");
  out->open_ramp = NUMBER (scenario, "open-ramp");
  out->close_ramp = NUMBER (scenario, "close-ramp");
  out->uniformity_tolerance = NUMBER (scenario, "uniformity-tolerance");
  out->recovery_fraction = NUMBER (scenario, "recovery-fraction");
  out->safe_pressure = NUMBER (scenario, "safe-pressure");
  out->shutdown_time = NUMBER (scenario, "shutdown-time");
  return TRUE;
}
