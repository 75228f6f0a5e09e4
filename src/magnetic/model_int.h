/* The magnetic model's inner layout, shared by its reader and its evaluation. */
#ifndef CORAX_MAGNETIC_MODEL_INT_H
#define CORAX_MAGNETIC_MODEL_INT_H

#include <stddef.h>

#include "corax/magnetic.h"

/* Coefficients of degree 1..N, order 0..n, at index n (n + 1) / 2 + m. */
#define MAG_NCOEF ((CORAX_MAGNETIC_MAX_DEGREE + 1) * (CORAX_MAGNETIC_MAX_DEGREE + 2) / 2)

/* One stretch of time over which the coefficients change linearly: a WMM with
 * its secular variation, or an IGRF epoch interpolated toward the next. */
typedef struct mag_part {
    char name[32];
    double epoch;      /* decimal year at which g and h hold */
    double from, to;   /* valid from `from`, up to but not including `to` */
    int nmax;          /* degree */
    double g[MAG_NCOEF], h[MAG_NCOEF];       /* nT at epoch */
    double gdot[MAG_NCOEF], hdot[MAG_NCOEF]; /* nT a year */
} mag_part;

struct corax_magnetic_model {
    char name[96];
    mag_part *part; /* in date order, each ending where the next begins */
    size_t n;
};

/* The index of coefficient (n, m). */
static inline size_t mag_index(int n, int m) { return (size_t)(n * (n + 1) / 2 + m); }

/* The built-in coefficient files (generated from data/magnetic/ at build time). */
typedef struct mag_builtin_file {
    const char *name;         /* the file's name without its ending: "WMM2025" */
    const char *const *lines;
    size_t nlines;
} mag_builtin_file;

extern const mag_builtin_file corax_magnetic_builtin_files[];
extern const size_t corax_magnetic_builtin_file_count;

#endif
