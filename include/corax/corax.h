/* corax: oriented drill core, from survey to structure. The whole public API. */
#ifndef CORAX_H
#define CORAX_H

#define CORAX_VERSION "0.1.0"

#include "corax/contour.h"
#include "corax/export.h"
#include "corax/finding.h"
#include "corax/geometry.h"
#include "corax/load.h"
#include "corax/output.h"
#include "corax/projection.h"
#include "corax/stats.h"
#include "corax/section.h"
#include "corax/section_drawing.h"
#include "corax/status.h"
#include "corax/structure.h"
#include "corax/survey.h"
#include "corax/svg.h"
#include "corax/table.h"
#include "corax/vtk.h"

#endif
