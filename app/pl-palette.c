/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-palette.c: colours of the three styles and the pressure ramp.
 */
#include "config.h"

#include "pl-palette.h"

#include <math.h>

#define RGB(r, g, b) { (r) / 255.0, (g) / 255.0, (b) / 255.0, 1.0 }
#define RGBA(r, g, b, a) { (r) / 255.0, (g) / 255.0, (b) / 255.0, (a) }
#define GREY(v) { (v) / 255.0, (v) / 255.0, (v) / 255.0, 1.0 }
#define GREYA(v, a) { (v) / 255.0, (v) / 255.0, (v) / 255.0, (a) }

/* The project's own choices: a warm paper white and a slate ink for light,
 * their inverse for dark; selection in a blue that is not in cividis (so a
 * selected wire never reads as a pressure), dose colours that differ in
 * lightness as well as hue. */
static const PlPalette palettes[PL_N_RENDER_STYLES] = {
  [PL_RENDER_STYLE_LIGHT] = {
    .background = RGB (250, 249, 246),
    .grid_minor = RGB (234, 232, 226),
    .grid_major = RGB (214, 211, 203),
    .ink = RGB (38, 44, 52),
    .fill = RGB (255, 255, 255),
    .fluid = RGB (176, 186, 198),
    .gas = RGB (96, 106, 118),
    .text = RGB (28, 32, 38),
    .text_dim = RGB (110, 116, 124),
    .port = RGB (38, 44, 52),
    .port_highlight = RGB (214, 92, 20),
    .selection = RGB (36, 110, 220),
    .hover = RGBA (36, 110, 220, 0.55),
    .label_bg = RGBA (255, 255, 255, 0.88),
    .dose_ok = RGB (60, 140, 90),
    .dose_bad = RGB (190, 50, 40),
    .stale = RGBA (120, 120, 120, 0.55),
    .greys_only = FALSE,
  },
  [PL_RENDER_STYLE_DARK] = {
    .background = RGB (30, 32, 36),
    .grid_minor = RGB (40, 43, 48),
    .grid_major = RGB (54, 58, 64),
    .ink = RGB (222, 226, 232),
    .fill = RGB (46, 50, 56),
    .fluid = RGB (98, 110, 124),
    .gas = RGB (170, 178, 188),
    .text = RGB (232, 234, 238),
    .text_dim = RGB (150, 156, 164),
    .port = RGB (222, 226, 232),
    .port_highlight = RGB (255, 150, 70),
    .selection = RGB (110, 170, 255),
    .hover = RGBA (110, 170, 255, 0.55),
    .label_bg = RGBA (30, 32, 36, 0.88),
    .dose_ok = RGB (110, 200, 140),
    .dose_bad = RGB (255, 110, 95),
    .stale = RGBA (160, 160, 160, 0.5),
    .greys_only = FALSE,
  },
  [PL_RENDER_STYLE_PRINT] = {
    .background = GREY (255),
    .grid_minor = GREY (235),
    .grid_major = GREY (215),
    .ink = GREY (0),
    .fill = GREY (255),
    .fluid = GREY (200),
    .gas = GREY (90),
    .text = GREY (0),
    .text_dim = GREY (90),
    .port = GREY (0),
    .port_highlight = GREY (60),
    .selection = GREY (40),
    .hover = GREYA (40, 0.5),
    .label_bg = GREYA (255, 0.9),
    .dose_ok = GREY (150),
    .dose_bad = GREY (20),
    .stale = GREYA (110, 0.55),
    .greys_only = TRUE,
  },
};

/* Entries 0, 8, 16, ..., 248 and 255 of the published cividis table
 * (Nuñez et al. 2018, as distributed with matplotlib's _cm_listed.py).
 * Linear interpolation between them stays within 0.019 of every entry
 * of the full table. */
static const double cividis_knots[][3] = {
  { 0.000000, 0.135112, 0.304751 },   /*   0 */
  { 0.000000, 0.157932, 0.357521 },   /*   8 */
  { 0.000000, 0.178802, 0.414764 },   /*  16 */
  { 0.017852, 0.198528, 0.441248 },   /*  24 */
  { 0.103401, 0.220406, 0.435790 },   /*  32 */
  { 0.154261, 0.242475, 0.430120 },   /*  40 */
  { 0.195057, 0.264372, 0.425924 },   /*  48 */
  { 0.230871, 0.286134, 0.423498 },   /*  56 */
  { 0.263738, 0.307831, 0.422789 },   /*  64 */
  { 0.294669, 0.329531, 0.423716 },   /*  72 */
  { 0.324250, 0.351289, 0.426250 },   /*  80 */
  { 0.352892, 0.373153, 0.430226 },   /*  88 */
  { 0.380830, 0.395164, 0.435653 },   /*  96 */
  { 0.408226, 0.417357, 0.442570 },   /* 104 */
  { 0.435168, 0.439763, 0.451134 },   /* 112 */
  { 0.461616, 0.462405, 0.461969 },   /* 120 */
  { 0.488697, 0.485318, 0.471008 },   /* 128 */
  { 0.517920, 0.508454, 0.472707 },   /* 136 */
  { 0.547840, 0.531895, 0.471704 },   /* 144 */
  { 0.578236, 0.555673, 0.468724 },   /* 152 */
  { 0.609105, 0.579816, 0.463638 },   /* 160 */
  { 0.640352, 0.604354, 0.456791 },   /* 168 */
  { 0.671991, 0.629316, 0.448018 },   /* 176 */
  { 0.704037, 0.654731, 0.437147 },   /* 184 */
  { 0.736488, 0.680629, 0.424028 },   /* 192 */
  { 0.769353, 0.707035, 0.408516 },   /* 200 */
  { 0.802667, 0.733978, 0.390153 },   /* 208 */
  { 0.836429, 0.761483, 0.368747 },   /* 216 */
  { 0.870717, 0.789572, 0.343333 },   /* 224 */
  { 0.905589, 0.818257, 0.312889 },   /* 232 */
  { 0.941147, 0.847530, 0.275815 },   /* 240 */
  { 0.977780, 0.877281, 0.227954 },   /* 248 */
  { 0.995737, 0.909344, 0.217772 },   /* 255 */
};

const PlPalette *
pl_palette_get (PlRenderStyle style)
{
  if ((guint) style >= PL_N_RENDER_STYLES)
    return NULL;
  return &palettes[style];
}

void
pl_color_cividis (double t, PlColor *out)
{
  const guint last = G_N_ELEMENTS (cividis_knots) - 1;
  double idx, lo_pos, hi_pos, f;
  guint k;

  g_return_if_fail (out != NULL);
  t = isnan (t) ? 0.0 : CLAMP (t, 0.0, 1.0);
  /* Knot k sits at table entry 8k (the last at 255) of 0..255. */
  idx = t * 255.0;
  k = MIN ((guint) (idx / 8.0), last - 1);
  lo_pos = 8.0 * k;
  hi_pos = k + 1 == last ? 255.0 : 8.0 * (k + 1);
  f = CLAMP ((idx - lo_pos) / (hi_pos - lo_pos), 0.0, 1.0);
  out->r = cividis_knots[k][0] + f * (cividis_knots[k + 1][0] - cividis_knots[k][0]);
  out->g = cividis_knots[k][1] + f * (cividis_knots[k + 1][1] - cividis_knots[k][1]);
  out->b = cividis_knots[k][2] + f * (cividis_knots[k + 1][2] - cividis_knots[k][2]);
  out->a = 1.0;
}

void
pl_palette_ramp (const PlPalette *palette, double t, PlColor *out)
{
  g_return_if_fail (palette != NULL && out != NULL);
  if (palette->greys_only)
    {
      /* From 78 % to 8 % grey: the low end still shows on white paper. */
      double v = 0.78 - 0.70 * (isnan (t) ? 0.0 : CLAMP (t, 0.0, 1.0));

      *out = (PlColor) { v, v, v, 1.0 };
      return;
    }
  pl_color_cividis (t, out);
}

static double
linearise (double c)
{
  /* IEC 61966-2-1 (sRGB) inverse transfer function. */
  return c <= 0.04045 ? c / 12.92 : pow ((c + 0.055) / 1.055, 2.4);
}

double
pl_color_luminance (const PlColor *c)
{
  g_return_val_if_fail (c != NULL, 0.0);
  return 0.2126 * linearise (c->r) + 0.7152 * linearise (c->g) + 0.0722 * linearise (c->b);
}
