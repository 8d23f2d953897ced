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
 *   - numbers are parsed and formatted without reading the C locale;
 *   - one argument order for the same quantities, so that two doubles
 *     swapped cannot read as a plausible call: the handle; the quantity
 *     the function converts or judges (lengths, delays, degrees, the goal
 *     or tolerance); the line (Z0, gamma, vf); the frequency, then the
 *     direction (azimuth, elevation); what is at the line's ends and how
 *     well the inputs are known (fixture, allowance, load, tolerances);
 *     the outputs last.  It reads as said aloud: "this length, on this
 *     line, at this frequency", e.g.
 *     cxl_line_degrees_from_length(length_m, vf, freq_hz, &phase_deg) and
 *     cxl_line_length_from_degrees(phase_deg, vf, freq_hz, &length_m).
 *     tests/api_order.sh checks it by parameter name;
 *   - counts are returned as size_t (0 for a NULL handle), never through
 *     a status and an out-parameter: a count of a valid handle cannot
 *     fail, and reads in a loop bound.
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
 * "41'6\"", "41' 6 3/8\"", "6 3/8in".  A bare number takes bare_units.
 * Refused (CXL_EPARSE): "Mm"/"MM" (a megametre prefix, not millimetres) and
 * three or more digits after a foot mark ("1'000", a thousands separator). */
cxl_status cxl_units_parse_length(const char *text, cxl_units bare_units,
                                  double *length_m, size_t *error_pos);

/* Parse a frequency: "1830kHz", "1.83MHz", "1830000Hz", "0.5GHz"; unit
 * words are case-insensitive except the M of MHz: "mHz" or "mhz" (milli)
 * is refused with CXL_EPARSE rather than read as megahertz; a bare number
 * is MHz. */
cxl_status cxl_units_parse_freq(const char *text, double *freq_hz,
                                size_t *error_pos);

/* Parse a time: "33.4ns", "0.0334us" ("µs" too), "1ms", "2e-9s"; a bare
 * number is nanoseconds.  Unit words are case-insensitive except the
 * prefixes m and p ("Ms", "PS" would be mega- and petaseconds: CXL_EPARSE). */
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
cxl_status cxl_line_length_from_degrees(double phase_deg, double vf,
                                        double freq_hz, double *length_m);
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
/* Longest rest of a rejected record the reader skips before it stops. */
#define CXL_CSV_MAX_SKIP (16 * CXL_CSV_MAX_RECORD)

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
 * returns CXL_EPARSE or CXL_ETOOLONG and is skipped to its end (a line
 * break inside one of its quoted cells does not end it), so the next call
 * continues with the following record.  Blank lines are skipped.  A read
 * error on the stream returns CXL_EIO (the record it cut short is not a
 * row) and stops the reader; so does a rejected record whose rest runs
 * over CXL_CSV_MAX_SKIP bytes (CXL_ETOOLONG, e.g. /dev/zero): see
 * cxl_csv_reader_stopped. */
cxl_status cxl_csv_reader_next(cxl_csv_reader *reader, int *has_row);
/* CXL_OK while reading can go on; once it cannot, the status that stopped
 * it (CXL_EIO or CXL_ETOOLONG), which every later cxl_csv_reader_next
 * returns again.  CXL_EINVAL for NULL. */
cxl_status cxl_csv_reader_stopped(const cxl_csv_reader *reader);
/* Field separator: ',' (the default), ';' or '\t', or 0 to take it from
 * the first record: the first of the three met outside quotes (',' when
 * the record has one field).  Only before the first record is read;
 * CXL_EINVAL otherwise or for any other character. */
cxl_status cxl_csv_reader_set_separator(cxl_csv_reader *reader, int separator);
/* The separator in use (0 while it is still to be detected). */
int cxl_csv_reader_separator(const cxl_csv_reader *reader);
/* 1 when the input began with a UTF-8 byte-order mark (known once the
 * first record is read), else 0. */
int cxl_csv_reader_bom(const cxl_csv_reader *reader);
/* Fields of the current record; valid until the next call. */
size_t cxl_csv_reader_nfields(const cxl_csv_reader *reader);
const char *cxl_csv_reader_field(const cxl_csv_reader *reader, size_t i);
/* 1-based line on which the current (or last rejected) record began. */
size_t cxl_csv_reader_line(const cxl_csv_reader *reader);

/* Write one field, quoted when it holds a comma, quote, CR, LF, ';' or
 * TAB.  When neutralise is non-zero, text that a spreadsheet would run as
 * a formula gets a leading apostrophe: a first character of TAB or CR, or
 * of = + - @ (also after blanks, and in a piece after a ';' or TAB, where a
 * ';'-separating spreadsheet would split the cell), unless the text is a
 * plain number such as -3.5. */
cxl_status cxl_csv_write_field(FILE *stream, const char *text,
                               int neutralise);

/* ---- band.c: band edges per ITU Region -------------------------------- */

/* A band table: the built-in one (data/bands.csv: amateur bands 2200 m to
 * 6 m and the medium-wave broadcast band "mw", per ITU Region, from the ITU
 * Radio Regulations, Article 5) or one read from a user file of the same
 * columns: band,service,region,low_khz,high_khz,footnote,source.  A row is
 * one segment: the general allocation (empty footnote) or a segment that
 * holds only in the countries an RR footnote lists (footnote "5.96"). */
typedef struct cxl_bands cxl_bands;

typedef enum cxl_service {
    CXL_SERVICE_AMATEUR = 0,
    CXL_SERVICE_BROADCAST = 1
} cxl_service;

/* The built-in table. */
cxl_status cxl_bands_new(cxl_bands **bands);
/* A table read from a CSV stream the caller owns.  CXL_EPARSE (with
 * *error_line, if not NULL, the offending line) for a missing column, a
 * bad value, a region other than 1-3, low >= high or an empty source. */
cxl_status cxl_bands_new_stream(FILE *stream, cxl_bands **bands,
                                size_t *error_line);
void cxl_bands_free(cxl_bands *bands);

/* Rows in table order; 0 for NULL. */
size_t cxl_bands_count(const cxl_bands *bands);
/* Row index: any output pointer may be NULL.  Strings live as long as the
 * table; name is canonical ("160m", "mw"); footnote is "" for the general
 * allocation. */
cxl_status cxl_bands_get(const cxl_bands *bands, size_t index,
                         const char **name, cxl_service *service,
                         int *region, double *low_hz, double *high_hz,
                         const char **footnote, const char **source);
/* The table's own name for a band as a user may type it ("160", "160M"
 * -> "160m"): same matching as cxl_bands_edges.  *name is the name string
 * of the band's first row (the one cxl_bands_get gives for that index),
 * living as long as the table.  CXL_ENOTFOUND for a band with no row. */
cxl_status cxl_bands_name(const cxl_bands *bands, const char *band,
                          const char **name);
/* Edges of a band: the lowest low edge and highest high edge of its rows
 * in region (1-3), or across all Regions for region 0, footnote segments
 * counted when include_footnotes is non-zero.  Names are case-insensitive
 * and a bare wavelength is accepted: "160m", "160M", "160", "mw".
 * CXL_ERANGE for a region outside 0-3, CXL_ENOTFOUND for an unknown band
 * or one with no segment in that region. */
cxl_status cxl_bands_edges(const cxl_bands *bands, const char *band,
                           int region, int include_footnotes,
                           double *low_hz, double *high_hz);

/* ---- stub.c: velocity factor from stub resonances ----------------------- */

/* Far end of a stub measured at its input on an analyzer.  Series (low
 * impedance) resonances: open, the n-th at (2n-1)/4 wavelength; shorted,
 * the n-th at n/2 wavelength. */
typedef enum cxl_stub_end {
    CXL_STUB_OPEN = 0,
    CXL_STUB_SHORT = 1
} cxl_stub_end;

/* Highest resonance order the stub functions accept. */
#define CXL_STUB_MAX_ORDER 1000

/* Wavelengths of line at the order-th series resonance (1-based). */
cxl_status cxl_stub_wavelengths(cxl_stub_end end, int order,
                                double *wavelengths);
/* VF from one resonance of length_m of cable; fixture_m of line with
 * velocity factor fixture_vf sits between analyzer and cable (0 for none).
 * CXL_ERANGE when the fixture alone is that long or the VF would exceed 1. */
cxl_status cxl_stub_vf_from_resonance(cxl_stub_end end, int order,
                                      double length_m, double freq_hz,
                                      double fixture_m, double fixture_vf,
                                      double *vf);
/* Frequency of the order-th resonance of length_m of cable with vf;
 * CXL_ERANGE when it overflows (a subnormal length). */
cxl_status cxl_stub_resonance_freq(cxl_stub_end end, int order,
                                   double length_m, double vf,
                                   double fixture_m, double fixture_vf,
                                   double *freq_hz);

/* A set of resonance readings to fit. */
typedef struct cxl_stub cxl_stub;
typedef struct cxl_stub_result cxl_stub_result;

/* How readings without a given order are numbered. */
typedef enum cxl_stub_orders {
    CXL_STUB_ORDERS_CONSECUTIVE = 0, /* 1st, 2nd, ... in ascending frequency */
    CXL_STUB_ORDERS_BEST_FIT = 1     /* the orders that best fit one fundamental */
} cxl_stub_orders;

cxl_status cxl_stub_new(cxl_stub_end end, cxl_stub **stub);
void cxl_stub_free(cxl_stub *stub);
/* Empty the stub for a new set of readings on end, as cxl_stub_new
 * leaves it (defaults restored), keeping its memory: a program fitting
 * one set per row allocates nothing once the largest set was seen. */
cxl_status cxl_stub_reset(cxl_stub *stub, cxl_stub_end end);
/* Known fixture between analyzer and cable (default none). */
cxl_status cxl_stub_set_fixture(cxl_stub *stub, double fixture_m,
                                double fixture_vf);
/* Length tolerance of each measured cable length and the analyzer's
 * frequency resolution, both >= 0 (default 0): they set the VF error
 * budget, and a resolution also weights the fit toward higher orders. */
cxl_status cxl_stub_set_tolerances(cxl_stub *stub, double length_tol_m,
                                   double freq_res_hz);
/* Plausible VF range, default 0.5 to 1.0. */
cxl_status cxl_stub_set_vf_range(cxl_stub *stub, double vf_min,
                                 double vf_max);
/* Relative tolerance (0, 0.5] within which readings count as multiples of
 * one fundamental, default 0.02. */
cxl_status cxl_stub_set_consistency(cxl_stub *stub, double rel_tol);
/* Numbering of readings given without order (default consecutive). */
cxl_status cxl_stub_set_orders(cxl_stub *stub, cxl_stub_orders rule);
/* One reading: the resonance at freq_hz of length_m of cable, order >= 1,
 * or 0 when not known (all readings give an order, or none does).  On one
 * length, readings must come in ascending frequency and order: CXL_EINVAL
 * for a reading out of order or repeated.  Readings on two or more lengths
 * (the cable trimmed between readings) let the fit find an unknown extra
 * fixture length; on one length VF and fixture cannot be told apart. */
cxl_status cxl_stub_add_reading(cxl_stub *stub, double length_m,
                                double freq_hz, int order);
size_t cxl_stub_count(const cxl_stub *stub);
/* The orders that best fit one fundamental with a plausible VF, for the
 * readings in the order added (count must equal cxl_stub_count()); given
 * orders are ignored.  CXL_ERANGE when a reading has no plausible order. */
cxl_status cxl_stub_infer_orders(const cxl_stub *stub, int *orders,
                                 size_t count);
/* The first reading (in the order added) that no allowed order explains
 * with a VF in the plausible range (its given order, or any when none is
 * given): CXL_OK and *index set, or CXL_ENOTFOUND when every reading is
 * plausible (CXL_EINVAL without readings).  It names the reading behind
 * cxl_stub_fit's CXL_ERANGE. */
cxl_status cxl_stub_implausible_reading(const cxl_stub *stub, size_t *index);

/* Result flags: warnings, not failures. */
#define CXL_STUB_FLAG_INCONSISTENT   0x1u /* readings off one fundamental */
#define CXL_STUB_FLAG_VF_RANGE       0x2u /* a VF outside the plausible range */
#define CXL_STUB_FLAG_ORDERS_ASSUMED 0x4u /* orders were numbered, not given */
#define CXL_STUB_FLAG_FIXTURE_FITTED 0x8u /* an extra fixture length was fitted */
#define CXL_STUB_FLAG_TREND          0x10u /* the readings' VFs rise or fall with
                                            * frequency beyond their own errors:
                                            * ask for the VF at a frequency */

/* Weighted least-squares fit of k c / f - fixture = L / VF (+ x).
 * CXL_EINVAL without readings; CXL_ERANGE when a reading implies a VF
 * outside the plausible range for every allowed order (the given one, or
 * any); CXL_EINCONSISTENT when the readings imply a longer line has a
 * shorter electrical length, or a fitted fixture longer than a reading. */
cxl_status cxl_stub_fit(const cxl_stub *stub, cxl_stub_result **result);
void cxl_stub_result_free(cxl_stub_result *result);
/* A result to refit with cxl_stub_fit_into, empty until then.  Refitted
 * row after row, it allocates only for more readings than before; on
 * failure it is left empty (its functions return CXL_EINVAL) and the
 * status is cxl_stub_fit's. */
cxl_status cxl_stub_result_new(cxl_stub_result **result);
cxl_status cxl_stub_fit_into(const cxl_stub *stub, cxl_stub_result *result);
/* Fitted VF and its total uncertainty (root sum of squares of the budget). */
cxl_status cxl_stub_result_vf(const cxl_stub_result *result, double *vf,
                              double *vf_err);
/* VF uncertainty from the scatter of the fit (0 without redundant
 * readings), from the length tolerance and from the frequency resolution.
 * Any output may be NULL. */
cxl_status cxl_stub_result_vf_budget(const cxl_stub_result *result,
                                     double *err_fit, double *err_length,
                                     double *err_freq);
/* Fitted extra fixture length: free-space equivalent, its uncertainty, and
 * as a length of the measured cable.  CXL_ENOTFOUND when not fitted
 * (readings on one length). */
cxl_status cxl_stub_result_fixture(const cxl_stub_result *result,
                                   double *extra_free_m, double *extra_err_m,
                                   double *extra_cable_m);
cxl_status cxl_stub_result_flags(const cxl_stub_result *result,
                                 unsigned *flags);
/* How cxl_stub_result_vf_at found its value. */
#define CXL_STUB_AT_TREND        0x1u /* trend a - b/sqrt(f) over the readings */
#define CXL_STUB_AT_EXTRAPOLATED 0x2u /* the trend carried outside the readings */
#define CXL_STUB_AT_ALLOWANCE    0x4u /* the nearest reading and the drift
                                       * allowance (cxl_drift_allowance) */
/* VF at freq_hz and its uncertainty.  Two candidates: the trend over the
 * readings (cxl_drift_new_stub with the analyzer step; with one frequency
 * or no error estimate there is none) and the reading nearest in
 * 1/sqrt(f) moved by the drift allowance; the one with the smaller
 * uncertainty is given.  The uncertainty adds in quadrature the reading
 * or trend error (a frequency step moves a VF by VF df / f), the length
 * tolerance (VF dL / L) and the allowance or the trend's law term.
 * how (may be NULL) gets CXL_STUB_AT_* bits.  CXL_ERANGE when freq_hz is
 * below the allowance's range and no trend covers it. */
cxl_status cxl_stub_result_vf_at(const cxl_stub_result *result,
                                 double freq_hz, double *vf, double *vf_err,
                                 unsigned *how);
size_t cxl_stub_result_count(const cxl_stub_result *result);
/* Reading index: its length, frequency, order used, the VF it alone
 * implies (after the fitted fixture), and its residual: measured minus
 * fitted frequency, and measured minus fitted length as cable metres.
 * Any output may be NULL. */
cxl_status cxl_stub_result_reading(const cxl_stub_result *result,
                                   size_t index, double *length_m,
                                   double *freq_hz, int *order, double *vf,
                                   double *residual_hz, double *residual_m);

/* ---- pair.c: phase error and pair tolerance ----------------------------- */

/* Phase error of length_m against reference_m at freq_hz:
 * 360 f (L - Lref) / (VF c); positive when the line is longer (lags). */
cxl_status cxl_pair_phase_error(double length_m, double reference_m,
                                double vf, double freq_hz,
                                double *phase_error_deg);
/* The same with the reference given as an electrical length reference_deg
 * at reference_freq_hz on the same cable (CXL_ERANGE when that rounds to no
 * length). */
cxl_status cxl_pair_phase_error_ref_deg(double length_m, double reference_deg,
                                        double reference_freq_hz,
                                        double vf,
                                        double freq_hz,
                                        double *phase_error_deg);
/* Length mismatch that makes tolerance_deg at freq_hz:
 * tolerance VF c / (360 f). */
cxl_status cxl_pair_max_mismatch(double tolerance_deg, double vf,
                                 double freq_hz, double *delta_m);
/* Worst-case growth of |phase error| when the measured length may be off
 * by length_tol_m and the VF by vf_tol (both bounds, vf_tol < vf). */
cxl_status cxl_pair_phase_uncertainty(double length_m, double reference_m,
                                      double vf, double freq_hz,
                                      double length_tol_m, double vf_tol,
                                      double *uncertainty_deg);

typedef enum cxl_verdict {
    CXL_VERDICT_PASS = 0,           /* within tolerance even in the worst case */
    CXL_VERDICT_PASS_UNCERTAIN = 1, /* within, but error + uncertainty is not */
    CXL_VERDICT_FAIL = 2            /* outside tolerance */
} cxl_verdict;

/* The verdict of a phase error (its magnitude) with its uncertainty
 * (>= 0) against tolerance_deg (> 0): CXL_VERDICT_FAIL when |error| is
 * above the tolerance, CXL_VERDICT_PASS_UNCERTAIN when |error| +
 * uncertainty is, else CXL_VERDICT_PASS.  The one rule cxl_pair_check and
 * any other check (lines into a load, say) use. */
cxl_status cxl_pair_verdict(double phase_error_deg, double uncertainty_deg,
                            double tolerance_deg, cxl_verdict *verdict);
/* Check count >= 2 lines meant to be equal: the worst pair's length
 * difference (longest minus shortest), its phase error at freq_hz, the
 * uncertainty of that error (each length within length_tol_m, VF within
 * vf_tol) and the verdict against tolerance_deg. */
cxl_status cxl_pair_check(const double *lengths_m, size_t count, double tolerance_deg,
                          double vf, double freq_hz,
                          double length_tol_m, double vf_tol,
                          double *delta_m, double *phase_error_deg,
                          double *uncertainty_deg, cxl_verdict *verdict);
/* Lines into a load.  A phasing line is judged by the phase of the voltage
 * it delivers into what it feeds, which departs from its electrical length
 * whenever the load does not match the line (cxl_transfer_*).  A
 * cxl_pair_load holds the load (load_re_ohm >= 0, not a short) and the
 * line's form: lossless of real impedance z0_ohm (the velocity factor given
 * per call), or a physical cable model (kept by reference: it must outlive
 * the handle).  Free with cxl_pair_load_free. */
typedef struct cxl_pair_load cxl_pair_load;
typedef struct cxl_loss_model cxl_loss_model; /* loss.c, below (C11 allows the repeat) */
cxl_status cxl_pair_load_new_lossless(double z0_ohm, double load_re_ohm,
                                      double load_im_ohm,
                                      cxl_pair_load **load);
cxl_status cxl_pair_load_new_model(const cxl_loss_model *model,
                                   double load_re_ohm, double load_im_ohm,
                                   cxl_pair_load **load);
void cxl_pair_load_free(cxl_pair_load *load);
/* length_m of the line into the load at freq_hz: transfer in dB, delay in
 * degrees (the phase lag of V_load behind V_in) and the electrical length
 * in degrees (may be NULL); vf is the lossless form's (checked, unused by a
 * model).  CXL_EEXTRAPOLATE outside a model's range, CXL_ERANGE when no
 * voltage reaches the load. */
cxl_status cxl_pair_load_transfer(const cxl_pair_load *load, double length_m,
                                  double vf, double freq_hz,
                                  double *transfer_db, double *delay_deg,
                                  double *electrical_deg);
/* cxl_pair_check into the load: the error is the largest delay into it
 * minus the smallest, the uncertainty the worst spread over the corners of
 * the tolerance box (each length within length_tol_m, the VF within vf_tol,
 * as the same electrical length on a line scaled by VF / VF') minus the
 * error, the electrical error the longest line's electrical length minus
 * the shortest's, the imbalance the spread of the lines' gains (dB), and
 * the verdict of cxl_pair_verdict. */
cxl_status cxl_pair_load_check(const cxl_pair_load *load,
                               const double *lengths_m, size_t count,
                               double tolerance_deg, double vf,
                               double freq_hz, double length_tol_m,
                               double vf_tol, double *phase_error_deg,
                               double *uncertainty_deg,
                               double *electrical_error_deg,
                               double *imbalance_db, cxl_verdict *verdict);
/* How much longer than length_m a line may be before its delay into the
 * load is tolerance_deg more (bisection to 1e-12 relative); CXL_ENOCONV
 * when no such length lies within ceil(tolerance / 180) + 1 half waves (a
 * very lossy line or a reactive load). */
cxl_status cxl_pair_load_max_mismatch(const cxl_pair_load *load,
                                      double tolerance_deg, double length_m,
                                      double vf, double freq_hz,
                                      double *delta_m);
/* ---- catalog.c: cable catalog ----------------------------------------- */

/* A catalog of cables: the built-in rows (compiled in from data/cables.csv
 * and data/cable_loss.csv) plus rows the caller loads from files of the same
 * formats.  Names are unique without regard to ASCII case; a user row never
 * replaces a built-in or an earlier user row (CXL_EDUPLICATE): give a
 * measured spool its own name.  Each load is all or nothing: on any error
 * the catalog is unchanged. */
typedef struct cxl_catalog cxl_catalog;

/* Numeric properties of a cable, in SI units. */
typedef enum cxl_cable_prop {
    CXL_CABLE_Z0_OHM = 0,               /* nominal characteristic impedance */
    CXL_CABLE_VF,                       /* nominal velocity factor */
    CXL_CABLE_INNER_DIAMETER_M,         /* centre conductor */
    CXL_CABLE_DIELECTRIC_DIAMETER_M,    /* = inner diameter of the outer conductor */
    CXL_CABLE_RELATIVE_PERMITTIVITY,
    CXL_CABLE_LOSS_TANGENT,
    CXL_CABLE_CONDUCTIVITY_S_PER_M,     /* 58.0e6 (annealed copper) when not given */
    CXL_CABLE_CONDUCTOR_LOSS_FACTOR,    /* 1 when not given */
    CXL_CABLE_CLAD_THICKNESS_M,         /* copper-clad steel centre: cladding */
    CXL_CABLE_CORE_CONDUCTIVITY_S_PER_M,    /* ... and its core */
    CXL_CABLE_CORE_RELATIVE_PERMEABILITY
} cxl_cable_prop;

/* Conductivity assumed when a row leaves it empty: annealed copper, 100 %
 * IACS, IEC 60028. */
#define CXL_COPPER_CONDUCTIVITY_S_PER_M 58.0e6

/* A new catalog holding the built-in rows. */
cxl_status cxl_catalog_new(cxl_catalog **catalog);
void cxl_catalog_free(cxl_catalog *catalog);

/* Add user cables from a CSV stream with a header row.  Columns (any order,
 * all but name and vf optional, cells may be empty): name, z0_ohm, vf,
 * dielectric, inner_diameter_mm, dielectric_diameter_mm,
 * relative_permittivity, loss_tangent, conductivity_s_per_m,
 * conductor_loss_factor, clad_thickness_mm, core_conductivity_s_per_m,
 * core_relative_permeability, source.  A row with only name and vf (a
 * measured spool) is enough for cut lengths.  Fields are separated by
 * ',', ';' or TAB, whichever the header uses first (a spreadsheet's
 * export); in a ';' file numbers are written with a decimal comma (0,66)
 * and a '.' in a number is refused.  The same holds for
 * cxl_catalog_load_loss.
 * Errors: CXL_EPARSE (unknown or repeated column, missing required column
 * or value, bad number, wrong field count, malformed CSV), CXL_ERANGE (a
 * number outside its valid range), CXL_EDUPLICATE (name already present),
 * CXL_ETOOLONG, CXL_ENOMEM, CXL_EIO.  On error *error_line (if not NULL)
 * is the 1-based line of the offending record (1 for the header) and
 * error_text (if not NULL and error_size > 0) gets one line such as
 * "spool.csv:3: column vf: not a number: 0,83"; file_name may be NULL. */
cxl_status cxl_catalog_load_cables(cxl_catalog *catalog, FILE *stream,
                                   const char *file_name, size_t *error_line,
                                   char *error_text, size_t error_size);

/* Add attenuation points from a CSV stream: columns name, freq_mhz,
 * loss_db_per_100m (required) and source (optional).  Each name must be a
 * user cable already in the catalog (CXL_ENOTFOUND otherwise); a built-in
 * cable's table cannot be extended (CXL_EDUPLICATE), nor can a frequency
 * appear twice for one cable (CXL_EDUPLICATE).  Errors as above. */
cxl_status cxl_catalog_load_loss(cxl_catalog *catalog, FILE *stream,
                                 const char *file_name, size_t *error_line,
                                 char *error_text, size_t error_size);

/* Number of cables (built-in first, then user rows in load order); 0 for
 * a NULL catalog. */
size_t cxl_catalog_count(const cxl_catalog *catalog);
/* Index of a cable by name, ASCII case ignored; CXL_ENOTFOUND if absent. */
cxl_status cxl_catalog_find(const cxl_catalog *catalog, const char *name,
                            size_t *index);
/* Text properties; the strings live as long as the catalog.  dielectric
 * and source are "" when a user row leaves them empty. */
cxl_status cxl_catalog_name(const cxl_catalog *catalog, size_t index,
                            const char **name);
cxl_status cxl_catalog_dielectric(const cxl_catalog *catalog, size_t index,
                                  const char **dielectric);
cxl_status cxl_catalog_source(const cxl_catalog *catalog, size_t index,
                              const char **source);
/* 1 for a built-in row, 0 for a user row. */
cxl_status cxl_catalog_is_builtin(const cxl_catalog *catalog, size_t index,
                                  int *builtin);
/* A numeric property; CXL_ENOTFOUND when the row does not give it (and it
 * has no default); CXL_ERANGE for an index past the end. */
cxl_status cxl_catalog_value(const cxl_catalog *catalog, size_t index,
                             cxl_cable_prop prop, double *value);
/* Attenuation table of a cable, sorted by frequency: its number of points
 * (0 for a NULL catalog or an index past the end), and each point. */
size_t cxl_catalog_loss_count(const cxl_catalog *catalog, size_t index);
cxl_status cxl_catalog_loss_point(const cxl_catalog *catalog, size_t index,
                                  size_t point, double *freq_hz,
                                  double *loss_db_per_m, const char **source);

/* ---- loss.c: loss models ----------------------------------------------- */

/* Flags for the evaluation functions below. */
#define CXL_LOSS_EXTRAPOLATE     0x1u /* allow frequencies outside the range */
#define CXL_LOSS_EXTERNAL_L_ONLY 0x2u /* physical model: no internal inductance */
#define CXL_LOSS_THIN_SKIN       0x4u /* physical model: thin-skin R, for comparison */

/* Fitted model: loss_db_per_m(f) = a sqrt(f) + b f, least squares (GSL,
 * weighted by 1/loss^2 so every point counts with its relative error) over
 * table points.  Evaluation outside the usable range
 * (cxl_loss_fit_usable_range: the table's range and 10 % beyond each end)
 * returns CXL_EEXTRAPOLATE unless CXL_LOSS_EXTRAPOLATE is given. */
typedef struct cxl_loss_fit cxl_loss_fit;

/* From n >= 2 points at two or more distinct frequencies (CXL_ERANGE
 * otherwise, and when the fitted value or residual at a point overflows);
 * every value finite and > 0 (CXL_EINVAL). */
cxl_status cxl_loss_fit_new(const double *freq_hz,
                            const double *loss_db_per_m, size_t n,
                            cxl_loss_fit **fit);
/* From a catalog cable's table; CXL_ENOTFOUND when it has fewer than two
 * points. */
cxl_status cxl_loss_fit_new_cable(const cxl_catalog *catalog, size_t index,
                                  cxl_loss_fit **fit);
void cxl_loss_fit_free(cxl_loss_fit *fit);
cxl_status cxl_loss_fit_coefficients(const cxl_loss_fit *fit,
                                     double *a_db_per_m_sqrt_hz,
                                     double *b_db_per_m_hz);
/* Lowest and highest table frequency. */
cxl_status cxl_loss_fit_range(const cxl_loss_fit *fit, double *min_freq_hz,
                              double *max_freq_hz);
/* Table points (0 for a NULL fit) and residuals (fitted - table). */
size_t cxl_loss_fit_count(const cxl_loss_fit *fit);
/* The range evaluation accepts without CXL_LOSS_EXTRAPOLATE. */
cxl_status cxl_loss_fit_usable_range(const cxl_loss_fit *fit,
                                     double *min_freq_hz, double *max_freq_hz);
cxl_status cxl_loss_fit_point(const cxl_loss_fit *fit, size_t point,
                              double *freq_hz, double *table_db_per_m,
                              double *residual_db_per_m);
/* Largest |residual| / table value over the points. */
cxl_status cxl_loss_fit_max_relative_residual(const cxl_loss_fit *fit,
                                              double *relative);
cxl_status cxl_loss_fit_eval(const cxl_loss_fit *fit, double freq_hz,
                             unsigned flags, double *loss_db_per_m);

/* Physical model of a coaxial line from geometry and materials:
 *   Z_int = R + j omega L_int, the internal impedance of both conductors,
 *     solid round centre  (eta_s / (2 pi a)) I0(tau a) / I1(tau a),
 *     thick outer wall    (eta_s / (2 pi b)) K0(tau b) / K1(tau b),
 *     tau = (1 + j)/delta, eta_s = (1 + j)/(sigma delta), times
 *     conductor_loss_factor (modified Bessel functions of complex argument
 *     from their series and asymptotic forms, Abramowitz and Stegun 9.6.10,
 *     9.6.11, 9.6.13, 9.7.1, 9.7.2);
 *   L = mu0 / (2 pi) ln(b/a) + L_int;
 *   C = 2 pi eps0 eps_r / ln(b/a); G = omega C tan(delta);
 *   gamma = sqrt((R + j omega L)(G + j omega C)), exact.
 * a = inner radius, b = dielectric radius (= inner radius of the outer
 * conductor).  A stranded centre is modelled as a solid wire of its
 * effective diameter (the one that gives the nominal Z0).  The model holds
 * from the frequency at which the skin depth equals the inner radius (below
 * it the outer wall's real thickness, which the model does not know,
 * matters) up to the TE11 cut-off, about c / (pi (a + b) sqrt(eps_r));
 * outside that range the evaluation functions return CXL_EEXTRAPOLATE
 * unless CXL_LOSS_EXTRAPOLATE is given.  CXL_LOSS_THIN_SKIN replaces the
 * Bessel forms by the thin-skin (1 + j) Rs/(2 pi) (1/a + 1/b),
 * Rs = sqrt(pi f mu0 / sigma), for comparison; it is low by some 4 % on
 * RG-58 at 1.8 MHz.  A copper-clad centre (cxl_loss_model_set_clad) uses
 * the planar surface impedance of a layer over a second metal, which holds
 * from 3 skin depths of whichever of its two metals has the deeper one. */
typedef struct cxl_loss_model cxl_loss_model;

cxl_status cxl_loss_model_new(double inner_diameter_m,
                              double dielectric_diameter_m,
                              double relative_permittivity,
                              double loss_tangent,
                              double conductivity_s_per_m,
                              double conductor_loss_factor,
                              cxl_loss_model **model);
/* From a catalog cable: needs both diameters (CXL_ENOTFOUND otherwise);
 * the permittivity defaults to 1/vf^2, the loss tangent to 0; a clad
 * centre is used when the row gives one. */
cxl_status cxl_loss_model_new_cable(const cxl_catalog *catalog, size_t index,
                                    cxl_loss_model **model);
/* Make the centre conductor a clad one: a layer clad_thickness_m (>= 0,
 * below the centre radius) of the model's conductivity over a core (e.g.
 * steel, relative permeability >= 1).  Its surface impedance is that of a
 * layer over a second metal,
 *   Zs = eta1 (eta2 + eta1 tanh(g1 t)) / (eta1 + eta2 tanh(g1 t)),
 *   eta_i = (1 + j)/(sigma_i delta_i), g1 = (1 + j)/delta1;
 * a thickness of 0 makes the centre the core metal. */
cxl_status cxl_loss_model_set_clad(cxl_loss_model *model,
                                   double clad_thickness_m,
                                   double core_conductivity_s_per_m,
                                   double core_relative_permeability);
/* Frequency at which the skin depth of the cladding equals its thickness:
 * well above it the centre behaves as solid cladding metal, below it the
 * core carries a growing share of the current.  CXL_ENOTFOUND for a model
 * without cladding, CXL_ERANGE for a cladding of thickness 0. */
cxl_status cxl_loss_model_clad_crossover(const cxl_loss_model *model,
                                         double *freq_hz);
void cxl_loss_model_free(cxl_loss_model *model);
/* Frequencies where the model holds (see above). */
cxl_status cxl_loss_model_range(const cxl_loss_model *model,
                                double *min_freq_hz, double *max_freq_hz);
cxl_status cxl_loss_model_rlgc(const cxl_loss_model *model, double freq_hz,
                               unsigned flags, double *r_ohm_per_m,
                               double *l_h_per_m, double *g_s_per_m,
                               double *c_f_per_m);
/* Propagation constant gamma = alpha + j beta. */
cxl_status cxl_loss_model_gamma(const cxl_loss_model *model, double freq_hz,
                                unsigned flags, double *alpha_np_per_m,
                                double *beta_rad_per_m);
/* Matched attenuation, 20 log10(e) alpha. */
cxl_status cxl_loss_model_attenuation(const cxl_loss_model *model,
                                      double freq_hz, unsigned flags,
                                      double *loss_db_per_m);
/* Complex characteristic impedance. */
cxl_status cxl_loss_model_z0(const cxl_loss_model *model, double freq_hz,
                             unsigned flags, double *z0_re_ohm,
                             double *z0_im_ohm);
/* Phase velocity over c, omega / (beta c): slightly below the high-frequency
 * value at low frequency, where R / (omega L) is not small. */
cxl_status cxl_loss_model_vf(const cxl_loss_model *model, double freq_hz,
                             unsigned flags, double *vf);

/* Skin depth 1 / sqrt(pi f mu0 mu_r sigma). */
cxl_status cxl_loss_skin_depth_m(double freq_hz, double conductivity_s_per_m,
                                 double relative_permeability,
                                 double *depth_m);

/* Total loss of a line with matched loss matched_loss_db (>= 0) into a load
 * with standing-wave ratio swr (>= 1, CXL_ERANGE below): with
 * A = 10^(ML/10) and |G| = (swr - 1)/(swr + 1),
 * total = 10 log10[(A^2 - |G|^2) / (A (1 - |G|^2))] (real Z0). */
cxl_status cxl_loss_total_db(double matched_loss_db, double swr,
                             double *total_loss_db);
/* The same for a run: length_m (> 0) of line losing loss_db_per_m (>= 0). */
cxl_status cxl_loss_run_db(double loss_db_per_m, double length_m, double swr,
                           double *matched_loss_db, double *total_loss_db);
/* ---- array.c: pattern of a receive array (N elements; the duo is N = 2) - */

/* Model (stated here so every caller sees it): identical elements, no
 * mutual coupling between them, an ideal combiner that adds the element
 * signals.  Isotropic and wire elements are in FREE SPACE (no ground); the
 * short vertical stands over PERFECT GROUND, modelled by its image.
 *
 * Coordinates (one convention for every function and for the CLI's
 * pattern and array commands): x is forward, y to the right of forward,
 * z up, all in metres.  Azimuth is a compass bearing: 0 along +x (the
 * forward axis), turning CLOCKWISE seen from above, so azimuth 90 points
 * to +y (right), 180 backwards; elevation is measured up from the
 * horizontal plane.  A wave arriving from direction
 *     u = (cos el cos az, cos el sin az, sin el)
 * gives at element i (position r_i) the signal
 *     s_i = w_i E(u) exp(j k u.r_i),   w_i = a_i q_i exp(j (phi_i - 2 pi f tau_i))
 * with k = 2 pi f / c (positions are free-space distances), a_i the
 * element's relative voltage amplitude 10^(weight_db/20) (times the feed
 * line's loss, exp(-alpha L), for a line given with a cxl_loss_model),
 * q_i = -1 when its polarity is reversed, tau_i its feed delay (a fixed
 * delay plus its line's L / (VF c), or beta L / (2 pi f) for a modelled
 * line) and phi_i a fixed, frequency-independent phase offset (for
 * modelling a phase error).  The output is the sum of the s_i.
 *
 * Elements (one kind for the whole array):
 *   isotropic, E = 1;
 *   traveling-wave long wire of length L and wire velocity factor p lying
 *     along the forward axis, fed at its rear end and terminated at its
 *     front end, so it favours arrivals from the front:
 *     E = sin(t) sinc((pi L / lambda)(1/p - cos t)),  cos t = cos(el) cos(az),
 *     sinc(x) = sin(x)/x: the traveling-wave pattern (Kraus, Antennas,
 *     traveling-wave antennas) divided by pi L / lambda so that |E| <= 1.
 *     The wire VF shapes the element pattern only, never a feed delay;
 *   short vertical over perfect ground at height z (z = 0: a monopole on
 *     the ground): element and image give E = cos(el) 2 cos(k z sin el)
 *     above the ground and nothing below it, so one element at z = 0 has a
 *     response of 6 dB over a unit isotropic element at the horizon.
 *
 * Results:
 *   response: |sum s_i|^2 in dB over one isotropic element of unit
 *     amplitude (no integration; the cheapest call, for plots);
 *   gain: directivity in dBi, 4 pi |F|^2 / (integral of |F|^2 over the whole
 *     sphere); being lossless, gain equals directivity (feed-line loss only
 *     changes the element weights);
 *   front-to-back: response at azimuth 0 over azimuth 180 at one elevation;
 *   rear null: the deepest response over azimuth 90..270 at one elevation,
 *     its depth relative to the response at azimuth 0 (same elevation);
 *   beamwidth: the azimuth width, at one elevation, of the region around
 *     azimuth 0 where the response stays within 3 dB of the response at
 *     azimuth 0 (360 when it never falls 3 dB below it);
 *   RDF (receiving directivity factor): a response over the mean response
 *     over the UPPER HEMISPHERE (elevation 0..90).  The forward RDF uses
 *     the response at azimuth 0 and the evaluation elevation; the
 *     peak-referred RDF the largest response over the upper hemisphere.
 *     For free-space elements in one horizontal plane the pattern is
 *     symmetric about that plane, so hemisphere and sphere means agree and
 *     the peak-referred RDF equals the directivity; over ground (the
 *     vertical) the hemisphere mean is twice the sphere mean and the RDF
 *     is 3 dB below the gain, which is why the convention is stated.
 * Integrals: for isotropic and vertical elements the azimuth integral is
 * exact (the mean of exp(j k u.d) over azimuth is J0(k rho cos el) times
 * the vertical part) and the elevation integral uses Gauss-Legendre
 * (gsl_integration_glfixed); the wire uses Gauss-Legendre in elevation and
 * the trapezoid rule in azimuth; node counts are doubled until two
 * successive estimates agree to 1e-10 relative (CXL_ENOCONV otherwise).
 * Searches: the peak on a coarse grid of about four points per lobe,
 * refined by a GSL simplex from the best local maxima; the rear null by a
 * scan refined by GSL Brent minimisation; the beamwidth edges by a scan and
 * bisection.  The work grows with the electrical size S = k (D + H + L): D
 * the diagonal of the box holding the elements, H twice the largest height
 * for the vertical, L the wire length.  S above CXL_ARRAY_MAX_KSIZE (about
 * 48 wavelengths) returns CXL_ERANGE; cxl_array_max_freq gives the highest
 * frequency a geometry allows.
 * dB results are clamped to +-CXL_DB_LIMIT, so a perfect null reports
 * -CXL_DB_LIMIT rather than minus infinity.
 * Errors: CXL_EINVAL for NULL, NaN, infinity, an element index out of range,
 * an array without elements or an argument out of its stated domain;
 * CXL_ERANGE when a ratio has a zero reference (e.g. a long wire at
 * elevation 0 has no response along its own axis), or the pattern is zero
 * everywhere, or the array is electrically too large; errors of
 * cxl_loss_model_gamma for a modelled line (CXL_EEXTRAPOLATE outside its
 * range); CXL_ENOMEM; CXL_ENOCONV.
 *
 * The duo, the two-element model (cxl_duo, cxl_duo_gain, ...) is the same
 * model with element 0 at (x, y) = (+stagger/2, -spacing/2) (front left
 * for a positive stagger) and element 1 at (-stagger/2, +spacing/2):
 * spacing is the distance across the forward axis, stagger the offset
 * along it; element 1 is weaker by the imbalance.  It is evaluated by the
 * N-element code. */

#define CXL_DB_LIMIT 300.0

/* Largest number of elements of a cxl_array. */
#define CXL_ARRAY_MAX_ELEMENTS 256
/* Largest electrical size k (D + H + L) evaluated (see above). */
#define CXL_ARRAY_MAX_KSIZE 300.0

typedef enum {
    CXL_ELEMENT_ISOTROPIC = 0,
    CXL_ELEMENT_WIRE = 1,
    CXL_ELEMENT_VERTICAL = 2
} cxl_element_kind;

typedef struct cxl_array cxl_array;

/* A new array without elements, isotropic. */
cxl_status cxl_array_new(cxl_array **array);
void cxl_array_free(cxl_array *array);
cxl_status cxl_array_copy(const cxl_array *array, cxl_array **copy);
/* Append an element at (x_m, y_m, z_m) (each finite): no delay, normal polarity, weight 0 dB.  Its
 * index goes to *index (may be NULL).  CXL_ERANGE when the array already
 * holds CXL_ARRAY_MAX_ELEMENTS. */
cxl_status cxl_array_add(cxl_array *array, double x_m, double y_m,
                         double z_m, size_t *index);
/* Number of elements (0 for NULL). */
size_t cxl_array_count(const cxl_array *array);
cxl_status cxl_array_set_position(cxl_array *array, size_t i, double x_m,
                                  double y_m, double z_m);
/* The fixed part of element i's feed delay (>= 0); a line set below adds
 * its own delay. */
cxl_status cxl_array_set_delay(cxl_array *array, size_t i, double delay_s);
/* Element i's feed line: length_m >= 0 of lossless line of velocity factor
 * vf (delay L / (vf c)). */
cxl_status cxl_array_set_line(cxl_array *array, size_t i, double length_m,
                              double vf);
/* Element i's feed line from a loss model: at each frequency its phase
 * constant sets the delay and its attenuation the element's amplitude.
 * The model is used, not copied: it must outlive the array's use. */
cxl_status cxl_array_set_line_model(cxl_array *array, size_t i,
                                    double length_m,
                                    const cxl_loss_model *model);
/* Reverse element i's polarity (non-zero) or restore it (0). */
cxl_status cxl_array_set_reversed(cxl_array *array, size_t i, int reversed);
/* Element i's relative voltage amplitude in dB (|dB| <= 200). */
cxl_status cxl_array_set_weight(cxl_array *array, size_t i,
                                double weight_db);
/* A fixed phase added to element i at every frequency (any sign). */
cxl_status cxl_array_set_phase_offset(cxl_array *array, size_t i,
                                      double phase_deg);
/* The element pattern of every element; wire_length_m (> 0) and wire_vf
 * (in (0, 1]) are read for CXL_ELEMENT_WIRE only. */
cxl_status cxl_array_set_element(cxl_array *array, cxl_element_kind kind,
                                 double wire_length_m, double wire_vf);
/* Highest frequency the geometry can be evaluated at (electrical size
 * CXL_ARRAY_MAX_KSIZE); CXL_ERANGE when the array has no extent (then no
 * frequency is refused for its size). */
cxl_status cxl_array_max_freq(const cxl_array *array, double *freq_hz);

/* Complex output (relative to one unit isotropic element) for a wave from
 * azimuth_deg (any finite value), elevation_deg in [-90, 90]. */
cxl_status cxl_array_eval_field(const cxl_array *array, double freq_hz,
                                double azimuth_deg, double elevation_deg,
                                double *field_re, double *field_im);
/* |output|^2 in dB over one unit isotropic element. */
cxl_status cxl_array_eval_response(const cxl_array *array, double freq_hz,
                                   double azimuth_deg, double elevation_deg,
                                   double *response_db);
/* Gain (directivity) in dBi toward (azimuth_deg, elevation_deg). */
cxl_status cxl_array_eval_gain(const cxl_array *array, double freq_hz,
                               double azimuth_deg, double elevation_deg,
                               double *gain_dbi);
/* Gains in dBi at n >= 1 azimuths 360 i / n degrees (i = 0..n-1,
 * clockwise) at elevation_deg, written to gain_dbi[0..n-1]. */
cxl_status cxl_array_eval_pattern(const cxl_array *array, double freq_hz,
                                  double elevation_deg, size_t n,
                                  double *gain_dbi);
/* Front-to-back ratio in dB at elevation_deg. */
cxl_status cxl_array_eval_front_to_back(const cxl_array *array,
                                        double freq_hz, double elevation_deg,
                                        double *ratio_db);
/* Deepest response over azimuth 90..270 at elevation_deg: its azimuth
 * (degrees, in [90, 270]) and depth in dB relative to azimuth 0. */
cxl_status cxl_array_eval_rear_null(const cxl_array *array, double freq_hz,
                                    double elevation_deg, double *azimuth_deg,
                                    double *depth_db);
/* -3 dB azimuth beamwidth around azimuth 0 at elevation_deg, degrees (see
 * the model comment; 360 when the response never falls 3 dB). */
cxl_status cxl_array_eval_beamwidth(const cxl_array *array, double freq_hz,
                                    double elevation_deg, double *width_deg);
/* Direction of the largest response over the upper hemisphere. */
cxl_status cxl_array_eval_peak(const cxl_array *array, double freq_hz,
                               double *azimuth_deg, double *elevation_deg);
/* Directivity in dBi: peak over the mean over the WHOLE SPHERE. */
cxl_status cxl_array_eval_directivity(const cxl_array *array, double freq_hz,
                                      double *directivity_dbi);
/* Receiving directivity factors in dB over the UPPER-HEMISPHERE mean: the
 * forward one (response at azimuth 0, elevation_deg) and the peak-referred
 * one (largest response over the upper hemisphere). */
cxl_status cxl_array_eval_rdf(const cxl_array *array, double freq_hz,
                              double elevation_deg, double *rdf_forward_db,
                              double *rdf_peak_db);

/* ---- the duo: the two-element model (evaluated by the code above) ---- */

typedef struct cxl_duo cxl_duo;

/* A new duo: isotropic elements, spacing and stagger 0, no delays, no
 * phase offsets, no flip, no imbalance. */
cxl_status cxl_duo_new(cxl_duo **duo);
void cxl_duo_free(cxl_duo *duo);
cxl_status cxl_duo_copy(const cxl_duo *duo,
                        cxl_duo **copy);

/* spacing_m >= 0 across the forward axis; stagger_m of either sign along
 * it (negative puts element 1 in front).  Free-space distances. */
cxl_status cxl_duo_set_geometry(cxl_duo *duo,
                                double spacing_m, double stagger_m);
/* Feed delay of element 0 or 1 (>= 0), e.g. from a cable through
 * cxl_line_delay_from_length(). */
cxl_status cxl_duo_set_delay(cxl_duo *duo, int element,
                             double delay_s);
/* Feed delay given as phase_deg (>= 0) at design_freq_hz: a true time
 * delay of phase_deg / (360 design_freq_hz), so it scales with frequency. */
cxl_status cxl_duo_set_delay_deg(cxl_duo *duo, int element,
                                 double phase_deg,
                                 double design_freq_hz);
/* A fixed phase added to element 0 or 1 at every frequency (any sign). */
cxl_status cxl_duo_set_phase_offset(cxl_duo *duo,
                                    int element, double phase_deg);
/* Invert element 0 or 1 (flipped non-zero) or restore it (0). */
cxl_status cxl_duo_set_flip(cxl_duo *duo, int element,
                            int flipped);
/* Element 1 weaker than element 0 by imbalance_db (|dB| <= 200). */
/* The design feed of a staggered duo (the geometry's stagger must not be
 * 0; element A is ahead when it is positive): CXL_FEED_CROSSFIRE delays
 * the rear element by the stagger's free-space delay and inverts it
 * (broadband; design_freq_hz may be 0); CXL_FEED_ENDFIRE delays the front
 * element by 180 degrees minus the stagger's electrical length at
 * design_freq_hz (> 0), modulo 360, and inverts neither.  Sets both
 * elements' delays and inversions. */
typedef enum cxl_feed {
    CXL_FEED_CROSSFIRE = 0,
    CXL_FEED_ENDFIRE = 1
} cxl_feed;
cxl_status cxl_duo_set_feed(cxl_duo *duo, cxl_feed feed,
                            double design_freq_hz);
/* An element's feed delay (s) and inversion (0 or 1). */
cxl_status cxl_duo_feed(const cxl_duo *duo, int element,
                        double *delay_s, int *flipped);
/* As-built phase error of element B against A at freq_hz (degrees, B
 * lagging positive, wrapped to +-180): the change of B's delay over A's
 * from the design (design_delay_s[0..1]) to the lines as built
 * (built_delay_s[0..1], all >= 0), plus a fixed extra_phase_deg. */
cxl_status cxl_duo_built_phase(const double *design_delay_s,
                               const double *built_delay_s,
                               double extra_phase_deg, double freq_hz,
                               double *phase_error_deg);
cxl_status cxl_duo_set_imbalance(cxl_duo *duo,
                                 double imbalance_db);
cxl_status cxl_duo_set_isotropic(cxl_duo *duo);
/* Both elements become long wires: length_m > 0, wire_vf in (0, 1]. */
cxl_status cxl_duo_set_long_wire(cxl_duo *duo,
                                 double length_m, double wire_vf);

/* Complex output s_0 + s_1 (relative to one unit isotropic element) for a
 * wave from azimuth_deg (any finite value), elevation_deg in [-90, 90]. */
cxl_status cxl_duo_field(const cxl_duo *duo, double freq_hz,
                         double azimuth_deg, double elevation_deg,
                         double *field_re, double *field_im);
/* |s_0 + s_1|^2 in dB over one unit isotropic element. */
cxl_status cxl_duo_response(const cxl_duo *duo, double freq_hz,
                            double azimuth_deg, double elevation_deg,
                            double *response_db);
/* Gain (directivity) in dBi toward (azimuth_deg, elevation_deg). */
cxl_status cxl_duo_gain(const cxl_duo *duo, double freq_hz,
                        double azimuth_deg, double elevation_deg,
                        double *gain_dbi);
/* Gain toward the forward axis (azimuth 0) at elevation_deg. */
cxl_status cxl_duo_forward_gain(const cxl_duo *duo, double freq_hz,
                                double elevation_deg, double *gain_dbi);
/* Gains in dBi at n >= 1 azimuths 360 i / n degrees (i = 0..n-1) at
 * elevation_deg, written to gain_dbi[0..n-1]; one sphere integral. */
cxl_status cxl_duo_pattern(const cxl_duo *duo, double freq_hz,
                           double elevation_deg, size_t n,
                           double *gain_dbi);
/* Front-to-back ratio in dB at elevation_deg. */
cxl_status cxl_duo_front_to_back(const cxl_duo *duo,
                                 double freq_hz, double elevation_deg,
                                 double *ratio_db);
/* Deepest response over azimuth 90..270 at elevation_deg: its azimuth
 * (degrees, in [90, 270]) and depth in dB relative to azimuth 0. */
cxl_status cxl_duo_rear_null(const cxl_duo *duo, double freq_hz,
                             double elevation_deg, double *azimuth_deg,
                             double *depth_db);
/* Direction of the largest response over the upper hemisphere (elevation
 * 0..90), found on a grid and refined by a GSL simplex minimizer. */
cxl_status cxl_duo_peak(const cxl_duo *duo, double freq_hz,
                        double *azimuth_deg, double *elevation_deg);
/* Directivity in dBi: peak over the mean over the WHOLE SPHERE. */
cxl_status cxl_duo_directivity(const cxl_duo *duo, double freq_hz,
                               double *directivity_dbi);
/* Receiving directivity factor in dB: peak over the mean over the UPPER
 * HEMISPHERE (the peak-referred RDF of the model comment above). */
cxl_status cxl_duo_rdf(const cxl_duo *duo, double freq_hz,
                       double *rdf_db);

/* Closed form, any duo: the null of an otherwise perfect duo whose
 * second signal has a phase error phase_error_deg and is weaker by
 * imbalance_db, relative to the coherent maximum (1 + a)^2, a =
 * 10^(-imbalance_db/20):  10 log10((1 - 2 a cos d + a^2) / (1 + a)^2).
 * With a = 1 this is 20 log10|sin(d/2)|; with d = 0 it is
 * 20 log10|(1 - a)/(1 + a)|.  |imbalance_db| <= 200. */
cxl_status cxl_duo_null_depth(double phase_error_deg, double imbalance_db,
                              double *depth_db);

/* ---- budget.c: what the errors may cost (inverse of array.c) ------------ */

/* Largest phase error (degrees, in [0, 180]) that still keeps the closed-
 * form null (cxl_duo_null_depth) at or below depth_db (< 0) with the
 * given amplitude imbalance: with a = 1, d = 2 asin(10^(depth_db/20)).
 * CXL_ERANGE when the imbalance alone already makes the null shallower
 * than depth_db. */
cxl_status cxl_budget_phase_for_null(double depth_db, double imbalance_db,
                                     double *phase_error_deg);
/* Largest phase error added to element 1 (either sign; the smaller of the
 * two limits is returned) for which the duo's front-to-back ratio at
 * freq_hz and elevation_deg stays at or above ratio_db.  Found by a scan in
 * 0.25-degree steps and refined with gsl_root_fsolver_brent.  CXL_ERANGE
 * when the error-free pair already misses ratio_db; 180 when no error up to
 * 180 degrees brings the ratio below ratio_db. */
cxl_status cxl_budget_phase_for_front_to_back(const cxl_duo *duo,
                                              double ratio_db,
                                              double freq_hz,
                                              double elevation_deg,
                                              double *phase_error_deg);
/* Largest phase error on element 1 (either sign; the smaller of the two
 * limits is returned, in [0, 180]) for which the duo's rear null at
 * freq_hz and elevation_deg, measured as cxl_duo_rear_null measures it
 * (deepest response over azimuth 90..270 relative to the response at
 * azimuth 0), stays at or below depth_db (-CXL_DB_LIMIT <= depth_db < 0).
 * This is the null relative to the forward response of the geometry
 * given, not to the in-phase sum (cxl_budget_phase_for_null): for a compact
 * duo it allows much less error.  The duo is the design (its imbalance
 * and element type count); each trial error replaces element 1's fixed
 * phase offset on a private copy (cxl_duo_set_phase_offset, B
 * lagging positive), the caller's duo is not changed.  The tolerance also
 * ends where an error cancels the forward response (a compact duo whose
 * pattern turns round).  Found by a scan in
 * 0.25-degree steps and refined with gsl_root_fsolver_brent.  CXL_ERANGE
 * when the error-free duo's null is already shallower than depth_db (or
 * the duo has no forward response); 180 when no error up to 180 degrees
 * makes the null shallower than depth_db. */
cxl_status cxl_budget_phase_for_rear_null(const cxl_duo *duo,
                                          double depth_db,
                                          double freq_hz,
                                          double elevation_deg,
                                          double *phase_error_deg);
/* Length mismatch of a line with velocity factor vf that makes
 * phase_error_deg (>= 0) at freq_hz (cxl_line_length_from_degrees). */
cxl_status cxl_budget_length_for_phase(double phase_error_deg,
                                       double vf, double freq_hz,
                                       double *length_m);

/* ---- hybrid.c: 0-degree combiner and transformer values ---------------- */

/* In-phase two-way combiner for port impedance z_port_ohm: isolation
 * resistor 2 Z and common-port impedance Z / 2 before any transformer. */
cxl_status cxl_hybrid_inphase(double z_port_ohm, double *isolation_ohm,
                              double *common_ohm);
/* Turns ratio (turns on the z_to side over turns on the z_from side) of an
 * ideal transformer that steps z_from_ohm to z_to_ohm: sqrt(z_to/z_from). */
cxl_status cxl_hybrid_turns_ratio(double z_from_ohm, double z_to_ohm,
                                  double *turns_ratio);
/* An ideal transformer with p_turns on the z_common side and q_turns on
 * the line side presents z_common (q/p)^2 to the line; its reflection
 * against z_line is Gamma = (Zx - Z)/(Zx + Z), SWR = (1 + |G|)/(1 - |G|),
 * return loss -20 log10|G| (CXL_DB_LIMIT for a perfect match). */
cxl_status cxl_hybrid_match(double z_common_ohm, double z_line_ohm,
                            unsigned p_turns, unsigned q_turns,
                            double *z_presented_ohm, double *swr,
                            double *return_loss_db);
/* The best turns pairs p:q (both 1..max_turns, max_turns <= 256, in lowest
 * terms) for stepping z_common_ohm to z_line_ohm, best first: ranked by
 * |Gamma| of the presented impedance against z_line_ohm, ties (within
 * 1e-12) going to fewer total turns.  Up to capacity pairs are written to
 * p_turns[] and q_turns[]; *count is how many. */
cxl_status cxl_hybrid_turns_search(double z_common_ohm, double z_line_ohm,
                                   unsigned max_turns, size_t capacity,
                                   unsigned *p_turns, unsigned *q_turns,
                                   size_t *count);
/* One input of an ideal in-phase combiner driven from a matched source of
 * unit available power.  Model: the ideal equal-split S-matrix with the
 * common port as port 1 and real entries, S12 = S13 = 1/sqrt(2), all other
 * entries 0 (the Wilkinson form with its quarter-wave phase removed; Pozar,
 * Microwave Engineering, 4th ed., sec. 7.3).  The common port is loaded with
 * reflection gamma_common, the other (idle) input with gamma_idle
 * (|Gamma| <= 1, each given as real and imaginary parts).  Then
 *   b1 = s / (1 - s^2 Gc Gi),  b3 = s Gc b1,  s = 1/sqrt(2):
 * *common_db = 10 log10(|b1|^2 (1 - |Gc|^2)), the power delivered to the
 * common-port load (-3.01 dB when all is matched); *isolation_db =
 * -20 log10|b3|, the wave leaving the idle input (what a matched receiver
 * there sees).  All matched: infinite isolation (reported as CXL_DB_LIMIT);
 * an open common port: 6.02 dB.  An idle input's own load changes nothing
 * while the common port is matched. */
cxl_status cxl_hybrid_response(double gamma_common_re,
                               double gamma_common_im,
                               double gamma_idle_re, double gamma_idle_im,
                               double *common_db, double *isolation_db);

/* A catalog cable's loss, from the model the trade would choose: the fit
 * to its attenuation table where it has two or more points, else the
 * physical model from its geometry (CXL_ENOTFOUND when it has neither).
 * cxl_loss_cable_kind says which was used; cxl_loss_cable_range gives the
 * usable range (the fit's with its margin, or the model's), outside which
 * cxl_loss_cable_db_per_m returns CXL_EEXTRAPOLATE unless
 * CXL_LOSS_EXTRAPOLATE is given (its only flag). */
typedef struct cxl_loss_cable cxl_loss_cable;
typedef enum cxl_loss_kind {
    CXL_LOSS_KIND_FIT = 0,      /* a sqrt(f) + b f fitted to the table */
    CXL_LOSS_KIND_PHYSICAL = 1  /* RLGC from the geometry */
} cxl_loss_kind;
cxl_status cxl_loss_cable_new(const cxl_catalog *catalog, size_t index,
                              cxl_loss_cable **loss);
void cxl_loss_cable_free(cxl_loss_cable *loss);
cxl_status cxl_loss_cable_kind(const cxl_loss_cable *loss,
                               cxl_loss_kind *kind);
cxl_status cxl_loss_cable_range(const cxl_loss_cable *loss,
                                double *min_freq_hz, double *max_freq_hz);
cxl_status cxl_loss_cable_db_per_m(const cxl_loss_cable *loss,
                                   double freq_hz, unsigned flags,
                                   double *loss_db_per_m);
/* Matched loss of line B minus that of line A (dB; B weaker when
 * positive) at freq_hz, no extrapolation. */
cxl_status cxl_loss_cable_difference(const cxl_loss_cable *loss,
                                     double length_a_m, double length_b_m,
                                     double freq_hz, double *loss_db);

/* ---- transfer.c: a line into a load ----------------------------------- */

/* Voltage transfer of length_m (>= 0) of line with propagation constant
 * gamma = alpha + j beta (alpha >= 0, beta > 0, per metre) and
 * characteristic impedance Z0 (Re Z0 > 0) into a load ZL (Re ZL >= 0):
 *     V_load / V_in = (1 + G) / (e^{gamma l} + G e^{-gamma l}),
 *     G = (ZL - Z0) / (ZL + Z0)
 * (Pozar, Microwave Engineering, 4th ed., sec. 2.3 and 2.7).  A lossless
 * half wave gives -1 into any load; a lossless quarter wave gives
 * -j ZL / Z0.  CXL_ERANGE when the load is a short (no voltage, no phase),
 * when the line turns a reactive load into a short at its input, or when
 * alpha l exceeds 345 Np.  A very high-impedance load (a probe, an open
 * end) is given as a large resistance, e.g. 1e9 ohm. */
cxl_status cxl_transfer_ratio(double length_m, double z0_re_ohm,
                              double z0_im_ohm, double alpha_np_per_m,
                              double beta_rad_per_m, double load_re_ohm,
                              double load_im_ohm, double *ratio_re,
                              double *ratio_im);
/* A ratio as 20 log10 |ratio| (dB; above 0 where the load sees more
 * voltage than the input) and as a delay in degrees: minus its phase
 * angle, taken within 180 degrees of electrical_deg (the line's own
 * electrical length, beta l) so that whole turns are kept.  The delay
 * equals electrical_deg into a matched load and departs from it into any
 * other: that departure is what a mismatched load adds to a phasing line.
 * CXL_ERANGE when |ratio| is 0 or overflows, or the delay overflows. */
cxl_status cxl_transfer_delay(double ratio_re, double ratio_im,
                              double electrical_deg, double *transfer_db,
                              double *delay_deg);
/* A lossless line of real impedance z0_ohm and velocity factor vf at
 * freq_hz: transfer in dB, delay in degrees, and the electrical length
 * 360 f l / (vf c) in degrees (electrical_deg may be NULL; CXL_ERANGE when
 * the phase constant or that length over- or underflows). */
cxl_status cxl_transfer_lossless(double length_m, double z0_ohm, double vf,
                                 double freq_hz, double load_re_ohm,
                                 double load_im_ohm, double *transfer_db,
                                 double *delay_deg, double *electrical_deg);
/* The same for a physical cable model (complex gamma and Z0 at freq_hz,
 * flags as for cxl_loss_model_gamma); electrical_deg is beta l. */
cxl_status cxl_transfer_model(const cxl_loss_model *model, double length_m,
                              double freq_hz, unsigned flags,
                              double load_re_ohm, double load_im_ohm,
                              double *transfer_db, double *delay_deg,
                              double *electrical_deg);
/* Input impedance Z0 (1 + G e^{-2 gamma l}) / (1 - G e^{-2 gamma l}) of the
 * same line and load; CXL_ERANGE when it is an open circuit. */
cxl_status cxl_transfer_input_impedance(double length_m, double z0_re_ohm,
                                        double z0_im_ohm,
                                        double alpha_np_per_m,
                                        double beta_rad_per_m, double load_re_ohm,
                                        double load_im_ohm, double *zin_re_ohm,
                                        double *zin_im_ohm);
/* What an analyzer shows on length_m of a modelled cable with its far end
 * open or shorted: the frequency of the order-th series resonance, where
 * the input reactance of Z0 coth(gamma l) (open) or Z0 tanh(gamma l)
 * (shorted) crosses zero near the point where the line is (2n-1)/4 or n/2
 * wavelengths long.  Found with GSL's Brent solver; it carries the model's
 * low-frequency VF drop and its complex Z0.  CXL_EEXTRAPOLATE when the
 * search leaves the model's range (unless CXL_LOSS_EXTRAPOLATE),
 * CXL_ENOCONV when no zero crossing is found (a very lossy line). */
cxl_status cxl_transfer_stub_resonance(const cxl_loss_model *model,
                                       unsigned flags, cxl_stub_end end,
                                       int order, double length_m,
                                       double *resonance_hz);
/* The three things an analyzer may call the dip of a series resonance:
 * the input reactance crossing zero, the minimum of |Z_in|, the minimum
 * SWR against the analyzer's real reference impedance.  On a lossy line
 * they lie at slightly different frequencies. */
typedef enum cxl_dip_kind {
    CXL_DIP_ZERO_X = 0,
    CXL_DIP_MIN_Z = 1,
    CXL_DIP_MIN_SWR = 2
} cxl_dip_kind;
/* The same resonance read as a dip of that kind: the reactance zero as
 * above, then for CXL_DIP_MIN_Z and CXL_DIP_MIN_SWR the minimum within
 * 1/16 wavelength of it by GSL's Brent minimiser.  ref_ohm (> 0 always)
 * is the analyzer's reference for CXL_DIP_MIN_SWR.  wave_hz (may be
 * NULL) gets the frequency at which the line is exactly (2n-1)/4 or n/2
 * wavelengths long: dip_hz / wave_hz is what a reading of that kind is
 * off by, the correction a fit divides out.  Errors as
 * cxl_transfer_stub_resonance; CXL_ENOCONV when no minimum lies there: a
 * line whose |Z0| is at or below the reference shows no SWR dip at its
 * series resonances (its input stays on a circle of nearly constant SWR,
 * closest to the reference at the anti-resonances). */
cxl_status cxl_transfer_stub_dip(const cxl_loss_model *model, unsigned flags,
                                 cxl_stub_end end, int order, double length_m,
                                 cxl_dip_kind kind, double ref_ohm,
                                 double *dip_hz, double *wave_hz);

/* ---- drift.c: velocity factor against frequency ------------------------ */

/* VF(f) = vf_hf - drop / sqrt(f), fitted by weighted least squares (GSL)
 * in 1/sqrt(f).  Physical reason: the conductors' internal inductance,
 * R / omega, falls as 1/sqrt(f) in the skin-effect regime, and the phase
 * velocity of a low-loss line drops by half its ratio to the external
 * inductance (see drift.c).  A clad centre below its crossover frequency
 * does not follow this law. */
typedef struct cxl_drift cxl_drift;

/* From n readings: frequency, VF and (vf_errs may be NULL) its standard
 * error, used as weight 1/err^2.  CXL_ERANGE unless there are two distinct
 * frequencies; with two points the line goes through both. */
cxl_status cxl_drift_new(const double *freqs_hz, const double *vfs,
                         const double *vf_errs, size_t n, cxl_drift **drift);
/* From the per-reading VFs of a stub fit; freq_res_hz (>= 0) the analyzer's
 * resolution, which weights each reading by its VF error VF df / f (equal
 * weights when 0; CXL_ERANGE when that error under- or overflows). */
cxl_status cxl_drift_new_stub(const cxl_stub_result *result,
                              double freq_res_hz, cxl_drift **drift);
void cxl_drift_free(cxl_drift *drift);
/* vf_hf (the limit at high frequency) and drop (VF times sqrt(Hz)). */
cxl_status cxl_drift_coefficients(const cxl_drift *drift, double *vf_hf,
                                  double *drop_sqrt_hz);
/* Lowest and highest reading frequency. */
cxl_status cxl_drift_range(const cxl_drift *drift, double *min_freq_hz,
                           double *max_freq_hz);
/* VF at freq_hz from the trend and its standard error from the fit's
 * covariance (vf_err may be NULL; 0 without redundant or weighted
 * readings).  Extrapolation is allowed: compare with cxl_drift_range.
 * CXL_ERANGE when the trend leaves (0, 1] there. */
cxl_status cxl_drift_vf(const cxl_drift *drift, double freq_hz, double *vf,
                        double *vf_err);
/* Largest relative drop c of VF(f) / VF_hf = 1 - c / sqrt(f), in sqrt(Hz),
 * the drift allowance assumes: it covers the physical model of every
 * built-in cable from 0.3 to 150 MHz with room to spare (see drift.c). */
#define CXL_DRIFT_MAX_DROP_SQRT_HZ 120.0
/* What one reading at from_hz says about the VF at to_hz when the trend is
 * unknown (c anywhere from 0 to CXL_DRIFT_MAX_DROP_SQRT_HZ): VF(to) =
 * VF(from) * factor, within +- VF(from) * rel_halfwidth (a bound, not a
 * standard error).  CXL_ERANGE below 4 c_max^2 (57.6 kHz), where the law
 * no longer holds. */
cxl_status cxl_drift_allowance(double from_hz, double to_hz, double *factor,
                               double *rel_halfwidth);

/* ---- trim.c: cut long, measure, trim ---------------------------------- */

/* A piece of cable of physical length length_m, cut long, whose series
 * resonances were read on an analyzer with its far end open or shorted.
 * The readings give the VF of this piece (per order, and a drift trend
 * over several orders); the target gives the length it must have; the
 * result says how much to cut off and what the analyzer should show
 * after the cut. */
typedef struct cxl_trim cxl_trim;
typedef struct cxl_trim_result cxl_trim_result;

typedef enum cxl_trim_action {
    CXL_TRIM_CUT = 0,    /* cut off more than the measurement resolves */
    CXL_TRIM_WITHIN = 1, /* on target within the resolution: stop, or read a
                          * higher order to resolve the rest */
    CXL_TRIM_SHORT = 2   /* shorter than the target beyond the resolution:
                          * it needs lengthening (cut a new piece) */
} cxl_trim_action;

/* Result flags beyond the CXL_STUB_FLAG_* ones of the reading fit. */
#define CXL_TRIM_FLAG_DRIFT        0x100u /* target VF from the drift trend */
#define CXL_TRIM_FLAG_EXTRAPOLATED 0x200u /* target frequency outside the readings */
#define CXL_TRIM_FLAG_MODEL        0x400u /* readings corrected with a cable model */
#define CXL_TRIM_FLAG_ALLOWANCE    0x800u /* target VF from the nearest reading and
                                           * the drift allowance (trend unknown) */

cxl_status cxl_trim_new(cxl_stub_end end, double length_m, cxl_trim **trim);
void cxl_trim_free(cxl_trim *trim);
/* Empty the trim for another piece, as cxl_trim_new leaves it (no
 * readings, fixture, model, allowance or target), keeping its memory. */
cxl_status cxl_trim_reset(cxl_trim *trim, cxl_stub_end end, double length_m);
/* What sits between the analyzer and the piece while measuring (tee,
 * adapters, a jumper; not part of the finished piece): fixture_m of line
 * with velocity factor fixture_vf, or of the piece's own cable when
 * fixture_vf is 0; fixture_tol_m (>= 0) the uncertainty of that length,
 * which limits the resolution.  Default: none. */
cxl_status cxl_trim_set_fixture(cxl_trim *trim, double fixture_m,
                                double fixture_vf, double fixture_tol_m);
/* Optional: a physical model of the piece's cable (kept by reference: it
 * must outlive the trim; NULL removes it).  On a lossy line with a complex
 * Z0 the input reactance crosses zero slightly above the frequency at
 * which the line is exactly (2n-1)/4 or n/2 wavelengths long (by about
 * 1e-4 relative on solid-PE cable at 2 MHz); with a model each reading is
 * moved back by that offset (cxl_transfer_stub_resonance) before the fit,
 * and the expected readings after the cut carry it again.  The model's
 * own VF does not enter: only the offset ratio. */
cxl_status cxl_trim_set_model(cxl_trim *trim, const cxl_loss_model *model);
/* The analyzer's frequency resolution (step), >= 0, default 0. */
cxl_status cxl_trim_set_resolution(cxl_trim *trim, double freq_res_hz);
/* What the readings are (default CXL_DIP_ZERO_X, reference 50 ohm; ref_ohm
 * > 0 always, used by CXL_DIP_MIN_SWR).  With a model each kind is moved
 * back by its own offset (cxl_transfer_stub_dip); without one the
 * readings are taken as they are. */
cxl_status cxl_trim_set_reading(cxl_trim *trim, cxl_dip_kind kind,
                                double ref_ohm);
/* Length already in connectors or adapters that the target counts but the
 * piece does not hold (>= 0, default 0), at allowance_vf, or at the
 * piece's VF at the target when allowance_vf is 0. */
cxl_status cxl_trim_set_allowance(cxl_trim *trim, double allowance_m,
                                  double allowance_vf);
/* One low-impedance reading in any order of frequency; order >= 1, or 0
 * when not known (all readings give one, or none does; unknown orders are
 * inferred as those that best fit one fundamental).  CXL_EINVAL for a
 * frequency or order given twice. */
cxl_status cxl_trim_add_reading(cxl_trim *trim, double freq_hz, int order);
size_t cxl_trim_count(const cxl_trim *trim);
/* The target (the last one set counts): phase_deg (> 0) of electrical
 * length at freq_hz; */
cxl_status cxl_trim_target_degrees(cxl_trim *trim, double phase_deg,
                                   double freq_hz);
/* a delay (> 0) at freq_hz, or with freq_hz 0 at the fitted VF of the
 * readings; */
cxl_status cxl_trim_target_delay(cxl_trim *trim, double delay_s,
                                 double freq_hz);
/* or the electrical length of a reference piece whose order-th resonance
 * with far end `end` read freq_hz through the same fixture. */
cxl_status cxl_trim_target_resonance(cxl_trim *trim, cxl_stub_end end,
                                     int order, double freq_hz);
/* Fit the readings and compute the cut.  CXL_EINVAL without readings or
 * target; CXL_ERANGE when a reading implies no plausible VF (0.5 to 1), the
 * target is not positive after the fixture or a resolution overflows;
 * CXL_EINCONSISTENT when given orders do not rise with frequency. */
cxl_status cxl_trim_solve(const cxl_trim *trim, cxl_trim_result **result);
void cxl_trim_result_free(cxl_trim_result *result);
/* A result to solve into with cxl_trim_solve_into, empty until then;
 * solved piece after piece it allocates only for more readings than
 * before.  On failure it is left empty (its functions return CXL_EINVAL)
 * and the status is cxl_trim_solve's. */
cxl_status cxl_trim_result_new(cxl_trim_result **result);
cxl_status cxl_trim_solve_into(const cxl_trim *trim, cxl_trim_result *result);
/* Length to cut off (negative: the piece is short), the length that will
 * remain, the uncertainty of that length (remaining times the relative
 * uncertainty of the VF at the target, cxl_stub_result_vf_at: the step of
 * the frequency resolution, the drift trend's error or the drift
 * allowance when the trend is unknown; without a target frequency VF
 * df / f of the one reading or the fit's budget; the fixture uncertainty
 * in quadrature) and what to do.  Any output may be NULL. */
cxl_status cxl_trim_result_cut(const cxl_trim_result *result,
                               double *cut_off_m, double *remaining_m,
                               double *resolution_m, cxl_trim_action *action);
/* The VF fitted over all readings (one value), the VF used at the target
 * frequency (drift trend with two or more readings, else the one
 * reading's; the fitted value without a target frequency) and that
 * frequency (0 when none).  Any output may be NULL. */
cxl_status cxl_trim_result_vf(const cxl_trim_result *result, double *vf_fit,
                              double *vf_target, double *target_freq_hz);
cxl_status cxl_trim_result_flags(const cxl_trim_result *result,
                                 unsigned *flags);
size_t cxl_trim_result_count(const cxl_trim_result *result);
/* Reading index, in ascending frequency: its frequency, order (given or
 * inferred), the VF it implies, the frequency it should read after the
 * cut, and the length that a step of the frequency resolution makes at
 * that order.  Any output may be NULL. */
cxl_status cxl_trim_result_reading(const cxl_trim_result *result,
                                   size_t index, double *freq_hz, int *order,
                                   double *vf, double *expected_hz,
                                   double *resolution_m);

/* ---- sweep.c: one-port analyzer sweeps --------------------------------- */

/* A one-port sweep read from a file: frequency points and the reflection
 * coefficient against the file's reference, from which Z(f) and Gamma(f)
 * against any reference follow.  Formats (chosen from the first line that
 * is neither blank nor a comment):
 *   - Touchstone 1.0: "! comments", an option line
 *     "# Hz|kHz|MHz|GHz S|Z|Y RI|MA|DB R n" (any order, case ignored; a
 *     missing option line or item takes the defaults GHz S MA R 50; later
 *     option lines are ignored), then "freq a b" per point.  Z and Y data
 *     are normalised to R (z = Z / R, y = Y R).
 *   - Touchstone 2.0: "[Version] 2.0", the option line, "[Number of Ports]
 *     1", optional "[Number of Frequencies] n" (checked), "[Reference] R"
 *     (overrides the option line's R), "[Matrix Format]", "[Begin
 *     Information]...[End Information]" (skipped), "[Network Data]", the
 *     points, "[End]".  Z and Y data are in ohms and siemens, not
 *     normalised.
 *   - CSV: a header naming freq_hz or freq_mhz and one of the column sets
 *     r_ohm,x_ohm | z_ohm,z_deg | s11_re,s11_im | s11_db,s11_deg | swr
 *     (s11 and swr against 50 ohm).  An swr column holds the magnitude of
 *     the reflection only: no reactance, no sign of the mismatch, so only
 *     SWR minima and no Z, reactance crossing, fit or distance-to-fault
 *     profile come from it (CXL_ENOTFOUND there).
 * Every frequency must be finite, >= 0 and above the one before; every
 * value finite; no line longer than CXL_SWEEP_MAX_LINE bytes; text only
 * (a NUL or other control byte is binary data).  Memory grows with the
 * number of points only. */
typedef struct cxl_sweep cxl_sweep;

#define CXL_SWEEP_MAX_LINE 4096

typedef enum cxl_sweep_source {
    CXL_SWEEP_TOUCHSTONE1 = 0,
    CXL_SWEEP_TOUCHSTONE2 = 1,
    CXL_SWEEP_CSV = 2
} cxl_sweep_source;

/* Read a sweep from a stream the caller owns (read to its end).  On error
 * nothing is kept: CXL_EPARSE for anything the format does not allow
 * (empty file, bad option, two-port data, a missing or extra column, a
 * non-number, NaN or infinity, a frequency not above the one before, a line
 * over CXL_SWEEP_MAX_LINE bytes, binary data), CXL_ENOMEM, CXL_EIO; then
 * *error_line (may be NULL) is the 1-based line at fault (0 when the whole
 * file is) and error_text (may be NULL) gets one line "what is wrong
 * (expected ...)". */
cxl_status cxl_sweep_read(FILE *stream, cxl_sweep **sweep, size_t *error_line,
                          char *error_text, size_t error_size);
/* The same from size bytes of text (no terminating NUL needed). */
cxl_status cxl_sweep_read_buffer(const char *text, size_t size, cxl_sweep **sweep,
                                 size_t *error_line, char *error_text,
                                 size_t error_size);
void cxl_sweep_free(cxl_sweep *sweep);
/* Number of points; 0 for NULL. */
size_t cxl_sweep_count(const cxl_sweep *sweep);
/* First and last frequency, the file's reference impedance, its format and
 * whether it holds the phase (0 for an swr column).  Any output may be
 * NULL. */
cxl_status cxl_sweep_info(const cxl_sweep *sweep, double *start_hz, double *stop_hz,
                          double *reference_ohm, cxl_sweep_source *source,
                          int *has_phase);
/* Point index against reference_ohm (> 0): frequency, reflection
 * coefficient Gamma = (Z - Zref)/(Z + Zref) and impedance.  Any output may
 * be NULL.  CXL_ENOTFOUND for a sweep without phase; CXL_ERANGE when Z is
 * an open circuit (Gamma = 1) and z_re_ohm or z_im_ohm is asked for. */
cxl_status cxl_sweep_point(const cxl_sweep *sweep, size_t index, double reference_ohm,
                           double *freq_hz, double *gamma_re, double *gamma_im,
                           double *z_re_ohm, double *z_im_ohm);
/* |Gamma| of point index against reference_ohm (SWR = (1 + |G|)/(1 - |G|)).
 * A sweep without phase gives it only against its own reference
 * (CXL_ENOTFOUND for any other). */
cxl_status cxl_sweep_magnitude(const cxl_sweep *sweep, size_t index,
                               double reference_ohm, double *freq_hz,
                               double *gamma_mag);

/* Resonances of a sweep.  Kinds (what an analyzer's "dip" can mean):
 *   CXL_SWEEP_X_ZERO  the reactance crosses zero, interpolated linearly
 *                     between the two points around it (in X for a series
 *                     resonance, where X rises through zero; in the
 *                     susceptance for a parallel one, where X falls);
 *   CXL_SWEEP_Z_MIN   a minimum of |Z|;
 *   CXL_SWEEP_SWR_MIN a minimum of SWR against the reference;
 * minima are the vertex of the parabola through the lowest point and its
 * two neighbours (in |Z|^2 and |Gamma|^2, which are smooth there), and
 * count only when both sides rise by at least CXL_SWEEP_MIN_PROMINENCE
 * (a ratio of |Z| or of SWR) before a lower point.  Each resonance has a
 * frequency uncertainty of half the point spacing around it: the truth
 * lies within it wherever the sweep samples the curve finely enough to
 * show the resonance at all (a half step bounds linear and parabolic
 * interpolation errors; tests/check_sweep.c checks it by simulation). */
typedef enum cxl_sweep_kind {
    CXL_SWEEP_X_ZERO = 0,
    CXL_SWEEP_Z_MIN = 1,
    CXL_SWEEP_SWR_MIN = 2
} cxl_sweep_kind;

#define CXL_SWEEP_MIN_PROMINENCE 1.4142135623730951

typedef struct cxl_sweep_res cxl_sweep_res;

/* Find the resonances against reference_ohm (> 0) and number them for a
 * line whose far end is `end`: a series (low impedance) resonance is the
 * n-th at (2n-1)/4 wavelength (open) or n/2 (short), a parallel one the
 * n-th at n/2 (open) or (2n-1)/4 (short).  With length_m and vf_guess
 * both > 0 the order is the nearest one for that line; with both 0 it is
 * inferred from the spacing of consecutive series resonances (half a
 * wavelength apart), and is 0 (unknown) when the sweep shows fewer than
 * two.  CXL_EINVAL for one of the two 0 and the other not. */
cxl_status cxl_sweep_resonances(const cxl_sweep *sweep, double reference_ohm,
                                cxl_stub_end end, double length_m, double vf_guess,
                                cxl_sweep_res **res);
void cxl_sweep_res_free(cxl_sweep_res *res);
/* Number of resonances (all kinds, ascending frequency); 0 for NULL. */
size_t cxl_sweep_res_count(const cxl_sweep_res *res);
/* Resonance index: its kind, 1 for series and 0 for parallel, its order
 * (0 when unknown), frequency and uncertainty, and the value there (R in
 * ohm at a reactance zero, |Z| in ohm at a |Z| minimum, the SWR at an SWR
 * minimum).  Any output may be NULL. */
cxl_status cxl_sweep_res_get(const cxl_sweep_res *res, size_t index,
                             cxl_sweep_kind *kind, int *series, int *order,
                             double *freq_hz, double *freq_err_hz, double *value);
/* The series resonances of one kind as readings for cxl_stub_add_reading
 * and cxl_trim_add_reading: up to max frequencies and orders (0 when
 * unknown) in ascending frequency, *count how many were written. */
cxl_status cxl_sweep_res_readings(const cxl_sweep_res *res, cxl_sweep_kind kind,
                                  double *freq_hz, int *order, size_t max,
                                  size_t *count);

/* ---- sweepfit.c: the line fitted to a whole sweep ---------------------- */

/* A piece of line of known length, swept at one end with the far end open,
 * shorted or on a known load, fitted to the line model over every point
 * of the sweep: VF(f) = vf_hf - drop / sqrt(f) (the law of cxl_drift),
 * attenuation a sqrt(f) + b f in dB/m (as cxl_loss_fit), a real Z0, and
 * optionally the length of a fixture (a lossless line matched to the
 * sweep's reference, VF fixture_vf, or the piece's vf_hf with 0) between
 * the reference plane and the piece.  The input reflection is Pozar,
 * Microwave Engineering, 4th ed., eq. 2.44; the residuals are the real
 * and imaginary parts of Gamma against the sweep's own reference; GSL's
 * nonlinear least squares (Levenberg-Marquardt) starts from the sweep's
 * series resonances (numbered from their spacing) and |Z|.  The
 * uncertainties are one standard deviation from the fit's covariance,
 * scaled by the residual (chi^2 per degree of freedom): they hold where
 * the model does and the noise is the same at every point.
 * Far end: `end` (CXL_STUB_OPEN or CXL_STUB_SHORT) or, with
 * CXL_SWEEPFIT_LOAD, load_re_ohm (>= 0) + j load_im_ohm (both 0 without
 * the flag).  Errors: CXL_EINVAL (bad argument, a fixture VF without
 * CXL_SWEEPFIT_FIXTURE), CXL_ENOTFOUND (a sweep without phase),
 * CXL_EEXTRAPOLATE (fewer than two series resonances of one kind, or fewer
 * points than parameters + 2: the model cannot be pinned down),
 * CXL_ENOCONV (no fit, or one outside any line: VF not in (0, 1], Z0 not
 * above 0), CXL_ERANGE, CXL_ENOMEM.  A DC point is left out. */
typedef struct cxl_sweepfit cxl_sweepfit;

#define CXL_SWEEPFIT_LOAD    0x1u /* far end on load_re_ohm + j load_im_ohm */
#define CXL_SWEEPFIT_FIXTURE 0x2u /* fit a fixture length too */

cxl_status cxl_sweepfit_new(const cxl_sweep *sweep, double length_m, cxl_stub_end end,
                            double load_re_ohm, double load_im_ohm, double fixture_vf,
                            unsigned flags, cxl_sweepfit **fit);
void cxl_sweepfit_free(cxl_sweepfit *fit);
/* vf_hf, drop (sqrt(Hz)) and Z0 (ohm) with their standard deviations.
 * Any output may be NULL. */
cxl_status cxl_sweepfit_line(const cxl_sweepfit *fit, double *vf_hf, double *vf_hf_err,
                             double *drop_sqrt_hz, double *drop_err, double *z0_ohm,
                             double *z0_err);
/* Attenuation coefficients a (dB/m/sqrt(Hz)) and b (dB/m/Hz) with their
 * standard deviations.  Any output may be NULL. */
cxl_status cxl_sweepfit_loss_coefficients(const cxl_sweepfit *fit, double *a_db_per_m_sqrt_hz,
                                          double *a_err, double *b_db_per_m_hz, double *b_err);
/* The fixture's length and its standard deviation (both 0 when the fit
 * had none).  Any output may be NULL. */
cxl_status cxl_sweepfit_fixture(const cxl_sweepfit *fit, double *length_m, double *length_err);
/* VF at freq_hz and its standard deviation (covariance of vf_hf and the
 * drop); CXL_ERANGE where the trend leaves (0, 1].  vf_err may be NULL. */
cxl_status cxl_sweepfit_vf(const cxl_sweepfit *fit, double freq_hz, double *vf, double *vf_err);
/* Attenuation in dB/m at freq_hz and its standard deviation.  loss_err may
 * be NULL. */
cxl_status cxl_sweepfit_loss(const cxl_sweepfit *fit, double freq_hz, double *loss_db_per_m,
                             double *loss_err);
/* How well the model fits: the rms and the largest |Gamma_model -
 * Gamma_sweep| over the points, the frequency of the largest, and the band
 * fitted.  Any output may be NULL. */
cxl_status cxl_sweepfit_quality(const cxl_sweepfit *fit, double *rms_residual,
                                double *max_residual, double *max_residual_hz,
                                double *min_freq_hz, double *max_freq_hz);

/* ---- fault.c: distance to fault ------------------------------------- */

/* Reflection against distance along the line from a one-port sweep with
 * phase: Gamma(f) against reference_ohm, windowed, zero-padded (to a power
 * of two at least 4 times the points) and transformed back with GSL's
 * FFT.  A reflection g at round-trip delay t shows as a peak of height g
 * at distance VF c t / 2.
 *   Band-pass (any sweep): the magnitude of the complex response.
 *   Low-pass (a sweep whose first frequency is k df, k an integer up to
 *   10, and CXL_FAULT_BANDPASS not given): Gamma is completed down to DC
 *   (the real part extrapolated linearly from the first two points, the
 *   harmonics below the first point interpolated) and mirrored as the
 *   conjugate at negative frequencies; the real impulse response is
 *   positive where the impedance steps up and negative where it steps down,
 *   and its running sum is the step response (Gamma seen up to that
 *   distance).
 * Windows (applied over the band in band-pass, as the right half centred
 * on DC in low-pass): CXL_FAULT_RECT (none: sharpest, sidelobes at
 * -13 dB), CXL_FAULT_HANN (0.5 + 0.5 cos, sidelobes at -31 dB, main lobe
 * twice as wide), CXL_FAULT_KAISER (I0(beta sqrt(1 - u^2)) / I0(beta);
 * beta 6 gives about -44 dB, larger beta lower sidelobes and a wider
 * lobe).  Peaks are the local maxima that stand above the window's highest
 * sidelobe of the strongest peak plus 6 dB and above -60 dB, refined by a
 * parabola through three samples.
 * Resolution VF c / (2 span) (span: the highest frequency in low-pass,
 * stop - start in band-pass; a window widens the peaks by its main-lobe
 * factor) and unambiguous range VF c / (2 df): a line longer than the
 * range folds back.
 * VF: vf (0 < vf <= 1), or with vf 0 the model's VF at the sweep's centre
 * frequency.  Loss compensation: each distance d is scaled by
 * 10^(2 loss_db_per_m d / 20) (the round trip), loss_db_per_m >= 0 (0:
 * none), or with CXL_FAULT_MODEL_LOSS the model's attenuation at the
 * centre frequency.
 * Errors: CXL_EINVAL (bad argument, vf 0 without a model), CXL_ENOTFOUND (a
 * sweep without phase, e.g. an swr column), CXL_EINCONSISTENT (the points
 * are not evenly spaced), CXL_ERANGE (fewer than two points, a result that
 * overflows). */
typedef struct cxl_fault cxl_fault;

typedef enum cxl_fault_window {
    CXL_FAULT_RECT = 0,
    CXL_FAULT_HANN = 1,
    CXL_FAULT_KAISER = 2
} cxl_fault_window;

#define CXL_FAULT_MAX_BETA 50.0
#define CXL_FAULT_BANDPASS   0x1u /* band-pass even when low-pass would apply */
#define CXL_FAULT_MODEL_LOSS 0x2u /* compensate the model's loss */

cxl_status cxl_fault_new(const cxl_sweep *sweep, double reference_ohm, double vf,
                         const cxl_loss_model *model, cxl_fault_window window,
                         double kaiser_beta, double loss_db_per_m, unsigned flags,
                         cxl_fault **fault);
void cxl_fault_free(cxl_fault *fault);
/* Mode (1 low-pass, 0 band-pass), the VF used, resolution, unambiguous
 * range and the sweep's step.  Any output may be NULL. */
cxl_status cxl_fault_info(const cxl_fault *fault, int *lowpass, double *vf,
                          double *resolution_m, double *range_m, double *step_hz);
/* Profile points, evenly spaced from distance 0 over the range; 0 for
 * NULL. */
size_t cxl_fault_count(const cxl_fault *fault);
/* Profile point index: distance, reflection (>= 0), the signed reflection
 * (low-pass; the reflection again in band-pass) and the step response
 * (low-pass; 0 in band-pass).  Any output may be NULL. */
cxl_status cxl_fault_point(const cxl_fault *fault, size_t index, double *distance_m,
                           double *reflection, double *signed_reflection,
                           double *step);
/* Peaks in ascending distance; 0 for NULL. */
size_t cxl_fault_peak_count(const cxl_fault *fault);
/* Peak index: distance, reflection, return loss -20 log10(reflection) (dB)
 * and the change (low-pass: +1 to a higher impedance, -1 to a lower one;
 * 0 in band-pass, where the sign is not known).  Any output may be NULL. */
cxl_status cxl_fault_peak(const cxl_fault *fault, size_t index, double *distance_m,
                          double *reflection, double *return_loss_db, int *change);

/* ---- harness.c: phasing-harness cut list and drum packing ----------- */

/* The harness of an array cut from one cable of velocity factor vf:
 *   - every element gets a feed run to the combiner; each must reach the
 *     straight-line ground distance in (x, y) from the element to the
 *     combiner plus the slack, and all runs are cut to the same length, the
 *     longest one needed (equal electrical length);
 *   - an element with an extra delay (the delay line its layout asks for)
 *     gets it as a second piece, CXL_PIECE_DELAY, of delay_s VF c;
 *   - the connector allowance is line already in each piece's connectors
 *     whose delay counts (as cxl_line_cut_length()): every piece is cut
 *     allowance_m shorter, so per element the pieces' (cut + allowance) sum
 *     to (feed delay + extra delay) VF c;
 *   - each piece takes its cut length plus one kerf from a drum; pieces
 *     are packed by first-fit decreasing and by best-fit decreasing, and
 *     the packing that leaves fewer pieces out, then uses fewer drums, is
 *     kept (first-fit on a tie).
 * Positions, lengths and drums are bounded by CXL_HARNESS_MAX_M, delays by
 * CXL_HARNESS_MAX_DELAY_S (CXL_ERANGE beyond). */
#define CXL_HARNESS_MAX_ELEMENTS 256
#define CXL_HARNESS_MAX_DRUMS 64
#define CXL_HARNESS_MAX_M 1e7
#define CXL_HARNESS_MAX_DELAY_S 1.0
/* Shortest piece that can be cut. */
#define CXL_HARNESS_MIN_PIECE_M 1e-3
/* The drum of a piece no drum could hold (or when no drum was given). */
#define CXL_HARNESS_NO_DRUM ((size_t)-1)

typedef enum {
    CXL_PIECE_FEED = 0,   /* feed run from the element to the combiner */
    CXL_PIECE_DELAY = 1   /* the element's extra delay line */
} cxl_piece_kind;

typedef struct cxl_harness cxl_harness;

/* A new harness of cable with velocity factor vf: no elements, combiner at
 * (0, 0), no slack, allowance or kerf, no drums. */
cxl_status cxl_harness_new(double vf, cxl_harness **harness);
void cxl_harness_free(cxl_harness *harness);
/* Append an element at (x_m, y_m) needing the extra delay delay_s (>= 0;
 * 0: no delay piece); its index to *index (may be NULL).  CXL_ERANGE
 * beyond the bounds or CXL_HARNESS_MAX_ELEMENTS. */
cxl_status cxl_harness_add_element(cxl_harness *harness, double x_m,
                                   double y_m, double delay_s, size_t *index);
cxl_status cxl_harness_set_combiner(cxl_harness *harness, double x_m,
                                    double y_m);
/* Slack added to the longest run, connector allowance per piece and saw
 * kerf per cut, each >= 0. */
cxl_status cxl_harness_set_cuts(cxl_harness *harness, double slack_m,
                                double allowance_m, double kerf_m);
/* Append a drum holding length_m (> 0) of the cable; its index to *index
 * (may be NULL).  CXL_ERANGE beyond CXL_HARNESS_MAX_DRUMS. */
cxl_status cxl_harness_add_drum(cxl_harness *harness, double length_m,
                                size_t *index);
/* Work out the pieces and pack them onto the drums.  CXL_EINVAL without
 * elements; CXL_EINCONSISTENT when a piece would be shorter than
 * CXL_HARNESS_MIN_PIECE_M (the allowance takes all of it); CXL_ERANGE when
 * the drums cannot hold every piece: the plan is still made, and the
 * pieces left out have the drum CXL_HARNESS_NO_DRUM.  Without drums every
 * piece has CXL_HARNESS_NO_DRUM and the status is CXL_OK.  Any setter
 * called afterwards discards the plan. */
cxl_status cxl_harness_plan(cxl_harness *harness);
/* Number of pieces of the plan (0 for NULL or before a plan): per element
 * in the order added, its feed run, then its delay piece if any. */
size_t cxl_harness_piece_count(const cxl_harness *harness);
/* Piece i: its element's index, kind, cut length, the quarter-wave
 * frequency of the cut piece with its far end open (the analyzer check,
 * cxl_line_quarter_wave_freq()) and its drum (CXL_HARNESS_NO_DRUM: none). */
cxl_status cxl_harness_piece(const cxl_harness *harness, size_t i,
                             size_t *element, cxl_piece_kind *kind,
                             double *length_m, double *check_hz,
                             size_t *drum);
/* The common feed run: its length with the allowance and its delay. */
cxl_status cxl_harness_feed_run(const cxl_harness *harness, double *length_m,
                                double *delay_s);
/* Drum d: cable taken (cut lengths plus kerfs) and cable left. */
cxl_status cxl_harness_drum(const cxl_harness *harness, size_t d,
                            double *used_m, double *left_m);
/* ---- yield.c: Monte-Carlo yield of as-built arrays ----------------------- */

/* How many arrays built to a layout within given tolerances meet a goal.
 * Each trial builds the array once, drawing independently and uniformly:
 *   - each element's feed-line length within +-length_tol_m (elements with
 *     a line of positive length, cxl_array_set_line or _line_model; an
 *     element fed by a fixed delay alone has no piece to cut);
 *   - ONE velocity-factor error within +-vf_tol for all lines (they come
 *     from the same drum; a modelled line's VF is omega / (beta c) at each
 *     frequency, its loss per metre is kept);
 *   - each element's amplitude within +-imbalance_tol_db (voltage dB);
 *   - each element's extra phase within +-phase_tol_deg (connectors,
 *     transformers, anything that is not the line).
 * The nominal is the array as given.  Every trial draws the VF error and
 * then, element by element, length, amplitude and phase (4 N + 1 numbers,
 * also for a zero tolerance), so a change of one tolerance keeps the
 * others' draws.  The same trial gives the same array at every frequency,
 * so calls for the points of a band describe one population of builds.
 *
 * Per frequency the results follow the array module: front-to-back as
 * cxl_array_eval_front_to_back (azimuth 0 over 180 at the evaluation
 * elevation), rear null as cxl_array_eval_rear_null (deepest response over
 * azimuth 90..270 relative to azimuth 0, a negative number when the null
 * is below the forward response); a trial without forward response counts
 * as a null of +CXL_DB_LIMIT.  The goal is a front-to-back ratio of at
 * least goal_db, or a null at least as deep as depth_db (null <= depth_db).
 * The yield is the fraction of trials meeting it, with its binomial
 * standard error sqrt(p (1 - p) / trials) (0 when every trial or none
 * passes: then about 3 / trials is a 95 % one-sided bound).  Quantiles go
 * from the worst trial: the median and the "p5" level that 95 % of the
 * trials reach (front-to-back: the 5th percentile; null depth, where lower
 * is better: the 95th percentile of the depth in dB), each the k-th worst
 * trial's value with k = ceil(q trials), read from a histogram of
 * CXL_YIELD_BIN_DB bins over +-CXL_DB_LIMIT (the bin's centre, so within
 * CXL_YIELD_BIN_DB / 2 of the exact order statistic).
 *
 * Random numbers: GSL's gsl_rng_mt19937.  Trials go in blocks of
 * CXL_YIELD_BLOCK; block b has its own generator seeded with
 * (h(seed) + b) mod 2^32, h a fixed 64-bit mix, so the result depends on
 * the seed only: the same on any machine and for any number of threads
 * (the counts are integers, summed in any order).  Default seed
 * CXL_YIELD_DEFAULT_SEED.
 * Threads: 0 means one per processor online (sysconf); a worker thread
 * that cannot be started leaves its share to the others.
 * Speed: front-to-back needs two directions per trial (about a
 * microsecond for a few elements); the null needs a scan and a Brent
 * refinement per trial (tens of times slower), so it is computed only
 * when asked for (null outputs not NULL) or when it is the goal. */
#define CXL_YIELD_DEFAULT_SEED 1UL
#define CXL_YIELD_DEFAULT_TRIALS 10000
#define CXL_YIELD_MAX_TRIALS 100000000
#define CXL_YIELD_MAX_THREADS 256
#define CXL_YIELD_BLOCK 1024
#define CXL_YIELD_BIN_DB 0.01

typedef struct cxl_yield cxl_yield;

/* A new plan: zero tolerances, goal front-to-back >= 20 dB,
 * CXL_YIELD_DEFAULT_TRIALS trials, seed CXL_YIELD_DEFAULT_SEED, 1 thread. */
cxl_status cxl_yield_new(cxl_yield **yield);
void cxl_yield_free(cxl_yield *yield);
/* Tolerances (each >= 0): line length (m), velocity factor (absolute,
 * < 1), amplitude (dB, <= 200) and phase (degrees, <= 180).  A length
 * tolerance longer than a line or a VF tolerance that takes a line's VF
 * out of (0, 1] is refused when the plan is run (CXL_ERANGE). */
cxl_status cxl_yield_set_tolerances(cxl_yield *yield, double length_tol_m,
                                    double vf_tol, double imbalance_tol_db,
                                    double phase_tol_deg);
/* Goal: front-to-back of at least goal_db (|goal_db| < CXL_DB_LIMIT). */
cxl_status cxl_yield_set_goal_front_to_back(cxl_yield *yield, double goal_db);
/* Goal: a rear null at least as deep as depth_db (-CXL_DB_LIMIT <=
 * depth_db < 0, e.g. -25). */
cxl_status cxl_yield_set_goal_null(cxl_yield *yield, double depth_db);
/* Trials (1..CXL_YIELD_MAX_TRIALS), the seed (any value) and threads
 * (0 = one per processor, at most CXL_YIELD_MAX_THREADS). */
cxl_status cxl_yield_set_run(cxl_yield *yield, size_t trials,
                             unsigned long seed, unsigned threads);
/* Run the plan on array at freq_hz, elevation_deg: the yield (fraction in
 * [0, 1]) and its standard error, median and p5 front-to-back (dB), and,
 * when null_median_db or null_p5_db is not NULL, the
 * median and p5 rear-null depth (dB) (each may be NULL).  Errors: those of
 * cxl_array_eval_front_to_back and cxl_array_eval_rear_null for the
 * nominal array (CXL_ERANGE when it has neither forward nor backward
 * response), CXL_ERANGE for a tolerance the lines cannot take (see
 * cxl_yield_set_tolerances), CXL_ENOMEM. */
cxl_status cxl_yield_eval(const cxl_yield *yield, const cxl_array *array,
                          double freq_hz, double elevation_deg,
                          double *yield_frac, double *yield_se,
                          double *front_to_back_median_db,
                          double *front_to_back_p5_db,
                          double *null_median_db, double *null_p5_db);

#ifdef __cplusplus
}
#endif

#endif /* COAXLINE_H */
