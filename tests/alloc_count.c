/* alloc_count.c - a preload module for tests/alloc_rows.sh: counts the
 * calls of malloc, calloc and realloc a coaxline process makes and, at
 * exit, writes the count to the file named by ALLOC_COUNT_FILE.  Only the
 * coaxline binary itself writes (not the shell of libtool's wrapper).
 * Built as a libtool module for the tests only, never installed. */
#include <errno.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* glibc's own entry points, so that no dlsym is needed */
extern void *__libc_malloc(size_t size);
extern void *__libc_calloc(size_t n, size_t size);
extern void *__libc_realloc(void *p, size_t size);

static unsigned long count;

void *malloc(size_t size)
{
    count++;
    return __libc_malloc(size);
}

void *calloc(size_t n, size_t size)
{
    count++;
    return __libc_calloc(n, size);
}

void *realloc(void *p, size_t size)
{
    count++;
    return __libc_realloc(p, size);
}

static int is_coaxline(void)
{
    FILE *fp = fopen("/proc/self/comm", "r");
    char name[64] = "";
    if (!fp) return 0;
    if (!fgets(name, sizeof name, fp)) name[0] = '\0';
    fclose(fp);
    name[strcspn(name, "\n")] = '\0';
    return strcmp(name, "coaxline") == 0 || strcmp(name, "lt-coaxline") == 0;
}

__attribute__((destructor)) static void report(void)
{
    const char *path = getenv("ALLOC_COUNT_FILE");
    unsigned long n = count; /* before fopen's own allocations */
    if (!path || !is_coaxline()) return;
    FILE *fp = fopen(path, "w");
    if (!fp) return;
    fprintf(fp, "%lu\n", n);
    fclose(fp);
}
