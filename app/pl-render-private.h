/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-render-private.h: what the renderer's files share during one draw.
 */
#pragma once

#include <pango/pangocairo.h>

#include "pl-geometry.h"
#include "pl-label-placer.h"
#include "pl-render.h"

G_BEGIN_DECLS

/* Sizes on the drawing (mm), the project's own choices.  Text sizes are
 * raised so that no text is drawn below MIN_TEXT_PX device pixels while
 * there is room, and dropped below HIDE_TEXT_PX of their own size (raised
 * beyond 2.8 times they would crowd the symbols). */
#define PL_RENDER_INK_MM 0.45        /* outline of symbols */
#define PL_RENDER_WIRE_MM 0.9        /* wires */
#define PL_RENDER_TAG_MM 3.4         /* a part's tag */
#define PL_RENDER_VALUE_MM 2.8       /* its key value */
#define PL_RENDER_MIN_TEXT_PX 7.0
#define PL_RENDER_HIDE_TEXT_PX 2.5
/* The smallest text on paper, 1.8 mm (about 5 pt), still read with the
 * sheet in hand (common practice, no source). */
#define PL_RENDER_PAPER_TEXT_MM 1.8
#define PL_RENDER_PORT_MM 1.3        /* radius of a port circle */

/* One draw. */
typedef struct
{
  cairo_t *cr;
  PlDocument *doc;
  PlResults *results;          /* NULL unless current (see pl-render.h) */
  gboolean stale;              /* results were given but are out of date */
  const PlRenderOptions *opts;
  const PlPalette *pal;
  double scale;                /* device px per mm */
  double px;                   /* one device pixel in mm */
  PlRect clip;                 /* the world area being drawn */
  PangoLayout *layout;         /* one layout reused for every text */
  PangoFontDescription *font;
  double p_lo, p_hi;           /* pressure range of the ramp (Pa) */
  gboolean have_range;
  double uniformity;           /* the scenario's shot tolerance (fraction) */
  GHashTable *port_wires;      /* "part\nport" -> wire count */
  GHashTable *parts;           /* part id -> const PlPart * (borrowed) */
  GArray *route;               /* scratch PlPoint array */
  PlLabelPlacer *placer;       /* symbols drawn and labels placed so far */
} PlRenderCtx;

/* pl-render.c */
void pl_render_set_color (PlRenderCtx *ctx, const PlColor *c);
void pl_render_set_color_alpha (PlRenderCtx *ctx, const PlColor *c, double alpha);
/* A line width in mm that is never thinner than one device pixel. */
double pl_render_line_width (PlRenderCtx *ctx, double mm);
/* Text size (mm) for a wished size, or 0 if too small to draw. */
double pl_render_text_size (PlRenderCtx *ctx, double mm);
/* Lays out text at size mm (bold or not); its extent in mm. */
void pl_render_layout_text (PlRenderCtx *ctx, const char *text, double size, gboolean bold,
                            double *width, double *height);
/* Draws the laid-out text with its top left at (x, y). */
void pl_render_show_layout (PlRenderCtx *ctx, double x, double y, const PlColor *color);
guint pl_render_port_wire_count (PlRenderCtx *ctx, const char *part_id, const char *port_key);
/* Places a label at the first free candidate (pl_label_placer_place) and
 * reports its box to the caller's label_boxes; returns the index taken
 * (n: none was free, the first is used). */
guint pl_render_place_label (PlRenderCtx *ctx, const PlRect *candidates, guint n);

/* pl-render-symbols.c: the symbol of part in its own frame (cairo already
 * translated, turned and mirrored), fluid colour(s) from the overlay. */
typedef struct
{
  gboolean have_a, have_b;     /* pressures known at the first and second port */
  PlColor color_a, color_b;    /* their ramp colours */
  double flow;                 /* port 0 -> port 1 flow (m^3/s), or NaN */
  double gauge_fraction;       /* reading / full scale, or NaN */
  double jet;                  /* applicator in a replay: flow at the instant
                                * over its steady-open flow; NaN otherwise */
} PlSymbolState;

void pl_render_symbol (PlRenderCtx *ctx, const PlPartType *type, const PlPart *part,
                       const PlSymbolState *state);
/* Below this scale (device px per mm; zoom 0.16) symbols are drawn as
 * outlines in one fill and one stroke: details of 20 px symbols are lost
 * anyway, and 500 parts must redraw within a frame. */
#define PL_RENDER_OUTLINE_SCALE 0.6
void pl_render_silhouette (PlRenderCtx *ctx, const PlPartType *type);
/* The gauge dial drawn upright in world frame (centre, radius, fraction). */
void pl_render_gauge_dial (PlRenderCtx *ctx, PlPoint centre, double radius, double fraction);
/* The key value of a part in the user's units ("30:1", "Ø 6.35 mm · 10 m"),
 * newly allocated, or NULL. */
char *pl_render_key_value (const PlPart *part, const PlUnitPrefs *units);

/* pl-render-overlay.c */
/* Sets ctx's pressure range; call once results are known current. */
void pl_render_overlay_prepare (PlRenderCtx *ctx);
gboolean pl_render_port_pressure (PlRenderCtx *ctx, const char *part_id,
                                  const char *port_key, double *out);
void pl_render_pressure_color (PlRenderCtx *ctx, double p, PlColor *out);
/* Flow out of a part through one of its ports (m^3/s), when its type
 * defines one. */
gboolean pl_render_port_outflow (PlRenderCtx *ctx, const PlPart *part, const char *port_key,
                                 double *out);
void pl_render_symbol_state (PlRenderCtx *ctx, const PlPart *part, PlSymbolState *state);
/* A chevron at p pointing along (dx, dy), size in mm; _path only adds it
 * to the current path, _flush draws every mark on the path. */
void pl_render_flow_mark (PlRenderCtx *ctx, PlPoint p, double dx, double dy, double size);
void pl_render_flow_mark_path (PlRenderCtx *ctx, PlPoint p, double dx, double dy,
                               double size);
void pl_render_flow_mark_flush (PlRenderCtx *ctx);
/* The gauge reading or dose bar of a part: its size (0 x 0: none), and
 * drawing it in box, a box of that size (world frame). */
void pl_render_part_overlay_size (PlRenderCtx *ctx, const PlPart *part, double *width,
                                  double *height);
void pl_render_part_overlay (PlRenderCtx *ctx, const PlPart *part, const PlRect *box);
void pl_render_pressure_label (PlRenderCtx *ctx, PlPoint anchor, const char *part_id,
                               const char *port_key);
void pl_render_stale_badge (PlRenderCtx *ctx);

G_END_DECLS
