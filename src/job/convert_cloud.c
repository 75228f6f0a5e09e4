/* job: the convert job's lanes (one thread's state each) and the cloud of
 * draws (--cloud), shared by the draws in bounded memory (convert_draws.c)
 * and those of every log held in memory (convert_memory.c). */
#include <stdlib.h>
#include <string.h>

#include "job/convert_int.h"

convert_lane *convert_lanes_new(int n)
{
    convert_lane *lanes = calloc((size_t)n, sizeof *lanes);
    for (int k = 0; lanes && k < n; k++) {
        lanes[k].last_len = (size_t)-1;
        lanes[k].unknown_kind = corax_tally_new();
        lanes[k].unknown_confidence = corax_tally_new();
        lanes[k].no_line_error = corax_tally_new();
        if (!lanes[k].unknown_kind || !lanes[k].unknown_confidence || !lanes[k].no_line_error) {
            convert_lanes_free(lanes, n);
            return NULL;
        }
    }
    return lanes;
}

void convert_lanes_free(convert_lane *lanes, int n)
{
    for (int k = 0; lanes && k < n; k++) {
        free(lanes[k].field);
        corax_tally_free(lanes[k].unknown_kind);
        corax_tally_free(lanes[k].unknown_confidence);
        corax_tally_free(lanes[k].no_line_error);
    }
    free(lanes);
}

corax_writer *convert_cloud_open(const convert_run *r, corax_status *st)
{
    corax_writer *cloud = job_output(r->job, r->s->cloud, st);
    if (!cloud)
        return NULL;
    static const char *const head[] = {"hole", "depth", "draw", "dip", "dip_direction",
                                       "x", "y", "z"};
    corax_writer_format(cloud, r->s->output);
    for (size_t k = 0; k < sizeof head / sizeof *head; k++)
        corax_writer_field(cloud, head[k], strlen(head[k]));
    corax_writer_end_row(cloud);
    return cloud;
}

void convert_cloud_draw(void *user, size_t i, size_t draw, const corax_vec3 *p,
                        const corax_plane *plane)
{
    convert_cloud *c = user;
    corax_writer_field(c->w, c->hole, strlen(c->hole));
    corax_writer_number(c->w, c->readings[i].reading.depth, 3);
    corax_writer_integer(c->w, (long long)draw + 1);
    if (plane) {
        corax_writer_number(c->w, corax_deg(plane->dip), 2);
        corax_writer_azimuth(c->w, corax_deg(plane->dip_direction), 2);
    } else {
        corax_writer_field(c->w, "", 0);
        corax_writer_field(c->w, "", 0);
    }
    corax_writer_number(c->w, p->x, 3);
    corax_writer_number(c->w, p->y, 3);
    corax_writer_number(c->w, p->z, 3);
    corax_writer_end_row(c->w);
}
