/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-json-parse.h: a small, strict JSON (RFC 8259) reader for the tests,
 * independent of the program's writer, so a report that does not parse
 * fails here rather than in someone's script.  Header-only, tests only.
 *
 * Strict where it matters: no trailing commas, no NaN or Infinity, no
 * leading zeros, no unescaped control characters, nothing after the value
 * but white space, duplicate keys refused.
 */
#pragma once

#include <glib.h>
#include <stdarg.h>
#include <string.h>

typedef enum
{
  TJ_NULL,
  TJ_BOOL,
  TJ_NUMBER,
  TJ_STRING,
  TJ_ARRAY,
  TJ_OBJECT,
} TjKind;

typedef struct _TjValue TjValue;
struct _TjValue
{
  TjKind kind;
  gboolean boolean;
  double number;
  char *string;
  GPtrArray *keys;     /* object: char*, in order */
  GPtrArray *items;    /* object: values by key order; array: elements */
};

static inline void
tj_free (TjValue *v)
{
  if (v == NULL)
    return;
  g_free (v->string);
  if (v->keys != NULL)
    g_ptr_array_unref (v->keys);
  if (v->items != NULL)
    g_ptr_array_unref (v->items);
  g_free (v);
}

G_DEFINE_AUTOPTR_CLEANUP_FUNC (TjValue, tj_free)

typedef struct
{
  const char *p;
  const char *end;
  int depth;
} TjParser;

static inline void
tj_ws (TjParser *ps)
{
  while (ps->p < ps->end && (*ps->p == ' ' || *ps->p == '\t' || *ps->p == '\n'
                             || *ps->p == '\r'))
    ps->p++;
}

static TjValue *tj_value (TjParser *ps);

static inline gboolean
tj_literal (TjParser *ps, const char *word)
{
  size_t n = strlen (word);

  if ((size_t) (ps->end - ps->p) < n || memcmp (ps->p, word, n) != 0)
    return FALSE;
  ps->p += n;
  return TRUE;
}

static inline int
tj_hex (char c)
{
  if (c >= '0' && c <= '9')
    return c - '0';
  if (c >= 'a' && c <= 'f')
    return c - 'a' + 10;
  if (c >= 'A' && c <= 'F')
    return c - 'A' + 10;
  return -1;
}

static inline char *
tj_string (TjParser *ps)
{
  GString *s = g_string_new (NULL);

  if (ps->p >= ps->end || *ps->p != '"')
    goto fail;
  ps->p++;
  while (ps->p < ps->end && *ps->p != '"')
    {
      unsigned char c = (unsigned char) *ps->p++;

      if (c < 0x20)
        goto fail;
      if (c != '\\')
        {
          g_string_append_c (s, (char) c);
          continue;
        }
      if (ps->p >= ps->end)
        goto fail;
      c = (unsigned char) *ps->p++;
      switch (c)
        {
        case '"': g_string_append_c (s, '"'); break;
        case '\\': g_string_append_c (s, '\\'); break;
        case '/': g_string_append_c (s, '/'); break;
        case 'b': g_string_append_c (s, '\b'); break;
        case 'f': g_string_append_c (s, '\f'); break;
        case 'n': g_string_append_c (s, '\n'); break;
        case 'r': g_string_append_c (s, '\r'); break;
        case 't': g_string_append_c (s, '\t'); break;
        case 'u':
          {
            gunichar u = 0;

            if (ps->end - ps->p < 4)
              goto fail;
            for (int k = 0; k < 4; k++)
              {
                int h = tj_hex (ps->p[k]);
                if (h < 0)
                  goto fail;
                u = u * 16 + (gunichar) h;
              }
            ps->p += 4;
            /* The writer never needs surrogate pairs (it escapes only
             * controls and U+2028/9); a lone surrogate is refused. */
            if (u >= 0xd800 && u <= 0xdfff)
              goto fail;
            g_string_append_unichar (s, u);
            break;
          }
        default:
          goto fail;
        }
    }
  if (ps->p >= ps->end)
    goto fail;
  ps->p++;
  if (!g_utf8_validate (s->str, (gssize) s->len, NULL))
    goto fail;
  return g_string_free (s, FALSE);
fail:
  g_string_free (s, TRUE);
  return NULL;
}

/* RFC 8259 sec. 6: -? (0 | [1-9][0-9]*) (. [0-9]+)? ([eE] [+-]? [0-9]+)? */
static inline gboolean
tj_number (TjParser *ps, double *out)
{
  const char *start = ps->p, *q = ps->p;
  g_autofree char *copy = NULL;

  if (q < ps->end && *q == '-')
    q++;
  if (q >= ps->end || !g_ascii_isdigit (*q))
    return FALSE;
  if (*q == '0')
    q++;
  else
    while (q < ps->end && g_ascii_isdigit (*q))
      q++;
  if (q < ps->end && *q == '.')
    {
      q++;
      if (q >= ps->end || !g_ascii_isdigit (*q))
        return FALSE;
      while (q < ps->end && g_ascii_isdigit (*q))
        q++;
    }
  if (q < ps->end && (*q == 'e' || *q == 'E'))
    {
      q++;
      if (q < ps->end && (*q == '+' || *q == '-'))
        q++;
      if (q >= ps->end || !g_ascii_isdigit (*q))
        return FALSE;
      while (q < ps->end && g_ascii_isdigit (*q))
        q++;
    }
  copy = g_strndup (start, (gsize) (q - start));
  *out = g_ascii_strtod (copy, NULL);
  ps->p = q;
  return TRUE;
}

static TjValue *
tj_value (TjParser *ps)
{
  TjValue *v = g_new0 (TjValue, 1);

  if (++ps->depth > 64)
    goto fail;
  tj_ws (ps);
  if (ps->p >= ps->end)
    goto fail;
  if (*ps->p == '{' || *ps->p == '[')
    {
      gboolean object = *ps->p == '{';
      char close = object ? '}' : ']';

      v->kind = object ? TJ_OBJECT : TJ_ARRAY;
      v->items = g_ptr_array_new_with_free_func ((GDestroyNotify) tj_free);
      if (object)
        v->keys = g_ptr_array_new_with_free_func (g_free);
      ps->p++;
      tj_ws (ps);
      if (ps->p < ps->end && *ps->p == close)
        {
          ps->p++;
          goto done;
        }
      for (;;)
        {
          TjValue *item;

          if (object)
            {
              char *key;

              tj_ws (ps);
              key = tj_string (ps);
              if (key == NULL)
                goto fail;
              for (guint i = 0; i < v->keys->len; i++)
                if (g_str_equal (g_ptr_array_index (v->keys, i), key))
                  {
                    g_free (key);
                    goto fail;
                  }
              g_ptr_array_add (v->keys, key);
              tj_ws (ps);
              if (ps->p >= ps->end || *ps->p != ':')
                goto fail;
              ps->p++;
            }
          item = tj_value (ps);
          if (item == NULL)
            goto fail;
          g_ptr_array_add (v->items, item);
          tj_ws (ps);
          if (ps->p < ps->end && *ps->p == ',')
            {
              ps->p++;
              continue;
            }
          if (ps->p < ps->end && *ps->p == close)
            {
              ps->p++;
              goto done;
            }
          goto fail;
        }
    }
  if (*ps->p == '"')
    {
      v->kind = TJ_STRING;
      v->string = tj_string (ps);
      if (v->string == NULL)
        goto fail;
      goto done;
    }
  if (tj_literal (ps, "true") || tj_literal (ps, "false"))
    {
      v->kind = TJ_BOOL;
      v->boolean = ps->p[-1] == 'e' && ps->p[-2] == 'u';
      goto done;
    }
  if (tj_literal (ps, "null"))
    {
      v->kind = TJ_NULL;
      goto done;
    }
  v->kind = TJ_NUMBER;
  if (!tj_number (ps, &v->number))
    goto fail;
done:
  ps->depth--;
  return v;
fail:
  tj_free (v);
  return NULL;
}

/* The whole text as one value, or NULL if it is not valid JSON. */
static inline TjValue *
tj_parse (const char *text)
{
  TjParser ps = { text, text + strlen (text), 0 };
  TjValue *v = tj_value (&ps);

  if (v == NULL)
    return NULL;
  tj_ws (&ps);
  if (ps.p != ps.end)
    {
      tj_free (v);
      return NULL;
    }
  return v;
}

/* Member of an object by key, or NULL. */
static inline const TjValue *
tj_get (const TjValue *v, const char *key)
{
  if (v == NULL || v->kind != TJ_OBJECT)
    return NULL;
  for (guint i = 0; i < v->keys->len; i++)
    if (g_str_equal (g_ptr_array_index (v->keys, i), key))
      return g_ptr_array_index (v->items, i);
  return NULL;
}

/* A path of keys: tj_path (v, "parts", "p1", "ports", NULL). */
static inline const TjValue *
tj_path (const TjValue *v, ...)
{
  va_list ap;
  const char *key;

  va_start (ap, v);
  while (v != NULL && (key = va_arg (ap, const char *)) != NULL)
    v = tj_get (v, key);
  va_end (ap);
  return v;
}
