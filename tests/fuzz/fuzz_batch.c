/* fuzz_batch.c - libFuzzer target for the batch path of every command:
 * the input becomes a CSV file given to `coaxline COMMAND --input`, for
 * each command that takes one.  The CLI's main() is compiled in as
 * coaxline_main (see Makefile.am).
 *
 * Columns that name files (plot and sweep-plot write one, vf-from, sweep,
 * layout and as-built read one) are defused before the run: a fuzzed row
 * must not write files anywhere or read a device that never ends. */
#include <config.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <unistd.h>

int coaxline_main(int argc, char **argv);

static const char *const commands[] = {
    "cut", "vf", "trim", "phase", "pair", "loss", "pattern", "budget", "hybrid", "array",
};

/* A column name is matched without regard to case and after trimming
 * blanks, so any byte run that spells one of these words (in any case)
 * is changed into a column no command knows. */
static void defuse(uint8_t *p, size_t n)
{
    static const char *const words[] = { "plot", "vf-from", "sweep", "layout", "as-built" };
    for (size_t w = 0; w < sizeof words / sizeof words[0]; w++) {
        size_t len = strlen(words[w]);
        for (size_t i = 0; i + len <= n; i++)
            if (strncasecmp((const char *)p + i, words[w], len) == 0) p[i + 1] = '#';
    }
}

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc; (void)argv;
    /* run with -close_fd_mask=2 to silence the CLI's error lines: libFuzzer
     * keeps its own reports on a duplicate of stderr */
    if (!freopen("/dev/null", "w", stdout)) abort();
    /* nothing a row names may wait on a terminal */
    if (!freopen("/dev/null", "r", stdin)) abort();
    return 0;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char path[] = "/tmp/coaxline-fuzz-XXXXXX";
    uint8_t *copy = malloc(size ? size : 1);
    if (!copy) return 0;
    memcpy(copy, data, size);
    defuse(copy, size);
    int fd = mkstemp(path);
    if (fd < 0) { free(copy); return 0; }
    ssize_t put = write(fd, copy, size);
    free(copy);
    close(fd);
    if (put != (ssize_t)size) { unlink(path); return 0; }
    static const char *const formats[] = { "text", "csv", "json" };
    for (size_t c = 0; c < sizeof commands / sizeof commands[0]; c++) {
        char *argv[] = { "coaxline", (char *)commands[c], "--input", path, "--format",
                         (char *)formats[size % 3], NULL };
        int rc = coaxline_main(6, argv);
        if (rc < 0 || rc > 2) abort();
    }
    unlink(path);
    return 0;
}
