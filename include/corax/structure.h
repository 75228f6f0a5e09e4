/* corax: located structures, as rows of a converted table (the output of
 * the conversion: the log's own columns, then x, y, z, dip, dip_direction,
 * ... status, note), and the feature kinds they belong to. */
#ifndef CORAX_STRUCTURE_H
#define CORAX_STRUCTURE_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/status.h"
#include "corax/table.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- feature kinds ----
 *
 * Each kind of feature gets an integer code, for files that cannot hold
 * text (VTK) and to keep colours and legends in a stable order:
 *
 *   0   none given (empty)
 *   1   bedding        6   shear
 *   2   foliation      7   joint
 *   3   cleavage       8   fracture
 *   4   vein           9   contact
 *   5   fault         10   lineation
 *   100, 101, ...  any other kind, in the order it first appears in a run
 *
 * Matching ignores case and surrounding blanks. */
enum { CORAX_KIND_NONE = 0, CORAX_KIND_OTHER = 100 };

typedef struct corax_kinds corax_kinds;

/* An empty register of kinds; NULL when out of memory. */
corax_kinds *corax_kinds_new(void);
void corax_kinds_free(corax_kinds *kinds);

/* The code of a kind (text of len bytes), registering it when new; -1 when
 * out of memory. */
int corax_kinds_code(corax_kinds *kinds, const char *text, size_t len);

/* Number of distinct kinds registered so far (codes given out). */
size_t corax_kinds_count(const corax_kinds *kinds);

/* The i-th registered kind in increasing code order: its code, and its name
 * in *name (the common kinds in lower case, others as first written; "none"
 * for code 0). -1 when i is out of range. */
int corax_kinds_at(const corax_kinds *kinds, size_t i, const char **name);

/* The name of a registered kind code (as corax_kinds_at() gives it), or
 * NULL for a code not given out. */
const char *corax_kinds_name(const corax_kinds *kinds, int code);

/* ---- rows of a converted table ---- */

/* Where a converted table keeps what corax reads (-1 when absent). */
typedef struct corax_structure_columns {
    long x, y, z, dip, dip_direction;         /* required */
    long hole, depth, kind, polarity, nx, ny, nz; /* optional */
} corax_structure_columns;

/* The logical names of those columns, in the order of the struct's fields
 * (x, y, z, dip, dip_direction, hole, depth, kind, polarity, nx, ny, nz),
 * how many there are, and how many of them a converted table must have. */
enum { CORAX_STRUCTURE_COLUMNS = 12, CORAX_STRUCTURE_REQUIRED = 5 };
extern const char *const corax_structure_column_names[CORAX_STRUCTURE_COLUMNS];

/* Fill the struct from the column indices found for
 * corax_structure_column_names, in that order. */
void corax_structure_columns_set(corax_structure_columns *c, const long *col);

/* One structure as read from a row. Text fields are borrowed from the row. */
typedef struct corax_structure {
    const char *hole;   /* "" when the table has none */
    size_t hole_len;
    double depth;       /* metres; NaN when not given */
    int located;        /* x, y and z are all given */
    corax_vec3 position;
    int oriented;       /* dip and dip direction are both given */
    corax_plane plane;  /* radians */
    const char *kind;   /* "" when not given */
    size_t kind_len;
    int polarity;       /* +1 upright (younging along the upward normal),
                         * -1 overturned, 0 not known */
} corax_structure;

/* Read one row. An empty cell means "not known": a row the conversion could
 * not orient (empty dip and dip direction) reads as not oriented, one it
 * could not place as not located. When the row also gives the unit normal
 * (nx, ny, nz), the plane is taken from it, as it keeps more digits than
 * dip and dip direction rounded to hundredths; the two must agree within
 * 0.05 degrees. CORAX_EVALUE, with a phrase in why, for a value given but
 * unusable: not a number, a dip outside [0, 90], a dip direction outside
 * [0, 360], half a position, orientation or normal, a normal that is not a
 * unit vector or disagrees with the dip, a polarity other than 1, +1,
 * upright, -1, overturned, 0 or unknown (any case). */
corax_status corax_structure_read(const corax_row *row, const corax_structure_columns *c,
                                  char decimal, corax_structure *s, char *why, size_t whylen);

#ifdef __cplusplus
}
#endif
#endif
