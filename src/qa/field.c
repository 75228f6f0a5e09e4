/* qa: the magnetic field a survey measured, against the magnetic model's. */
#include <math.h>
#include <stdio.h>

#include "qa/qa_int.h"

/* One station: a warning when its field departs beyond the tolerances. */
static corax_status check_station(const corax_station_record *r, const char *file,
                                  const corax_qa_options *o, corax_findings *out)
{
    const corax_magnetic_field *m = &r->correction.field;
    double df = r->total_field - m->total, dd = r->field_dip - m->inclination;
    int bad_total = fabs(df) > o->total_field, bad_dip = fabs(dd) > o->field_dip;
    if (!bad_total && !bad_dip)
        return CORAX_OK;
    char what[240] = "";
    int n = 0;
    if (bad_total)
        n = snprintf(what, sizeof what, "a total field of %.0f nT, %.0f %s %s's %.0f (tolerance "
                     "%.0f)", r->total_field, fabs(df), df > 0 ? "above" : "below", m->model,
                     m->total, o->total_field);
    if (bad_dip)
        snprintf(what + n, sizeof what - (size_t)n, "%sa dip of the field of %.2f, %.2f degrees "
                 "%s %s's %.2f (tolerance %.2f)", bad_total ? ", and " : "",
                 corax_deg(r->field_dip), fabs(corax_deg(dd)), dd > 0 ? "above" : "below",
                 m->model, corax_deg(m->inclination), corax_deg(o->field_dip));
    return corax_findings_add(out, CORAX_WARNING, "survey-field", file, r->line, r->hole,
                              r->depth, "the station at %.1f m measured %s: magnetic rock, steel "
                              "nearby or a faulty tool? its azimuth is doubtful", r->depth, what);
}

corax_status corax_qa_field(const corax_corrections *stations, const char *file,
                            const corax_qa_options *o, corax_findings *out)
{
    size_t unmodelled = 0;
    for (size_t i = 0; i < stations->count; i++) {
        const corax_station_record *r = &stations->item[i];
        if ((isnan(r->total_field) && isnan(r->field_dip)) || !qa_in_shard(o, r->hole))
            continue;
        if (!r->correction.field.model) { /* no model, or a station not read magnetically */
            unmodelled += r->correction.north == CORAX_NORTH_MAGNETIC;
            continue;
        }
        corax_status st = check_station(r, file, o, out);
        if (st != CORAX_OK)
            return st;
    }
    if (unmodelled == 0 || o->shards > 1) /* a note about no hole: the whole program's */
        return CORAX_OK;
    return corax_findings_add(out, CORAX_NOTE, "survey-field", file, 0, NULL, NAN,
                              "%zu station%s measured the magnetic field, but there is no "
                              "magnetic model to compare %s with (declination = model)",
                              unmodelled, unmodelled == 1 ? "" : "s",
                              unmodelled == 1 ? "it" : "them");
}
