/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * fuzz-main.c: runs the fuzz target over files named on the command line
 * (the committed corpus), for builds without libFuzzer.  Exit status 0 if
 * every file went through; the target aborts on a broken property.
 */

#include "config.h"

#include <glib.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size);

int
main (int argc, char **argv)
{
  int status = 0;

  if (argc < 2)
    {
      g_printerr ("usage: %s FILE...\n", argv[0]);
      return 2;
    }
  for (int i = 1; i < argc; i++)
    {
      char *data = NULL;
      gsize size = 0;
      GError *error = NULL;

      if (!g_file_get_contents (argv[i], &data, &size, &error))
        {
          g_printerr ("%s\n", error->message);
          g_error_free (error);
          status = 1;
          continue;
        }
      LLVMFuzzerTestOneInput ((const uint8_t *) data, size);
      g_free (data);
    }
  g_print ("%d inputs run\n", argc - 1);
  return status;
}
