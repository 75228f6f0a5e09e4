/* The order of hole names (internal to the library): as text, but with runs
 * of digits compared as numbers, so that DH2 comes before DH10. The order
 * corax_findings_sort() puts holes in; the report lists holes the same way. */
#ifndef CORAX_ORDER_H
#define CORAX_ORDER_H

/* Below, at or above 0 as a comes before, with or after b. Names that differ
 * only in leading zeros (DH01, DH1) compare equal. */
int corax_hole_name_cmp(const char *a, const char *b);

#endif
