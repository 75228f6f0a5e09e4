/* io: legacy VTK polydata, streamed block by block through corax_writer,
 * with every block's announced size checked against what was written. */
#include <math.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/output.h"
#include "corax/vtk.h"

struct corax_vtk {
    corax_writer *w;
    corax_vtk_encoding encoding;
    int decimals;
    corax_vtk_type type; /* of the current block's values */
    const char *block;   /* its keyword, for messages */
    size_t left;         /* values still owed to it */
    size_t per_line;     /* ASCII: values on a line (cells: this cell's values) */
    size_t on_line;
    size_t cell_left;    /* indices owed to the current cell */
    size_t npoints;
    size_t data_items;   /* tuples per array in the current data section */
    size_t arrays_left;  /* arrays owed to the current FIELD */
    char fault[200];     /* the first misuse, reported at commit */
    size_t nout;         /* bytes waiting in out */
    char out[1 << 16];   /* values gathered, handed to the writer in large pieces */
};

/* Hand what is gathered to the writer. */
static void flush_out(corax_vtk *v)
{
    corax_writer_text(v->w, v->out, v->nout);
    v->nout = 0;
}

/* Bytes of the file, in order. A value is a few bytes: gathering them
 * spares the writer a call each. */
static inline void emit(corax_vtk *v, const void *p, size_t n)
{
    if (v->nout + n > sizeof v->out)
        flush_out(v);
    if (n > sizeof v->out) {
        corax_writer_text(v->w, p, n);
        return;
    }
    memcpy(v->out + v->nout, p, n);
    v->nout += n;
}

/* Record the first misuse; the file is refused at commit. */
static void fault(corax_vtk *v, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

static void fault(corax_vtk *v, const char *fmt, ...)
{
    va_list ap;
    if (v->fault[0])
        return;
    va_start(ap, fmt);
    vsnprintf(v->fault, sizeof v->fault, fmt, ap);
    va_end(ap);
}

/* Close the current block: it must have had all its values. */
static void end_block(corax_vtk *v)
{
    if (v->left)
        fault(v, "VTK block %s lacks %zu values", v->block, v->left);
    if (v->block && (v->encoding == CORAX_VTK_BINARY || v->on_line))
        emit(v, "\n", 1); /* binary blocks end with a line break too */
    v->left = 0;
    v->on_line = 0;
    v->block = NULL;
}

/* Start a block of n values, each line of ASCII holding per_line of them. */
static void begin_block(corax_vtk *v, const char *keyword, size_t n, corax_vtk_type type,
                        size_t per_line)
{
    v->block = keyword;
    v->left = n;
    v->type = type;
    v->per_line = per_line;
    v->on_line = 0;
}

static void header_line(corax_vtk *v, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

static void header_line(corax_vtk *v, const char *fmt, ...)
{
    char line[400];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(line, sizeof line, fmt, ap);
    va_end(ap);
    emit(v, line, strlen(line));
}

/* A name fit for a keyword line: blanks become '_', empty becomes "data". */
static void clean_name(char *out, size_t cap, const char *name)
{
    size_t n = 0;
    for (const char *p = name; *p && n + 1 < cap; p++)
        out[n++] = (*p == ' ' || *p == '\t' || *p == '\n' || *p == '\r') ? '_' : *p;
    out[n] = '\0';
    if (!n)
        snprintf(out, cap, "data");
}

corax_status corax_vtk_open(corax_outputs *set, const char *path, corax_vtk_encoding encoding,
                            const char *title,
                            corax_vtk **out, corax_error *err)
{
    *out = NULL;
    corax_vtk *v = calloc(1, sizeof *v);
    if (!v)
        return CORAX_ENOMEM;
    corax_status st = corax_writer_open_in(set, path, &v->w, err);
    if (st != CORAX_OK) {
        free(v);
        return st;
    }
    v->encoding = encoding == CORAX_VTK_BINARY ? CORAX_VTK_BINARY : CORAX_VTK_ASCII;
    v->decimals = 6;
    char t[256];
    size_t n = 0;
    for (const char *p = title ? title : ""; *p && n + 1 < sizeof t; p++)
        t[n++] = (*p == '\n' || *p == '\r') ? ' ' : *p;
    t[n] = '\0';
    header_line(v, "# vtk DataFile Version 3.0\n%s\n%s\nDATASET POLYDATA\n", t,
                encoding == CORAX_VTK_BINARY ? "BINARY" : "ASCII");
    *out = v;
    return CORAX_OK;
}

void corax_vtk_decimals(corax_vtk *v, int decimals)
{
    v->decimals = decimals < 0 ? 0 : decimals > 9 ? 9 : decimals;
}

void corax_vtk_points(corax_vtk *v, size_t n)
{
    end_block(v);
    if (n > INT32_MAX)
        fault(v, "POINTS: %zu points are more than legacy VTK can index", n);
    v->npoints = n;
    header_line(v, "POINTS %zu double\n", n);
    begin_block(v, "POINTS", 3 * n, CORAX_VTK_DOUBLE, 3);
}

void corax_vtk_cells(corax_vtk *v, const char *keyword, size_t ncells, size_t nindices)
{
    end_block(v);
    if (ncells + nindices > INT32_MAX)
        fault(v, "%s: %zu values are more than legacy VTK can hold", keyword, ncells + nindices);
    header_line(v, "%s %zu %zu\n", keyword, ncells, ncells + nindices);
    begin_block(v, keyword, ncells + nindices, CORAX_VTK_INT, 0);
    v->cell_left = 0;
}

static void data_section(corax_vtk *v, const char *keyword, size_t n)
{
    end_block(v);
    if (v->arrays_left)
        fault(v, "VTK FIELD lacks %zu arrays", v->arrays_left);
    v->arrays_left = 0;
    v->data_items = n;
    header_line(v, "%s %zu\n", keyword, n);
}

void corax_vtk_point_data(corax_vtk *v, size_t n) { data_section(v, "POINT_DATA", n); }
void corax_vtk_cell_data(corax_vtk *v, size_t n) { data_section(v, "CELL_DATA", n); }

static const char *type_name(corax_vtk_type t) { return t == CORAX_VTK_INT ? "int" : "double"; }

void corax_vtk_scalars(corax_vtk *v, const char *name, corax_vtk_type type)
{
    char nm[128];
    end_block(v);
    clean_name(nm, sizeof nm, name);
    header_line(v, "SCALARS %s %s 1\nLOOKUP_TABLE default\n", nm, type_name(type));
    begin_block(v, "SCALARS", v->data_items, type, 9);
}

void corax_vtk_normals(corax_vtk *v, const char *name)
{
    char nm[128];
    end_block(v);
    clean_name(nm, sizeof nm, name);
    header_line(v, "NORMALS %s double\n", nm);
    begin_block(v, "NORMALS", 3 * v->data_items, CORAX_VTK_DOUBLE, 3);
}

void corax_vtk_field(corax_vtk *v, const char *name, size_t narrays)
{
    char nm[128];
    end_block(v);
    clean_name(nm, sizeof nm, name);
    header_line(v, "FIELD %s %zu\n", nm, narrays);
    v->arrays_left = narrays;
}

void corax_vtk_array(corax_vtk *v, const char *name, int components, corax_vtk_type type)
{
    char nm[128];
    end_block(v);
    if (v->arrays_left == 0)
        fault(v, "VTK FIELD: array %s is one more than announced", name);
    else
        v->arrays_left--;
    clean_name(nm, sizeof nm, name);
    size_t c = components > 0 ? (size_t)components : 1;
    header_line(v, "%s %zu %zu %s\n", nm, c, v->data_items, type_name(type));
    begin_block(v, "FIELD array", c * v->data_items, type, c == 1 ? 9 : c);
}

/* Count one value against the block; 0 when the block is already full. */
static int take(corax_vtk *v)
{
    if (v->left == 0) {
        fault(v, "VTK block %s got more values than announced", v->block ? v->block : "(none)");
        return 0;
    }
    v->left--;
    return 1;
}

static void ascii_separator(corax_vtk *v)
{
    if (v->on_line)
        emit(v, " ", 1);
    v->on_line++;
}

static void ascii_line_end(corax_vtk *v)
{
    if (v->per_line && v->on_line == v->per_line) {
        emit(v, "\n", 1);
        v->on_line = 0;
    }
}

/* The low n bytes of u (4 or 8), big-endian whatever the host: written
 * straight into the gathered bytes, where the compiler makes one store of
 * them. */
static inline void put_big_endian(corax_vtk *v, uint64_t u, size_t n)
{
    if (v->nout + n > sizeof v->out)
        flush_out(v);
    unsigned char *p = (unsigned char *)v->out + v->nout;
    v->nout += n;
    if (n == 4) {
        p[0] = (unsigned char)(u >> 24);
        p[1] = (unsigned char)(u >> 16);
        p[2] = (unsigned char)(u >> 8);
        p[3] = (unsigned char)u;
        return;
    }
    p[0] = (unsigned char)(u >> 56);
    p[1] = (unsigned char)(u >> 48);
    p[2] = (unsigned char)(u >> 40);
    p[3] = (unsigned char)(u >> 32);
    p[4] = (unsigned char)(u >> 24);
    p[5] = (unsigned char)(u >> 16);
    p[6] = (unsigned char)(u >> 8);
    p[7] = (unsigned char)u;
}

static void put_int(corax_vtk *v, long x)
{
    if (x < INT32_MIN || x > INT32_MAX) {
        fault(v, "VTK block %s: %ld does not fit in 32 bits", v->block, x);
        x = 0;
    }
    if (v->encoding == CORAX_VTK_BINARY) {
        put_big_endian(v, (uint32_t)(int32_t)x, 4);
        return;
    }
    char t[24];
    int n = snprintf(t, sizeof t, "%ld", x);
    ascii_separator(v);
    emit(v, t, (size_t)n);
}

static void put_double(corax_vtk *v, double x)
{
    if (!isfinite(x)) {
        fault(v, "VTK block %s: a value is not a finite number", v->block);
        x = 0.0;
    }
    if (v->encoding == CORAX_VTK_BINARY) {
        uint64_t u;
        memcpy(&u, &x, sizeof u);
        put_big_endian(v, u, 8);
        return;
    }
    char t[48];
    size_t n = corax_format_fixed(t, x, v->decimals);
    ascii_separator(v);
    emit(v, t, n);
}

void corax_vtk_double(corax_vtk *v, double x)
{
    if (!take(v))
        return;
    if (v->type == CORAX_VTK_INT)
        put_int(v, (long)x);
    else
        put_double(v, x);
    if (v->encoding == CORAX_VTK_ASCII)
        ascii_line_end(v);
}

void corax_vtk_int(corax_vtk *v, long x)
{
    if (!take(v))
        return;
    if (v->type == CORAX_VTK_INT)
        put_int(v, x);
    else
        put_double(v, (double)x);
    if (v->encoding == CORAX_VTK_ASCII)
        ascii_line_end(v);
}

void corax_vtk_point(corax_vtk *v, corax_vec3 p) { corax_vtk_vector(v, p); }

void corax_vtk_vector(corax_vtk *v, corax_vec3 x)
{
    corax_vtk_double(v, x.x);
    corax_vtk_double(v, x.y);
    corax_vtk_double(v, x.z);
}

void corax_vtk_cell(corax_vtk *v, size_t npoints)
{
    if (v->cell_left)
        fault(v, "VTK %s: a cell lacks %zu indices", v->block, v->cell_left);
    v->cell_left = npoints;
    v->per_line = 0; /* one cell a line: the line ends with its last index */
    corax_vtk_int(v, (long)npoints);
    if (npoints == 0 && v->encoding == CORAX_VTK_ASCII) {
        emit(v, "\n", 1);
        v->on_line = 0;
    }
}

void corax_vtk_index(corax_vtk *v, size_t index)
{
    if (index >= v->npoints)
        fault(v, "VTK %s: point index %zu is beyond the points", v->block, index);
    if (v->cell_left == 0)
        fault(v, "VTK %s: a cell got more indices than announced", v->block);
    else
        v->cell_left--;
    corax_vtk_int(v, (long)index);
    if (v->cell_left == 0 && v->encoding == CORAX_VTK_ASCII) {
        emit(v, "\n", 1);
        v->on_line = 0;
    }
}

corax_status corax_vtk_commit(corax_vtk *v, corax_error *err)
{
    end_block(v);
    if (v->arrays_left)
        fault(v, "VTK FIELD lacks %zu arrays", v->arrays_left);
    if (v->cell_left)
        fault(v, "VTK cells: a cell lacks %zu indices", v->cell_left);
    if (v->fault[0]) {
        corax_error_set(err, CORAX_EARG, NULL, 0, "%s", v->fault);
        corax_vtk_discard(v);
        return CORAX_EARG;
    }
    flush_out(v);
    corax_status st = corax_writer_commit(v->w, err);
    free(v);
    return st;
}

void corax_vtk_discard(corax_vtk *v)
{
    if (!v)
        return;
    corax_writer_discard(v->w);
    free(v);
}
