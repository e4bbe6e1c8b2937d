/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-units.c: the unit and quantity tables, conversions, preferences and
 * formatting.  Parsing what people type is in pl-unit-parse.c.
 */

#include "config.h"

#include "pl-units.h"
#include "pl-units-private.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <math.h>
#include <string.h>

G_DEFINE_QUARK (pl-unit-error-quark, pl_unit_error)

/* Exact definitions behind the customary units, all from NIST SP 811 (2008),
 * Appendix B.8 and its footnotes: the international inch and foot (1959),
 * the avoirdupois pound (1959), and the standard acceleration of free fall
 * that turns the pound into the pound-force (3rd CGPM, 1901). */
#define PL_NIST_INCH 0.0254          /* m, exact */
#define PL_NIST_FOOT 0.3048          /* m, exact */
#define PL_NIST_POUND 0.45359237     /* kg, exact */
#define PL_NIST_GN 9.80665           /* m/s^2, exact */
#define PL_NIST_LBF (PL_NIST_POUND * PL_NIST_GN)    /* N, exact: 4.4482216152605 */
#define PL_NIST_PSI (PL_NIST_LBF / (PL_NIST_INCH * PL_NIST_INCH))  /* Pa */
#define PL_NIST_IN3 (PL_NIST_INCH * PL_NIST_INCH * PL_NIST_INCH)   /* m^3 */
#define PL_NIST_GALLON (231.0 * PL_NIST_IN3)  /* US gallon = 231 in^3, m^3 */

/* Indexed by PlUnitId.  The comment beside each customary unit names the
 * NIST SP 811 (2008) Appendix B.8 entry ("to convert from ... to ...,
 * multiply by ...") whose rounded factor the tests compare with; the
 * factor used here is the exact one from the definitions above.  SI
 * prefixes are exact by definition (SP 811 sec. 4.3). */
static const PlUnit pl_units[PL_N_UNITS] = {
  [PL_UNIT_NONE] = { PL_UNIT_NONE, "", "", "", PL_N_QUANTITIES, 0.0, 0.0 },

  [PL_UNIT_PA] = { PL_UNIT_PA, "Pa", "Pa", N_("pascal"), PL_QUANTITY_PRESSURE, 1.0, 0.0 },
  [PL_UNIT_KPA] = { PL_UNIT_KPA, "kPa", "kPa", N_("kilopascal"), PL_QUANTITY_PRESSURE, 1e3,
                    0.0 },
  [PL_UNIT_MPA] = { PL_UNIT_MPA, "MPa", "MPa", N_("megapascal"), PL_QUANTITY_PRESSURE, 1e6,
                    0.0 },
  [PL_UNIT_GPA] = { PL_UNIT_GPA, "GPa", "GPa", N_("gigapascal"), PL_QUANTITY_PRESSURE, 1e9,
                    0.0 },
  /* B.8: bar (bar) to pascal (Pa), 1.0 E+05 (exact). */
  [PL_UNIT_BAR] = { PL_UNIT_BAR, "bar", "bar", N_("bar"), PL_QUANTITY_PRESSURE, 1e5, 0.0 },
  /* B.8: pound-force per square inch (psi) (lbf/in^2) to pascal, 6.894 757 E+03. */
  [PL_UNIT_PSI] = { PL_UNIT_PSI, "psi", "psi", N_("pound-force per square inch"),
                    PL_QUANTITY_PRESSURE, PL_NIST_PSI, 0.0 },
  /* B.8: kip per square inch (ksi) (kip/in^2) to pascal, 6.894 757 E+06. */
  [PL_UNIT_KSI] = { PL_UNIT_KSI, "ksi", "ksi", N_("kip per square inch"),
                    PL_QUANTITY_PRESSURE, 1e3 * PL_NIST_PSI, 0.0 },

  [PL_UNIT_M3_PER_S] = { PL_UNIT_M3_PER_S, "m3/s", "m³/s", N_("cubic meter per second"),
                         PL_QUANTITY_FLOW, 1.0, 0.0 },
  /* B.8: liter (L) to cubic meter, 1.0 E-03 (exact); minute (min) to
   * second, 6.0 E+01 (exact). */
  [PL_UNIT_L_PER_MIN] = { PL_UNIT_L_PER_MIN, "L/min", "L/min", N_("liter per minute"),
                          PL_QUANTITY_FLOW, 1e-3 / 60.0, 0.0 },
  [PL_UNIT_ML_PER_S] = { PL_UNIT_ML_PER_S, "mL/s", "mL/s", N_("milliliter per second"),
                         PL_QUANTITY_FLOW, 1e-6, 0.0 },
  [PL_UNIT_ML_PER_MIN] = { PL_UNIT_ML_PER_MIN, "mL/min", "mL/min",
                           N_("milliliter per minute"), PL_QUANTITY_FLOW, 1e-6 / 60.0, 0.0 },
  /* B.8: gallon (U.S.) per minute (gpm) (gal/min) to cubic meter per
   * second, 6.309 020 E-05. */
  [PL_UNIT_GAL_PER_MIN] = { PL_UNIT_GAL_PER_MIN, "gal/min", "gal/min",
                            N_("US gallon per minute"), PL_QUANTITY_FLOW,
                            PL_NIST_GALLON / 60.0, 0.0 },

  [PL_UNIT_M] = { PL_UNIT_M, "m", "m", N_("meter"), PL_QUANTITY_LENGTH, 1.0, 0.0 },
  [PL_UNIT_CM] = { PL_UNIT_CM, "cm", "cm", N_("centimeter"), PL_QUANTITY_LENGTH, 1e-2, 0.0 },
  [PL_UNIT_MM] = { PL_UNIT_MM, "mm", "mm", N_("millimeter"), PL_QUANTITY_LENGTH, 1e-3, 0.0 },
  [PL_UNIT_UM] = { PL_UNIT_UM, "um", "µm", N_("micrometer"), PL_QUANTITY_LENGTH, 1e-6, 0.0 },
  /* B.8: inch (in) to meter, 2.54 E-02 (exact). */
  [PL_UNIT_IN] = { PL_UNIT_IN, "in", "in", N_("inch"), PL_QUANTITY_LENGTH, PL_NIST_INCH,
                   0.0 },
  /* B.8: foot (ft) to meter, 3.048 E-01 (exact). */
  [PL_UNIT_FT] = { PL_UNIT_FT, "ft", "ft", N_("foot"), PL_QUANTITY_LENGTH, PL_NIST_FOOT,
                   0.0 },

  [PL_UNIT_PA_S] = { PL_UNIT_PA_S, "Pa.s", "Pa·s", N_("pascal second"),
                     PL_QUANTITY_VISCOSITY, 1.0, 0.0 },
  [PL_UNIT_MPA_S] = { PL_UNIT_MPA_S, "mPa.s", "mPa·s", N_("millipascal second"),
                      PL_QUANTITY_VISCOSITY, 1e-3, 0.0 },
  /* B.8: centipoise (cP) to pascal second, 1.0 E-03 (exact). */
  [PL_UNIT_CP] = { PL_UNIT_CP, "cP", "cP", N_("centipoise"), PL_QUANTITY_VISCOSITY, 1e-3,
                   0.0 },
  /* B.8: poise (P) to pascal second, 1.0 E-01 (exact). */
  [PL_UNIT_POISE] = { PL_UNIT_POISE, "P", "P", N_("poise"), PL_QUANTITY_VISCOSITY, 0.1,
                      0.0 },

  [PL_UNIT_M3] = { PL_UNIT_M3, "m3", "m³", N_("cubic meter"), PL_QUANTITY_VOLUME, 1.0, 0.0 },
  /* B.8: liter (L) to cubic meter, 1.0 E-03 (exact). */
  [PL_UNIT_L] = { PL_UNIT_L, "L", "L", N_("liter"), PL_QUANTITY_VOLUME, 1e-3, 0.0 },
  [PL_UNIT_ML] = { PL_UNIT_ML, "mL", "mL", N_("milliliter"), PL_QUANTITY_VOLUME, 1e-6, 0.0 },
  /* B.8: gallon [U.S.] (gal) to cubic meter, 3.785 412 E-03 (231 in^3). */
  [PL_UNIT_GAL] = { PL_UNIT_GAL, "gal", "gal", N_("US gallon"), PL_QUANTITY_VOLUME,
                    PL_NIST_GALLON, 0.0 },
  /* B.8: cubic inch (in^3) to cubic meter, 1.638 706 E-05. */
  [PL_UNIT_IN3] = { PL_UNIT_IN3, "in3", "in³", N_("cubic inch"), PL_QUANTITY_VOLUME,
                    PL_NIST_IN3, 0.0 },

  [PL_UNIT_KG] = { PL_UNIT_KG, "kg", "kg", N_("kilogram"), PL_QUANTITY_MASS, 1.0, 0.0 },
  [PL_UNIT_G] = { PL_UNIT_G, "g", "g", N_("gram"), PL_QUANTITY_MASS, 1e-3, 0.0 },
  /* B.8: ounce (avoirdupois) (oz) to kilogram, 2.834 952 E-02 (1/16 lb). */
  [PL_UNIT_OZ] = { PL_UNIT_OZ, "oz", "oz", N_("ounce (avoirdupois)"), PL_QUANTITY_MASS,
                   PL_NIST_POUND / 16.0, 0.0 },
  /* B.8: pound (avoirdupois) (lb) to kilogram, 4.535 924 E-01. */
  [PL_UNIT_LB] = { PL_UNIT_LB, "lb", "lb", N_("pound (avoirdupois)"), PL_QUANTITY_MASS,
                   PL_NIST_POUND, 0.0 },

  [PL_UNIT_K] = { PL_UNIT_K, "K", "K", N_("kelvin"), PL_QUANTITY_TEMPERATURE, 1.0, 0.0 },
  /* B.9: degree Celsius to kelvin, T/K = t/°C + 273.15. */
  [PL_UNIT_DEG_C] = { PL_UNIT_DEG_C, "degC", "°C", N_("degree Celsius"),
                      PL_QUANTITY_TEMPERATURE, 1.0, 273.15 },
  /* B.9: degree Fahrenheit to kelvin, T/K = (t/°F + 459.67)/1.8. */
  [PL_UNIT_DEG_F] = { PL_UNIT_DEG_F, "degF", "°F", N_("degree Fahrenheit"),
                      PL_QUANTITY_TEMPERATURE, 1.0 / 1.8, 459.67 },

  [PL_UNIT_J] = { PL_UNIT_J, "J", "J", N_("joule"), PL_QUANTITY_ENERGY, 1.0, 0.0 },
  [PL_UNIT_KJ] = { PL_UNIT_KJ, "kJ", "kJ", N_("kilojoule"), PL_QUANTITY_ENERGY, 1e3, 0.0 },
  /* B.8: foot pound-force (ft·lbf) to joule, 1.355 818 E+00. */
  [PL_UNIT_FT_LBF] = { PL_UNIT_FT_LBF, "ft.lbf", "ft·lbf", N_("foot pound-force"),
                       PL_QUANTITY_ENERGY, PL_NIST_FOOT * PL_NIST_LBF, 0.0 },

  [PL_UNIT_S] = { PL_UNIT_S, "s", "s", N_("second"), PL_QUANTITY_TIME, 1.0, 0.0 },
  [PL_UNIT_MS] = { PL_UNIT_MS, "ms", "ms", N_("millisecond"), PL_QUANTITY_TIME, 1e-3, 0.0 },
  /* B.8: minute (min) to second, 6.0 E+01 (exact). */
  [PL_UNIT_MIN] = { PL_UNIT_MIN, "min", "min", N_("minute"), PL_QUANTITY_TIME, 60.0, 0.0 },

  [PL_UNIT_HZ] = { PL_UNIT_HZ, "Hz", "Hz", N_("hertz"), PL_QUANTITY_FREQUENCY, 1.0, 0.0 },
  [PL_UNIT_PER_MIN] = { PL_UNIT_PER_MIN, "1/min", "1/min", N_("cycles per minute"),
                        PL_QUANTITY_FREQUENCY, 1.0 / 60.0, 0.0 },

  [PL_UNIT_KG_PER_M3] = { PL_UNIT_KG_PER_M3, "kg/m3", "kg/m³", N_("kilogram per cubic meter"),
                          PL_QUANTITY_DENSITY, 1.0, 0.0 },
  /* B.8: gram per cubic centimeter (g/cm^3) to kilogram per cubic meter,
   * 1.0 E+03 (exact). */
  [PL_UNIT_G_PER_CM3] = { PL_UNIT_G_PER_CM3, "g/cm3", "g/cm³",
                          N_("gram per cubic centimeter"), PL_QUANTITY_DENSITY, 1e3, 0.0 },
  /* B.8: pound per cubic foot (lb/ft^3) to kilogram per cubic meter,
   * 1.601 846 E+01. */
  [PL_UNIT_LB_PER_FT3] = { PL_UNIT_LB_PER_FT3, "lb/ft3", "lb/ft³", N_("pound per cubic foot"),
                           PL_QUANTITY_DENSITY,
                           PL_NIST_POUND / (PL_NIST_FOOT * PL_NIST_FOOT * PL_NIST_FOOT),
                           0.0 },

  [PL_UNIT_ONE] = { PL_UNIT_ONE, "1", "", N_("plain number"), PL_QUANTITY_RATIO, 1.0, 0.0 },
  /* SP 811 sec. 7.10.2: % = 0.01. */
  [PL_UNIT_PERCENT] = { PL_UNIT_PERCENT, "%", "%", N_("percent"), PL_QUANTITY_RATIO, 1e-2,
                        0.0 },

  [PL_UNIT_M2] = { PL_UNIT_M2, "m2", "m²", N_("square meter"), PL_QUANTITY_AREA, 1.0, 0.0 },
  [PL_UNIT_MM2] = { PL_UNIT_MM2, "mm2", "mm²", N_("square millimeter"), PL_QUANTITY_AREA,
                    1e-6, 0.0 },
  /* B.8: square inch (in^2) to square meter, 6.4516 E-04 (exact). */
  [PL_UNIT_IN2] = { PL_UNIT_IN2, "in2", "in²", N_("square inch"), PL_QUANTITY_AREA,
                    PL_NIST_INCH * PL_NIST_INCH, 0.0 },

  [PL_UNIT_M_PER_S] = { PL_UNIT_M_PER_S, "m/s", "m/s", N_("meter per second"),
                        PL_QUANTITY_VELOCITY, 1.0, 0.0 },
  /* B.8: foot per second (ft/s) to meter per second, 3.048 E-01 (exact). */
  [PL_UNIT_FT_PER_S] = { PL_UNIT_FT_PER_S, "ft/s", "ft/s", N_("foot per second"),
                         PL_QUANTITY_VELOCITY, PL_NIST_FOOT, 0.0 },

  [PL_UNIT_PER_S] = { PL_UNIT_PER_S, "1/s", "1/s", N_("reciprocal second"),
                      PL_QUANTITY_SHEAR_RATE, 1.0, 0.0 },

  [PL_UNIT_M3_PER_M_PA] = { PL_UNIT_M3_PER_M_PA, "m3/(m.Pa)", "m³/(m·Pa)",
                            N_("cubic meter per meter and pascal"),
                            PL_QUANTITY_HOSE_EXPANSION, 1.0, 0.0 },
  [PL_UNIT_ML_PER_M_BAR] = { PL_UNIT_ML_PER_M_BAR, "mL/(m.bar)", "mL/(m·bar)",
                             N_("milliliter per meter and bar"),
                             PL_QUANTITY_HOSE_EXPANSION, 1e-6 / 1e5, 0.0 },
  /* From the B.8 foot and ksi entries above (cm^3 = 1e-6 m^3 exactly). */
  [PL_UNIT_CC_PER_FT_KSI] = { PL_UNIT_CC_PER_FT_KSI, "cc/(ft.ksi)", "cc/(ft·ksi)",
                              N_("cubic centimeter per foot and ksi"),
                              PL_QUANTITY_HOSE_EXPANSION,
                              1e-6 / (PL_NIST_FOOT * 1e3 * PL_NIST_PSI), 0.0 },
  /* K of the power law tau = K (du/dy)^n is in Pa s^n (Chhabra &
   * Richardson, Non-Newtonian Flow and Applied Rheology, 2nd ed., ch. 1;
   * from memory); the exponent is the flow index, so the symbol carries a
   * literal n. */
  [PL_UNIT_PA_S_N] = { PL_UNIT_PA_S_N, "Pa.s(n)", "Pa·sⁿ", N_("pascal second to the n"),
                       PL_QUANTITY_CONSISTENCY, 1.0, 0.0 },
  [PL_UNIT_MPA_S_N] = { PL_UNIT_MPA_S_N, "mPa.s(n)", "mPa·sⁿ",
                        N_("millipascal second to the n"), PL_QUANTITY_CONSISTENCY, 1e-3, 0.0 },
};

/* What people type for each unit, besides its key and symbol (which are
 * always accepted).  pl_unit_lookup() normalises both sides the same way,
 * so one spelling covers "mPa s", "mPa·s" and "mPa.s", and ASCII case only
 * matters where an exact match exists. */
static const PlUnitAlias pl_unit_aliases[] = {
  { PL_UNIT_PA, "pascal" }, { PL_UNIT_PA, "pascals" }, { PL_UNIT_PA, "N/m2" },
  { PL_UNIT_MPA, "N/mm2" },
  { PL_UNIT_BAR, "barg" }, { PL_UNIT_BAR, "bars" },
  { PL_UNIT_PSI, "psig" }, { PL_UNIT_PSI, "lbf/in2" }, { PL_UNIT_PSI, "lb/in2" },
  { PL_UNIT_KSI, "kpsi" },
  { PL_UNIT_L_PER_MIN, "lpm" }, { PL_UNIT_L_PER_MIN, "liter/min" },
  { PL_UNIT_L_PER_MIN, "litre/min" }, { PL_UNIT_L_PER_MIN, "dm3/min" },
  { PL_UNIT_ML_PER_S, "cc/s" }, { PL_UNIT_ML_PER_S, "cm3/s" },
  { PL_UNIT_ML_PER_MIN, "cc/min" }, { PL_UNIT_ML_PER_MIN, "cm3/min" },
  { PL_UNIT_ML_PER_MIN, "ccm" },
  { PL_UNIT_GAL_PER_MIN, "gpm" }, { PL_UNIT_GAL_PER_MIN, "US gal/min" },
  { PL_UNIT_GAL_PER_MIN, "gallon/min" }, { PL_UNIT_GAL_PER_MIN, "gallons/min" },
  { PL_UNIT_M, "meter" }, { PL_UNIT_M, "meters" }, { PL_UNIT_M, "metre" },
  { PL_UNIT_M, "metres" },
  { PL_UNIT_UM, "micron" }, { PL_UNIT_UM, "microns" },
  { PL_UNIT_IN, "inch" }, { PL_UNIT_IN, "inches" }, { PL_UNIT_IN, "\"" },
  { PL_UNIT_IN, "''" },
  { PL_UNIT_FT, "foot" }, { PL_UNIT_FT, "feet" }, { PL_UNIT_FT, "'" },
  { PL_UNIT_PA_S, "N.s/m2" },
  { PL_UNIT_PA_S_N, "Pa.s^n" }, { PL_UNIT_MPA_S_N, "mPa.s^n" },
  { PL_UNIT_CP, "cps" }, { PL_UNIT_CP, "centipoise" },
  { PL_UNIT_POISE, "poise" },
  { PL_UNIT_L, "liter" }, { PL_UNIT_L, "liters" }, { PL_UNIT_L, "litre" },
  { PL_UNIT_L, "litres" }, { PL_UNIT_L, "dm3" },
  { PL_UNIT_ML, "cc" }, { PL_UNIT_ML, "cm3" },
  { PL_UNIT_GAL, "US gal" }, { PL_UNIT_GAL, "gallon" }, { PL_UNIT_GAL, "gallons" },
  { PL_UNIT_IN3, "cu in" }, { PL_UNIT_IN3, "cubic inch" }, { PL_UNIT_IN3, "cubic inches" },
  { PL_UNIT_G, "gram" }, { PL_UNIT_G, "grams" },
  { PL_UNIT_LB, "lbs" }, { PL_UNIT_LB, "lbm" },
  { PL_UNIT_K, "kelvin" },
  { PL_UNIT_DEG_C, "C" }, { PL_UNIT_DEG_C, "deg C" }, { PL_UNIT_DEG_C, "celsius" },
  { PL_UNIT_DEG_F, "F" }, { PL_UNIT_DEG_F, "deg F" }, { PL_UNIT_DEG_F, "fahrenheit" },
  { PL_UNIT_J, "joule" }, { PL_UNIT_J, "joules" }, { PL_UNIT_J, "N.m" },
  { PL_UNIT_FT_LBF, "ft-lbf" }, { PL_UNIT_FT_LBF, "lbf.ft" },
  { PL_UNIT_S, "sec" }, { PL_UNIT_S, "second" }, { PL_UNIT_S, "seconds" },
  { PL_UNIT_MS, "msec" },
  { PL_UNIT_MIN, "minute" }, { PL_UNIT_MIN, "minutes" },
  { PL_UNIT_HZ, "1/s" }, { PL_UNIT_HZ, "/s" }, { PL_UNIT_HZ, "cycles/s" },
  { PL_UNIT_PER_MIN, "/min" }, { PL_UNIT_PER_MIN, "min-1" }, { PL_UNIT_PER_MIN, "cpm" },
  { PL_UNIT_PER_MIN, "cycles/min" }, { PL_UNIT_PER_MIN, "cycle/min" },
  { PL_UNIT_PER_MIN, "strokes/min" }, { PL_UNIT_PER_MIN, "spm" },
  { PL_UNIT_PER_MIN, "shots/min" },
  { PL_UNIT_G_PER_CM3, "g/cc" }, { PL_UNIT_G_PER_CM3, "g/mL" }, { PL_UNIT_G_PER_CM3, "kg/L" },
  { PL_UNIT_G_PER_CM3, "kg/dm3" },
  { PL_UNIT_LB_PER_FT3, "lb/cu ft" }, { PL_UNIT_LB_PER_FT3, "pcf" },
  /* "30:1" is how pump ratios are written. */
  { PL_UNIT_ONE, ":1" }, { PL_UNIT_ONE, "x" },
  { PL_UNIT_PERCENT, "percent" },
  { PL_UNIT_IN2, "sq in" }, { PL_UNIT_IN2, "square inch" },
  { PL_UNIT_FT_PER_S, "fps" },
  { PL_UNIT_PER_S, "/s" }, { PL_UNIT_PER_S, "s-1" },
  { PL_UNIT_M3_PER_M_PA, "m2/Pa" },
  { PL_UNIT_ML_PER_M_BAR, "mL/m/bar" }, { PL_UNIT_ML_PER_M_BAR, "cc/(m.bar)" },
  { PL_UNIT_ML_PER_M_BAR, "cc/m/bar" },
  { PL_UNIT_CC_PER_FT_KSI, "cc/ft/ksi" }, { PL_UNIT_CC_PER_FT_KSI, "mL/(ft.ksi)" },
  { PL_UNIT_CC_PER_FT_KSI, "mL/ft/ksi" },
};

typedef struct
{
  const char *key;
  const char *name;
  const char *phrase;
  PlQuantity unit_kind;
  gboolean may_be_negative;
  PlUnitId default_unit[PL_N_UNIT_SYSTEMS];  /* SI, US */
} PlQuantityInfo;

/* Indexed by PlQuantity.  Defaults follow what datasheets of the trade
 * print in each system (common practice, no source); a unit override in
 * PlUnitPrefs changes any of them. */
static const PlQuantityInfo pl_quantities[PL_N_QUANTITIES] = {
  [PL_QUANTITY_PRESSURE] = { "pressure", N_("Pressure"),
                             /* Translators: the phrases ("a pressure", "a length",
                              * ...) finish sentences such as "“22 psi” is a
                              * pressure; a length is expected (mm, m, in, ft)." and
                              * "a volume cannot be negative"; both places are in
                              * the nominative. */
                             N_("a pressure"),
                             PL_QUANTITY_PRESSURE, TRUE, { PL_UNIT_BAR, PL_UNIT_PSI } },
  [PL_QUANTITY_MODULUS] = { "modulus", N_("Modulus"), N_("a modulus"),
                            PL_QUANTITY_PRESSURE, FALSE, { PL_UNIT_MPA, PL_UNIT_KSI } },
  [PL_QUANTITY_FLOW] = { "flow", N_("Flow rate"), N_("a flow rate"),
                         PL_QUANTITY_FLOW, TRUE, { PL_UNIT_L_PER_MIN, PL_UNIT_GAL_PER_MIN } },
  [PL_QUANTITY_LENGTH] = { "length", N_("Length"), N_("a length"),
                           PL_QUANTITY_LENGTH, FALSE, { PL_UNIT_MM, PL_UNIT_IN } },
  [PL_QUANTITY_LINE_LENGTH] = { "line-length", N_("Line length or height"), N_("a length"),
                                PL_QUANTITY_LENGTH, TRUE, { PL_UNIT_M, PL_UNIT_FT } },
  [PL_QUANTITY_VISCOSITY] = { "viscosity", N_("Viscosity"), N_("a viscosity"),
                              PL_QUANTITY_VISCOSITY, FALSE, { PL_UNIT_MPA_S, PL_UNIT_CP } },
  [PL_QUANTITY_VOLUME] = { "volume", N_("Volume"), N_("a volume"),
                           PL_QUANTITY_VOLUME, FALSE, { PL_UNIT_ML, PL_UNIT_IN3 } },
  [PL_QUANTITY_MASS] = { "mass", N_("Mass"), N_("a mass"),
                         PL_QUANTITY_MASS, FALSE, { PL_UNIT_G, PL_UNIT_OZ } },
  [PL_QUANTITY_TEMPERATURE] = { "temperature", N_("Temperature"), N_("a temperature"),
                                PL_QUANTITY_TEMPERATURE, TRUE,
                                { PL_UNIT_DEG_C, PL_UNIT_DEG_F } },
  [PL_QUANTITY_ENERGY] = { "energy", N_("Energy"), N_("an energy"),
                           PL_QUANTITY_ENERGY, TRUE, { PL_UNIT_J, PL_UNIT_J } },
  [PL_QUANTITY_TIME] = { "time", N_("Time"), N_("a time"),
                         PL_QUANTITY_TIME, FALSE, { PL_UNIT_S, PL_UNIT_S } },
  [PL_QUANTITY_FREQUENCY] = { "frequency", N_("Cycle rate"), N_("a cycle rate"),
                              PL_QUANTITY_FREQUENCY, FALSE,
                              { PL_UNIT_PER_MIN, PL_UNIT_PER_MIN } },
  [PL_QUANTITY_DENSITY] = { "density", N_("Density"), N_("a density"),
                            PL_QUANTITY_DENSITY, FALSE,
                            { PL_UNIT_KG_PER_M3, PL_UNIT_LB_PER_FT3 } },
  [PL_QUANTITY_RATIO] = { "ratio", N_("Ratio"), N_("a plain number"),
                          PL_QUANTITY_RATIO, FALSE, { PL_UNIT_ONE, PL_UNIT_ONE } },
  [PL_QUANTITY_AREA] = { "area", N_("Area"), N_("an area"),
                         PL_QUANTITY_AREA, FALSE, { PL_UNIT_MM2, PL_UNIT_IN2 } },
  [PL_QUANTITY_VELOCITY] = { "velocity", N_("Velocity"), N_("a velocity"),
                             PL_QUANTITY_VELOCITY, TRUE, { PL_UNIT_M_PER_S, PL_UNIT_FT_PER_S } },
  [PL_QUANTITY_SHEAR_RATE] = { "shear-rate", N_("Shear rate"), N_("a shear rate"),
                               PL_QUANTITY_SHEAR_RATE, FALSE, { PL_UNIT_PER_S, PL_UNIT_PER_S } },
  [PL_QUANTITY_HOSE_EXPANSION] = { "hose-expansion", N_("Volumetric expansion"),
                                   N_("a volumetric expansion"), PL_QUANTITY_HOSE_EXPANSION,
                                   FALSE, { PL_UNIT_ML_PER_M_BAR, PL_UNIT_CC_PER_FT_KSI } },
  /* US datasheets give K in the same units as SI ones (common practice, no
   * source). */
  [PL_QUANTITY_CONSISTENCY] = { "consistency", N_("Consistency"), N_("a consistency"),
                                PL_QUANTITY_CONSISTENCY, FALSE,
                                { PL_UNIT_MPA_S_N, PL_UNIT_MPA_S_N } },
};

static const char *const pl_unit_system_keys[PL_N_UNIT_SYSTEMS] = { "si", "us" };

static gboolean
pl_quantity_valid (PlQuantity quantity)
{
  return (int) quantity >= 0 && quantity < PL_N_QUANTITIES;
}

static gboolean
pl_unit_valid (PlUnitId unit)
{
  return (int) unit > PL_UNIT_NONE && unit < PL_N_UNITS;
}

const PlUnitAlias *
pl_unit_get_aliases (gsize *n_aliases)
{
  *n_aliases = G_N_ELEMENTS (pl_unit_aliases);
  return pl_unit_aliases;
}

/* --- quantities --- */

const char *
pl_quantity_get_key (PlQuantity quantity)
{
  return pl_quantity_valid (quantity) ? pl_quantities[quantity].key : NULL;
}

PlQuantity
pl_quantity_from_key (const char *key)
{
  if (key == NULL)
    return PL_N_QUANTITIES;
  for (int q = 0; q < PL_N_QUANTITIES; q++)
    if (strcmp (pl_quantities[q].key, key) == 0)
      return (PlQuantity) q;
  return PL_N_QUANTITIES;
}

const char *
pl_quantity_get_name (PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), "");
  return _(pl_quantities[quantity].name);
}

const char *
pl_quantity_get_phrase (PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), "");
  return _(pl_quantities[quantity].phrase);
}

PlQuantity
pl_quantity_get_unit_kind (PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), PL_N_QUANTITIES);
  return pl_quantities[quantity].unit_kind;
}

gboolean
pl_quantity_may_be_negative (PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), FALSE);
  return pl_quantities[quantity].may_be_negative;
}

char *
pl_quantity_list_units (PlQuantity quantity)
{
  GString *list;

  g_return_val_if_fail (pl_quantity_valid (quantity), g_strdup (""));
  list = g_string_new (NULL);
  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    {
      if (pl_units[u].kind != pl_quantities[quantity].unit_kind)
        continue;
      if (list->len > 0)
        g_string_append (list, ", ");
      /* The plain number has no symbol; "1" says what to type. */
      g_string_append (list, pl_units[u].symbol[0] != '\0' ? pl_units[u].symbol
                                                           : pl_units[u].key);
    }
  return g_string_free (list, FALSE);
}

/* --- units --- */

const PlUnit *
pl_unit_get (PlUnitId unit)
{
  return pl_unit_valid (unit) ? &pl_units[unit] : NULL;
}

PlUnitId
pl_unit_from_key (const char *key)
{
  if (key == NULL)
    return PL_UNIT_NONE;
  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    if (strcmp (pl_units[u].key, key) == 0)
      return (PlUnitId) u;
  return PL_UNIT_NONE;
}

gboolean
pl_unit_fits (PlUnitId unit, PlQuantity quantity)
{
  if (!pl_unit_valid (unit) || !pl_quantity_valid (quantity))
    return FALSE;
  /* A consistency typed or stored in a viscosity unit is the n = 1 case:
   * files name it "Pa.s" (the coherent unit, found first). */
  if (quantity == PL_QUANTITY_CONSISTENCY && pl_units[unit].kind == PL_QUANTITY_VISCOSITY)
    return TRUE;
  return pl_units[unit].kind == pl_quantities[quantity].unit_kind;
}

double
pl_unit_to_si (PlUnitId unit, double value)
{
  if (!pl_unit_valid (unit))
    return NAN;
  return (value + pl_units[unit].offset) * pl_units[unit].factor;
}

double
pl_unit_from_si (PlUnitId unit, double value_si)
{
  if (!pl_unit_valid (unit))
    return NAN;
  return value_si / pl_units[unit].factor - pl_units[unit].offset;
}

/* --- systems and preferences --- */

const char *
pl_unit_system_get_key (PlUnitSystem system)
{
  return (int) system >= 0 && system < PL_N_UNIT_SYSTEMS ? pl_unit_system_keys[system] : NULL;
}

PlUnitSystem
pl_unit_system_from_key (const char *key)
{
  if (key == NULL)
    return PL_N_UNIT_SYSTEMS;
  for (int s = 0; s < PL_N_UNIT_SYSTEMS; s++)
    if (strcmp (pl_unit_system_keys[s], key) == 0)
      return (PlUnitSystem) s;
  return PL_N_UNIT_SYSTEMS;
}

PlUnitId
pl_unit_system_get_default (PlUnitSystem system, PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), PL_UNIT_NONE);
  if ((int) system < 0 || system >= PL_N_UNIT_SYSTEMS)
    system = PL_UNIT_SYSTEM_SI;
  return pl_quantities[quantity].default_unit[system];
}

void
pl_unit_prefs_init (PlUnitPrefs *prefs, PlUnitSystem system)
{
  g_return_if_fail (prefs != NULL);
  memset (prefs, 0, sizeof *prefs);
  prefs->system = (int) system >= 0 && system < PL_N_UNIT_SYSTEMS ? system
                                                                   : PL_UNIT_SYSTEM_SI;
}

gboolean
pl_unit_prefs_set_unit (PlUnitPrefs *prefs, PlQuantity quantity, PlUnitId unit)
{
  g_return_val_if_fail (prefs != NULL, FALSE);
  g_return_val_if_fail (pl_quantity_valid (quantity), FALSE);
  if (unit != PL_UNIT_NONE && !pl_unit_fits (unit, quantity))
    return FALSE;
  prefs->override[quantity] = unit;
  return TRUE;
}

PlUnitId
pl_unit_prefs_get_unit (const PlUnitPrefs *prefs, PlQuantity quantity)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), PL_UNIT_NONE);
  if (prefs == NULL)
    return pl_unit_system_get_default (PL_UNIT_SYSTEM_SI, quantity);
  /* A struct that came from elsewhere may hold anything: a wrong override
   * falls back to the default rather than to a unit of another kind. */
  if (pl_unit_fits (prefs->override[quantity], quantity))
    return prefs->override[quantity];
  return pl_unit_system_get_default (prefs->system, quantity);
}

char *
pl_unit_prefs_to_string (const PlUnitPrefs *prefs)
{
  GString *text = g_string_new (NULL);
  PlUnitPrefs si;

  if (prefs == NULL)
    {
      pl_unit_prefs_init (&si, PL_UNIT_SYSTEM_SI);
      prefs = &si;
    }
  g_string_append (text, pl_unit_system_get_key (prefs->system) != NULL
                         ? pl_unit_system_get_key (prefs->system) : "si");
  for (int q = 0; q < PL_N_QUANTITIES; q++)
    if (pl_unit_fits (prefs->override[q], (PlQuantity) q))
      g_string_append_printf (text, ";%s=%s", pl_quantities[q].key,
                              pl_units[prefs->override[q]].key);
  return g_string_free (text, FALSE);
}

gboolean
pl_unit_prefs_from_string (PlUnitPrefs *prefs, const char *text, GError **error)
{
  g_auto (GStrv) parts = NULL;
  PlUnitPrefs result;
  PlUnitSystem system;
  gboolean ok = FALSE;
  const char *bad = NULL;

  g_return_val_if_fail (prefs != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  if (text == NULL || !g_utf8_validate (text, -1, NULL))
    {
      g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER,
                   _("The unit settings are not valid text."));
      goto out;
    }
  parts = g_strsplit (text, ";", -1);
  system = pl_unit_system_from_key (parts[0] != NULL ? g_strstrip (parts[0]) : NULL);
  if (system == PL_N_UNIT_SYSTEMS)
    {
      bad = parts[0] != NULL ? parts[0] : "";
      goto fail;
    }
  pl_unit_prefs_init (&result, system);
  for (int i = 1; parts[i] != NULL; i++)
    {
      char *eq;
      PlQuantity q;
      PlUnitId u;

      g_strstrip (parts[i]);
      if (parts[i][0] == '\0')
        continue;  /* a trailing ';' */
      eq = strchr (parts[i], '=');
      if (eq == NULL)
        {
          bad = parts[i];
          goto fail;
        }
      *eq = '\0';
      q = pl_quantity_from_key (g_strstrip (parts[i]));
      u = pl_unit_from_key (g_strstrip (eq + 1));
      *eq = '=';
      if (q == PL_N_QUANTITIES || u == PL_UNIT_NONE || !pl_unit_prefs_set_unit (&result, q, u))
        {
          bad = parts[i];
          goto fail;
        }
    }
  *prefs = result;
  ok = TRUE;
  goto out;

fail:
  g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_UNKNOWN_UNIT,
               /* Translators: the first %s is the whole settings text, the
                * second the part of it that was not understood. */
               _("In the unit settings “%s”, “%s” is not understood."), text, bad);
out:
  return ok;
}

/* --- formatting --- */

char
pl_unit_resolve_decimal (char decimal_separator)
{
  const struct lconv *lc;

  if (decimal_separator == '.' || decimal_separator == ',')
    return decimal_separator;
  /* Only '.' and ',' are supported; a locale with another mark (or a
   * multi-byte one) gets '.', which every locale can read. */
  lc = localeconv ();
  if (lc != NULL && lc->decimal_point != NULL && strcmp (lc->decimal_point, ",") == 0)
    return ',';
  return '.';
}

/* Drops the zeros that end a fraction ("2.500" -> "2.5", "3.000" -> "3",
 * "1.500e-07" -> "1.5e-07"), in place. */
static void
pl_unit_strip_zeros (char *number)
{
  char *dot = strchr (number, '.');
  char *tail;
  char *end;

  if (dot == NULL)
    return;
  tail = strpbrk (dot, "eE");
  if (tail == NULL)
    tail = dot + strlen (dot);
  end = tail;
  while (end > dot + 1 && end[-1] == '0')
    end--;
  if (end == dot + 1)
    end = dot;
  memmove (end, tail, strlen (tail) + 1);
}

char *
pl_unit_format_number_in (double value_si, PlUnitId unit, int digits, char decimal_separator)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE + 32];
  char format[16];
  double value = pl_unit_from_si (unit, value_si);
  double magnitude;
  char sep;

  if (!isfinite (value))
    return g_strdup ("–");
  if (digits <= 0)
    digits = PL_UNIT_DEFAULT_DIGITS;
  digits = MIN (digits, 17);
  if (value == 0.0)
    return g_strdup ("0");

  magnitude = fabs (value);
  if (magnitude < 1e-4 || magnitude >= 1e9)
    g_snprintf (format, sizeof format, "%%.%de", digits - 1);
  else
    {
      int exponent = (int) floor (log10 (magnitude));

      g_snprintf (format, sizeof format, "%%.%df", MAX (0, digits - 1 - exponent));
    }
  /* g_ascii_formatd always writes '.', whatever the process locale. */
  g_ascii_formatd (buf, sizeof buf, format, value);
  pl_unit_strip_zeros (buf);
  if (strcmp (buf, "-0") == 0)
    return g_strdup ("0");

  sep = pl_unit_resolve_decimal (decimal_separator);
  if (sep != '.')
    {
      char *dot = strchr (buf, '.');

      if (dot != NULL)
        *dot = sep;
    }
  return g_strdup (buf);
}

char *
pl_unit_format_in (double value_si, PlUnitId unit, int digits, char decimal_separator)
{
  g_autofree char *number = pl_unit_format_number_in (value_si, unit, digits,
                                                      decimal_separator);
  const PlUnit *u = pl_unit_get (unit);

  if (u == NULL || u->symbol[0] == '\0')
    return g_steal_pointer (&number);
  return g_strconcat (number, " ", u->symbol, NULL);
}

char *
pl_unit_format_number (double value_si, PlQuantity quantity, const PlUnitPrefs *prefs,
                       int digits, char decimal_separator)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), g_strdup ("–"));
  return pl_unit_format_number_in (value_si, pl_unit_prefs_get_unit (prefs, quantity), digits,
                                   decimal_separator);
}

char *
pl_unit_format (double value_si, PlQuantity quantity, const PlUnitPrefs *prefs, int digits,
                char decimal_separator)
{
  g_return_val_if_fail (pl_quantity_valid (quantity), g_strdup ("–"));
  return pl_unit_format_in (value_si, pl_unit_prefs_get_unit (prefs, quantity), digits,
                            decimal_separator);
}
