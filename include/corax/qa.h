/* corax: QA of a drill program. Finds the survey and orientation errors that
 * plague drill programs and places each at its hole and depth as a finding:
 * surveys (repeated or unordered depths, gaps, doglegs, magnetic disturbance,
 * a first station far down, a collar that disagrees with its first station,
 * stations past the hole's end, holes too steep for a gravity-marked line),
 * orientation readings (values out of range, unoriented readings in oriented
 * runs, low alpha, runs that disagree with their neighbours and whether a
 * line marked on the wrong side or a beta read the wrong way round would
 * explain it, low-confidence runs), and the program as a whole (findings
 * with no hole: the log read under other conventions than stated, an azimuth
 * offset between collars and surveys that most holes or a group share,
 * holes turned alike about the vertical) and against its holes (a hole
 * whose fabric scatters more than the program's, a hole whose readings sit
 * turned about its axis or about the vertical). */
#ifndef CORAX_QA_H
#define CORAX_QA_H

#include <stddef.h>

#include "corax/convert.h"
#include "corax/correction.h"
#include "corax/finding.h"
#include "corax/shard.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Thresholds; angles in radians, lengths in metres. */
typedef struct corax_qa_options {
    double gap;              /* stations further apart than this (default 60 m) */
    double dogleg;           /* dogleg severity above this, per 30 m (default 3 deg) */
    double magnetic_azimuth; /* an azimuth change of at least this between stations... */
    double magnetic_dip;     /* ...with a dip change of at most this: magnetic? (5, 1 deg) */
    double first_station;    /* a first station deeper than this (default 15 m) */
    double collar_mismatch;  /* collar and first station apart by more (default 5 deg) */
    double steep;            /* plunge beyond which a gravity mark is unreliable (70 deg) */
    double low_alpha;        /* alpha below this (default 10 deg) */
    double run_length;       /* an orientation run's length where no runs table gives it
                                (default 3 m, a barrel; else the table's median) */
    size_t min_run;          /* readings of one fabric a run needs when no slip explains
                                it (default 3; two readings can name a slip) */
    double run_window;       /* neighbours within this of a run make its reference (30 m,
                                further in sparse logging) */
    double run_misfit;       /* a run this far from its neighbours disagrees (25 deg) */
    size_t min_fabric;       /* readings of a kind in a hole to judge it (default 10) */
    double fabric_strength;  /* a kind whose first normalised eigenvalue reaches this is
                                a consistent fabric (default 0.8) */
    double spread_ratio;     /* a hole whose fabric scatters this many times more
                                than the program's (default 2) */
    double hole_turn;        /* a hole fitting the program best turned by more than
                                this (default 15 deg)... */
    double turn_gain;        /* ...when the turn cuts its misfit by this fraction (0.4) */
    const char *const *low_confidence; /* confidence words taken as low (NULL-ended;
                                          default "poor", "low") */
    double azimuth_correction; /* what was added to the survey azimuths (declination
                                  minus convergence, radians; default 0), to name
                                  the likely cause of an offset the holes share */
    double total_field;      /* a measured total field this far from the model's, nT
                                (default 300: common practice for field acceptance) */
    double field_dip;        /* a measured dip of the field this far from the model's
                                (default 0.45 deg: common practice) */
    unsigned shard, shards;  /* work split by hole (shard.h): only the holes in shard
                                `shard` of `shards` are checked, each on its own, and
                                the checks that compare holes (the azimuth offset
                                they share, the convention test, the program's
                                scattered and turned holes) are left out with their
                                findings about no hole in particular; a hole's own
                                checks still take out the offset most holes share.
                                shards 0 or 1: the whole program (default) */
} corax_qa_options;

corax_qa_options corax_qa_options_default(void);

/* One row of a core log, as the QA sees it. Strings are borrowed. */
typedef struct corax_qa_reading {
    const char *hole;        /* the hole's name as written */
    const corax_hole *path;  /* NULL when the hole is unknown or has no path */
    corax_reading reading;   /* radians, NaN when absent */
    const char *kind;        /* feature kind, "" when none */
    const char *confidence;  /* "" when none */
    const char *file;
    long line;
    const char *problem;     /* why the row's values could not be read, else NULL */
} corax_qa_reading;

/* The readings of a program's core logs, held for the checks and the report
 * in a compact record each (48 bytes: the hole, kind, confidence and file
 * as numbers into tables of the names met, the depth, the angles as whole
 * millionths of a degree, the line), so that a log of millions of readings
 * fits in memory. Every value comes back exactly as added: a reading whose
 * values a record cannot hold exactly (an angle with more than six decimals
 * of a degree, as computed angles have, a row with a problem, a line past
 * 4,294,967,295, a thousand kinds) keeps them whole beside its record. */
typedef struct corax_qa_log corax_qa_log;

/* NULL when out of memory. */
corax_qa_log *corax_qa_log_new(void);
void corax_qa_log_free(corax_qa_log *log);

/* Add a reading. Its hole, kind, confidence and problem are copied (each
 * name held once); its file is borrowed and must outlive the log and the
 * findings made from it; the first path given for a hole is its path. A
 * NULL hole, kind or confidence is taken as "". The log is then unsorted.
 * CORAX_ENOMEM, also past 4,294,967,294 readings. */
corax_status corax_qa_log_add(corax_qa_log *log, const corax_qa_reading *reading);

/* Group the readings by hole, holes in the order they first appear, each
 * hole's by depth (no depth last) and in the order added where depths tie:
 * the order the checks and the report take them in. CORAX_ENOMEM. */
corax_status corax_qa_log_sort(corax_qa_log *log);

/* Whether the log is sorted (no reading added since corax_qa_log_sort()). */
int corax_qa_log_sorted(const corax_qa_log *log);

size_t corax_qa_log_size(const corax_qa_log *log);

/* Reading i (0 .. size - 1), in the order added, or once sorted in the
 * log's order. Its strings are the log's, valid until a reading is added
 * or the log freed. */
void corax_qa_log_get(const corax_qa_log *log, size_t i, corax_qa_reading *out);

/* Mark reading i as measured from an arbitrary line (reading.arbitrary_line),
 * once its run says so, or not. */
void corax_qa_log_set_arbitrary(corax_qa_log *log, size_t i, int arbitrary);

/* An orientation run: the core between two marks of the orientation line. */
typedef struct corax_qa_run {
    const char *hole;
    double from, to;         /* metres */
    const char *confidence;  /* "" when not given */
    const char *file;
    long line;               /* 0 for an inferred run */
} corax_qa_run;

/* The survey checks of a program: an azimuth offset between the collars'
 * set-ups and the first stations that most holes (or a group) share, then
 * every hole. Findings are appended, with surveys_file (may be NULL) as the
 * file their lines are in. */
corax_status corax_qa_surveys(const corax_program *program, const char *surveys_file,
                              const corax_qa_options *options, corax_findings *out);

/* The magnetic field checks: each station whose survey measured the total
 * field or its dip (total_field, field_dip in the records) is compared with
 * the magnetic model's field there; a departure beyond the options'
 * tolerances is a warning (a magnetometer disturbed by magnetic rock, steel
 * or a faulty tool: its azimuth is doubtful). Measured fields without a model
 * to compare them with give one note. Findings are appended, with
 * surveys_file (may be NULL) as the file their lines are in. */
corax_status corax_qa_field(const corax_corrections *stations, const char *surveys_file,
                            const corax_qa_options *options, corax_findings *out);

/* The orientation and program checks of a sorted log (corax_qa_log_sort();
 * CORAX_EARG when it is not; NULL: no readings). runs may be NULL (nruns
 * 0); a hole without runs has them inferred from its readings (readings in
 * a row that sit off their neighbours alike, however densely it is
 * logged). convert gives the conventions the readings were taken under:
 * when the program reads clearly better under others, a finding says so and
 * the checks of each hole against the rest read it that way. The checks go
 * over the log hole by hole, each hole's readings converted as it comes,
 * so that the memory they take beyond the log's grows with the largest
 * hole, not the program. Findings are appended. */
corax_status corax_qa_readings(const corax_program *program, const corax_qa_log *log,
                               const corax_qa_run *runs, size_t nruns,
                               const corax_convert_options *convert,
                               const corax_qa_options *options, corax_findings *out);

#ifdef __cplusplus
}
#endif
#endif
