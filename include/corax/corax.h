/* corax: oriented drill core, from survey to structure. The whole public API. */
#ifndef CORAX_H
#define CORAX_H

#define CORAX_VERSION "0.1.0"

#include "corax/codes.h"
#include "corax/contour.h"
#include "corax/convert.h"
#include "corax/core.h"
#include "corax/correction.h"
#include "corax/crs.h"
#include "corax/export.h"
#include "corax/finding.h"
#include "corax/geometry.h"
#include "corax/gis.h"
#include "corax/interval.h"
#include "corax/load.h"
#include "corax/magnetic.h"
#include "corax/output.h"
#include "corax/plan.h"
#include "corax/project.h"
#include "corax/projection.h"
#include "corax/qa.h"
#include "corax/report.h"
#include "corax/section.h"
#include "corax/section_drawing.h"
#include "corax/solve.h"
#include "corax/stats.h"
#include "corax/status.h"
#include "corax/stereonet.h"
#include "corax/structure.h"
#include "corax/survey.h"
#include "corax/svg.h"
#include "corax/table.h"
#include "corax/uncertainty.h"
#include "corax/vtk.h"

#endif
