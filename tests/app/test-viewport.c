/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Viewport: world <-> screen transforms, zoom about the pointer, limits,
 * fit to a rectangle, panning, grid spacing; bad input leaves it unchanged.
 *
 * References: the scale of zoom 1 is the CSS reference pixel, 96 px per
 * inch (W3C CSS Values and Units Level 3, sec. 5.2), with 25.4 mm per inch
 * exactly (NIST SP 811, B.8); the rest follows from the map
 * screen = (world - origin) * scale, worked by hand in each table row.
 */

#include "config.h"

#include <math.h>

#include "pl-check.h"
#include "pl-viewport.h"

/* Transforms are a multiply and an add on numbers below 1e4: 1e-9 is a
 * million times the rounding error and far below a pixel. */
#define TOL 1e-9

START_TEST (test_scale_is_css_pixel)
{
  PlViewport vp;

  pl_viewport_init (&vp, 800, 600);
  /* One inch (25.4 mm) is 96 px at zoom 1 (CSS Values 3, sec. 5.2). */
  ck_assert_double_eq_tol (25.4 * pl_viewport_get_scale (&vp), 96.0, TOL);
  ck_assert_double_eq (vp.zoom, 1.0);
  /* The world origin is at the centre of the area. */
  {
    PlPoint s;

    pl_viewport_world_to_screen (&vp, (PlPoint) { 0, 0 }, &s);
    ck_assert_double_eq_tol (s.x, 400.0, TOL);
    ck_assert_double_eq_tol (s.y, 300.0, TOL);
  }
}
END_TEST

/* Round trips world -> screen -> world at assorted zooms and origins, and
 * one hand-worked value per row: a world point 10 mm right of and 20 mm
 * below the origin lands at (10, 20) * scale px. */
static const struct
{
  double zoom, ox, oy;
} transform_rows[] = {
  { 1.0, 0.0, 0.0 },
  { 0.1, -500.0, 250.0 },
  { 8.0, 1234.5, -678.25 },
  { 2.5, -0.125, 0.5 },
};

START_TEST (test_transform_round_trip)
{
  PlViewport vp = { transform_rows[_i].zoom, transform_rows[_i].ox, transform_rows[_i].oy,
                    1600, 1000 };
  double scale = transform_rows[_i].zoom * 96.0 / 25.4;
  static const PlPoint pts[] = { { 0, 0 }, { 10, 20 }, { -333.3, 77.7 }, { 1e4, -1e4 } };

  for (guint k = 0; k < G_N_ELEMENTS (pts); k++)
    {
      PlPoint s, w;

      pl_viewport_world_to_screen (&vp, pts[k], &s);
      ck_assert_double_eq_tol (s.x, (pts[k].x - vp.origin_x) * scale, 1e-7);
      ck_assert_double_eq_tol (s.y, (pts[k].y - vp.origin_y) * scale, 1e-7);
      pl_viewport_screen_to_world (&vp, s, &w);
      ck_assert_double_eq_tol (w.x, pts[k].x, 1e-8);
      ck_assert_double_eq_tol (w.y, pts[k].y, 1e-8);
    }
  /* A tolerance of 6 px is 6 / scale mm. */
  ck_assert_double_eq_tol (pl_viewport_world_tolerance (&vp, 6.0), 6.0 / scale, TOL);
}
END_TEST

/* Zoom about a screen point: the world point under it stays put, and the
 * zoom is clamped to 0.1 .. 8. */
static const struct
{
  double start, factor, sx, sy, expect;
} zoom_rows[] = {
  { 1.0, 2.0, 400, 300, 2.0 },
  { 1.0, 0.5, 0, 0, 0.5 },
  { 1.0, 1.25, 1599, 999, 1.25 },
  { 4.0, 4.0, 123, 456, 8.0 },     /* clamped at the top */
  { 0.2, 0.1, 800, 10, 0.1 },      /* clamped at the bottom */
  { 0.5, 1.1, -50, 2000, 0.55 },   /* a pointer outside the area still works */
};

START_TEST (test_zoom_keeps_pointer)
{
  PlViewport vp;
  PlPoint before, after_screen;

  pl_viewport_init (&vp, 1600, 1000);
  pl_viewport_pan (&vp, 37, -81);
  vp.zoom = zoom_rows[_i].start;
  pl_viewport_screen_to_world (&vp, (PlPoint) { zoom_rows[_i].sx, zoom_rows[_i].sy }, &before);
  ck_assert (pl_viewport_zoom_at (&vp, zoom_rows[_i].factor, zoom_rows[_i].sx,
                                  zoom_rows[_i].sy));
  ck_assert_double_eq_tol (vp.zoom, zoom_rows[_i].expect, TOL);
  pl_viewport_world_to_screen (&vp, before, &after_screen);
  ck_assert_double_eq_tol (after_screen.x, zoom_rows[_i].sx, 1e-7);
  ck_assert_double_eq_tol (after_screen.y, zoom_rows[_i].sy, 1e-7);
}
END_TEST

START_TEST (test_zoom_limits)
{
  PlViewport vp, copy;

  pl_viewport_init (&vp, 640, 480);
  for (int i = 0; i < 100; i++)
    pl_viewport_zoom_at (&vp, 1.5, 10, 10);
  ck_assert_double_eq (vp.zoom, PL_VIEWPORT_ZOOM_MAX);
  /* At the limit a further zoom in changes nothing and says so. */
  copy = vp;
  ck_assert (!pl_viewport_zoom_at (&vp, 2.0, 10, 10));
  ck_assert_mem_eq (&vp, &copy, sizeof vp);
  for (int i = 0; i < 100; i++)
    pl_viewport_zoom_at (&vp, 0.5, 10, 10);
  ck_assert_double_eq (vp.zoom, PL_VIEWPORT_ZOOM_MIN);
}
END_TEST

START_TEST (test_bad_input_changes_nothing)
{
  PlViewport vp, copy;
  PlRect nan_box = { NAN, 0, 10, 10 }, box = { 0, 0, 10, 10 };

  pl_viewport_init (&vp, 640, 480);
  copy = vp;
  ck_assert (!pl_viewport_zoom_at (&vp, NAN, 0, 0));
  ck_assert (!pl_viewport_zoom_at (&vp, -2.0, 0, 0));
  ck_assert (!pl_viewport_zoom_at (&vp, 0.0, 0, 0));
  ck_assert (!pl_viewport_zoom_at (&vp, 2.0, INFINITY, 0));
  ck_assert (!pl_viewport_set_zoom_at (&vp, INFINITY, 0, 0));
  ck_assert (!pl_viewport_pan (&vp, NAN, 0));
  ck_assert (!pl_viewport_pan (&vp, 0, -INFINITY));
  ck_assert (!pl_viewport_fit (&vp, &nan_box, 10));
  ck_assert (!pl_viewport_fit (&vp, &box, NAN));
  ck_assert (!pl_viewport_set_size (&vp, -1, 10));
  ck_assert (!pl_viewport_set_size (&vp, 10, NAN));
  ck_assert_mem_eq (&vp, &copy, sizeof vp);
  /* An area of no size cannot be fitted into. */
  pl_viewport_init (&vp, 0, 0);
  copy = vp;
  ck_assert (!pl_viewport_fit (&vp, &box, 0));
  ck_assert_mem_eq (&vp, &copy, sizeof vp);
}
END_TEST

/* Fit: the box ends up centred and fills the area less the margin in one
 * direction (the tighter one) unless the zoom limits stop it. */
static const struct
{
  PlRect box;
  double margin, expect_zoom;   /* expect_zoom < 0: computed from the box */
} fit_rows[] = {
  { { 0, 0, 400, 200 }, 20, -1 },
  { { -1000, -50, 1000, 50 }, 0, -1 },
  { { -10, -500, 30, 300 }, 50, -1 },
  { { 5, 5, 6, 6 }, 20, PL_VIEWPORT_ZOOM_MAX },        /* tiny: clamped */
  { { -1e6, -1e6, 1e6, 1e6 }, 20, PL_VIEWPORT_ZOOM_MIN },  /* huge: clamped */
  { { 50, 70, 50, 70 }, 20, 1.0 },                      /* a point: zoom kept */
  { { 0, 10, 300, 10 }, 20, -1 },                       /* a horizontal line */
};

START_TEST (test_fit)
{
  PlViewport vp;
  const PlRect *box = &fit_rows[_i].box;
  double w = 1600, h = 1000, m = fit_rows[_i].margin, expect = fit_rows[_i].expect_zoom;
  PlPoint centre;

  pl_viewport_init (&vp, w, h);
  ck_assert (pl_viewport_fit (&vp, box, m));
  if (expect < 0)
    {
      double bw = box->x1 - box->x0, bh = box->y1 - box->y0;

      expect = bh == 0 ? (w - 2 * m) / bw : MIN ((w - 2 * m) / bw, (h - 2 * m) / bh);
      expect /= 96.0 / 25.4;
    }
  ck_assert_double_eq_tol (vp.zoom, expect, 1e-12);
  pl_viewport_world_to_screen (&vp, (PlPoint) { 0.5 * (box->x0 + box->x1),
                                                0.5 * (box->y0 + box->y1) }, &centre);
  ck_assert_double_eq_tol (centre.x, 0.5 * w, 1e-6);
  ck_assert_double_eq_tol (centre.y, 0.5 * h, 1e-6);
  /* Unless clamped at the bottom, the whole box is visible within the
   * margin. */
  if (vp.zoom > PL_VIEWPORT_ZOOM_MIN)
    {
      PlPoint a, b;

      pl_viewport_world_to_screen (&vp, (PlPoint) { box->x0, box->y0 }, &a);
      pl_viewport_world_to_screen (&vp, (PlPoint) { box->x1, box->y1 }, &b);
      ck_assert (a.x >= m - 1e-6 && a.y >= m - 1e-6);
      ck_assert (b.x <= w - m + 1e-6 && b.y <= h - m + 1e-6);
    }
}
END_TEST

START_TEST (test_pan_and_size)
{
  PlViewport vp;
  PlPoint w, s, centre_before, centre_after;
  PlRect visible;

  pl_viewport_init (&vp, 800, 600);
  pl_viewport_zoom_at (&vp, 2.0, 100, 100);
  pl_viewport_screen_to_world (&vp, (PlPoint) { 250, 250 }, &w);
  /* Dragging 30 px right and 12 px up carries the drawing along. */
  ck_assert (pl_viewport_pan (&vp, 30, -12));
  pl_viewport_world_to_screen (&vp, w, &s);
  ck_assert_double_eq_tol (s.x, 280.0, 1e-9);
  ck_assert_double_eq_tol (s.y, 238.0, 1e-9);
  /* A resize keeps the world point at the centre. */
  pl_viewport_screen_to_world (&vp, (PlPoint) { 400, 300 }, &centre_before);
  ck_assert (pl_viewport_set_size (&vp, 1000, 200));
  pl_viewport_screen_to_world (&vp, (PlPoint) { 500, 100 }, &centre_after);
  ck_assert_double_eq_tol (centre_after.x, centre_before.x, 1e-9);
  ck_assert_double_eq_tol (centre_after.y, centre_before.y, 1e-9);
  /* The visible rectangle is the area over the scale. */
  pl_viewport_get_visible (&vp, &visible);
  ck_assert_double_eq_tol (visible.x1 - visible.x0, 1000 / pl_viewport_get_scale (&vp), 1e-9);
  ck_assert_double_eq_tol (visible.y1 - visible.y0, 200 / pl_viewport_get_scale (&vp), 1e-9);
}
END_TEST

/* Grid spacing: the finest of 5, 10, 20, 50, ... mm at least min_px apart.
 * Worked by hand with scale = zoom * 3.7795 px/mm. */
static const struct
{
  double zoom, min_px, minor, major;
} grid_rows[] = {
  { 1.0, 8, 5, 50 },       /* 5 mm = 18.9 px */
  { 0.5, 8, 5, 50 },       /* 5 mm = 9.45 px */
  { 0.3, 8, 10, 50 },      /* 5 mm = 5.67 px, 10 mm = 11.3 px */
  { 0.2, 8, 20, 100 },     /* 10 mm = 7.56 px, 20 mm = 15.1 px */
  { 0.1, 8, 50, 500 },     /* 20 mm = 7.56 px, 50 mm = 18.9 px */
  { 0.1, 40, 200, 1000 },  /* 100 mm = 37.8 px, 200 mm = 75.6 px */
  { 8.0, 8, 5, 50 },       /* never finer than the snap grid */
  { 1.0, 0, 5, 50 },       /* min_px <= 0 counts as 1 */
};

START_TEST (test_grid_spacing)
{
  PlViewport vp;
  double minor = 0, major = 0;

  pl_viewport_init (&vp, 100, 100);
  vp.zoom = grid_rows[_i].zoom;
  pl_viewport_grid_spacing (&vp, grid_rows[_i].min_px, &minor, &major);
  ck_assert_double_eq_tol (minor, grid_rows[_i].minor, 1e-9);
  ck_assert_double_eq_tol (major, grid_rows[_i].major, 1e-9);
  ck_assert (minor * pl_viewport_get_scale (&vp) >= MAX (grid_rows[_i].min_px, 1.0));
}
END_TEST

static Suite *
viewport_suite (void)
{
  Suite *s = suite_create ("viewport");
  TCase *tc = tcase_create ("core");

  tcase_add_test (tc, test_scale_is_css_pixel);
  tcase_add_loop_test (tc, test_transform_round_trip, 0, G_N_ELEMENTS (transform_rows));
  tcase_add_loop_test (tc, test_zoom_keeps_pointer, 0, G_N_ELEMENTS (zoom_rows));
  tcase_add_test (tc, test_zoom_limits);
  tcase_add_test (tc, test_bad_input_changes_nothing);
  tcase_add_loop_test (tc, test_fit, 0, G_N_ELEMENTS (fit_rows));
  tcase_add_test (tc, test_pan_and_size);
  tcase_add_loop_test (tc, test_grid_spacing, 0, G_N_ELEMENTS (grid_rows));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (viewport_suite ());
}
