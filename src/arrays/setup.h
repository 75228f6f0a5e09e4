/* The setup's parts, for the arrays' jobs (internal). */
#ifndef CORAX_ARRAYS_SETUP_H
#define CORAX_ARRAYS_SETUP_H

#include <stdint.h>

#include "corax/arrays.h"
#include "corax/convert.h"
#include "corax/correction.h"
#include "corax/uncertainty.h"

/* The tables a setup describes: the defaults for all, then each one's own. */
typedef enum setup_table_id {
    SETUP_ALL, SETUP_COLLARS, SETUP_SURVEYS, SETUP_STRUCTURES, SETUP_TABLES
} setup_table_id;

/* One table's settings; -1 (NaN for the unit) where not set. */
typedef struct setup_table {
    int delimiter, decimal; /* the character, 0 for found */
    double unit;            /* metres per unit */
    int dip;                /* a corax_dip_convention */
    corax_column_map *columns;
} setup_table;

struct corax_setup {
    setup_table table[SETUP_TABLES];
    int collar_station;
    corax_station_ref *reject;  /* hole names owned */
    size_t nreject;
    double declination, convergence; /* degrees */
    int declination_model, convergence_projection;
    corax_crs *crs;
    corax_local_grid grid;
    int has_grid;
    double date;                /* decimal year, NaN when none */
    char *model_name;           /* NULL: the series WMM */
    corax_north north;
    corax_convert_options convert;
    corax_error_model errors;
    size_t draws;
    uint64_t seed;
};

/* A table's settings: its own over the defaults for all; columns merged into
 * *merged (created here; the caller frees it) when both have some. */
corax_table_settings corax_setup_table(const corax_setup *setup, setup_table_id id,
                                       corax_column_map **merged);

/* A table's dip convention, its own over the defaults. */
corax_dip_convention corax_setup_dip(const corax_setup *setup, setup_table_id id);

#endif
