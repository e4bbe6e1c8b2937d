/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-palette.h: the colours of the drawing in each style, and the pressure
 * colour ramp.
 *
 * Shape carries the meaning of every symbol; colour only adds to it, so
 * the print style (greys only) loses nothing but the ramp's hue.
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

/* sRGB components 0..1 and alpha 0..1 (cairo's convention). */
typedef struct
{
  double r, g, b, a;
} PlColor;

typedef enum
{
  PL_RENDER_STYLE_LIGHT,   /* dark ink on a light sheet */
  PL_RENDER_STYLE_DARK,    /* light ink on a dark sheet, for a dark desktop */
  PL_RENDER_STYLE_PRINT,   /* black and greys on white, for paper */
  PL_N_RENDER_STYLES
} PlRenderStyle;

typedef struct
{
  PlColor background;     /* the sheet */
  PlColor grid_minor;     /* grid lines */
  PlColor grid_major;
  PlColor ink;            /* outlines of symbols, wires without results */
  PlColor fill;           /* bodies of symbols */
  PlColor fluid;          /* fluid inside symbols without results */
  PlColor gas;            /* the gas hatch of an accumulator */
  PlColor text;           /* tags and values */
  PlColor text_dim;       /* secondary text, stale marks */
  PlColor port;           /* open circles of ports */
  PlColor port_highlight; /* ports a dragged wire may attach to */
  PlColor selection;      /* outline of selected items */
  PlColor hover;          /* outline of the item under the pointer */
  PlColor label_bg;       /* behind result labels and notes */
  PlColor dose_ok;        /* a dose bar within the uniformity tolerance */
  PlColor dose_bad;       /* ... outside it */
  PlColor stale;          /* hatch over out-of-date results */
  gboolean greys_only;    /* the ramp is drawn in greys (print) */
} PlPalette;

/* The palette of a style (static, never freed); NULL out of range. */
const PlPalette *pl_palette_get (PlRenderStyle style);

/* Cividis at t in 0..1 (clamped; NaN gives the low end), opaque: the
 * colour-blind-friendly ramp of Nuñez, Anderton & Renslow, "Optimizing
 * colormaps with consideration for color vision deficiency...", PLOS ONE
 * 13(7): e0199239 (2018), interpolated in sRGB between 33 entries of its
 * published 256-entry table. */
void pl_color_cividis (double t, PlColor *out);
/* The palette's pressure ramp: cividis, or for a greys-only palette a grey
 * from light (low) to near black (high), so high pressure prints dark. */
void pl_palette_ramp (const PlPalette *palette, double t, PlColor *out);
/* Relative luminance of an sRGB colour (IEC 61966-2-1 transfer function,
 * Rec. 709 primaries: Y = 0.2126 R + 0.7152 G + 0.0722 B). */
double pl_color_luminance (const PlColor *c);

G_END_DECLS
