/* units.c - locale-free parsing and formatting of lengths, frequencies,
 * times and plain numbers.
 *
 * Numbers are checked against a strict grammar of our own first (so "1,5",
 * "0x10", "inf" and "nan" never get in), then converted with strtod_l()
 * in the "C" locale; output comes from snprintf() with whatever radix
 * character the locale put in replaced by '.'.  Neither path reads or
 * changes the process locale, so host programs under a comma-decimal
 * locale get the same bytes.
 */
#include <config.h>
#include <errno.h>
#include <fenv.h>
#include <float.h>
#include <locale.h>
#include <math.h>
#include <pthread.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include "coaxline.h"
#include "internal.h"

#define M_PER_FT 0.3048
#define M_PER_IN 0.0254
#define NUMBER_MAX_CHARS 64

/* The "C" locale object: created once, never changed afterwards. */
static locale_t c_locale;
static pthread_once_t c_locale_once = PTHREAD_ONCE_INIT;
static void c_locale_init(void) { c_locale = newlocale(LC_ALL_MASK, "C", (locale_t)0); }

int cxl__ascii_ncaseeq(const char *a, const char *b, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        unsigned char x = (unsigned char)a[i], y = (unsigned char)b[i];
        if (x >= 'A' && x <= 'Z') x = (unsigned char)(x - 'A' + 'a');
        if (y >= 'A' && y <= 'Z') y = (unsigned char)(y - 'A' + 'a');
        if (x != y) return 0;
        if (x == '\0') return 1;
    }
    return 1;
}

static int is_digit(char c) { return c >= '0' && c <= '9'; }
static int is_space(char c) { return c == ' ' || c == '\t'; }

static size_t skip_spaces(const char *s, size_t i)
{
    while (is_space(s[i])) i++;
    return i;
}

/* Powers of ten that are exact doubles: 10^k = 2^k 5^k and 5^k < 2^53 up
 * to k = 22.  For the two fast paths below. */
static const double exact_pow10[23] = {
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
    1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22
};

/* Appends the digits at s[*i..end) to *m; fraction digits (fraction 1)
 * also count *e down by one each.  Returns 0 when m would overflow. */
static inline int accumulate_digits(const char *s, size_t *i, size_t end, uint64_t *m,
                                    int *e, int fraction)
{
    for (; *i < end && is_digit(s[*i]); (*i)++, *e -= fraction) {
        if (*m > (UINT64_MAX - 9) / 10) return 0;
        *m = *m * 10 + (uint64_t)(s[*i] - '0');
    }
    return 1;
}

/* The exponent at s[i..end), just past its 'e' or 'E': optional sign and
 * digits, as scan_unsigned checked them.  Returns 0 when it is too large
 * for any fast path. */
static inline int exponent_value(const char *s, size_t i, size_t end, int *exponent)
{
    int sign = 1, x = 0;
    if (s[i] == '+' || s[i] == '-') sign = s[i++] == '-' ? -1 : 1;
    for (; i < end; i++) {
        if (x > 1000) return 0;
        x = x * 10 + (s[i] - '0');
    }
    *exponent = sign * x;
    return 1;
}

/* Fast exact conversion of a decimal already checked by scan_unsigned,
 * s[i..end): digits, optional fraction, optional exponent.  When the
 * digits form an integer m <= 2^53 and the decimal exponent e satisfies
 * |e| <= 22, m and 10^|e| are exact doubles and one IEEE multiplication
 * or division rounds m 10^e correctly (the fast path of Clinger, "How to
 * Read Floating Point Numbers Accurately", PLDI 1990), so the result is
 * bit-identical to strtod's at a fraction of its cost (tests/bench).
 * Returns 0 to use strtod_l: other inputs, a rounding mode other than to
 * nearest, or excess-precision arithmetic, where the argument fails. */
static int decimal_fast(const char *s, size_t i, size_t end, double *value)
{
#if FLT_EVAL_METHOD == 0
    uint64_t m = 0;
    int e = 0, x = 0;
    if (!accumulate_digits(s, &i, end, &m, &e, 0)) return 0;
    if (i < end && s[i] == '.') {
        i++;
        if (!accumulate_digits(s, &i, end, &m, &e, 1)) return 0;
    }
    if (i < end && !exponent_value(s, i + 1, end, &x)) return 0;
    e += x;
    if (m > ((uint64_t)1 << 53) || e < -22 || e > 22 || fegetround() != FE_TONEAREST)
        return 0;
    *value = e < 0 ? (double)m / exact_pow10[-e] : (double)m * exact_pow10[e];
    return 1;
#else
    (void)s; (void)i; (void)end; (void)value;
    return 0;
#endif
}

/* The end of the unsigned decimal at s[i] (digits, optional fraction,
 * optional exponent), or i when it has no digits. */
static inline size_t unsigned_end(const char *s, size_t i)
{
    size_t start = i, digits = 0;
    while (is_digit(s[i])) { i++; digits++; }
    if (s[i] == '.') {
        i++;
        while (is_digit(s[i])) { i++; digits++; }
    }
    if (digits == 0) return start;
    if (s[i] == 'e' || s[i] == 'E') {
        size_t j = i + 1;
        if (s[j] == '+' || s[j] == '-') j++;
        if (is_digit(s[j])) {
            while (is_digit(s[j])) j++;
            i = j;
        }
    }
    return i;
}

/* strtod_l on the n < NUMBER_MAX_CHARS characters at s, for what
 * decimal_fast cannot do exactly. */
static double decimal_slow(const char *s, size_t n, int *range_error)
{
    char buf[NUMBER_MAX_CHARS];
    memcpy(buf, s, n);
    buf[n] = '\0';
    pthread_once(&c_locale_once, c_locale_init);
    double v = c_locale ? strtod_l(buf, NULL, c_locale) : strtod(buf, NULL);
    /* too large, or a non-zero mantissa that underflowed to zero */
    *range_error = !isfinite(v) ||
                   (v == 0.0 && strcspn(buf, "123456789") < strcspn(buf, "eE"));
    return v;
}

/* Scan an unsigned decimal number at s[i] (digits, optional fraction,
 * optional exponent).  Returns the end index, or i when nothing valid is
 * there.  *value gets the number; *range_error is set when it overflows. */
static size_t scan_unsigned(const char *s, size_t i, double *value,
                            int *range_error)
{
    size_t end = unsigned_end(s, i);
    if (end == i) return i;
    if (end - i >= NUMBER_MAX_CHARS) {
        *range_error = 1;
        return end;
    }
    if (decimal_fast(s, i, end, value)) {
        *range_error = 0;
        return end;
    }
    *value = decimal_slow(s + i, end - i, range_error);
    return end;
}

static cxl_status fail(size_t *error_pos, size_t pos, cxl_status st)
{
    if (error_pos) *error_pos = pos;
    return st;
}

/* Optional sign at s[*i]; returns -1 or +1. */
static double scan_sign(const char *s, size_t *i)
{
    if (s[*i] == '-') { (*i)++; return -1.0; }
    if (s[*i] == '+') { (*i)++; }
    return 1.0;
}

/* Leading spaces, an optional sign and an unsigned decimal at the start of
 * text: *i is where the digits begin, *end just past them, *sign -1 or +1
 * and *v the magnitude. */
static cxl_status scan_leading(const char *text, size_t *i, size_t *end, double *sign,
                               double *v, size_t *error_pos)
{
    *i = skip_spaces(text, 0);
    *sign = scan_sign(text, i);
    *v = 0.0;
    int range_error = 0;
    *end = scan_unsigned(text, *i, v, &range_error);
    if (*end == *i) return fail(error_pos, *i, CXL_EPARSE);
    if (range_error) return fail(error_pos, *i, CXL_ERANGE);
    return CXL_OK;
}

cxl_status cxl_units_parse_number(const char *text, double *value,
                                  size_t *error_pos)
{
    if (!text || !value) return CXL_EINVAL;
    size_t i, end;
    double sign, v;
    cxl_status st = scan_leading(text, &i, &end, &sign, &v, error_pos);
    if (st != CXL_OK) return st;
    end = skip_spaces(text, end);
    if (text[end] != '\0') return fail(error_pos, end, CXL_EPARSE);
    *value = sign * v;
    return CXL_OK;
}

/* Match one of a list of unit words (case-insensitive) at s[i], longest
 * first; the word must not be followed by a letter.  Returns the index in
 * words or -1; *len gets the matched length. */
static int match_word(const char *s, size_t i, const char *const *words,
                      size_t nwords, size_t *len)
{
    int best = -1;
    size_t best_len = 0;
    for (size_t k = 0; k < nwords; k++) {
        size_t n = strlen(words[k]);
        if (n <= best_len) continue;
        if (!cxl__ascii_ncaseeq(s + i, words[k], n)) continue;
        char next = s[i + n];
        int is_letter = (next >= 'a' && next <= 'z') || (next >= 'A' && next <= 'Z');
        if (is_letter && words[k][n - 1] != '\'' && words[k][n - 1] != '"') continue;
        best = (int)k;
        best_len = n;
    }
    if (best >= 0) *len = best_len;
    return best;
}

/* Scan "W N/D", "N/D" or "W" inch amounts.  Returns end index or i. */
static size_t scan_inches(const char *s, size_t i, double *inches,
                          size_t *error_pos, cxl_status *st)
{
    double whole = 0.0, num = 0.0, den = 0.0;
    int range_error = 0;
    size_t end = scan_unsigned(s, i, &whole, &range_error);
    if (end == i) return i;
    if (range_error) { *st = CXL_ERANGE; *error_pos = i; return i; }
    if (s[end] == '/') {
        /* the number just read was a numerator */
        size_t d0 = end + 1;
        size_t d1 = scan_unsigned(s, d0, &den, &range_error);
        if (d1 == d0 || range_error) { *st = CXL_EPARSE; *error_pos = d0; return i; }
        if (den == 0.0) { *st = CXL_ERANGE; *error_pos = d0; return i; }
        *inches = whole / den;
        return d1;
    }
    size_t j = skip_spaces(s, end);
    if (j > end && is_digit(s[j])) {
        size_t n1 = scan_unsigned(s, j, &num, &range_error);
        if (n1 > j && s[n1] == '/') {
            size_t d0 = n1 + 1;
            size_t d1 = scan_unsigned(s, d0, &den, &range_error);
            if (d1 == d0 || range_error) { *st = CXL_EPARSE; *error_pos = d0; return i; }
            if (den == 0.0) { *st = CXL_ERANGE; *error_pos = d0; return i; }
            *inches = whole + num / den;
            return d1;
        }
    }
    *inches = whole;
    return end;
}

static const char *const metric_words[] = { "m", "cm", "mm" };
static const double metric_scale[] = { 1.0, 0.01, 0.001 };
static const char *const feet_words[] = { "ft", "feet", "foot", "'" };
static const char *const inch_words[] = { "in", "inch", "inches", "\"" };

/* After a number of feet and its word, ending at text[end]: an optional
 * inch amount with an optional inch word.  *metres gets the inches added,
 * *end_out the index past them. */
static cxl_status feet_and_inches(const char *text, size_t end, double *metres,
                                  size_t *end_out, size_t *error_pos)
{
    /* 1'000 is a thousands separator (Swiss style), not 1 ft 0 in */
    if (strspn(text + end, "0123456789") >= 3) return fail(error_pos, end, CXL_EPARSE);
    *end_out = end;
    if (text[end] == '\0') return CXL_OK;
    double more = 0.0;
    size_t dummy_pos = 0, wlen = 0;
    cxl_status st = CXL_OK;
    size_t e2 = scan_inches(text, end, &more, &dummy_pos, &st);
    if (st != CXL_OK) return fail(error_pos, dummy_pos, st);
    if (e2 == end) return fail(error_pos, end, CXL_EPARSE);
    size_t u2 = skip_spaces(text, e2);
    if (match_word(text, u2, inch_words, 4, &wlen) >= 0)
        e2 = u2 + wlen;
    *metres += more * M_PER_IN;
    *end_out = e2;
    return CXL_OK;
}

/* The amount at text[i..end) is already read into amount; the unit word
 * (or none) at text[u] says what it counts.  *metres gets the length and
 * *end_out the index past the unit (and any inches after feet). */
static cxl_status length_with_unit(const char *text, size_t i, size_t end, size_t u,
                                   double amount, cxl_units bare_units, double *metres,
                                   size_t *end_out, size_t *error_pos)
{
    int is_fraction = memchr(text + i, '/', end - i) != NULL;
    int has_space = memchr(text + i, ' ', end - i) != NULL;
    size_t wlen = 0;
    int k;
    if (!is_fraction && (k = match_word(text, u, metric_words, 3, &wlen)) >= 0) {
        if (has_space) return fail(error_pos, end, CXL_EPARSE);
        if (k == 2 && text[u] == 'M') return fail(error_pos, u, CXL_EPARSE); /* Mm: megametre */
        *metres = amount * metric_scale[k];
        *end_out = u + wlen;
    } else if (!is_fraction && match_word(text, u, feet_words, 4, &wlen) >= 0 && !has_space) {
        *metres = amount * M_PER_FT;
        return feet_and_inches(text, skip_spaces(text, u + wlen), metres, end_out, error_pos);
    } else if (match_word(text, u, inch_words, 4, &wlen) >= 0) {
        *metres = amount * M_PER_IN;
        *end_out = u + wlen;
    } else if (text[u] == '\0' && !is_fraction && !has_space) {
        *metres = bare_units == CXL_UNITS_METRIC ? amount : amount * M_PER_FT;
        *end_out = u;
    } else {
        return fail(error_pos, text[u] == '\0' ? i : u, CXL_EPARSE);
    }
    return CXL_OK;
}

cxl_status cxl_units_parse_length(const char *text, cxl_units bare_units,
                                  double *length_m, size_t *error_pos)
{
    if (!text || !length_m) return CXL_EINVAL;
    if (bare_units != CXL_UNITS_METRIC && bare_units != CXL_UNITS_IMPERIAL)
        return CXL_EINVAL;
    size_t i = skip_spaces(text, 0);
    double sign = scan_sign(text, &i);
    double amount = 0.0, metres = 0.0;
    size_t dummy_pos = 0;
    cxl_status st = CXL_OK;
    size_t end = scan_inches(text, i, &amount, &dummy_pos, &st);
    if (st != CXL_OK) return fail(error_pos, dummy_pos, st);
    if (end == i) return fail(error_pos, i, CXL_EPARSE);
    st = length_with_unit(text, i, end, skip_spaces(text, end), amount, bare_units, &metres,
                          &end, error_pos);
    if (st != CXL_OK) return st;
    end = skip_spaces(text, end);
    if (text[end] != '\0') return fail(error_pos, end, CXL_EPARSE);
    if (!isfinite(metres)) return fail(error_pos, i, CXL_ERANGE);
    *length_m = sign * metres;
    return CXL_OK;
}

/* number, optional spaces, optional unit word from a table; bare_scale
 * applies when no unit is written. */
static cxl_status parse_scaled(const char *text, const char *const *words,
                               const double *scales, const char *prefix_case,
                               size_t nwords, double bare_scale, double *out,
                               size_t *error_pos)
{
    if (!text || !out) return CXL_EINVAL;
    size_t i, end;
    double sign, v;
    cxl_status st = scan_leading(text, &i, &end, &sign, &v, error_pos);
    if (st != CXL_OK) return st;
    size_t u = skip_spaces(text, end);
    double scale = bare_scale;
    if (text[u] != '\0') {
        size_t wlen = 0;
        int k = match_word(text, u, words, nwords, &wlen);
        if (k < 0) return fail(error_pos, u, CXL_EPARSE);
        /* unit words match in any case, except a prefix letter whose
         * other case is another prefix: mHz is millihertz, not MHz */
        if (prefix_case[k] && text[u] != prefix_case[k]) return fail(error_pos, u, CXL_EPARSE);
        scale = scales[k];
        u = skip_spaces(text, u + wlen);
        if (text[u] != '\0') return fail(error_pos, u, CXL_EPARSE);
    }
    double r = sign * v * scale;
    if (!isfinite(r) || (v != 0.0 && r == 0.0)) return fail(error_pos, i, CXL_ERANGE);
    *out = r;
    return CXL_OK;
}

static const char *const freq_words[] = { "hz", "khz", "mhz", "ghz" };
static const double freq_scale[] = { 1.0, 1e3, 1e6, 1e9 };
static const char freq_case[] = { 0, 0, 'M', 0 };

cxl_status cxl_units_parse_freq(const char *text, double *freq_hz,
                                size_t *error_pos)
{
    return parse_scaled(text, freq_words, freq_scale, freq_case, 4, 1e6, freq_hz,
                        error_pos);
}

static const char *const time_words[] = { "s", "ms", "us", "\xc2\xb5s", "ns", "ps" };
static const double time_scale[] = { 1.0, 1e-3, 1e-6, 1e-6, 1e-9, 1e-12 };
static const char time_case[] = { 0, 'm', 0, 0, 0, 'p' };

cxl_status cxl_units_parse_time(const char *text, double *delay_s,
                                size_t *error_pos)
{
    return parse_scaled(text, time_words, time_scale, time_case, 6, 1e-9, delay_s,
                        error_pos);
}

/* Replace the locale's radix string (which follows the first run of
 * digits) with '.', in place. */
static void fix_radix(char *buf)
{
    char *p = buf;
    if (*p == '-') p++;
    while (is_digit(*p)) p++;
    if (*p == '\0' || *p == 'e' || *p == 'E') return;
    char *q = p;
    while (*q && !is_digit(*q) && *q != 'e' && *q != 'E') q++;
    *p = '.';
    memmove(p + 1, q, strlen(q) + 1);
}

/* 1 while the rounding mode is to-nearest.  Two additions that any other
 * mode rounds away from 1 (upward: 1 + tiny; downward and toward zero:
 * 1 - tiny); tiny is read through a volatile so that neither is folded at
 * compile time.  A few instructions where fegetround() was a library call
 * per number (about 2 % of a phase batch, tests/bench). */
static int rounding_to_nearest(void)
{
    static volatile const double tiny = 0x1p-60;
    double t = tiny;
    return 1.0 + t == 1.0 && 1.0 - t == 1.0;
}

static const char digit_pairs[] =
    "00010203040506070809101112131415161718192021222324252627282930"
    "31323334353637383940414243444546474849505152535455565758596061"
    "6263646566676869707172737475767778798081828384858687888990919293"
    "949596979899";

/* n as decimal digits written backwards ending at q, with a '.' before the
 * last decimals digits; returns the first byte written. */
static char *digits_backwards(char *q, uint64_t n, int decimals)
{
    int k = decimals;
    for (; k >= 2; k -= 2, n /= 100) {
        q -= 2;
        memcpy(q, digit_pairs + 2 * (n % 100), 2);
    }
    if (k == 1) {
        *--q = (char)('0' + n % 10);
        n /= 10;
    }
    if (decimals > 0) *--q = '.';
    for (; n >= 100; n /= 100) {
        q -= 2;
        memcpy(q, digit_pairs + 2 * (n % 100), 2);
    }
    if (n >= 10) {
        q -= 2;
        memcpy(q, digit_pairs + 2 * n, 2);
    } else {
        *--q = (char)('0' + n);
    }
    return q;
}

/* Fast path of cxl_units_format_fixed, the CSV hot spot (snprintf's "%f"
 * cost about 160 ns a number, measured by tests/bench/bench_lib).  The
 * digits of "%.*f" are the integer nearest to s = |value| 10^decimals
 * (exact real).  10^decimals is exact in a double, so p = |value| *
 * 10^decimals is s rounded once; below 2^52 every k + 1/2 is a double and
 * rounding is monotonic, so s and p lie on the same side of every half
 * except when p lands exactly on one (1.0005 * 1000 gives 1000.5 though
 * s is just below it).  Then, and for large values or a rounding mode
 * other than to-nearest (which "%f" would follow), this returns 0 and the
 * snprintf path runs, so the bytes are always those of the slow path.
 * Returns the length, 0 to fall back, or -1 when buf is too small. */
static int format_fixed_fast(double value, int decimals, char *buf, size_t size)
{
    double p = fabs(value) * exact_pow10[decimals];
    if (!(p < 4503599627370496.0) || !rounding_to_nearest()) return 0; /* 2^52 */
    uint64_t n = (uint64_t)p; /* floor: p >= 0 */
    double frac = p - (double)n; /* exact below 2^52 */
    if (frac == 0.5) return 0; /* s may be on either side: let snprintf decide */
    n += frac > 0.5;
    /* n <= 2^52: at most 16 digits; decimals <= 17 leading zeros, the
     * point, the integer's 0 and a sign */
    char tmp[40], *end = tmp + sizeof tmp;
    char *q = digits_backwards(end, n, decimals);
    if (value < 0.0 && n > 0) *--q = '-'; /* no "-0.000" */
    size_t len = (size_t)(end - q);
    if (len >= size) return -1;
    memcpy(buf, q, len);
    buf[len] = '\0';
    return (int)len;
}

cxl_status cxl_units_format_fixed(double value, int decimals, char *buf,
                                  size_t size)
{
    if (!buf || size == 0 || !isfinite(value) || decimals < 0 || decimals > 17)
        return CXL_EINVAL;
    int fast = format_fixed_fast(value, decimals, buf, size);
    if (fast > 0) return CXL_OK;
    if (fast < 0) return CXL_ETOOLONG;
    char tmp[512];
    int n = snprintf(tmp, sizeof tmp, "%.*f", decimals, value);
    if (n < 0 || (size_t)n >= sizeof tmp) return CXL_ETOOLONG;
    fix_radix(tmp);
    char *s = tmp;
    if (s[0] == '-' && strspn(s + 1, "0.") == strlen(s + 1))
        s++; /* no "-0.000" */
    size_t len = strlen(s);
    if (len >= size) return CXL_ETOOLONG;
    memcpy(buf, s, len + 1);
    return CXL_OK;
}

cxl_status cxl_units_format_roundtrip(double value, char *buf, size_t size)
{
    if (!buf || size == 0 || !isfinite(value)) return CXL_EINVAL;
    char tmp[64];
    pthread_once(&c_locale_once, c_locale_init);
    for (int prec = 15; prec <= 17; prec++) {
        snprintf(tmp, sizeof tmp, "%.*g", prec, value);
        fix_radix(tmp);
        double back = c_locale ? strtod_l(tmp, NULL, c_locale) : value;
        if (back == value || prec == 17) break;
    }
    size_t len = strlen(tmp);
    if (len >= size) return CXL_ETOOLONG;
    memcpy(buf, tmp, len + 1);
    return CXL_OK;
}

static long long gcd_ll(long long a, long long b)
{
    while (b) { long long t = a % b; a = b; b = t; }
    return a;
}

cxl_status cxl_units_format_imperial(double length_m, char *buf, size_t size)
{
    if (!buf || size == 0 || !isfinite(length_m)) return CXL_EINVAL;
    char tmp[96]; /* buf is written only on success */
    double sixteenths = fabs(length_m) / M_PER_IN * 16.0;
    if (sixteenths > 1e15) return CXL_ERANGE;
    long long n = llround(sixteenths);
    long long feet = n / 192, rem = n % 192;
    long long inches = rem / 16, frac = rem % 16;
    const char *sign = (length_m < 0 && n > 0) ? "-" : "";
    int w;
    if (frac == 0) {
        w = snprintf(tmp, sizeof tmp, "%s%lld ft %lld in", sign, feet, inches);
    } else {
        long long g = gcd_ll(frac, 16);
        w = snprintf(tmp, sizeof tmp, "%s%lld ft %lld %lld/%lld in", sign, feet,
                     inches, frac / g, 16 / g);
    }
    if (w < 0 || (size_t)w >= size) return CXL_ETOOLONG;
    memcpy(buf, tmp, (size_t)w + 1);
    return CXL_OK;
}
