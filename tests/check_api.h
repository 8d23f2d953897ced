/* check_api.h - what the walk of tests/check_api.c shares with the
 * adapters of each module (tests/check_api_MODULE.c): argument helpers,
 * the NULL mask, sentinels, the global objects built once in main(), and
 * the adapters the table calls (a new adapter is declared at the end). */
#ifndef CHECK_API_H
#define CHECK_API_H
#include <check.h>
#include <float.h>
#include <limits.h>
#include <locale.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include "coaxline.h"

#define SENT 7777.0      /* representable as int, unsigned, size_t, double */
#define NOUT 12
#define MAXARGS 8

static inline int to_int(double v)
{
    return v >= INT_MAX ? INT_MAX : v <= INT_MIN ? INT_MIN : (int)v;
}
static inline unsigned to_uint(double v)
{
    return v >= UINT_MAX ? UINT_MAX : v <= 0 ? 0u : (unsigned)v;
}
static inline size_t to_size(double v)
{
    return v >= 1.8e19 ? SIZE_MAX : v <= 0 ? 0u : (size_t)v;
}

/* Pointer argument j, or NULL when its bit is set. */
#define P(j, p) (((nulls >> (j)) & 1u) ? NULL : (p))
#define ADAPTER(name) cxl_status call_##name(const double *a, double *o, unsigned nulls)

/* A sentinel handle: never dereferenced, only compared. */
extern char sentinel_object;
#define SENT_PTR ((void *)&sentinel_object)
extern const char sentinel_text[];

/* An output handle or string: SENT when untouched, 0 when set, NaN when
 * set to NULL (a success must never hand back NULL). */
static inline double ptr_out(const void *p)
{
    return p == SENT_PTR || p == (const void *)sentinel_text ? SENT : p ? 0.0 : NAN;
}

/* Global objects the walk works on, built once in main(). */
extern cxl_bands *g_bands;
extern cxl_catalog *g_cat;
extern size_t g_user;          /* a user cable with two loss points */
extern cxl_stub *g_stub;       /* readings on one length */
extern cxl_stub_result *g_res1;
extern cxl_stub_result *g_res2; /* readings on two lengths: fixture fitted */
extern cxl_loss_fit *g_fit;
extern cxl_loss_model *g_model;
extern cxl_duo *g_pair;  /* end-fire pair of long wires */
extern cxl_array *g_array;      /* three elements, one fed by a modelled line */
extern cxl_loss_model *g_clad;  /* g_model with a copper-clad steel centre */
extern cxl_drift *g_drift;      /* VF at three frequencies */
extern cxl_trim *g_trim;        /* a piece read at three orders, with a target */
extern cxl_trim_result *g_trim_res;
extern char *g_sweep_text;      /* an open stub, 10 m at VF 0.66, 1-40 MHz */
extern cxl_sweep *g_sweep;
extern cxl_sweep_res *g_sres;
extern cxl_fault *g_fault;      /* profile of g_sweep */
extern cxl_harness *g_harness;  /* planned: two elements, drums of 30 m and 20 m */
extern cxl_yield *g_yield;      /* all four tolerances, a few trials on 2 threads */
extern cxl_sweepfit *g_sfit;    /* g_sweep fitted as a 10 m open line */

/* A read stream over text (a new one per call). */
static inline FILE *text_stream(const char *text)
{
    FILE *fp = fmemopen((void *)text, strlen(text), "r");
    if (!fp) {
        perror("fmemopen");
        abort();
    }
    return fp;
}

extern const char good_bands_csv[];
extern const char good_cables_csv[];
extern const char good_loss_csv[];

/* Text formatted into a buffer: SENT untouched, 0 for a clean result,
 * NaN for no terminator or a "nan"/"inf" in the text. */
static inline double text_out(const char *buf, size_t size, size_t cap)
{
    size_t k;
    for (k = 0; k < cap - 1 && buf[k] == 'Z'; k++) {}
    if (k == cap - 1) return SENT;
    const char *nul = memchr(buf, '\0', size < cap ? size : cap);
    if (!nul) return NAN;
    if (strstr(buf, "nan") || strstr(buf, "inf") || strstr(buf, "NAN") || strstr(buf, "INF"))
        return NAN;
    if (strchr(buf, ','))
        return NAN; /* the decimal mark is '.', whatever the locale */
    return 0.0;
}

/* A constructor: the handle is set on success, untouched on failure. */
#define NEW_ADAPTER(name, type, call, free_fn)                               \
    ADAPTER(name)                                                            \
    {                                                                        \
        (void)a;                                                             \
        type *h = SENT_PTR;                                                  \
        cxl_status st = call;                                                \
        o[0] = ptr_out(h);                                                   \
        if (st == CXL_OK) free_fn(h);                                        \
        return st;                                                           \
    }

/* length of the piece the trim adapters read (tests/check_api_stub.c) */
#define TRIM_LEN 30.0
/* its order-th reading, and a trim with that many readings (and a target
 * when asked), also used by the tests by hand */
double trim_reading_hz(int order);
cxl_trim *fresh_trim(int readings, int target);

/* ---- the adapters, one per table row kind (tests/check_api_*.c) ---- */
cxl_status call_array_add(const double *a, double *o, unsigned nulls);
cxl_status call_array_copy(const double *a, double *o, unsigned nulls);
cxl_status call_array_directivity(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_beamwidth(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_directivity(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_field(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_front_to_back(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_gain(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_pattern(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_peak(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_rdf(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_rear_null(const double *a, double *o, unsigned nulls);
cxl_status call_array_eval_response(const double *a, double *o, unsigned nulls);
cxl_status call_array_field(const double *a, double *o, unsigned nulls);
cxl_status call_array_forward_gain(const double *a, double *o, unsigned nulls);
cxl_status call_array_front_to_back(const double *a, double *o, unsigned nulls);
cxl_status call_array_gain(const double *a, double *o, unsigned nulls);
cxl_status call_array_max_freq(const double *a, double *o, unsigned nulls);
cxl_status call_array_new(const double *a, double *o, unsigned nulls);
cxl_status call_array_null_depth(const double *a, double *o, unsigned nulls);
cxl_status call_array_pattern(const double *a, double *o, unsigned nulls);
cxl_status call_array_peak(const double *a, double *o, unsigned nulls);
cxl_status call_array_rdf(const double *a, double *o, unsigned nulls);
cxl_status call_array_rear_null(const double *a, double *o, unsigned nulls);
cxl_status call_array_response(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_delay(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_element(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_line(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_line_model(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_phase_offset(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_position(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_reversed(const double *a, double *o, unsigned nulls);
cxl_status call_array_set_weight(const double *a, double *o, unsigned nulls);
cxl_status call_bands_edges(const double *a, double *o, unsigned nulls);
cxl_status call_bands_get(const double *a, double *o, unsigned nulls);
cxl_status call_bands_name(const double *a, double *o, unsigned nulls);
cxl_status call_bands_new(const double *a, double *o, unsigned nulls);
cxl_status call_bands_new_stream(const double *a, double *o, unsigned nulls);
cxl_status call_budget_length_for_phase(const double *a, double *o, unsigned nulls);
cxl_status call_budget_phase_for_front_to_back(const double *a, double *o, unsigned nulls);
cxl_status call_budget_phase_for_null(const double *a, double *o, unsigned nulls);
cxl_status call_budget_phase_for_rear_null(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_dielectric(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_find(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_is_builtin(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_load_cables(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_load_loss(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_loss_point(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_name(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_new(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_source(const double *a, double *o, unsigned nulls);
cxl_status call_catalog_value(const double *a, double *o, unsigned nulls);
cxl_status call_cut_length(const double *a, double *o, unsigned nulls);
cxl_status call_degrees_from_delay(const double *a, double *o, unsigned nulls);
cxl_status call_degrees_from_length(const double *a, double *o, unsigned nulls);
cxl_status call_delay_from_length(const double *a, double *o, unsigned nulls);
cxl_status call_delay_from_offset(const double *a, double *o, unsigned nulls);
cxl_status call_drift_allowance(const double *a, double *o, unsigned nulls);
cxl_status call_drift_coefficients(const double *a, double *o, unsigned nulls);
cxl_status call_drift_new(const double *a, double *o, unsigned nulls);
cxl_status call_drift_new_stub(const double *a, double *o, unsigned nulls);
cxl_status call_drift_range(const double *a, double *o, unsigned nulls);
cxl_status call_drift_vf(const double *a, double *o, unsigned nulls);
cxl_status call_fault_info(const double *a, double *o, unsigned nulls);
cxl_status call_fault_new(const double *a, double *o, unsigned nulls);
cxl_status call_fault_peak(const double *a, double *o, unsigned nulls);
cxl_status call_fault_point(const double *a, double *o, unsigned nulls);
cxl_status call_format_fixed(const double *a, double *o, unsigned nulls);
cxl_status call_format_imperial(const double *a, double *o, unsigned nulls);
cxl_status call_format_roundtrip(const double *a, double *o, unsigned nulls);
cxl_status call_hybrid_inphase(const double *a, double *o, unsigned nulls);
cxl_status call_hybrid_match(const double *a, double *o, unsigned nulls);
cxl_status call_hybrid_response(const double *a, double *o, unsigned nulls);
cxl_status call_hybrid_turns_ratio(const double *a, double *o, unsigned nulls);
cxl_status call_hybrid_turns_search(const double *a, double *o, unsigned nulls);
cxl_status call_length_from_degrees(const double *a, double *o, unsigned nulls);
cxl_status call_length_from_delay(const double *a, double *o, unsigned nulls);
cxl_status call_loss_cable_db_per_m(const double *a, double *o, unsigned nulls);
cxl_status call_loss_cable_difference(const double *a, double *o, unsigned nulls);
cxl_status call_loss_cable_kind(const double *a, double *o, unsigned nulls);
cxl_status call_loss_cable_new(const double *a, double *o, unsigned nulls);
cxl_status call_loss_cable_range(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_coefficients(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_eval(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_max_relative_residual(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_new(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_new_cable(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_point(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_range(const double *a, double *o, unsigned nulls);
cxl_status call_loss_fit_usable_range(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_attenuation(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_clad_crossover(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_gamma(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_new(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_new_cable(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_range(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_rlgc(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_set_clad(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_vf(const double *a, double *o, unsigned nulls);
cxl_status call_loss_model_z0(const double *a, double *o, unsigned nulls);
cxl_status call_loss_run_db(const double *a, double *o, unsigned nulls);
cxl_status call_loss_skin_depth(const double *a, double *o, unsigned nulls);
cxl_status call_loss_total_db(const double *a, double *o, unsigned nulls);
cxl_status call_pair_built_phase(const double *a, double *o, unsigned nulls);
cxl_status call_pair_check(const double *a, double *o, unsigned nulls);
cxl_status call_pair_copy(const double *a, double *o, unsigned nulls);
cxl_status call_pair_feed(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_check(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_max_mismatch(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_new_lossless(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_new_model(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_transfer(const double *a, double *o, unsigned nulls);
cxl_status call_pair_load_transfer_model(const double *a, double *o, unsigned nulls);
cxl_status call_pair_max_mismatch(const double *a, double *o, unsigned nulls);
cxl_status call_pair_new(const double *a, double *o, unsigned nulls);
cxl_status call_pair_phase_error(const double *a, double *o, unsigned nulls);
cxl_status call_pair_phase_error_ref_deg(const double *a, double *o, unsigned nulls);
cxl_status call_pair_phase_uncertainty(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_delay(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_delay_deg(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_feed(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_flip(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_geometry(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_imbalance(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_isotropic(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_long_wire(const double *a, double *o, unsigned nulls);
cxl_status call_pair_set_phase_offset(const double *a, double *o, unsigned nulls);
cxl_status call_pair_verdict(const double *a, double *o, unsigned nulls);
cxl_status call_parse_freq(const double *a, double *o, unsigned nulls);
cxl_status call_parse_length(const double *a, double *o, unsigned nulls);
cxl_status call_parse_number(const double *a, double *o, unsigned nulls);
cxl_status call_parse_time(const double *a, double *o, unsigned nulls);
cxl_status call_quarter_wave(const double *a, double *o, unsigned nulls);
cxl_status call_reader_new_buffer(const double *a, double *o, unsigned nulls);
cxl_status call_reader_new_stream(const double *a, double *o, unsigned nulls);
cxl_status call_reader_next(const double *a, double *o, unsigned nulls);
cxl_status call_stub_add_reading(const double *a, double *o, unsigned nulls);
cxl_status call_stub_fit(const double *a, double *o, unsigned nulls);
cxl_status call_stub_infer_orders(const double *a, double *o, unsigned nulls);
cxl_status call_stub_new(const double *a, double *o, unsigned nulls);
cxl_status call_stub_resonance_freq(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_fixture(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_flags(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_reading(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_vf(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_vf_at(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_vf_budget(const double *a, double *o, unsigned nulls);
cxl_status call_stub_set_consistency(const double *a, double *o, unsigned nulls);
cxl_status call_stub_set_fixture(const double *a, double *o, unsigned nulls);
cxl_status call_stub_set_orders(const double *a, double *o, unsigned nulls);
cxl_status call_stub_set_tolerances(const double *a, double *o, unsigned nulls);
cxl_status call_stub_set_vf_range(const double *a, double *o, unsigned nulls);
cxl_status call_stub_vf_from_resonance(const double *a, double *o, unsigned nulls);
cxl_status call_stub_wavelengths(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_info(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_magnitude(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_point(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_read(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_read_buffer(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_res_get(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_res_readings(const double *a, double *o, unsigned nulls);
cxl_status call_sweep_resonances(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_delay(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_input_impedance(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_lossless(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_model(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_ratio(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_stub_dip(const double *a, double *o, unsigned nulls);
cxl_status call_transfer_stub_resonance(const double *a, double *o, unsigned nulls);
cxl_status call_trim_add_reading(const double *a, double *o, unsigned nulls);
cxl_status call_trim_new(const double *a, double *o, unsigned nulls);
cxl_status call_trim_result_cut(const double *a, double *o, unsigned nulls);
cxl_status call_trim_result_flags(const double *a, double *o, unsigned nulls);
cxl_status call_trim_result_reading(const double *a, double *o, unsigned nulls);
cxl_status call_trim_result_vf(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_allowance(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_allowance_1(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_fixture(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_fixture_1(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_model(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_reading(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_resolution(const double *a, double *o, unsigned nulls);
cxl_status call_trim_set_resolution_1(const double *a, double *o, unsigned nulls);
cxl_status call_trim_solve(const double *a, double *o, unsigned nulls);
cxl_status call_trim_target_degrees(const double *a, double *o, unsigned nulls);
cxl_status call_trim_target_delay(const double *a, double *o, unsigned nulls);
cxl_status call_trim_target_delay_1(const double *a, double *o, unsigned nulls);
cxl_status call_trim_target_resonance(const double *a, double *o, unsigned nulls);
cxl_status call_write_field(const double *a, double *o, unsigned nulls);
cxl_status call_harness_new(const double *a, double *o, unsigned nulls);
cxl_status call_harness_add_element(const double *a, double *o, unsigned nulls);
cxl_status call_harness_set_combiner(const double *a, double *o, unsigned nulls);
cxl_status call_harness_set_cuts(const double *a, double *o, unsigned nulls);
cxl_status call_harness_add_drum(const double *a, double *o, unsigned nulls);
cxl_status call_harness_plan(const double *a, double *o, unsigned nulls);
cxl_status call_harness_piece(const double *a, double *o, unsigned nulls);
cxl_status call_harness_feed_run(const double *a, double *o, unsigned nulls);
cxl_status call_harness_drum(const double *a, double *o, unsigned nulls);
cxl_status call_yield_new(const double *a, double *o, unsigned nulls);
cxl_status call_yield_set_tolerances(const double *a, double *o, unsigned nulls);
cxl_status call_yield_set_goal_front_to_back(const double *a, double *o, unsigned nulls);
cxl_status call_yield_set_goal_null(const double *a, double *o, unsigned nulls);
cxl_status call_yield_set_run(const double *a, double *o, unsigned nulls);
cxl_status call_yield_eval(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_new(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_line(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_loss_coefficients(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_fixture(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_vf(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_loss(const double *a, double *o, unsigned nulls);
cxl_status call_sweepfit_quality(const double *a, double *o, unsigned nulls);

#endif
cxl_status call_stub_reset(const double *a, double *o, unsigned nulls);
cxl_status call_stub_result_new(const double *a, double *o, unsigned nulls);
cxl_status call_stub_fit_into(const double *a, double *o, unsigned nulls);
cxl_status call_trim_reset(const double *a, double *o, unsigned nulls);
cxl_status call_trim_result_new(const double *a, double *o, unsigned nulls);
cxl_status call_trim_solve_into(const double *a, double *o, unsigned nulls);
