/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Renderer: every part type in every orientation, in each style and at
 * 50 %, 100 % and 400 %, drawn to image surfaces without a cairo error,
 * with ink inside every part's box and nothing outside the drawing's reach
 * (a NaN or runaway coordinate would show there); the print style gives
 * only greys; stale results draw exactly what no results draw (plus the
 * mark); current results change the drawing; the colour ramp against the
 * published cividis table; palette contrast against WCAG 2.1.
 *
 * PNGs of each style and zoom are left under the build tree as artifacts
 * (tests/app/render-*.png) for people to look at.
 *
 * References: cividis entries from Nuñez, Anderton & Renslow, PLOS ONE
 * 13(7): e0199239 (2018), table as distributed with matplotlib
 * (_cm_listed.py); contrast ratio (L1 + 0.05) / (L2 + 0.05) and the 4.5:1
 * minimum for text from WCAG 2.1, SC 1.4.3 and its definition of relative
 * luminance.
 */

#include "config.h"

#include <math.h>
#include <string.h>

#include "pl-check.h"
#include "pl-command.h"
#include "pl-compile.h"
#include "pl-document.h"
#include "pl-geometry.h"
#include "pl-palette.h"
#include "pl-render.h"
#include "pl-render-private.h"
#include "pl-results.h"
#include "pl-viewport.h"

static void
apply_ok (PlDocument *doc, PlCommand *cmd)
{
  g_autoptr (GError) error = NULL;

  ck_assert_msg (pl_command_apply (cmd, doc, &error), "%s", error ? error->message : "");
  pl_command_unref (cmd);
}

/* A small working line (pump, hose, tee, two applicators, a gauge, a
 * pipe) above a grid of every placeable type (rows) in all eight
 * orientations (columns: four turns, then the same mirrored). */
static PlDocument *
gallery (void)
{
  PlDocument *doc = pl_document_new ();

  apply_ok (doc, pl_command_new_add_part ("pump", NULL, 0, -150));               /* p1 */
  apply_ok (doc, pl_command_new_add_part ("hose", NULL, 80, -150));              /* p2 */
  apply_ok (doc, pl_command_new_add_part ("tee", NULL, 170, -150));              /* p3 */
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 250, -110));       /* p4 */
  apply_ok (doc, pl_command_new_add_part ("pipe", NULL, 230, -150));             /* p5 */
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 300, -110));       /* p6 */
  apply_ok (doc, pl_command_new_add_part ("gauge", NULL, 130, -200));            /* p7 */
  apply_ok (doc, pl_command_new_add_wire (NULL, "p1", "out", "p2", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p2", "b", "p3", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p3", "branch", "p4", "in", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p3", "b", "p5", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p5", "b", "p6", "in", NULL, 0));
  apply_ok (doc, pl_command_new_add_wire (NULL, "p7", "p", "p3", "a", NULL, 0));
  apply_ok (doc, pl_command_new_add_note (NULL, 0, -230, "Line 2 — Grundierung · 底漆"));
  for (guint t = 0; t < pl_part_type_get_n_placeable (); t++)
    for (guint o = 0; o < 8; o++)
      apply_ok (doc, pl_command_new_add_part_full (pl_part_type_get_placeable (t)->key, NULL,
                                                   NULL, 90.0 * o, 90.0 * t, o % 4, o >= 4));
  return doc;
}

static const PlRenderStyle styles[] = {
  PL_RENDER_STYLE_LIGHT, PL_RENDER_STYLE_DARK, PL_RENDER_STYLE_PRINT,
};
static const char *const style_names[] = { "light", "dark", "print" };
static const double zooms[] = { 0.5, 1.0, 4.0 };

static char *
artifact_path (const char *name)
{
  const char *root = g_getenv ("PRESSLINE_BUILD_ROOT");
  g_autofree char *dir = g_build_filename (root != NULL ? root : ".", "tests", "app", NULL);

  g_mkdir_with_parents (dir, 0755);
  return g_build_filename (dir, name, NULL);
}

static guint32
pixel (cairo_surface_t *s, int x, int y)
{
  const unsigned char *data = cairo_image_surface_get_data (s);

  return *(const guint32 *) (const void *) (data + y * cairo_image_surface_get_stride (s)
                                            + 4 * x);
}

/* How many pixels of a screen rectangle differ from the sheet colour. */
static guint
inked_pixels (cairo_surface_t *s, int x0, int y0, int x1, int y1, guint32 sheet)
{
  guint n = 0;

  for (int y = MAX (y0, 0); y < MIN (y1, cairo_image_surface_get_height (s)); y++)
    for (int x = MAX (x0, 0); x < MIN (x1, cairo_image_surface_get_width (s)); x++)
      n += pixel (s, x, y) != sheet;
  return n;
}

/* Styles x zooms: draws the gallery, checks ink in every visible part's
 * box, and that the recorded ink stays within reach of the drawing. */
START_TEST (test_gallery)
{
  PlRenderStyle style = styles[_i / 3];
  double zoom = zooms[_i % 3];
  g_autoptr (PlDocument) doc = gallery ();
  PlViewport vp;
  PlRenderOptions opts;
  PlRect bounds;
  cairo_surface_t *surface, *rec;
  cairo_t *cr;
  guint32 sheet;
  g_autofree char *name = NULL, *path = NULL;
  double ix, iy, iw, ih;
  guint checked = 0;

  pl_viewport_init (&vp, 1400, 1000);
  ck_assert (pl_geometry_document_bounds (doc, &bounds));
  /* The gallery's top left corner (the first part sits at 0, 0). */
  vp.zoom = zoom;
  vp.origin_x = -45;
  vp.origin_y = -45;
  pl_render_options_init (&opts);
  opts.viewport = &vp;
  opts.style = style;
  opts.show_ports = TRUE;

  surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 1400, 1000);
  cr = cairo_create (surface);
  ck_assert_int_eq (pl_render_document (cr, doc, NULL, &opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_flush (surface);
  ck_assert_int_eq (cairo_surface_status (surface), CAIRO_STATUS_SUCCESS);
  name = g_strdup_printf ("render-%s-%03d.png", style_names[_i / 3], (int) (zoom * 100));
  path = artifact_path (name);
  ck_assert_int_eq (cairo_surface_write_to_png (surface, path), CAIRO_STATUS_SUCCESS);

  /* The sheet's colour: a pixel no grid line or part touches is hard to
   * name in general, so take the premultiplied palette colour itself. */
  {
    const PlColor *bg = &pl_palette_get (style)->background;

    sheet = 0xff000000u | ((guint32) lround (bg->r * 255) << 16)
            | ((guint32) lround (bg->g * 255) << 8) | (guint32) lround (bg->b * 255);
  }
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      PlRect box;
      PlPoint a, b;

      pl_geometry_part_bounds (pl_document_get_part (doc, i), &box);
      pl_viewport_world_to_screen (&vp, (PlPoint) { box.x0, box.y0 }, &a);
      pl_viewport_world_to_screen (&vp, (PlPoint) { box.x1, box.y1 }, &b);
      if (a.x < 0 || a.y < 0 || b.x > 1400 || b.y > 1000)
        continue;
      checked++;
      /* A symbol covers at least a tenth of its box in any style (the
       * thinnest, a pipe, covers about a quarter). */
      ck_assert_msg (inked_pixels (surface, (int) a.x, (int) a.y, (int) b.x, (int) b.y, sheet)
                       >= 0.1 * (b.x - a.x) * (b.y - a.y) * 0.5,
                     "part %s drew almost nothing",
                     pl_part_get_id (pl_document_get_part (doc, i)));
    }
  /* Not a vacuous pass: the window shows 740 x 530 mm at 50 % (48
   * gallery places), 370 x 265 mm at 100 % (12), 93 x 66 mm at 400 % (1). */
  ck_assert_uint_ge (checked, zoom > 2 ? 1 : zoom > 0.7 ? 10 : 30);
  cairo_surface_destroy (surface);

  /* Recorded without grid or sheet, the ink lies within the drawing plus
   * the room labels take (30 mm each way is more than any label). */
  opts.viewport = NULL;
  opts.show_grid = FALSE;
  opts.paint_background = FALSE;
  rec = cairo_recording_surface_create (CAIRO_CONTENT_COLOR_ALPHA, NULL);
  cr = cairo_create (rec);
  cairo_scale (cr, zoom * PL_VIEWPORT_PX_PER_MM, zoom * PL_VIEWPORT_PX_PER_MM);
  ck_assert_int_eq (pl_render_document (cr, doc, NULL, &opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_recording_surface_ink_extents (rec, &ix, &iy, &iw, &ih);
  cairo_surface_destroy (rec);
  ck_assert (isfinite (ix) && isfinite (iy) && isfinite (iw) && isfinite (ih));
  {
    double s = zoom * PL_VIEWPORT_PX_PER_MM;

    ck_assert_double_ge (ix / s, bounds.x0 - 30);
    ck_assert_double_ge (iy / s, bounds.y0 - 30);
    ck_assert_double_le ((ix + iw) / s, bounds.x1 + 30);
    ck_assert_double_le ((iy + ih) / s, bounds.y1 + 30);
    ck_assert_double_gt (iw, 0);
  }
}
END_TEST

/* Renders doc at 100 % into a fresh 1200 x 800 image. */
static cairo_surface_t *
draw (PlDocument *doc, PlResults *results, PlRenderOptions *opts, PlViewport *vp)
{
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 1200, 800);
  cairo_t *cr = cairo_create (surface);
  PlRect bounds;

  pl_viewport_init (vp, 1200, 800);
  /* The working line only (the gallery lies below y = -90). */
  bounds = (PlRect) { -30, -240, 340, -85 };
  pl_viewport_fit (vp, &bounds, 60);
  opts->viewport = vp;
  ck_assert_int_eq (pl_render_document (cr, doc, results, opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_flush (surface);
  return surface;
}

static PlResults *
solve (PlDocument *doc)
{
  g_autoptr (PlCompiled) compiled = pl_compile (doc);

  return pl_results_solve_fast (compiled);
}

/* Current results colour the lines (some pixel is not grey in light);
 * the same in print is all greys. */
START_TEST (test_results_and_print_greys)
{
  g_autoptr (PlDocument) doc = gallery ();
  g_autoptr (PlResults) results = solve (doc);
  PlRenderOptions opts;
  PlViewport vp;
  cairo_surface_t *plain, *colored, *print;
  guint differ = 0, coloured_px = 0, non_grey = 0;
  g_autofree char *p1 = artifact_path ("render-results-light.png");
  g_autofree char *p2 = artifact_path ("render-results-print.png");
  g_autofree char *p3 = artifact_path ("render-results-dark.png");
  double lo, hi;

  ck_assert_uint_eq (pl_results_get_revision (results), pl_document_get_revision (doc));
  pl_render_options_init (&opts);
  opts.pressure_ports = (PlPortRef[]) { { "p5", "b" } };
  opts.n_pressure_ports = 1;
  ck_assert (pl_render_pressure_range (doc, results, &opts, &lo, &hi));
  ck_assert_double_gt (hi, lo);
  plain = draw (doc, NULL, &opts, &vp);
  colored = draw (doc, results, &opts, &vp);
  cairo_surface_write_to_png (colored, p1);
  for (int y = 0; y < 800; y++)
    for (int x = 0; x < 1200; x++)
      {
        guint32 a = pixel (plain, x, y), b = pixel (colored, x, y);
        int r = (b >> 16) & 0xff, bl = b & 0xff;

        differ += a != b;
        /* Cividis is blue to yellow: b far from r marks a ramp pixel. */
        coloured_px += abs (r - bl) > 60;
      }
  ck_assert_uint_gt (differ, 1000);
  ck_assert_uint_gt (coloured_px, 200);
  cairo_surface_destroy (plain);
  cairo_surface_destroy (colored);

  opts.style = PL_RENDER_STYLE_DARK;
  colored = draw (doc, results, &opts, &vp);
  cairo_surface_write_to_png (colored, p3);
  cairo_surface_destroy (colored);

  opts.style = PL_RENDER_STYLE_PRINT;
  print = draw (doc, results, &opts, &vp);
  cairo_surface_write_to_png (print, p2);
  for (int y = 0; y < 800; y++)
    for (int x = 0; x < 1200; x++)
      {
        guint32 v = pixel (print, x, y);

        non_grey += ((v >> 16) & 0xff) != (v & 0xff) || ((v >> 8) & 0xff) != (v & 0xff);
      }
  ck_assert_uint_eq (non_grey, 0);
  cairo_surface_destroy (print);
}
END_TEST

/* Stale results: after a parameter edit the old snapshot draws exactly
 * what no results draw, except in the corner that holds the stale mark. */
START_TEST (test_stale_never_mixed)
{
  g_autoptr (PlDocument) doc = gallery ();
  g_autoptr (PlResults) results = solve (doc);
  PlRenderOptions opts;
  PlViewport vp;
  cairo_surface_t *none, *stale;
  guint differ = 0, badge = 0;
  g_autofree char *path = artifact_path ("render-stale-light.png");

  apply_ok (doc, pl_command_new_set_number ("p2", "length", 25.0));
  ck_assert_uint_ne (pl_results_get_revision (results), pl_document_get_revision (doc));
  pl_render_options_init (&opts);
  opts.show_legend = FALSE;
  none = draw (doc, NULL, &opts, &vp);
  stale = draw (doc, results, &opts, &vp);
  cairo_surface_write_to_png (stale, path);
  for (int y = 0; y < 800; y++)
    for (int x = 0; x < 1200; x++)
      {
        gboolean d = pixel (none, x, y) != pixel (stale, x, y);

        if (x < 400 && y < 60)
          badge += d;
        else
          differ += d;
      }
  ck_assert_uint_eq (differ, 0);
  ck_assert_uint_gt (badge, 100);
  /* The caller's flag alone does the same for a current snapshot. */
  g_clear_pointer (&results, pl_results_unref);
  results = solve (doc);
  opts.results_stale = TRUE;
  cairo_surface_destroy (stale);
  stale = draw (doc, results, &opts, &vp);
  differ = 0;
  for (int y = 60; y < 800; y++)
    for (int x = 0; x < 1200; x++)
      differ += pixel (none, x, y) != pixel (stale, x, y);
  ck_assert_uint_eq (differ, 0);
  ck_assert (!pl_render_pressure_range (doc, results, &opts, NULL, NULL));
  cairo_surface_destroy (none);
  cairo_surface_destroy (stale);
}
END_TEST

START_TEST (test_bad_input)
{
  g_autoptr (PlDocument) doc = gallery ();
  PlRenderOptions opts;
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 64, 64);
  cairo_t *cr = cairo_create (surface);
  cairo_t *broken;

  pl_render_options_init (&opts);
  opts.style = PL_N_RENDER_STYLES;
  ck_assert_int_eq (pl_render_document (cr, doc, NULL, &opts), CAIRO_STATUS_INVALID_CONTENT);
  /* A context already in error is reported, not drawn on. */
  opts.style = PL_RENDER_STYLE_LIGHT;
  broken = cairo_create (surface);
  cairo_scale (broken, 0, 0);
  ck_assert_int_ne (pl_render_document (broken, doc, NULL, &opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (broken);
  /* A replay time with no cycle falls back to the steady pressures. */
  opts.replay_time = 0.123;
  ck_assert_int_eq (pl_render_document (cr, doc, NULL, &opts), CAIRO_STATUS_SUCCESS);
  /* A legend of an empty range or odd sizes draws without error. */
  pl_render_legend (cr, 0, 0, 50, 20, 0, 0, NULL, PL_RENDER_STYLE_DARK, FALSE);
  pl_render_legend (cr, 0, 0, -5, 20, 0, 1e5, NULL, PL_RENDER_STYLE_LIGHT, TRUE);
  pl_render_legend (cr, 0, 0, 50, 20, 0, 1e5, NULL, PL_N_RENDER_STYLES, FALSE);
  ck_assert_int_eq (cairo_status (cr), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
}
END_TEST

/* Every placeable type has an icon with ink; the pseudo types have none. */
START_TEST (test_icons)
{
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 48, 48);
  cairo_t *cr = cairo_create (surface);

  for (guint t = 0; t < pl_part_type_get_n_placeable (); t++)
    {
      cairo_save (cr);
      cairo_set_operator (cr, CAIRO_OPERATOR_CLEAR);
      cairo_paint (cr);
      cairo_restore (cr);
      ck_assert (pl_render_type_icon (cr, pl_part_type_get_placeable (t), 48,
                                      PL_RENDER_STYLE_LIGHT));
      cairo_surface_flush (surface);
      ck_assert_uint_gt (inked_pixels (surface, 0, 0, 48, 48, 0), 40);
    }
  ck_assert (!pl_render_type_icon (cr, pl_part_type_get (PL_PART_SCENARIO), 48,
                                   PL_RENDER_STYLE_LIGHT));
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
}
END_TEST

/* Key values of the default parts, in SI and in US units. */
START_TEST (test_key_values)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  PlUnitPrefs us;
  g_autofree char *pump = NULL, *nozzle = NULL, *gauge = NULL, *gauge_us = NULL;

  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  apply_ok (doc, pl_command_new_add_part ("pump", NULL, 0, 0));
  apply_ok (doc, pl_command_new_add_part ("applicator", NULL, 0, 0));
  apply_ok (doc, pl_command_new_add_part ("gauge", NULL, 0, 0));
  pump = pl_render_key_value (pl_document_find_part (doc, "p1"), NULL);
  nozzle = pl_render_key_value (pl_document_find_part (doc, "p2"), NULL);
  gauge = pl_render_key_value (pl_document_find_part (doc, "p3"), NULL);
  gauge_us = pl_render_key_value (pl_document_find_part (doc, "p3"), &us);
  /* Defaults of pl-part-types.c: ratio 30, orifice 0.5 mm, 250 bar. */
  ck_assert_str_eq (pump, "30:1");
  ck_assert_str_eq (nozzle, "Ø 0.5 mm");
  ck_assert_str_eq (gauge, "0–250 bar");
  /* 250e5 Pa / 6894.757 Pa/psi (NIST SP 811 B.8) = 3626 psi (the
   * formatter never rounds away integer digits). */
  ck_assert_str_eq (gauge_us, "0–3626 psi");
}
END_TEST

/* --- palette and ramp --- */

static const struct
{
  int index;
  double r, g, b;
} cividis_rows[] = {
  { 0, 0.000000, 0.135112, 0.304751 },
  { 20, 0.000000, 0.188769, 0.439563 },
  { 100, 0.394568, 0.406236, 0.438986 },
  { 180, 0.687957, 0.641966, 0.442886 },
  { 230, 0.896818, 0.811030, 0.320982 },
  { 255, 0.995737, 0.909344, 0.217772 },
};

START_TEST (test_cividis_table)
{
  PlColor c;

  pl_color_cividis (cividis_rows[_i].index / 255.0, &c);
  /* Linear interpolation between every eighth entry stays within 0.019
   * of the full table (worked over all 256 entries); 0.02 allows that. */
  ck_assert_double_eq_tol (c.r, cividis_rows[_i].r, 0.02);
  ck_assert_double_eq_tol (c.g, cividis_rows[_i].g, 0.02);
  ck_assert_double_eq_tol (c.b, cividis_rows[_i].b, 0.02);
  ck_assert_double_eq (c.a, 1.0);
}
END_TEST

START_TEST (test_ramp_lightness_rises)
{
  PlColor c;
  double last = -1.0;

  /* Cividis was built so that lightness rises monotonically (Nuñez et al.
   * 2018, sec. "Colormap optimization"); high pressure is always lighter
   * on screen and, in print, darker. */
  for (int i = 0; i <= 255; i++)
    {
      double y;

      pl_color_cividis (i / 255.0, &c);
      y = pl_color_luminance (&c);
      ck_assert_double_gt (y, last);
      last = y;
    }
  last = 2.0;
  for (int i = 0; i <= 255; i++)
    {
      pl_palette_ramp (pl_palette_get (PL_RENDER_STYLE_PRINT), i / 255.0, &c);
      ck_assert_double_eq (c.r, c.g);
      ck_assert_double_eq (c.g, c.b);
      ck_assert_double_lt (c.r, last);
      last = c.r;
    }
  /* Out of range and NaN clamp to the ends. */
  pl_color_cividis (NAN, &c);
  ck_assert_double_eq_tol (c.b, 0.304751, 1e-9);
  pl_color_cividis (7.0, &c);
  ck_assert_double_eq_tol (c.r, 0.995737, 1e-9);
}
END_TEST

static void
check_grey (const PlColor *c, const char *what)
{
  ck_assert_msg (c->r == c->g && c->g == c->b, "print colour %s is not grey", what);
}

START_TEST (test_print_palette_greys)
{
  const PlPalette *p = pl_palette_get (PL_RENDER_STYLE_PRINT);

  ck_assert (p->greys_only);
  check_grey (&p->background, "background");
  check_grey (&p->grid_minor, "grid_minor");
  check_grey (&p->grid_major, "grid_major");
  check_grey (&p->ink, "ink");
  check_grey (&p->fill, "fill");
  check_grey (&p->fluid, "fluid");
  check_grey (&p->gas, "gas");
  check_grey (&p->text, "text");
  check_grey (&p->text_dim, "text_dim");
  check_grey (&p->port, "port");
  check_grey (&p->port_highlight, "port_highlight");
  check_grey (&p->selection, "selection");
  check_grey (&p->hover, "hover");
  check_grey (&p->label_bg, "label_bg");
  check_grey (&p->dose_ok, "dose_ok");
  check_grey (&p->dose_bad, "dose_bad");
  check_grey (&p->stale, "stale");
  ck_assert_ptr_null (pl_palette_get (PL_N_RENDER_STYLES));
}
END_TEST

static double
contrast (const PlColor *a, const PlColor *b)
{
  double la = pl_color_luminance (a), lb = pl_color_luminance (b);

  return (MAX (la, lb) + 0.05) / (MIN (la, lb) + 0.05);
}

START_TEST (test_palette_contrast)
{
  const PlPalette *p = pl_palette_get (styles[_i]);

  /* WCAG 2.1 SC 1.4.3: at least 4.5:1 for text; ink lines too. */
  ck_assert_double_ge (contrast (&p->text, &p->background), 4.5);
  ck_assert_double_ge (contrast (&p->ink, &p->background), 4.5);
  ck_assert_double_ge (contrast (&p->text, &p->fill), 4.5);
  /* sRGB white has luminance 1, black 0: 21:1 (WCAG's own extreme). */
  {
    PlColor w = { 1, 1, 1, 1 }, k = { 0, 0, 0, 1 };

    ck_assert_double_eq_tol (contrast (&w, &k), 21.0, 1e-12);
  }
}
END_TEST

static Suite *
render_suite (void)
{
  Suite *s = suite_create ("render");
  TCase *tc = tcase_create ("core");

  tcase_set_timeout (tc, 60);
  tcase_add_loop_test (tc, test_gallery, 0, 9);
  tcase_add_test (tc, test_results_and_print_greys);
  tcase_add_test (tc, test_stale_never_mixed);
  tcase_add_test (tc, test_bad_input);
  tcase_add_test (tc, test_icons);
  tcase_add_test (tc, test_key_values);
  tcase_add_loop_test (tc, test_cividis_table, 0, G_N_ELEMENTS (cividis_rows));
  tcase_add_test (tc, test_ramp_lightness_rises);
  tcase_add_test (tc, test_print_palette_greys);
  tcase_add_loop_test (tc, test_palette_contrast, 0, G_N_ELEMENTS (styles));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (render_suite ());
}
