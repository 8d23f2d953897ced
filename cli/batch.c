/* batch.c - option parsing and the --input batch driver shared by every
 * command. */
#include <config.h>
#include <errno.h>
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "cli.h"

enum { OPT_FORMAT = 1000, OPT_UNITS, OPT_INPUT, OPT_CABLES, OPT_CABLE_LOSS, OPT_HELP };

static const cli_optdef common_opts[] = {
    { "format", "text|csv|json", "output format (default text)", 0 },
    { "units", "metric|imperial", "bare lengths and text output (default metric)", 0 },
    { "input", "FILE|-", "run once per row of a CSV whose header names the options", 0 },
    { "cables", "FILE", "user cables (CSV, same columns as data/cables.csv)", 0 },
    { "cable-loss", "FILE", "user attenuation points (CSV, as data/cable_loss.csv)", 0 },
    { "help", NULL, "show this help", 0 },
    { NULL, NULL, NULL, 0 }
};

void cli_print_command_help(const cli_command *cmd, FILE *fp)
{
    fprintf(fp, "usage: coaxline %s %s\n%s\n\noptions:\n", cmd->name, cmd->synopsis,
            cmd->summary);
    for (int pass = 0; pass < 2; pass++) {
        const cli_optdef *o = pass ? common_opts : cmd->opts;
        for (; o->name; o++) {
            if (pass && !cmd->batch && strcmp(o->name, "input") == 0) continue;
            char left[64];
            snprintf(left, sizeof left, "--%s%s%s", o->name, o->arg ? " " : "",
                     o->arg ? o->arg : "");
            fprintf(fp, "  %-28s %s%s\n", left, o->help, o->repeat ? " (repeatable)" : "");
        }
    }
    fprintf(fp, "\nSee coaxline(1) for details.\n");
}

static int worse(int a, int b)
{
    if (a == CLI_EXIT_USAGE || b == CLI_EXIT_USAGE) return CLI_EXIT_USAGE;
    return a > b ? a : b;
}

/* ASCII-only, so a Turkish locale's dotless i cannot change a match. */
static int ascii_caseeq(const char *a, const char *b, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        char x = a[i], y = b[i];
        if (x >= 'A' && x <= 'Z') x = (char)(x - 'A' + 'a');
        if (y >= 'A' && y <= 'Z') y = (char)(y - 'A' + 'a');
        if (x != y) return 0;
    }
    return 1;
}

static int header_index(const cli_command *cmd, const char *name)
{
    while (*name == ' ') name++;
    size_t len = strlen(name);
    while (len > 0 && name[len - 1] == ' ') len--;
    for (int i = 0; cmd->opts[i].name; i++)
        if (strlen(cmd->opts[i].name) == len && ascii_caseeq(cmd->opts[i].name, name, len))
            return i;
    return -1;
}

static void list_columns(const cli_command *cmd, char *buf, size_t size)
{
    size_t used = 0;
    buf[0] = '\0';
    for (int i = 0; cmd->opts[i].name && used + 2 < size; i++) {
        int w = snprintf(buf + used, size - used, "%s%s", i ? "," : "", cmd->opts[i].name);
        if (w < 0) break;
        used += (size_t)w;
    }
}

static int run_batch(cli_ctx *ctx, cli_args *args, const char *path)
{
    const cli_command *cmd = ctx->cmd;
    FILE *fp = strcmp(path, "-") == 0 ? stdin : fopen(path, "rb");
    if (!fp)
        return cli_error(ctx, "input", "a readable CSV file, or - for standard input",
                         "cannot open '%s': %s", path, strerror(errno));
    cxl_csv_reader *rd = NULL;
    if (cxl_csv_reader_new_stream(fp, &rd) != CXL_OK) {
        if (fp != stdin) fclose(fp);
        return cli_error(ctx, "input", NULL, "out of memory");
    }
    int code = CLI_EXIT_OK, has_row = 0, ncols = 0;
    int col_opt[CLI_MAX_OPTS];
    char columns[512];
    list_columns(cmd, columns, sizeof columns);
    char expected_header[600];
    snprintf(expected_header, sizeof expected_header, "a header row naming options, from: %s",
             columns);
    cxl_status st = cxl_csv_reader_next(rd, &has_row);
    ctx->input_name = strcmp(path, "-") == 0 ? "stdin" : path;
    ctx->line = cxl_csv_reader_line(rd);
    if (st != CXL_OK || !has_row) {
        code = cli_error(ctx, "input", expected_header,
                         st != CXL_OK ? "the header row is malformed" : "the file is empty");
        goto done;
    }
    size_t nf = cxl_csv_reader_nfields(rd);
    if (nf > CLI_MAX_OPTS) {
        code = cli_error(ctx, "input", expected_header, "the header has %zu columns", nf);
        goto done;
    }
    for (size_t i = 0; i < nf; i++) {
        const char *name = cxl_csv_reader_field(rd, i);
        int k = header_index(cmd, name);
        if (k < 0) {
            code = cli_error(ctx, "input", expected_header, "unknown column '%s'", name);
            goto done;
        }
        for (size_t j = 0; j < i; j++)
            if (col_opt[j] == k) {
                code = cli_error(ctx, "input", expected_header,
                                 "column '%s' appears twice", name);
                goto done;
            }
        col_opt[i] = k;
    }
    ncols = (int)nf;
    const char *row[CLI_MAX_OPTS];
    args->row = row;
    size_t rows = 0;
    for (;;) {
        st = cxl_csv_reader_next(rd, &has_row);
        ctx->line = cxl_csv_reader_line(rd);
        if (st == CXL_ETOOLONG) {
            code = cli_error(ctx, "row", "rows shorter than 65536 bytes",
                             "the row is too long");
            rows++;
            continue;
        }
        if (st != CXL_OK) {
            code = cli_error(ctx, "row", "RFC 4180 CSV: quotes closed before the next comma, no NUL bytes",
                             "malformed CSV (unbalanced quote, text after a closing quote or a NUL byte)");
            rows++;
            continue;
        }
        if (!has_row) break;
        rows++;
        nf = cxl_csv_reader_nfields(rd);
        if (nf != (size_t)ncols) {
            code = cli_error(ctx, "row", "one cell per header column; leave a cell empty to use the default",
                             "has %zu fields but the header has %d", nf, ncols);
            continue;
        }
        for (int i = 0; i < CLI_MAX_OPTS; i++) row[i] = NULL;
        for (int i = 0; i < ncols; i++) row[col_opt[i]] = cxl_csv_reader_field(rd, (size_t)i);
        code = worse(code, cmd->run(ctx, args));
    }
    if (rows == 0) {
        ctx->line = 0;
        ctx->input_name = NULL;
        code = cli_error(ctx, "input", "one data row per piece under the header",
                         "'%s' has a header but no data rows", path);
    }
done:
    args->row = NULL;
    cxl_csv_reader_free(rd);
    if (fp != stdin) fclose(fp);
    ctx->input_name = NULL;
    return code;
}

int cli_run_command(const cli_command *cmd, int argc, char **argv)
{
    static cli_args args; /* large; one per process */
    struct option longopts[CLI_MAX_OPTS + 8];
    int n = 0;
    memset(&args, 0, sizeof args);
    args.cmd = cmd;
    cli_ctx ctx = { .cmd = cmd, .format = CLI_TEXT, .units = CXL_UNITS_METRIC, .out = stdout };
    for (; cmd->opts[n].name; n++) {
        longopts[n] = (struct option){ cmd->opts[n].name,
                                       cmd->opts[n].arg ? required_argument : no_argument,
                                       NULL, n };
    }
    int nc = 0;
    for (const cli_optdef *o = common_opts; o->name; o++, nc++)
        longopts[n + nc] = (struct option){ o->name, o->arg ? required_argument : no_argument,
                                            NULL, OPT_FORMAT + nc };
    longopts[n + nc] = (struct option){ NULL, 0, NULL, 0 };

    const char *format = NULL, *units = NULL, *input = NULL;
    int help = 0, c;
    unsigned common_seen = 0; /* a common option given twice is an error, as for others */
    opterr = 0;
    optind = 0; /* glibc: full reset, so the driver can run more than once per process */
    while ((c = getopt_long(argc, argv, ":", longopts, NULL)) != -1) {
        if (c == ':')
            return cli_error(&ctx, NULL, "a value after it, such as --vf 0.66",
                             "option '%s' needs a value", argv[optind - 1]);
        if (c == '?')
            return cli_error(&ctx, NULL, "an option listed by coaxline COMMAND --help",
                             "unknown option '%s'", argv[optind - 1]);
        if (c >= OPT_FORMAT && c < OPT_HELP) {
            unsigned bit = 1u << (c - OPT_FORMAT);
            if (common_seen & bit)
                return cli_error(&ctx, common_opts[c - OPT_FORMAT].name, "it once",
                                 "given more than once");
            common_seen |= bit;
        }
        if (c == OPT_FORMAT) format = optarg;
        else if (c == OPT_UNITS) units = optarg;
        else if (c == OPT_INPUT) input = optarg;
        else if (c == OPT_CABLES) ctx.cables_path = optarg;
        else if (c == OPT_CABLE_LOSS) ctx.loss_path = optarg;
        else if (c == OPT_HELP) help = 1;
        else if (c >= 0 && c < n) {
            if (args.nval[c] > 0 && !cmd->opts[c].repeat)
                return cli_error(&ctx, cmd->opts[c].name, "it once",
                                 "given more than once");
            if (args.nval[c] == CLI_MAX_REPEAT)
                return cli_error(&ctx, cmd->opts[c].name, "at most 32 values",
                                 "given too many times");
            args.val[c][args.nval[c]++] = cmd->opts[c].arg ? optarg : "1";
        }
    }
    if (help) {
        cli_print_command_help(cmd, stdout);
        return CLI_EXIT_OK;
    }
    if (optind < argc && cmd->positional && optind + 1 == argc) {
        int k = 0;
        while (cmd->opts[k].name && strcmp(cmd->opts[k].name, cmd->positional) != 0) k++;
        if (cmd->opts[k].name && args.nval[k] == 0) {
            args.val[k][args.nval[k]++] = argv[optind];
            optind++;
        }
    }
    if (optind < argc)
        return cli_error(&ctx, NULL, "options only, such as --offset 10m",
                         "unexpected argument '%s'", argv[optind]);
    if (format) {
        if (strcmp(format, "text") == 0) ctx.format = CLI_TEXT;
        else if (strcmp(format, "csv") == 0) ctx.format = CLI_CSV;
        else if (strcmp(format, "json") == 0) ctx.format = CLI_JSON;
        else return cli_error(&ctx, "format", "text, csv or json", "unknown format '%s'", format);
    }
    if (units) {
        if (strcmp(units, "metric") == 0) ctx.units = CXL_UNITS_METRIC;
        else if (strcmp(units, "imperial") == 0) ctx.units = CXL_UNITS_IMPERIAL;
        else return cli_error(&ctx, "units", "metric or imperial", "unknown units '%s'", units);
    }
    if (input && !cmd->batch)
        return cli_error(&ctx, "input", "the command without --input",
                         "the %s command does not take a batch file", cmd->name);

    /* files named on the command line are read (and checked) even when no
     * row ends up needing the catalog */
    if ((ctx.cables_path || ctx.loss_path) && !cli_catalog(&ctx)) return CLI_EXIT_USAGE;

    if (cmd->begin) cmd->begin(&ctx);
    int code = input ? run_batch(&ctx, &args, input) : cmd->run(&ctx, &args);
    if (cmd->end) code = worse(code, cmd->end(&ctx));
    cli_table_close(&ctx);
    cxl_catalog_free(ctx.catalog);
    cxl_bands_free(ctx.bands);
    if (fflush(stdout) != 0 || ferror(stdout)) {
        fprintf(stderr, "coaxline: %s: output: write failed\n", cmd->name);
        return CLI_EXIT_USAGE;
    }
    return code;
}
