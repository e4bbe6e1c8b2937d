/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-viewport.h: pan and zoom of the canvas, world <-> screen transforms.
 *
 * World units are millimetres on the drawing (x right, y down; pl-types.h);
 * screen units are device pixels of the widget (x right, y down, (0, 0) at
 * the top left corner).  The map is a uniform scale and a shift:
 *
 *   screen = (world - origin) * scale,   scale = zoom * PL_VIEWPORT_PX_PER_MM
 *
 * so zoom 1 ("100 %") draws the sheet at its real size on a 96 dpi screen.
 *
 * PlViewport is a plain value (copy it with =): the canvas widget keeps
 * one, the renderer reads one, tests drive one without a display.  Every
 * function keeps the viewport valid (zoom inside the limits, origin
 * finite) whatever it is given: a NaN or infinite argument leaves the
 * viewport unchanged and returns FALSE.
 */
#pragma once

#include <glib.h>

#include "pl-types.h"

G_BEGIN_DECLS

/* Reference pixels per millimetre at zoom 1: 96 px per inch (the CSS
 * reference pixel, W3C CSS Values and Units Level 3, sec. 5.2) over
 * 25.4 mm per inch (NIST SP 811, B.8). */
#define PL_VIEWPORT_PX_PER_MM (96.0 / 25.4)

/* Zoom limits: at 0.1 a 40 mm pump is 15 px wide (still a shape), at 8 a
 * 0.5 mm orifice label is 15 px tall; beyond either nothing gets clearer. */
#define PL_VIEWPORT_ZOOM_MIN 0.1
#define PL_VIEWPORT_ZOOM_MAX 8.0

/* The snap grid of the drawing (mm).  Every port of every part type sits
 * on a multiple of 5 mm from the part's origin, so parts placed on this
 * grid put their ports on it too and straight wires line up. */
#define PL_GRID_SNAP_MM 5.0

/* An axis-aligned rectangle in world units, x0 <= x1 and y0 <= y1. */
typedef struct
{
  double x0, y0;
  double x1, y1;
} PlRect;

typedef struct
{
  double zoom;       /* PL_VIEWPORT_ZOOM_MIN .. PL_VIEWPORT_ZOOM_MAX */
  double origin_x;   /* world point drawn at the screen's top left, mm */
  double origin_y;
  double width;      /* size of the screen area, px (>= 0) */
  double height;
} PlViewport;

/* Zoom 1, world (0, 0) at the centre of a width x height px area. */
void pl_viewport_init (PlViewport *vp, double width, double height);
/* A new area size; keeps the world point at the centre where it was.
 * FALSE (no change) for a negative or non-finite size. */
gboolean pl_viewport_set_size (PlViewport *vp, double width, double height);

/* Device pixels per world mm. */
double pl_viewport_get_scale (const PlViewport *vp);

void pl_viewport_world_to_screen (const PlViewport *vp, PlPoint world, PlPoint *screen);
void pl_viewport_screen_to_world (const PlViewport *vp, PlPoint screen, PlPoint *world);
/* A distance of px screen pixels in world units (hit-test tolerances). */
double pl_viewport_world_tolerance (const PlViewport *vp, double px);

/* Shifts the view by (dx, dy) screen pixels: the drawing follows the
 * pointer (a drag to the right moves the drawing to the right). */
gboolean pl_viewport_pan (PlViewport *vp, double dx, double dy);
/* Sets the zoom (clamped to the limits) keeping the world point under the
 * screen point (sx, sy) where it is.  FALSE if nothing changed. */
gboolean pl_viewport_set_zoom_at (PlViewport *vp, double zoom, double sx, double sy);
/* Multiplies the zoom by factor (> 0) about (sx, sy); see above. */
gboolean pl_viewport_zoom_at (PlViewport *vp, double factor, double sx, double sy);
/* Zooms and pans so that box fills the area less margin_px on every side,
 * centred; the zoom is clamped to the limits (a box too big or too small
 * ends up centred at the limit).  An empty box (a point) is centred at the
 * current zoom.  FALSE, and no change, for a non-finite box or margin or
 * an area of zero size. */
gboolean pl_viewport_fit (PlViewport *vp, const PlRect *box, double margin_px);
/* The world rectangle that the screen area shows. */
void pl_viewport_get_visible (const PlViewport *vp, PlRect *out);

/* Grid lines to draw at this zoom: the finest spacing (mm) of the series
 * 5, 10, 20, 50, 100, 200, 500, ... (the snap grid and its 1-2-5 multiples)
 * whose lines are at least min_px screen pixels apart, and the major
 * spacing, five or ten times it so that major lines fall on multiples of
 * ten snap steps.  min_px <= 0 counts as 1. */
void pl_viewport_grid_spacing (const PlViewport *vp, double min_px, double *minor,
                               double *major);

G_END_DECLS
