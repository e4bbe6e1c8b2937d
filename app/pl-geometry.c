/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-geometry.c: transforms, hit-testing, snapping and wire routes.
 */
#include "config.h"

#include "pl-geometry.h"

#include <math.h>

/* How far a route detours around a part when its ports line up the wrong
 * way: four snap steps (20 mm) clear the half height of most symbols
 * (pl-part-types.c: 6 to 30 mm).  Routing does not know the obstacles; a
 * user who wants a cleaner path adds bend points. */
#define DETOUR_MM (4.0 * PL_GRID_SNAP_MM)

/* --- transforms --- */

void
pl_geometry_transform_point (double x, double y, guint rotation, gboolean mirrored,
                             PlPoint local, PlPoint *out)
{
  double lx = mirrored ? -local.x : local.x, ly = local.y;

  g_return_if_fail (out != NULL);
  /* A quarter turn clockwise with y down: (x, y) -> (-y, x). */
  for (guint r = 0; r < rotation % 4; r++)
    {
      double t = lx;

      lx = -ly;
      ly = t;
    }
  /* -0 from the turns kept out of the sum, as pl_part_get_port_position
   * does, so both give the same bits. */
  out->x = x + (lx == 0.0 ? 0.0 : lx);
  out->y = y + (ly == 0.0 ? 0.0 : ly);
}

PlSide
pl_geometry_transform_side (PlSide side, guint rotation, gboolean mirrored)
{
  guint s = (guint) side % 4;

  /* Sides are numbered clockwise: a mirror across the vertical axis swaps
   * east and west, a quarter turn adds one. */
  if (mirrored && (s == PL_SIDE_EAST || s == PL_SIDE_WEST))
    s = s == PL_SIDE_EAST ? PL_SIDE_WEST : PL_SIDE_EAST;
  return (PlSide) ((s + rotation) % 4);
}

void
pl_geometry_side_vector (PlSide side, double *dx, double *dy)
{
  static const double vx[4] = { 1.0, 0.0, -1.0, 0.0 };
  static const double vy[4] = { 0.0, 1.0, 0.0, -1.0 };
  guint s = (guint) side % 4;

  if (dx != NULL)
    *dx = vx[s];
  if (dy != NULL)
    *dy = vy[s];
}

void
pl_geometry_type_bounds (const PlPartType *type, double x, double y, guint rotation,
                         PlRect *out)
{
  double hw, hh;

  g_return_if_fail (type != NULL && out != NULL);
  hw = rotation % 2 == 0 ? type->half_width : type->half_height;
  hh = rotation % 2 == 0 ? type->half_height : type->half_width;
  *out = (PlRect) { x - hw, y - hh, x + hw, y + hh };
}

void
pl_geometry_part_bounds (const PlPart *part, PlRect *out)
{
  g_return_if_fail (part != NULL && out != NULL);
  pl_geometry_type_bounds (pl_part_get_part_type (part), pl_part_get_x (part),
                           pl_part_get_y (part), pl_part_get_rotation (part), out);
}

/* --- rectangles --- */

void
pl_rect_from_corners (PlPoint a, PlPoint b, PlRect *out)
{
  g_return_if_fail (out != NULL);
  *out = (PlRect) { MIN (a.x, b.x), MIN (a.y, b.y), MAX (a.x, b.x), MAX (a.y, b.y) };
}

gboolean
pl_rect_contains_point (const PlRect *r, PlPoint p)
{
  return p.x >= r->x0 && p.x <= r->x1 && p.y >= r->y0 && p.y <= r->y1;
}

gboolean
pl_rect_contains_rect (const PlRect *outer, const PlRect *inner)
{
  return inner->x0 >= outer->x0 && inner->x1 <= outer->x1 && inner->y0 >= outer->y0
         && inner->y1 <= outer->y1;
}

gboolean
pl_rect_intersects (const PlRect *a, const PlRect *b)
{
  return a->x0 <= b->x1 && b->x0 <= a->x1 && a->y0 <= b->y1 && b->y0 <= a->y1;
}

void
pl_rect_add_point (PlRect *r, PlPoint p)
{
  r->x0 = MIN (r->x0, p.x);
  r->y0 = MIN (r->y0, p.y);
  r->x1 = MAX (r->x1, p.x);
  r->y1 = MAX (r->y1, p.y);
}

double
pl_geometry_point_segment_distance (PlPoint p, PlPoint a, PlPoint b)
{
  double dx = b.x - a.x, dy = b.y - a.y, len2 = dx * dx + dy * dy, t;

  if (len2 == 0.0)
    return hypot (p.x - a.x, p.y - a.y);
  /* Projection of p on the line, clamped to the segment. */
  t = CLAMP (((p.x - a.x) * dx + (p.y - a.y) * dy) / len2, 0.0, 1.0);
  return hypot (p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

/* --- snapping --- */

static double
snap1 (double v, double grid)
{
  double s = floor (v / grid + 0.5) * grid;

  return s == 0.0 ? 0.0 : s;   /* no -0 */
}

void
pl_geometry_snap (PlPoint p, double grid, PlPoint *out)
{
  g_return_if_fail (out != NULL);
  if (!(isfinite (grid) && grid > 0.0) || !isfinite (p.x) || !isfinite (p.y))
    {
      *out = p;
      return;
    }
  out->x = snap1 (p.x, grid);
  out->y = snap1 (p.y, grid);
}

/* --- routes --- */

static void
push (GArray *pts, double x, double y)
{
  PlPoint p = { x, y };

  g_array_append_val (pts, p);
}

static PlPoint
last_point (GArray *pts)
{
  return g_array_index (pts, PlPoint, pts->len - 1);
}

/* Sign of a coordinate difference, with exact zero for points on a line
 * (coordinates on a drawing are sums of grid steps and offsets, so an
 * aligned pair compares equal). */
static int
sgn (double v)
{
  return (v > 0.0) - (v < 0.0);
}

/* Joins the last point, reached moving along (hx, hy), to t with the route
 * arriving at t so that the next move (ex, ey) into the port does not turn
 * back on itself.  Worked in a frame where the heading is +x: lx = d.h and
 * ly = d.n with n = h turned a quarter clockwise; back by d = lx h + ly n. */
static void
connect_final (GArray *pts, double hx, double hy, PlPoint target, double ex, double ey)
{
  PlPoint p = last_point (pts);
  double nx = -hy, ny = hx;
  double dx = target.x - p.x, dy = target.y - p.y;
  double tx = dx * hx + dy * hy, ty = dx * nx + dy * ny;
  double fx = ex * hx + ey * hy, fy = ex * nx + ey * ny;   /* e in the frame */
  double flip = 1.0, c[3][2];
  guint n = 0;

  if (fy < 0.0)
    {
      /* Arriving against -n: reflect n so that the cases below see +n. */
      flip = -1.0;
      ty = -ty;
      fy = -fy;
    }
  if (fx > 0.0)
    {
      if (tx > 0.0)
        {
          /* Same way on and ahead: a Z through the middle (a line if
           * level). */
          c[n][0] = 0.5 * tx, c[n++][1] = 0.0;
          c[n][0] = 0.5 * tx, c[n++][1] = ty;
        }
      else
        {
          /* Ahead but behind us: out sideways, back, and in. */
          double my = fabs (ty) >= 2.0 * PL_ROUTE_STUB_MM ? 0.5 * ty
                      : ty + (ty >= 0.0 ? DETOUR_MM : -DETOUR_MM);

          c[n][0] = 0.0, c[n++][1] = my;
          c[n][0] = tx, c[n++][1] = my;
        }
    }
  else if (fx < 0.0)
    {
      if (fabs (ty) >= PL_ROUTE_STUB_MM)
        {
          /* Facing the same way: a U around the farther end. */
          double xe = MAX (0.0, tx);

          c[n][0] = xe, c[n++][1] = 0.0;
          c[n][0] = xe, c[n++][1] = ty;
        }
      else
        {
          /* Level with it: over the top and back down. */
          c[n][0] = 0.0, c[n++][1] = ty - DETOUR_MM;
          c[n][0] = tx, c[n++][1] = ty - DETOUR_MM;
        }
    }
  else
    {
      /* Arriving across the heading (+n after the reflection). */
      if (tx > 0.0 && ty > 0.0)
        c[n][0] = tx, c[n++][1] = 0.0;                    /* an L */
      else if (tx > 0.0)
        {
          c[n][0] = 0.5 * tx, c[n++][1] = 0.0;            /* a Z, in sideways */
          c[n][0] = 0.5 * tx, c[n++][1] = ty;
        }
      else if (fabs (tx) < PL_ROUTE_STUB_MM && ty < 0.0)
        {
          c[n][0] = DETOUR_MM, c[n++][1] = 0.0;           /* round the far part */
          c[n][0] = DETOUR_MM, c[n++][1] = ty;
        }
      else
        c[n][0] = 0.0, c[n++][1] = ty;                    /* an L, turning first */
    }
  for (guint i = 0; i < n; i++)
    {
      double ly = flip * c[i][1];

      push (pts, p.x + c[i][0] * hx + ly * nx, p.y + c[i][0] * hy + ly * ny);
    }
  push (pts, target.x, target.y);
}

/* Joins the last point to q through one corner, going on along the current
 * heading first; updates the heading to that of the last non-empty move. */
static void
connect_bend (GArray *pts, double *hx, double *hy, PlPoint q)
{
  PlPoint p = last_point (pts);
  int sx = sgn (q.x - p.x), sy = sgn (q.y - p.y);

  if (sx != 0 && sy != 0)
    {
      if (*hx != 0.0)
        push (pts, q.x, p.y);
      else
        push (pts, p.x, q.y);
    }
  if (sx != 0 || sy != 0)
    {
      PlPoint c = last_point (pts);

      push (pts, q.x, q.y);
      /* The heading of the corner-to-q move (or p-to-q if no corner). */
      if (sx != 0 && sy != 0)
        {
          *hx = c.x == q.x ? 0.0 : sgn (q.x - c.x);
          *hy = c.y == q.y ? 0.0 : sgn (q.y - c.y);
        }
      else
        {
          *hx = sx;
          *hy = sy;
        }
    }
}

/* Drops empty segments and points between two moves in the same
 * direction; keeps a turn back (a bend point a user placed behind). */
static void
simplify (GArray *pts)
{
  guint w = 0;

  for (guint r = 0; r < pts->len; r++)
    {
      PlPoint p = g_array_index (pts, PlPoint, r);

      if (w > 0)
        {
          PlPoint q = g_array_index (pts, PlPoint, w - 1);

          if (p.x == q.x && p.y == q.y)
            continue;
          if (w > 1)
            {
              PlPoint o = g_array_index (pts, PlPoint, w - 2);

              if (sgn (q.x - o.x) == sgn (p.x - q.x) && sgn (q.y - o.y) == sgn (p.y - q.y))
                w--;   /* q lies on a straight run: replace it by p */
            }
        }
      g_array_index (pts, PlPoint, w++) = p;
    }
  g_array_set_size (pts, w);
}

void
pl_geometry_route (PlPoint a, PlSide side_a, PlPoint b, PlSide side_b,
                   const PlPoint *bends, guint n_bends, GArray *out)
{
  double ax, ay, bx, by, hx, hy;
  PlPoint b1;
  gboolean finite = isfinite (a.x) && isfinite (a.y) && isfinite (b.x) && isfinite (b.y);

  g_return_if_fail (out != NULL && g_array_get_element_size (out) == sizeof (PlPoint));
  g_array_set_size (out, 0);
  for (guint i = 0; finite && i < n_bends; i++)
    finite = isfinite (bends[i].x) && isfinite (bends[i].y);
  pl_geometry_side_vector (side_a, &ax, &ay);
  pl_geometry_side_vector (side_b, &bx, &by);
  push (out, a.x, a.y);
  /* Ports that face each other on one line (or touch) need no stubs. */
  if (!finite
      || (n_bends == 0 && ax == -bx && ay == -by
          && ((ax != 0.0 && a.y == b.y && (b.x - a.x) * ax >= 0.0)
              || (ay != 0.0 && a.x == b.x && (b.y - a.y) * ay >= 0.0))))
    {
      push (out, b.x, b.y);
      simplify (out);
      return;
    }
  push (out, a.x + PL_ROUTE_STUB_MM * ax, a.y + PL_ROUTE_STUB_MM * ay);
  b1 = (PlPoint) { b.x + PL_ROUTE_STUB_MM * bx, b.y + PL_ROUTE_STUB_MM * by };
  hx = ax;
  hy = ay;
  for (guint i = 0; i < n_bends; i++)
    connect_bend (out, &hx, &hy, bends[i]);
  /* The move from b1 into b is against b's side: e = -side_b. */
  connect_final (out, hx, hy, b1, -bx, -by);
  push (out, b.x, b.y);
  simplify (out);
}

gboolean
pl_geometry_route_wire (PlDocument *doc, const PlWire *wire, GArray *out)
{
  g_return_val_if_fail (doc != NULL && wire != NULL && out != NULL, FALSE);
  return pl_geometry_route_wire_parts (wire,
                                       pl_document_find_part (doc, pl_wire_get_part_id (wire, 0)),
                                       pl_document_find_part (doc, pl_wire_get_part_id (wire, 1)),
                                       out);
}

gboolean
pl_geometry_route_wire_parts (const PlWire *wire, const PlPart *part0, const PlPart *part1,
                              GArray *out)
{
  PlPoint end[2];
  PlSide side[2];
  const PlPoint *bends;
  guint n_bends = 0;

  g_return_val_if_fail (wire != NULL && out != NULL, FALSE);
  g_array_set_size (out, 0);
  for (guint e = 0; e < 2; e++)
    {
      const PlPart *part = e == 0 ? part0 : part1;
      const char *key = pl_wire_get_port_key (wire, e);

      if (part == NULL || !pl_part_get_port_position (part, key, &end[e]))
        return FALSE;
      side[e] = pl_part_get_port_side (part, key);
    }
  bends = pl_wire_get_bends (wire, &n_bends);
  pl_geometry_route (end[0], side[0], end[1], side[1], bends, n_bends, out);
  return TRUE;
}

gboolean
pl_geometry_document_bounds (PlDocument *doc, PlRect *out)
{
  g_autoptr (GArray) route = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  PlRect r = { INFINITY, INFINITY, -INFINITY, -INFINITY };
  gboolean any = FALSE;

  g_return_val_if_fail (doc != NULL && out != NULL, FALSE);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      PlRect b;

      pl_geometry_part_bounds (pl_document_get_part (doc, i), &b);
      pl_rect_add_point (&r, (PlPoint) { b.x0, b.y0 });
      pl_rect_add_point (&r, (PlPoint) { b.x1, b.y1 });
      any = TRUE;
    }
  for (guint i = 0; i < pl_document_get_n_wires (doc); i++)
    if (pl_geometry_route_wire (doc, pl_document_get_wire (doc, i), route))
      for (guint k = 0; k < route->len; k++)
        {
          pl_rect_add_point (&r, g_array_index (route, PlPoint, k));
          any = TRUE;
        }
  for (guint i = 0; i < pl_document_get_n_notes (doc); i++)
    {
      const PlNote *note = pl_document_get_note (doc, i);

      pl_rect_add_point (&r, (PlPoint) { pl_note_get_x (note), pl_note_get_y (note) });
      any = TRUE;
    }
  if (any)
    *out = r;
  return any;
}

/* --- hit-testing --- */

const PlPart *
pl_geometry_part_at (PlDocument *doc, PlPoint p, double tolerance)
{
  g_return_val_if_fail (doc != NULL, NULL);
  tolerance = isfinite (tolerance) ? MAX (tolerance, 0.0) : 0.0;
  for (guint i = pl_document_get_n_parts (doc); i-- > 0;)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      PlRect b;

      pl_geometry_part_bounds (part, &b);
      b.x0 -= tolerance, b.y0 -= tolerance, b.x1 += tolerance, b.y1 += tolerance;
      if (pl_rect_contains_point (&b, p))
        return part;
    }
  return NULL;
}

gboolean
pl_geometry_port_at (PlDocument *doc, PlPoint p, double tolerance, const PlPart **part,
                     const char **port_key)
{
  const PlPart *best_part = NULL;
  const char *best_key = NULL;
  double best = INFINITY;

  g_return_val_if_fail (doc != NULL, FALSE);
  tolerance = isfinite (tolerance) ? MAX (tolerance, 0.0) : 0.0;
  for (guint i = pl_document_get_n_parts (doc); i-- > 0;)
    {
      const PlPart *candidate = pl_document_get_part (doc, i);
      const PlPartType *type = pl_part_get_part_type (candidate);

      for (guint k = 0; k < type->n_ports; k++)
        {
          PlPoint q;
          double d;

          pl_part_get_port_position (candidate, type->ports[k].key, &q);
          d = hypot (p.x - q.x, p.y - q.y);
          /* Strictly nearer: of two ports at one spot the topmost wins. */
          if (d <= tolerance && d < best)
            {
              best = d;
              best_part = candidate;
              best_key = type->ports[k].key;
            }
        }
    }
  if (best_part == NULL)
    return FALSE;
  if (part != NULL)
    *part = best_part;
  if (port_key != NULL)
    *port_key = best_key;
  return TRUE;
}

const PlWire *
pl_geometry_wire_at (PlDocument *doc, PlPoint p, double tolerance)
{
  g_autoptr (GArray) route = g_array_new (FALSE, FALSE, sizeof (PlPoint));

  g_return_val_if_fail (doc != NULL, NULL);
  tolerance = isfinite (tolerance) ? MAX (tolerance, 0.0) : 0.0;
  for (guint i = pl_document_get_n_wires (doc); i-- > 0;)
    {
      const PlWire *wire = pl_document_get_wire (doc, i);

      if (!pl_geometry_route_wire (doc, wire, route))
        continue;
      for (guint k = 0; k + 1 < route->len; k++)
        if (pl_geometry_point_segment_distance (p, g_array_index (route, PlPoint, k),
                                                g_array_index (route, PlPoint, k + 1))
            <= tolerance)
          return wire;
    }
  return NULL;
}

guint
pl_geometry_items_in_rect (PlDocument *doc, const PlRect *rect, GPtrArray *ids)
{
  g_autoptr (GArray) route = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  guint before;

  g_return_val_if_fail (doc != NULL && rect != NULL && ids != NULL, 0);
  before = ids->len;
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      PlRect b;

      pl_geometry_part_bounds (part, &b);
      if (pl_rect_contains_rect (rect, &b))
        g_ptr_array_add (ids, (gpointer) pl_part_get_id (part));
    }
  for (guint i = 0; i < pl_document_get_n_wires (doc); i++)
    {
      const PlWire *wire = pl_document_get_wire (doc, i);
      gboolean inside;

      inside = pl_geometry_route_wire (doc, wire, route) && route->len > 0;
      for (guint k = 0; inside && k < route->len; k++)
        inside = pl_rect_contains_point (rect, g_array_index (route, PlPoint, k));
      if (inside)
        g_ptr_array_add (ids, (gpointer) pl_wire_get_id (wire));
    }
  for (guint i = 0; i < pl_document_get_n_notes (doc); i++)
    {
      const PlNote *note = pl_document_get_note (doc, i);

      if (pl_rect_contains_point (rect, (PlPoint) { pl_note_get_x (note),
                                                    pl_note_get_y (note) }))
        g_ptr_array_add (ids, (gpointer) pl_note_get_id (note));
    }
  return ids->len - before;
}
