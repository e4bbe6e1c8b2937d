/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Geometry: a part's transform (hand-worked quarter turns and mirrors, and
 * agreement with the document's own port look-up), boxes, point-segment
 * distance, grid snap, hit-testing tables with the tolerance in screen
 * pixels, rubber bands, and orthogonal routes (checked as properties over
 * every pair of port sides and many placements, plus exact shapes).
 *
 * References: the rotation of a point by a quarter turn, (x, y) ->
 * (-y, x) with y downwards, and the distance from a point to a segment
 * (projection clamped to the segment) are the textbook formulas (e.g.
 * Schneider & Eberly, Geometric Tools for Computer Graphics, 2003,
 * sec. 6.1.2, from memory); the rest is worked by hand in each row.
 */

#include "config.h"

#include <math.h>

#include "pl-check.h"
#include "pl-command.h"
#include "pl-document.h"
#include "pl-geometry.h"
#include "pl-part-type.h"
#include "pl-viewport.h"

/* Coordinates are sums of small multiples of 5 mm: exact in binary floating
 * point up to the last bit, so the routes compare exactly (tolerance 0)
 * and distances to 1e-12. */
#define TOL 1e-12

static void
apply_ok (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "%s", error ? error->message : "");
  pl_command_unref (cmd);
}

/* --- transforms --- */

static const struct
{
  guint rotation;
  gboolean mirrored;
  PlPoint local, expect;   /* part at (100, 50) */
} transform_rows[] = {
  { 0, FALSE, { 20, 0 }, { 120, 50 } },
  { 1, FALSE, { 20, 0 }, { 100, 70 } },    /* east turns to south */
  { 2, FALSE, { 20, 0 }, { 80, 50 } },
  { 3, FALSE, { 20, 0 }, { 100, 30 } },    /* east turns to north */
  { 0, TRUE, { 20, 0 }, { 80, 50 } },      /* mirror across the vertical axis */
  { 1, TRUE, { 20, 0 }, { 100, 30 } },     /* mirror first, then the turn */
  { 1, FALSE, { 0, 30 }, { 70, 50 } },     /* south turns to west */
  { 3, TRUE, { 12, -7 }, { 93, 62 } },     /* (-12,-7) -> 3 turns -> (-7, 12) */
  { 5, FALSE, { 20, 0 }, { 100, 70 } },    /* rotations count modulo 4 */
};

START_TEST (test_transform_point)
{
  PlPoint out;

  pl_geometry_transform_point (100, 50, transform_rows[_i].rotation,
                               transform_rows[_i].mirrored, transform_rows[_i].local, &out);
  ck_assert_double_eq_tol (out.x, transform_rows[_i].expect.x, TOL);
  ck_assert_double_eq_tol (out.y, transform_rows[_i].expect.y, TOL);
}
END_TEST

static const struct
{
  PlSide side;
  guint rotation;
  gboolean mirrored;
  PlSide expect;
} side_rows[] = {
  { PL_SIDE_EAST, 0, FALSE, PL_SIDE_EAST },
  { PL_SIDE_EAST, 1, FALSE, PL_SIDE_SOUTH },
  { PL_SIDE_NORTH, 1, FALSE, PL_SIDE_EAST },
  { PL_SIDE_EAST, 0, TRUE, PL_SIDE_WEST },
  { PL_SIDE_NORTH, 0, TRUE, PL_SIDE_NORTH },  /* a vertical side keeps its face */
  { PL_SIDE_WEST, 3, TRUE, PL_SIDE_NORTH },   /* west -> east -> three turns */
  { PL_SIDE_SOUTH, 2, FALSE, PL_SIDE_NORTH },
};

START_TEST (test_transform_side)
{
  ck_assert_int_eq (pl_geometry_transform_side (side_rows[_i].side, side_rows[_i].rotation,
                                                side_rows[_i].mirrored),
                    side_rows[_i].expect);
}
END_TEST

/* Every placeable type, every orientation: the geometry module and the
 * document agree on where every port is and which way it faces, and the
 * port lies on or inside the part's box. */
START_TEST (test_ports_agree_with_document)
{
  const PlPartType *type = pl_part_type_get_placeable (_i);
  g_autoptr (PlDocument) doc = pl_document_new ();

  apply_ok (doc, pl_command_new_add_part (type->key, NULL, 35, -15));
  for (guint o = 0; o < 8; o++)
    {
      const PlPart *part;
      PlRect box;

      apply_ok (doc, pl_command_new_set_orientation ("p1", o % 4, o >= 4));
      part = pl_document_find_part (doc, "p1");
      pl_geometry_part_bounds (part, &box);
      for (guint k = 0; k < type->n_ports; k++)
        {
          const PlPortSpec *port = &type->ports[k];
          PlPoint mine, theirs;

          pl_geometry_transform_point (35, -15, o % 4, o >= 4,
                                       (PlPoint) { port->x, port->y }, &mine);
          ck_assert (pl_part_get_port_position (part, port->key, &theirs));
          ck_assert_double_eq (mine.x, theirs.x);
          ck_assert_double_eq (mine.y, theirs.y);
          ck_assert_int_eq (pl_geometry_transform_side (port->side, o % 4, o >= 4),
                            pl_part_get_port_side (part, port->key));
          ck_assert (pl_rect_contains_point (&box, mine));
        }
    }
}
END_TEST

START_TEST (test_bounds)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  PlRect b;

  /* A hose is 60 x 16 mm (half sizes 30 x 8); turned once it stands up. */
  apply_ok (doc, pl_command_new_add_part_full ("hose", NULL, NULL, 100, 50, 1, TRUE));
  pl_geometry_part_bounds (pl_document_find_part (doc, "p1"), &b);
  ck_assert_double_eq_tol (b.x0, 92, TOL);
  ck_assert_double_eq_tol (b.x1, 108, TOL);
  ck_assert_double_eq_tol (b.y0, 20, TOL);
  ck_assert_double_eq_tol (b.y1, 80, TOL);
  ck_assert (pl_geometry_document_bounds (doc, &b));
  ck_assert_double_eq_tol (b.y1, 80, TOL);
  {
    g_autoptr (PlDocument) empty = pl_document_new ();

    ck_assert (!pl_geometry_document_bounds (empty, &b));
  }
}
END_TEST

/* --- distances and snapping --- */

static const struct
{
  PlPoint p, a, b;
  double expect;
} distance_rows[] = {
  { { 3, 4 }, { 0, 0 }, { 0, 0 }, 5 },          /* a point segment: 3-4-5 */
  { { 5, 3 }, { 0, 0 }, { 10, 0 }, 3 },         /* over the middle */
  { { -3, 4 }, { 0, 0 }, { 10, 0 }, 5 },        /* beyond end a */
  { { 13, -4 }, { 0, 0 }, { 10, 0 }, 5 },       /* beyond end b */
  { { 1, 1 }, { 0, 0 }, { 2, 2 }, 0 },          /* on a diagonal */
  { { 0, 2 }, { 0, 0 }, { 2, 2 }, G_SQRT2 },    /* off a diagonal */
};

START_TEST (test_point_segment_distance)
{
  ck_assert_double_eq_tol (pl_geometry_point_segment_distance (distance_rows[_i].p,
                                                               distance_rows[_i].a,
                                                               distance_rows[_i].b),
                           distance_rows[_i].expect, TOL);
}
END_TEST

static const struct
{
  PlPoint p;
  double grid;
  PlPoint expect;
} snap_rows[] = {
  { { 2.4, 2.6 }, 5, { 0, 5 } },
  { { 2.5, -2.5 }, 5, { 5, 0 } },         /* ties go up whatever the sign */
  { { -7.5, 7.5 }, 5, { -5, 10 } },
  { { -0.1, -2.4 }, 5, { 0, 0 } },        /* no -0 */
  { { 123.456, -98.7 }, 10, { 120, -100 } },
  { { 1.26, 0.74 }, 0.5, { 1.5, 0.5 } },
  { { 3.3, 4.4 }, 0, { 3.3, 4.4 } },      /* no grid: unchanged */
  { { 3.3, 4.4 }, -5, { 3.3, 4.4 } },
  { { 3.3, 4.4 }, NAN, { 3.3, 4.4 } },
};

START_TEST (test_snap)
{
  PlPoint out;

  pl_geometry_snap (snap_rows[_i].p, snap_rows[_i].grid, &out);
  ck_assert_double_eq_tol (out.x, snap_rows[_i].expect.x, TOL);
  ck_assert_double_eq_tol (out.y, snap_rows[_i].expect.y, TOL);
  ck_assert (!signbit (out.x) || out.x != 0.0);
  ck_assert (!signbit (out.y) || out.y != 0.0);
}
END_TEST

/* --- routes --- */

/* The properties every route must have (see pl-geometry.h). */
static void
check_route (GArray *r, PlPoint a, PlSide sa, PlPoint b, PlSide sb, const PlPoint *bends,
             guint n_bends)
{
  double ax, ay, bx, by;
  guint next_bend = 0;

  pl_geometry_side_vector (sa, &ax, &ay);
  pl_geometry_side_vector (sb, &bx, &by);
  ck_assert_uint_ge (r->len, 2);
  ck_assert (g_array_index (r, PlPoint, 0).x == a.x && g_array_index (r, PlPoint, 0).y == a.y);
  ck_assert (g_array_index (r, PlPoint, r->len - 1).x == b.x
             && g_array_index (r, PlPoint, r->len - 1).y == b.y);
  for (guint k = 0; k + 1 < r->len; k++)
    {
      PlPoint p = g_array_index (r, PlPoint, k), q = g_array_index (r, PlPoint, k + 1);
      double dx = q.x - p.x, dy = q.y - p.y;

      /* Orthogonal and never empty. */
      ck_assert_msg ((dx == 0.0) != (dy == 0.0), "segment %u (%g,%g)-(%g,%g) not orthogonal",
                     k, p.x, p.y, q.x, q.y);
      if (k == 0)
        ck_assert_msg (dx * ax + dy * ay > 0.0, "does not leave along its side");
      if (k + 2 == r->len)
        ck_assert_msg (-(dx * bx + dy * by) > 0.0, "does not enter against its side");
      if (k > 0)
        {
          PlPoint o = g_array_index (r, PlPoint, k - 1);
          double ox = p.x - o.x, oy = p.y - o.y;

          /* No point in the middle of a straight run. */
          ck_assert (!(ox * dy - oy * dx == 0.0 && ox * dx + oy * dy > 0.0));
        }
      /* Bends are passed in order (as a vertex or on a segment). */
      while (next_bend < n_bends
             && pl_geometry_point_segment_distance (bends[next_bend], p, q) == 0.0)
        next_bend++;
    }
  ck_assert_uint_eq (next_bend, n_bends);
}

/* All 16 pairs of sides, b placed on a 9 x 9 grid of offsets around a,
 * with no bends and with two. */
START_TEST (test_route_properties)
{
  PlSide sa = (PlSide) (_i / 4), sb = (PlSide) (_i % 4);
  g_autoptr (GArray) r = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  PlPoint a = { 10, 20 };

  for (int i = -4; i <= 4; i++)
    for (int j = -4; j <= 4; j++)
      {
        PlPoint b = { a.x + 15.0 * i, a.y + 15.0 * j };
        PlPoint bends[2] = { { a.x + 40, a.y - 30 }, { b.x - 20, b.y + 25 } };

        if (i == 0 && j == 0)
          continue;
        pl_geometry_route (a, sa, b, sb, NULL, 0, r);
        check_route (r, a, sa, b, sb, NULL, 0);
        pl_geometry_route (a, sa, b, sb, bends, 2, r);
        ck_assert_uint_ge (r->len, 4);
        /* The bend route passes its bends; its end segments are the stubs
         * (or longer runs in the same direction). */
        {
          guint next = 0;

          for (guint k = 0; k + 1 < r->len; k++)
            while (next < 2
                   && pl_geometry_point_segment_distance (bends[next],
                                                          g_array_index (r, PlPoint, k),
                                                          g_array_index (r, PlPoint, k + 1))
                      == 0.0)
              next++;
          ck_assert_uint_eq (next, 2);
          for (guint k = 0; k + 1 < r->len; k++)
            {
              PlPoint p = g_array_index (r, PlPoint, k), q = g_array_index (r, PlPoint, k + 1);

              ck_assert ((q.x - p.x == 0.0) || (q.y - p.y == 0.0));
            }
        }
      }
}
END_TEST

/* Exact shapes, worked by hand with 5 mm stubs. */
static const struct
{
  PlPoint a;
  PlSide sa;
  PlPoint b;
  PlSide sb;
  guint n;
  PlPoint expect[6];
} shape_rows[] = {
  /* Facing ports on one line: one straight segment. */
  { { 0, 0 }, PL_SIDE_EAST, { 100, 0 }, PL_SIDE_WEST, 2, { { 0, 0 }, { 100, 0 } } },
  /* Facing, offset: a Z through the middle of the stubs' ends. */
  { { 0, 0 }, PL_SIDE_EAST, { 100, 40 }, PL_SIDE_WEST, 4,
    { { 0, 0 }, { 50, 0 }, { 50, 40 }, { 100, 40 } } },
  /* East into a north-facing port below and right: one L. */
  { { 0, 0 }, PL_SIDE_EAST, { 50, 50 }, PL_SIDE_NORTH, 3, { { 0, 0 }, { 50, 0 }, { 50, 50 } } },
  /* Both facing east, b above: a U round the farther end (b's stub). */
  { { 0, 0 }, PL_SIDE_EAST, { 40, -30 }, PL_SIDE_EAST, 4,
    { { 0, 0 }, { 45, 0 }, { 45, -30 }, { 40, -30 } } },
  /* South out, north in, straight below: a line. */
  { { 0, 0 }, PL_SIDE_SOUTH, { 0, 60 }, PL_SIDE_NORTH, 2, { { 0, 0 }, { 0, 60 } } },
  /* Touching ports (a pump's outlet on a hose's end): one empty-free line. */
  { { 20, 0 }, PL_SIDE_EAST, { 20, 0 }, PL_SIDE_WEST, 1, { { 20, 0 } } },
};

START_TEST (test_route_shapes)
{
  g_autoptr (GArray) r = g_array_new (FALSE, FALSE, sizeof (PlPoint));

  pl_geometry_route (shape_rows[_i].a, shape_rows[_i].sa, shape_rows[_i].b, shape_rows[_i].sb,
                     NULL, 0, r);
  ck_assert_uint_eq (r->len, shape_rows[_i].n);
  for (guint k = 0; k < r->len; k++)
    {
      ck_assert_double_eq (g_array_index (r, PlPoint, k).x, shape_rows[_i].expect[k].x);
      ck_assert_double_eq (g_array_index (r, PlPoint, k).y, shape_rows[_i].expect[k].y);
    }
}
END_TEST

START_TEST (test_route_bend_is_a_corner)
{
  g_autoptr (GArray) r = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  PlPoint bend = { 60, -40 };

  /* East out of (0, 0), through (60, -40), into a west port at (120, 0):
   * on along the heading to x = 60, up to the bend, on to x = 110 (half
   * way is not needed: the heading after the bend is north, so the route
   * turns east at the bend's height and comes down to b's stub). */
  pl_geometry_route ((PlPoint) { 0, 0 }, PL_SIDE_EAST, (PlPoint) { 120, 0 }, PL_SIDE_WEST,
                     &bend, 1, r);
  check_route (r, (PlPoint) { 0, 0 }, PL_SIDE_EAST, (PlPoint) { 120, 0 }, PL_SIDE_WEST,
               &bend, 1);
  ck_assert_double_eq (g_array_index (r, PlPoint, 1).x, 60);
  ck_assert_double_eq (g_array_index (r, PlPoint, 1).y, 0);
  ck_assert_double_eq (g_array_index (r, PlPoint, 2).x, 60);
  ck_assert_double_eq (g_array_index (r, PlPoint, 2).y, -40);
}
END_TEST

/* A wire stays attached when either part moves or turns. */
START_TEST (test_route_follows_parts)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (GArray) r = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  const char *ids[] = { "p1" };
  const PlPoint bend = { 70, 40 };

  apply_ok (doc, pl_command_new_add_part ("pump", NULL, 0, 0));
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 140, 80));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p1", "out", "p2", "in", &bend, 1));
  for (guint step = 0; step < 3; step++)
    {
      const PlPart *p1 = pl_document_find_part (doc, "p1");
      const PlPart *p2 = pl_document_find_part (doc, "p2");
      PlPoint a, b;

      pl_part_get_port_position (p1, "out", &a);
      pl_part_get_port_position (p2, "in", &b);
      ck_assert (pl_geometry_route_wire (doc, pl_document_find_wire (doc, "w1"), r));
      check_route (r, a, pl_part_get_port_side (p1, "out"), b,
                   pl_part_get_port_side (p2, "in"), &bend, 1);
      if (step == 0)
        apply_ok (doc, pl_command_new_move (ids, 1, -35, 25));
      else
        apply_ok (doc, pl_command_new_rotate ("p2", 1));
    }
}
END_TEST

/* --- hit-testing --- */

/* p1 pump at (0, 0): box -20..20 x -20..20, port "out" (20, 0).
 * p2 hose at (60, 0): box 30..90 x -8..8, ports (30, 0), (90, 0).
 * p3 gauge at (10, 10) on top of the pump: box -5..25 x -10..30,
 *    port (10, 30).
 * w1 pump out -> hose a (facing on one line: the segment (20, 0)-(30, 0)),
 * w2 hose b (90, 0) -> gauge p (10, 30) via a bend at (100, 60). */
static PlDocument *
hit_layout (void)
{
  PlDocument *doc = pl_document_new ();
  const PlPoint bend = { 100, 60 };

  apply_ok (doc, pl_command_new_add_part ("pump", NULL, 0, 0));
  apply_ok (doc, pl_command_new_add_part ("hose", NULL, 60, 0));
  apply_ok (doc, pl_command_new_add_part ("gauge", NULL, 10, 10));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p1", "out", "p2", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p2", "b", "p3", "p", &bend, 1));
  apply_ok (doc, pl_command_new_add_note (NULL, 200, 200, "Note"));
  return doc;
}

/* Tolerances are 6 screen px: 1.5875 mm at zoom 1, 3.175 mm at zoom 0.5. */
static const struct
{
  PlPoint p;
  double zoom;
  const char *part, *port_part, *port, *wire;
} hit_rows[] = {
  { { -10, -10 }, 1.0, "p1", NULL, NULL, NULL },
  { { 15, 15 }, 1.0, "p3", NULL, NULL, NULL },             /* gauge is on top */
  { { 60, 0 }, 1.0, "p2", NULL, NULL, NULL },
  { { 60, 10 }, 1.0, NULL, NULL, NULL, NULL },             /* 2 mm off the hose */
  { { 60, 10 }, 0.5, "p2", NULL, NULL, NULL },             /* ... within 3.2 mm */
  { { 20.5, 0.5 }, 1.0, "p3", "p1", "out", "w1" },
  { { 89, 1 }, 1.0, "p2", "p2", "b", "w2" },
  { { 100, 30 }, 1.0, NULL, NULL, NULL, "w2" },            /* on the bend's leg */
  { { 102, 30 }, 1.0, NULL, NULL, NULL, NULL },            /* 2 mm off it */
  { { 102, 30 }, 0.5, NULL, NULL, NULL, "w2" },
  { { 10, 31 }, 1.0, "p3", "p3", "p", "w2" },              /* gauge's port */
  { { 500, 500 }, 0.1, NULL, NULL, NULL, NULL },
};

START_TEST (test_hits)
{
  g_autoptr (PlDocument) doc = hit_layout ();
  PlViewport vp;
  double tol;
  const PlPart *part, *port_part = NULL;
  const char *port = NULL;
  const PlWire *wire;

  pl_viewport_init (&vp, 800, 600);
  vp.zoom = hit_rows[_i].zoom;
  tol = pl_viewport_world_tolerance (&vp, 6.0);
  part = pl_geometry_part_at (doc, hit_rows[_i].p, tol);
  if (hit_rows[_i].part == NULL)
    ck_assert_ptr_null (part);
  else
    ck_assert_str_eq (pl_part_get_id (part), hit_rows[_i].part);
  if (hit_rows[_i].port == NULL)
    ck_assert (!pl_geometry_port_at (doc, hit_rows[_i].p, tol, &port_part, &port));
  else
    {
      ck_assert (pl_geometry_port_at (doc, hit_rows[_i].p, tol, &port_part, &port));
      ck_assert_str_eq (pl_part_get_id (port_part), hit_rows[_i].port_part);
      ck_assert_str_eq (port, hit_rows[_i].port);
    }
  wire = pl_geometry_wire_at (doc, hit_rows[_i].p, tol);
  if (hit_rows[_i].wire == NULL)
    ck_assert_ptr_null (wire);
  else
    ck_assert_str_eq (pl_wire_get_id (wire), hit_rows[_i].wire);
}
END_TEST

static const struct
{
  PlRect rect;
  const char *expect;   /* ids joined by spaces */
} band_rows[] = {
  { { -100, -100, 300, 300 }, "p1 p2 p3 w1 w2 n1" },
  { { -25, -25, 95, 25 }, "p1 p2 w1" },        /* the gauge's box reaches y = 30 */
  { { -25, -25, 95, 35 }, "p1 p2 p3 w1" },     /* w2 goes out to x = 100 */
  { { 25, -10, 95, 10 }, "p2" },               /* w1 starts at x = 20 */
  { { 150, 150, 250, 250 }, "n1" },
  { { 1000, 1000, 1001, 1001 }, "" },
};

START_TEST (test_rubber_band)
{
  g_autoptr (PlDocument) doc = hit_layout ();
  g_autoptr (GPtrArray) ids = g_ptr_array_new ();
  g_autofree char *joined = NULL;
  guint n;

  n = pl_geometry_items_in_rect (doc, &band_rows[_i].rect, ids);
  ck_assert_uint_eq (n, ids->len);
  g_ptr_array_add (ids, NULL);
  joined = g_strjoinv (" ", (char **) ids->pdata);
  ck_assert_str_eq (joined, band_rows[_i].expect);
}
END_TEST

static Suite *
geometry_suite (void)
{
  Suite *s = suite_create ("geometry");
  TCase *tc = tcase_create ("core");

  tcase_add_loop_test (tc, test_transform_point, 0, G_N_ELEMENTS (transform_rows));
  tcase_add_loop_test (tc, test_transform_side, 0, G_N_ELEMENTS (side_rows));
  tcase_add_loop_test (tc, test_ports_agree_with_document, 0, pl_part_type_get_n_placeable ());
  tcase_add_test (tc, test_bounds);
  tcase_add_loop_test (tc, test_point_segment_distance, 0, G_N_ELEMENTS (distance_rows));
  tcase_add_loop_test (tc, test_snap, 0, G_N_ELEMENTS (snap_rows));
  tcase_add_loop_test (tc, test_route_properties, 0, 16);
  tcase_add_loop_test (tc, test_route_shapes, 0, G_N_ELEMENTS (shape_rows));
  tcase_add_test (tc, test_route_bend_is_a_corner);
  tcase_add_test (tc, test_route_follows_parts);
  tcase_add_loop_test (tc, test_hits, 0, G_N_ELEMENTS (hit_rows));
  tcase_add_loop_test (tc, test_rubber_band, 0, G_N_ELEMENTS (band_rows));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (geometry_suite ());
}
