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

/* ---- array.c: pattern of a two-element receive pair ------------------ */

/* Model (stated here so every caller sees it): two identical elements in
 * FREE SPACE: no ground, no mutual coupling between the elements, lossless
 * feeds, an ideal in-phase combiner that adds the two element signals.
 *
 * Coordinates: the forward axis is +x: azimuth 0, elevation 0 (the
 * horizon).  Azimuth turns counter-clockwise seen from above, so azimuth 90
 * points to +y; elevation is measured up from the horizontal plane.
 * Element 0 sits at (x, y) = (+stagger/2, -spacing/2), element 1 at
 * (-stagger/2, +spacing/2): spacing is the broadside distance across the
 * axis, stagger the offset along it (with a positive stagger element 0 is
 * the front element).
 *
 * A plane wave arriving from direction u gives at element i the signal
 *     s_i = a_i q_i E(u) exp(j (k u.r_i - 2 pi f tau_i + phi_i))
 * with k = 2 pi f / c (a spacing or stagger is a free-space distance),
 * a_0 = 1, a_1 = 10^(-imbalance_db/20), q_i = -1 when element i's polarity
 * is flipped (crossfire feed), tau_i its feed delay and phi_i a fixed,
 * frequency-independent phase offset (for modelling a phase error).  The
 * output is s_0 + s_1.
 *
 * Elements: isotropic, E = 1; or a traveling-wave long wire of length L and
 * wire velocity factor p lying along the forward axis, fed at its rear end
 * and terminated at its front end, so it favours arrivals from the front:
 *     E = sin(t) sinc((pi L / lambda)(1/p - cos t)),  cos t = cos(el) cos(az),
 * sinc(x) = sin(x)/x: the traveling-wave pattern (Kraus, Antennas,
 * traveling-wave antennas) divided by pi L / lambda so that |E| <= 1.  The
 * wire VF shapes the element pattern only; it never enters a feed delay.
 *
 * Results:
 *   response: |s_0 + s_1|^2 in dB over one isotropic element of unit
 *     amplitude (no integration; the cheapest call, for plots);
 *   gain: directivity in dBi, 4 pi |F|^2 / (integral of |F|^2 over the whole
 *     sphere); being lossless and in free space, gain equals directivity;
 *   front-to-back: response at azimuth 0 over azimuth 180 at one elevation;
 *   rear null: the deepest response over azimuth 90..270 at one elevation,
 *     its depth relative to the response at azimuth 0 (same elevation);
 *   RDF (receiving directivity factor): peak response over the UPPER
 *     HEMISPHERE (elevation 0..90) divided by the mean response over that
 *     hemisphere.  In this free-space model the pattern is symmetric about
 *     the horizontal plane, so the hemisphere and whole-sphere means agree
 *     and the RDF equals the directivity; over real ground they differ by
 *     about 3 dB, which is why the convention is stated.
 * Integrals use a product rule: Gauss-Legendre in elevation
 * (gsl_integration_glfixed) and the trapezoid rule in azimuth (exact to
 * rounding for a smooth periodic integrand), both doubled until two
 * successive estimates agree to 1e-10 relative (CXL_ENOCONV otherwise).
 * dB results are clamped to +-CXL_DB_LIMIT, so a perfect null reports
 * -CXL_DB_LIMIT rather than minus infinity.
 * Errors: CXL_EINVAL for NULL, NaN, infinity or an argument out of its
 * stated domain; CXL_ERANGE when a ratio has a zero reference (e.g. a long
 * wire at elevation 0 has no response along its own axis), or the pattern
 * is zero everywhere, or the pair is electrically huge (k times its size
 * above 1e4, some 1600 wavelengths); CXL_ENOMEM; CXL_ENOCONV. */

#define CXL_DB_LIMIT 300.0

typedef struct cxl_array_pair cxl_array_pair;

/* A new pair: isotropic elements, spacing and stagger 0, no delays, no
 * phase offsets, no flip, no imbalance. */
cxl_status cxl_array_pair_new(cxl_array_pair **pair);
void cxl_array_pair_free(cxl_array_pair *pair);
cxl_status cxl_array_pair_copy(const cxl_array_pair *pair,
                               cxl_array_pair **copy);

/* spacing_m >= 0 across the forward axis; stagger_m of either sign along
 * it (negative puts element 1 in front).  Free-space distances. */
cxl_status cxl_array_pair_set_geometry(cxl_array_pair *pair,
                                       double spacing_m, double stagger_m);
/* Feed delay of element 0 or 1 (>= 0), e.g. from a cable through
 * cxl_line_delay_from_length(). */
cxl_status cxl_array_pair_set_delay(cxl_array_pair *pair, int element,
                                    double delay_s);
/* Feed delay given as phase_deg (>= 0) at design_freq_hz: a true time
 * delay of phase_deg / (360 design_freq_hz), so it scales with frequency. */
cxl_status cxl_array_pair_set_delay_deg(cxl_array_pair *pair, int element,
                                        double phase_deg,
                                        double design_freq_hz);
/* A fixed phase added to element 0 or 1 at every frequency (any sign). */
cxl_status cxl_array_pair_set_phase_offset(cxl_array_pair *pair,
                                           int element, double phase_deg);
/* Invert element 0 or 1 (flipped non-zero) or restore it (0). */
cxl_status cxl_array_pair_set_flip(cxl_array_pair *pair, int element,
                                   int flipped);
/* Element 1 weaker than element 0 by imbalance_db (|dB| <= 200). */
cxl_status cxl_array_pair_set_imbalance(cxl_array_pair *pair,
                                        double imbalance_db);
cxl_status cxl_array_pair_set_isotropic(cxl_array_pair *pair);
/* Both elements become long wires: length_m > 0, wire_vf in (0, 1]. */
cxl_status cxl_array_pair_set_long_wire(cxl_array_pair *pair,
                                        double length_m, double wire_vf);

/* Complex output s_0 + s_1 (relative to one unit isotropic element) for a
 * wave from azimuth_deg (any finite value), elevation_deg in [-90, 90]. */
cxl_status cxl_array_field(const cxl_array_pair *pair, double freq_hz,
                           double azimuth_deg, double elevation_deg,
                           double *field_re, double *field_im);
/* |s_0 + s_1|^2 in dB over one unit isotropic element. */
cxl_status cxl_array_response(const cxl_array_pair *pair, double freq_hz,
                              double azimuth_deg, double elevation_deg,
                              double *response_db);
/* Gain (directivity) in dBi toward (azimuth_deg, elevation_deg). */
cxl_status cxl_array_gain(const cxl_array_pair *pair, double freq_hz,
                          double azimuth_deg, double elevation_deg,
                          double *gain_dbi);
/* Gain toward the forward axis (azimuth 0) at elevation_deg. */
cxl_status cxl_array_forward_gain(const cxl_array_pair *pair, double freq_hz,
                                  double elevation_deg, double *gain_dbi);
/* Gains in dBi at n >= 1 azimuths 360 i / n degrees (i = 0..n-1) at
 * elevation_deg, written to gain_dbi[0..n-1]; one sphere integral. */
cxl_status cxl_array_pattern(const cxl_array_pair *pair, double freq_hz,
                             double elevation_deg, size_t n,
                             double *gain_dbi);
/* Front-to-back ratio in dB at elevation_deg. */
cxl_status cxl_array_front_to_back(const cxl_array_pair *pair,
                                   double freq_hz, double elevation_deg,
                                   double *ratio_db);
/* Deepest response over azimuth 90..270 at elevation_deg: its azimuth
 * (degrees, in [90, 270]) and depth in dB relative to azimuth 0. */
cxl_status cxl_array_rear_null(const cxl_array_pair *pair, double freq_hz,
                               double elevation_deg, double *azimuth_deg,
                               double *depth_db);
/* Direction of the largest response over the upper hemisphere (elevation
 * 0..90), found on a grid and refined by a GSL simplex minimizer. */
cxl_status cxl_array_peak(const cxl_array_pair *pair, double freq_hz,
                          double *azimuth_deg, double *elevation_deg);
/* Directivity in dBi: peak over the mean over the WHOLE SPHERE. */
cxl_status cxl_array_directivity(const cxl_array_pair *pair, double freq_hz,
                                 double *directivity_dbi);
/* Receiving directivity factor in dB: peak over the mean over the UPPER
 * HEMISPHERE (see the model comment above). */
cxl_status cxl_array_rdf(const cxl_array_pair *pair, double freq_hz,
                         double *rdf_db);

/* Closed form, any pair: the null of an otherwise perfect pair whose
 * second signal has a phase error phase_error_deg and is weaker by
 * imbalance_db, relative to the coherent maximum (1 + a)^2, a =
 * 10^(-imbalance_db/20):  10 log10((1 - 2 a cos d + a^2) / (1 + a)^2).
 * With a = 1 this is 20 log10|sin(d/2)|; with d = 0 it is
 * 20 log10|(1 - a)/(1 + a)|.  |imbalance_db| <= 200. */
cxl_status cxl_array_null_depth(double phase_error_deg, double imbalance_db,
                                double *depth_db);

/* ---- budget.c: what the errors may cost (inverse of array.c) ------------ */

/* Largest phase error (degrees, in [0, 180]) that still keeps the closed-
 * form null (cxl_array_null_depth) at or below depth_db (< 0) with the
 * given amplitude imbalance: with a = 1, d = 2 asin(10^(depth_db/20)).
 * CXL_ERANGE when the imbalance alone already makes the null shallower
 * than depth_db. */
cxl_status cxl_budget_phase_for_null(double depth_db, double imbalance_db,
                                     double *phase_error_deg);
/* Largest phase error added to element 1 (either sign; the smaller of the
 * two limits is returned) for which the pair's front-to-back ratio at
 * freq_hz and elevation_deg stays at or above ratio_db.  Found by a scan in
 * 0.25-degree steps and refined with gsl_root_fsolver_brent.  CXL_ERANGE
 * when the error-free pair already misses ratio_db; 180 when no error up to
 * 180 degrees brings the ratio below ratio_db. */
cxl_status cxl_budget_phase_for_front_to_back(const cxl_array_pair *pair,
                                              double freq_hz,
                                              double elevation_deg,
                                              double ratio_db,
                                              double *phase_error_deg);
/* Length mismatch of a line with velocity factor vf that makes
 * phase_error_deg (>= 0) at freq_hz (cxl_line_length_from_degrees). */
cxl_status cxl_budget_length_for_phase(double phase_error_deg,
                                       double freq_hz, double vf,
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

#ifdef __cplusplus
}
#endif

#endif /* COAXLINE_H */
