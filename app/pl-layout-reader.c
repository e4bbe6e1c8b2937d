/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-layout-reader.c: reading a layout file safely (see pl-layout-reader.h
 * for the stages and their limits).
 *
 * The parser is libxml2 with a per-load parser context whose SAX handler
 * is our own copy: the DOCTYPE and entity-resolution callbacks stop the
 * parse, the element callbacks count depth, elements and attribute
 * lengths, and the structured error callback of the context (not the
 * process-wide one) records the first error.  The schema is parsed anew for
 * every load from the copy compiled into the program: that costs about a
 * millisecond and keeps a load free of shared mutable state.
 */
#include "config.h"

#include "pl-layout-reader.h"

#include <errno.h>
#include <fcntl.h>
#include <glib/gi18n.h>
#include <libxml/SAX2.h>
#include <libxml/parser.h>
#include <libxml/parserInternals.h>
#include <libxml/relaxng.h>
#include <libxml/tree.h>
#include <libxml/xmlerror.h>
#include <math.h>
#include <stdarg.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "pl-app-resources.h"
#include "pl-command.h"
#include "pl-document.h"
#include "pl-part-type.h"
#include "pl-units.h"

G_DEFINE_QUARK (pl-layout-error-quark, pl_layout_error)

/* Parser options.  NONET: no network even if something asked for it.
 * IGNORE_ENC: the bytes were checked to be UTF-8 before parsing, and the
 * declaration was checked to say so (or nothing), so the parser never
 * converts.  BIG_LINES: line numbers past 65535 in messages.  NOCDATA:
 * CDATA sections become plain text.  Deliberately absent: NOENT (entity
 * substitution), DTDLOAD, DTDATTR, DTDVALID, XINCLUDE and HUGE (which would
 * lift libxml2's own limits). */
#define PL_LAYOUT_PARSE_OPTIONS                                           \
  (XML_PARSE_NONET | XML_PARSE_IGNORE_ENC | XML_PARSE_BIG_LINES |         \
   XML_PARSE_NOCDATA | XML_PARSE_NOERROR | XML_PARSE_NOWARNING)

typedef struct
{
  const char *name;        /* display name of the source, UTF-8 */
  GError *error;           /* the first problem found; later ones are dropped */
  int depth;               /* element nesting while parsing */
  guint n_elements;
} LoadState;

/* --- messages --- */

static void pl_layout_fail (LoadState *state, PlLayoutError code, long line, int column,
                            const char *format, ...) G_GNUC_PRINTF (5, 6);

/* Records the first failure as "NAME:LINE:COLUMN: sentence" (the parts
 * that are not known left out). */
static void
pl_layout_fail (LoadState *state, PlLayoutError code, long line, int column,
                const char *format, ...)
{
  va_list args;
  g_autofree char *sentence = NULL;

  if (state->error != NULL)
    return;
  va_start (args, format);
  sentence = g_strdup_vprintf (format, args);
  va_end (args);
  if (line > 0 && column > 0)
    state->error = g_error_new (PL_LAYOUT_ERROR, code, "%s:%ld:%d: %s", state->name, line,
                                column, sentence);
  else if (line > 0)
    state->error = g_error_new (PL_LAYOUT_ERROR, code, "%s:%ld: %s", state->name, line,
                                sentence);
  else
    state->error = g_error_new (PL_LAYOUT_ERROR, code, "%s: %s", state->name, sentence);
}

/* Line and column (in characters, from 1) of byte offset in data, whose
 * bytes before offset are valid UTF-8. */
static void
pl_layout_position (const char *data, gsize offset, long *line, int *column)
{
  gsize line_start = 0;

  *line = 1;
  for (gsize i = 0; i < offset; i++)
    if (data[i] == '\n')
      {
        (*line)++;
        line_start = i + 1;
      }
  *column = (int) g_utf8_strlen (data + line_start, (gssize) (offset - line_start)) + 1;
}

/* libxml2's messages end in a newline; a GError's should not. */
static char *
pl_layout_xml_message (const char *message)
{
  char *copy = g_strdup (message != NULL ? message : "");

  return g_strchomp (copy);
}

/* --- lexical forms (the schema's patterns, for messages and for reading) --- */

static gboolean
pl_is_digit (char c)
{
  return c >= '0' && c <= '9';
}

/* [+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([eE][+-]?[0-9]+)? */
static gboolean
pl_layout_is_decimal (const char *s)
{
  gboolean digits = FALSE;

  if (*s == '+' || *s == '-')
    s++;
  while (pl_is_digit (*s))
    s++, digits = TRUE;
  if (*s == '.')
    {
      s++;
      while (pl_is_digit (*s))
        s++, digits = TRUE;
    }
  if (!digits)
    return FALSE;
  if (*s == 'e' || *s == 'E')
    {
      s++;
      if (*s == '+' || *s == '-')
        s++;
      if (!pl_is_digit (*s))
        return FALSE;
      while (pl_is_digit (*s))
        s++;
    }
  return *s == '\0';
}

static gboolean
pl_is_lower_alnum (char c)
{
  return (c >= 'a' && c <= 'z') || pl_is_digit (c);
}

/* [a-z][a-z0-9]*(-[a-z0-9]+)*, read up to end (or NUL) */
static gboolean
pl_layout_is_key_n (const char *s, const char *end)
{
  if (s >= end || !(*s >= 'a' && *s <= 'z'))
    return FALSE;
  for (s++; s < end; s++)
    {
      if (*s == '-')
        {
          if (s + 1 >= end || !pl_is_lower_alnum (s[1]))
            return FALSE;
        }
      else if (!pl_is_lower_alnum (*s))
        return FALSE;
    }
  return TRUE;
}

static gboolean
pl_layout_is_key (const char *s)
{
  return pl_layout_is_key_n (s, s + strlen (s));
}

/* [A-Za-z0-9%][A-Za-z0-9%/.()]* */
static gboolean
pl_layout_is_unit_key (const char *s)
{
  if (*s == '\0')
    return FALSE;
  for (const char *p = s; *p != '\0'; p++)
    {
      gboolean alnum = g_ascii_isalnum (*p) || *p == '%';

      if (!alnum && (p == s || strchr ("/.()", *p) == NULL))
        return FALSE;
    }
  return TRUE;
}

/* prefix[1-9][0-9]{0,8}, read up to end */
static gboolean
pl_layout_is_id_n (const char *s, const char *end, char prefix)
{
  gsize n = (gsize) (end - s);

  if (n < 2 || n > 10 || s[0] != prefix || s[1] < '1' || s[1] > '9')
    return FALSE;
  for (const char *p = s + 2; p < end; p++)
    if (!pl_is_digit (*p))
      return FALSE;
  return TRUE;
}

static gboolean
pl_layout_is_id (const char *s, char prefix)
{
  return pl_layout_is_id_n (s, s + strlen (s), prefix);
}

static gboolean
pl_layout_is_port_ref (const char *s)
{
  const char *colon = strchr (s, ':');

  return colon != NULL && pl_layout_is_id_n (s, colon, 'p')
         && pl_layout_is_key_n (colon + 1, colon + 1 + strlen (colon + 1));
}

/* --- stage 1: the raw bytes --- */

/* The encoding named by an XML declaration at the start of data, or NULL. */
static char *
pl_layout_declared_encoding (const char *data, gsize length)
{
  gsize start = 0, end;
  const char *p, *stop, *q;
  char quote;

  if (length >= 3 && memcmp (data, "\xEF\xBB\xBF", 3) == 0)
    start = 3;
  if (length - start < 6 || memcmp (data + start, "<?xml", 5) != 0
      || !g_ascii_isspace (data[start + 5]))
    return NULL;
  /* The declaration is short: version, encoding, standalone. */
  end = MIN (length, start + 256);
  p = data + start;
  stop = g_strstr_len (p, (gssize) (end - start), "?>");
  if (stop == NULL)
    return NULL;   /* the parser will say what is wrong */
  p = g_strstr_len (p, stop - p, "encoding");
  if (p == NULL)
    return NULL;
  p += strlen ("encoding");
  while (p < stop && g_ascii_isspace (*p))
    p++;
  if (p >= stop || *p != '=')
    return NULL;
  p++;
  while (p < stop && g_ascii_isspace (*p))
    p++;
  if (p >= stop || (*p != '"' && *p != '\''))
    return NULL;
  quote = *p++;
  q = memchr (p, quote, (gsize) (stop - p));
  if (q == NULL)
    return NULL;
  return g_strndup (p, (gsize) (q - p));
}

static gboolean
pl_layout_check_bytes (LoadState *state, const char *data, gsize length)
{
  const char *nul, *bad = NULL;
  g_autofree char *encoding = NULL;
  long line;
  int column;

  if (length > PL_LAYOUT_MAX_FILE_SIZE)
    {
      g_autofree char *size = g_format_size (length);
      g_autofree char *limit = g_format_size (PL_LAYOUT_MAX_FILE_SIZE);

      pl_layout_fail (state, PL_LAYOUT_ERROR_TOO_LARGE, 0, 0,
                      _("the file is %s, more than the %s a layout file may have"), size,
                      limit);
      return FALSE;
    }
  if (length == 0)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_WELL_FORMED, 0, 0,
                      _("the file is empty; expected a Pressline layout"));
      return FALSE;
    }
  nul = memchr (data, '\0', length);
  if (!g_utf8_validate_len (data, nul != NULL ? (gsize) (nul - data) : length, &bad))
    {
      pl_layout_position (data, (gsize) (bad - data), &line, &column);
      pl_layout_fail (state, PL_LAYOUT_ERROR_ENCODING, line, column,
                      _("the byte 0x%02X is not valid UTF-8; layout files are UTF-8 text"),
                      (guint) (guchar) *bad);
      return FALSE;
    }
  if (nul != NULL)
    {
      pl_layout_position (data, (gsize) (nul - data), &line, &column);
      pl_layout_fail (state, PL_LAYOUT_ERROR_ENCODING, line, column,
                      _("the file holds a NUL byte; layout files are UTF-8 text"));
      return FALSE;
    }
  encoding = pl_layout_declared_encoding (data, length);
  if (encoding != NULL && g_ascii_strcasecmp (encoding, "UTF-8") != 0
      && g_ascii_strcasecmp (encoding, "UTF8") != 0)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_ENCODING, 1, 0,
                      _("the file declares the encoding “%s”; layout files are UTF-8"),
                      encoding);
      return FALSE;
    }
  return TRUE;
}

/* --- stage 2: the safe parse --- */

static LoadState *
pl_layout_state_of (void *ctx)
{
  return ((xmlParserCtxtPtr) ctx)->_private;
}

static void
pl_layout_refuse (void *ctx, const char *sentence)
{
  LoadState *state = pl_layout_state_of (ctx);

  /* The column libxml2 knows here is where the parser stands (after the
   * construct), so only the line is given. */
  pl_layout_fail (state, PL_LAYOUT_ERROR_REFUSED, xmlSAX2GetLineNumber (ctx), 0, "%s",
                  sentence);
  xmlStopParser ((xmlParserCtxtPtr) ctx);
}

/* Called as soon as "<!DOCTYPE name ..." is read, before any declaration
 * inside it: stopping here means no entity is ever declared. */
static void
pl_layout_internal_subset_cb (void *ctx, const xmlChar *name, const xmlChar *external_id,
                              const xmlChar *system_id)
{
  pl_layout_refuse (ctx, _("a document type declaration (<!DOCTYPE …>) is not allowed in a "
                           "layout file"));
}

/* Never reached while DOCTYPE is refused; here so that nothing outside the
 * file could be opened even if it were. */
static xmlParserInputPtr
pl_layout_resolve_entity_cb (void *ctx, const xmlChar *public_id, const xmlChar *system_id)
{
  pl_layout_refuse (ctx, _("a layout file may not refer to other files or entities"));
  return NULL;
}

static void
pl_layout_start_element_cb (void *ctx, const xmlChar *localname, const xmlChar *prefix,
                            const xmlChar *uri, int n_namespaces, const xmlChar **namespaces,
                            int n_attributes, int n_defaulted, const xmlChar **attributes)
{
  LoadState *state = pl_layout_state_of (ctx);

  state->depth++;
  state->n_elements++;
  if (state->depth > PL_LAYOUT_MAX_DEPTH)
    {
      g_autofree char *msg =
        g_strdup_printf (_("elements are nested more than %d deep; a layout needs 5"),
                         PL_LAYOUT_MAX_DEPTH);
      pl_layout_refuse (ctx, msg);
      return;
    }
  if (state->n_elements > PL_LAYOUT_MAX_ELEMENTS)
    {
      g_autofree char *msg = g_strdup_printf (_("the file has more than %u elements"),
                                              PL_LAYOUT_MAX_ELEMENTS);
      pl_layout_refuse (ctx, msg);
      return;
    }
  /* attributes: n_attributes quintuples (localname, prefix, URI, value,
   * end of value); namespaces: pairs (prefix, URI). */
  for (int i = 0; i < n_attributes; i++)
    {
      gsize length = (gsize) (attributes[5 * i + 4] - attributes[5 * i + 3]);

      if (length > PL_LAYOUT_MAX_ATTRIBUTE_LENGTH)
        {
          g_autofree char *msg =
            g_strdup_printf (_("the attribute “%s” of <%s> is %u bytes long; at most %u "
                               "are allowed"),
                             (const char *) attributes[5 * i], (const char *) localname,
                             (guint) length, PL_LAYOUT_MAX_ATTRIBUTE_LENGTH);
          pl_layout_refuse (ctx, msg);
          return;
        }
    }
  for (int i = 0; i < n_namespaces; i++)
    {
      const xmlChar *ns_uri = namespaces[2 * i + 1];

      if (ns_uri != NULL && (gsize) xmlStrlen (ns_uri) > PL_LAYOUT_MAX_ATTRIBUTE_LENGTH)
        {
          g_autofree char *msg =
            g_strdup_printf (_("a namespace name on <%s> is longer than %u bytes"),
                             (const char *) localname, PL_LAYOUT_MAX_ATTRIBUTE_LENGTH);
          pl_layout_refuse (ctx, msg);
          return;
        }
    }
  xmlSAX2StartElementNs (ctx, localname, prefix, uri, n_namespaces, namespaces, n_attributes,
                         n_defaulted, attributes);
}

static void
pl_layout_end_element_cb (void *ctx, const xmlChar *localname, const xmlChar *prefix,
                          const xmlChar *uri)
{
  LoadState *state = pl_layout_state_of (ctx);

  state->depth--;
  xmlSAX2EndElementNs (ctx, localname, prefix, uri);
}

/* The context's own error channel (data is the parser context). */
static void
pl_layout_parse_error_cb (void *data, xmlErrorPtr err)
{
  LoadState *state = pl_layout_state_of (data);
  g_autofree char *message = NULL;

  if (err == NULL || err->level < XML_ERR_ERROR || err->code == XML_ERR_USER_STOP)
    return;
  if (err->code == XML_ERR_DOCUMENT_EMPTY)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_WELL_FORMED, err->line, 0,
                      _("the file holds no XML element; expected a Pressline layout"));
      return;
    }
  message = pl_layout_xml_message (err->message);
  pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_WELL_FORMED, err->line, err->int2,
                  _("not well-formed XML: %s"), message);
}

static xmlDocPtr
pl_layout_parse (LoadState *state, const char *data, gsize length)
{
  xmlParserCtxtPtr ctxt;
  xmlDocPtr doc = NULL;

  ctxt = xmlCreateMemoryParserCtxt (data, (int) length);
  if (ctxt == NULL)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_IO, 0, 0, _("out of memory"));
      goto out;
    }
  xmlCtxtUseOptions (ctxt, PL_LAYOUT_PARSE_OPTIONS);
  /* Belt and braces: whatever the process-wide defaults say. */
  ctxt->replaceEntities = 0;
  ctxt->loadsubset = 0;
  ctxt->validate = 0;
  ctxt->_private = state;
  /* ctxt->sax is this context's own copy of the SAX2 handler. */
  ctxt->sax->internalSubset = pl_layout_internal_subset_cb;
  ctxt->sax->externalSubset = NULL;
  ctxt->sax->resolveEntity = pl_layout_resolve_entity_cb;
  ctxt->sax->startElementNs = pl_layout_start_element_cb;
  ctxt->sax->endElementNs = pl_layout_end_element_cb;
  ctxt->sax->serror = pl_layout_parse_error_cb;

  xmlParseDocument (ctxt);
  doc = ctxt->myDoc;
  ctxt->myDoc = NULL;
  if (state->error == NULL && (!ctxt->wellFormed || !ctxt->nsWellFormed || doc == NULL))
    pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_WELL_FORMED, ctxt->input != NULL
                    ? ctxt->input->line : 0, 0, _("not well-formed XML"));
  if (state->error != NULL && doc != NULL)
    g_clear_pointer (&doc, xmlFreeDoc);

out:
  if (ctxt != NULL)
    xmlFreeParserCtxt (ctxt);
  return doc;
}

/* --- stage 3: the root --- */

static gboolean
pl_layout_is_ours (xmlNodePtr node, const char *name)
{
  return node->type == XML_ELEMENT_NODE && node->ns != NULL
         && xmlStrcmp (node->ns->href, BAD_CAST PL_LAYOUT_NAMESPACE) == 0
         && (name == NULL || xmlStrcmp (node->name, BAD_CAST name) == 0);
}

static gboolean
pl_layout_check_root (LoadState *state, xmlNodePtr root)
{
  xmlChar *version = NULL;
  gboolean ok = FALSE;

  if (root == NULL)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_WELL_FORMED, 0, 0,
                      _("the file holds no XML element; expected a Pressline layout"));
      goto out;
    }
  if (!pl_layout_is_ours (root, "layout"))
    {
      if (xmlStrcmp (root->name, BAD_CAST "layout") == 0)
        pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_A_LAYOUT, xmlGetLineNo (root), 0,
                        _("the <layout> element is not in the namespace of Pressline "
                          "layouts; expected xmlns=\"%s\""), PL_LAYOUT_NAMESPACE);
      else
        pl_layout_fail (state, PL_LAYOUT_ERROR_NOT_A_LAYOUT, xmlGetLineNo (root), 0,
                        _("this is not a Pressline layout: the root element is <%s>, "
                          "expected <layout xmlns=\"%s\">"),
                        (const char *) root->name, PL_LAYOUT_NAMESPACE);
      goto out;
    }
  /* A newer format may differ in any way, so this comes before the
   * schema: the user learns why, not which element is unexpected. */
  version = xmlGetNoNsProp (root, BAD_CAST "version");
  if (version != NULL)
    {
      const char *v = (const char *) version;
      gsize n = strlen (v);
      gboolean digits = n > 0 && n < 10;

      for (gsize i = 0; i < n && digits; i++)
        digits = pl_is_digit (v[i]);
      if (digits && g_ascii_strtoull (v, NULL, 10) > PL_LAYOUT_FORMAT_VERSION)
        {
          /* The format the brief prescribes: no line, the file as subject. */
          if (state->error == NULL)
            state->error = g_error_new (PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_NEWER_VERSION,
                                        _("%s was written by a newer Pressline (layout "
                                          "format %s); this version reads format %d."),
                                        state->name, v + strspn (v, "0"),
                                        PL_LAYOUT_FORMAT_VERSION);
          goto out;
        }
    }
  ok = TRUE;

out:
  if (version != NULL)
    xmlFree (version);
  return ok;
}

/* --- stage 4: the schema --- */

typedef struct
{
  LoadState *state;
  char *message;      /* the first validity error */
  long line;
} SchemaErrors;

static void
pl_layout_schema_error_cb (void *data, xmlErrorPtr err)
{
  SchemaErrors *errors = data;

  if (err == NULL || err->level < XML_ERR_ERROR || errors->message != NULL)
    return;
  errors->message = pl_layout_xml_message (err->message);
  errors->line = err->line;
  if (errors->line <= 0 && err->node != NULL)
    errors->line = xmlGetLineNo ((xmlNodePtr) err->node);
}

/* Attribute types of the schema, for messages that say what was expected
 * (libxml2's RELAX NG messages name the element, rarely the attribute, and
 * sometimes no line). */
typedef enum
{
  ATTR_DECIMAL,
  ATTR_KEY,
  ATTR_UNIT,
  ATTR_BOOLEAN,
  ATTR_ROTATION,
  ATTR_PART_ID,
  ATTR_WIRE_ID,
  ATTR_NOTE_ID,
  ATTR_PORT_REF,
  ATTR_VERSION,
  ATTR_TAG,
} AttrType;

typedef struct
{
  const char *name;
  AttrType type;
  gboolean required;
} AttrRule;

typedef struct
{
  const char *element;
  const char *parents;    /* space-separated, "" for the root */
  gboolean text;          /* whether text content is allowed */
  AttrRule attrs[7];      /* up to the first NULL name */
} ElementRule;

static const ElementRule pl_layout_rules[] = {
  { "layout", "", FALSE,
    { { "version", ATTR_VERSION, TRUE }, { "drawing-unit", ATTR_UNIT, TRUE } } },
  { "title", "layout", FALSE, { { NULL } } },
  { "scenario", "layout", FALSE, { { NULL } } },
  { "parts", "layout", FALSE, { { NULL } } },
  { "wires", "layout", FALSE, { { NULL } } },
  { "notes", "layout", FALSE, { { NULL } } },
  { "part", "parts", FALSE,
    { { "id", ATTR_PART_ID, TRUE }, { "type", ATTR_KEY, TRUE }, { "tag", ATTR_TAG, TRUE },
      { "x", ATTR_DECIMAL, TRUE }, { "y", ATTR_DECIMAL, TRUE },
      { "rotation", ATTR_ROTATION, FALSE }, { "mirrored", ATTR_BOOLEAN, FALSE } } },
  { "number", "title scenario part", FALSE,
    { { "key", ATTR_KEY, TRUE }, { "value", ATTR_DECIMAL, TRUE },
      { "unit", ATTR_UNIT, TRUE } } },
  { "choice", "title scenario part", FALSE,
    { { "key", ATTR_KEY, TRUE }, { "value", ATTR_KEY, TRUE } } },
  { "boolean", "title scenario part", FALSE,
    { { "key", ATTR_KEY, TRUE }, { "value", ATTR_BOOLEAN, TRUE } } },
  { "text", "title scenario part", TRUE, { { "key", ATTR_KEY, TRUE } } },
  { "wire", "wires", FALSE,
    { { "id", ATTR_WIRE_ID, TRUE }, { "from", ATTR_PORT_REF, TRUE },
      { "to", ATTR_PORT_REF, TRUE } } },
  { "bend", "wire", FALSE, { { "x", ATTR_DECIMAL, TRUE }, { "y", ATTR_DECIMAL, TRUE } } },
  { "note", "notes", TRUE,
    { { "id", ATTR_NOTE_ID, TRUE }, { "x", ATTR_DECIMAL, TRUE },
      { "y", ATTR_DECIMAL, TRUE } } },
};

static const ElementRule *
pl_layout_find_rule (const char *name)
{
  for (guint i = 0; i < G_N_ELEMENTS (pl_layout_rules); i++)
    if (strcmp (pl_layout_rules[i].element, name) == 0)
      return &pl_layout_rules[i];
  return NULL;
}

static gboolean
pl_layout_word_in (const char *word, const char *list)
{
  gsize n = strlen (word);

  if (n == 0)
    return list[0] == '\0';   /* the root: no parent */
  for (const char *p = list; *p != '\0';)
    {
      gsize m = strcspn (p, " ");

      if (m == n && strncmp (p, word, n) == 0)
        return TRUE;
      p += m;
      p += strspn (p, " ");
    }
  return FALSE;
}

/* The children that parent_name allows, "<a>, <b>" (newly allocated). */
static char *
pl_layout_allowed_children (const char *parent_name)
{
  GString *list = g_string_new (NULL);

  for (guint i = 0; i < G_N_ELEMENTS (pl_layout_rules); i++)
    if (pl_layout_word_in (parent_name, pl_layout_rules[i].parents))
      g_string_append_printf (list, "%s<%s>", list->len > 0 ? ", " : "",
                              pl_layout_rules[i].element);
  return g_string_free (list, FALSE);
}

static gboolean
pl_layout_attr_fits (AttrType type, const char *value)
{
  switch (type)
    {
    case ATTR_DECIMAL:
      return pl_layout_is_decimal (value);
    case ATTR_KEY:
      return pl_layout_is_key (value);
    case ATTR_UNIT:
      return pl_layout_is_unit_key (value);
    case ATTR_BOOLEAN:
      return strcmp (value, "true") == 0 || strcmp (value, "false") == 0;
    case ATTR_ROTATION:
      return strcmp (value, "0") == 0 || strcmp (value, "90") == 0
             || strcmp (value, "180") == 0 || strcmp (value, "270") == 0;
    case ATTR_PART_ID:
      return pl_layout_is_id (value, 'p');
    case ATTR_WIRE_ID:
      return pl_layout_is_id (value, 'w');
    case ATTR_NOTE_ID:
      return pl_layout_is_id (value, 'n');
    case ATTR_PORT_REF:
      return pl_layout_is_port_ref (value);
    case ATTR_VERSION:
      return strcmp (value, "1") == 0;
    case ATTR_TAG:
      return value[0] != '\0';
    default:
      return FALSE;
    }
}

static const char *
pl_layout_attr_expected (AttrType type)
{
  switch (type)
    {
    case ATTR_DECIMAL:
      return _("a number with '.' as the decimal mark and no thousands separator, "
               "such as 12.5 or 1.5e-3");
    case ATTR_KEY:
      return _("a key of lower-case letters, digits and single hyphens, such as "
               "“ball-valve”");
    case ATTR_UNIT:
      return _("a unit key such as “mm”, “psi” or “L/min”");
    case ATTR_BOOLEAN:
      return _("“true” or “false”");
    case ATTR_ROTATION:
      return _("0, 90, 180 or 270 (degrees clockwise)");
    case ATTR_PART_ID:
      return _("a part id such as “p1”");
    case ATTR_WIRE_ID:
      return _("a wire id such as “w1”");
    case ATTR_NOTE_ID:
      return _("a note id such as “n1”");
    case ATTR_PORT_REF:
      return _("a part id and a port key, such as “p1:out”");
    case ATTR_VERSION:
      return _("the format version 1");
    case ATTR_TAG:
      return _("a tag such as “H1”");
    default:
      return "";
    }
}

/* The line where a text node's first non-blank character is: libxml2
 * gives a text node the line where it ends. */
static long
pl_layout_text_line (xmlNodePtr text)
{
  const char *content = (const char *) text->content;
  long line = xmlGetLineNo (text);
  long before = 0;
  gboolean leading = TRUE;

  for (const char *p = content; p != NULL && *p != '\0'; p++)
    {
      if (*p != '\n')
        {
          leading = leading && g_ascii_isspace (*p);
          continue;
        }
      line--;
      if (leading)
        before++;
    }
  return MAX (line + before, 1);
}

/* Looks for the first place where node breaks the element rules above and
 * records a message for it; FALSE if it finds none (the schema's own
 * message is then used). */
static gboolean
pl_layout_diagnose (LoadState *state, xmlNodePtr node, const char *parent_name)
{
  const ElementRule *rule;
  long line = xmlGetLineNo (node);

  if (!pl_layout_is_ours (node, NULL) || (rule = pl_layout_find_rule ((const char *) node->name))
      == NULL || !pl_layout_word_in (parent_name, rule->parents))
    {
      g_autofree char *allowed = pl_layout_allowed_children (parent_name);

      if (!pl_layout_is_ours (node, NULL))
        pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                        _("<%s> is not an element of a Pressline layout (its namespace is "
                          "not %s); inside <%s> one of %s was expected"),
                        (const char *) node->name, PL_LAYOUT_NAMESPACE, parent_name, allowed);
      else
        pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                        _("<%s> is not allowed inside <%s>; expected one of %s"),
                        (const char *) node->name, parent_name,
                        allowed[0] != '\0' ? allowed : _("nothing"));
      return TRUE;
    }

  for (xmlAttrPtr attr = node->properties; attr != NULL; attr = attr->next)
    {
      gboolean known = FALSE;

      for (guint i = 0; i < G_N_ELEMENTS (rule->attrs) && rule->attrs[i].name != NULL; i++)
        known = known || (attr->ns == NULL
                          && strcmp ((const char *) attr->name, rule->attrs[i].name) == 0);
      if (!known)
        {
          pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                          _("<%s> has no attribute “%s”"), rule->element,
                          (const char *) attr->name);
          return TRUE;
        }
    }
  for (guint i = 0; i < G_N_ELEMENTS (rule->attrs) && rule->attrs[i].name != NULL; i++)
    {
      const AttrRule *a = &rule->attrs[i];
      xmlChar *value = xmlGetNoNsProp (node, BAD_CAST a->name);
      gboolean found = FALSE;

      if (value == NULL && a->required)
        {
          pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                          _("<%s> lacks the attribute “%s” (%s)"), rule->element, a->name,
                          pl_layout_attr_expected (a->type));
          found = TRUE;
        }
      else if (value != NULL && !pl_layout_attr_fits (a->type, (const char *) value))
        {
          pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                          _("the attribute “%s” of <%s> is “%s”; expected %s"), a->name,
                          rule->element, (const char *) value,
                          pl_layout_attr_expected (a->type));
          found = TRUE;
        }
      if (value != NULL)
        xmlFree (value);
      if (found)
        return TRUE;
    }

  for (xmlNodePtr child = node->children; child != NULL; child = child->next)
    {
      if (child->type == XML_ELEMENT_NODE)
        {
          if (rule->text || pl_layout_find_rule ((const char *) child->name) == NULL
              || !pl_layout_is_ours (child, NULL))
            {
              /* No element may sit in a text-only element. */
              if (rule->text)
                {
                  pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, xmlGetLineNo (child), 0,
                                  _("<%s> may hold only text, not the element <%s>"),
                                  rule->element, (const char *) child->name);
                  return TRUE;
                }
            }
          if (pl_layout_diagnose (state, child, rule->element))
            return TRUE;
        }
      else if ((child->type == XML_TEXT_NODE || child->type == XML_CDATA_SECTION_NODE)
               && !rule->text && !xmlIsBlankNode (child))
        {
          g_autofree char *text = g_strstrip (g_strdup ((const char *) child->content));

          if (g_utf8_strlen (text, -1) > 20)
            *g_utf8_offset_to_pointer (text, 20) = '\0';
          pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA, pl_layout_text_line (child), 0,
                          _("<%s> may not hold text (found “%s”)"), rule->element, text);
          return TRUE;
        }
    }
  return FALSE;
}

static gboolean
pl_layout_validate (LoadState *state, xmlDocPtr doc)
{
  g_autoptr (GBytes) schema_text = NULL;
  xmlRelaxNGParserCtxtPtr parser = NULL;
  xmlRelaxNGPtr schema = NULL;
  xmlRelaxNGValidCtxtPtr valid = NULL;
  SchemaErrors errors = { state, NULL, 0 };
  gboolean ok = FALSE;
  gsize size;
  const char *text;

  schema_text = pl_layout_get_schema ();
  text = g_bytes_get_data (schema_text, &size);
  parser = xmlRelaxNGNewMemParserCtxt (text, (int) size);
  if (parser == NULL)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_IO, 0, 0, _("out of memory"));
      goto out;
    }
  xmlRelaxNGSetParserStructuredErrors (parser, pl_layout_schema_error_cb, &errors);
  schema = xmlRelaxNGParse (parser);
  if (schema == NULL)
    {
      /* The schema is part of the program: this is a build error. */
      g_critical ("The built-in layout schema does not compile: %s",
                  errors.message != NULL ? errors.message : "?");
      pl_layout_fail (state, PL_LAYOUT_ERROR_IO, 0, 0,
                      _("the layout schema built into Pressline is broken"));
      goto out;
    }
  g_clear_pointer (&errors.message, g_free);
  valid = xmlRelaxNGNewValidCtxt (schema);
  if (valid == NULL)
    {
      pl_layout_fail (state, PL_LAYOUT_ERROR_IO, 0, 0, _("out of memory"));
      goto out;
    }
  xmlRelaxNGSetValidStructuredErrors (valid, pl_layout_schema_error_cb, &errors);
  if (xmlRelaxNGValidateDoc (valid, doc) == 0)
    {
      ok = TRUE;
      goto out;
    }
  /* Invalid.  Say precisely what is wrong where the rules above can;
   * otherwise (order of sections, repeated sections) pass on the
   * validator's sentence. */
  if (!pl_layout_diagnose (state, xmlDocGetRootElement (doc), ""))
    pl_layout_fail (state, PL_LAYOUT_ERROR_SCHEMA,
                    errors.line > 0 ? errors.line : xmlGetLineNo (xmlDocGetRootElement (doc)),
                    0, _("this does not follow the layout schema: %s"),
                    errors.message != NULL ? errors.message : "?");

out:
  g_free (errors.message);
  if (valid != NULL)
    xmlRelaxNGFreeValidCtxt (valid);
  if (schema != NULL)
    xmlRelaxNGFree (schema);
  if (parser != NULL)
    xmlRelaxNGFreeParserCtxt (parser);
  return ok;
}

/* --- stage 5: the content --- */

typedef struct
{
  LoadState *state;
  PlDocument *doc;
  PlUnitId drawing_unit;
  GHashTable *id_lines;    /* id -> line of its first use (GINT_TO_POINTER) */
  GHashTable *tag_lines;   /* tag -> line */
  GHashTable *part_types;  /* part id -> const PlPartType * */
} Builder;

static char *
pl_layout_get_attr (xmlNodePtr node, const char *name)
{
  xmlChar *value = xmlGetNoNsProp (node, BAD_CAST name);
  char *copy = g_strdup (value != NULL ? (const char *) value : "");

  if (value != NULL)
    xmlFree (value);
  return copy;
}

static char *
pl_layout_get_text (xmlNodePtr node)
{
  xmlChar *content = xmlNodeGetContent (node);
  char *copy = g_strdup (content != NULL ? (const char *) content : "");

  if (content != NULL)
    xmlFree (content);
  return copy;
}

/* The keys of the units a quantity takes, "m, cm, mm, um, in, ft". */
static char *
pl_layout_unit_keys (PlQuantity quantity)
{
  GString *list = g_string_new (NULL);

  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    if (pl_unit_fits ((PlUnitId) u, quantity))
      g_string_append_printf (list, "%s%s", list->len > 0 ? ", " : "",
                              pl_unit_get ((PlUnitId) u)->key);
  return g_string_free (list, FALSE);
}

static gboolean
pl_layout_apply (Builder *b, xmlNodePtr node, PlCommand *cmd)
{
  g_autoptr (GError) err = NULL;
  gboolean ok = pl_command_apply (cmd, b->doc, &err);

  if (!ok)
    pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, xmlGetLineNo (node), 0, "%s",
                    err->message);
  pl_command_unref (cmd);
  return ok;
}

/* A decimal attribute (already matched by the schema) as a finite double. */
static gboolean
pl_layout_read_decimal (Builder *b, xmlNodePtr node, const char *text, double *out)
{
  double v;

  if (!pl_layout_is_decimal (text))
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_SCHEMA, xmlGetLineNo (node), 0,
                      _("“%s” is not a number; expected %s"), text,
                      pl_layout_attr_expected (ATTR_DECIMAL));
      return FALSE;
    }
  v = g_ascii_strtod (text, NULL);
  if (!isfinite (v))
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, xmlGetLineNo (node), 0,
                      _("“%s” is too large to be held as a number"), text);
      return FALSE;
    }
  *out = v;
  return TRUE;
}

/* A coordinate of the drawing in world units (mm). */
static gboolean
pl_layout_read_coordinate (Builder *b, xmlNodePtr node, const char *attr, double *out)
{
  g_autofree char *text = pl_layout_get_attr (node, attr);
  double v;

  if (!pl_layout_read_decimal (b, node, text, &v))
    return FALSE;
  /* The drawing is in mm: no arithmetic at all for a file in mm, so a
   * coordinate comes back bit for bit. */
  if (b->drawing_unit != PL_UNIT_MM)
    v = pl_unit_to_si (b->drawing_unit, v) / pl_unit_to_si (PL_UNIT_MM, 1.0);
  if (!isfinite (v))
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, xmlGetLineNo (node), 0,
                      _("“%s” is too large to be held as a number"), text);
      return FALSE;
    }
  *out = v;
  return TRUE;
}

static const char *
pl_layout_kind_element (PlParamKind kind)
{
  switch (kind)
    {
    case PL_PARAM_NUMBER:
      return "number";
    case PL_PARAM_CHOICE:
      return "choice";
    case PL_PARAM_BOOLEAN:
      return "boolean";
    case PL_PARAM_TEXT:
      return "text";
    default:
      return "";
    }
}

/* One <number>, <choice>, <boolean> or <text> of item_id (of type), into
 * *value (text newly allocated). */
static gboolean
pl_layout_read_value (Builder *b, xmlNodePtr node, const PlPartType *type, const char *owner,
                      guint *index, PlValue *value)
{
  g_autofree char *key = pl_layout_get_attr (node, "key");
  g_autofree char *text = NULL;
  const PlParamSpec *spec = pl_part_type_find_param (type, key, index);
  const char *element = (const char *) node->name;
  long line = xmlGetLineNo (node);
  g_autoptr (GError) err = NULL;

  if (spec == NULL)
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("%s has no parameter “%s”"), owner, key);
      return FALSE;
    }
  if (strcmp (element, pl_layout_kind_element (spec->kind)) != 0)
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("the parameter “%s” of %s is written as <%s>, not as <%s>"), key,
                      owner, pl_layout_kind_element (spec->kind), element);
      return FALSE;
    }
  memset (value, 0, sizeof *value);
  value->kind = spec->kind;
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      {
        g_autofree char *unit_key = pl_layout_get_attr (node, "unit");
        PlUnitId unit = pl_unit_from_key (unit_key);
        double v;

        text = pl_layout_get_attr (node, "value");
        if (unit == PL_UNIT_NONE || !pl_unit_fits (unit, spec->quantity))
          {
            g_autofree char *keys = pl_layout_unit_keys (spec->quantity);

            pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                            _("the unit “%s” does not fit the parameter “%s” of %s, which is "
                              "%s; expected one of: %s"), unit_key, key, owner,
                            pl_quantity_get_phrase (spec->quantity), keys);
            return FALSE;
          }
        if (!pl_layout_read_decimal (b, node, text, &v))
          return FALSE;
        value->number = pl_unit_to_si (unit, v);
        if (!isfinite (value->number))
          {
            pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                            _("“%s” is too large to be held as a number"), text);
            return FALSE;
          }
        if (!pl_param_spec_check_number (spec, value->number, NULL, &err))
          {
            pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0, "%s: %s", owner,
                            err->message);
            return FALSE;
          }
        return TRUE;
      }
    case PL_PARAM_CHOICE:
      {
        int choice;

        text = pl_layout_get_attr (node, "value");
        choice = pl_param_spec_find_choice (spec, text);
        if (choice < 0)
          {
            GString *keys = g_string_new (NULL);

            for (guint i = 0; i < spec->n_choices; i++)
              g_string_append_printf (keys, "%s%s", i > 0 ? ", " : "", spec->choices[i].key);
            pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                            _("“%s” is not a choice of the parameter “%s” of %s; expected one "
                              "of: %s"), text, key, owner, keys->str);
            g_string_free (keys, TRUE);
            return FALSE;
          }
        value->choice = (guint) choice;
        return TRUE;
      }
    case PL_PARAM_BOOLEAN:
      text = pl_layout_get_attr (node, "value");
      value->boolean = strcmp (text, "true") == 0;
      return TRUE;
    case PL_PARAM_TEXT:
      text = pl_layout_get_text (node);
      if (!pl_param_spec_check_text (spec, text, &err))
        {
          pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0, "%s: %s", owner,
                          err->message);
          return FALSE;
        }
      value->text = g_steal_pointer (&text);
      return TRUE;
    default:
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("%s has no parameter “%s”"), owner, key);
      return FALSE;
    }
}

/* The value children of node, set on item_id (a part, "title" or
 * "scenario") where they differ from what the item holds. */
static gboolean
pl_layout_read_values (Builder *b, xmlNodePtr node, const char *item_id, const char *owner)
{
  const PlPart *part = pl_document_find_part (b->doc, item_id);
  const PlPartType *type = pl_part_get_part_type (part);
  g_autofree long *seen = g_new0 (long, type->n_params + 1);
  gboolean ok = TRUE;

  for (xmlNodePtr child = node->children; child != NULL && ok; child = child->next)
    {
      PlValue value;
      guint index = 0;

      if (child->type != XML_ELEMENT_NODE)
        continue;
      if (!pl_layout_read_value (b, child, type, owner, &index, &value))
        {
          ok = FALSE;
          break;
        }
      if (seen[index] > 0)
        {
          pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, xmlGetLineNo (child), 0,
                          _("%s gives the parameter “%s” twice (first on line %ld)"), owner,
                          type->params[index].key, seen[index]);
          ok = FALSE;
        }
      else
        {
          seen[index] = MAX (xmlGetLineNo (child), 1);
          /* The model refuses a command that changes nothing. */
          part = pl_document_find_part (b->doc, item_id);
          if (!pl_value_equal (pl_part_get_nth_value (part, index), &value))
            ok = pl_layout_apply (b, child, pl_command_new_set_value (item_id,
                                                                      type->params[index].key,
                                                                      &value));
        }
      pl_value_clear (&value);
    }
  return ok;
}

/* Records what (an id, or a tag if is_tag) with the line of node; FALSE
 * with a message if it was seen before. */
static gboolean
pl_layout_claim (Builder *b, xmlNodePtr node, const char *what, gboolean is_tag)
{
  GHashTable *table = is_tag ? b->tag_lines : b->id_lines;
  long line = xmlGetLineNo (node);
  gpointer first;

  if (g_hash_table_lookup_extended (table, what, NULL, &first))
    {
      if (is_tag)
        pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                        _("the tag “%s” is used twice (first on line %ld)"), what,
                        (long) GPOINTER_TO_INT (first));
      else
        pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                        _("the id “%s” is used twice (first on line %ld)"), what,
                        (long) GPOINTER_TO_INT (first));
      return FALSE;
    }
  g_hash_table_insert (table, g_strdup (what), GINT_TO_POINTER ((int) MAX (line, 1)));
  return TRUE;
}

static char *
pl_layout_placeable_keys (void)
{
  GString *list = g_string_new (NULL);

  for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
    g_string_append_printf (list, "%s%s", i > 0 ? ", " : "",
                            pl_part_type_get_placeable (i)->key);
  return g_string_free (list, FALSE);
}

static gboolean
pl_layout_read_part (Builder *b, xmlNodePtr node)
{
  g_autofree char *id = pl_layout_get_attr (node, "id");
  g_autofree char *type_key = pl_layout_get_attr (node, "type");
  g_autofree char *tag = pl_layout_get_attr (node, "tag");
  g_autofree char *rotation = pl_layout_get_attr (node, "rotation");
  g_autofree char *mirrored = pl_layout_get_attr (node, "mirrored");
  g_autofree char *owner = NULL;
  const PlPartType *type = pl_part_type_lookup (type_key);
  long line = xmlGetLineNo (node);
  double x, y;

  if (type == NULL || !type->placeable)
    {
      g_autofree char *keys = pl_layout_placeable_keys ();

      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("unknown part type “%s”; expected one of: %s"), type_key, keys);
      return FALSE;
    }
  if (!pl_layout_claim (b, node, id, FALSE) || !pl_layout_claim (b, node, tag, TRUE)
      || !pl_layout_read_coordinate (b, node, "x", &x)
      || !pl_layout_read_coordinate (b, node, "y", &y))
    return FALSE;
  g_hash_table_insert (b->part_types, g_strdup (id), (gpointer) type);
  if (!pl_layout_apply (b, node,
                        pl_command_new_add_part_full (type->key, id, tag, x, y,
                                                      (guint) (g_ascii_strtoull (rotation, NULL,
                                                                                 10) / 90),
                                                      strcmp (mirrored, "true") == 0)))
    return FALSE;
  owner = g_strdup_printf (_("part “%s”"), tag);
  return pl_layout_read_values (b, node, id, owner);
}

/* "p3:out" of a wire into its part id and port key, checked against the
 * parts read so far. */
static gboolean
pl_layout_read_wire_end (Builder *b, xmlNodePtr node, const char *wire_id, const char *attr,
                         char **part_id, char **port_key)
{
  g_autofree char *ref = pl_layout_get_attr (node, attr);
  const char *colon = strchr (ref, ':');
  const PlPartType *type;
  long line = xmlGetLineNo (node);

  if (colon == NULL)
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_SCHEMA, line, 0,
                      _("the attribute “%s” of <%s> is “%s”; expected %s"), attr, "wire", ref,
                      pl_layout_attr_expected (ATTR_PORT_REF));
      return FALSE;
    }
  *part_id = g_strndup (ref, (gsize) (colon - ref));
  *port_key = g_strdup (colon + 1);
  type = g_hash_table_lookup (b->part_types, *part_id);
  if (type == NULL)
    {
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("the wire “%s” ends at the part “%s”, which the file does not have"),
                      wire_id, *part_id);
      return FALSE;
    }
  if (pl_part_type_find_port (type, *port_key, NULL) == NULL)
    {
      GString *ports = g_string_new (NULL);

      for (guint i = 0; i < type->n_ports; i++)
        g_string_append_printf (ports, "%s%s", i > 0 ? ", " : "", type->ports[i].key);
      pl_layout_fail (b->state, PL_LAYOUT_ERROR_CONTENT, line, 0,
                      _("the wire “%s” ends at the port “%s” of the part “%s”, but a part of "
                        "type “%s” has only the ports: %s"),
                      wire_id, *port_key, *part_id, type->key, ports->str);
      g_string_free (ports, TRUE);
      return FALSE;
    }
  return TRUE;
}

static gboolean
pl_layout_read_wire (Builder *b, xmlNodePtr node)
{
  g_autofree char *id = pl_layout_get_attr (node, "id");
  g_autofree char *part_a = NULL, *port_a = NULL, *part_b = NULL, *port_b = NULL;
  g_autoptr (GArray) bends = g_array_new (FALSE, FALSE, sizeof (PlPoint));

  if (!pl_layout_claim (b, node, id, FALSE)
      || !pl_layout_read_wire_end (b, node, id, "from", &part_a, &port_a)
      || !pl_layout_read_wire_end (b, node, id, "to", &part_b, &port_b))
    return FALSE;
  for (xmlNodePtr child = node->children; child != NULL; child = child->next)
    {
      PlPoint p;

      if (!pl_layout_is_ours (child, "bend"))
        continue;
      if (!pl_layout_read_coordinate (b, child, "x", &p.x)
          || !pl_layout_read_coordinate (b, child, "y", &p.y))
        return FALSE;
      g_array_append_val (bends, p);
    }
  return pl_layout_apply (b, node, pl_command_new_add_wire (id, part_a, port_a, part_b, port_b,
                                                            (const PlPoint *) bends->data,
                                                            bends->len));
}

static gboolean
pl_layout_read_note (Builder *b, xmlNodePtr node)
{
  g_autofree char *id = pl_layout_get_attr (node, "id");
  g_autofree char *text = pl_layout_get_text (node);
  double x, y;

  if (!pl_layout_claim (b, node, id, FALSE)
      || !pl_layout_read_coordinate (b, node, "x", &x)
      || !pl_layout_read_coordinate (b, node, "y", &y))
    return FALSE;
  return pl_layout_apply (b, node, pl_command_new_add_note (id, x, y, text));
}

static PlDocument *
pl_layout_build (LoadState *state, xmlNodePtr root)
{
  g_autofree char *unit_key = pl_layout_get_attr (root, "drawing-unit");
  Builder b = { state, NULL, pl_unit_from_key (unit_key), NULL, NULL, NULL };
  gboolean ok = TRUE;

  if (!pl_unit_fits (b.drawing_unit, PL_QUANTITY_LENGTH))
    {
      g_autofree char *keys = pl_layout_unit_keys (PL_QUANTITY_LENGTH);

      pl_layout_fail (state, PL_LAYOUT_ERROR_CONTENT, xmlGetLineNo (root), 0,
                      _("the drawing unit “%s” is not a unit of length; expected one of: %s"),
                      unit_key, keys);
      return NULL;
    }
  b.doc = pl_document_new ();
  b.id_lines = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  b.tag_lines = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  b.part_types = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);

  /* The schema fixed the order: title, scenario, parts, wires, notes. */
  for (xmlNodePtr section = root->children; section != NULL && ok; section = section->next)
    {
      if (pl_layout_is_ours (section, "title"))
        ok = pl_layout_read_values (&b, section, "title", _("the title block"));
      else if (pl_layout_is_ours (section, "scenario"))
        ok = pl_layout_read_values (&b, section, "scenario", _("the scenario"));
      else if (pl_layout_is_ours (section, "parts"))
        for (xmlNodePtr n = section->children; n != NULL && ok; n = n->next)
          ok = !pl_layout_is_ours (n, "part") || pl_layout_read_part (&b, n);
      else if (pl_layout_is_ours (section, "wires"))
        for (xmlNodePtr n = section->children; n != NULL && ok; n = n->next)
          ok = !pl_layout_is_ours (n, "wire") || pl_layout_read_wire (&b, n);
      else if (pl_layout_is_ours (section, "notes"))
        for (xmlNodePtr n = section->children; n != NULL && ok; n = n->next)
          ok = !pl_layout_is_ours (n, "note") || pl_layout_read_note (&b, n);
    }

  g_hash_table_unref (b.id_lines);
  g_hash_table_unref (b.tag_lines);
  g_hash_table_unref (b.part_types);
  if (!ok)
    g_clear_object (&b.doc);
  return b.doc;
}

/* --- entry points --- */

static gpointer
pl_layout_init_once (gpointer data)
{
  /* libxml2 asks for this once before threads use it; the RELAX NG type
   * library is a process-wide table built on first use, so build it here
   * rather than race two first loads. */
  xmlInitParser ();
  xmlRelaxNGInitTypes ();
  /* pl_app_get_resource() needs the bundle initialised, which registers
   * it with GIO once for the process (an app-wide fact, not load state). */
  pl_app_register_resource ();
  return NULL;
}

static void
pl_layout_init (void)
{
  static GOnce once = G_ONCE_INIT;

  g_once (&once, pl_layout_init_once, NULL);
}

GBytes *
pl_layout_get_schema (void)
{
  GBytes *bytes;

  pl_layout_init ();
  bytes = g_resource_lookup_data (pl_app_get_resource (), PL_LAYOUT_SCHEMA_RESOURCE,
                                  G_RESOURCE_LOOKUP_FLAGS_NONE, NULL);
  g_assert (bytes != NULL);   /* compiled in by app/meson.build */
  return bytes;
}

PlDocument *
pl_layout_read_data (const char *data, gsize length, const char *display_name,
                     GError **error)
{
  LoadState state = { display_name != NULL ? display_name : "layout", NULL, 0, 0 };
  xmlDocPtr xml = NULL;
  PlDocument *doc = NULL;

  g_return_val_if_fail (data != NULL || length == 0, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  pl_layout_init ();
  if (!pl_layout_check_bytes (&state, data, length))
    goto out;
  xml = pl_layout_parse (&state, data, length);
  if (xml == NULL)
    goto out;
  if (!pl_layout_check_root (&state, xmlDocGetRootElement (xml))
      || !pl_layout_validate (&state, xml))
    goto out;
  doc = pl_layout_build (&state, xmlDocGetRootElement (xml));

out:
  if (xml != NULL)
    xmlFreeDoc (xml);
  if (doc == NULL && state.error == NULL)
    pl_layout_fail (&state, PL_LAYOUT_ERROR_CONTENT, 0, 0, _("the layout cannot be read"));
  if (state.error != NULL)
    g_propagate_error (error, g_steal_pointer (&state.error));
  return doc;
}

PlDocument *
pl_layout_read_file (const char *filename, GError **error)
{
  g_autofree char *name = NULL;
  GByteArray *bytes = NULL;
  PlDocument *doc = NULL;
  struct stat st;
  int fd = -1;

  g_return_val_if_fail (filename != NULL, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  name = g_filename_display_name (filename);
  /* O_NONBLOCK: opening a FIFO must not wait for a writer; fstat below
   * refuses anything but a regular file before a byte is read. */
  fd = open (filename, O_RDONLY | O_CLOEXEC | O_NOCTTY | O_NONBLOCK);
  if (fd < 0)
    {
      int saved = errno;

      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO, _("%s: cannot open the file: %s"),
                   name, g_strerror (saved));
      goto out;
    }
  if (fstat (fd, &st) != 0 || !S_ISREG (st.st_mode))
    {
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                   _("%s: not a regular file; a layout is read from a file"), name);
      goto out;
    }
  if (st.st_size > (off_t) PL_LAYOUT_MAX_FILE_SIZE)
    {
      /* Refused before reading: the same message as for the bytes. */
      LoadState state = { name, NULL, 0, 0 };
      g_autofree char *size = g_format_size ((guint64) st.st_size);
      g_autofree char *limit = g_format_size (PL_LAYOUT_MAX_FILE_SIZE);

      pl_layout_fail (&state, PL_LAYOUT_ERROR_TOO_LARGE, 0, 0,
                      _("the file is %s, more than the %s a layout file may have"), size,
                      limit);
      g_propagate_error (error, state.error);
      goto out;
    }
  /* Read to the end but never more than the limit allows, even if the
   * file grows after fstat. */
  bytes = g_byte_array_sized_new ((guint) st.st_size + 1);
  for (;;)
    {
      guint8 chunk[65536];
      ssize_t n = read (fd, chunk, sizeof chunk);

      if (n < 0 && errno == EINTR)
        continue;
      if (n < 0)
        {
          int saved = errno;

          g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                       _("%s: cannot read the file: %s"), name, g_strerror (saved));
          goto out;
        }
      if (n == 0)
        break;
      g_byte_array_append (bytes, chunk, (guint) n);
      if (bytes->len > PL_LAYOUT_MAX_FILE_SIZE)
        break;   /* pl_layout_read_data gives the message */
    }
  doc = pl_layout_read_data ((const char *) bytes->data, bytes->len, name, error);

out:
  if (bytes != NULL)
    g_byte_array_unref (bytes);
  if (fd >= 0)
    close (fd);
  return doc;
}
