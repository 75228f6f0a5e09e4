/* Test helper for the render tests: how many distinct colours a PNG holds,
 * what share of its pixels differ from the most common one, and how many
 * pixels are exactly each colour asked about.
 * usage: png_colours FILE.png [#rrggbb...]
 *        ->  "WIDTH HEIGHT COLOURS INKED_PERCENT [PIXELS...]" */
#include <png.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int cmp(const void *a, const void *b)
{
    unsigned x = *(const unsigned *)a, y = *(const unsigned *)b;
    return x < y ? -1 : x > y;
}

int main(int argc, char **argv)
{
    png_image img;
    memset(&img, 0, sizeof img);
    img.version = PNG_IMAGE_VERSION;
    if (argc < 2 || !png_image_begin_read_from_file(&img, argv[1])) {
        fprintf(stderr, "png_colours: cannot read %s\n", argc > 1 ? argv[1] : "(none)");
        return 1;
    }
    img.format = PNG_FORMAT_RGBA;
    size_t n = (size_t)img.width * img.height;
    unsigned *px = malloc(n * sizeof *px);
    if (!px || !png_image_finish_read(&img, NULL, px, 0, NULL)) {
        fprintf(stderr, "png_colours: cannot decode %s\n", argv[1]);
        return 1;
    }
    unsigned *sorted = malloc(n * sizeof *sorted);
    if (!sorted)
        return 1;
    memcpy(sorted, px, n * sizeof *px);
    qsort(sorted, n, sizeof *sorted, cmp);
    size_t colours = 0, best = 0;
    for (size_t i = 0, run = 0; i < n; i++) {
        run = i && sorted[i] == sorted[i - 1] ? run + 1 : 1;
        colours += run == 1;
        best = run > best ? run : best;
    }
    printf("%u %u %zu %.1f", img.width, img.height, colours, 100.0 * (double)(n - best) / (double)n);
    for (int a = 2; a < argc; a++) {
        unsigned r, g, b;
        size_t hits = 0;
        if (sscanf(argv[a], "#%2x%2x%2x", &r, &g, &b) != 3) {
            fprintf(stderr, "png_colours: not a colour: %s\n", argv[a]);
            return 1;
        }
        for (size_t i = 0; i < n; i++) { /* RGBA bytes in memory order */
            const unsigned char *p = (const unsigned char *)&px[i];
            hits += p[0] == r && p[1] == g && p[2] == b;
        }
        printf(" %zu", hits);
    }
    printf("\n");
    free(px);
    free(sorted);
    return 0;
}
