/* main.c - coaxline: dispatch to a command. */
#include <config.h>
#include <locale.h>
#include <stdio.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include "cli.h"

static const cli_command *const commands[] = {
    &cli_cmd_cut,
    &cli_cmd_vf,
    &cli_cmd_trim,
    &cli_cmd_phase,
    &cli_cmd_pair,
    &cli_cmd_bands,
    &cli_cmd_cables,
    &cli_cmd_loss,
    &cli_cmd_pattern,
    &cli_cmd_array,
    &cli_cmd_harness,
    &cli_cmd_yield,
    &cli_cmd_budget,
    &cli_cmd_hybrid,
    &cli_cmd_sweep,
    &cli_cmd_fault,
    &cli_cmd_demo,
};
#define NCOMMANDS (sizeof commands / sizeof commands[0])

static void usage(FILE *fp)
{
    fprintf(fp, "usage: coaxline COMMAND [OPTIONS]\n"
                "Feedline and delay-line calculations for phased receiving arrays.\n\n"
                "commands:\n");
    for (size_t i = 0; i < NCOMMANDS; i++)
        fprintf(fp, "  %-10s %s\n", commands[i]->name, commands[i]->summary);
    fprintf(fp, "\n  coaxline COMMAND --help   options of one command\n"
                "  coaxline --version        version of the tool and library\n"
                "\nSee coaxline(1).\n");
}

/* Standard output written and closed, or one line on stderr and exit 2:
 * a full disk must not pass for success. */
static int finish(int code)
{
    int bad = fflush(stdout) != 0 || ferror(stdout);
    if (fclose(stdout) != 0) bad = 1;
    if (bad && code != CLI_EXIT_USAGE) {
        fprintf(stderr, "coaxline: output: write failed\n");
        return CLI_EXIT_USAGE;
    }
    return code;
}

int main(int argc, char **argv)
{
    /* Usage and version first: their bytes need no locale, and loading
     * one (a file a category) is most of a short run's system calls. */
    if (argc < 2) {
        usage(stderr);
        return CLI_EXIT_USAGE;
    }
    if (strcmp(argv[1], "--help") == 0 || strcmp(argv[1], "-h") == 0 ||
        strcmp(argv[1], "help") == 0) {
        usage(stdout);
        return finish(CLI_EXIT_OK);
    }
    if (strcmp(argv[1], "--version") == 0) {
        printf("coaxline %s (libcoaxline %s)\n", PACKAGE_VERSION, cxl_version());
        return finish(CLI_EXIT_OK);
    }
    /* The user's locale may use a comma decimal mark: the library's
     * number I/O ignores it, so output is the same bytes everywhere. */
    setlocale(LC_ALL, "");
    /* This process owns GSL's error handler: statuses, never abort(). */
    gsl_set_error_handler_off();
    if (strcmp(argv[1], "--generate") == 0 && argc == 3) /* build and test tool */
        return finish(cli_generate(argv[2], commands, NCOMMANDS, stdout));
    for (size_t i = 0; i < NCOMMANDS; i++)
        if (strcmp(argv[1], commands[i]->name) == 0)
            return finish(cli_run_command(commands[i], argc - 1, argv + 1));
    fprintf(stderr, "coaxline: unknown command '%s' (expected one of:", argv[1]);
    for (size_t i = 0; i < NCOMMANDS; i++) fprintf(stderr, " %s", commands[i]->name);
    fprintf(stderr, "; see coaxline --help)\n");
    return CLI_EXIT_USAGE;
}
