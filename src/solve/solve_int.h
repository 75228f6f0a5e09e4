/* The solve module's shared pieces (internal). */
#ifndef CORAX_SOLVE_INT_H
#define CORAX_SOLVE_INT_H

#include "corax/solve.h"

/* v turned to point up (z >= 0). */
corax_vec3 solve_upward(corax_vec3 v);

/* The number of a hole among those seen so far (seen has room for one more),
 * adding it when new. */
size_t solve_hole_number(const corax_hole **seen, size_t *nseen, const corax_hole *hole);

#endif
