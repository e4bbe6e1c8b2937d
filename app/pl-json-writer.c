/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-json-writer.c: JSON text per RFC 8259 (sections 4 to 7: objects,
 * arrays, numbers, strings) without a JSON library.
 */

#include "config.h"

#include "pl-json-writer.h"

#include <math.h>
#include <string.h>

typedef enum
{
  PL_JSON_FRAME_OBJECT,
  PL_JSON_FRAME_ARRAY,
} PlJsonFrameKind;

typedef struct
{
  PlJsonFrameKind kind;
  guint count;             /* members or elements written so far */
  gboolean have_key;       /* object: a key was written, its value is due */
} PlJsonFrame;

struct _PlJsonWriter
{
  GString *text;
  GArray *stack;           /* of PlJsonFrame, innermost last */
  gboolean pretty;
  gboolean top_done;       /* the one top-level value is complete */
  gboolean misused;
};

static PlJsonFrame *
pl_json_writer_top (PlJsonWriter *writer)
{
  if (writer->stack->len == 0)
    return NULL;
  return &g_array_index (writer->stack, PlJsonFrame, writer->stack->len - 1);
}

static void
pl_json_writer_newline (PlJsonWriter *writer)
{
  if (!writer->pretty)
    return;
  g_string_append_c (writer->text, '\n');
  for (guint i = 0; i < writer->stack->len; i++)
    g_string_append (writer->text, "  ");
}

/* Everything that must precede a value: a comma and line break inside an
 * array, nothing after a key.  FALSE when no value may go here. */
static gboolean
pl_json_writer_before_value (PlJsonWriter *writer)
{
  PlJsonFrame *top = pl_json_writer_top (writer);

  if (writer->misused)
    return FALSE;
  if (top == NULL)
    {
      if (writer->top_done)
        {
          writer->misused = TRUE;
          g_return_val_if_reached (FALSE);
        }
      return TRUE;
    }
  if (top->kind == PL_JSON_FRAME_OBJECT)
    {
      if (!top->have_key)
        {
          writer->misused = TRUE;
          g_return_val_if_reached (FALSE);
        }
      top->have_key = FALSE;
      top->count++;
      return TRUE;
    }
  if (top->count > 0)
    g_string_append_c (writer->text, ',');
  top->count++;
  pl_json_writer_newline (writer);
  return TRUE;
}

static void
pl_json_writer_after_value (PlJsonWriter *writer)
{
  if (writer->stack->len == 0)
    writer->top_done = TRUE;
}

static void
pl_json_writer_begin (PlJsonWriter *writer, PlJsonFrameKind kind)
{
  PlJsonFrame frame = { kind, 0, FALSE };

  if (!pl_json_writer_before_value (writer))
    return;
  g_string_append_c (writer->text, kind == PL_JSON_FRAME_OBJECT ? '{' : '[');
  g_array_append_val (writer->stack, frame);
}

static void
pl_json_writer_end (PlJsonWriter *writer, PlJsonFrameKind kind)
{
  PlJsonFrame *top = pl_json_writer_top (writer);
  guint count;

  if (writer->misused)
    return;
  if (top == NULL || top->kind != kind || top->have_key)
    {
      writer->misused = TRUE;
      g_return_if_reached ();
    }
  count = top->count;
  g_array_set_size (writer->stack, writer->stack->len - 1);
  if (count > 0)
    pl_json_writer_newline (writer);
  g_string_append_c (writer->text, kind == PL_JSON_FRAME_OBJECT ? '}' : ']');
  pl_json_writer_after_value (writer);
}

PlJsonWriter *
pl_json_writer_new (gboolean pretty)
{
  PlJsonWriter *writer = g_new0 (PlJsonWriter, 1);

  writer->text = g_string_new (NULL);
  writer->stack = g_array_new (FALSE, FALSE, sizeof (PlJsonFrame));
  writer->pretty = pretty;
  return writer;
}

void
pl_json_writer_free (PlJsonWriter *writer)
{
  if (writer == NULL)
    return;
  g_string_free (writer->text, TRUE);
  g_array_unref (writer->stack);
  g_free (writer);
}

void
pl_json_writer_begin_object (PlJsonWriter *writer)
{
  g_return_if_fail (writer != NULL);
  pl_json_writer_begin (writer, PL_JSON_FRAME_OBJECT);
}

void
pl_json_writer_end_object (PlJsonWriter *writer)
{
  g_return_if_fail (writer != NULL);
  pl_json_writer_end (writer, PL_JSON_FRAME_OBJECT);
}

void
pl_json_writer_begin_array (PlJsonWriter *writer)
{
  g_return_if_fail (writer != NULL);
  pl_json_writer_begin (writer, PL_JSON_FRAME_ARRAY);
}

void
pl_json_writer_end_array (PlJsonWriter *writer)
{
  g_return_if_fail (writer != NULL);
  pl_json_writer_end (writer, PL_JSON_FRAME_ARRAY);
}

void
pl_json_writer_key (PlJsonWriter *writer, const char *key)
{
  PlJsonFrame *top;

  g_return_if_fail (writer != NULL);
  g_return_if_fail (key != NULL);
  if (writer->misused)
    return;
  top = pl_json_writer_top (writer);
  if (top == NULL || top->kind != PL_JSON_FRAME_OBJECT || top->have_key)
    {
      writer->misused = TRUE;
      g_return_if_reached ();
    }
  if (top->count > 0)
    g_string_append_c (writer->text, ',');
  pl_json_writer_newline (writer);
  pl_json_append_string (writer->text, key);
  g_string_append (writer->text, writer->pretty ? ": " : ":");
  top->have_key = TRUE;
}

void
pl_json_writer_string (PlJsonWriter *writer, const char *value)
{
  g_return_if_fail (writer != NULL);
  if (!pl_json_writer_before_value (writer))
    return;
  if (value == NULL)
    g_string_append (writer->text, "null");
  else
    pl_json_append_string (writer->text, value);
  pl_json_writer_after_value (writer);
}

void
pl_json_writer_number (PlJsonWriter *writer, double value)
{
  g_return_if_fail (writer != NULL);
  if (!pl_json_writer_before_value (writer))
    return;
  pl_json_append_number (writer->text, value);
  pl_json_writer_after_value (writer);
}

void
pl_json_writer_integer (PlJsonWriter *writer, gint64 value)
{
  g_return_if_fail (writer != NULL);
  if (!pl_json_writer_before_value (writer))
    return;
  g_string_append_printf (writer->text, "%" G_GINT64_FORMAT, value);
  pl_json_writer_after_value (writer);
}

void
pl_json_writer_boolean (PlJsonWriter *writer, gboolean value)
{
  g_return_if_fail (writer != NULL);
  if (!pl_json_writer_before_value (writer))
    return;
  g_string_append (writer->text, value ? "true" : "false");
  pl_json_writer_after_value (writer);
}

void
pl_json_writer_null (PlJsonWriter *writer)
{
  g_return_if_fail (writer != NULL);
  if (!pl_json_writer_before_value (writer))
    return;
  g_string_append (writer->text, "null");
  pl_json_writer_after_value (writer);
}

void
pl_json_writer_member_string (PlJsonWriter *writer, const char *key, const char *value)
{
  pl_json_writer_key (writer, key);
  pl_json_writer_string (writer, value);
}

void
pl_json_writer_member_number (PlJsonWriter *writer, const char *key, double value)
{
  pl_json_writer_key (writer, key);
  pl_json_writer_number (writer, value);
}

void
pl_json_writer_member_integer (PlJsonWriter *writer, const char *key, gint64 value)
{
  pl_json_writer_key (writer, key);
  pl_json_writer_integer (writer, value);
}

void
pl_json_writer_member_boolean (PlJsonWriter *writer, const char *key, gboolean value)
{
  pl_json_writer_key (writer, key);
  pl_json_writer_boolean (writer, value);
}

char *
pl_json_writer_finish (PlJsonWriter *writer)
{
  char *result = NULL;

  g_return_val_if_fail (writer != NULL, NULL);
  if (!writer->misused && writer->top_done && writer->stack->len == 0)
    {
      g_string_append_c (writer->text, '\n');
      result = g_string_free (writer->text, FALSE);
      writer->text = g_string_new (NULL);
    }
  writer->misused = TRUE;
  return result;
}

/* RFC 8259 sec. 7: '"', '\\' and U+0000..U+001F must be escaped; the short
 * forms are used where the RFC has them.  U+2028 and U+2029 are escaped as
 * well, so the text is also a valid JavaScript literal. */
void
pl_json_append_string (GString *out, const char *value)
{
  g_autofree char *valid = g_utf8_make_valid (value, -1);

  g_string_append_c (out, '"');
  for (const char *p = valid; *p != '\0'; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);

      switch (c)
        {
        case '"':
          g_string_append (out, "\\\"");
          break;
        case '\\':
          g_string_append (out, "\\\\");
          break;
        case '\b':
          g_string_append (out, "\\b");
          break;
        case '\f':
          g_string_append (out, "\\f");
          break;
        case '\n':
          g_string_append (out, "\\n");
          break;
        case '\r':
          g_string_append (out, "\\r");
          break;
        case '\t':
          g_string_append (out, "\\t");
          break;
        default:
          if (c < 0x20 || c == 0x2028 || c == 0x2029)
            g_string_append_printf (out, "\\u%04x", (unsigned) c);
          else
            g_string_append_len (out, p, g_utf8_next_char (p) - p);
          break;
        }
    }
  g_string_append_c (out, '"');
}

/* %.15g is exact for every decimal of 15 digits (DBL_DIG) and reads well;
 * where it does not round-trip, %.17g always does (IEEE 754-2008 sec. 5.12.2).
 * g_ascii_formatd writes '.' whatever the locale.  "1e+20", "-0" and
 * "2.5e-07" are valid JSON numbers (RFC 8259 sec. 6). */
void
pl_json_append_number (GString *out, double value)
{
  char buffer[G_ASCII_DTOSTR_BUF_SIZE];

  if (!isfinite (value))
    {
      g_string_append (out, "null");
      return;
    }
  g_ascii_formatd (buffer, sizeof buffer, "%.15g", value);
  if (g_ascii_strtod (buffer, NULL) != value)
    g_ascii_formatd (buffer, sizeof buffer, "%.17g", value);
  g_string_append (out, buffer);
}
