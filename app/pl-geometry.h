/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-geometry.h: where things are on the drawing, what lies under a point,
 * the grid snap and the orthogonal routes of wires.
 *
 * Everything here is a pure function in world units (mm).  Hit-testing
 * takes its tolerance in world units too: pass
 * pl_viewport_world_tolerance (vp, px), so that "within 6 pixels" means the
 * same on screen at every zoom.  Items are searched topmost first: the
 * document draws its lists in order, so the last part is on top.
 */
#pragma once

#include <glib.h>

#include "pl-document.h"
#include "pl-types.h"
#include "pl-viewport.h"

G_BEGIN_DECLS

/* Length of the straight stub with which a route leaves a port along the
 * port's side before it may turn: one snap step, so that a turn never hides
 * inside the symbol and stubs of facing ports never overlap. */
#define PL_ROUTE_STUB_MM PL_GRID_SNAP_MM

/* --- a part's transform --- */

/* A point in the part's own frame (before mirror and rotation, as in the
 * PlPortSpec and the symbol drawings) to world: mirrored across the
 * part's vertical axis first if mirrored, then turned rotation quarter
 * turns clockwise on the drawing, then shifted to (x, y).  The same map as
 * pl_part_get_port_position(). */
void pl_geometry_transform_point (double x, double y, guint rotation, gboolean mirrored,
                                  PlPoint local, PlPoint *out);
/* The side a port faces after mirror and rotation. */
PlSide pl_geometry_transform_side (PlSide side, guint rotation, gboolean mirrored);
/* The unit vector of a side: east (1, 0), south (0, 1), west, north. */
void pl_geometry_side_vector (PlSide side, double *dx, double *dy);

/* The part's symbol box on the drawing (its type's half sizes, turned with
 * it; a mirror does not change a box centred on the origin). */
void pl_geometry_part_bounds (const PlPart *part, PlRect *out);
/* The same for a type at a place, for previews of parts not yet added. */
void pl_geometry_type_bounds (const PlPartType *type, double x, double y, guint rotation,
                              PlRect *out);

/* Smallest rectangle around every part box, every wire route and every
 * note anchor of the document; FALSE (out untouched) if there is nothing. */
gboolean pl_geometry_document_bounds (PlDocument *doc, PlRect *out);

/* --- rectangles and distances --- */

/* A rectangle from two corners in any order. */
void pl_rect_from_corners (PlPoint a, PlPoint b, PlRect *out);
gboolean pl_rect_contains_point (const PlRect *r, PlPoint p);
/* Whether inner lies entirely inside outer (edges included). */
gboolean pl_rect_contains_rect (const PlRect *outer, const PlRect *inner);
gboolean pl_rect_intersects (const PlRect *a, const PlRect *b);
/* Grows r to hold p. */
void pl_rect_add_point (PlRect *r, PlPoint p);

/* Euclidean distance from p to the segment a-b (to a when a == b). */
double pl_geometry_point_segment_distance (PlPoint p, PlPoint a, PlPoint b);

/* --- snapping --- */

/* The nearest grid point in each coordinate, a tie rounded up (towards
 * +x, +y) whatever the sign, so that a drag across the origin snaps
 * evenly.  A grid that is not positive and finite returns p unchanged. */
void pl_geometry_snap (PlPoint p, double grid, PlPoint *out);

/* --- routes --- */

/* The orthogonal polyline of a wire from port a (facing side_a) to port b
 * (facing side_b), written to out (a GArray of PlPoint, cleared first):
 *  - it starts at a and ends at b exactly;
 *  - every segment is horizontal or vertical;
 *  - its first segment leaves a along side_a and its last segment enters b
 *    against side_b (a wire never starts into its own part);
 *  - it passes through every bend point in order; between two points that
 *    do not line up it turns once, keeping the direction it came in on
 *    first (so a bend point is where the wire turns);
 *  - without bends it is a stub out of each port joined by one L or Z
 *    (a U where the ports face away from each other);
 *  - no zero-length segment, and no point between two segments that run
 *    on in the same direction (two ports at one spot give one point).
 * n_bends may be 0 (bends may then be NULL).  Non-finite input gives the
 * straight segment a-b (the document never holds such points). */
void pl_geometry_route (PlPoint a, PlSide side_a, PlPoint b, PlSide side_b,
                        const PlPoint *bends, guint n_bends, GArray *out);
/* The route of a wire of doc from its ports' current places, so a wire
 * stays attached when its parts move.  FALSE (out emptied) if an end's
 * part or port is missing. */
gboolean pl_geometry_route_wire (PlDocument *doc, const PlWire *wire, GArray *out);
/* The same with the wire's two parts already looked up (end 0, end 1), for
 * callers that route many wires: no search of the document. */
gboolean pl_geometry_route_wire_parts (const PlWire *wire, const PlPart *part0,
                                       const PlPart *part1, GArray *out);

/* --- hit-testing (tolerance in world units, >= 0) --- */

/* The topmost part whose box, grown by tolerance, holds p; NULL if none. */
const PlPart *pl_geometry_part_at (PlDocument *doc, PlPoint p, double tolerance);
/* The port nearest to p within tolerance (the topmost part's on a tie);
 * FALSE if none.  part and port_key may be NULL. */
gboolean pl_geometry_port_at (PlDocument *doc, PlPoint p, double tolerance,
                              const PlPart **part, const char **port_key);
/* The topmost wire whose route passes within tolerance of p; NULL if none.
 * (Wires are drawn under parts, so a canvas asks for ports, then parts,
 * then wires.) */
const PlWire *pl_geometry_wire_at (PlDocument *doc, PlPoint p, double tolerance);

/* Items entirely inside a rubber band: parts whose boxes, wires whose
 * routes and notes whose anchors lie in rect.  The ids are appended to
 * ids (a GPtrArray of borrowed const char *, valid until the document next
 * changes), parts first, then wires, then notes, each in document order.
 * Returns how many were appended. */
guint pl_geometry_items_in_rect (PlDocument *doc, const PlRect *rect, GPtrArray *ids);

G_END_DECLS
