/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-export.c: the backends: PDF (every sheet a page), SVG and
 * PNG (a file per sheet, pl-work-order.h says why).  Each file is made in
 * memory and then written through a temporary file that is renamed over the
 * target (g_file_set_contents), so a failure never leaves half a file.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <cairo-pdf.h>
#include <glib/gstdio.h>
#include <sys/stat.h>
#include <cairo-svg.h>
#include <glib/gi18n.h>
#include <libxml/parser.h>
#include <libxml/tree.h>
#include <math.h>
#include <string.h>

/* PostScript points per mm: 72 per inch, 25.4 mm per inch. */
#define PT_PER_MM (72.0 / 25.4)

/* The generator mark every SVG and PNG sheet carries, so a later export
 * knows which NAME-N files it may remove: in an SVG, an element in this
 * namespace inside <metadata> (SVG 1.1 sec. 21); in a PNG, a tEXt chunk
 * with the keyword "Software" (PNG, ISO/IEC 15948 sec. 11.3.4). */
#define GENERATOR_NS "https://pressline.org/ns/work-order"
#define GENERATOR_TEXT "Pressline " PACKAGE_VERSION
#define GENERATOR_PREFIX "Pressline"
/* Files larger than this are not read to look for the mark (they are not
 * sheets of ours): 64 MiB, above a 600 dpi A3 PNG. */
#define MARK_MAX_BYTES (64u << 20)

static cairo_status_t
append_bytes (void *closure, const unsigned char *data, unsigned int length)
{
  g_byte_array_append (closure, data, length);
  return CAIRO_STATUS_SUCCESS;
}

char *
pl_work_order_sheet_filename (const char *filename, guint index)
{
  g_autofree char *dir = NULL, *base = NULL, *name = NULL;
  const char *dot;

  g_return_val_if_fail (filename != NULL, NULL);
  if (index == 0)
    return g_strdup (filename);
  dir = g_path_get_dirname (filename);
  base = g_path_get_basename (filename);
  dot = strrchr (base, '.');
  if (dot != NULL && dot != base)
    name = g_strdup_printf ("%.*s-%u%s", (int) (dot - base), base, index + 1, dot);
  else
    name = g_strdup_printf ("%s-%u", base, index + 1);
  if (g_str_equal (dir, ".") && strchr (filename, G_DIR_SEPARATOR) == NULL)
    return g_steal_pointer (&name);
  return g_build_filename (dir, name, NULL);
}

static gboolean
render_failed (cairo_status_t status, const char *filename, GError **error)
{
  if (status == CAIRO_STATUS_SUCCESS)
    return FALSE;
  g_set_error (error, PL_WORK_ORDER_ERROR, PL_WORK_ORDER_ERROR_RENDER,
               /* Translators: the first %s is a file name, the second cairo's
                * reason ("out of memory"). */
               _("Could not draw the work order for %s: %s"), filename,
               cairo_status_to_string (status));
  return TRUE;
}

static char *
document_title (PlWorkOrder *wo)
{
  const char *number = pl_part_get_text (pl_document_get_title (wo->doc), "work-order");

  /* Translators: the title of an exported work order, with its number. */
  return *number ? g_strdup_printf (_("Work order %s"), number) : g_strdup (_("Work order"));
}

static GByteArray *
render_pdf (PlWorkOrder *wo, const char *filename, GError **error)
{
  g_autoptr (GByteArray) bytes = g_byte_array_new ();
  g_autofree char *title = document_title (wo);
  cairo_surface_t *surface;
  cairo_status_t status;

  surface = cairo_pdf_surface_create_for_stream (append_bytes, bytes,
                                                 wo->opts.width_mm * PT_PER_MM,
                                                 wo->opts.height_mm * PT_PER_MM);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_TITLE, title);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_CREATOR,
                                  "Pressline " PACKAGE_VERSION);
  for (guint i = 0; i < wo->n_sheets; i++)
    {
      cairo_t *cr = cairo_create (surface);

      cairo_scale (cr, PT_PER_MM, PT_PER_MM);
      pl_work_order_draw_sheet (wo, cr, i);
      cairo_show_page (cr);
      status = cairo_status (cr);
      cairo_destroy (cr);
      if (render_failed (status, filename, error))
        {
          cairo_surface_destroy (surface);
          return NULL;
        }
    }
  cairo_surface_finish (surface);
  status = cairo_surface_status (surface);
  cairo_surface_destroy (surface);
  if (render_failed (status, filename, error))
    return NULL;
  return g_steal_pointer (&bytes);
}

/* cairo draws text as glyph outlines in SVG; a <title> and a <desc> with
 * the sheet's text make it searchable and readable to screen readers
 * (SVG 1.1 sec. 5.4). */
static GByteArray *
add_svg_description (PlWorkOrder *wo, GByteArray *svg, guint sheet)
{
  xmlDocPtr doc = xmlReadMemory ((const char *) svg->data, (int) svg->len, NULL, "UTF-8",
                                 XML_PARSE_NONET);
  xmlNodePtr root, title, desc, metadata, generator;
  g_autofree char *name = document_title (wo);
  /* Translators: an SVG sheet's title, "Work order DEMO-0001, sheet 2 of 3". */
  g_autofree char *heading = g_strdup_printf (_("%s, sheet %u of %u"), name, sheet + 1,
                                              wo->n_sheets);
  g_autofree char *text = pl_work_order_get_sheet_text (wo, sheet);
  xmlChar *out = NULL;
  int len = 0;
  GByteArray *result;

  if (doc == NULL || (root = xmlDocGetRootElement (doc)) == NULL)
    {
      xmlFreeDoc (doc);
      return g_byte_array_ref (svg);
    }
  title = xmlNewDocNode (doc, root->ns, (const xmlChar *) "title", NULL);
  xmlNodeAddContent (title, (const xmlChar *) heading);
  desc = xmlNewDocNode (doc, root->ns, (const xmlChar *) "desc", NULL);
  xmlNodeAddContent (desc, (const xmlChar *) text);
  metadata = xmlNewDocNode (doc, root->ns, (const xmlChar *) "metadata", NULL);
  generator = xmlNewChild (metadata, NULL, (const xmlChar *) "generator",
                           (const xmlChar *) GENERATOR_TEXT);
  xmlSetNs (generator, xmlNewNs (generator, (const xmlChar *) GENERATOR_NS, NULL));
  if (root->children != NULL)
    {
      xmlAddPrevSibling (root->children, metadata);
      xmlAddPrevSibling (metadata, desc);
      xmlAddPrevSibling (desc, title);
    }
  else
    {
      xmlAddChild (root, title);
      xmlAddChild (root, desc);
      xmlAddChild (root, metadata);
    }
  xmlDocDumpMemoryEnc (doc, &out, &len, "UTF-8");
  xmlFreeDoc (doc);
  if (out == NULL)
    return g_byte_array_ref (svg);
  result = g_byte_array_sized_new ((guint) len);
  g_byte_array_append (result, out, (guint) len);
  xmlFree (out);
  return result;
}

static GByteArray *
render_svg (PlWorkOrder *wo, guint sheet, const char *filename, GError **error)
{
  g_autoptr (GByteArray) bytes = g_byte_array_new ();
  cairo_surface_t *surface;
  cairo_t *cr;
  cairo_status_t status;

  surface = cairo_svg_surface_create_for_stream (append_bytes, bytes,
                                                 wo->opts.width_mm * PT_PER_MM,
                                                 wo->opts.height_mm * PT_PER_MM);
  cr = cairo_create (surface);
  cairo_scale (cr, PT_PER_MM, PT_PER_MM);
  pl_work_order_draw_sheet (wo, cr, sheet);
  status = cairo_status (cr);
  cairo_destroy (cr);
  cairo_surface_finish (surface);
  if (status == CAIRO_STATUS_SUCCESS)
    status = cairo_surface_status (surface);
  cairo_surface_destroy (surface);
  if (render_failed (status, filename, error))
    return NULL;
  return add_svg_description (wo, bytes, sheet);
}

/* CRC-32 of PNG chunks (ISO/IEC 15948 Annex D: polynomial 0xedb88320,
 * reflected, initial and final XOR 0xffffffff). */
static guint32
png_crc (const guint8 *data, gsize length)
{
  guint32 c = 0xffffffffu;

  for (gsize i = 0; i < length; i++)
    {
      c ^= data[i];
      for (int k = 0; k < 8; k++)
        c = (c & 1u) ? 0xedb88320u ^ (c >> 1) : c >> 1;
    }
  return c ^ 0xffffffffu;
}

static void
put_be32 (guint8 *p, guint32 v)
{
  p[0] = (guint8) (v >> 24);
  p[1] = (guint8) (v >> 16);
  p[2] = (guint8) (v >> 8);
  p[3] = (guint8) v;
}

static guint32
get_be32 (const guint8 *p)
{
  return ((guint32) p[0] << 24) | ((guint32) p[1] << 16) | ((guint32) p[2] << 8) | p[3];
}

#define PNG_SIGNATURE_LENGTH 8
#define PNG_IHDR_END (PNG_SIGNATURE_LENGTH + 4 + 4 + 13 + 4)

/* Puts a tEXt "Software" chunk right after the IHDR chunk that cairo
 * writes first (a chunk: length, type, data, CRC of type and data). */
static void
add_png_software (GByteArray *png)
{
  static const char keyword[] = "Software";
  gsize data_len = sizeof keyword + strlen (GENERATOR_TEXT);   /* keyword, NUL, text */
  g_autofree guint8 *chunk = g_malloc (12 + data_len);

  if (png->len < PNG_IHDR_END || memcmp (png->data + 12, "IHDR", 4) != 0)
    return;
  put_be32 (chunk, (guint32) data_len);
  memcpy (chunk + 4, "tEXt", 4);
  memcpy (chunk + 8, keyword, sizeof keyword);
  memcpy (chunk + 8 + sizeof keyword, GENERATOR_TEXT, strlen (GENERATOR_TEXT));
  put_be32 (chunk + 8 + data_len, png_crc (chunk + 4, 4 + data_len));
  {
    guint tail = png->len - PNG_IHDR_END;

    g_byte_array_set_size (png, png->len + (guint) (12 + data_len));
    memmove (png->data + PNG_IHDR_END + 12 + data_len, png->data + PNG_IHDR_END, tail);
    memcpy (png->data + PNG_IHDR_END, chunk, 12 + data_len);
  }
}

static GByteArray *
render_png (PlWorkOrder *wo, guint sheet, double dpi, const char *filename, GError **error)
{
  g_autoptr (GByteArray) bytes = g_byte_array_new ();
  /* The paper's size at the resolution, to the nearest pixel: A4 at 150
   * dpi is 1240 x 1754. */
  int w = (int) lround (wo->opts.width_mm / 25.4 * dpi);
  int h = (int) lround (wo->opts.height_mm / 25.4 * dpi);
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_RGB24, w, h);
  cairo_t *cr = cairo_create (surface);
  cairo_status_t status;

  cairo_scale (cr, w / wo->opts.width_mm, h / wo->opts.height_mm);
  pl_work_order_draw_sheet (wo, cr, sheet);
  status = cairo_status (cr);
  cairo_destroy (cr);
  if (status == CAIRO_STATUS_SUCCESS)
    status = cairo_surface_write_to_png_stream (surface, append_bytes, bytes);
  cairo_surface_destroy (surface);
  if (render_failed (status, filename, error))
    return NULL;
  add_png_software (bytes);
  return g_steal_pointer (&bytes);
}

/* --- removing sheets of an earlier export --- */

static gboolean
png_has_mark (const guint8 *data, gsize length)
{
  static const guint8 signature[PNG_SIGNATURE_LENGTH] = { 0x89, 'P', 'N', 'G', '\r', '\n',
                                                          0x1a, '\n' };
  gsize pos = PNG_SIGNATURE_LENGTH;

  if (length < PNG_SIGNATURE_LENGTH || memcmp (data, signature, sizeof signature) != 0)
    return FALSE;
  while (pos + 12 <= length)
    {
      guint32 n = get_be32 (data + pos);
      const guint8 *type = data + pos + 4;

      if (n > length - pos - 12)
        return FALSE;
      if (memcmp (type, "IDAT", 4) == 0 || memcmp (type, "IEND", 4) == 0)
        return FALSE;
      if (memcmp (type, "tEXt", 4) == 0 && n > 9 && memcmp (type + 4, "Software", 9) == 0
          && n - 9 >= strlen (GENERATOR_PREFIX)
          && memcmp (type + 4 + 9, GENERATOR_PREFIX, strlen (GENERATOR_PREFIX)) == 0)
        return TRUE;
      pos += 12 + n;
    }
  return FALSE;
}

static gboolean
svg_has_mark (const char *data, gsize length)
{
  xmlDocPtr doc = xmlReadMemory (data, (int) length, NULL, NULL, XML_PARSE_NONET
                                 | XML_PARSE_NOERROR | XML_PARSE_NOWARNING);
  xmlNodePtr root = doc != NULL ? xmlDocGetRootElement (doc) : NULL;
  gboolean found = FALSE;

  for (xmlNodePtr m = root != NULL ? root->children : NULL; m != NULL && !found; m = m->next)
    {
      if (m->type != XML_ELEMENT_NODE || !xmlStrEqual (m->name, (const xmlChar *) "metadata"))
        continue;
      for (xmlNodePtr g = m->children; g != NULL && !found; g = g->next)
        if (g->type == XML_ELEMENT_NODE && g->ns != NULL
            && xmlStrEqual (g->ns->href, (const xmlChar *) GENERATOR_NS)
            && xmlStrEqual (g->name, (const xmlChar *) "generator"))
          {
            xmlChar *text = xmlNodeGetContent (g);

            found = text != NULL && g_str_has_prefix ((const char *) text, GENERATOR_PREFIX);
            xmlFree (text);
          }
    }
  xmlFreeDoc (doc);
  return found;
}

/* Whether filename is a regular file that a work order export of this
 * format wrote (it carries the generator mark). */
static gboolean
file_is_our_sheet (const char *filename, PlWorkOrderFormat format)
{
  g_autofree char *data = NULL;
  gsize length = 0;
  GStatBuf st;

  if (g_lstat (filename, &st) != 0 || !S_ISREG (st.st_mode) || (guint64) st.st_size
      > MARK_MAX_BYTES)
    return FALSE;
  if (!g_file_get_contents (filename, &data, &length, NULL))
    return FALSE;
  return format == PL_WORK_ORDER_PNG ? png_has_mark ((const guint8 *) data, length)
                                     : svg_has_mark (data, length);
}

/* The sheets an earlier export of filename left beyond the n_sheets just
 * written: NAME-K.EXT for K = n_sheets + 1, n_sheets + 2, ... as long as
 * each is there and ours; the first gap or foreign file ends the run. */
static void
remove_stale_sheets (const char *filename, PlWorkOrderFormat format, guint n_sheets,
                     GPtrArray *removed)
{
  for (guint k = n_sheets; k < G_MAXUINT; k++)
    {
      g_autofree char *name = pl_work_order_sheet_filename (filename, k);

      if (!file_is_our_sheet (name, format) || g_unlink (name) != 0)
        return;
      if (removed != NULL)
        g_ptr_array_add (removed, g_steal_pointer (&name));
    }
}

gboolean
pl_work_order_write (PlWorkOrder *self, PlWorkOrderFormat format, double dpi,
                     const char *filename, GError **error)
{
  return pl_work_order_write_full (self, format, dpi, filename, NULL, error);
}

gboolean
pl_work_order_write_full (PlWorkOrder *self, PlWorkOrderFormat format, double dpi,
                          const char *filename, GPtrArray *removed, GError **error)
{
  g_autoptr (GPtrArray) files = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GPtrArray) contents = g_ptr_array_new_with_free_func (
    (GDestroyNotify) g_byte_array_unref);

  g_return_val_if_fail (PL_IS_WORK_ORDER (self), FALSE);
  g_return_val_if_fail (filename != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  if ((guint) format >= PL_N_WORK_ORDER_FORMATS)
    {
      g_set_error (error, PL_WORK_ORDER_ERROR, PL_WORK_ORDER_ERROR_FORMAT,
                   _("Cannot tell the format of %s: the name should end in .pdf, .svg or "
                     ".png."), filename);
      return FALSE;
    }
  if (format == PL_WORK_ORDER_PNG
      && !(dpi >= PL_WORK_ORDER_MIN_DPI && dpi <= PL_WORK_ORDER_MAX_DPI))
    {
      g_set_error (error, PL_WORK_ORDER_ERROR, PL_WORK_ORDER_ERROR_FORMAT,
                   _("The resolution must be between %.0f and %.0f dots per inch."),
                   PL_WORK_ORDER_MIN_DPI, PL_WORK_ORDER_MAX_DPI);
      return FALSE;
    }

  /* Everything in memory first: nothing is written unless all of it drew. */
  for (guint i = 0; i < (format == PL_WORK_ORDER_PDF ? 1 : self->n_sheets); i++)
    {
      char *name = pl_work_order_sheet_filename (filename, i);
      GByteArray *bytes = format == PL_WORK_ORDER_PDF ? render_pdf (self, name, error)
                          : format == PL_WORK_ORDER_SVG ? render_svg (self, i, name, error)
                          : render_png (self, i, dpi, name, error);

      g_ptr_array_add (files, name);
      if (bytes == NULL)
        return FALSE;
      g_ptr_array_add (contents, bytes);
    }
  for (guint i = 0; i < files->len; i++)
    {
      GByteArray *bytes = g_ptr_array_index (contents, i);
      g_autoptr (GError) local = NULL;

      if (!g_file_set_contents (g_ptr_array_index (files, i), (const char *) bytes->data,
                                (gssize) bytes->len, &local))
        {
          g_set_error (error, PL_WORK_ORDER_ERROR, PL_WORK_ORDER_ERROR_WRITE,
                       /* Translators: %s is a file name, then the system's reason. */
                       _("Could not write %s: %s"), (const char *) g_ptr_array_index (files, i),
                       local->message);
          return FALSE;
        }
    }
  if (format != PL_WORK_ORDER_PDF)
    remove_stale_sheets (filename, format, files->len, removed);
  return TRUE;
}
