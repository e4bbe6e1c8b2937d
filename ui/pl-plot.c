/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-plot.h"

#include <glib/gi18n.h>
#include <math.h>

typedef struct
{
  char *label;
  GArray *t;   /* double, s */
  GArray *p;   /* double, Pa */
} PlPlotSeries;

struct _PlPlot
{
  GtkWidget parent_instance;

  GPtrArray *series;         /* PlPlotSeries */
  GArray *bands;             /* double pairs */
  gboolean have_reference;
  double reference;
  char *reference_label;
  PlUnitPrefs prefs;
  char *placeholder;
  gboolean stale;
};

G_DEFINE_FINAL_TYPE (PlPlot, pl_plot, GTK_TYPE_WIDGET)

typedef struct
{
  double r, g, b;
} PlRgb;

/* Okabe & Ito, "Color Universal Design" (2008): hues that stay apart for the
 * common colour-vision deficiencies.  Yellow is left out (it vanishes on
 * white); the dark blue leads on light backgrounds, the sky blue on dark. */
static const PlRgb pl_plot_light[] = {
  { 0.000, 0.447, 0.698 }, { 0.835, 0.369, 0.000 }, { 0.000, 0.620, 0.451 },
  { 0.800, 0.475, 0.655 }, { 0.902, 0.624, 0.000 }, { 0.337, 0.706, 0.914 },
};
static const PlRgb pl_plot_dark[] = {
  { 0.337, 0.706, 0.914 }, { 0.902, 0.624, 0.000 }, { 0.000, 0.620, 0.451 },
  { 0.800, 0.475, 0.655 }, { 0.835, 0.369, 0.000 }, { 0.941, 0.894, 0.259 },
};

/* Dash patterns in line widths: shape carries the meaning in grey print. */
static const double pl_plot_dashes[][2] = {
  { 0, 0 }, { 6, 3 }, { 2, 2 }, { 8, 2 }, { 4, 4 }, { 1, 3 },
};

static void
pl_plot_series_free (gpointer data)
{
  PlPlotSeries *s = data;

  g_free (s->label);
  g_array_unref (s->t);
  g_array_unref (s->p);
  g_free (s);
}

/* "Nice numbers for graph labels", P. S. Heckbert, Graphics Gems (1990):
 * a step of 1, 2 or 5 times a power of ten giving about n ticks. */
static double
pl_plot_nice_step (double span, int n)
{
  double raw = span / MAX (n, 1);
  double mag, f;

  if (!(raw > 0.0) || !isfinite (raw))
    return 1.0;
  mag = pow (10.0, floor (log10 (raw)));
  f = raw / mag;
  if (f < 1.5)
    return mag;
  if (f < 3.0)
    return 2.0 * mag;
  if (f < 7.0)
    return 5.0 * mag;
  return 10.0 * mag;
}

static char *
pl_plot_tick_text (double v, double step)
{
  int decimals = step >= 1.0 ? 0 : (int) ceil (-log10 (step) - 1e-9);
  g_autofree char *raw = NULL;

  if (fabs (v) < step * 1e-6)
    v = 0.0;
  raw = g_strdup_printf ("%.*f", CLAMP (decimals, 0, 9), v);
  return g_steal_pointer (&raw);
}

static void
pl_plot_get_colors (PlPlot *self, GdkRGBA *fg, gboolean *dark)
{
  GtkStyleContext *style = gtk_widget_get_style_context (GTK_WIDGET (self));

  gtk_style_context_get_color (style, fg);
  /* Light text means a dark background (the dark style). */
  *dark = 0.2126 * fg->red + 0.7152 * fg->green + 0.0722 * fg->blue > 0.5;
}

void
pl_plot_draw (PlPlot *self, cairo_t *cr, int width, int height)
{
  GdkRGBA fg;
  gboolean dark;
  const PlRgb *colors;
  PangoLayout *layout;
  const double left = 64, right = 16, top = 16, bottom = 42;
  double x0, x1, y0, y1, tmin = INFINITY, tmax = -INFINITY, pmin = INFINITY, pmax = -INFINITY;
  PlUnitId tunit, punit;
  double tstep, pstep;
  const PlUnit *tu, *pu;

  g_return_if_fail (PL_IS_PLOT (self));

  pl_plot_get_colors (self, &fg, &dark);
  colors = dark ? pl_plot_dark : pl_plot_light;
  layout = gtk_widget_create_pango_layout (GTK_WIDGET (self), NULL);

  for (guint i = 0; i < self->series->len; i++)
    {
      PlPlotSeries *s = g_ptr_array_index (self->series, i);

      for (guint k = 0; k < s->t->len; k++)
        {
          double t = g_array_index (s->t, double, k), p = g_array_index (s->p, double, k);

          if (!isfinite (t) || !isfinite (p))
            continue;
          tmin = MIN (tmin, t);
          tmax = MAX (tmax, t);
          pmin = MIN (pmin, p);
          pmax = MAX (pmax, p);
        }
    }
  if (self->have_reference)
    {
      pmin = MIN (pmin, self->reference);
      pmax = MAX (pmax, self->reference);
    }

  if (self->series->len == 0 || !(tmax > tmin) || width < left + right + 20
      || height < top + bottom + 20)
    {
      int tw, th;

      pango_layout_set_text (layout, self->placeholder != NULL ? self->placeholder
                             : _("Nothing to plot yet."), -1);
      pango_layout_set_width (layout, MAX (width - 24, 10) * PANGO_SCALE);
      pango_layout_set_alignment (layout, PANGO_ALIGN_CENTER);
      pango_layout_get_pixel_size (layout, &tw, &th);
      cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.55);
      cairo_move_to (cr, 12, (height - th) / 2.0);
      pango_cairo_show_layout (cr, layout);
      g_object_unref (layout);
      return;
    }

  /* The axis spans the curves with a margin: a dip of a few bar at 40 bar
   * would be a flat line on an axis from 0. */
  if (!(pmax > pmin))
    {
      pmin -= 0.5e5;
      pmax += 0.5e5;
    }
  else
    {
      double pad = 0.08 * (pmax - pmin);

      pmin -= pad;
      pmax += pad;
    }
  punit = pl_unit_prefs_get_unit (&self->prefs, PL_QUANTITY_PRESSURE);
  pu = pl_unit_get (punit);
  tunit = tmax - tmin < 2.0 ? PL_UNIT_MS : tmax - tmin > 600.0 ? PL_UNIT_MIN : PL_UNIT_S;
  tu = pl_unit_get (tunit);

  {
    double a = pl_unit_from_si (punit, pmin), b = pl_unit_from_si (punit, pmax);

    pstep = pl_plot_nice_step (b - a, 5);
    pmin = pl_unit_to_si (punit, floor (a / pstep) * pstep);
    pmax = pl_unit_to_si (punit, ceil (b / pstep - 1e-9) * pstep);
    tstep = pl_plot_nice_step (pl_unit_from_si (tunit, tmax) - pl_unit_from_si (tunit, tmin),
                               6);
  }

  x0 = left;
  x1 = width - right;
  y0 = height - bottom;
  y1 = top;

#define X(t) (x0 + ((t) - tmin) / (tmax - tmin) * (x1 - x0))
#define Y(p) (y0 - ((p) - pmin) / (pmax - pmin) * (y0 - y1))

  /* Bands (shots) behind everything. */
  cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.07);
  for (guint i = 0; i + 1 < self->bands->len; i += 2)
    {
      double a = CLAMP (g_array_index (self->bands, double, i), tmin, tmax);
      double b = CLAMP (g_array_index (self->bands, double, i + 1), tmin, tmax);

      if (b > a)
        {
          cairo_rectangle (cr, X (a), y1, X (b) - X (a), y0 - y1);
          cairo_fill (cr);
        }
    }

  /* Grid and tick labels. */
  cairo_set_line_width (cr, 1.0);
  pango_layout_set_width (layout, -1);
  {
    double a = pl_unit_from_si (punit, pmin), b = pl_unit_from_si (punit, pmax);

    for (double v = ceil (a / pstep - 1e-9) * pstep; v <= b + pstep * 1e-6; v += pstep)
      {
        double y = round (Y (pl_unit_to_si (punit, v))) + 0.5;
        g_autofree char *text = pl_plot_tick_text (v, pstep);
        int tw, th;

        cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.12);
        cairo_move_to (cr, x0, y);
        cairo_line_to (cr, x1, y);
        cairo_stroke (cr);
        pango_layout_set_text (layout, text, -1);
        pango_layout_get_pixel_size (layout, &tw, &th);
        cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.8);
        cairo_move_to (cr, x0 - 6 - tw, y - th / 2.0);
        pango_cairo_show_layout (cr, layout);
      }
  }
  {
    double a = pl_unit_from_si (tunit, tmin), b = pl_unit_from_si (tunit, tmax);

    for (double v = ceil (a / tstep - 1e-9) * tstep; v <= b + tstep * 1e-6; v += tstep)
      {
        double x = round (X (pl_unit_to_si (tunit, v))) + 0.5;
        g_autofree char *text = pl_plot_tick_text (v, tstep);
        int tw, th;

        cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.12);
        cairo_move_to (cr, x, y0);
        cairo_line_to (cr, x, y1);
        cairo_stroke (cr);
        pango_layout_set_text (layout, text, -1);
        pango_layout_get_pixel_size (layout, &tw, &th);
        cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.8);
        cairo_move_to (cr, x - tw / 2.0, y0 + 4);
        pango_cairo_show_layout (cr, layout);
      }
  }

  /* Axes and their titles with units. */
  cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.7);
  cairo_move_to (cr, x0 + 0.5, y1);
  cairo_line_to (cr, x0 + 0.5, y0 + 0.5);
  cairo_line_to (cr, x1, y0 + 0.5);
  cairo_stroke (cr);
  {
    /* Translators: axis titles of the time plot with the unit, "Time (ms)". */
    g_autofree char *ttitle = g_strdup_printf (_("Time (%s)"), tu->symbol);
    g_autofree char *ptitle = g_strdup_printf (_("Pressure (%s)"), pu->symbol);
    int tw, th;

    pango_layout_set_text (layout, ttitle, -1);
    pango_layout_get_pixel_size (layout, &tw, &th);
    cairo_move_to (cr, (x0 + x1 - tw) / 2.0, height - th - 2);
    pango_cairo_show_layout (cr, layout);
    pango_layout_set_text (layout, ptitle, -1);
    pango_layout_get_pixel_size (layout, &tw, &th);
    cairo_save (cr);
    cairo_move_to (cr, 2, (y0 + y1 + tw) / 2.0);
    cairo_rotate (cr, -G_PI / 2.0);
    pango_cairo_show_layout (cr, layout);
    cairo_restore (cr);
  }

  /* Reference line. */
  if (self->have_reference)
    {
      double y = round (Y (self->reference)) + 0.5;
      static const double dash[] = { 3, 3 };

      cairo_save (cr);
      cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.6);
      cairo_set_dash (cr, dash, 2, 0);
      cairo_move_to (cr, x0, y);
      cairo_line_to (cr, x1, y);
      cairo_stroke (cr);
      cairo_restore (cr);
      if (self->reference_label != NULL)
        {
          int tw, th;

          pango_layout_set_text (layout, self->reference_label, -1);
          pango_layout_get_pixel_size (layout, &tw, &th);
          cairo_move_to (cr, x1 - tw - 4, y - th - 1);
          pango_cairo_show_layout (cr, layout);
        }
    }

  /* The lines, clipped to the plot area. */
  cairo_save (cr);
  cairo_rectangle (cr, x0, y1 - 2, x1 - x0, y0 - y1 + 4);
  cairo_clip (cr);
  cairo_set_line_width (cr, 2.0);
  cairo_set_line_join (cr, CAIRO_LINE_JOIN_ROUND);
  for (guint i = 0; i < self->series->len; i++)
    {
      PlPlotSeries *s = g_ptr_array_index (self->series, i);
      const PlRgb *c = &colors[i % G_N_ELEMENTS (pl_plot_light)];
      const double *d = pl_plot_dashes[(i / G_N_ELEMENTS (pl_plot_light)
                                        + i) % G_N_ELEMENTS (pl_plot_dashes)];
      gboolean pen = FALSE;

      cairo_set_source_rgba (cr, c->r, c->g, c->b, self->stale ? 0.35 : 1.0);
      if (d[0] > 0)
        {
          double dd[2] = { d[0] * 2.0, d[1] * 2.0 };
          cairo_set_dash (cr, dd, 2, 0);
        }
      else
        cairo_set_dash (cr, NULL, 0, 0);
      for (guint k = 0; k < s->t->len; k++)
        {
          double t = g_array_index (s->t, double, k), p = g_array_index (s->p, double, k);

          if (!isfinite (t) || !isfinite (p))
            {
              pen = FALSE;
              continue;
            }
          if (pen)
            cairo_line_to (cr, X (t), Y (p));
          else
            cairo_move_to (cr, X (t), Y (p));
          pen = TRUE;
        }
      cairo_stroke (cr);
    }
  cairo_restore (cr);

  /* Legend, top right, on a plate so it reads over the lines. */
  {
    int lw = 0, lh = 0, row = 0;

    for (guint i = 0; i < self->series->len; i++)
      {
        PlPlotSeries *s = g_ptr_array_index (self->series, i);
        int tw, th;

        pango_layout_set_text (layout, s->label, -1);
        pango_layout_get_pixel_size (layout, &tw, &th);
        lw = MAX (lw, tw);
        row = MAX (row, th);
      }
    lh = row * (int) self->series->len;
    if (lw > 0)
      {
        double bx = x1 - lw - 44, by = y1 + 6;
        GdkRGBA bg = { dark ? 0.13 : 1.0, dark ? 0.13 : 1.0, dark ? 0.14 : 1.0, 0.85 };

        cairo_set_source_rgba (cr, bg.red, bg.green, bg.blue, bg.alpha);
        cairo_rectangle (cr, bx - 6, by - 4, lw + 44, lh + 8);
        cairo_fill_preserve (cr);
        cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 0.25);
        cairo_set_line_width (cr, 1.0);
        cairo_stroke (cr);
        for (guint i = 0; i < self->series->len; i++)
          {
            PlPlotSeries *s = g_ptr_array_index (self->series, i);
            const PlRgb *c = &colors[i % G_N_ELEMENTS (pl_plot_light)];
            const double *d = pl_plot_dashes[(i / G_N_ELEMENTS (pl_plot_light)
                                              + i) % G_N_ELEMENTS (pl_plot_dashes)];
            double ly = by + row * (i + 0.5);

            cairo_set_source_rgb (cr, c->r, c->g, c->b);
            cairo_set_line_width (cr, 2.0);
            if (d[0] > 0)
              {
                double dd[2] = { d[0] * 2.0, d[1] * 2.0 };
                cairo_set_dash (cr, dd, 2, 0);
              }
            else
              cairo_set_dash (cr, NULL, 0, 0);
            cairo_move_to (cr, bx, ly);
            cairo_line_to (cr, bx + 28, ly);
            cairo_stroke (cr);
            cairo_set_dash (cr, NULL, 0, 0);
            cairo_set_source_rgba (cr, fg.red, fg.green, fg.blue, 1.0);
            pango_layout_set_text (layout, s->label, -1);
            cairo_move_to (cr, bx + 34, by + row * i);
            pango_cairo_show_layout (cr, layout);
          }
      }
  }
#undef X
#undef Y
  g_object_unref (layout);
}

static void
pl_plot_snapshot (GtkWidget *widget, GtkSnapshot *snapshot)
{
  int w = gtk_widget_get_width (widget), h = gtk_widget_get_height (widget);
  cairo_t *cr;

  if (w <= 0 || h <= 0)
    return;
  cr = gtk_snapshot_append_cairo (snapshot, &GRAPHENE_RECT_INIT (0, 0, w, h));
  pl_plot_draw (PL_PLOT (widget), cr, w, h);
  cairo_destroy (cr);
}

static void
pl_plot_measure (GtkWidget *widget, GtkOrientation orientation, int for_size, int *minimum,
                 int *natural, int *minimum_baseline, int *natural_baseline)
{
  *minimum = orientation == GTK_ORIENTATION_HORIZONTAL ? 240 : 160;
  *natural = orientation == GTK_ORIENTATION_HORIZONTAL ? 640 : 260;
}

static void
pl_plot_finalize (GObject *object)
{
  PlPlot *self = PL_PLOT (object);

  g_ptr_array_unref (self->series);
  g_array_unref (self->bands);
  g_free (self->reference_label);
  g_free (self->placeholder);
  G_OBJECT_CLASS (pl_plot_parent_class)->finalize (object);
}

static void
pl_plot_class_init (PlPlotClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->finalize = pl_plot_finalize;
  widget_class->snapshot = pl_plot_snapshot;
  widget_class->measure = pl_plot_measure;
  gtk_widget_class_set_css_name (widget_class, "plplot");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_IMG);
}

static void
pl_plot_init (PlPlot *self)
{
  self->series = g_ptr_array_new_with_free_func (pl_plot_series_free);
  self->bands = g_array_new (FALSE, FALSE, sizeof (double));
  pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  gtk_widget_set_hexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_vexpand (GTK_WIDGET (self), TRUE);
}

GtkWidget *
pl_plot_new (void)
{
  return g_object_new (PL_TYPE_PLOT, NULL);
}

void
pl_plot_clear (PlPlot *self)
{
  g_return_if_fail (PL_IS_PLOT (self));
  g_ptr_array_set_size (self->series, 0);
  g_array_set_size (self->bands, 0);
  self->have_reference = FALSE;
  g_clear_pointer (&self->reference_label, g_free);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_plot_add_series (PlPlot *self, const char *label, const double *t, const double *p,
                    guint n)
{
  PlPlotSeries *s;

  g_return_if_fail (PL_IS_PLOT (self));
  g_return_if_fail (n == 0 || (t != NULL && p != NULL));

  s = g_new0 (PlPlotSeries, 1);
  s->label = g_strdup (label != NULL ? label : "");
  s->t = g_array_sized_new (FALSE, FALSE, sizeof (double), n);
  s->p = g_array_sized_new (FALSE, FALSE, sizeof (double), n);
  g_array_append_vals (s->t, t, n);
  g_array_append_vals (s->p, p, n);
  g_ptr_array_add (self->series, s);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

guint
pl_plot_get_n_series (PlPlot *self)
{
  g_return_val_if_fail (PL_IS_PLOT (self), 0);
  return self->series->len;
}

void
pl_plot_add_band (PlPlot *self, double t0, double t1)
{
  g_return_if_fail (PL_IS_PLOT (self));
  g_array_append_val (self->bands, t0);
  g_array_append_val (self->bands, t1);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_plot_set_reference (PlPlot *self, double pressure, const char *label)
{
  g_return_if_fail (PL_IS_PLOT (self));
  self->have_reference = isfinite (pressure);
  self->reference = pressure;
  g_free (self->reference_label);
  self->reference_label = g_strdup (label);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_plot_set_prefs (PlPlot *self, const PlUnitPrefs *prefs)
{
  g_return_if_fail (PL_IS_PLOT (self));
  if (prefs != NULL)
    self->prefs = *prefs;
  else
    pl_unit_prefs_init (&self->prefs, PL_UNIT_SYSTEM_SI);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_plot_set_placeholder (PlPlot *self, const char *text)
{
  g_return_if_fail (PL_IS_PLOT (self));
  g_free (self->placeholder);
  self->placeholder = g_strdup (text);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_plot_set_stale (PlPlot *self, gboolean stale)
{
  g_return_if_fail (PL_IS_PLOT (self));
  self->stale = stale;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}
