/* failstream.h - a read stream that fails: the given text, then EIO after
 * a number of bytes (or endless bytes of one value), for the library
 * suites that check read errors are reported.  glibc's fopencookie. */
#ifndef COAXLINE_FAILSTREAM_H
#define COAXLINE_FAILSTREAM_H

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/types.h>

typedef struct failstream {
    const char *text;
    size_t size, pos, fail_at;
} failstream;

static ssize_t failstream_read(void *cookie, char *buf, size_t size)
{
    failstream *f = cookie;
    if (f->pos >= f->fail_at) {
        errno = EIO;
        return -1;
    }
    size_t n = f->fail_at - f->pos;
    if (n > size) n = size;
    if (n > 1000) n = 1000; /* short reads, as a pipe gives them */
    for (size_t i = 0; i < n; i++)
        buf[i] = f->pos + i < f->size ? f->text[f->pos + i] : 'x';
    f->pos += n;
    return (ssize_t)n;
}

static int failstream_close(void *cookie)
{
    free(cookie);
    return 0;
}

/* text, then (if fail_at > strlen(text)) 'x' bytes, then EIO once
 * fail_at bytes have been delivered. */
static FILE *failstream_open(const char *text, size_t fail_at)
{
    failstream *f = calloc(1, sizeof *f);
    if (!f) return NULL;
    f->text = text;
    f->size = strlen(text);
    f->fail_at = fail_at;
    cookie_io_functions_t io = { failstream_read, NULL, NULL, failstream_close };
    FILE *fp = fopencookie(f, "r", io);
    if (!fp) free(f);
    return fp;
}

#endif
