/* Fuzzing harness: one command run in-process on fuzzed tables and project
 * files. Built once per command (FUZZ_COMMAND names it: trace, convert,
 * check, stereonet, section, export, plan, solve, merge). The input: byte 0 picks one of
 * the command's argument lines, byte 1 where the main output goes and
 * which output operation fails (see run.c), and the rest, split at 0x1e,
 * fills the command's files in order (tests/fuzz/commands.c). */
#include <string.h>

#include "fuzz.h"

#ifndef FUZZ_COMMAND
#error "FUZZ_COMMAND names the command to fuzz"
#endif

static const fuzz_cmd *command;

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc;
    (void)argv;
    for (size_t i = 0; i < fuzz_ncommands; i++)
        if (strcmp(fuzz_commands[i].name, FUZZ_COMMAND) == 0)
            command = &fuzz_commands[i];
    if (!command)
        fuzz_fail("no command '%s'", FUZZ_COMMAND);
    fuzz_setup();
    return 0;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    fuzz_run_command(command, data, size);
    return 0;
}
