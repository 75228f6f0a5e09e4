/* The row engine of `corax convert` (internal to src/cli). */
#ifndef CORAX_CONVERT_ROWS_H
#define CORAX_CONVERT_ROWS_H

#include "cli/cli.h"
#include "corax/convert.h"

typedef struct convert_setup {
    corax_convert_options convert;
    corax_dip_convention dip_convention; /* for hole_dip in and out */
    corax_table_format format;
    const corax_column_map *columns;
    int has_section;
    double section_azimuth; /* radians */
    int quiet;
} convert_setup;

/* Stream every structures file through the conversion into one output.
 * Returns an exit status (messages printed). */
int convert_files(const corax_program *prog, const convert_setup *s, const char *const *files,
                  size_t nfiles, const char *output);

/* One reading at the core shed: a labelled answer on standard output.
 * Angles in degrees; NaN for what was not given. */
int convert_one_reading(const cli_common *c, const convert_setup *s, double hole_azimuth,
                        double hole_dip, double alpha, double beta, double gamma,
                        const double plane[2], const double line[2]);

/* The conventions and thresholds, for a .about file. */
void convert_about_conventions(cli_about *a, const corax_convert_options *cv);

#endif
