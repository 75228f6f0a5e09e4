/* The VTK export over structures kept in a spool (internal to the library:
 * the export job, which reads more structures than it should hold). */
#ifndef CORAX_EXPORT_INT_H
#define CORAX_EXPORT_INT_H

#include "corax/export.h"
#include "io/spool.h"

/* corax_export_vtk() over the corax_export_structure records of a spool
 * (read back once per block of the file): memory does not grow with their
 * number. CORAX_EIO (err says) also when the spool could not be read. */
corax_status corax_export_vtk_spooled(corax_outputs *set, const char *path,
                                      const corax_program *program, corax_spool *spool,
                                      const corax_export_options *options,
                                      corax_export_counts *counts, corax_error *err);

#endif
