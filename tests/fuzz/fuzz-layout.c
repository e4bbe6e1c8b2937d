/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * fuzz-layout.c: a libFuzzer target for the layout reader.
 *
 * Besides "no crash, no leak, no undefined behaviour" (the sanitizers'
 * part) it checks properties: a refusal has a UTF-8 message that starts
 * with the source's name; an accepted file writes back, reads back as an
 * equal document, and writes back to the same bytes.  A broken property
 * aborts, which libFuzzer reports like a crash.
 *
 * Built as a fuzzer with -Dfuzzing=true and clang (tests/fuzz/meson.build);
 * in every build, fuzz-main.c runs it over the committed corpus.
 */

#include "config.h"

#include <glib.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "pl-document.h"
#include "pl-layout-reader.h"
#include "pl-layout-writer.h"

int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size);

static void
check_or_abort (gboolean ok, const char *what)
{
  if (!ok)
    {
      g_printerr ("fuzz-layout: property broken: %s\n", what);
      abort ();
    }
}

int
LLVMFuzzerTestOneInput (const uint8_t *data, size_t size)
{
  GError *error = NULL;
  PlDocument *doc = pl_layout_read_data ((const char *) data, size, "fuzz", &error);
  PlDocument *back = NULL;
  char *first = NULL, *second = NULL;
  gsize n1 = 0, n2 = 0;

  if (doc == NULL)
    {
      check_or_abort (error != NULL, "a refusal sets an error");
      check_or_abort (error->domain == PL_LAYOUT_ERROR, "the error is a layout error");
      check_or_abort (g_utf8_validate (error->message, -1, NULL), "the message is UTF-8");
      check_or_abort (g_str_has_prefix (error->message, "fuzz"),
                      "the message names the source");
      g_error_free (error);
      return 0;
    }
  check_or_abort (error == NULL, "success sets no error");
  /* A document the model built may still hold a character XML cannot
   * carry only if the file had it, which the parser refuses: so the
   * writer must succeed. */
  first = pl_layout_write_data (doc, &n1, &error);
  check_or_abort (first != NULL, "an accepted file can be written");
  back = pl_layout_read_data (first, n1, "fuzz-again", &error);
  if (back == NULL)
    g_printerr ("%s\n", error->message);
  check_or_abort (back != NULL, "what was written reads back");
  check_or_abort (pl_document_equal (doc, back), "the round trip keeps the document");
  second = pl_layout_write_data (back, &n2, NULL);
  check_or_abort (second != NULL && n1 == n2 && memcmp (first, second, n1) == 0,
                  "save, load, save gives the same bytes");
  g_free (first);
  g_free (second);
  g_object_unref (back);
  g_object_unref (doc);
  return 0;
}
