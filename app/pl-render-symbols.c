/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-render-symbols.c: the project's own symbol for every part type,
 * drawn from code in the part's frame (mm, before turn and mirror; the
 * box and ports of pl-part-types.c), and each part's key value.
 *
 * The shapes carry the meaning (they must survive black-and-white print
 * and 50 % zoom): a squat pump box with a stroke mark, a wavy hose, a
 * straight double-walled pipe with end collars, a T-shaped fitting body, a
 * capsule accumulator with hatched gas over fluid, a dump valve body whose
 * arrow drops into a tray, a ball valve whose bore and handle lie along
 * the line when open and across it when shut, a tapered nozzle with a
 * dashed jet, a round dial on a stem, and an open tray.
 */
#include "config.h"

#include "pl-render-private.h"

#include <glib/gi18n.h>
#include <math.h>

static void
rect_path (cairo_t *cr, double x0, double y0, double x1, double y1, double r)
{
  cairo_new_sub_path (cr);
  cairo_arc (cr, x1 - r, y0 + r, r, -G_PI / 2, 0);
  cairo_arc (cr, x1 - r, y1 - r, r, 0, G_PI / 2);
  cairo_arc (cr, x0 + r, y1 - r, r, G_PI / 2, G_PI);
  cairo_arc (cr, x0 + r, y0 + r, r, G_PI, 1.5 * G_PI);
  cairo_close_path (cr);
}

static void
line (cairo_t *cr, double x0, double y0, double x1, double y1)
{
  cairo_move_to (cr, x0, y0);
  cairo_line_to (cr, x1, y1);
}

/* Fill with the body colour, outline in ink. */
static void
body (PlRenderCtx *ctx)
{
  pl_render_set_color (ctx, &ctx->pal->fill);
  cairo_fill_preserve (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_stroke (ctx->cr);
}

static void
ink (PlRenderCtx *ctx)
{
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_stroke (ctx->cr);
}

/* The fluid colour of a symbol: a gradient from port a to port b over
 * x0..x1 when the overlay knows both pressures, one colour for one, the
 * palette's plain fluid otherwise. */
static void
fluid_source (PlRenderCtx *ctx, const PlSymbolState *s, double x0, double x1)
{
  if (s->have_a && s->have_b)
    {
      cairo_pattern_t *g = cairo_pattern_create_linear (x0, 0, x1, 0);

      cairo_pattern_add_color_stop_rgb (g, 0, s->color_a.r, s->color_a.g, s->color_a.b);
      cairo_pattern_add_color_stop_rgb (g, 1, s->color_b.r, s->color_b.g, s->color_b.b);
      cairo_set_source (ctx->cr, g);
      cairo_pattern_destroy (g);
    }
  else if (s->have_a)
    pl_render_set_color (ctx, &s->color_a);
  else
    pl_render_set_color (ctx, &ctx->pal->fluid);
}

/* A flow mark inside a line symbol, in the symbol's frame (+x is a -> b). */
static void
flow_mark_local (PlRenderCtx *ctx, const PlSymbolState *s, double x)
{
  if (isnan (s->flow) || fabs (s->flow) < 1e-9)
    return;
  pl_render_flow_mark (ctx, (PlPoint) { x, 0 }, s->flow > 0 ? 1 : -1, 0, 2.6);
}

static void
draw_pump (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;

  line (cr, 14, 0, 20, 0);                    /* outlet stub */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  rect_path (cr, -17, -12, 14, 12, 2.5);
  body (ctx);
  /* The stroke mark: a piston bar on its rod, the stroke as a double
   * arrow over it, along the top of the box. */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.9));
  line (cr, -10, -8.5, 7, -8.5);
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  cairo_move_to (cr, -12, -8.5);
  cairo_rel_line_to (cr, 2.4, -1.6);
  cairo_rel_line_to (cr, 0, 3.2);
  cairo_close_path (cr);
  cairo_move_to (cr, 9, -8.5);
  cairo_rel_line_to (cr, -2.4, -1.6);
  cairo_rel_line_to (cr, 0, 3.2);
  cairo_close_path (cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (cr);
  /* An air inlet on the back face: a short open stub. */
  rect_path (cr, -20, -3, -17, 3, 0.6);
  body (ctx);
  (void) s;
}

/* A ribbon that waves along x from x0 to x1 around y, half width hw. */
static void
wave_path (cairo_t *cr, double x0, double x1, double y, double amp)
{
  const double wavelength = 13.0;
  const int n = 24;

  for (int i = 0; i <= n; i++)
    {
      double x = x0 + (x1 - x0) * i / n;
      double yy = y + amp * sin (2 * G_PI * (x - x0) / wavelength);

      if (i == 0)
        cairo_move_to (cr, x, yy);
      else
        cairo_line_to (cr, x, yy);
    }
}

static void
draw_hose (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;

  /* The bore: a thick wavy band of fluid colour, then its two walls. */
  wave_path (cr, -25, 25, 0, 1.1);
  fluid_source (ctx, s, -25, 25);
  cairo_set_line_width (cr, 4.2);
  cairo_stroke (cr);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  wave_path (cr, -25, 25, -2.3, 1.1);
  wave_path (cr, -25, 25, 2.3, 1.1);
  ink (ctx);
  /* Crimped end fittings. */
  rect_path (cr, -30, -3.2, -25, 3.2, 0.5);
  rect_path (cr, 25, -3.2, 30, 3.2, 0.5);
  body (ctx);
  line (cr, -27.5, -3.2, -27.5, 3.2);
  line (cr, 27.5, -3.2, 27.5, 3.2);
  ink (ctx);
  flow_mark_local (ctx, s, 0);
}

static void
draw_pipe (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;

  cairo_rectangle (cr, -28, -2.2, 56, 4.4);
  fluid_source (ctx, s, -28, 28);
  cairo_fill (cr);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.0));
  line (cr, -28, -2.2, 28, -2.2);
  line (cr, -28, 2.2, 28, 2.2);
  ink (ctx);
  /* Collars at both ends set a pipe apart from a wire. */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.4));
  line (cr, -28.5, -4.5, -28.5, 4.5);
  line (cr, 28.5, -4.5, 28.5, 4.5);
  line (cr, -30, 0, -28.5, 0);
  line (cr, 28.5, 0, 30, 0);
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  flow_mark_local (ctx, s, 0);
}

static void
draw_tee (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;

  /* One T-shaped body: the run across, the branch down to its port. */
  cairo_move_to (cr, -20, -3.5);
  cairo_line_to (cr, 20, -3.5);
  cairo_line_to (cr, 20, 3.5);
  cairo_line_to (cr, 3.5, 3.5);
  cairo_line_to (cr, 3.5, 20);
  cairo_line_to (cr, -3.5, 20);
  cairo_line_to (cr, -3.5, 3.5);
  cairo_line_to (cr, -20, 3.5);
  cairo_close_path (cr);
  fluid_source (ctx, s, -20, 20);
  cairo_fill_preserve (cr);
  ink (ctx);
  /* A solid hub at the centre. */
  rect_path (cr, -6, -6, 6, 6, 1.2);
  body (ctx);
  cairo_arc (cr, 0, 0, 1.6, 0, 2 * G_PI);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (cr);
}

static void
draw_accumulator (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;
  const double r = 10.0, top = -26.0, bottom = 18.0, split = -4.0;

  line (cr, 0, bottom, 0, 30);                /* neck */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.4));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  /* Capsule: two half circles joined by straight walls. */
  cairo_new_sub_path (cr);
  cairo_arc (cr, 0, top + r, r, G_PI, 2 * G_PI);
  cairo_arc (cr, 0, bottom - r, r, 0, G_PI);
  cairo_close_path (cr);
  pl_render_set_color (ctx, &ctx->pal->fill);
  cairo_fill_preserve (cr);
  cairo_save (cr);
  cairo_clip_preserve (cr);
  cairo_new_path (cr);
  /* Fluid below the bladder line. */
  cairo_rectangle (cr, -r, split, 2 * r, bottom - split);
  fluid_source (ctx, s, -r, r);
  cairo_fill (cr);
  /* Gas above it: diagonal hatch, clipped to the gas space. */
  cairo_rectangle (cr, -r, top, 2 * r, split - top);
  cairo_clip (cr);
  for (double d = 0; d < 2 * r + (split - top); d += 3.0)
    line (cr, -r, top + d, r, top + d - 2 * r);
  pl_render_set_color (ctx, &ctx->pal->gas);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.35));
  cairo_stroke (cr);
  cairo_restore (cr);
  /* The capsule outline again, on top, and the bladder as a wave. */
  cairo_new_sub_path (cr);
  cairo_arc (cr, 0, top + r, r, G_PI, 2 * G_PI);
  cairo_arc (cr, 0, bottom - r, r, 0, G_PI);
  cairo_close_path (cr);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.8));
  ink (ctx);
  wave_path (cr, -r, r, split, 0.9);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.6));
  ink (ctx);
  /* The charging valve on top. */
  rect_path (cr, -2.5, top - 3.5, 2.5, top + 0.5, 0.6);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  body (ctx);
}

static void
draw_dump_valve (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;
  double dash[] = { 1.2, 0.9 };

  line (cr, -20, 0, -13, 0);
  line (cr, 13, 0, 20, 0);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  rect_path (cr, -13, -7, 13, 7, 2.0);
  body (ctx);
  /* Air pilot on top, joined by a dashed air line. */
  rect_path (cr, -5, -15, 5, -10.5, 1.0);
  body (ctx);
  cairo_set_dash (cr, dash, 2, 0);
  line (cr, 0, -10.5, 0, -7);
  ink (ctx);
  cairo_set_dash (cr, NULL, 0, 0);
  /* The arrow from the inlet side that drops into a tray. */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.8));
  cairo_move_to (cr, -9, -2.5);
  cairo_line_to (cr, 1, -2.5);
  cairo_line_to (cr, 4.5, 1.8);
  ink (ctx);
  cairo_move_to (cr, 6.2, 4.0);
  cairo_line_to (cr, 2.6, 2.6);
  cairo_line_to (cr, 5.4, 0.3);
  cairo_close_path (cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (cr);
  cairo_move_to (cr, 3.5, 3.5);
  cairo_line_to (cr, 4.2, 5.5);
  cairo_line_to (cr, 10.5, 5.5);
  cairo_line_to (cr, 11.2, 3.5);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.6));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  (void) s;
}

static void
draw_ball_valve (PlRenderCtx *ctx, const PlPart *part, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;
  gboolean open = part == NULL || pl_part_get_boolean (part, "open");

  line (cr, -20, 0, -11, 0);
  line (cr, 11, 0, 20, 0);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  rect_path (cr, -11, -7, 11, 7, 3.0);
  body (ctx);
  /* The ball, and its bore along the line (open) or across it (shut). */
  cairo_arc (cr, 0, 0, 5.2, 0, 2 * G_PI);
  body (ctx);
  if (open)
    {
      cairo_rectangle (cr, -5.2, -1.8, 10.4, 3.6);
      fluid_source (ctx, s, -5.2, 5.2);
      cairo_fill_preserve (cr);
    }
  else
    {
      cairo_rectangle (cr, -1.8, -4.9, 3.6, 9.8);
      pl_render_set_color (ctx, &ctx->pal->fill);
      cairo_fill_preserve (cr);
    }
  ink (ctx);
  /* The handle: a bar on a stem; along the line when open, standing up
   * when shut (the lever of a real quarter-turn valve). */
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.4));
  line (cr, 0, -7, 0, -10);
  if (open)
    line (cr, -9, -10.5, 5, -10.5);
  else
    line (cr, 0, -10, 0, -12);
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
}

static void
draw_applicator (PlRenderCtx *ctx, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;
  double dash[] = { 1.6, 1.2 };

  line (cr, 0, -20, 0, -15);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  /* Valve body, then the nozzle tapering to its tip. */
  rect_path (cr, -7, -15, 7, -3, 1.5);
  body (ctx);
  cairo_move_to (cr, -5.5, -3);
  cairo_line_to (cr, 5.5, -3);
  cairo_line_to (cr, 1.3, 5);
  cairo_line_to (cr, -1.3, 5);
  cairo_close_path (cr);
  fluid_source (ctx, s, -5.5, 5.5);
  cairo_fill_preserve (cr);
  ink (ctx);
  if (isfinite (s->jet))
    {
      /* In a replay the jet shows the flow at the instant: a fan whose
       * reach and width grow with the flow over the steady-open flow
       * (full at 1), nothing while the valve is shut; it stays inside the
       * symbol's box, where the static jet is drawn. */
      double k = MIN (s->jet, 1.0), reach = 12.0 * k, half = 4.0 * k;

      if (k >= 0.02)
        {
          cairo_move_to (cr, -0.8, 6);
          cairo_line_to (cr, -0.8 - half, 7 + reach);
          cairo_line_to (cr, 0.8 + half, 7 + reach);
          cairo_line_to (cr, 0.8, 6);
          cairo_close_path (cr);
          fluid_source (ctx, s, -half, half);
          cairo_fill_preserve (cr);
          ink (ctx);
        }
      cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
      return;
    }
  /* The jet: short dashes fanning out below the tip. */
  cairo_set_dash (cr, dash, 2, 0);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.6));
  line (cr, 0, 7, 0, 19);
  line (cr, -0.8, 7, -3.6, 18);
  line (cr, 0.8, 7, 3.6, 18);
  ink (ctx);
  cairo_set_dash (cr, NULL, 0, 0);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
}

static void
draw_gauge_stem (PlRenderCtx *ctx)
{
  cairo_t *cr = ctx->cr;

  /* The stem and its hex; the dial is drawn upright by the caller. */
  line (cr, 0, 6, 0, 20);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  rect_path (cr, -3.5, 10, 3.5, 14, 0.6);
  body (ctx);
}

void
pl_render_gauge_dial (PlRenderCtx *ctx, PlPoint c, double radius, double fraction)
{
  cairo_t *cr = ctx->cr;
  /* The scale sweeps 270 degrees, zero at the lower left. */
  const double start = 0.75 * G_PI, sweep = 1.5 * G_PI;
  double a;

  cairo_arc (cr, c.x, c.y, radius, 0, 2 * G_PI);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.8));
  body (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.4));
  for (int i = 0; i <= 10; i++)
    {
      double t = start + sweep * i / 10.0, r0 = i % 5 == 0 ? 0.68 : 0.78;

      line (cr, c.x + r0 * radius * cos (t), c.y + r0 * radius * sin (t),
            c.x + 0.88 * radius * cos (t), c.y + 0.88 * radius * sin (t));
    }
  ink (ctx);
  /* The needle rests at zero when there is no reading. */
  a = start + sweep * (isnan (fraction) ? 0.0 : CLAMP (fraction, 0.0, 1.05));
  cairo_set_line_width (cr, pl_render_line_width (ctx, 0.8));
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_ROUND);
  line (cr, c.x - 0.15 * radius * cos (a), c.y - 0.15 * radius * sin (a),
        c.x + 0.8 * radius * cos (a), c.y + 0.8 * radius * sin (a));
  pl_render_set_color (ctx, fraction > 1.0 ? &ctx->pal->dose_bad : &ctx->pal->ink);
  cairo_stroke (cr);
  cairo_arc (cr, c.x, c.y, 1.3, 0, 2 * G_PI);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (cr);
}

static void
draw_drain (PlRenderCtx *ctx, const PlPart *part, const PlSymbolState *s)
{
  cairo_t *cr = ctx->cr;
  gboolean tank = part != NULL && g_strcmp0 (pl_part_get_choice_key (part, "kind"), "tank") == 0;
  double top = tank ? -9.0 : -3.0;

  /* Inlet pipe falling into the tray with an arrow. */
  line (cr, 0, -15, 0, top - 1);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.2));
  ink (ctx);
  cairo_move_to (cr, 0, top + 2.5);
  cairo_rel_line_to (cr, -2.0, -3.2);
  cairo_rel_line_to (cr, 4.0, 0);
  cairo_close_path (cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (cr);
  /* The tray: open at the top, a level of fluid inside. */
  cairo_move_to (cr, -13.6, 5.5);
  cairo_line_to (cr, 13.6, 5.5);
  cairo_line_to (cr, 13.8, 10.5);
  cairo_line_to (cr, -13.8, 10.5);
  cairo_close_path (cr);
  fluid_source (ctx, s, -14, 14);
  cairo_fill (cr);
  cairo_move_to (cr, tank ? -15 : -17, top);
  cairo_line_to (cr, -14, 11);
  cairo_line_to (cr, 14, 11);
  cairo_line_to (cr, tank ? 15 : 17, top);
  cairo_set_line_width (cr, pl_render_line_width (ctx, 1.0));
  ink (ctx);
  cairo_set_line_width (cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
}

/* Outlines only, added to the current path, for a whole layout seen from
 * far away (pl-render.c fills and strokes them all at once): each type
 * keeps its own outline, so a pump is still a box and a gauge a disc. */
void
pl_render_silhouette (PlRenderCtx *ctx, const PlPartType *type)
{
  cairo_t *cr = ctx->cr;

  switch (type->kind)
    {
    case PL_PART_PUMP:
      rect_path (cr, -17, -12, 14, 12, 2.5);
      cairo_rectangle (cr, 14, -1, 6, 2);
      break;
    case PL_PART_HOSE:
      cairo_rectangle (cr, -30, -2.5, 60, 5);
      break;
    case PL_PART_PIPE:
      cairo_rectangle (cr, -30, -2.2, 60, 4.4);
      cairo_rectangle (cr, -29, -4.5, 1.5, 9);
      cairo_rectangle (cr, 27.5, -4.5, 1.5, 9);
      break;
    case PL_PART_TEE:
      cairo_rectangle (cr, -20, -3.5, 40, 7);
      cairo_rectangle (cr, -3.5, 3.5, 7, 16.5);
      break;
    case PL_PART_ACCUMULATOR:
      cairo_new_sub_path (cr);
      cairo_arc (cr, 0, -16, 10, G_PI, 2 * G_PI);
      cairo_arc (cr, 0, 8, 10, 0, G_PI);
      cairo_close_path (cr);
      cairo_rectangle (cr, -1, 18, 2, 12);
      break;
    case PL_PART_DUMP_VALVE:
      rect_path (cr, -13, -7, 13, 7, 2.0);
      cairo_rectangle (cr, -5, -15, 10, 4.5);
      cairo_rectangle (cr, -20, -1, 40, 2);
      break;
    case PL_PART_BALL_VALVE:
      rect_path (cr, -11, -7, 11, 7, 3.0);
      cairo_rectangle (cr, -20, -1, 40, 2);
      cairo_rectangle (cr, -9, -11.5, 14, 2);
      break;
    case PL_PART_APPLICATOR:
      rect_path (cr, -7, -15, 7, -3, 1.5);
      cairo_move_to (cr, -5.5, -3);
      cairo_line_to (cr, 5.5, -3);
      cairo_line_to (cr, 0, 12);
      cairo_close_path (cr);
      cairo_rectangle (cr, -1, -20, 2, 5);
      break;
    case PL_PART_GAUGE:
      cairo_new_sub_path (cr);
      cairo_arc (cr, 0, -5, 11, 0, 2 * G_PI);
      cairo_close_path (cr);
      cairo_rectangle (cr, -1, 6, 2, 14);
      break;
    case PL_PART_DRAIN:
      cairo_move_to (cr, -17, -3);
      cairo_line_to (cr, -14, 11);
      cairo_line_to (cr, 14, 11);
      cairo_line_to (cr, 17, -3);
      cairo_close_path (cr);
      cairo_rectangle (cr, -1, -15, 2, 12);
      break;
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      break;
    }
}

void
pl_render_symbol (PlRenderCtx *ctx, const PlPartType *type, const PlPart *part,
                  const PlSymbolState *state)
{
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, PL_RENDER_INK_MM));
  cairo_set_line_join (ctx->cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap (ctx->cr, CAIRO_LINE_CAP_BUTT);
  switch (type->kind)
    {
    case PL_PART_PUMP:
      draw_pump (ctx, state);
      break;
    case PL_PART_HOSE:
      draw_hose (ctx, state);
      break;
    case PL_PART_PIPE:
      draw_pipe (ctx, state);
      break;
    case PL_PART_TEE:
      draw_tee (ctx, state);
      break;
    case PL_PART_ACCUMULATOR:
      draw_accumulator (ctx, state);
      break;
    case PL_PART_DUMP_VALVE:
      draw_dump_valve (ctx, state);
      break;
    case PL_PART_BALL_VALVE:
      draw_ball_valve (ctx, part, state);
      break;
    case PL_PART_APPLICATOR:
      draw_applicator (ctx, state);
      break;
    case PL_PART_GAUGE:
      draw_gauge_stem (ctx);
      break;
    case PL_PART_DRAIN:
      draw_drain (ctx, part, state);
      break;
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      break;
    }
}

static char *
fmt (const PlPart *part, const char *key, PlQuantity q, const PlUnitPrefs *units)
{
  return pl_unit_format (pl_part_get_number (part, key), q, units, 3,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
}

char *
pl_render_key_value (const PlPart *part, const PlUnitPrefs *units)
{
  const PlPartType *type = pl_part_get_part_type (part);
  g_autofree char *a = NULL, *b = NULL;

  switch (type->kind)
    {
    case PL_PART_PUMP:
      a = pl_unit_format_number_in (pl_part_get_number (part, "ratio"), PL_UNIT_ONE, 3,
                                    PL_UNIT_DECIMAL_FROM_LOCALE);
      /* Translators: a pump's pressure ratio, "30:1". */
      return g_strdup_printf (_("%s:1"), a);
    case PL_PART_HOSE:
    case PL_PART_PIPE:
      a = fmt (part, "bore", PL_QUANTITY_LENGTH, units);
      b = fmt (part, "length", PL_QUANTITY_LINE_LENGTH, units);
      /* Translators: a hose's bore (Ø, inner diameter) and its length. */
      return g_strdup_printf (_("Ø %s · %s"), a, b);
    case PL_PART_TEE:
      a = fmt (part, "bore", PL_QUANTITY_LENGTH, units);
      return g_strdup_printf (_("Ø %s"), a);
    case PL_PART_ACCUMULATOR:
      a = fmt (part, "precharge", PL_QUANTITY_PRESSURE, units);
      /* Translators: an accumulator's gas precharge pressure. */
      return g_strdup_printf (_("p₀ %s"), a);
    case PL_PART_DUMP_VALVE:
      a = pl_unit_format_number_in (pl_part_get_number (part, "kv"), PL_UNIT_ONE, 3,
                                    PL_UNIT_DECIMAL_FROM_LOCALE);
      /* Translators: a valve's flow coefficient, "Kv 0.5". */
      return g_strdup_printf (_("Kv %s"), a);
    case PL_PART_BALL_VALVE:
      a = pl_unit_format_number_in (pl_part_get_number (part, "kv"), PL_UNIT_ONE, 3,
                                    PL_UNIT_DECIMAL_FROM_LOCALE);
      /* Translators: a ball valve's state and flow coefficient. */
      return g_strdup_printf (pl_part_get_boolean (part, "open") ? _("open · Kv %s")
                                                                 : _("shut · Kv %s"), a);
    case PL_PART_APPLICATOR:
      a = fmt (part, "orifice-diameter", PL_QUANTITY_LENGTH, units);
      return g_strdup_printf (_("Ø %s"), a);
    case PL_PART_GAUGE:
      a = fmt (part, "full-scale", PL_QUANTITY_PRESSURE, units);
      /* Translators: the range of a gauge's dial, "0–250 bar". */
      return g_strdup_printf (_("0–%s"), a);
    case PL_PART_DRAIN:
      return g_strdup (g_strcmp0 (pl_part_get_choice_key (part, "kind"), "tank") == 0
                         ? _("tank") : _("drain"));
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      return NULL;
    }
}

gboolean
pl_render_type_icon (cairo_t *cr, const PlPartType *type, double size, PlRenderStyle style)
{
  PlRenderCtx ctx = { 0 };
  PlSymbolState state = { .flow = NAN, .gauge_fraction = NAN, .jet = NAN };
  double extent, s, dx = 1.0, dy = 0.0;

  g_return_val_if_fail (cr != NULL && type != NULL, FALSE);
  if (!type->placeable || pl_palette_get (style) == NULL || !(size > 0.0))
    return FALSE;
  extent = 2.0 * MAX (type->half_width, type->half_height);
  s = size / extent;
  cairo_save (cr);
  cairo_translate (cr, 0.5 * size, 0.5 * size);
  cairo_scale (cr, s, s);
  ctx.cr = cr;
  ctx.pal = pl_palette_get (style);
  cairo_user_to_device_distance (cr, &dx, &dy);
  ctx.scale = hypot (dx, dy);
  ctx.px = ctx.scale > 0.0 ? 1.0 / ctx.scale : 1.0;
  pl_render_symbol (&ctx, type, NULL, &state);
  if (type->kind == PL_PART_GAUGE)
    pl_render_gauge_dial (&ctx, (PlPoint) { 0.0, -5.0 }, 11.0, NAN);
  cairo_restore (cr);
  return cairo_status (cr) == CAIRO_STATUS_SUCCESS;
}
