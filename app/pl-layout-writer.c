/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-layout-writer.c: the layout as XML text, and its atomic save.
 *
 * The text is built by hand rather than through libxml2's tree and
 * serialiser: the order of every attribute, the indent and the escaping
 * are then exactly what the format promises, independent of the library's
 * version, and a text node's white space is never re-indented.
 */
#include "config.h"

#include "pl-layout-writer.h"

#include <errno.h>
#include <fcntl.h>
#include <glib/gi18n.h>
#include <glib/gstdio.h>
#include <math.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "pl-document.h"
#include "pl-part-type.h"
#include "pl-units.h"

/* --- numbers --- */

/* Same value and same sign (so -0 stays -0 and the bytes stay stable). */
static gboolean
pl_same_double (double a, double b)
{
  return a == b && signbit (a) == signbit (b);
}

static const char *const pl_layout_formats[] = {
  "%.1g", "%.2g", "%.3g", "%.4g", "%.5g", "%.6g", "%.7g", "%.8g", "%.9g",
  "%.10g", "%.11g", "%.12g", "%.13g", "%.14g", "%.15g", "%.16g", "%.17g",
};

/* Whether text reads back (through to_si of unit, unless PL_UNIT_NONE) as
 * target. */
static gboolean
pl_layout_reads_back (const char *text, PlUnitId unit, double target)
{
  double back = g_ascii_strtod (text, NULL);

  if (unit != PL_UNIT_NONE)
    back = pl_unit_to_si (unit, back);
  return pl_same_double (back, target);
}

/* The fewest significant digits (1..17) at which value_in_unit reads back
 * (through to_si) as target, in buf; 0 if none does.  "%g" would write
 * 250 with two digits as "2.5e+02": numbers from 1 up to 1e17 are given
 * as many digits as their integer part needs ("250"), which reads back the
 * same (checked); smaller ones keep the exponent form below 1e-4. */
static int
pl_layout_shortest (double value_in_unit, PlUnitId unit, double target,
                    char buf[G_ASCII_DTOSTR_BUF_SIZE])
{
  if (!isfinite (value_in_unit))
    return 0;
  /* g_ascii_formatd takes a format, not a precision argument. */
  for (int digits = 1; digits <= 17; digits++)
    {
      int exponent;

      g_ascii_formatd (buf, G_ASCII_DTOSTR_BUF_SIZE, pl_layout_formats[digits - 1],
                       value_in_unit);
      if (!pl_layout_reads_back (buf, unit, target))
        continue;
      exponent = value_in_unit != 0.0 ? (int) floor (log10 (fabs (value_in_unit))) : 0;
      if (exponent >= digits && exponent < 17)
        {
          char wide[G_ASCII_DTOSTR_BUF_SIZE];

          g_ascii_formatd (wide, sizeof wide, pl_layout_formats[exponent], value_in_unit);
          if (strchr (wide, 'e') == NULL && pl_layout_reads_back (wide, unit, target))
            memcpy (buf, wide, sizeof wide);
        }
      return digits;
    }
  return 0;
}

/* A plain number (coordinates in mm): 17 significant digits always read
 * back exactly (IEEE 754 binary64; Goldberg, "What every computer
 * scientist should know about floating-point arithmetic", 1991, Theorem
 * 15), so this never fails for a finite value. */
static void
pl_layout_append_number (GString *out, double value)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  if (pl_layout_shortest (value, PL_UNIT_NONE, value, buf) == 0)
    g_ascii_formatd (buf, sizeof buf, "%.17g", value);
  g_string_append (out, buf);
}

/* The coherent SI unit of a quantity (factor 1, no offset). */
static PlUnitId
pl_layout_coherent_unit (PlQuantity quantity)
{
  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    {
      const PlUnit *unit = pl_unit_get ((PlUnitId) u);

      if (pl_unit_fits ((PlUnitId) u, quantity) && unit->factor == 1.0 && unit->offset == 0.0)
        return (PlUnitId) u;
    }
  return PL_UNIT_NONE;
}

/* value="..." unit="..." of an SI value of quantity: in the SI system's
 * default unit, the US system's or the coherent SI unit, whichever reads
 * back exactly with the fewest digits (the first of them on a tie), so a
 * 3/8 in bore typed in inches stays "0.375" in, and 9.53 mm stays "9.53"
 * mm.  The coherent unit always succeeds (factor 1, so 17 digits do). */
static void
pl_layout_append_quantity (GString *out, double value_si, PlQuantity quantity)
{
  PlUnitId candidates[3] = {
    pl_unit_system_get_default (PL_UNIT_SYSTEM_SI, quantity),
    pl_unit_system_get_default (PL_UNIT_SYSTEM_US, quantity),
    pl_layout_coherent_unit (quantity),
  };
  char buf[G_ASCII_DTOSTR_BUF_SIZE] = "";
  PlUnitId unit = candidates[2];
  int best = 0;

  for (guint i = 0; i < G_N_ELEMENTS (candidates); i++)
    {
      char text[G_ASCII_DTOSTR_BUF_SIZE];
      int digits;

      if (candidates[i] == PL_UNIT_NONE)
        continue;
      digits = pl_layout_shortest (pl_unit_from_si (candidates[i], value_si), candidates[i],
                                   value_si, text);
      if (digits > 0 && (best == 0 || digits < best))
        {
          best = digits;
          unit = candidates[i];
          memcpy (buf, text, sizeof text);
        }
    }
  if (best == 0)   /* cannot happen for a finite value; keep the file valid */
    g_ascii_formatd (buf, sizeof buf, "%.17g", value_si);
  g_string_append_printf (out, " value=\"%s\" unit=\"", buf);
  /* Unit keys are ASCII but may hold '/', '(' and '.': nothing to escape,
   * yet escape anyway so a future key cannot break the file. */
  for (const char *p = pl_unit_get (unit)->key; *p != '\0'; p++)
    if (*p == '"' || *p == '&' || *p == '<')
      g_string_append_printf (out, "&#%d;", *p);
    else
      g_string_append_c (out, *p);
  g_string_append_c (out, '"');
}

/* --- text --- */

/* XML 1.0, production [2] Char. */
static gboolean
pl_layout_is_xml_char (gunichar c)
{
  return c == 0x9 || c == 0xA || c == 0xD || (c >= 0x20 && c <= 0xD7FF)
         || (c >= 0xE000 && c <= 0xFFFD) || (c >= 0x10000 && c <= 0x10FFFF);
}

/* Appends text escaped for an attribute value (in_attribute) or element
 * content.  In attributes, tab and line breaks become character
 * references, or the reader's attribute-value normalisation (XML 1.0 sec.
 * 3.3.3) would turn them into spaces; in content, '\r' does, or line-end
 * handling (sec. 2.11) would drop it.  FALSE (nothing reliable appended) if
 * text is not valid UTF-8 or holds a character XML cannot carry, with that
 * character in *bad. */
static gboolean
pl_layout_append_text (GString *out, const char *text, gboolean in_attribute, gunichar *bad)
{
  if (!g_utf8_validate (text, -1, NULL))
    {
      *bad = 0xFFFD;
      return FALSE;
    }
  for (const char *p = text; *p != '\0'; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);

      if (!pl_layout_is_xml_char (c))
        {
          *bad = c;
          return FALSE;
        }
      switch (c)
        {
        case '&':
          g_string_append (out, "&amp;");
          break;
        case '<':
          g_string_append (out, "&lt;");
          break;
        case '>':
          g_string_append (out, "&gt;");
          break;
        case '"':
          g_string_append (out, in_attribute ? "&quot;" : "\"");
          break;
        case '\r':
          g_string_append (out, "&#13;");
          break;
        case '\t':
          g_string_append (out, in_attribute ? "&#9;" : "\t");
          break;
        case '\n':
          g_string_append (out, in_attribute ? "&#10;" : "\n");
          break;
        default:
          g_string_append_len (out, p, g_utf8_next_char (p) - p);
          break;
        }
    }
  return TRUE;
}

typedef struct
{
  GString *out;
  GError *error;
} Writer;

static void
pl_layout_text_or_fail (Writer *w, const char *text, gboolean in_attribute, const char *item,
                        const char *field)
{
  gunichar bad = 0;

  if (w->error != NULL || pl_layout_append_text (w->out, text, in_attribute, &bad))
    return;
  g_set_error (&w->error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_UNSAVABLE,
               _("%s, %s: the character U+%04X cannot be stored in a layout file"), item,
               field, (guint) bad);
}

/* --- sections --- */

static void
pl_layout_write_values (Writer *w, const PlPart *part, const char *item, const char *indent)
{
  const PlPartType *type = pl_part_get_part_type (part);

  for (guint i = 0; i < type->n_params && w->error == NULL; i++)
    {
      const PlParamSpec *spec = &type->params[i];
      const PlValue *value = pl_part_get_nth_value (part, i);

      g_string_append (w->out, indent);
      switch (spec->kind)
        {
        case PL_PARAM_NUMBER:
          g_string_append_printf (w->out, "<number key=\"%s\"", spec->key);
          pl_layout_append_quantity (w->out, value->number, spec->quantity);
          g_string_append (w->out, "/>\n");
          break;
        case PL_PARAM_CHOICE:
          g_string_append_printf (w->out, "<choice key=\"%s\" value=\"%s\"/>\n", spec->key,
                                  value->choice < spec->n_choices
                                  ? spec->choices[value->choice].key : "");
          break;
        case PL_PARAM_BOOLEAN:
          g_string_append_printf (w->out, "<boolean key=\"%s\" value=\"%s\"/>\n", spec->key,
                                  value->boolean ? "true" : "false");
          break;
        case PL_PARAM_TEXT:
          g_string_append_printf (w->out, "<text key=\"%s\">", spec->key);
          pl_layout_text_or_fail (w, value->text != NULL ? value->text : "", FALSE, item,
                                  spec->key);
          g_string_append (w->out, "</text>\n");
          break;
        default:
          g_string_append_printf (w->out, "<!-- %s -->\n", spec->key);
          break;
        }
    }
}

static void
pl_layout_write_pseudo (Writer *w, const char *element, const PlPart *part, const char *item)
{
  g_string_append_printf (w->out, "  <%s>\n", element);
  pl_layout_write_values (w, part, item, "    ");
  g_string_append_printf (w->out, "  </%s>\n", element);
}

static void
pl_layout_write_parts (Writer *w, PlDocument *doc)
{
  guint n = pl_document_get_n_parts (doc);

  if (n == 0)
    {
      g_string_append (w->out, "  <parts/>\n");
      return;
    }
  g_string_append (w->out, "  <parts>\n");
  for (guint i = 0; i < n && w->error == NULL; i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      g_autofree char *item = g_strdup_printf (_("part “%s”"), pl_part_get_tag (part));

      g_string_append_printf (w->out, "    <part id=\"%s\" type=\"%s\" tag=\"",
                              pl_part_get_id (part), pl_part_get_part_type (part)->key);
      pl_layout_text_or_fail (w, pl_part_get_tag (part), TRUE, item, "tag");
      g_string_append (w->out, "\" x=\"");
      pl_layout_append_number (w->out, pl_part_get_x (part));
      g_string_append (w->out, "\" y=\"");
      pl_layout_append_number (w->out, pl_part_get_y (part));
      g_string_append_printf (w->out, "\" rotation=\"%u\" mirrored=\"%s\">\n",
                              (pl_part_get_rotation (part) % 4) * 90,
                              pl_part_get_mirrored (part) ? "true" : "false");
      pl_layout_write_values (w, part, item, "      ");
      g_string_append (w->out, "    </part>\n");
    }
  g_string_append (w->out, "  </parts>\n");
}

static void
pl_layout_write_wires (Writer *w, PlDocument *doc)
{
  guint n = pl_document_get_n_wires (doc);

  if (n == 0)
    {
      g_string_append (w->out, "  <wires/>\n");
      return;
    }
  g_string_append (w->out, "  <wires>\n");
  for (guint i = 0; i < n; i++)
    {
      const PlWire *wire = pl_document_get_wire (doc, i);
      guint n_bends = 0;
      const PlPoint *bends = pl_wire_get_bends (wire, &n_bends);

      g_string_append_printf (w->out, "    <wire id=\"%s\" from=\"%s:%s\" to=\"%s:%s\"",
                              pl_wire_get_id (wire), pl_wire_get_part_id (wire, 0),
                              pl_wire_get_port_key (wire, 0), pl_wire_get_part_id (wire, 1),
                              pl_wire_get_port_key (wire, 1));
      if (n_bends == 0)
        {
          g_string_append (w->out, "/>\n");
          continue;
        }
      g_string_append (w->out, ">\n");
      for (guint j = 0; j < n_bends; j++)
        {
          g_string_append (w->out, "      <bend x=\"");
          pl_layout_append_number (w->out, bends[j].x);
          g_string_append (w->out, "\" y=\"");
          pl_layout_append_number (w->out, bends[j].y);
          g_string_append (w->out, "\"/>\n");
        }
      g_string_append (w->out, "    </wire>\n");
    }
  g_string_append (w->out, "  </wires>\n");
}

static void
pl_layout_write_notes (Writer *w, PlDocument *doc)
{
  guint n = pl_document_get_n_notes (doc);

  if (n == 0)
    {
      g_string_append (w->out, "  <notes/>\n");
      return;
    }
  g_string_append (w->out, "  <notes>\n");
  for (guint i = 0; i < n && w->error == NULL; i++)
    {
      const PlNote *note = pl_document_get_note (doc, i);
      g_autofree char *item = g_strdup_printf (_("note “%s”"), pl_note_get_id (note));

      g_string_append_printf (w->out, "    <note id=\"%s\" x=\"", pl_note_get_id (note));
      pl_layout_append_number (w->out, pl_note_get_x (note));
      g_string_append (w->out, "\" y=\"");
      pl_layout_append_number (w->out, pl_note_get_y (note));
      g_string_append (w->out, "\">");
      pl_layout_text_or_fail (w, pl_note_get_text (note), FALSE, item, "text");
      g_string_append (w->out, "</note>\n");
    }
  g_string_append (w->out, "  </notes>\n");
}

char *
pl_layout_write_data (PlDocument *doc, gsize *length, GError **error)
{
  Writer w = { NULL, NULL };

  g_return_val_if_fail (doc != NULL, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  w.out = g_string_sized_new (4096);
  g_string_append (w.out, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
  g_string_append_printf (w.out, "<layout xmlns=\"%s\" version=\"%d\" drawing-unit=\"mm\">\n",
                          PL_LAYOUT_NAMESPACE, PL_LAYOUT_FORMAT_VERSION);
  pl_layout_write_pseudo (&w, "title", pl_document_get_title (doc), _("the title block"));
  if (w.error == NULL)
    pl_layout_write_pseudo (&w, "scenario", pl_document_get_scenario (doc), _("the scenario"));
  if (w.error == NULL)
    pl_layout_write_parts (&w, doc);
  if (w.error == NULL)
    pl_layout_write_wires (&w, doc);
  if (w.error == NULL)
    pl_layout_write_notes (&w, doc);
  g_string_append (w.out, "</layout>\n");

  if (w.error != NULL)
    {
      g_propagate_error (error, w.error);
      g_string_free (w.out, TRUE);
      return NULL;
    }
  if (length != NULL)
    *length = w.out->len;
  return g_string_free (w.out, FALSE);
}

/* --- the atomic save --- */

static gboolean
pl_layout_write_all (int fd, const char *data, gsize length)
{
  while (length > 0)
    {
      ssize_t n = write (fd, data, length);

      if (n < 0 && errno == EINTR)
        continue;
      if (n <= 0)
        return FALSE;
      data += n;
      length -= (gsize) n;
    }
  return TRUE;
}

/* The file that a chain of symbolic links at path ends in (path itself if
 * it is none, or does not exist yet); NULL with *err_no set on a loop or
 * an unreadable link. */
static char *
pl_layout_follow_links (const char *path, int *err_no)
{
  char *current = g_strdup (path);

  /* 40: the most links Linux follows in one path (MAXSYMLINKS). */
  for (int i = 0; i < 40; i++)
    {
      struct stat st;
      g_autofree char *link = NULL;
      g_autofree char *dir = NULL;
      char *next;

      if (lstat (current, &st) != 0 || !S_ISLNK (st.st_mode))
        return current;
      link = g_file_read_link (current, NULL);
      if (link == NULL)
        {
          *err_no = errno;
          g_free (current);
          return NULL;
        }
      dir = g_path_get_dirname (current);
      next = g_path_is_absolute (link) ? g_strdup (link)
                                       : g_build_filename (dir, link, NULL);
      g_free (current);
      current = next;
    }
  *err_no = ELOOP;
  g_free (current);
  return NULL;
}

gboolean
pl_layout_write_file (PlDocument *doc, const char *filename, GError **error)
{
  g_autofree char *name = NULL;
  g_autofree char *data = NULL;
  g_autofree char *target = NULL;
  g_autofree char *dir = NULL;
  g_autofree char *base = NULL;
  g_autofree char *tmp = NULL;
  GError *local = NULL;
  gboolean ok = FALSE;
  struct stat st;
  gsize length = 0;
  int fd = -1;
  int saved = 0;

  g_return_val_if_fail (doc != NULL, FALSE);
  g_return_val_if_fail (filename != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  name = g_filename_display_name (filename);
  /* Everything that can fail without touching the disk comes first. */
  data = pl_layout_write_data (doc, &length, &local);
  if (data == NULL)
    {
      g_propagate_prefixed_error (error, local, "%s: ", name);
      goto out;
    }

  /* Replace a link's target, not the link. */
  target = pl_layout_follow_links (filename, &saved);
  if (target == NULL)
    {
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                   _("%s: cannot save: %s"), name, g_strerror (saved));
      goto out;
    }

  dir = g_path_get_dirname (target);
  base = g_path_get_basename (target);
  /* Same folder, so the rename stays on one file system and is atomic
   * (POSIX rename()); hidden, so a file manager does not show it. */
  tmp = g_strdup_printf ("%s%c.%s.XXXXXX", dir, G_DIR_SEPARATOR, base);
  fd = g_mkstemp_full (tmp, O_WRONLY | O_CLOEXEC, 0666);
  if (fd < 0)
    {
      saved = errno;
      g_clear_pointer (&tmp, g_free);   /* nothing to remove */
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                   _("%s: cannot save: cannot create a file in the folder: %s"), name,
                   g_strerror (saved));
      goto out;
    }
  /* mkstemp makes the file private (0600 before the umask); a layout
   * replacing another keeps that one's permissions, a new one gets what
   * the umask gives (0666 was passed). */
  if (stat (target, &st) == 0 && S_ISREG (st.st_mode))
    (void) fchmod (fd, st.st_mode & 07777);

  if (!pl_layout_write_all (fd, data, length) || fsync (fd) != 0)
    {
      saved = errno;
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO, _("%s: cannot save: %s"), name,
                   g_strerror (saved));
      goto out;
    }
  if (close (fd) != 0)
    {
      fd = -1;
      saved = errno;
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO, _("%s: cannot save: %s"), name,
                   g_strerror (saved));
      goto out;
    }
  fd = -1;
  if (rename (tmp, target) != 0)
    {
      saved = errno;
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO, _("%s: cannot save: %s"), name,
                   g_strerror (saved));
      goto out;
    }
  g_clear_pointer (&tmp, g_free);   /* renamed: nothing to remove */

  /* Make the rename itself durable.  Some file systems refuse fsync on a
   * folder (EINVAL); the file is saved then all the same. */
  {
    int dir_fd = open (dir, O_RDONLY | O_DIRECTORY | O_CLOEXEC);

    if (dir_fd >= 0)
      {
        (void) fsync (dir_fd);
        close (dir_fd);
      }
  }
  ok = TRUE;

out:
  if (fd >= 0)
    close (fd);
  if (tmp != NULL)
    g_unlink (tmp);
  return ok;
}
