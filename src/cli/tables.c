/* cli: each input table's settings (delimiter, decimal mark, units, dip
 * convention, header names), from the project file's table sections and the
 * options, and the record of how each table was read. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

static const char *const table_names[CLI_NTABLES] = {"collars", "surveys", "structures", "runs",
                                                     "converted", "depths"};

const char *cli_table_name(cli_table_id id)
{
    return (unsigned)id < CLI_NTABLES ? table_names[id] : "table";
}

int cli_table_section(const char *section)
{
    for (int i = 0; i < CLI_DEPTHS; i++) /* the depths table has no section */
        if (strcmp(section, table_names[i]) == 0)
            return i;
    return -1;
}

/* The first of own and fallback that is set, else dflt. */
static int pick(int own, int fallback, int dflt)
{
    return own != CLI_UNSET ? own : fallback != CLI_UNSET ? fallback : dflt;
}

corax_table_settings cli_table_settings(const cli_common *c, cli_table_id id)
{
    const cli_table *t = &c->table[id];
    corax_table_settings s = corax_table_settings_default();
    /* corax writes converted tables in a format of its own, found on reading:
     * the input tables' defaults do not hold for them, the command line does */
    int defaults = id != CLI_CONVERTED || c->format_from_options;
    s.format.delimiter = (char)pick(t->delimiter, defaults ? c->all.delimiter : CLI_UNSET, 0);
    s.format.decimal = (char)pick(t->decimal, defaults ? c->all.decimal : CLI_UNSET,
                                  id == CLI_CONVERTED ? CORAX_DECIMAL_EITHER : 0);
    if (id == CLI_CONVERTED && s.format.decimal == 0)
        s.format.decimal = CORAX_DECIMAL_EITHER;
    s.unit = pick(t->units, id == CLI_CONVERTED ? CLI_UNSET : c->all.units, 0) ? CORAX_FOOT : 1.0;
    s.columns = id == CLI_CONVERTED ? t->columns : t->merged ? t->merged : c->all.columns;
    return s;
}

corax_dip_convention cli_table_dip(const cli_common *c, cli_table_id id)
{
    return (corax_dip_convention)pick(c->table[id].dip, c->all.dip, CORAX_DIP_NEGATIVE_DOWN);
}

cli_interval cli_interval_depth(const cli_common *c)
{
    return (cli_interval)pick(c->table[CLI_STRUCTURES].interval_depth, c->all.interval_depth,
                              CLI_INTERVAL_MID);
}

int cli_table_key(cli_common *c, cli_table_id id, const char *key, const char *value, char *why,
                  size_t wl)
{
    cli_table *t = &c->table[id];
    if (strcmp(key, "path") == 0) {
        if (id == CLI_CONVERTED) {
            snprintf(why, wl, "converted tables are named on the command line, not by path");
            return -1;
        }
        return 1;
    }
    if (strcmp(key, "delimiter") == 0)
        return cli_value_delimiter(value, &t->delimiter, why, wl);
    if (strcmp(key, "decimal_mark") == 0)
        return cli_value_decimal(value, &t->decimal, why, wl);
    if (strcmp(key, "units") == 0)
        return cli_value_units(value, &t->units, why, wl);
    if (strcmp(key, "dip_convention") == 0) {
        if (id != CLI_COLLARS && id != CLI_SURVEYS) {
            snprintf(why, wl, "only collars and surveys have a dip convention");
            return -1;
        }
        return cli_value_dip(value, &t->dip, why, wl);
    }
    if (strcmp(key, "interval_depth") == 0) {
        static const char *const names[] = {"mid", "from", "to"};
        if (id != CLI_STRUCTURES) {
            snprintf(why, wl, "only a core log ([structures]) places readings in intervals");
            return -1;
        }
        return cli_value_choice(value, names, 3, &t->interval_depth, why, wl);
    }
    if (!corax_column_known(key)) {
        snprintf(why, wl, "not a setting (path, delimiter, decimal_mark, units%s) or a column "
                 "corax knows (corax help columns)",
                 id == CLI_COLLARS || id == CLI_SURVEYS ? ", dip_convention"
                 : id == CLI_STRUCTURES                 ? ", interval_depth"
                                                        : "");
        return -1;
    }
    char spec[600];
    corax_error err;
    corax_error_clear(&err);
    snprintf(spec, sizeof spec, "%s=%s", key, value);
    if (corax_column_map_add(&t->columns, spec, &err) != CORAX_OK) {
        snprintf(why, wl, "%s", err.message);
        return -1;
    }
    return 0;
}

/* ---- reading core logs ---- */

int cli_log_option(cli_common *c, cli_log_options *l, int opt, const char *arg, char *why,
                   size_t wl)
{
    corax_codes **codes = opt == OPT_KIND_CODES         ? &l->kind_codes
                          : opt == OPT_CONFIDENCE_CODES ? &l->confidence_codes
                                                        : NULL;
    if (opt == OPT_INTERVAL_DEPTH)
        return cli_table_key(c, CLI_STRUCTURES, "interval_depth", arg, why, wl) ? -1 : 1;
    if (!codes)
        return 0;
    corax_error err;
    corax_error_clear(&err);
    if (corax_codes_add(codes, arg, &err) != CORAX_OK) {
        snprintf(why, wl, "%s", err.message[0] ? err.message : "out of memory");
        return -1;
    }
    return 1;
}

void cli_log_options_free(cli_log_options *l)
{
    corax_codes_free(l->kind_codes);
    corax_codes_free(l->confidence_codes);
    l->kind_codes = l->confidence_codes = NULL;
}
