/* coaxline.h - libcoaxline public API: feedline and delay-line math for
 * phased receiving arrays.
 *
 * Conventions (see libcoaxline(3)):
 *   - every function that can fail returns cxl_status; results go through
 *     out-parameters, which are left untouched on failure;
 *   - SI units inside the API, the unit in every name (length_m, freq_hz,
 *     delay_s, phase_deg, loss_db);
 *   - velocity factor is a plain ratio in (0, 1];
 *   - no global mutable state, nothing printed, the process-wide GSL error
 *     handler is never changed (host programs should turn it off:
 *     gsl_set_error_handler_off());
 *   - numbers are parsed and formatted without reading the C locale.
 *
 * Copyright (C) 2026 the libcoaxline authors.  GPL-3.0-or-later.
 */
#ifndef COAXLINE_H
#define COAXLINE_H

#include <stddef.h>
#include <stdio.h>

#ifdef __cplusplus
extern "C" {
#endif

/* ---- version ---------------------------------------------------------- */

#define CXL_VERSION_MAJOR 0
#define CXL_VERSION_MINOR 1
#define CXL_VERSION_PATCH 0
#define CXL_VERSION_STRING "0.1.0"

/* Runtime version string of the linked library, e.g. "0.1.0". */
const char *cxl_version(void);

/* ---- status ----------------------------------------------------------- */

typedef enum cxl_status {
    CXL_OK = 0,
    CXL_EINVAL,        /* invalid argument (NULL, NaN, wrong sign, ...) */
    CXL_ERANGE,        /* argument or result outside the valid range */
    CXL_EPARSE,        /* text could not be parsed */
    CXL_ENOTFOUND,     /* named item not in the catalog or table */
    CXL_ENOMEM,        /* out of memory */
    CXL_EIO,           /* read or write failed */
    CXL_ENOCONV,       /* numerical method did not converge */
    CXL_EEXTRAPOLATE,  /* outside the range a model or table supports */
    CXL_EDUPLICATE,    /* name already present */
    CXL_ETOOLONG,      /* text or record longer than the limit */
    CXL_EINCONSISTENT  /* measurements that cannot all be true at once */
} cxl_status;

/* A short English description of a status; never NULL. */
const char *cxl_strerror(cxl_status status);

/* ---- physical constants ----------------------------------------------- */

/* Speed of light in vacuum, exact by the SI definition of the metre. */
#define CXL_C_M_PER_S 299792458.0

/* ---- units.c: locale-free parsing and formatting ----------------------- */

typedef enum cxl_units {
    CXL_UNITS_METRIC = 0,   /* bare lengths are metres */
    CXL_UNITS_IMPERIAL = 1  /* bare lengths are feet */
} cxl_units;

/* Parse a plain decimal number ("12.5", "-3", "1e-3"); '.' is the only
 * decimal mark.  Leading/trailing spaces are allowed.  On CXL_EPARSE or
 * CXL_ERANGE *error_pos (if not NULL) is the byte offset of the problem. */
cxl_status cxl_units_parse_number(const char *text, double *value,
                                  size_t *error_pos);

/* Parse a length: "12.5m", "1250mm", "125cm", "41ft", "498in", "41ft 6in",
 * "41'6\"", "41' 6 3/8\"", "6 3/8in".  A bare number takes bare_units. */
cxl_status cxl_units_parse_length(const char *text, cxl_units bare_units,
                                  double *length_m, size_t *error_pos);

/* Parse a frequency: "1830kHz", "1.83MHz", "1830000Hz", "0.5GHz"; unit
 * words are case-insensitive; a bare number is MHz. */
cxl_status cxl_units_parse_freq(const char *text, double *freq_hz,
                                size_t *error_pos);

/* Parse a time: "33.4ns", "0.0334us" ("µs" too), "1ms", "2e-9s"; a bare
 * number is nanoseconds. */
cxl_status cxl_units_parse_time(const char *text, double *delay_s,
                                size_t *error_pos);

/* Format value with a fixed number of decimals (0..17) and '.' as the
 * decimal mark, whatever the locale.  Negative zero prints as "0.000".
 * CXL_EINVAL for NaN/inf, CXL_ETOOLONG when size is too small. */
cxl_status cxl_units_format_fixed(double value, int decimals, char *buf,
                                  size_t size);

/* Shortest-safe round-trip form ("%.17g" style) with '.' as decimal mark. */
cxl_status cxl_units_format_roundtrip(double value, char *buf, size_t size);

/* A length as a tape measure shows it, to the nearest 1/16 inch:
 * "26 ft 2 15/16 in", "0 ft 11 1/2 in", "-1 ft 0 1/16 in". */
cxl_status cxl_units_format_imperial(double length_m, char *buf,
                                     size_t size);

/* ---- line.c: delay, length and electrical degrees ---------------------- */

/* Time for a wave to travel length_m of line with velocity factor vf. */
cxl_status cxl_line_delay_from_length(double length_m, double vf,
                                      double *delay_s);
/* Line length that gives delay_s for velocity factor vf. */
cxl_status cxl_line_length_from_delay(double delay_s, double vf,
                                      double *length_m);
/* Electrical length in degrees of length_m of line at freq_hz. */
cxl_status cxl_line_degrees_from_length(double length_m, double vf,
                                        double freq_hz, double *phase_deg);
/* Line length that is phase_deg long at freq_hz. */
cxl_status cxl_line_length_from_degrees(double phase_deg, double freq_hz,
                                        double vf, double *length_m);
/* Phase in degrees that a delay makes at a frequency: 360 f t. */
cxl_status cxl_line_degrees_from_delay(double delay_s, double freq_hz,
                                       double *phase_deg);
/* Delay that a free-space (stagger) offset makes: offset / c. */
cxl_status cxl_line_delay_from_offset(double offset_m, double *delay_s);

/* Cable to cut so that cable plus an allowance (connectors, adapters,
 * fixture: allowance_m of line with velocity factor allowance_vf) delays
 * the signal by delay_s.  allowance_m may be 0.  CXL_ERANGE when the
 * allowance alone is already longer than the wanted delay. */
cxl_status cxl_line_cut_length(double delay_s, double vf,
                               double allowance_m, double allowance_vf,
                               double *cut_length_m);

/* Frequency at which length_m of line with an open far end is a quarter
 * wave: its first low-impedance (series) resonance seen on an analyzer. */
cxl_status cxl_line_quarter_wave_freq(double length_m, double vf,
                                      double *freq_hz);

/* ---- csv.c: RFC 4180 reader and writer --------------------------------- */

typedef struct cxl_csv_reader cxl_csv_reader;

/* Largest record (one row, quotes included) the reader accepts. */
#define CXL_CSV_MAX_RECORD 65536

/* A reader over a stream the caller owns (not closed by the reader). */
cxl_status cxl_csv_reader_new_stream(FILE *stream, cxl_csv_reader **reader);
/* A reader over a buffer the caller keeps alive while reading. */
cxl_status cxl_csv_reader_new_buffer(const char *text, size_t size,
                                     cxl_csv_reader **reader);
void cxl_csv_reader_free(cxl_csv_reader *reader);

/* Read the next record.  *has_row is 0 at end of input.  A UTF-8 byte-order
 * mark before the first record is skipped; CRLF, LF and quoted fields with
 * embedded commas, quotes and line breaks are understood.  A malformed
 * record (unbalanced quote, NUL byte, longer than CXL_CSV_MAX_RECORD)
 * returns CXL_EPARSE or CXL_ETOOLONG and is skipped, so the next call
 * continues with the following record.  Blank lines are skipped. */
cxl_status cxl_csv_reader_next(cxl_csv_reader *reader, int *has_row);
/* Fields of the current record; valid until the next call. */
size_t cxl_csv_reader_nfields(const cxl_csv_reader *reader);
const char *cxl_csv_reader_field(const cxl_csv_reader *reader, size_t i);
/* 1-based line on which the current (or last rejected) record began. */
size_t cxl_csv_reader_line(const cxl_csv_reader *reader);

/* Write one field, quoted when it holds a comma, quote, CR or LF.  When
 * neutralise is non-zero, text that a spreadsheet would run as a formula
 * (a first character of = + - @, TAB or CR, and not a plain number) gets a
 * leading apostrophe. */
cxl_status cxl_csv_write_field(FILE *stream, const char *text,
                               int neutralise);

#ifdef __cplusplus
}
#endif

#endif /* COAXLINE_H */
