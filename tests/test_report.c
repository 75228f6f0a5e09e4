/* Tests of the QA report: the page holds every hole and finding, escaped,
 * with the right counts, the caution and nothing fetched or run; holes are
 * listed in the findings' order; flagged readings are picked out; a failed
 * write leaves nothing behind. The program, readings and findings are
 * invented here. */
#include <dirent.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "corax/report.h"
#include "draw/report_int.h"
#include "support/check.h"

static size_t count(const char *doc, const char *what)
{
    size_t n = 0;
    for (const char *p = doc; (p = strstr(p, what)); p++)
        n++;
    return n;
}

/* Where `what` first stands in doc, as an offset; fails the test when absent. */
static size_t at(const char *doc, const char *what)
{
    const char *p = strstr(doc, what);
    if (!p)
        fail_msg("not in the page: %s", what);
    return (size_t)(p - doc);
}

/* A straight hole: collar, direction (degrees, plunge down) and length, with
 * a station every 30 m (none when `stations` is 0; no direction either when
 * `direction` is 0). */
static corax_hole *hole(const char *name, double x, double y, double azimuth, double plunge,
                        double length, int stations, int direction)
{
    corax_collar c = {.position = {x, y, 300.0}, .azimuth = corax_rad(azimuth),
                      .plunge = corax_rad(plunge), .has_direction = direction, .length = length};
    corax_station st[16];
    size_t n = 0;
    for (double d = 30.0; stations && d <= length && n < 16; d += 30.0, n++)
        st[n] = corax_station_make(d, corax_rad(azimuth), corax_rad(plunge), (long)n + 2);
    corax_hole *h = NULL;
    corax_error err;
    assert_int_equal(corax_hole_new(name, &c, st, n, 0.0, &h, &err), CORAX_OK);
    return h;
}

typedef struct fixture {
    corax_program *program;
    corax_qa_reading reading[64];
    size_t nreading;
    corax_qa_log *log; /* of the readings (fixture_log) */
    corax_findings findings;
    corax_convert_options convert;
    const char *inputs[2];
    corax_report_input in;
} fixture;

static void add_reading(fixture *f, const char *name, double depth, double alpha, double beta,
                        const char *kind)
{
    const corax_hole *path = corax_program_find(f->program, name, strlen(name));
    corax_qa_reading *q = &f->reading[f->nreading++];
    *q = (corax_qa_reading){.hole = name, .path = path, .reading = corax_reading_empty(),
                            .kind = kind, .confidence = "", .file = "log.csv",
                            .line = (long)f->nreading + 1, .problem = NULL};
    q->reading.depth = depth;
    q->reading.alpha = corax_rad(alpha);
    q->reading.beta = corax_rad(beta); /* NaN stays NaN */
}

/* The log of the fixture's readings, made again after readings are added. */
static void fixture_log(fixture *f)
{
    corax_qa_log_free(f->log);
    f->log = test_qa_log(f->reading, f->nreading);
    f->in.log = f->log;
}

/* Four holes in the collars (one named with markup in it, one without a
 * path, one clean) and one that only the log and a finding name. */
static fixture *make_fixture(void)
{
    fixture *f = calloc(1, sizeof *f);
    assert_non_null(f);
    f->program = corax_program_new();
    assert_non_null(f->program);
    assert_int_equal(corax_program_add(f->program, hole("DH10", 1100, 2000, 90, 60, 120, 1, 1)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(f->program, hole("DH1", 1000, 2000, 90, 60, 150, 1, 1)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(f->program, hole("DH2", 1050, 2100, 0, 0, 80, 0, 0)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(f->program, hole("A<1&B", 1000, 2200, 180, 70, 90, 1, 1)),
                     CORAX_OK);
    /* DH1: three readings inside the 20-30 m stretch of a warning, one at
     * the 45 m of an error (to the centimetre), four elsewhere */
    add_reading(f, "DH1", 22, 40, 10, "bedding");
    add_reading(f, "DH1", 25, 42, 15, "bedding");
    add_reading(f, "DH1", 29.99, 38, 12, "vein");
    add_reading(f, "DH1", 45.004, 50, 200, "bedding");
    add_reading(f, "DH1", 60, 41, 190, "bedding");
    add_reading(f, "DH1", 75, 44, 195, "bedding");
    add_reading(f, "DH1", 95, 39, 185, "vein");
    add_reading(f, "DH1", 110, 55, NAN, "vein"); /* unoriented */
    add_reading(f, "A<1&B", 40, 30, 100, "joint <j>");
    add_reading(f, "GHOST", 12, 30, 100, "bedding");
    add_reading(f, "DH10", 50, 60, 300, "");
    add_reading(f, "DH2", 30, 45, 90, "bedding");
    corax_findings *F = &f->findings;
    assert_int_equal(corax_findings_add(F, CORAX_NOTE, "fabric", NULL, 0, NULL, NAN,
                                        "the program's fabric <spreads> & scatters"), CORAX_OK);
    assert_int_equal(corax_findings_add_range(F, CORAX_WARNING, "run-misfit", "log.csv", 3,
                                              "DH1", 20, 30, "run 20-30 m sits \"180\" off"),
                     CORAX_OK);
    assert_int_equal(corax_findings_add(F, CORAX_ERROR, "alpha-range", "log.csv", 9, "DH1", 45,
                                        "alpha 95 > 90"), CORAX_OK);
    assert_int_equal(corax_findings_add(F, CORAX_NOTE, "soft", "log.csv", 5, "DH1", 60,
                                        "a note picks out nothing"), CORAX_OK);
    assert_int_equal(corax_findings_add(F, CORAX_NOTE, "steep", "collars.csv", 4, "A<1&B", NAN,
                                        "hole 'A<1&B' is steep"), CORAX_OK);
    assert_int_equal(corax_findings_add(F, CORAX_WARNING, "unknown-hole", "log.csv", 11, "GHOST",
                                        12, "GHOST is not in the collars"), CORAX_OK);
    assert_int_equal(corax_findings_sort(F), CORAX_OK);
    f->convert = corax_convert_options_default();
    f->inputs[0] = "in/collars & surveys.csv";
    f->inputs[1] = "in/log.csv";
    f->in = (corax_report_input){.title = "Test <program>", .inputs = f->inputs, .ninputs = 2,
                                 .version = "9.9.9", .when = "2026-01-02 03:04",
                                 .program = f->program, .findings = F,
                                 .convert = &f->convert};
    fixture_log(f);
    return f;
}

static void free_fixture(fixture *f)
{
    corax_findings_clear(&f->findings);
    corax_program_free(f->program);
    corax_qa_log_free(f->log);
    free(f);
}

static char *write_page(const corax_report_input *in, const char *name)
{
    const char *path = test_tmp_path(name);
    corax_error err = {0};
    corax_status st = corax_report_write(in, NULL, path, &err);
    if (st != CORAX_OK)
        fail_msg("report not written: %s (%s)", err.message, corax_strerror(st));
    char *doc = test_read_file(path, NULL);
    unlink(path);
    return doc;
}

/* Nothing is fetched or run: no script, no external reference of any kind;
 * the only address is the SVG namespace, which names and fetches nothing. */
static void assert_self_contained(const char *doc)
{
    static const char *const never[] = {"<script", "<SCRIPT", "<img", "<link", "<iframe",
                                        "<object", "<embed", "@import", " src=", "href=\"/",
                                        "javascript:", " on" "load=", " onclick="};
    for (size_t i = 0; i < sizeof never / sizeof never[0]; i++)
        if (strstr(doc, never[i]))
            fail_msg("the page holds %s", never[i]);
    const char *ns = "http://www.w3.org/2000/svg\"";
    for (const char *p = doc; (p = strstr(p, "http")); p++)
        if (strncmp(p, ns, strlen(ns)) != 0)
            fail_msg("an address other than the SVG namespace: %.60s", p);
    assert_null(strstr(doc, "https:"));
    for (const char *p = doc; (p = strstr(p, "url(")); p++)
        assert_int_equal(p[4], '#'); /* only clip paths inside the page */
    for (const char *p = doc; (p = strstr(p, "href=\"")); p++)
        assert_int_equal(p[6], '#'); /* only links within the page */
}

/* Every id on the page is there once (several nets share the page). */
static void assert_ids_unique(const char *doc)
{
    size_t n = count(doc, " id=\"");
    const char **ids = calloc(n + 1, sizeof *ids);
    size_t *len = calloc(n + 1, sizeof *len);
    assert_true(ids && len);
    size_t k = 0;
    for (const char *p = doc; (p = strstr(p, " id=\"")); p++, k++) {
        ids[k] = p + 5;
        len[k] = strcspn(p + 5, "\"");
        for (size_t j = 0; j < k; j++)
            if (len[j] == len[k] && strncmp(ids[j], ids[k], len[k]) == 0)
                fail_msg("id %.*s is given twice", (int)len[k], ids[k]);
    }
    assert_true(n >= 4 + 5); /* three counts, five hole parts and more */
    free(ids);
    free(len);
}

static void test_page_holds_everything_escaped(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    char *doc = write_page(&f->in, "report-everything.html");
    assert_int_equal(strncmp(doc, "<!DOCTYPE html>\n<html lang=\"en\">", 32), 0);
    assert_string_equal(doc + strlen(doc) - 8, "</html>\n");
    /* the header: title, inputs, version, time, all escaped */
    assert_non_null(strstr(doc, "<h1>Test &lt;program&gt;</h1>"));
    assert_non_null(strstr(doc, "<code>in/collars &amp; surveys.csv</code>"));
    assert_non_null(strstr(doc, "corax 9.9.9"));
    assert_non_null(strstr(doc, "2026-01-02 03:04"));
    /* every hole has its part, its heading escaped, in the findings' order
     * (A<1&B, DH1, DH2, DH10, GHOST: digits compare as numbers) */
    static const char *const heads[] = {"<h3>A&lt;1&amp;B</h3>", "<h3>DH1</h3>", "<h3>DH2</h3>",
                                        "<h3>DH10</h3>", "<h3>GHOST</h3>"};
    for (size_t i = 1; i < 5; i++)
        assert_true(at(doc, heads[i - 1]) < at(doc, heads[i]));
    assert_null(strstr(doc, "A<1&B"));
    assert_null(strstr(doc, "<spreads>"));
    assert_null(strstr(doc, "joint <j>"));
    /* every message, escaped */
    at(doc, "the program&#39;s fabric &lt;spreads&gt; &amp; scatters");
    at(doc, "run 20-30 m sits &quot;180&quot; off");
    at(doc, "alpha 95 &gt; 90");
    at(doc, "hole &#39;A&lt;1&amp;B&#39; is steep");
    at(doc, "GHOST is not in the collars");
    /* counts by severity, as added above: 1 error, 2 warnings, 3 notes */
    const corax_findings *F = &f->findings;
    char want[64];
    snprintf(want, sizeof want, "id=\"count-error\">%zu<", corax_findings_count(F, CORAX_ERROR));
    at(doc, want);
    at(doc, "id=\"count-error\">1<");
    at(doc, "id=\"count-warning\">2<");
    at(doc, "id=\"count-note\">3<");
    /* the table by hole links each hole to its part */
    size_t dh1 = at(doc, "<a href=\"#hole-2\">DH1</a>");
    assert_true(dh1 < at(doc, "id=\"hole-2\""));
    at(doc, "<a href=\"#hole-1\">A&lt;1&amp;B</a>");
    at(doc, "<a href=\"#program-wide\">");
    at(doc, "<code>run-misfit</code>");
    at(doc, "<code>alpha-range</code>");
    /* a clean hole says so; the hole without a path says why */
    size_t dh10 = at(doc, "<h3>DH10</h3>");
    assert_true(at(doc + dh10, "No findings.") < at(doc + dh10, "</article>"));
    size_t dh2 = at(doc, "<h3>DH2</h3>");
    assert_true(at(doc + dh2, "the hole has no path") < at(doc + dh2, "</article>"));
    assert_true(at(doc + dh2, "No stereonet: the hole has no path") < at(doc + dh2, "</article>"));
    size_t ghost = at(doc, "<h3>GHOST</h3>");
    assert_true(at(doc + ghost, "No stereonet: the hole is not in the collars") <
                at(doc + ghost, "</article>"));
    /* the caution, at the head and at the foot */
    assert_int_equal(count(doc, "must be reviewed by a competent person"), 2);
    assert_int_equal(count(doc, "Local codes and licensed practice prevail"), 2);
    assert_true(at(doc, "competent person") < at(doc, "<section id=\"summary\">"));
    assert_true(strstr(strstr(doc, "<footer>"), "competent person") != NULL);
    /* the plan and the section name the holes in the collars; GHOST is not drawn */
    assert_int_equal(count(doc, "class=\"hole-name\">DH1<"), 2);
    assert_int_equal(count(doc, "class=\"hole-name\">A&lt;1&amp;B<"), 2);
    assert_int_equal(count(doc, "class=\"hole-name\">GHOST<"), 0);
    at(doc, "they are not in the collars: GHOST.");
    /* a strip per hole, a net per hole whose readings can be oriented */
    assert_int_equal(count(doc, ">Alpha (\xc2\xb0)</text>"), 5);
    assert_int_equal(count(doc, ">Readings of "), 3); /* A<1&B, DH1, DH10 */
    assert_self_contained(doc);
    assert_ids_unique(doc);
    free(doc);
    free_fixture(f);
}

/* DH1's net picks out the three readings inside the warning's 20-30 m and
 * the one at the error's 45 m (to the centimetre); the others are the rest,
 * the one at the depth of a note among them. Its unoriented reading gives
 * no plane and is counted. */
static void test_flagged_readings_picked_out(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    report_model m;
    assert_int_equal(corax_report_model_build(&m, &f->in), CORAX_OK);
    assert_int_equal(m.nhole, 5);
    assert_string_equal(m.hole[1].name, "DH1");
    const report_hole *h = &m.hole[1];
    assert_int_equal(h->nreading, 8);
    assert_int_equal(h->nfinding, 3);
    report_readings rr;
    assert_int_equal(corax_report_readings(&m, h, &rr), CORAX_OK);
    assert_int_equal(rr.n, 8);
    size_t flagged = 0;
    for (size_t k = 0; k < rr.n; k++) {
        flagged += rr.flagged[k];
        if (k) /* by depth */
            assert_true(rr.reading[k - 1].depth <= rr.reading[k].depth);
        double d = rr.reading[k].depth;
        assert_int_equal(rr.flagged[k], (d >= 20 && d <= 30) || fabs(d - 45) < 0.005);
    }
    assert_int_equal(flagged, 4);
    report_net_counts c;
    corax_svg *svg;
    assert_int_equal(corax_report_net(&m, h, &rr, 2, &c, &svg), CORAX_OK);
    corax_report_readings_free(&rr);
    assert_non_null(svg);
    assert_int_equal(c.placed, 7);
    assert_int_equal(c.flagged, 4);
    assert_int_equal(c.unplaced, 1);
    assert_int_equal(c.no_beta, 1);
    const char *doc = corax_svg_finish(svg, NULL);
    const char *set = strstr(doc, ">in a stretch with a warning or error</text>");
    assert_non_null(set);
    assert_non_null(strstr(set, ">4 poles, 0 lines</text>"));
    assert_non_null(strstr(doc, ">3 poles, 0 lines</text>")); /* the rest */
    assert_null(strstr(doc, "corax-net")); /* ids of its own */
    corax_svg_free(svg);
    /* the hole without a path: nothing to put on a net */
    assert_string_equal(m.hole[2].name, "DH2");
    assert_false(m.hole[2].traced);
    assert_int_equal(m.hole[2].ntrace, 1); /* its collar */
    corax_report_model_free(&m);
    free_fixture(f);
}

/* The strip puts depth down the page at one scale: the bars of a 10 m and
 * a 30 m stretch are a third as long as each other, and a finding's mark
 * sits lower the deeper it is. */
static void test_strip_to_scale(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    assert_int_equal(corax_findings_add_range(&f->findings, CORAX_NOTE, "soft", NULL, 0, "DH10",
                                              40, 50, "ten metres"), CORAX_OK);
    assert_int_equal(corax_findings_add_range(&f->findings, CORAX_NOTE, "soft", NULL, 0, "DH10",
                                              70, 100, "thirty metres"), CORAX_OK);
    report_model m;
    assert_int_equal(corax_report_model_build(&m, &f->in), CORAX_OK);
    assert_string_equal(m.hole[3].name, "DH10");
    report_strip_counts c;
    corax_svg *svg;
    report_readings rr;
    assert_int_equal(corax_report_readings(&m, &m.hole[3], &rr), CORAX_OK);
    assert_int_equal(corax_report_strip(&m, &m.hole[3], &rr, &c, &svg), CORAX_OK);
    corax_report_readings_free(&rr);
    assert_int_equal(c.step, 1);
    assert_int_equal(c.drawn, 1);
    const char *doc = corax_svg_finish(svg, NULL);
    double y[2], h[2], x, w;
    const char *p = doc;
    for (int k = 0; k < 2; k++) {
        p = strstr(p, "class=\"bar sev-n\"");
        assert_non_null(p);
        while (p > doc && strncmp(p, "<rect", 5) != 0)
            p--;
        assert_int_equal(sscanf(p, "<rect x=\"%lf\" y=\"%lf\" width=\"%lf\" height=\"%lf\"", &x,
                                &y[k], &w, &h[k]), 4);
        p = strstr(p, "/>");
    }
    assert_close(h[1] / h[0], 3.0, 0.01, 0.0, "30 m over 10 m (the same scale)");
    assert_close((y[1] - y[0]) / h[0], 3.0, 0.01, 0.0, "70 m less 40 m, in tens of metres");
    assert_non_null(strstr(doc, "<title>40\xe2\x80\x93" "50 m, note (soft): ten metres</title>"));
    corax_svg_free(svg);
    corax_report_model_free(&m);
    free_fixture(f);
}

/* The section runs the way the holes spread: collars along a north-east
 * line give 045 degrees; one vertical hole, which spreads no way, east-west. */
static void test_section_along_the_spread(void **state)
{
    (void)state;
    corax_program *p = corax_program_new();
    for (int i = 0; i < 4; i++) {
        char name[16];
        snprintf(name, sizeof name, "NE%d", i);
        assert_int_equal(corax_program_add(p, hole(name, 100.0 * i, 100.0 * i, 0, 90, 50, 1, 1)),
                         CORAX_OK);
    }
    corax_report_input in = {.program = p};
    report_model m;
    assert_int_equal(corax_report_model_build(&m, &in), CORAX_OK);
    double azimuth;
    corax_svg *svg;
    assert_int_equal(corax_report_section(&m, &azimuth, &svg), CORAX_OK);
    assert_close(corax_deg(azimuth), 45.0, 0, 1e-9, "collars on a line to 045");
    assert_non_null(strstr(corax_svg_finish(svg, NULL), ">045\xc2\xb0</text>"));
    corax_svg_free(svg);
    corax_report_model_free(&m);
    corax_program_free(p);
    p = corax_program_new();
    assert_int_equal(corax_program_add(p, hole("V", 0, 0, 0, 90, 50, 1, 1)), CORAX_OK);
    in.program = p;
    assert_int_equal(corax_report_model_build(&m, &in), CORAX_OK);
    assert_int_equal(corax_report_section(&m, &azimuth, &svg), CORAX_OK);
    assert_close(corax_deg(azimuth), 90.0, 0, 1e-9, "no spread: east-west");
    corax_svg_free(svg);
    corax_report_model_free(&m);
    corax_program_free(p);
}

/* A hole's name on the plan keeps off its own path: a hole running due east
 * from its collar has its name to the left, not on the line to the right
 * (where the first place tried would put it). */
static void test_names_keep_off_the_paths(void **state)
{
    (void)state;
    corax_program *p = corax_program_new();
    assert_int_equal(corax_program_add(p, hole("EAST", 0, 0, 90, 30, 200, 1, 1)), CORAX_OK);
    corax_report_input in = {.program = p};
    report_model m;
    assert_int_equal(corax_report_model_build(&m, &in), CORAX_OK);
    corax_svg *svg;
    assert_int_equal(corax_report_plan(&m, &svg), CORAX_OK);
    const char *doc = corax_svg_finish(svg, NULL);
    double cx, cy, tx, ty;
    const char *c = strstr(doc, "<circle cx=");
    const char *t = strstr(doc, "class=\"hole-name\">EAST<");
    assert_non_null(c);
    assert_non_null(t);
    while (t > doc && strncmp(t, "<text ", 6) != 0)
        t--;
    assert_int_equal(sscanf(c, "<circle cx=\"%lf\" cy=\"%lf\"", &cx, &cy), 2);
    assert_int_equal(sscanf(t, "<text x=\"%lf\" y=\"%lf\"", &tx, &ty), 2);
    /* the name's box (its baseline ty, 12 px high) against the path, which
     * runs from the collar to the right at the collar's height */
    int across_path = ty - 10.0 <= cy && cy <= ty + 2.0;
    if (across_path && tx > cx)
        fail_msg("the name (x %g, y %g) sits on the path east of the collar (%g, %g)", tx, ty,
                 cx, cy);
    corax_svg_free(svg);
    corax_report_model_free(&m);
    corax_program_free(p);
}

/* A hole with more readings than the strip's cap draws every second one and
 * says so; its net draws no more than its cap, every flagged reading kept. */
static void test_large_hole_thinned(void **state)
{
    (void)state;
    enum { N = REPORT_STRIP_CAP + 500 };
    corax_program *p = corax_program_new();
    assert_int_equal(corax_program_add(p, hole("BIG", 0, 0, 45, 60, 400, 1, 1)), CORAX_OK);
    corax_qa_reading *r = calloc(N, sizeof *r);
    assert_non_null(r);
    const corax_hole *path = corax_program_hole(p, 0);
    uint64_t seed = 11;
    for (size_t i = 0; i < N; i++) {
        r[i] = (corax_qa_reading){.hole = "BIG", .path = path, .reading = corax_reading_empty(),
                                  .kind = i % 2 ? "vein" : "bedding", .confidence = "",
                                  .file = "log.csv", .line = (long)i + 2, .problem = NULL};
        r[i].reading.depth = 400.0 * (double)i / N;
        r[i].reading.alpha = corax_rad(20 + 60 * test_uniform(&seed));
        r[i].reading.beta = corax_rad(360 * test_uniform(&seed));
    }
    corax_findings F = {0};
    assert_int_equal(corax_findings_add_range(&F, CORAX_WARNING, "run", NULL, 0, "BIG", 100, 110,
                                              "flagged"), CORAX_OK);
    corax_qa_log *log = test_qa_log(r, N);
    corax_report_input in = {.program = p, .findings = &F, .log = log};
    report_model m;
    assert_int_equal(corax_report_model_build(&m, &in), CORAX_OK);
    report_readings rr;
    assert_int_equal(corax_report_readings(&m, &m.hole[0], &rr), CORAX_OK);
    report_strip_counts sc;
    corax_svg *svg;
    assert_int_equal(corax_report_strip(&m, &m.hole[0], &rr, &sc, &svg), CORAX_OK);
    assert_int_equal(sc.step, 2);
    assert_int_equal(sc.drawn, N / 2);
    corax_svg_free(svg);
    report_net_counts nc;
    assert_int_equal(corax_report_net(&m, &m.hole[0], &rr, 1, &nc, &svg), CORAX_OK);
    corax_report_readings_free(&rr);
    assert_int_equal(nc.placed, N);
    assert_true(nc.drawn <= REPORT_NET_CAP && nc.drawn > REPORT_NET_CAP / 2);
    char want[64];
    snprintf(want, sizeof want, ">%zu poles, 0 lines</text>", nc.flagged);
    const char *doc = corax_svg_finish(svg, NULL);
    assert_non_null(strstr(strstr(doc, ">in a stretch with"), want)); /* all flagged drawn */
    assert_true(nc.flagged > 50);
    corax_svg_free(svg);
    corax_report_model_free(&m);
    const char *path_out = test_tmp_path("report-big.html");
    corax_error err;
    assert_int_equal(corax_report_write(&in, NULL, path_out, &err), CORAX_OK);
    char *page = test_read_file(path_out, NULL);
    assert_non_null(strstr(page, "one reading in every 2 is drawn"));
    free(page);
    unlink(path_out);
    corax_findings_clear(&F);
    corax_program_free(p);
    corax_qa_log_free(log);
    free(r);
}

/* A program of many holes keeps to the page's budget: REPORT_LISTED_HOLES
 * listed (those with the most errors, then warnings, first), the figures of
 * REPORT_FIGURE_HOLES, at most REPORT_HOLE_ROWS rows of findings a hole once
 * they exceed REPORT_FINDING_ROWS, and a link to the findings table beside
 * the page for the rest; the tiles still count every finding. */
static void test_many_holes_keep_to_the_budget(void **state)
{
    (void)state;
    enum { HOLES = REPORT_LISTED_HOLES + 150, PER = 8, FINDINGS = 12 };
    corax_program *p = corax_program_new();
    corax_qa_reading *r = calloc(HOLES * PER, sizeof *r);
    char (*name)[16] = calloc(HOLES, sizeof *name);
    assert_true(p && r && name);
    corax_findings F = {0};
    for (int h = 0; h < HOLES; h++) {
        snprintf(name[h], sizeof name[h], "M%04d", h);
        assert_int_equal(corax_program_add(p, hole(name[h], 20.0 * (h % 40), 20.0 * (h / 40),
                                                   10.0 * h, 60, 120, 1, 1)),
                         CORAX_OK);
        const corax_hole *path = corax_program_hole(p, (size_t)h);
        for (int k = 0; k < PER; k++) {
            corax_qa_reading *q = &r[h * PER + k];
            *q = (corax_qa_reading){.hole = name[h], .path = path,
                                    .reading = corax_reading_empty(), .kind = "vein",
                                    .confidence = "", .file = "log.csv",
                                    .line = (long)(h * PER + k + 2)};
            q->reading.depth = 10.0 + 12.0 * k;
            q->reading.alpha = corax_rad(30 + 5 * k);
            q->reading.beta = corax_rad(40 * k);
        }
        /* every hole has notes; one in three a warning deep down, every 50th an
     * error */
        for (int k = 0; k < FINDINGS; k++)
            assert_int_equal(corax_findings_add(&F, k == 0 && h % 50 == 7 ? CORAX_ERROR
                                                    : k == 10 && h % 3 == 0 ? CORAX_WARNING
                                                                          : CORAX_NOTE,
                                                "soft", "log.csv", k + 2, name[h], 5.0 + 9 * k,
                                                "finding %d of %s", k, name[h]),
                             CORAX_OK);
    }
    corax_findings_sort(&F);
    const char *path_out = test_tmp_path("report-budget.html");
    corax_qa_log *log = test_qa_log(r, HOLES * PER);
    corax_report_input in = {.program = p, .findings = &F, .log = log,
                             .findings_table = test_tmp_path("findings-budget.csv")};
    corax_error err;
    assert_int_equal(corax_report_write(&in, NULL, path_out, &err), CORAX_OK);
    size_t len;
    char *page = test_read_file(path_out, &len);
    assert_int_equal(count(page, "<article class=\"hole\""), REPORT_LISTED_HOLES);
    assert_int_equal(count(page, "<figure class=\"fig strip\">"), REPORT_FIGURE_HOLES);
    char want[600];
    snprintf(want, sizeof want, "<a href=\"%s\">the findings table (",
             strrchr(in.findings_table, '/') + 1); /* beside the page: by its name */
    assert_non_null(strstr(page, want));
    snprintf(want, sizeof want, "%d other holes are not listed here", HOLES - REPORT_LISTED_HOLES);
    assert_non_null(strstr(page, want));
    snprintf(want, sizeof want, "id=\"count-note\">%d</span>",
             HOLES * FINDINGS - HOLES / 3 - 1 - (HOLES + 42) / 50);
    assert_non_null(strstr(page, want)); /* every finding counted */
    /* every hole with an error is listed and drawn, the error ranks first */
    for (int h = 7; h < HOLES; h += 50) {
        snprintf(want, sizeof want, "<h3>%s</h3>", name[h]);
        const char *part = strstr(page, want);
        assert_non_null(part);
        const char *next = strstr(part + 1, "<article");
        const char *fig = strstr(part, "<figure class=\"fig strip\">");
        assert_true(fig && (!next || fig < next));
    }
    /* the listed holes' 12 findings each pass the budget: a share of the rows
     * each (never below REPORT_HOLE_ROWS), the rest named */
    size_t rows = REPORT_FINDING_ROWS / REPORT_LISTED_HOLES;
    rows = rows > REPORT_HOLE_ROWS ? rows : REPORT_HOLE_ROWS;
    assert_int_equal(count(page, "<tr class=\"sev-"), REPORT_LISTED_HOLES * rows);
    snprintf(want, sizeof want, "%zu more findings of this hole are in <a href=",
             FINDINGS - rows);
    assert_non_null(strstr(page, want));
    const char *m3 = strstr(page, "<h3>M0003</h3>"); /* its warning is its 11th finding */
    assert_non_null(m3);
    const char *warned = strstr(m3, "finding 10 of M0003");
    assert_true(warned && warned < strstr(m3, "</article>"));
    free(page);
    unlink(path_out);
    /* standard output as the table: named, not linked */
    in.findings_table = "-";
    assert_int_equal(corax_report_write(&in, NULL, path_out, &err), CORAX_OK);
    page = test_read_file(path_out, NULL);
    assert_null(strstr(page, "<a href=\"findings"));
    assert_non_null(strstr(page, "are in the findings table."));
    free(page);
    unlink(path_out);
    corax_findings_clear(&F);
    corax_program_free(p);
    corax_qa_log_free(log);
    free(r);
    free(name);
}

/* A program with nothing in it still makes a whole page. */
static void test_empty_program(void **state)
{
    (void)state;
    corax_program *p = corax_program_new();
    corax_report_input in = {.program = p};
    char *doc = write_page(&in, "report-empty.html");
    at(doc, "<h1>Drill program</h1>");
    at(doc, "id=\"count-error\">0<");
    at(doc, "The program has no holes.");
    at(doc, "No check found anything.");
    assert_int_equal(count(doc, "must be reviewed by a competent person"), 2);
    assert_self_contained(doc);
    free(doc);
    corax_program_free(p);
}

static size_t entries(const char *dir)
{
    DIR *d = opendir(dir);
    assert_non_null(d);
    size_t n = 0;
    for (struct dirent *e; (e = readdir(d));)
        n += strcmp(e->d_name, ".") != 0 && strcmp(e->d_name, "..") != 0;
    closedir(d);
    return n;
}

/* A write that fails leaves nothing: not under the name, not under a
 * temporary one; a bad input writes nothing at all. */
static void test_failed_write_leaves_nothing(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    corax_error err = {0};
    char dir[600], taken[700], missing[700];
    snprintf(dir, sizeof dir, "%s", test_tmp_path("report-fail"));
    assert_int_equal(mkdir(dir, 0777), 0);
    /* a folder that does not exist */
    snprintf(missing, sizeof missing, "%s/no/such/folder/report.html", dir);
    assert_int_equal(corax_report_write(&f->in, NULL, missing, &err), CORAX_EIO);
    assert_string_equal(err.file, missing);
    assert_int_equal(entries(dir), 0);
    /* the name is a folder with something in it: the rename at the end fails */
    snprintf(taken, sizeof taken, "%s/taken", dir);
    assert_int_equal(mkdir(taken, 0777), 0);
    char inside[800];
    snprintf(inside, sizeof inside, "%s/keep", taken);
    test_write_file(inside, "kept");
    assert_int_equal(corax_report_write(&f->in, NULL, taken, &err), CORAX_EIO);
    assert_int_equal(entries(dir), 1); /* only the folder: no temporary file left */
    assert_int_equal(entries(taken), 1);
    /* a finding of no known severity: refused before anything is written */
    char page[700];
    snprintf(page, sizeof page, "%s/page.html", dir);
    f->findings.item[0].severity = (corax_severity)7;
    assert_int_equal(corax_report_write(&f->in, NULL, page, &err), CORAX_EARG);
    assert_int_equal(entries(dir), 1);
    assert_int_equal(corax_report_write(NULL, NULL, page, &err), CORAX_EARG);
    f->findings.item[0].severity = CORAX_NOTE;
    corax_qa_log *unsorted = corax_qa_log_new(); /* a log not sorted */
    assert_non_null(unsorted);
    assert_int_equal(corax_qa_log_add(unsorted, &f->reading[0]), CORAX_OK);
    f->in.log = unsorted;
    assert_int_equal(corax_report_write(&f->in, NULL, page, &err), CORAX_EARG);
    assert_int_equal(entries(dir), 1);
    f->in.log = f->log;
    corax_qa_log_free(unsorted);
    unlink(inside);
    rmdir(taken);
    rmdir(dir);
    free_fixture(f);
}

/* The findings about the program as a whole come first, before the
 * summary; the summary counts the holes of the program, the collars', and
 * names apart those only the core log gives (GHOST: a typo, most often). */
static void test_program_first_and_holes_counted(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    char *doc = write_page(&f->in, "report-counts.html");
    assert_true(at(doc, "<section id=\"program-wide\"") < at(doc, "<section id=\"summary\">"));
    assert_true(at(doc, "<a href=\"#program-wide\">Whole program</a>") <
                at(doc, "<a href=\"#summary\">Summary</a>"));
    at(doc, "the rest in 2 of its 4 holes and under 1 name that only the core log gives "
            "(GHOST), not holes of the program.");
    at(doc, "Program</dt><dd>4 holes in the collars");
    /* a program-wide note alone does not frame the section as an alert */
    assert_null(strstr(doc, "id=\"program-wide\" class=\"alert\""));
    free(doc);
    /* a program-wide warning does */
    assert_int_equal(corax_findings_add(&f->findings, CORAX_WARNING, "program-conventions",
                                        "log.csv", 0, NULL, NAN, "the log reads as if ..."),
                     CORAX_OK);
    assert_int_equal(corax_findings_sort(&f->findings), CORAX_OK);
    doc = write_page(&f->in, "report-counts-alert.html");
    size_t wide = at(doc, "<section id=\"program-wide\" class=\"alert\">");
    assert_true(wide < at(doc, "the log reads as if ...") &&
                at(doc, "the log reads as if ...") < at(doc, "<section id=\"summary\">"));
    free(doc);
    free_fixture(f);
}

/* A hole's net shades and contours the density of 20 poles or more; below
 * that it draws the poles alone and says why. */
static void test_net_contours_need_twenty_poles(void **state)
{
    (void)state;
    for (int many = 0; many < 2; many++) {
        fixture *f = make_fixture();
        for (int k = 0; k < (many ? 19 : 10); k++) /* DH10 has one already */
            add_reading(f, "DH10", 5 + 5 * k, 50 + k % 7, 280 + 3 * k, "bedding");
        fixture_log(f);
        report_model m;
        assert_int_equal(corax_report_model_build(&m, &f->in), CORAX_OK);
        assert_string_equal(m.hole[3].name, "DH10");
        report_readings rr;
        assert_int_equal(corax_report_readings(&m, &m.hole[3], &rr), CORAX_OK);
        report_net_counts c;
        corax_svg *svg;
        assert_int_equal(corax_report_net(&m, &m.hole[3], &rr, 4, &c, &svg), CORAX_OK);
        corax_report_readings_free(&rr);
        assert_int_equal(c.poles, many ? 20 : 11);
        assert_int_equal(c.contoured, many);
        corax_svg_free(svg);
        corax_report_model_free(&m);
        char *doc = write_page(&f->in, "report-contours.html");
        size_t part = at(doc, "<h3>DH10</h3>");
        if (many)
            at(doc + part, "lines hollow), shaded by their density.");
        else
            at(doc + part, "No density contours: 11 poles are too few to contour (it takes 20).");
        free(doc);
        free_fixture(f);
    }
}

/* Readings in a hole within 5 degrees of vertical cannot be placed: no
 * orientation line can be marked there, and the caption says so rather
 * than blaming their values. */
static void test_too_steep_to_place(void **state)
{
    (void)state;
    fixture *f = make_fixture();
    assert_int_equal(corax_program_add(f->program, hole("V1", 1200, 2000, 90, 88, 60, 1, 1)),
                     CORAX_OK);
    add_reading(f, "V1", 20, 40, 100, "bedding");
    add_reading(f, "V1", 25, 45, 120, "bedding");
    add_reading(f, "V1", 30, 90, 0, "bedding"); /* square to the core: placed all the same */
    fixture_log(f);
    char *doc = write_page(&f->in, "report-steep.html");
    size_t part = at(doc, "<h3>V1</h3>");
    at(doc + part, "2 readings could not be oriented (a dip at most): the hole is within 5 "
                   "degrees of vertical there, too steep for an orientation line to be marked.");
    assert_true(strstr(doc + part, "their values make no plane or line") == NULL ||
                at(doc + part, "their values make no plane or line") > at(doc + part, "</article>"));
    free(doc);
    free_fixture(f);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_page_holds_everything_escaped),
        cmocka_unit_test(test_flagged_readings_picked_out),
        cmocka_unit_test(test_strip_to_scale),
        cmocka_unit_test(test_section_along_the_spread),
        cmocka_unit_test(test_names_keep_off_the_paths),
        cmocka_unit_test(test_large_hole_thinned),
        cmocka_unit_test(test_many_holes_keep_to_the_budget),
        cmocka_unit_test(test_empty_program),
        cmocka_unit_test(test_failed_write_leaves_nothing),
        cmocka_unit_test(test_program_first_and_holes_counted),
        cmocka_unit_test(test_net_contours_need_twenty_poles),
        cmocka_unit_test(test_too_steep_to_place),
    };
    return cmocka_run_group_tests_name("report", tests, NULL, NULL);
}
