/* Internal to src/draw: the QA report's model of a drill program, shared by
 * the page (report.c), its plan and section (report_views.c) and the strip
 * and stereonet of each hole (report_strip.c). Built once from the report's
 * input (report_model.c); everything it points to is borrowed from there.
 * It keeps nothing per reading: a hole's readings are unpacked from the log
 * while its figures are drawn. */
#ifndef CORAX_REPORT_INT_H
#define CORAX_REPORT_INT_H

#include <stddef.h>

#include "corax/report.h"
#include "corax/svg.h"
#include "draw/palette.h"

enum { REPORT_SEVERITIES = 3 }; /* note, warning, error: corax_severity's values */

#define REPORT_NONE ((size_t)-1)

/* How a severity looks, wherever it is shown: a palette colour, a shape (so
 * that colour is never the only cue), the character of that shape for text,
 * and a pale tint for table rows. */
typedef struct report_look {
    const char *colour;
    corax_shape shape;
    const char *glyph;
    const char *tint;
} report_look;

extern const report_look corax_report_look[REPORT_SEVERITIES];

/* The colour of the dark outlines and hole traces of the pictures. */
extern const char corax_report_ink[];

/* A point down a hole. */
typedef struct report_point {
    double depth;
    corax_vec3 at;
    int surveyed; /* between the collar and the last station */
} report_point;

typedef struct report_hole {
    const char *name;
    const corax_hole *path; /* NULL: not in the program */
    int traced;             /* the hole can be followed down (stations or a collar direction) */
    double length;          /* corax_hole_length(); 0 when unknown or not in the program */
    double depth_shown;     /* the strip's depth: the hole, its readings and its findings */
    report_point *trace;    /* collar to length, every few metres and at every station */
    size_t ntrace;
    size_t *finding;        /* indices of its findings, in the order given */
    size_t nfinding;
    size_t nwhole;          /* of which about the whole hole (no depth) */
    size_t log_hole;        /* its number in the log, or REPORT_NONE */
    size_t nreading;        /* its readings (those that could be read) */
    size_t count[REPORT_SEVERITIES];
    int drawn;              /* its path is on the plan and section (REPORT_PATH_HOLES) */
    int listed;             /* it has a row in the summary and a part of its own */
    int figures;            /* its strip and net are drawn (see REPORT_FIGURE_HOLES) */
    size_t *shown;          /* the findings its table shows (of `finding`), in order */
    size_t nshown;          /* nfinding, or fewer when the page's budget is reached */
} report_hole;

typedef struct report_model {
    const corax_report_input *in;
    const corax_finding *finding; /* the input's findings (NULL when none) */
    size_t nfinding;
    report_hole *hole;            /* every hole named anywhere, in the findings' order */
    size_t nhole;
    size_t *wide;                 /* program-wide findings (no hole) */
    size_t nwide;
    size_t count[REPORT_SEVERITIES];
    const char **kind;            /* the readings' feature kinds, sorted ("" for none) */
    size_t nkind;
    size_t *kind_of;              /* per kind number of the log: its index in kind */
    size_t nreadings;             /* the log's readings */
    size_t unreadable;            /* readings whose values could not be read */
    corax_convert_options convert;
    size_t *store;                /* the storage behind the holes' index lists */
    size_t *shown_store;          /* the storage behind the holes' shown lists */
    size_t drawn_holes;           /* holes on the plan and section */
    size_t listed_holes;          /* holes listed (REPORT_LISTED_HOLES at most) */
    size_t figure_holes;          /* holes whose figures are drawn */
    size_t hidden;                /* findings of holes (listed or not) not in a table */
    size_t unlisted[REPORT_SEVERITIES]; /* the findings of the holes not listed */
} report_model;

/* The page's budget, so that it stays a few megabytes whatever the program's
 * size (a browser opens it; 2,000 holes of 500 readings made 216 MB before).
 * Holes are ranked by their errors, then warnings, notes and readings (ties
 * in the page's order). The first REPORT_PATH_HOLES are drawn on the plan
 * and section (their paths simplified to a quarter of a pixel), the first
 * REPORT_LISTED_HOLES have a row in the summary, a part of their own and a
 * collar mark (the rest are counted in one line), the
 * first REPORT_FIGURE_HOLES their strip and stereonet, and the named holes
 * of the plan and section are those; the listed holes' tables show at most
 * REPORT_FINDING_ROWS findings, each hole at least REPORT_HOLE_ROWS (its
 * errors and warnings before its notes, in depth order), and only those are
 * marked on the plan and section. Everything left out is in the findings
 * table (corax check -o), which the page links to; the tiles and counts
 * still count every hole and finding. Within these bounds a program's page is
 * drawn whole, as before. */
enum {
    REPORT_PATH_HOLES = 5000,
    REPORT_LISTED_HOLES = 500,
    REPORT_FIGURE_HOLES = 40,
    REPORT_FINDING_ROWS = 3000,
    REPORT_HOLE_ROWS = 5
};

/* Which of two tallies is worse: -1 when a is (more errors, then warnings,
 * then notes), 1 when b is, 0 when they are equal. */
static inline int corax_report_worse(const size_t a[REPORT_SEVERITIES],
                                     const size_t b[REPORT_SEVERITIES])
{
    for (int s = REPORT_SEVERITIES - 1; s >= 0; s--)
        if (a[s] != b[s])
            return a[s] > b[s] ? -1 : 1;
    return 0;
}

/* Build the model. CORAX_ENOMEM; the model is then freed. */
corax_status corax_report_model_build(report_model *m, const corax_report_input *in);
void corax_report_model_free(report_model *m);

/* Where a depth lies down a hole (extrapolated past the survey, the collar
 * for a hole without a path or a NaN depth); 0 when the hole is not in the
 * program. */
int corax_report_hole_at(const report_hole *h, double depth, corax_vec3 *at);

/* Whether a finding names a stretch of its hole that holds `depth`: within
 * its range, or at its depth to the centimetre. */
int corax_report_finding_holds(const corax_finding *f, double depth);

/* A hole's readings unpacked for its figures: those that could be read, by
 * depth, each with its kind (an index in the model's kinds) and whether it
 * lies in a stretch that a warning or an error of the hole names. */
typedef struct report_readings {
    corax_reading *reading;
    size_t *kind;
    unsigned char *flagged;
    size_t n;
} report_readings;

/* CORAX_ENOMEM; free with corax_report_readings_free() either way. */
corax_status corax_report_readings(const report_model *m, const report_hole *h,
                                   report_readings *out);
void corax_report_readings_free(report_readings *rr);

/* The pictures, as SVG documents the caller frees. CORAX_ENOMEM. */
corax_status corax_report_plan(const report_model *m, corax_svg **out);
corax_status corax_report_section(const report_model *m, double *azimuth, corax_svg **out);

/* Above these many readings a hole's strip, or its net, draws only every
 * k-th (the net keeps every flagged one up to its cap, and every k-th
 * flagged one beyond), so that the page of a large program stays a few
 * megabytes; the captions say so. */
enum { REPORT_STRIP_CAP = 2500, REPORT_NET_CAP = 1500 };

/* What a hole's strip shows of its readings. */
typedef struct report_strip_counts {
    size_t step;  /* one reading in every `step` is drawn (1: all) */
    size_t drawn; /* readings drawn */
    size_t blank; /* readings without a depth or an alpha, never drawn */
} report_strip_counts;

/* The strip of a hole: depth down the page; survey stations, readings (alpha
 * and beta, by feature kind) and findings. */
corax_status corax_report_strip(const report_model *m, const report_hole *h,
                                const report_readings *rr, report_strip_counts *counts,
                                corax_svg **out);

/* What a hole's stereonet shows. */
typedef struct report_net_counts {
    size_t placed;    /* readings with a plane or a line on the net */
    size_t flagged;   /* of which in flagged stretches */
    size_t unplaced;  /* readings that gave neither... */
    size_t no_beta;   /* ...of which for want of a beta (an alpha alone) */
    size_t too_steep; /* ...of which because the hole is too near vertical there for
                         an orientation line */
    size_t drawn;     /* readings drawn, when the net was thinned; else placed */
    size_t flagged_drawn; /* flagged readings drawn (every one up to REPORT_NET_CAP) */
    size_t poles;     /* poles drawn */
    int contoured;    /* the density is shaded and contoured (REPORT_NET_CONTOURS poles
                         or more) */
} report_net_counts;

/* Fewer poles than this on a hole's net are drawn without density contours:
 * a handful of poles gives contours that mean nothing. */
enum { REPORT_NET_CONTOURS = 20 };

/* The stereonet of a hole's readings: those in flagged stretches picked out
 * from the rest. *out is NULL when nothing could be placed. `index` makes its
 * ids unique on the page. */
corax_status corax_report_net(const report_model *m, const report_hole *h,
                              const report_readings *rr, size_t index, report_net_counts *counts,
                              corax_svg **out);

/* Where a finding lies, for people: "whole hole", "120.5" or "120.5-129"
 * (an en dash), metres; into buf of REPORT_DEPTHS bytes; returns the length. */
enum { REPORT_DEPTHS = 96 };
size_t corax_report_depths(char *buf, const corax_finding *f);

/* A <title> (a tooltip) for the mark of a finding: where, severity, check
 * and message, led by the hole's name when `with_hole`. */
void corax_report_finding_title(corax_svg *svg, const corax_finding *f, int with_hole);

/* A picture's key: items (a symbol and its words) left to right in rows. */
typedef struct report_key {
    corax_svg *svg;
    double left, right; /* the rows' extent, pixels */
    double x, y;        /* the next item's place; y is the middle of its row */
} report_key;

/* A key for measuring: the same layout, drawn on a scratch picture, so that
 * a caller can size its page before drawing (free key->svg after). */
corax_status corax_report_key_scratch(report_key *key, double left, double right);

/* An item with room `symbol` pixels wide for its symbol, then its words: on
 * this row when it fits, else the next. Writes the words; returns the x
 * where the symbol's room begins. */
double corax_report_key_item(report_key *key, double symbol, const char *words);

/* The three severities' symbols, worst first. */
void corax_report_key_severities(report_key *key);

/* Layout helpers shared by the pictures. */
double corax_report_nice(double x);          /* 1, 2, 2.5 or 5 x 10^k >= x > 0 */
double corax_report_text_width(const char *text, double px); /* estimated, pixels */
void corax_report_symbol(corax_svg *svg, corax_severity s, double x, double y, double size);

/* The pictures draw with classes that the page styles once (report.c):
 * every class they use is listed there, and none is a class of the
 * stereonet's, whose style sheet an HTML page applies to the whole page. */

#endif
