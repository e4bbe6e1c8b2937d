/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-viewport.c: pan and zoom of the canvas.
 */
#include "config.h"

#include "pl-viewport.h"

#include <math.h>

static double
clamp_zoom (double zoom)
{
  return CLAMP (zoom, PL_VIEWPORT_ZOOM_MIN, PL_VIEWPORT_ZOOM_MAX);
}

void
pl_viewport_init (PlViewport *vp, double width, double height)
{
  g_return_if_fail (vp != NULL);

  vp->zoom = 1.0;
  vp->width = isfinite (width) && width > 0.0 ? width : 0.0;
  vp->height = isfinite (height) && height > 0.0 ? height : 0.0;
  vp->origin_x = -0.5 * vp->width / pl_viewport_get_scale (vp);
  vp->origin_y = -0.5 * vp->height / pl_viewport_get_scale (vp);
}

gboolean
pl_viewport_set_size (PlViewport *vp, double width, double height)
{
  double scale;

  g_return_val_if_fail (vp != NULL, FALSE);
  if (!(isfinite (width) && isfinite (height) && width >= 0.0 && height >= 0.0))
    return FALSE;
  /* Keep the centre: a window that grows shows more on every side. */
  scale = pl_viewport_get_scale (vp);
  vp->origin_x += 0.5 * (vp->width - width) / scale;
  vp->origin_y += 0.5 * (vp->height - height) / scale;
  vp->width = width;
  vp->height = height;
  return TRUE;
}

double
pl_viewport_get_scale (const PlViewport *vp)
{
  g_return_val_if_fail (vp != NULL, PL_VIEWPORT_PX_PER_MM);
  return vp->zoom * PL_VIEWPORT_PX_PER_MM;
}

void
pl_viewport_world_to_screen (const PlViewport *vp, PlPoint world, PlPoint *screen)
{
  double scale;

  g_return_if_fail (vp != NULL && screen != NULL);
  scale = pl_viewport_get_scale (vp);
  screen->x = (world.x - vp->origin_x) * scale;
  screen->y = (world.y - vp->origin_y) * scale;
}

void
pl_viewport_screen_to_world (const PlViewport *vp, PlPoint screen, PlPoint *world)
{
  double scale;

  g_return_if_fail (vp != NULL && world != NULL);
  scale = pl_viewport_get_scale (vp);
  world->x = vp->origin_x + screen.x / scale;
  world->y = vp->origin_y + screen.y / scale;
}

double
pl_viewport_world_tolerance (const PlViewport *vp, double px)
{
  g_return_val_if_fail (vp != NULL, 0.0);
  return fabs (px) / pl_viewport_get_scale (vp);
}

gboolean
pl_viewport_pan (PlViewport *vp, double dx, double dy)
{
  double scale, ox, oy;

  g_return_val_if_fail (vp != NULL, FALSE);
  if (!(isfinite (dx) && isfinite (dy)))
    return FALSE;
  scale = pl_viewport_get_scale (vp);
  ox = vp->origin_x - dx / scale;
  oy = vp->origin_y - dy / scale;
  if (!(isfinite (ox) && isfinite (oy)))
    return FALSE;
  vp->origin_x = ox;
  vp->origin_y = oy;
  return dx != 0.0 || dy != 0.0;
}

gboolean
pl_viewport_set_zoom_at (PlViewport *vp, double zoom, double sx, double sy)
{
  PlPoint fixed;
  double scale;

  g_return_val_if_fail (vp != NULL, FALSE);
  if (!(isfinite (zoom) && zoom > 0.0 && isfinite (sx) && isfinite (sy)))
    return FALSE;
  zoom = clamp_zoom (zoom);
  if (zoom == vp->zoom)
    return FALSE;
  /* The world point under (sx, sy) before the change is solved for the
   * new origin: origin' = fixed - s / scale'. */
  pl_viewport_screen_to_world (vp, (PlPoint) { sx, sy }, &fixed);
  vp->zoom = zoom;
  scale = pl_viewport_get_scale (vp);
  vp->origin_x = fixed.x - sx / scale;
  vp->origin_y = fixed.y - sy / scale;
  return TRUE;
}

gboolean
pl_viewport_zoom_at (PlViewport *vp, double factor, double sx, double sy)
{
  g_return_val_if_fail (vp != NULL, FALSE);
  if (!(isfinite (factor) && factor > 0.0))
    return FALSE;
  return pl_viewport_set_zoom_at (vp, vp->zoom * factor, sx, sy);
}

gboolean
pl_viewport_fit (PlViewport *vp, const PlRect *box, double margin_px)
{
  double bw, bh, aw, ah, zoom, scale;

  g_return_val_if_fail (vp != NULL && box != NULL, FALSE);
  if (!(isfinite (box->x0) && isfinite (box->y0) && isfinite (box->x1)
        && isfinite (box->y1) && isfinite (margin_px))
      || vp->width <= 0.0 || vp->height <= 0.0)
    return FALSE;
  bw = fabs (box->x1 - box->x0);
  bh = fabs (box->y1 - box->y0);
  /* A margin wider than half the area would leave nothing: keep at least
   * a tenth of the area for the drawing. */
  aw = MAX (vp->width - 2.0 * MAX (margin_px, 0.0), 0.1 * vp->width);
  ah = MAX (vp->height - 2.0 * MAX (margin_px, 0.0), 0.1 * vp->height);
  if (bw == 0.0 && bh == 0.0)
    zoom = vp->zoom;
  else if (bw == 0.0)
    zoom = ah / (bh * PL_VIEWPORT_PX_PER_MM);
  else if (bh == 0.0)
    zoom = aw / (bw * PL_VIEWPORT_PX_PER_MM);
  else
    zoom = MIN (aw / bw, ah / bh) / PL_VIEWPORT_PX_PER_MM;
  if (!isfinite (zoom))
    return FALSE;
  vp->zoom = clamp_zoom (zoom);
  scale = pl_viewport_get_scale (vp);
  vp->origin_x = 0.5 * (box->x0 + box->x1) - 0.5 * vp->width / scale;
  vp->origin_y = 0.5 * (box->y0 + box->y1) - 0.5 * vp->height / scale;
  return TRUE;
}

void
pl_viewport_get_visible (const PlViewport *vp, PlRect *out)
{
  double scale;

  g_return_if_fail (vp != NULL && out != NULL);
  scale = pl_viewport_get_scale (vp);
  out->x0 = vp->origin_x;
  out->y0 = vp->origin_y;
  out->x1 = vp->origin_x + vp->width / scale;
  out->y1 = vp->origin_y + vp->height / scale;
}

void
pl_viewport_grid_spacing (const PlViewport *vp, double min_px, double *minor, double *major)
{
  /* Mantissas of the 1-2-5 series and the major multiple of each (see the
   * header: majors land on multiples of ten snap steps). */
  static const double mantissa[] = { 1.0, 2.0, 5.0 };
  static const double major_of[] = { 5.0, 5.0, 10.0 };
  double scale, decade = 1.0, step = PL_GRID_SNAP_MM, step_major = 10.0 * PL_GRID_SNAP_MM;
  guint i = 2;   /* start at 5 mm = 5 x 10^0 */

  g_return_if_fail (vp != NULL);
  scale = pl_viewport_get_scale (vp);
  if (!(min_px > 0.0))
    min_px = 1.0;
  /* At most a few dozen steps: the zoom is bounded, and so is min_px in
   * any sane call; the cap keeps an absurd min_px from looping long. */
  for (guint guard = 0; guard < 64 && step * scale < min_px; guard++)
    {
      i++;
      if (i == G_N_ELEMENTS (mantissa))
        {
          i = 0;
          decade *= 10.0;
        }
      step = mantissa[i] * decade;
      step_major = major_of[i] * step;
    }
  if (minor != NULL)
    *minor = step;
  if (major != NULL)
    *major = step_major;
}
