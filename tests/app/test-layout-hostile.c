/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Hostile layout files: entity expansion, external entities and DTDs,
 * XInclude, deep nesting, huge attributes and files, NUL bytes and bad
 * UTF-8.  Each must be refused with the message of the stage that stops it,
 * and nothing outside the file may be opened: the references point at a
 * FIFO that this test creates and never writes, so a reader that opened it
 * would block there (and the test would time out), and at a file holding a
 * secret that must not appear in any message.
 */

#include "config.h"

#include <glib.h>
#include <glib/gstdio.h>
#include <string.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <unistd.h>

#include "pl-check.h"

#include "pl-document.h"
#include "pl-layout-reader.h"

#define SECRET "secret-7c1d2e"
#define LAYOUT_OPEN "<layout xmlns=\"" PL_LAYOUT_NAMESPACE "\" version=\"1\" drawing-unit=\"mm\">"

typedef struct
{
  char *dir;
  char *fifo;      /* a FIFO nobody writes: opening it blocks */
  char *secret;    /* a regular file holding SECRET */
  char *missing;   /* a path that does not exist */
} Outside;

static Outside outside;

static void
outside_setup (void)
{
  outside.dir = g_dir_make_tmp ("pressline-hostile-XXXXXX", NULL);
  ck_assert_ptr_nonnull (outside.dir);
  outside.fifo = g_build_filename (outside.dir, "fifo", NULL);
  outside.secret = g_build_filename (outside.dir, "secret.txt", NULL);
  outside.missing = g_build_filename (outside.dir, "no-such-file", NULL);
  ck_assert_int_eq (mkfifo (outside.fifo, 0600), 0);
  ck_assert (g_file_set_contents (outside.secret, SECRET "\n", -1, NULL));
}

static void
outside_teardown (void)
{
  g_unlink (outside.fifo);
  g_unlink (outside.secret);
  g_rmdir (outside.dir);
  g_clear_pointer (&outside.dir, g_free);
  g_clear_pointer (&outside.fifo, g_free);
  g_clear_pointer (&outside.secret, g_free);
  g_clear_pointer (&outside.missing, g_free);
}

typedef enum
{
  BILLION_LAUGHS,
  ENTITY_PASSWD,
  ENTITY_FIFO,
  ENTITY_MISSING,
  ENTITY_SECRET,
  ENTITY_IN_ATTRIBUTE,
  DTD_FIFO,
  PARAMETER_ENTITY_FIFO,
  INTERNAL_SUBSET_ONLY,
  XINCLUDE_FIFO,
  XML_BASE,
  DEEP_NESTING,
  HUGE_ATTRIBUTE,
  LONG_ATTRIBUTE,
  LONG_NAME,
  MANY_ELEMENTS,
  NUL_BYTE,
  BAD_UTF8,
  OVERLONG_UTF8,
  UTF16,
  CHAR_REF_ZERO,
  N_HOSTILE
} Hostile;

typedef struct
{
  const char *name;
  PlLayoutError code;
  const char *fragment;
} HostileCase;

/* Indexed by Hostile. */
static const HostileCase hostile_cases[N_HOSTILE] = {
  /* A DTD is refused at its first line: no entity is ever declared. */
  [BILLION_LAUGHS] = { "billion laughs (XML bomb)", PL_LAYOUT_ERROR_REFUSED,
                       ":2: a document type declaration" },
  [ENTITY_PASSWD] = { "external entity to /etc/passwd", PL_LAYOUT_ERROR_REFUSED,
                      ":2: a document type declaration" },
  [ENTITY_FIFO] = { "external entity to a FIFO", PL_LAYOUT_ERROR_REFUSED,
                    ":2: a document type declaration" },
  [ENTITY_MISSING] = { "external entity to a missing file", PL_LAYOUT_ERROR_REFUSED,
                       ":2: a document type declaration" },
  [ENTITY_SECRET] = { "external entity to a readable file", PL_LAYOUT_ERROR_REFUSED,
                      ":2: a document type declaration" },
  /* Without a DTD an entity reference is simply undefined. */
  [ENTITY_IN_ATTRIBUTE] = { "undeclared entity in an attribute",
                            PL_LAYOUT_ERROR_NOT_WELL_FORMED, "Entity 'xxe' not defined" },
  [DTD_FIFO] = { "external DTD on a FIFO", PL_LAYOUT_ERROR_REFUSED,
                 ":1: a document type declaration" },
  [PARAMETER_ENTITY_FIFO] = { "parameter entity to a FIFO", PL_LAYOUT_ERROR_REFUSED,
                              ":1: a document type declaration" },
  [INTERNAL_SUBSET_ONLY] = { "a harmless internal DTD", PL_LAYOUT_ERROR_REFUSED,
                             ":3: a document type declaration" },
  /* XInclude is never processed: the element is foreign to the schema. */
  [XINCLUDE_FIFO] = { "XInclude of a FIFO", PL_LAYOUT_ERROR_SCHEMA,
                      ":4: <include> is not an element of a Pressline layout" },
  [XML_BASE] = { "xml:base on the root", PL_LAYOUT_ERROR_SCHEMA,
                 ":1: <layout> has no attribute “base”" },
  /* libxml2 stops at 256 levels by itself; the reader already at 33. */
  [DEEP_NESTING] = { "10 000 nested elements", PL_LAYOUT_ERROR_REFUSED,
                     ":1: elements are nested more than 32 deep" },
  [HUGE_ATTRIBUTE] = { "a 50 MiB attribute", PL_LAYOUT_ERROR_TOO_LARGE,
                       "a layout file may have" },
  [LONG_ATTRIBUTE] = { "a 1 MiB attribute", PL_LAYOUT_ERROR_REFUSED,
                       ":1: the attribute “tag” of <part> is 1048576 bytes long; at most 1024" },
  [LONG_NAME] = { "a 100 000 character element name", PL_LAYOUT_ERROR_NOT_WELL_FORMED,
                  "not well-formed XML" },
  [MANY_ELEMENTS] = { "150 000 elements", PL_LAYOUT_ERROR_REFUSED,
                      "the file has more than 100000 elements" },
  [NUL_BYTE] = { "a NUL byte", PL_LAYOUT_ERROR_ENCODING, ":2:8: the file holds a NUL byte" },
  [BAD_UTF8] = { "invalid UTF-8", PL_LAYOUT_ERROR_ENCODING,
                 ":3:37: the byte 0xC3 is not valid UTF-8" },
  [OVERLONG_UTF8] = { "an overlong UTF-8 sequence", PL_LAYOUT_ERROR_ENCODING,
                      ":1:1: the byte 0xC0 is not valid UTF-8" },
  [UTF16] = { "UTF-16 with a byte order mark", PL_LAYOUT_ERROR_ENCODING,
              ":1:1: the byte 0xFF is not valid UTF-8" },
  [CHAR_REF_ZERO] = { "a character reference to U+0000", PL_LAYOUT_ERROR_NOT_WELL_FORMED,
                      "not well-formed XML" },
};

static GString *
repeat (GString *out, const char *piece, guint n)
{
  for (guint i = 0; i < n; i++)
    g_string_append (out, piece);
  return out;
}

/* The bytes of case c (a GString: may hold NUL bytes). */
static GString *
hostile_bytes (Hostile c)
{
  GString *s = g_string_new (NULL);

  switch (c)
    {
    case BILLION_LAUGHS:
      /* The classic exponential entity expansion: each level names the
       * one below it ten times, 10^9 "lol"s in all. */
      g_string_append (s, "<?xml version=\"1.0\"?>\n<!DOCTYPE layout [\n"
                          " <!ENTITY lol \"lol\">\n");
      for (int i = 1; i <= 9; i++)
        {
          g_string_append_printf (s, " <!ENTITY lol%d \"", i);
          for (int j = 0; j < 10; j++)
            {
              if (i == 1)
                g_string_append (s, "&lol;");
              else
                g_string_append_printf (s, "&lol%d;", i - 1);
            }
          g_string_append (s, "\">\n");
        }
      g_string_append (s, "]>\n" LAYOUT_OPEN "<notes><note id=\"n1\" x=\"0\" y=\"0\">"
                          "&lol9;</note></notes></layout>\n");
      break;
    case ENTITY_PASSWD:
    case ENTITY_FIFO:
    case ENTITY_MISSING:
    case ENTITY_SECRET:
      {
        const char *target = c == ENTITY_PASSWD ? "/etc/passwd"
                             : c == ENTITY_FIFO ? outside.fifo
                             : c == ENTITY_MISSING ? outside.missing : outside.secret;

        g_string_append_printf (s, "<?xml version=\"1.0\"?>\n"
                                   "<!DOCTYPE layout [ <!ENTITY xxe SYSTEM \"file://%s\"> ]>\n"
                                   LAYOUT_OPEN "<notes><note id=\"n1\" x=\"0\" y=\"0\">&xxe;"
                                   "</note></notes></layout>\n", target);
        break;
      }
    case ENTITY_IN_ATTRIBUTE:
      g_string_append (s, LAYOUT_OPEN "<parts><part id=\"p1\" type=\"hose\" tag=\"&xxe;\" "
                          "x=\"0\" y=\"0\"/></parts></layout>\n");
      break;
    case DTD_FIFO:
      g_string_append_printf (s, "<!DOCTYPE layout SYSTEM \"%s\">\n" LAYOUT_OPEN "</layout>\n",
                              outside.fifo);
      break;
    case PARAMETER_ENTITY_FIFO:
      g_string_append_printf (s, "<!DOCTYPE layout [ <!ENTITY %% p SYSTEM \"%s\"> %%p; ]>\n"
                                 LAYOUT_OPEN "</layout>\n", outside.fifo);
      break;
    case INTERNAL_SUBSET_ONLY:
      g_string_append (s, "<?xml version=\"1.0\"?>\n<!-- a comment first -->\n"
                          "<!DOCTYPE layout [ <!ELEMENT layout ANY> ]>\n"
                          LAYOUT_OPEN "</layout>\n");
      break;
    case XINCLUDE_FIFO:
      g_string_append_printf (s, "<?xml version=\"1.0\"?>\n" LAYOUT_OPEN "\n<notes>\n"
                                 "<xi:include xmlns:xi=\"http://www.w3.org/2001/XInclude\" "
                                 "href=\"%s\" parse=\"text\"/>\n</notes></layout>\n",
                              outside.fifo);
      break;
    case XML_BASE:
      g_string_append_printf (s, "<layout xmlns=\"" PL_LAYOUT_NAMESPACE "\" version=\"1\" "
                                 "drawing-unit=\"mm\" xml:base=\"file://%s/\"/>\n",
                              outside.dir);
      break;
    case DEEP_NESTING:
      g_string_append (s, LAYOUT_OPEN);
      repeat (s, "<notes>", 10000);
      repeat (s, "</notes>", 10000);
      g_string_append (s, "</layout>\n");
      break;
    case HUGE_ATTRIBUTE:
      g_string_append (s, LAYOUT_OPEN "<parts><part id=\"p1\" type=\"hose\" tag=\"");
      g_string_set_size (s, s->len + 50u * 1024u * 1024u);
      memset (s->str + s->len - 50u * 1024u * 1024u, 'A', 50u * 1024u * 1024u);
      g_string_append (s, "\" x=\"0\" y=\"0\"/></parts></layout>\n");
      break;
    case LONG_ATTRIBUTE:
      g_string_append (s, LAYOUT_OPEN "<parts><part id=\"p1\" type=\"hose\" tag=\"");
      repeat (s, "A", 1024u * 1024u);
      g_string_append (s, "\" x=\"0\" y=\"0\"/></parts></layout>\n");
      break;
    case LONG_NAME:
      g_string_append (s, LAYOUT_OPEN "<");
      repeat (s, "n", 100000);
      g_string_append (s, "/></layout>\n");
      break;
    case MANY_ELEMENTS:
      g_string_append (s, LAYOUT_OPEN "<parts/><wires><wire id=\"w1\" from=\"p1:a\" "
                          "to=\"p2:b\">");
      repeat (s, "<bend x=\"0\" y=\"0\"/>", 150000);
      g_string_append (s, "</wire></wires></layout>\n");
      break;
    case NUL_BYTE:
      g_string_append (s, LAYOUT_OPEN "\n<notes>");
      g_string_append_c (s, '\0');
      g_string_append (s, "</notes></layout>\n");
      break;
    case BAD_UTF8:
      g_string_append (s, "<?xml version=\"1.0\"?>\n" LAYOUT_OPEN "\n"
                          "<notes><note id=\"n1\" x=\"0\" y=\"0\">caf\xC3\x28</note></notes>"
                          "</layout>\n");
      break;
    case OVERLONG_UTF8:
      /* '<' encoded in two bytes: forbidden by RFC 3629 sec. 3. */
      g_string_append (s, "\xC0\xBC" "layout/>\n");
      break;
    case UTF16:
      {
        static const char text[] = "<layout/>";

        g_string_append (s, "\xFF\xFE");
        for (const char *p = text; *p != '\0'; p++)
          {
            g_string_append_c (s, *p);
            g_string_append_c (s, '\0');
          }
        break;
      }
    case CHAR_REF_ZERO:
      g_string_append (s, LAYOUT_OPEN "<notes><note id=\"n1\" x=\"0\" y=\"0\">&#0;</note>"
                          "</notes></layout>\n");
      break;
    case N_HOSTILE:
    default:
      break;
    }
  return s;
}

START_TEST (test_hostile)
{
  const HostileCase *c = &hostile_cases[_i];
  GString *bytes = hostile_bytes ((Hostile) _i);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_data (bytes->str, bytes->len, "hostile", &error);

  ck_assert_msg (doc == NULL, "%s: loaded", c->name);
  ck_assert_msg (error != NULL && error->domain == PL_LAYOUT_ERROR
                 && error->code == (int) c->code, "%s: code %d, expected %d: %s", c->name,
                 error != NULL ? error->code : -1, c->code,
                 error != NULL ? error->message : "no error");
  ck_assert_msg (g_str_has_prefix (error->message, "hostile"), "%s", error->message);
  ck_assert_msg (strstr (error->message, c->fragment) != NULL, "%s: “%s” not in: %.300s",
                 c->name, c->fragment, error->message);
  ck_assert_msg (strstr (error->message, SECRET) == NULL, "%s: the secret leaked", c->name);
  ck_assert_msg (strlen (error->message) < 2000, "%s: a message of %zu bytes", c->name,
                 strlen (error->message));
  ck_assert (g_utf8_validate (error->message, -1, NULL));
  g_string_free (bytes, TRUE);
}
END_TEST

/* A file bigger than the limit is refused from its size alone: a sparse
 * 50 MiB file (no 50 MiB written) whose bytes would not even be XML. */
START_TEST (test_huge_file)
{
  g_autofree char *path = g_build_filename (outside.dir, "huge.pline", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = NULL;
  FILE *f = fopen (path, "w");

  ck_assert_ptr_nonnull (f);
  ck_assert_int_eq (ftruncate (fileno (f), 50 * 1024 * 1024), 0);
  fclose (f);
  doc = pl_layout_read_file (path, &error);
  ck_assert_ptr_null (doc);
  ck_assert_msg (error != NULL && error->code == PL_LAYOUT_ERROR_TOO_LARGE, "%s",
                 error != NULL ? error->message : "no error");
  ck_assert_msg (g_str_has_prefix (error->message, path), "%s", error->message);
  ck_assert_msg (strstr (error->message, "52.4") != NULL, "%s", error->message);
  g_unlink (path);
}
END_TEST

/* A processing instruction that names a style sheet is kept out of the
 * document and never followed: the file loads (and does not block). */
START_TEST (test_stylesheet_not_followed)
{
  g_autofree char *xml =
    g_strdup_printf ("<?xml version=\"1.0\"?>\n<?xml-stylesheet type=\"text/xsl\" "
                     "href=\"%s\"?>\n" LAYOUT_OPEN "</layout>\n", outside.fifo);
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = pl_layout_read_data (xml, strlen (xml), "pi", &error);

  ck_assert_msg (doc != NULL, "%s", error != NULL ? error->message : "?");
}
END_TEST

/* Just below each limit still loads: the limits refuse hostile files, not
 * large honest ones. */
START_TEST (test_limits_are_not_too_tight)
{
  GString *s = g_string_new (LAYOUT_OPEN "<parts>");
  g_autoptr (GError) error = NULL;
  g_autoptr (PlDocument) doc = NULL;

  /* 2000 parts with all their values: about 3 MB. */
  for (guint i = 1; i <= 2000; i++)
    g_string_append_printf (s, "<part id=\"p%u\" type=\"hose\" tag=\"H%u\" x=\"%u\" y=\"0\">"
                               "<number key=\"length\" value=\"2.5\" unit=\"m\"/>"
                               "<number key=\"bore\" value=\"6.35\" unit=\"mm\"/>"
                               "</part>\n", i, i, i * 10);
  g_string_append (s, "</parts><notes><note id=\"n1\" x=\"0\" y=\"0\">");
  repeat (s, "x", 4000);   /* the longest note the model takes */
  g_string_append (s, "</note></notes></layout>\n");
  doc = pl_layout_read_data (s->str, s->len, "large", &error);
  ck_assert_msg (doc != NULL, "%s", error != NULL ? error->message : "?");
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 2000);
  g_string_free (s, TRUE);
}
END_TEST

static Suite *
layout_hostile_suite (void)
{
  Suite *s = suite_create ("layout-hostile");
  TCase *tc = tcase_create ("hostile");

  tcase_add_unchecked_fixture (tc, outside_setup, outside_teardown);
  tcase_add_loop_test (tc, test_hostile, 0, N_HOSTILE);
  tcase_add_test (tc, test_huge_file);
  tcase_add_test (tc, test_stylesheet_not_followed);
  tcase_add_test (tc, test_limits_are_not_too_tight);
  /* The default 4 s would do; a slow sanitizer machine gets room. */
  tcase_set_timeout (tc, 60);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (layout_hostile_suite ());
}
