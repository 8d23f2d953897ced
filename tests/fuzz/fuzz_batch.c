/* fuzz_batch.c - libFuzzer target for the batch path of every command:
 * the input becomes a CSV file given to `coaxline COMMAND --input`.  The
 * CLI's main() is compiled in as coaxline_main (see Makefile.am). */
#include <config.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

int coaxline_main(int argc, char **argv);

static const char *const commands[] = { "cut", "loss" };

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc; (void)argv;
    /* run with -close_fd_mask=2 to silence the CLI's error lines: libFuzzer
     * keeps its own reports on a duplicate of stderr */
    if (!freopen("/dev/null", "w", stdout)) abort();
    return 0;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char path[] = "/tmp/coaxline-fuzz-XXXXXX";
    int fd = mkstemp(path);
    if (fd < 0) return 0;
    if (write(fd, data, size) != (ssize_t)size) { close(fd); unlink(path); return 0; }
    close(fd);
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
