/* cli: the help on the shared options, and the drill program loaded for a
 * command. */
#include <stdlib.h>

#include "cli/cli.h"
#include "job/job_int.h"

const char cli_common_help[] =
    "Drill program:\n"
    "  --collars FILE        collar table: hole, x, y, z; optional azimuth, dip, length,\n"
    "                        date, latitude, longitude\n"
    "  --surveys FILE        survey table: hole, depth, azimuth, dip; optional date,\n"
    "                        reference (magnetic, true, grid), total_field, field_dip\n"
    "  --columns MAP         header names for corax's columns, e.g.\n"
    "                        hole=HOLE_NO,depth=DEPTH_M (names match without case)\n"
    "  --dip-convention C    negative-down (default: -60 is a downward hole),\n"
    "                        positive-down, or from-vertical (0 = straight down)\n"
    "  --declination DEG|model  magnetic declination, east positive; added to\n"
    "                        magnetic survey azimuths (magnetic to true). Default 0.\n"
    "                        model: from the World Magnetic Model at each station's\n"
    "                        date and its collar's place (needs --crs, or latitude\n"
    "                        and longitude columns in the collars)\n"
    "  --convergence DEG|projection  grid convergence, positive when grid north is\n"
    "                        east of true north; subtracted from survey azimuths\n"
    "                        (true to grid). Default 0. projection: from --crs at\n"
    "                        each collar\n"
    "  --crs EPSG:NNNN       the CRS of the collar coordinates (of the CRS side of\n"
    "                        a local grid), any projected CRS PROJ knows\n"
    "  --local-grid x1,y1,E1,N1,x2,y2,E2,N2 | origin=E,N,rotation=DEG,scale=S\n"
    "                        the collars are on a local mine grid: two points known\n"
    "                        on both grids, or its origin in the CRS, its rotation\n"
    "                        (local north clockwise of grid north) and scale; its\n"
    "                        rotation is subtracted from survey azimuths\n"
    "  --survey-date DATE    the date (YYYY-MM-DD) of stations without one: the\n"
    "                        surveys' date column comes first, then the collars'\n"
    "  --magnetic-model M    WMM (default: WMM2015v2, WMM2020, WMM2025 by date),\n"
    "                        WMM2015, WMM2015v2, WMM2020, WMM2025, or a COF file\n"
    "  --survey-reference magnetic|true|grid  the north of survey azimuths without a\n"
    "                        reference column of their own (default magnetic)\n"
    "  --delimiter D         field separator of the input tables: comma, semicolon,\n"
    "                        tab or auto (default: found from each table)\n"
    "  --decimal-mark M      point, comma or auto (default: found from each table)\n"
    "  --decimal-comma       the same as --decimal-mark comma\n"
    "  --units U             metres (default) or feet, for every input table; also\n"
    "                        --collars-units, --surveys-units, --structures-units\n"
    "  --collars-dip-convention C, --surveys-dip-convention C   one table's\n"
    "  --collars-columns MAP, --surveys-columns MAP, --structures-columns MAP\n"
    "                        one table's header names\n"
    "  --collar-station      the collar's set-up is a station at 0 m when the surveys\n"
    "                        start deeper (the hole curves from it)\n"
    "  --reject-station HOLE@DEPTH,...  leave these survey stations out\n"
    "  -p, --project FILE    read inputs, columns and conventions from a project file\n"
    "                        (INI); options on the command line override it\n"
    "Output:\n"
    "  -o, --output FILE     output file (default: standard output)\n"
    "  --about FILE          record of the run's assumptions (default: OUTPUT.about\n"
    "                        when -o names a file)\n"
    "  --output-delimiter D, --output-decimal-mark M   the tables written: comma\n"
    "                        and point (default), or semicolon and comma\n"
    "  -q, --quiet           no notes, warnings or progress on standard error\n"
    "  -h, --help            this help\n";

int cli_load_program_findings(cli_common *c, corax_program **prog, corax_findings *found)
{
    return corax_job_program_findings(&c->job, c->collars, c->surveys, &c->load, prog, found) ==
                   CORAX_OK
               ? EXIT_OK
               : EXIT_DATA;
}

corax_program *cli_load_program(cli_common *c)
{
    corax_program *prog = NULL;
    corax_job_program_load(&c->job, c->collars, c->surveys, &c->load, &prog);
    return prog;
}

int cli_begin(cli_common *c, int parsed, int want_program, corax_program **prog, int *status)
{
    *prog = NULL;
    *status = parsed < 0 ? EXIT_OK : parsed;
    if (parsed == 0 && (!want_program || (*prog = cli_load_program(c)) != NULL))
        return 1;
    if (parsed == 0)
        *status = EXIT_DATA;
    cli_common_free(c);
    return 0;
}

int cli_status(corax_status st)
{
    return st == CORAX_OK ? EXIT_OK : st == CORAX_EARG ? EXIT_USAGE : EXIT_DATA;
}

corax_table *cli_table_keep(cli_common *c, cli_table_id id, const char *path,
                            corax_table ***tables, size_t *n)
{
    corax_table *t;
    corax_table_settings ts = cli_table_settings(c, id);
    if (job_table_load(&c->job, (corax_table_role)id, path, &ts, &t) != CORAX_OK)
        return NULL;
    corax_table **tt = realloc(*tables, (*n + 1) * sizeof *tt);
    if (!tt) {
        corax_table_free(t);
        cli_error(NULL, 0, "out of memory");
        return NULL;
    }
    *tables = tt;
    tt[(*n)++] = t;
    return t;
}
