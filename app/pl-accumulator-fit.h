/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-accumulator-fit.h: where an accumulator added to a layout without one
 * goes, and how big it is (the presentation's "accumulator fitted" what-if).
 *
 * Where: the feed node of the applicators -- the node that every path from
 * the pump outlet to every applicator passes through, and of those the one
 * farthest from the pump (nearest to the applicators): the manifold inlet.
 *
 * How big: the accumulator alone gives one shot of every applicator while
 * its node falls from the idle pressure p2 to 90 % of it (p1), with the
 * precharge p0 the trainer chose: the usable volume of PHYSICS.md,
 *   dV = V0 [(p0/p1)^(1/n) - (p0/p2)^(1/n)]   (absolute pressures),
 * solved for the gas volume V0.  The shot is the on-time times the larger
 * of the applicators' flow held open and the scenario's demand flow.  The
 * one shot and the 90 % are common practice, no source.
 */
#pragma once

#include <glib.h>

#include "pl-document.h"
#include "pl-results.h"

G_BEGIN_DECLS

/* The share of the idle pressure the feed node may fall to in a shot
 * (common practice, no source). */
#define PL_ACCUMULATOR_FIT_DROOP 0.9

/* The gas volume V0 (m^3) whose usable volume between p1 and p2 is dv
 * (m^3), from the polytropic gas law; pressures gauge (Pa), taken as
 * absolute with the standard atmosphere.  NAN unless 0 < p0 < p1 < p2,
 * dv > 0 and n >= 1. */
double pl_accumulator_fit_gas_volume (double dv, double p0, double p1, double p2, double n);

/* A port at the feed node of the applicators (see above): the part id and
 * port key, borrowed from doc.  FALSE (with error) when the layout has no
 * pump or no applicator the pump reaches. */
gboolean pl_accumulator_fit_find_feed (PlDocument *doc, const char **part_id,
                                       const char **port_key, GError **error);

/* What the what-if adds. */
typedef struct
{
  const char *part_id;     /* the port it is wired to (borrowed from doc) */
  const char *port_key;
  PlPoint position;        /* where the accumulator's centre goes */
  double gas_volume;       /* m^3 */
  double precharge;        /* Pa gauge, as asked */
  double idle_pressure;    /* p2 at the feed node, Pa gauge */
  double shot_volume;      /* dV, m^3 */
} PlAccumulatorFit;

/* Plans an accumulator for doc with the precharge p0 (Pa gauge; NAN: half
 * the feed node's idle pressure, common practice in glue manifolds, no
 * source) from fast, the document's fresh fast results.  FALSE with a
 * translated error naming the reason when it cannot be done. */
gboolean pl_accumulator_fit_plan (PlDocument *doc, PlResults *fast, double precharge,
                                  PlAccumulatorFit *out, GError **error);

/* The command that adds the planned accumulator with its gas volume and
 * precharge, wired to the feed node, as one step. */
PlCommand *pl_accumulator_fit_command (PlDocument *doc, const PlAccumulatorFit *fit);

G_END_DECLS
