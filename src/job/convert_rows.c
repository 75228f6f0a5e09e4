/* job: the row engine of the convert job: fields to a reading, the reading
 * through the library, the answer out. Every input row gives exactly one
 * output row, in order. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "io/fields.h"
#include "job/convert_int.h"

static const char *const col_names[NCOLS] = {
    "hole",      "depth",     "from",        "to",          "alpha",      "beta",
    "gamma",     "line_alpha", "line_beta",  "alpha_error", "beta_error", "line_error",
    "depth_error", "confidence", "kind"};

static const char *const own_names[NOWN] = {"hole", "depth", "kind", "confidence"};
static const int own_cols[NOWN] = {COL_HOLE, COL_DEPTH, COL_KIND, COL_CONFIDENCE};

static const char *const out_names[] = {
    "x",          "y",           "z",     "hole_azimuth", "hole_plunge", "dip", "dip_direction",
    "strike",     "pole_trend",  "pole_plunge", "nx",     "ny",       "nz",
};
static const char *const line_names[] = {"trend", "plunge"};
static const char *const section_names[] = {"apparent_dip", "apparent_dip_toward"};
static const char *const spread_names[] = {"dip_sd", "dip_direction_sd", "cone95", "kappa",
                                           "position_sd"};
static const char *const tail_names[] = {"status", "note"};

#define COUNT(a) (sizeof(a) / sizeof(a)[0])

static void write_names(corax_writer *w, const char *const *names, size_t n, int used)
{
    for (size_t i = 0; used && i < n; i++)
        corax_writer_field(w, names[i], strlen(names[i]));
}

/* The names corax writes after the log's, in order: n of them in names. */
static size_t own_header(const convert_run *r, const char **names)
{
    const char *const *groups[] = {out_names, line_names, section_names, spread_names,
                                   tail_names};
    const size_t sizes[] = {COUNT(out_names), COUNT(line_names), COUNT(section_names),
                            COUNT(spread_names), COUNT(tail_names)};
    const int used[] = {1, r->has_lines, r->s->has_section, r->s->draws > 0, 1};
    size_t n = 0;
    for (int k = 0; k < NOWN; k++)
        if (r->own[k])
            names[n++] = own_names[k];
    for (size_t g = 0; g < COUNT(groups); g++)
        for (size_t i = 0; used[g] && i < sizes[g]; i++)
            names[n++] = groups[g][i];
    return n;
}

/* The log's header, with "log_" before a name corax writes itself (so that no
 * name appears twice), then corax's own names. */
static void write_header(convert_run *r, const corax_row *header)
{
    const char *names[NOWN + COUNT(out_names) + COUNT(line_names) + COUNT(section_names) +
                      COUNT(spread_names) + COUNT(tail_names)];
    size_t n = own_header(r, names);
    for (size_t i = 0; i < header->count; i++) {
        char name[512];
        size_t len = corax_carried_name(header->field[i], names, n, name, sizeof name);
        corax_writer_field(r->w, name, len);
    }
    write_names(r->w, names, n, 1);
    corax_writer_end_row(r->w);
}

static const corax_hole *find_hole(const convert_run *shared, convert_lane *r, const char *name, size_t len)
{
    if (r->has_known) { /* looked up already, when it was fetched toward the cache */
        r->has_known = 0;
        if (r->known != r->last_hole)
            r->hint = 0;
        r->last_len = (size_t)-1;
        return r->last_hole = r->known;
    }
    if (len == r->last_len && len < sizeof r->last_name && memcmp(name, r->last_name, len) == 0)
        return r->last_hole;
    r->last_hole = corax_program_find(shared->prog, name, len);
    r->hint = 0;
    if (len < sizeof r->last_name) {
        memcpy(r->last_name, name, len);
        r->last_len = len;
    } else {
        r->last_len = (size_t)-1;
    }
    return r->last_hole;
}

/* Read the reading's numbers; a phrase in why for the first that is not one. */
static int read_numbers(const convert_run *r, const convert_lane *ln, const corax_row *row,
                        corax_reading *rd, char *why, size_t wl)
{
    double *slot[] = {&rd->alpha, &rd->beta, &rd->gamma, &rd->line_alpha, &rd->line_beta};
    *rd = corax_reading_empty();
    int ok = corax_field_depth(row, r->col + COL_DEPTH, ln->decimal, r->s->log.unit,
                               (int)r->s->place, &rd->depth, why, wl) == CORAX_NUMBER_OK;
    for (int k = COL_ALPHA; k <= COL_LBETA; k++) {
        if (r->col[k] < 0)
            continue;
        double v;
        char phrase[160];
        corax_number_status st = corax_field_number(row, r->col[k], ln->decimal, col_names[k],
                                                    &v, phrase, sizeof phrase);
        if (st == CORAX_NUMBER_OK)
            *slot[k - COL_ALPHA] = corax_rad(v);
        else if (st != CORAX_NUMBER_EMPTY) {
            if (ok)
                snprintf(why, wl, "%s", phrase);
            ok = 0;
        }
    }
    return ok;
}

/* A kind or confidence as its word: through the codes when there are any
 * (an unknown code counted in `unknown`, which may be NULL, and kept as it is
 * written). */
static const char *word_of(const convert_lane *ln, const corax_codes *codes, const char *text,
                           size_t len, size_t *wl, corax_tally *unknown, long line)
{
    *wl = len;
    if (!codes || !len)
        return text;
    const char *w = corax_codes_word(codes, text, len, wl);
    if (w)
        return w;
    *wl = len;
    if (unknown)
        corax_tally_add(unknown, text, len, ln->file, ln->file_index, line);
    return text;
}

static void write_blanks(corax_writer *w, int n)
{
    for (int i = 0; i < n; i++)
        corax_writer_field(w, "", 0);
}

static void write_result(const convert_run *r, corax_writer *w, const corax_result *res)
{
    if (res->located) {
        double az, plunge;
        corax_direction_angles(res->point.tangent, &az, &plunge);
        corax_writer_number(w, res->point.position.x, 3);
        corax_writer_number(w, res->point.position.y, 3);
        corax_writer_number(w, res->point.position.z, 3);
        corax_writer_azimuth(w, corax_deg(az), 2);
        corax_writer_number(w, corax_deg(plunge), 2);
    } else {
        write_blanks(w, 5);
    }
    if (res->has_plane) {
        double dd = corax_deg(res->plane.dip_direction), dip = corax_deg(res->plane.dip);
        corax_writer_number(w, dip, 2);
        corax_writer_azimuth(w, dd, 2);
        corax_writer_azimuth(w, dd - 90.0, 2);
        corax_writer_azimuth(w, dd + 180.0, 2);
        corax_writer_number(w, 90.0 - dip, 2);
        corax_writer_number(w, res->normal.x, 5);
        corax_writer_number(w, res->normal.y, 5);
        corax_writer_number(w, res->normal.z, 5);
    } else if (res->conditions & CORAX_COND_DIP_ONLY) { /* the dip, and so the pole's plunge */
        corax_writer_number(w, corax_deg(res->plane.dip), 2);
        write_blanks(w, 3);
        corax_writer_number(w, 90.0 - corax_deg(res->plane.dip), 2);
        write_blanks(w, 3);
    } else {
        write_blanks(w, 8);
    }
    if (r->has_lines) {
        if (res->has_line) {
            corax_writer_azimuth(w, corax_deg(res->trend), 2);
            corax_writer_number(w, corax_deg(res->plunge), 2);
        } else {
            write_blanks(w, 2);
        }
    }
    if (r->s->has_section) {
        if (res->has_plane) {
            int toward;
            double a = corax_apparent_dip(res->plane, r->s->section_azimuth, &toward);
            corax_writer_number(w, corax_deg(a), 2);
            if (toward)
                corax_writer_azimuth(w, corax_deg(r->s->section_azimuth) + (toward < 0 ? 180 : 0), 2);
            else
                write_blanks(w, 1);
        } else {
            write_blanks(w, 2);
        }
    }
}

/* This row's reading errors: the run's, the orientation line's (a
 * confidence's line error; for a line turned onto a reference, the turn's
 * error and no gravity mark), and the row's own columns. 0 with why filled
 * when one cannot be used. */
static int row_errors(const convert_run *r, convert_lane *ln, const corax_row *row,
                      const convert_eval *ev,
                      corax_error_model *e, char *why, size_t wl)
{
    const convert_setup *s = r->s;
    *e = s->errors;
    if (ev->rd.arbitrary_line) {
        e->line = ev->turn_sigma;
        e->gravity = 0.0;
    } else if (r->col[COL_CONFIDENCE] >= 0) {
        size_t n, len;
        const char *text = corax_field_text(row, r->col[COL_CONFIDENCE], &len);
        const char *c = word_of(ln, s->confidence_codes, text, len, &n, NULL, 0);
        if (n) {
            size_t k = 0;
            while (k < s->nconfidence &&
                   !(strlen(s->confidence[k].name) == n && strncasecmp(s->confidence[k].name, c, n) == 0))
                k++;
            if (k == s->nconfidence) {
                /* an unknown code was counted already, when the row was read */
                if (!s->confidence_codes || corax_codes_word(s->confidence_codes, text, len, &n))
                    corax_tally_add(ln->no_line_error, c, n, ln->file, ln->file_index, row->line);
                snprintf(why, wl, "no uncertainty: confidence '%.40s' has no line error "
                         "(--confidence-errors)", c);
                return 0;
            }
            e->line = s->confidence[k].sigma;
        }
    }
    static const int cols[] = {COL_ALPHA_ERROR, COL_BETA_ERROR, COL_LINE_ERROR, COL_DEPTH_ERROR};
    double *slot[] = {&e->alpha, &e->beta, &e->line, &e->depth};
    for (int i = 0; i < 4; i++) {
        if (r->col[cols[i]] < 0)
            continue;
        double v;
        char phrase[120];
        corax_number_status st = corax_field_number(row, r->col[cols[i]], ln->decimal,
                                                    col_names[cols[i]], &v, phrase, sizeof phrase);
        if (st == CORAX_NUMBER_EMPTY)
            continue;
        if (st != CORAX_NUMBER_OK || v < 0.0) {
            if (st == CORAX_NUMBER_OK)
                snprintf(phrase, sizeof phrase, "%s %g is negative", col_names[cols[i]], v);
            snprintf(why, wl, "no uncertainty: %s", phrase);
            return 0;
        }
        *slot[i] = cols[i] == COL_DEPTH_ERROR ? v * s->log.unit : corax_rad(v);
    }
    return 1;
}

void convert_uncertainty(const convert_run *r, convert_lane *ln, const corax_row *row,
                         convert_eval *ev)
{
    ev->simulate = 0;
    ev->mc_why[0] = '\0';
    if (r->s->draws && (ev->res.has_plane || ev->res.has_line ||
                        (ev->res.conditions & CORAX_COND_DIP_ONLY)))
        ev->simulate = row_errors(r, ln, row, ev, &ev->errors, ev->mc_why, sizeof ev->mc_why);
}

/* Whether the row's betas run from an arbitrary line: its confidence is the
 * word for a run without an orientation mark (the row's own word when it has
 * one, else its run's). */
static int arbitrary_line(const convert_run *r, const convert_lane *ln, const corax_row *row,
                          long run)
{
    const convert_setup *s = r->s;
    size_t n, len;
    const char *text = corax_field_text(row, r->col[COL_CONFIDENCE], &len);
    const char *word = word_of(ln, s->confidence_codes, text, len, &n, NULL, 0);
    if (!n && run >= 0) {
        word = s->runs->run[run].confidence;
        n = strlen(word);
    }
    return corax_unoriented_confidence(word, n, s->unoriented_word);
}

const corax_hole *convert_prefetch(const convert_run *r, const corax_table *batch, size_t row)
{
    size_t len;
    const char *name = corax_table_cell(batch, row, r->col[COL_HOLE], &len);
    const corax_hole *hole = corax_program_find(r->prog, name, len);
    corax_hole_prefetch(hole);
    return hole;
}

void convert_prefetch_course(const convert_run *r, const convert_lane *ln,
                             const corax_table *batch, size_t row, const corax_hole *hole)
{
    /* a log of intervals: the course of their start is near enough */
    long col = r->col[COL_DEPTH] >= 0 ? r->col[COL_DEPTH] : r->col[COL_FROM];
    size_t len;
    const char *text = corax_table_cell(batch, row, col, &len);
    double depth;
    if (hole && corax_parse_number(text, len, ln->decimal, &depth) == CORAX_NUMBER_OK)
        corax_hole_prefetch_course(hole, depth * r->s->log.unit);
}

int convert_row_in_shard(const convert_run *r, const corax_row *row)
{
    if (r->s->shards <= 1)
        return 1;
    size_t len;
    const char *name = corax_field_text(row, r->col[COL_HOLE], &len);
    return corax_shard_of(name, len, r->s->shards) == r->s->shard;
}

corax_status convert_fill_batch(convert_run *r, corax_reader *rd, corax_table *batch, size_t most,
                                corax_error *err)
{
    corax_row row;
    corax_status st = CORAX_OK;
    corax_table_truncate(batch);
    while (corax_table_rows(batch) < most && (st = corax_reader_next(rd, &row, err)) == CORAX_OK)
        if (!convert_row_in_shard(r, &row))
            r->other++;
        else if (corax_table_append(batch, &row) != CORAX_OK)
            return CORAX_ENOMEM;
    return st;
}

void convert_evaluate(const convert_run *r, convert_lane *ln, const corax_row *row,
                      convert_eval *ev)
{
    ev->rd = corax_reading_empty();
    ev->why[0] = ev->mc_why[0] = '\0';
    ev->simulate = 0;
    int ragged = corax_field_ragged(row, r->width, ev->why, sizeof ev->why) != NULL;
    ev->usable = !ragged && read_numbers(r, ln, row, &ev->rd, ev->why, sizeof ev->why);
    size_t hl;
    const char *name = corax_field_text(row, r->col[COL_HOLE], &hl);
    ev->hole = find_hole(r, ln, name, hl);
    ev->run = r->s->runs ? corax_runs_find(r->s->runs, name, hl, ev->rd.depth) : -1;
    ev->group = -1;
    ev->turn_sigma = NAN;
    ev->rd.arbitrary_line = arbitrary_line(r, ln, row, ev->run);
    if (ev->usable) {
        corax_convert_reading(ev->hole, &ev->rd, &r->s->convert, &ln->hint, &ev->res);
    } else { /* the row's own phrase first, then what is known of its place */
        corax_convert_locate(ev->hole, ragged ? (double)NAN : ev->rd.depth, &ln->hint, &ev->res);
        ev->res.conditions |= CORAX_COND_INVALID;
    }
}

static void write_spread(const convert_run *r, corax_writer *w, const corax_spread *sp,
                         int dip_only)
{
    if (!r->s->draws)
        return;
    if (!sp || !sp->has_orientation || sp->draws < 2) {
        write_blanks(w, 5);
        return;
    }
    corax_writer_number(w, corax_deg(sp->dip_sd), 2);
    if (dip_only) {
        write_blanks(w, 3);
    } else {
        corax_writer_number(w, corax_deg(sp->dip_direction_sd), 2);
        corax_writer_number(w, corax_deg(sp->cone95), 2);
        corax_writer_number(w, isfinite(sp->kappa) ? sp->kappa : (double)NAN, 1);
    }
    corax_writer_number(w, sp->position_sd, 3);
}

/* corax's own hole, depth (metres), kind and confidence (words), where the
 * log's columns would not read back as they are; unknown codes are counted. */
static void write_own(const convert_run *r, convert_lane *ln, const corax_row *row,
                      const convert_eval *ev)
{
    corax_writer *w = ln->w;
    size_t len, wl;
    const char *text;
    if (r->own[OWN_HOLE]) {
        text = corax_field_text(row, r->col[COL_HOLE], &len);
        corax_writer_field(w, text, len);
    }
    if (r->own[OWN_DEPTH])
        corax_writer_number(w, ev->rd.depth, 4);
    if (r->col[COL_KIND] >= 0) { /* counted whether or not it is written again */
        text = corax_field_text(row, r->col[COL_KIND], &len);
        text = word_of(ln, r->s->kind_codes, text, len, &wl, ln->unknown_kind, row->line);
        if (r->own[OWN_KIND])
            corax_writer_field(w, text, wl);
    }
    if (r->col[COL_CONFIDENCE] >= 0) {
        text = corax_field_text(row, r->col[COL_CONFIDENCE], &len);
        text = word_of(ln, r->s->confidence_codes, text, len, &wl, ln->unknown_confidence,
                       row->line);
        if (r->own[OWN_CONFIDENCE])
            corax_writer_field(w, text, wl);
    }
}

void convert_write(const convert_run *r, convert_lane *ln, const corax_row *row,
                   const convert_eval *ev, const corax_spread *sp)
{
    corax_writer *w = ln->w;
    char note[1200];
    size_t nl = 0;
    for (size_t i = 0; i < r->width; i++)
        corax_writer_field(w, i < row->count ? row->field[i] : "", i < row->count ? row->length[i] : 0);
    write_own(r, ln, row, ev);
    write_result(r, w, &ev->res);
    write_spread(r, w, sp, (ev->res.conditions & CORAX_COND_DIP_ONLY) != 0);
    unsigned c = ev->res.conditions;
    const char *status = corax_condition_status(c);
    corax_writer_field(w, status, strlen(status));
    if (!ev->usable)
        nl = (size_t)snprintf(note, sizeof note, "%s", ev->why);
    if (c) {
        char more[400];
        if (corax_result_note(&ev->res, &ev->rd, ev->hole, &r->s->convert, more, sizeof more))
            nl += (size_t)snprintf(note + nl, sizeof note - nl, "%s%s", nl ? "; " : "", more);
    }
    if (ev->group >= 0 && r->groups && nl < sizeof note)
        nl += (size_t)snprintf(note + nl, sizeof note - nl, "%s%s", nl ? "; " : "",
                               r->groups[ev->group].note);
    if (ev->mc_why[0] && nl < sizeof note)
        nl += (size_t)snprintf(note + nl, sizeof note - nl, "%s%s", nl ? "; " : "", ev->mc_why);
    if (row->count > r->width && nl < sizeof note) { /* keep the surplus: nothing lost */
        nl += (size_t)snprintf(note + nl, sizeof note - nl, "%sextra fields: ", nl ? "; " : "");
        for (size_t i = r->width; i < row->count && nl < sizeof note; i++)
            nl += (size_t)snprintf(note + nl, sizeof note - nl, "%s%s", i > r->width ? "," : "",
                                   row->field[i]);
    }
    corax_writer_field(w, note, nl < sizeof note ? nl : sizeof note - 1);
    corax_writer_end_row(w);
    unsigned k = 0;
    while (k < CORAX_COND_COUNT && !(c & (1u << k)))
        k++;
    ln->count[k]++;
    ln->rows++;
}

/* Same header names, in the same order (without regard to case). */
static int same_header(const corax_row *h, char **names, size_t n)
{
    if (h->count != n)
        return 0;
    for (size_t i = 0; i < n; i++)
        if (strcasecmp(h->field[i], names[i]) != 0)
            return 0;
    return 1;
}

/* Which of the log's columns corax writes again, in its own words. */
static void choose_own(convert_run *r, const corax_row *header)
{
    const convert_setup *s = r->s;
    for (int k = 0; k < NOWN; k++) {
        long c = r->col[own_cols[k]];
        /* a reader of the converted table, knowing none of the user's names */
        int found_as_is = c >= 0 && corax_column_find(header, own_names[k], NULL) == c;
        r->own[k] = c >= 0 && !found_as_is;
    }
    r->own[OWN_DEPTH] |= r->col[COL_DEPTH] < 0 || s->log.unit != 1.0;
    r->own[OWN_KIND] |= r->col[COL_KIND] >= 0 && s->kind_codes;
    r->own[OWN_CONFIDENCE] |= r->col[COL_CONFIDENCE] >= 0 && s->confidence_codes;
}

corax_status convert_open_log(convert_run *r, const char *path, corax_reader **reader,
                              corax_row *header, corax_error *err)
{
    corax_status st;
    if (r->stdin_copy && strcmp(path, "-") == 0) { /* read again from the start */
        rewind(r->stdin_copy);
        st = corax_reader_open_stream(r->stdin_copy, path, r->s->log.format, reader, err);
    } else {
        st = corax_reader_open(path, r->s->log.format, reader, err);
    }
    if (st != CORAX_OK)
        return st;
    st = corax_table_header(*reader, col_names, NCOLS, 1, r->s->log.columns, r->col, &r->width,
                            header, err);
    if (st == CORAX_OK && r->col[COL_DEPTH] < 0 && (r->col[COL_FROM] < 0 || r->col[COL_TO] < 0))
        st = corax_column_missing(path, header, "depth", r->s->log.columns, err);
    if (st == CORAX_OK && r->col[COL_ALPHA] < 0 && r->col[COL_LALPHA] < 0)
        st = corax_error_set(err, CORAX_EFORMAT, path, header->line,
                             "no 'alpha' or 'line_alpha' column: nothing to convert");
    if (st == CORAX_OK && !r->first) { /* the first log sets the output's columns */
        r->has_lines = r->col[COL_GAMMA] >= 0 || r->col[COL_LALPHA] >= 0;
        choose_own(r, header);
        write_header(r, header);
        r->first = calloc(header->count ? header->count : 1, sizeof *r->first);
        for (size_t i = 0; r->first && i < header->count; i++)
            r->first[i] = strdup(header->field[i]);
        r->nfirst = header->count;
    } else if (st == CORAX_OK && !same_header(header, r->first, r->nfirst)) {
        st = corax_error_set(err, CORAX_EFORMAT, path, header->line,
                             "the header differs from the first core log's; convert them "
                             "separately or give them the same columns");
    }
    if (st != CORAX_OK) {
        corax_reader_close(*reader);
        *reader = NULL;
    }
    return st;
}

void convert_lane_file(convert_lane *ln, const char *path, size_t index,
                       const corax_reader *reader)
{
    corax_table_info info;
    corax_reader_info(reader, &info);
    ln->file = path;
    ln->file_index = index;
    ln->decimal = info.format.decimal;
}
