/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-render-overlay.c: what the results add to the drawing -- pressures
 * (steady, cycle statistics, or the instant of a replay), ramp colours,
 * flow marks, a gauge's reading, an applicator's dose bar, labels at
 * chosen ports -- and the legend and the stale mark.
 *
 * Only called with results that match the document (pl-render.h), except
 * the stale badge and the legend, which draw no figure from stale results.
 */
#include "config.h"

#include "pl-render-private.h"

#include <glib/gi18n.h>
#include <math.h>

static gboolean
replaying (PlRenderCtx *ctx)
{
  return isfinite (ctx->opts->replay_time);
}

/* Flow of a part's element at the replay instant when there is one, else
 * in the steady case the pressure kind names. */
static gboolean
part_flow (PlRenderCtx *ctx, const char *part_id, guint slot, double *out)
{
  PlSteadyCase c = ctx->opts->pressure_kind == PL_PRESSURE_IDLE ? PL_CASE_IDLE
                                                                : PL_CASE_STEADY_OPEN;

  if (replaying (ctx)
      && pl_results_get_flow_at (ctx->results, part_id, slot, ctx->opts->replay_run,
                                 ctx->opts->replay_time, out))
    return TRUE;
  return pl_results_get_flow (ctx->results, part_id, slot, c, out);
}

gboolean
pl_render_port_pressure (PlRenderCtx *ctx, const char *part_id, const char *port_key,
                         double *out)
{
  double p;

  if (ctx->results == NULL)
    return FALSE;
  if (replaying (ctx)
      && pl_results_get_port_pressure_at (ctx->results, part_id, port_key,
                                          ctx->opts->replay_run, ctx->opts->replay_time, out))
    return TRUE;
  if (!pl_results_get_port_pressure (ctx->results, part_id, port_key,
                                     ctx->opts->pressure_kind, &p) || !isfinite (p))
    return FALSE;
  *out = p;
  return TRUE;
}

void
pl_render_overlay_prepare (PlRenderCtx *ctx)
{
  const PlRenderOptions *o = ctx->opts;
  double lo = 0.0, hi = -INFINITY;
  /* With a replay the ramp spans the whole cycle and the idle pressure the
   * shutdown starts from, so colours do not rescale as the instant moves
   * nor when the replay goes from one run to the other. */
  gboolean over_runs = replaying (ctx) && pl_results_get_cycle (ctx->results) != NULL;
  PlPressureKind kind = over_runs ? PL_PRESSURE_CYCLE_MAX : o->pressure_kind;
  const PlPart *scenario = pl_document_get_scenario (ctx->doc);

  ctx->uniformity = pl_part_get_number (scenario, "uniformity-tolerance");
  if (!isfinite (ctx->uniformity))
    ctx->uniformity = 0.02;
  for (guint i = 0; i < pl_document_get_n_parts (ctx->doc); i++)
    {
      const PlPart *part = pl_document_get_part (ctx->doc, i);
      const PlPartType *type = pl_part_get_part_type (part);

      for (guint k = 0; k < type->n_ports; k++)
        {
          double p;

          if (pl_results_get_port_pressure (ctx->results, pl_part_get_id (part),
                                            type->ports[k].key, kind, &p) && isfinite (p))
            {
              hi = MAX (hi, p);
              lo = MIN (lo, p);
            }
          if (over_runs
              && pl_results_get_port_pressure (ctx->results, pl_part_get_id (part),
                                               type->ports[k].key, PL_PRESSURE_IDLE, &p)
              && isfinite (p))
            hi = MAX (hi, p);
        }
    }
  if (isfinite (o->pressure_max) && o->pressure_max > 0.0)
    hi = o->pressure_max;
  ctx->have_range = isfinite (hi);
  /* A layout at rest (all 0 Pa) still gets a legend of 1 bar. */
  if (ctx->have_range && hi <= lo)
    hi = lo + 1e5;
  ctx->p_lo = lo;
  ctx->p_hi = hi;
}

gboolean
pl_render_pressure_range (PlDocument *doc, PlResults *results, const PlRenderOptions *opts,
                          double *lo, double *hi)
{
  PlRenderCtx ctx = { 0 };

  g_return_val_if_fail (doc != NULL && opts != NULL, FALSE);
  if (results == NULL || opts->results_stale
      || pl_results_get_revision (results) != pl_document_get_revision (doc))
    return FALSE;
  ctx.doc = doc;
  ctx.results = results;
  ctx.opts = opts;
  pl_render_overlay_prepare (&ctx);
  if (!ctx.have_range)
    return FALSE;
  if (lo != NULL)
    *lo = ctx.p_lo;
  if (hi != NULL)
    *hi = ctx.p_hi;
  return TRUE;
}

void
pl_render_pressure_color (PlRenderCtx *ctx, double p, PlColor *out)
{
  double t = ctx->have_range ? (p - ctx->p_lo) / (ctx->p_hi - ctx->p_lo) : 0.0;

  pl_palette_ramp (ctx->pal, t, out);
}

gboolean
pl_render_port_outflow (PlRenderCtx *ctx, const PlPart *part, const char *port_key,
                        double *out)
{
  const PlPartType *type = pl_part_get_part_type (part);
  const char *id = pl_part_get_id (part);
  guint index = 0;
  double q;

  if (ctx->results == NULL || pl_part_type_find_port (type, port_key, &index) == NULL)
    return FALSE;
  /* Sign conventions of pl_results_get_flow (pl-results.h). */
  switch (type->kind)
    {
    case PL_PART_PUMP:
      if (!part_flow (ctx, id, 0, &q))
        return FALSE;
      *out = q;                              /* delivered out of "out" */
      return TRUE;
    case PL_PART_HOSE:
    case PL_PART_PIPE:
    case PL_PART_BALL_VALVE:
    case PL_PART_DUMP_VALVE:
      if (!part_flow (ctx, id, 0, &q))
        return FALSE;
      *out = index == 0 ? -q : q;            /* port 0 -> port 1 */
      return TRUE;
    case PL_PART_TEE:
      if (!part_flow (ctx, id, index, &q))
        return FALSE;
      *out = q;                              /* centre outwards */
      return TRUE;
    case PL_PART_APPLICATOR:
      if (!part_flow (ctx, id, 0, &q))
        return FALSE;
      *out = -q;                             /* out of the line, into the nozzle */
      return TRUE;
    case PL_PART_ACCUMULATOR:
    case PL_PART_GAUGE:
    case PL_PART_DRAIN:
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      return FALSE;
    }
}

void
pl_render_symbol_state (PlRenderCtx *ctx, const PlPart *part, PlSymbolState *s)
{
  const PlPartType *type = pl_part_get_part_type (part);
  double p;

  *s = (PlSymbolState) { .flow = NAN, .gauge_fraction = NAN, .jet = NAN };
  if (ctx->results == NULL)
    return;
  if (type->n_ports > 0
      && pl_render_port_pressure (ctx, pl_part_get_id (part), type->ports[0].key, &p))
    {
      s->have_a = TRUE;
      pl_render_pressure_color (ctx, p, &s->color_a);
      if (type->kind == PL_PART_GAUGE)
        {
          double fs = pl_part_get_number (part, "full-scale");

          s->gauge_fraction = fs > 0.0 ? p / fs : NAN;
        }
    }
  if (s->have_a && type->n_ports > 1
      && pl_render_port_pressure (ctx, pl_part_get_id (part), type->ports[1].key, &p))
    {
      s->have_b = TRUE;
      pl_render_pressure_color (ctx, p, &s->color_b);
    }
  if (type->kind == PL_PART_HOSE || type->kind == PL_PART_PIPE
      || type->kind == PL_PART_BALL_VALVE || type->kind == PL_PART_DUMP_VALVE)
    {
      double q;

      if (part_flow (ctx, pl_part_get_id (part), 0, &q))
        s->flow = q;
    }
  else if (type->kind == PL_PART_APPLICATOR && replaying (ctx))
    {
      double q, q_open;

      /* The jet against the applicator's own steady-open flow: full when
       * it sprays as if held open, none while it is shut. */
      if (part_flow (ctx, pl_part_get_id (part), 0, &q)
          && pl_results_get_flow (ctx->results, pl_part_get_id (part), 0, PL_CASE_STEADY_OPEN,
                                  &q_open) && q_open > 0.0)
        s->jet = MAX (q, 0.0) / q_open;
    }
}

void
pl_render_flow_mark_path (PlRenderCtx *ctx, PlPoint p, double dx, double dy, double size)
{
  cairo_t *cr = ctx->cr;
  double nx = -dy, ny = dx, h = 0.5 * size;

  cairo_move_to (cr, p.x + h * dx, p.y + h * dy);
  cairo_line_to (cr, p.x - h * dx + h * nx, p.y - h * dy + h * ny);
  cairo_line_to (cr, p.x - 0.4 * h * dx, p.y - 0.4 * h * dy);
  cairo_line_to (cr, p.x - h * dx - h * nx, p.y - h * dy - h * ny);
  cairo_close_path (cr);
}

void
pl_render_flow_mark_flush (PlRenderCtx *ctx)
{
  /* A solid arrowhead with a rim of the sheet colour: it reads on any
   * ramp colour and on a casing alike. */
  pl_render_set_color (ctx, &ctx->pal->background);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.5));
  cairo_stroke_preserve (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (ctx->cr);
}

void
pl_render_flow_mark (PlRenderCtx *ctx, PlPoint p, double dx, double dy, double size)
{
  pl_render_flow_mark_path (ctx, p, dx, dy, size);
  pl_render_flow_mark_flush (ctx);
}

/* A boxed text with its top left at (x, y); returns its height. */
static double
boxed_text (PlRenderCtx *ctx, const char *text, double x, double y, gboolean bold,
            double *width)
{
  double size = pl_render_text_size (ctx, PL_RENDER_VALUE_MM), w, h, pad;

  if (size == 0.0)
    return 0.0;
  pl_render_layout_text (ctx, text, size, bold, &w, &h);
  pad = 0.25 * h;
  cairo_rectangle (ctx->cr, x, y, w + 2 * pad, h);
  pl_render_set_color (ctx, &ctx->pal->label_bg);
  cairo_fill_preserve (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.25));
  cairo_stroke (ctx->cr);
  pl_render_show_layout (ctx, x + pad, y, &ctx->pal->text);
  if (width != NULL)
    *width = w + 2 * pad;
  return h;
}

/* The dose bar: the shot's mass against the mean of all applicators, the
 * mean at two thirds of the bar (so +50 % still fits), coloured by the
 * scenario's uniformity tolerance.  Its figures follow the bar on a
 * screen (the deviation) and stand under it on a sheet (the inlet
 * pressure, the mass and the deviation, kept to the applicator's width so
 * they do not meet the next applicator's). */
#define DOSE_BAR_MM 18.0
#define DOSE_BAR_HEIGHT_MM 3.0
#define DOSE_MEAN_AT_MM 12.0
#define DOSE_TEXT_GAP_MM 1.2

static char *
dose_text (PlRenderCtx *ctx, const PlPart *part, double *dev)
{
  g_autofree char *m = NULL, *pr = NULL, *shot = NULL;
  double mass, p;

  if (!pl_results_get_shot (ctx->results, pl_part_get_id (part), &mass, dev, NULL)
      || !isfinite (*dev))
    return NULL;
  if (!ctx->opts->show_dose_details)
    /* Translators: a shot's deviation from the mean of all shots, in %. */
    return g_strdup_printf (_("%+.1f %%"), 100.0 * *dev);
  m = pl_unit_format (mass, PL_QUANTITY_MASS, ctx->opts->units, 3,
                      PL_UNIT_DECIMAL_FROM_LOCALE);
  if (pl_render_port_pressure (ctx, pl_part_get_id (part), "in", &p))
    pr = pl_unit_format (p, PL_QUANTITY_PRESSURE, ctx->opts->units, 3,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
  /* Translators: a shot's mass and its deviation from the mean of all
   * shots, "0.449 g, +0.2 %". */
  shot = g_strdup_printf (_("%s, %+.1f %%"), m, 100.0 * *dev);
  return pr != NULL ? g_strconcat (pr, "\n", shot, NULL) : g_steal_pointer (&shot);
}

/* The block a dose bar and its figures take (mm), and the figures' size. */
static void
dose_block_size (PlRenderCtx *ctx, const char *text, double dev, double *width,
                 double *height, double *text_w, double *text_h)
{
  double size = pl_render_text_size (ctx, PL_RENDER_VALUE_MM);

  *text_w = *text_h = 0.0;
  if (size > 0.0)
    pl_render_layout_text (ctx, text, size, fabs (dev) > ctx->uniformity, text_w, text_h);
  /* The mean mark reaches 0.8 mm above and below the bar. */
  if (ctx->opts->show_dose_details)
    {
      *width = MAX (DOSE_BAR_MM, *text_w);
      *height = DOSE_BAR_HEIGHT_MM + 1.6 + (*text_h > 0.0 ? DOSE_TEXT_GAP_MM + *text_h : 0.0);
    }
  else
    {
      *width = DOSE_BAR_MM + (*text_w > 0.0 ? 1.0 + *text_w : 0.0);
      *height = MAX (DOSE_BAR_HEIGHT_MM + 1.6, *text_h);
    }
}

/* Draws the block in box, the size dose_block_size gave. */
static void
dose_bar (PlRenderCtx *ctx, const PlPart *part, const PlRect *box)
{
  const double height = DOSE_BAR_HEIGHT_MM, mean_at = DOSE_MEAN_AT_MM;
  double dev, size = pl_render_text_size (ctx, PL_RENDER_VALUE_MM), w, h, x = box->x0, y;
  g_autofree char *text = dose_text (ctx, part, &dev);
  const PlColor *color;

  if (text == NULL)
    return;
  if (ctx->opts->show_dose_details)
    {
      /* The bar centred over its figures. */
      x += 0.5 * (box->x1 - box->x0 - DOSE_BAR_MM);
      y = box->y0 + 0.8;
    }
  else
    y = 0.5 * (box->y0 + box->y1 - height);
  color = fabs (dev) <= ctx->uniformity ? &ctx->pal->dose_ok : &ctx->pal->dose_bad;
  cairo_rectangle (ctx->cr, x, y, CLAMP (mean_at * (1.0 + dev), 0.0, DOSE_BAR_MM), height);
  pl_render_set_color (ctx, color);
  cairo_fill (ctx->cr);
  cairo_rectangle (ctx->cr, x, y, DOSE_BAR_MM, height);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.25));
  cairo_stroke (ctx->cr);
  cairo_move_to (ctx->cr, x + mean_at, y - 0.8);
  cairo_line_to (ctx->cr, x + mean_at, y + height + 0.8);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.5));
  cairo_stroke (ctx->cr);
  if (size == 0.0)
    return;
  pl_render_layout_text (ctx, text, size, fabs (dev) > ctx->uniformity, &w, &h);
  if (ctx->opts->show_dose_details)
    pl_render_show_layout (ctx, box->x0, y + height + 0.8 + DOSE_TEXT_GAP_MM, &ctx->pal->text);
  else
    pl_render_show_layout (ctx, x + DOSE_BAR_MM + 1.0, y + 0.5 * height - 0.5 * h,
                           &ctx->pal->text);
}

static char *
gauge_text (PlRenderCtx *ctx, const PlPart *part)
{
  double p;

  if (pl_render_text_size (ctx, PL_RENDER_VALUE_MM) == 0.0
      || !pl_render_port_pressure (ctx, pl_part_get_id (part), "p", &p))
    return NULL;
  return pl_unit_format (p, PL_QUANTITY_PRESSURE, ctx->opts->units, 3,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
}

/* The size of what boxed_text draws. */
static void
boxed_text_size (PlRenderCtx *ctx, const char *text, gboolean bold, double *w, double *h)
{
  double size = pl_render_text_size (ctx, PL_RENDER_VALUE_MM);

  *w = *h = 0.0;
  if (size == 0.0)
    return;
  pl_render_layout_text (ctx, text, size, bold, w, h);
  *w += 0.5 * *h;
}

void
pl_render_part_overlay_size (PlRenderCtx *ctx, const PlPart *part, double *width,
                             double *height)
{
  const PlPartType *type = pl_part_get_part_type (part);

  *width = *height = 0.0;
  if (ctx->results == NULL)
    return;
  if (type->kind == PL_PART_GAUGE)
    {
      g_autofree char *text = gauge_text (ctx, part);

      if (text != NULL)
        boxed_text_size (ctx, text, TRUE, width, height);
    }
  else if (type->kind == PL_PART_APPLICATOR)
    {
      double dev, w, h;
      g_autofree char *text = dose_text (ctx, part, &dev);

      if (text != NULL)
        dose_block_size (ctx, text, dev, width, height, &w, &h);
    }
}

void
pl_render_part_overlay (PlRenderCtx *ctx, const PlPart *part, const PlRect *box)
{
  const PlPartType *type = pl_part_get_part_type (part);

  if (ctx->results == NULL)
    return;
  if (type->kind == PL_PART_GAUGE)
    {
      g_autofree char *text = gauge_text (ctx, part);

      if (text != NULL)
        boxed_text (ctx, text, box->x0, box->y0, TRUE, NULL);
    }
  else if (type->kind == PL_PART_APPLICATOR)
    dose_bar (ctx, part, box);
}

/* Where a pressure label may go around its port, nearest first: the four
 * diagonals, then further out along them. */
static const double pressure_label_reach[] = { 3.0, 8.0, 14.0 };

void
pl_render_pressure_label (PlRenderCtx *ctx, PlPoint anchor, const char *part_id,
                          const char *port_key)
{
  static const double dirs[4][2] = { { 1, -1 }, { -1, -1 }, { 1, 1 }, { -1, 1 } };
  PlRect cand[G_N_ELEMENTS (pressure_label_reach) * 4];
  double p, w, h;
  guint n = 0, k;
  g_autofree char *text = NULL;
  PlPoint corner;

  if (!pl_render_port_pressure (ctx, part_id, port_key, &p))
    return;
  text = pl_unit_format (p, PL_QUANTITY_PRESSURE, ctx->opts->units, 3,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
  boxed_text_size (ctx, text, TRUE, &w, &h);
  if (w == 0.0)
    return;
  for (guint r = 0; r < G_N_ELEMENTS (pressure_label_reach); r++)
    for (guint d = 0; d < 4; d++)
      {
        double x = anchor.x + dirs[d][0] * pressure_label_reach[r];
        double y = anchor.y + dirs[d][1] * pressure_label_reach[r];

        /* The box's corner nearest the port sits at (x, y). */
        cand[n++] = (PlRect) { dirs[d][0] > 0 ? x : x - w, dirs[d][1] > 0 ? y : y - h,
                               dirs[d][0] > 0 ? x + w : x, dirs[d][1] > 0 ? y + h : y };
      }
  k = pl_render_place_label (ctx, cand, n);
  if (k >= n)
    k = 0;
  /* A leader from the port to the box's nearest corner. */
  corner.x = dirs[k % 4][0] > 0 ? cand[k].x0 : cand[k].x1;
  corner.y = dirs[k % 4][1] > 0 ? cand[k].y0 : cand[k].y1;
  cairo_move_to (ctx->cr, anchor.x, anchor.y);
  cairo_line_to (ctx->cr, corner.x, corner.y);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.25));
  cairo_stroke (ctx->cr);
  boxed_text (ctx, text, cand[k].x0, cand[k].y0, TRUE, NULL);
}

/* Diagonal stripes over a rectangle: the mark of things out of date. */
static void
hatch (cairo_t *cr, double x, double y, double w, double h, double step, double lw)
{
  cairo_save (cr);
  cairo_rectangle (cr, x, y, w, h);
  cairo_clip (cr);
  for (double d = -h; d < w; d += step)
    {
      cairo_move_to (cr, x + d, y + h);
      cairo_line_to (cr, x + d + h, y);
    }
  cairo_set_line_width (cr, lw);
  cairo_stroke (cr);
  cairo_restore (cr);
}

void
pl_render_stale_badge (PlRenderCtx *ctx)
{
  double size = 12.0 * ctx->px, w, h, x = ctx->clip.x0 + 10.0 * ctx->px;
  double y = ctx->clip.y0 + 10.0 * ctx->px, pad = 0.5 * size;

  pl_render_layout_text (ctx, _("Results out of date"), size, TRUE, &w, &h);
  cairo_rectangle (ctx->cr, x, y, w + 2 * pad, h + pad);
  pl_render_set_color (ctx, &ctx->pal->label_bg);
  cairo_fill (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->stale);
  hatch (ctx->cr, x, y, w + 2 * pad, h + pad, 0.6 * size, 0.12 * size);
  cairo_rectangle (ctx->cr, x, y, w + 2 * pad, h + pad);
  pl_render_set_color (ctx, &ctx->pal->text_dim);
  cairo_set_line_width (ctx->cr, ctx->px);
  cairo_stroke (ctx->cr);
  pl_render_show_layout (ctx, x + pad, y + 0.5 * pad, &ctx->pal->text);
}

void
pl_render_legend (cairo_t *cr, double x, double y, double width, double height, double lo,
                  double hi, const PlUnitPrefs *units, PlRenderStyle style, gboolean stale)
{
  const PlPalette *pal = pl_palette_get (style);
  PangoLayout *layout;
  PangoFontDescription *font;
  cairo_pattern_t *ramp;
  double pad = 0.12 * height, title = 0.24 * height, bar_y, bar_h = 0.26 * height;
  const PlUnit *unit = pl_unit_get (pl_unit_prefs_get_unit (units, PL_QUANTITY_PRESSURE));
  g_autofree char *heading = NULL;

  g_return_if_fail (cr != NULL);
  if (pal == NULL || !(width > 0.0 && height > 0.0))
    return;
  cairo_save (cr);
  layout = pango_cairo_create_layout (cr);
  pango_context_set_round_glyph_positions (pango_layout_get_context (layout), FALSE);
  pango_layout_context_changed (layout);
  font = pango_font_description_from_string ("Sans");
  cairo_rectangle (cr, x, y, width, height);
  cairo_set_source_rgba (cr, pal->label_bg.r, pal->label_bg.g, pal->label_bg.b,
                         pal->label_bg.a);
  cairo_fill_preserve (cr);
  cairo_set_source_rgba (cr, pal->text_dim.r, pal->text_dim.g, pal->text_dim.b, 0.6);
  cairo_set_line_width (cr, 0.02 * height);
  cairo_stroke (cr);

  /* Translators: title of the colour legend; %s is the pressure unit. */
  heading = stale ? g_strdup_printf (_("Pressure (%s) — out of date"), unit->symbol)
                  : g_strdup_printf (_("Pressure (%s)"), unit->symbol);
  pango_font_description_set_absolute_size (font, title * PANGO_SCALE);
  pango_font_description_set_weight (font, PANGO_WEIGHT_BOLD);
  pango_layout_set_font_description (layout, font);
  pango_layout_set_text (layout, heading, -1);
  cairo_move_to (cr, x + pad, y + 0.5 * pad);
  cairo_set_source_rgba (cr, pal->text.r, pal->text.g, pal->text.b, 1.0);
  pango_cairo_show_layout (cr, layout);

  /* Below the title with its descenders (about 1.2 of its size). */
  bar_y = y + 0.5 * pad + 1.4 * title;
  ramp = cairo_pattern_create_linear (x + pad, 0, x + width - pad, 0);
  for (int i = 0; i <= 32; i++)
    {
      PlColor c;

      pl_palette_ramp (pal, i / 32.0, &c);
      cairo_pattern_add_color_stop_rgba (ramp, i / 32.0, c.r, c.g, c.b, stale ? 0.3 : 1.0);
    }
  cairo_rectangle (cr, x + pad, bar_y, width - 2 * pad, bar_h);
  cairo_set_source (cr, ramp);
  cairo_fill_preserve (cr);
  cairo_pattern_destroy (ramp);
  cairo_set_source_rgba (cr, pal->ink.r, pal->ink.g, pal->ink.b, 1.0);
  cairo_set_line_width (cr, 0.02 * height);
  cairo_stroke (cr);
  if (stale)
    {
      cairo_set_source_rgba (cr, pal->stale.r, pal->stale.g, pal->stale.b, pal->stale.a);
      hatch (cr, x + pad, bar_y, width - 2 * pad, bar_h, 0.2 * height, 0.04 * height);
    }
  else if (hi > lo)
    {
      /* Ends and middle of the scale, in the user's pressure unit. */
      pango_font_description_set_absolute_size (font, 0.22 * height * PANGO_SCALE);
      pango_font_description_set_weight (font, PANGO_WEIGHT_NORMAL);
      pango_layout_set_font_description (layout, font);
      for (int i = 0; i <= 2; i++)
        {
          double v = lo + (hi - lo) * i / 2.0, tx = x + pad + (width - 2 * pad) * i / 2.0;
          g_autofree char *text = pl_unit_format_number (v, PL_QUANTITY_PRESSURE, units, 3,
                                                         PL_UNIT_DECIMAL_FROM_LOCALE);
          PangoRectangle ext;

          pango_layout_set_text (layout, text, -1);
          pango_layout_get_extents (layout, NULL, &ext);
          tx -= i == 0 ? 0 : i == 2 ? (double) ext.width / PANGO_SCALE
                                    : 0.5 * ext.width / PANGO_SCALE;
          cairo_move_to (cr, tx, bar_y + bar_h + 0.04 * height);
          cairo_set_source_rgba (cr, pal->text.r, pal->text.g, pal->text.b, 1.0);
          pango_cairo_show_layout (cr, layout);
        }
    }
  pango_font_description_free (font);
  g_object_unref (layout);
  cairo_restore (cr);
}
