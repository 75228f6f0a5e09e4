/* An example of corax's C API: load a drill program from its collar and
 * survey tables, then convert each reading of a core log (hole, depth, alpha,
 * beta, optionally gamma) into a located, true orientation, as `corax
 * convert` does.
 *
 * Build it against an installed corax (make install) with pkg-config:
 *
 *     cc -o convert_log convert_log.c $(pkg-config --cflags --libs corax)
 *
 * and run it on the demo program (declination 19.5 degrees east, say):
 *
 *     ./convert_log surveys/collars.csv surveys/surveys.csv examples/core_log.csv 19.5
 *
 * It writes hole, depth, x, y, z, dip, dip_direction and status for each
 * row, to the precision `corax convert` writes them. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <corax/corax.h>

/* The load: its findings as `corax convert` says them, and no program when
 * a row or hole could not be used. */
static corax_program *load(const char *collars, const char *surveys, double declination)
{
    corax_corrector corrector = corax_corrector_default();
    corrector.declination = corax_rad(declination); /* magnetic stations only */
    corax_load_options options = corax_load_options_default();
    options.corrector = &corrector;
    corax_program *program = NULL;
    corax_findings found = {0};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_program_load(collars, surveys, &options, &program, &found, NULL, &err);
    if (st != CORAX_OK) {
        fprintf(stderr, "convert_log: %s:%ld: %s\n", err.file, err.line,
                err.message[0] ? err.message : corax_strerror(st));
        return NULL;
    }
    for (size_t i = 0; i < found.count; i++)
        fprintf(stderr, "convert_log: %s:%ld: %s%s\n", found.item[i].file, found.item[i].line,
                found.item[i].severity == CORAX_WARNING ? "warning: " : "",
                found.item[i].message);
    if (corax_findings_count(&found, CORAX_ERROR) > 0) {
        corax_program_free(program);
        program = NULL;
    }
    corax_findings_clear(&found);
    return program;
}

/* A field as a number in radians (NaN when empty); 0 when it is not one. */
static int angle(const corax_row *row, long col, double *out)
{
    *out = NAN;
    if (col < 0 || (size_t)col >= row->count)
        return 1;
    double v;
    corax_number_status st = corax_parse_number(row->field[col], row->length[col], '.', &v);
    if (st == CORAX_NUMBER_OK)
        *out = corax_rad(v);
    return st == CORAX_NUMBER_OK || st == CORAX_NUMBER_EMPTY;
}

static void blanks(corax_writer *w, int n)
{
    for (int i = 0; i < n; i++)
        corax_writer_field(w, "", 0);
}

/* One row of the log: its hole and depth as written, then the answer. */
static void convert_row(const corax_program *program, const corax_row *row, size_t width,
                        const long *col, corax_writer *w)
{
    corax_reading rd = corax_reading_empty();
    int usable = row->count == width && angle(row, col[2], &rd.alpha) &&
                 angle(row, col[3], &rd.beta) && angle(row, col[4], &rd.gamma) &&
                 corax_parse_number(row->field[col[1]], row->length[col[1]], '.', &rd.depth) ==
                     CORAX_NUMBER_OK;
    for (int k = 0; k < 2; k++)
        corax_writer_field(w, (size_t)col[k] < row->count ? row->field[col[k]] : "",
                           (size_t)col[k] < row->count ? row->length[col[k]] : 0);
    const char *hole = (size_t)col[0] < row->count ? row->field[col[0]] : "";
    corax_result res;
    corax_convert_options options = corax_convert_options_default();
    corax_convert_reading(corax_program_find(program, hole, strlen(hole)), &rd, &options, NULL,
                          &res);
    if (!usable || !res.located) {
        blanks(w, 5);
    } else {
        corax_writer_number(w, res.point.position.x, 3);
        corax_writer_number(w, res.point.position.y, 3);
        corax_writer_number(w, res.point.position.z, 3);
        if (res.has_plane) {
            corax_writer_number(w, corax_deg(res.plane.dip), 2);
            corax_writer_azimuth(w, corax_deg(res.plane.dip_direction), 2);
        } else if (res.conditions & CORAX_COND_DIP_ONLY) { /* a steep hole: the dip alone */
            corax_writer_number(w, corax_deg(res.plane.dip), 2);
            blanks(w, 1);
        } else {
            blanks(w, 2);
        }
    }
    const char *status = usable ? corax_condition_status(res.conditions) : "invalid";
    corax_writer_field(w, status, strlen(status));
    corax_writer_end_row(w);
}

int main(int argc, char **argv)
{
    if (argc < 4 || argc > 5) {
        fprintf(stderr, "usage: convert_log COLLARS SURVEYS LOG [DECLINATION]\n");
        return 2;
    }
    corax_program *program = load(argv[1], argv[2], argc == 5 ? atof(argv[4]) : 0.0);
    if (!program)
        return 1;
    corax_reader *reader = NULL;
    corax_writer *w = NULL;
    corax_row row;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(argv[3], corax_table_format_default(), &reader, &err);
    if (st == CORAX_OK)
        st = corax_reader_next(reader, &row, &err); /* the header */
    long col[5] = {-1, -1, -1, -1, -1};
    static const char *const names[] = {"hole", "depth", "alpha", "beta", "gamma"};
    for (int k = 0; st == CORAX_OK && k < 5; k++)
        col[k] = corax_column_find(&row, names[k], NULL);
    if (st == CORAX_OK && (col[0] < 0 || col[1] < 0 || col[2] < 0))
        st = corax_error_set(&err, CORAX_EFORMAT, argv[3], 1, "no hole, depth or alpha column");
    size_t width = st == CORAX_OK ? row.count : 0;
    if (st == CORAX_OK)
        st = corax_writer_open("-", &w, &err);
    static const char header[] = "hole,depth,x,y,z,dip,dip_direction,status\n";
    if (st == CORAX_OK)
        corax_writer_text(w, header, strlen(header));
    while (st == CORAX_OK && (st = corax_reader_next(reader, &row, &err)) == CORAX_OK)
        convert_row(program, &row, width, col, w);
    if (st == CORAX_END)
        st = corax_writer_commit(w, &err);
    else
        corax_writer_discard(w);
    if (st != CORAX_OK)
        fprintf(stderr, "convert_log: %s:%ld: %s\n", err.file, err.line,
                err.message[0] ? err.message : corax_strerror(st));
    corax_reader_close(reader);
    corax_program_free(program);
    return st == CORAX_OK ? 0 : 1;
}
