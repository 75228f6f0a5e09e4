/* corax: the QA report, one self-contained HTML page (inline SVG and CSS, no
 * scripts, nothing fetched): a summary of the findings by severity and hole,
 * a plan and a section of the hole traces with the findings marked, and for
 * each hole a strip of its log with its findings and a stereonet with the
 * readings of flagged runs picked out. */
#ifndef CORAX_REPORT_H
#define CORAX_REPORT_H

#include <stddef.h>

#include "corax/convert.h"
#include "corax/finding.h"
#include "corax/qa.h"
#include "corax/output.h"
#include "corax/status.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What the report shows. Everything is borrowed; any pointer may be NULL
 * (with its count 0). */
typedef struct corax_report_input {
    const char *title;                    /* e.g. the project's name */
    const char *const *inputs;            /* the files read, for the header */
    size_t ninputs;
    const char *version;                  /* corax's version */
    const char *when;                     /* the run's time, as text */
    const corax_program *program;         /* the desurveyed holes (NULL: none) */
    const corax_findings *findings;       /* sorted by hole and depth (corax_findings_sort);
                                             each hole's are shown in the order given */
    const corax_qa_log *log;              /* the core log, sorted (corax_qa_log_sort());
                                             NULL: none. Each reading goes to the hole
                                             its name names */
    const corax_convert_options *convert; /* how readings convert (for the nets; NULL:
                                             the defaults) */
    const char *findings_table;           /* the findings as a table (corax check -o), which
                                             the page links to for what it leaves out: in
                                             the report's folder, or an absolute path;
                                             NULL or "-": named, not linked */
} corax_report_input;

/* Write the report to path ("-" for standard output), whole or not at all.
 * Every hole named by the program, the findings or the readings gets its
 * part, in the order corax_findings_sort() puts holes in. A large program's
 * page keeps to a budget (the figures of the holes with the most serious
 * findings, a share of each hole's findings) and links to the findings
 * table for the rest, so that it stays a few megabytes. Text from the data
 * is escaped; nothing on the page is fetched or run.
 * The page's model keeps a few numbers per hole and finding, not per
 * reading: a hole's readings are unpacked from the log only while its
 * figures are drawn.
 * CORAX_EARG for a NULL input or path, a finding of no known severity, a
 * count without its array or a log not sorted; CORAX_EIO (err names the
 * file), CORAX_ENOMEM. */
corax_status corax_report_write(const corax_report_input *input, corax_outputs *set,
                                const char *path,
                                corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
