/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-render.h: the one cairo renderer of a layout, shared by the canvas,
 * printing and export, so that all three agree.
 *
 * It draws, bottom to top: the sheet and grid, wires (orthogonal routes,
 * junction dots, colour by pressure and flow marks when results are
 * current), every part's symbol with its tag and key value (text through
 * Pango, so any script renders), ports when asked, result overlays
 * (pressure labels at gauges and chosen ports, a gauge's needle, a dose
 * bar per applicator), free notes, selection and hover outlines, and when
 * asked the pressure legend and the stale mark.  It never changes the
 * document or the results.
 *
 * Stale results: a snapshot belongs to one document revision.  When the
 * revision of results differs from the document's, or the caller says the
 * results are stale, the renderer draws no figure from them at all -- no
 * colours, numbers, needles, arrows or dose bars, as if there were none --
 * and instead marks the drawing "results out of date" (a hatched badge
 * and a hatched, dimmed legend).  Old numbers next to new geometry would
 * be read as true; a blank overlay with a clear mark is not.  (Moves and
 * bends do not change what is solved, and the scheduler re-tags the
 * snapshot for them, so the overlay survives a drag.)
 */
#pragma once

#include <cairo.h>
#include <glib.h>

#include "pl-document.h"
#include "pl-palette.h"
#include "pl-results.h"
#include "pl-results-series.h"
#include "pl-units.h"
#include "pl-viewport.h"

G_BEGIN_DECLS

/* A port of a part, by id and key (borrowed strings). */
typedef struct
{
  const char *part_id;
  const char *port_key;
} PlPortRef;

typedef struct
{
  /* Where: with a viewport the renderer maps world mm to its device pixels
   * (the canvas); with NULL the caller has set the cairo matrix to world mm
   * already (print and export). */
  const PlViewport *viewport;
  PlRenderStyle style;
  const PlUnitPrefs *units;          /* NULL: SI */

  gboolean paint_background;         /* fill the clip with the sheet colour */
  gboolean show_grid;
  gboolean show_ports;               /* every port as a small open circle */
  gboolean show_legend;              /* the pressure legend in the bottom right
                                      * corner (only with a viewport) */

  GHashTable *selection;             /* set of part, wire and note ids
                                      * (g_str_hash / g_str_equal), or NULL */
  const char *hover_id;              /* part, wire or note under the pointer */
  const PlPortRef *highlight_ports;  /* ports a dragged wire may attach to */
  guint n_highlight_ports;
  const PlPortRef *pressure_ports;   /* ports whose pressure is labelled (the
                                      * chosen nodes; gauges always are) */
  guint n_pressure_ports;

  gboolean results_stale;            /* the caller knows the results are old */
  PlPressureKind pressure_kind;      /* which pressure colours the lines and
                                      * fills the labels */
  double replay_time;                /* a time within the replayed run (s):
                                      * pressures and flows at that instant
                                      * when the run has run, else
                                      * pressure_kind; NaN for none */
  PlRun replay_run;                  /* which run replay_time is in: the
                                      * firing cycle (wraps) or the shutdown */
  double pressure_max;               /* top of the ramp (Pa); <= 0 or NaN:
                                      * the highest pressure drawn */
  double min_text_px;                /* smallest text drawn (device px), for
                                      * a screen read from afar; <= 0: the
                                      * renderer's own floor */
  gboolean show_dose_details;        /* a dose bar's figures give the inlet
                                      * pressure and the shot's mass before its
                                      * deviation (sheets, where a label at the
                                      * inlet would meet the line's text) */
  double paper_scale;                /* sheets: mm of paper per mm of drawing.
                                      * Text is then never hidden and never
                                      * under PL_RENDER_PAPER_TEXT_MM on the
                                      * paper, whatever the device; 0: the
                                      * screen's pixel rules */
  GArray *label_boxes;               /* out, or NULL: a PlRect (world mm)
                                      * appended for every label placed */
} PlRenderOptions;

/* The ports whose pressure a drawing labels (PlRenderOptions'
 * pressure_ports): every applicator's inlet and every pump's outlet (the
 * two ends a designer compares) and each port of the parts in selection (a
 * set of ids, or NULL); gauges are labelled by the renderer anyway.  Ports
 * on one hydraulic node of results (may be NULL), or on one spot, are
 * labelled once: two labels there would print over each other.  A new
 * array of PlPortRef borrowing doc's strings (valid until doc changes). */
GArray *pl_render_key_ports (PlDocument *doc, PlResults *results, GHashTable *selection);

/* Light style, SI, background, grid and legend on, ports off, no
 * selection, steady-open pressures, no replay, automatic ramp. */
void pl_render_options_init (PlRenderOptions *opts);

/* Draws doc (and results, which may be NULL) with cr.  The cairo state is
 * saved and restored; the clip of cr bounds what is drawn (parts outside
 * it are skipped).  Returns the cairo status of cr afterwards
 * (CAIRO_STATUS_SUCCESS when all went well); bad options (an unknown
 * style) draw nothing and return CAIRO_STATUS_INVALID_CONTENT. */
cairo_status_t pl_render_document (cairo_t *cr, PlDocument *doc, PlResults *results,
                                   const PlRenderOptions *opts);

/* The pressure range the lines are coloured over (Pa): 0 to the top of the
 * ramp.  FALSE when there is nothing to colour (no results, stale, or no
 * pressure known). */
gboolean pl_render_pressure_range (PlDocument *doc, PlResults *results,
                                   const PlRenderOptions *opts, double *lo, double *hi);

/* The legend of the pressure ramp in a box at (x, y) of width x height in
 * the current user units (device px on a canvas, mm on a sheet): the ramp,
 * its ends and middle in the user's pressure unit, a title; hatched and
 * marked stale when stale. */
void pl_render_legend (cairo_t *cr, double x, double y, double width, double height,
                       double lo, double hi, const PlUnitPrefs *units,
                       PlRenderStyle style, gboolean stale);

/* One symbol of a type on its own (for the parts shelf and previews),
 * centred in a box of size x size user units, without text.  FALSE for a
 * type that has no symbol (scenario, title). */
gboolean pl_render_type_icon (cairo_t *cr, const PlPartType *type, double size,
                              PlRenderStyle style);

G_END_DECLS
