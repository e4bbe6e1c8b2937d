/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-plot.h: a time plot of pressures, drawn with cairo.
 *
 * Series are copied in (time in s, pressure in Pa gauge); the plot shows
 * them in the user's pressure unit against a time axis in ms, s or min as
 * the span suits, with ticks at round numbers, a legend, and dashes as well
 * as colours so a print in grey still tells the lines apart.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-units.h"

G_BEGIN_DECLS

#define PL_TYPE_PLOT (pl_plot_get_type ())
G_DECLARE_FINAL_TYPE (PlPlot, pl_plot, PL, PLOT, GtkWidget)

GtkWidget *pl_plot_new (void);

void pl_plot_clear (PlPlot *self);
/* A line through n >= 2 points (t ascending, both copied). */
void pl_plot_add_series (PlPlot *self, const char *label, const double *t, const double *p,
                         guint n);
guint pl_plot_get_n_series (PlPlot *self);
/* A shaded time span behind the lines (a shot's on-time), seconds. */
void pl_plot_add_band (PlPlot *self, double t0, double t1);
/* A horizontal reference line (the safe pressure), Pa, with a label. */
void pl_plot_set_reference (PlPlot *self, double pressure, const char *label);
/* Copied; NULL: SI. */
void pl_plot_set_prefs (PlPlot *self, const PlUnitPrefs *prefs);
/* Shown in the middle when there is nothing to draw. */
void pl_plot_set_placeholder (PlPlot *self, const char *text);
/* Dims the lines and says so (results out of date). */
void pl_plot_set_stale (PlPlot *self, gboolean stale);

/* Draws the plot into cr at width x height pixels with the widget's
 * present colours: what snapshot() does, and what tests and exports use. */
void pl_plot_draw (PlPlot *self, cairo_t *cr, int width, int height);

G_END_DECLS
