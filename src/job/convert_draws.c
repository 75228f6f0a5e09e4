/* job: the convert job's uncertainty in bounded memory. The logs are read
 * twice. The first reading keeps each reading to be drawn in a compact record
 * (its hole, depth, the alpha and beta drawn, and its errors as a place in a
 * table of the distinct errors met: 32 bytes; and a bit for every row); the
 * holes are then drawn in parallel, each from its own stream seeded by its
 * name, and each reading's spread is written over its record (48 bytes). The
 * second reading converts the rows again in batches, as plain convert does,
 * and takes each row's spread from its record. A log on standard input is
 * kept in a temporary file for the second reading.
 *
 * Every value is kept in double precision, so the draws are those of a
 * reading held whole: a plane's alpha and beta (or a line's), which are all
 * the draws take, with the hole, depth and errors; the plain conversion that
 * fixes their hemisphere is made again from them. */
#include <errno.h>
#include <math.h>
#include <omp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "io/spool.h"
#include "job/convert_int.h"

enum { READ_ROWS = 16384, BLOCK_SHIFT = 16, BLOCK = 1 << BLOCK_SHIFT };

/* A reading to draw, then its spread. */
typedef union draw_rec {
    struct {
        double depth;
        double alpha, beta; /* radians: the plane's, or (LINE) the line's; NaN: none */
        uint32_t hole;      /* its index in the program, and the flags below */
        uint32_t errors;    /* its errors' place in the table of errors */
    } in;
    struct {
        double dip_sd, dip_direction_sd, cone95, kappa, position_sd;
        uint32_t draws;     /* and the flags has_orientation (ARBITRARY's bit) and
                               is_plane (LINE's) */
    } out;
} draw_rec;

#define ARBITRARY (UINT32_C(1) << 31) /* an arbitrary line: no gravity error */
#define LINE (UINT32_C(1) << 30)      /* a line drawn, not a plane */
#define HOLE_BITS (~(ARBITRARY | LINE))

/* The distinct errors of the readings (alpha, beta, line, depth), each once:
 * a few confidence levels in most programs. */
typedef struct error_table {
    double (*e)[4];
    size_t n, cap;
    uint32_t *slot; /* open addressing: place + 1, or 0 */
    size_t nslots;
} error_table;

struct convert_draws {
    draw_rec **block;   /* records by their place among the simulated rows */
    error_table errors;
    size_t n, nblocks;
    uint64_t *bits;     /* a bit for every row of the shard: simulated */
    uint32_t *rank;     /* simulated rows before each word of bits */
    size_t rows, nwords;
};

static draw_rec *rec_at(const convert_draws *d, size_t j)
{
    return &d->block[j >> BLOCK_SHIFT][j & (BLOCK - 1)];
}

void convert_draws_free(convert_draws *d)
{
    if (!d)
        return;
    for (size_t b = 0; b < d->nblocks; b++)
        free(d->block[b]);
    free(d->block);
    free(d->errors.e);
    free(d->errors.slot);
    free(d->bits);
    free(d->rank);
    free(d);
}

size_t convert_draws_rank(const convert_draws *d, size_t row)
{
    if (row >= d->rows)
        return d->n;
    size_t w = row >> 6;
    uint64_t below = d->bits[w] & ((UINT64_C(1) << (row & 63)) - 1);
    return d->rank[w] + (size_t)__builtin_popcountll(below);
}

const corax_spread *convert_draws_spread(const convert_draws *d, size_t j, corax_spread *sp)
{
    if (j >= d->n)
        return NULL;
    const draw_rec *r = rec_at(d, j);
    *sp = (corax_spread){(r->out.draws & ARBITRARY) != 0, (r->out.draws & LINE) != 0,
                         r->out.dip_sd, r->out.dip_direction_sd, r->out.cone95, r->out.kappa,
                         r->out.position_sd, r->out.draws & HOLE_BITS};
    return sp;
}

int convert_draws_match(const convert_draws *d, size_t rows) { return rows == d->rows; }

FILE *convert_stdin_copy(corax_job *job)
{
    const char *dir = corax_temp_folder();
    int fd = corax_temp_file(dir); /* gone when closed */
    FILE *f = fd >= 0 ? fdopen(fd, "w+b") : NULL;
    if (!f) {
        job_error(job, NULL, 0, "cannot keep standard input for a second reading in %s: %s",
                  dir, strerror(errno));
        if (fd >= 0)
            close(fd);
        return NULL;
    }
    char buf[1 << 16];
    size_t n;
    while ((n = fread(buf, 1, sizeof buf, stdin)) > 0)
        if (fwrite(buf, 1, n, f) != n)
            break;
    if (ferror(stdin) || ferror(f) || fflush(f) != 0) {
        job_error(job, NULL, 0, "cannot keep standard input for a second reading: %s",
                  strerror(errno));
        fclose(f);
        return NULL;
    }
    return f;
}

/* ---- the first reading ---- */

typedef struct first_reading {
    convert_draws *d;
    size_t cap_blocks, cap_words;
    uint32_t *count;       /* simulated readings of each hole */
    uint32_t *order;       /* holes in order of their first simulated reading */
    size_t norder;
} first_reading;

static corax_status grow(first_reading *f)
{
    convert_draws *d = f->d;
    if ((d->rows >> 6) + 1 > f->cap_words) {
        size_t cap = f->cap_words ? f->cap_words * 2 : 1024;
        uint64_t *b = realloc(d->bits, cap * sizeof *b);
        if (!b)
            return CORAX_ENOMEM;
        memset(b + f->cap_words, 0, (cap - f->cap_words) * sizeof *b);
        d->bits = b;
        f->cap_words = cap;
    }
    if ((d->n >> BLOCK_SHIFT) + 1 > d->nblocks) {
        if (d->nblocks == f->cap_blocks) {
            size_t cap = f->cap_blocks ? f->cap_blocks * 2 : 16;
            draw_rec **p = realloc(d->block, cap * sizeof *p);
            if (!p)
                return CORAX_ENOMEM;
            d->block = p;
            f->cap_blocks = cap;
        }
        if (!(d->block[d->nblocks] = malloc(BLOCK * sizeof(draw_rec))))
            return CORAX_ENOMEM;
        d->nblocks++;
    }
    return CORAX_OK;
}

/* A reading waiting for its place: its record and its errors. */
typedef struct pending {
    draw_rec rec;
    double errors[4];
} pending;

/* A row's record, from its evaluation: the plane's angles when the draws
 * take a plane (it has one, or its dip alone), else the line's. */
static void make_record(const corax_program *prog, const convert_eval *ev, pending *out)
{
    const corax_reading *rd = &ev->rd;
    int plane = ev->res.has_plane || (ev->res.conditions & CORAX_COND_DIP_ONLY);
    out->rec.in.depth = rd->depth;
    out->rec.in.alpha = plane ? rd->alpha : rd->line_alpha;
    out->rec.in.beta = plane ? rd->beta : rd->line_beta;
    out->errors[0] = ev->errors.alpha;
    out->errors[1] = ev->errors.beta;
    out->errors[2] = ev->errors.line;
    out->errors[3] = ev->errors.depth;
    const char *name = corax_hole_name(ev->hole);
    long h = corax_program_index(prog, name, strlen(name));
    out->rec.in.hole = (uint32_t)h | (rd->arbitrary_line ? ARBITRARY : 0u) | (plane ? 0u : LINE);
}

static size_t error_hash(const double *e)
{
    uint64_t h = 14695981039346656037u;
    const unsigned char *b = (const unsigned char *)e;
    for (size_t i = 0; i < 4 * sizeof *e; i++)
        h = (h ^ b[i]) * 1099511628211u;
    return (size_t)h;
}

/* The place of errors e in the table, added when new; UINT32_MAX when out of
 * memory. */
static uint32_t error_place(error_table *t, const double *e)
{
    if (2 * (t->n + 1) > t->nslots) {
        size_t nslots = t->nslots ? 2 * t->nslots : 64;
        uint32_t *slot = calloc(nslots, sizeof *slot);
        if (!slot)
            return UINT32_MAX;
        for (size_t i = 0; i < t->n; i++) {
            size_t k = error_hash(t->e[i]) & (nslots - 1);
            while (slot[k])
                k = (k + 1) & (nslots - 1);
            slot[k] = (uint32_t)i + 1;
        }
        free(t->slot);
        t->slot = slot;
        t->nslots = nslots;
    }
    size_t k = error_hash(e) & (t->nslots - 1);
    for (; t->slot[k]; k = (k + 1) & (t->nslots - 1))
        if (memcmp(t->e[t->slot[k] - 1], e, sizeof t->e[0]) == 0)
            return t->slot[k] - 1;
    if (t->n == t->cap) {
        size_t cap = t->cap ? 2 * t->cap : 16;
        double(*p)[4] = realloc(t->e, cap * sizeof *p);
        if (!p)
            return UINT32_MAX;
        t->e = p;
        t->cap = cap;
    }
    memcpy(t->e[t->n], e, sizeof t->e[0]);
    t->slot[k] = (uint32_t)t->n + 1;
    return (uint32_t)t->n++;
}

/* Evaluate a batch on every lane (each row once, in parallel) and keep its
 * simulated rows in row order. */
static corax_status keep_batch(convert_run *r, first_reading *f, const corax_table *batch,
                               convert_lane *lanes, int nlanes, pending *tmp, uint8_t *sim)
{
    size_t n = corax_table_rows(batch), widest = corax_table_widest(batch);
    for (int k = 0; k < nlanes; k++) {
        const char **field = realloc(lanes[k].field, (widest ? widest : 1) * sizeof *field);
        if (!field)
            return CORAX_ENOMEM;
        lanes[k].field = field;
    }
#pragma omp parallel for schedule(static) num_threads(nlanes)
    for (size_t i = 0; i < n; i++) {
        convert_lane *ln = &lanes[omp_get_thread_num()];
        corax_row row;
        corax_table_row(batch, i, ln->field, &row);
        convert_eval ev;
        convert_evaluate(r, ln, &row, &ev);
        convert_uncertainty(r, ln, &row, &ev);
        sim[i] = (uint8_t)(ev.simulate != 0);
        if (ev.simulate)
            make_record(r->prog, &ev, &tmp[i]);
    }
    convert_draws *d = f->d;
    for (size_t i = 0; i < n; i++, d->rows++) {
        if (grow(f) != CORAX_OK)
            return CORAX_ENOMEM;
        if (!sim[i])
            continue;
        if (d->n == UINT32_MAX) {
            job_error(r->job, NULL, 0, "more than %u readings to draw in one run: split the "
                      "holes with --shard K/N", UINT32_MAX - 1);
            return CORAX_EVALUE;
        }
        d->bits[d->rows >> 6] |= UINT64_C(1) << (d->rows & 63);
        uint32_t h = tmp[i].rec.in.hole & HOLE_BITS;
        if ((tmp[i].rec.in.errors = error_place(&d->errors, tmp[i].errors)) == UINT32_MAX)
            return CORAX_ENOMEM;
        if (f->count[h]++ == 0)
            f->order[f->norder++] = h;
        *rec_at(d, d->n++) = tmp[i].rec;
    }
    return CORAX_OK;
}

static corax_status read_log(convert_run *r, first_reading *f, const char *path, size_t index,
                             convert_lane *lanes, int nlanes, pending *tmp, uint8_t *sim)
{
    corax_reader *rd;
    corax_error err;
    corax_error_clear(&err);
    corax_row row;
    corax_status st = convert_open_log(r, path, &rd, &row, &err);
    corax_table *batch = NULL;
    corax_stage progress;
    job_stage_begin(r->job, &progress, path, "bytes", job_file_size(path));
    if (st == CORAX_OK) {
        for (int k = 0; k < nlanes; k++)
            convert_lane_file(&lanes[k], path, index, rd);
        if (!(batch = corax_table_new(path, lanes[0].decimal, &row)))
            st = CORAX_ENOMEM;
    }
    while (st == CORAX_OK) {
        st = convert_fill_batch(r, rd, batch, READ_ROWS, &err);
        if (st != CORAX_OK && st != CORAX_END)
            break;
        corax_status kept = keep_batch(r, f, batch, lanes, nlanes, tmp, sim);
        if (kept != CORAX_OK) {
            job_stage_end(r->job, &progress);
            corax_table_free(batch);
            corax_reader_close(rd);
            return job_failed(kept);
        }
        job_stage_step(r->job, &progress, (double)corax_reader_offset(rd));
    }
    job_stage_end(r->job, &progress);
    corax_table_free(batch);
    corax_reader_close(rd);
    if (st != CORAX_END) {
        job_error_record(r->job, &err, st);
        return job_failed(st == CORAX_OK ? CORAX_EFORMAT : st);
    }
    return CORAX_OK;
}

/* ---- the draws ---- */

/* One thread's room for a hole's readings. */
typedef struct lane_room {
    corax_mc *mc;
    corax_mc_reading *mr;
    corax_spread *sp;
    size_t cap;
    corax_writer *cloud;
} lane_room;

/* Draw hole h: its records (members[0..n)) into readings, the draws, and each
 * spread over its record. */
static corax_status draw_hole(const convert_run *r, convert_draws *d, uint32_t h,
                              const uint32_t *members, size_t n, lane_room *room)
{
    const convert_setup *s = r->s;
    if (n > room->cap) {
        corax_mc_reading *mr = realloc(room->mr, n * sizeof *mr);
        if (mr)
            room->mr = mr;
        corax_spread *sp = mr ? realloc(room->sp, n * sizeof *sp) : NULL;
        if (sp)
            room->sp = sp;
        if (!mr || !sp)
            return CORAX_ENOMEM;
        room->cap = n;
    }
    const corax_hole *hole = corax_program_hole(r->prog, h);
    size_t hint = 0;
    for (size_t k = 0; k < n; k++) {
        const draw_rec *rec = rec_at(d, members[k]);
        corax_mc_reading *m = &room->mr[k];
        m->reading = corax_reading_empty();
        m->reading.depth = rec->in.depth;
        if (rec->in.hole & LINE) {
            m->reading.line_alpha = rec->in.alpha;
            m->reading.line_beta = rec->in.beta;
        } else {
            m->reading.alpha = rec->in.alpha;
            m->reading.beta = rec->in.beta;
        }
        m->reading.arbitrary_line = (rec->in.hole & ARBITRARY) != 0;
        const double *e = d->errors.e[rec->in.errors];
        m->errors = s->errors;
        m->errors.alpha = e[0];
        m->errors.beta = e[1];
        m->errors.line = e[2];
        m->errors.depth = e[3];
        if (m->reading.arbitrary_line)
            m->errors.gravity = 0.0;
        corax_convert_reading(hole, &m->reading, &s->convert, &hint, &m->nominal);
    }
    convert_cloud ctx = {room->cloud, corax_hole_name(hole), room->mr};
    corax_status st = corax_mc_hole(room->mc, hole, room->mr, n, &s->convert, &s->errors,
                                    s->draws, s->seed, room->sp,
                                    room->cloud ? convert_cloud_draw : NULL, &ctx);
    for (size_t k = 0; st == CORAX_OK && k < n; k++) {
        const corax_spread *sp = &room->sp[k];
        draw_rec *rec = rec_at(d, members[k]);
        rec->out.dip_sd = sp->dip_sd;
        rec->out.dip_direction_sd = sp->dip_direction_sd;
        rec->out.cone95 = sp->cone95;
        rec->out.kappa = sp->kappa;
        rec->out.position_sd = sp->position_sd;
        rec->out.draws = ((uint32_t)sp->draws & HOLE_BITS) | (sp->has_orientation ? ARBITRARY : 0u) |
                         (sp->is_plane ? LINE : 0u);
    }
    return st;
}

/* Draw every hole, holes to threads in turn; with a cloud, its holes are
 * written in order of their first reading (an ordered loop, which makes a
 * thread that finishes early wait: only the cloud needs it). */
static corax_status draw_holes(const convert_run *r, first_reading *f, int nlanes)
{
    convert_draws *d = f->d;
    size_t nholes = corax_program_size(r->prog);
    /* members of each hole, holes in order: a counting sort of the records */
    size_t *start = calloc(nholes + 1, sizeof *start);
    uint32_t *members = malloc((d->n ? d->n : 1) * sizeof *members);
    lane_room *room = calloc((size_t)nlanes, sizeof *room);
    corax_status st = start && members && room ? CORAX_OK : CORAX_ENOMEM;
    corax_writer *cloud = NULL;
    if (st == CORAX_OK && r->s->cloud)
        cloud = convert_cloud_open(r, &st);
    for (int k = 0; st == CORAX_OK && k < nlanes; k++)
        if (!(room[k].mc = corax_mc_new()) ||
            (cloud && corax_writer_memory(&room[k].cloud) != CORAX_OK))
            st = CORAX_ENOMEM;
        else if (cloud)
            corax_writer_format(room[k].cloud, r->s->output);
    if (st == CORAX_OK) {
        size_t at = 0;
        for (size_t o = 0; o < f->norder; o++) {
            uint32_t h = f->order[o];
            start[h] = at;
            at += f->count[h];
            f->count[h] = 0; /* now the members placed so far */
        }
        for (size_t j = 0; j < d->n; j++) {
            uint32_t h = rec_at(d, j)->in.hole & HOLE_BITS;
            members[start[h] + f->count[h]++] = (uint32_t)j;
        }
    }
    corax_stage progress;
    job_stage_begin(r->job, &progress, "uncertainty", "readings", (double)d->n);
    size_t done = 0;
    int failed = st != CORAX_OK;
    if (!failed && cloud) {
#pragma omp parallel for ordered schedule(dynamic, 1) num_threads(nlanes)
        for (size_t o = 0; o < f->norder; o++) {
            lane_room *lr = &room[omp_get_thread_num()];
            uint32_t h = f->order[o];
            corax_writer_reset(lr->cloud);
            if (draw_hole(r, d, h, members + start[h], f->count[h], lr) != CORAX_OK) {
#pragma omp atomic write
                failed = 1;
            }
#pragma omp ordered
            {
                size_t len;
                const char *text = corax_writer_contents(lr->cloud, &len);
                corax_writer_text(cloud, text, len);
                done += f->count[h];
                job_stage_step(r->job, &progress, (double)done);
            }
        }
    } else if (!failed) {
#pragma omp parallel for schedule(dynamic, 1) num_threads(nlanes)
        for (size_t o = 0; o < f->norder; o++) {
            uint32_t h = f->order[o];
            if (draw_hole(r, d, h, members + start[h], f->count[h],
                          &room[omp_get_thread_num()]) != CORAX_OK) {
#pragma omp atomic write
                failed = 1;
            }
#pragma omp critical(convert_draws_progress)
            {
                done += f->count[h];
                job_stage_step(r->job, &progress, (double)done);
            }
        }
    }
    job_stage_end(r->job, &progress);
    if (failed && st == CORAX_OK) {
        job_error(r->job, NULL, 0, "out of memory while drawing");
        st = CORAX_ENOMEM;
    }
    if (cloud)
        st = st == CORAX_OK ? job_commit(r->job, cloud) : (corax_writer_discard(cloud), st);
    for (int k = 0; room && k < nlanes; k++) {
        corax_mc_free(room[k].mc);
        free(room[k].mr);
        free(room[k].sp);
        corax_writer_discard(room[k].cloud);
    }
    free(room);
    free(members);
    free(start);
    return st;
}

corax_status convert_draws_run(convert_run *r, const char *const *files, size_t nfiles,
                               int nlanes, convert_draws **out)
{
    *out = NULL;
    size_t nholes = corax_program_size(r->prog);
    first_reading f;
    memset(&f, 0, sizeof f);
    f.d = calloc(1, sizeof *f.d);
    f.count = calloc(nholes + 1, sizeof *f.count);
    f.order = malloc((nholes + 1) * sizeof *f.order);
    /* the first reading's lanes count nothing: the second's do */
    convert_lane *lanes = convert_lanes_new(nlanes);
    pending *tmp = malloc(READ_ROWS * sizeof *tmp);
    uint8_t *sim = malloc(READ_ROWS);
    corax_status st = f.d && f.count && f.order && lanes && tmp && sim ? CORAX_OK : CORAX_ENOMEM;
    if (st == CORAX_OK && nholes > HOLE_BITS) {
        job_error(r->job, NULL, 0, "more than %u holes to draw in one run: split the holes "
                  "with --shard K/N", (unsigned)HOLE_BITS);
        st = CORAX_EVALUE;
    }
    for (size_t i = 0; i < nfiles && st == CORAX_OK; i++)
        st = read_log(r, &f, files[i], i, lanes, nlanes, tmp, sim);
    if (st == CORAX_OK) { /* the ranks of the bits */
        convert_draws *d = f.d;
        d->nwords = (d->rows >> 6) + 1;
        if (!(d->rank = malloc(d->nwords * sizeof *d->rank)) ||
            (!d->bits && !(d->bits = calloc(1, sizeof *d->bits)))) {
            st = CORAX_ENOMEM;
        } else {
            uint32_t sum = 0;
            for (size_t w = 0; w < d->nwords; w++) {
                d->rank[w] = sum;
                sum += (uint32_t)__builtin_popcountll(d->bits[w]);
            }
        }
    }
    convert_lanes_free(lanes, nlanes);
    free(tmp);
    free(sim);
    if (st == CORAX_OK)
        st = draw_holes(r, &f, nlanes);
    else if (st == CORAX_ENOMEM)
        job_error(r->job, NULL, 0, "out of memory while reading the logs for the draws");
    free(f.count);
    free(f.order);
    if (st != CORAX_OK) {
        convert_draws_free(f.d);
        return job_failed(st);
    }
    *out = f.d;
    return CORAX_OK;
}
