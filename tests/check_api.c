/* check_api.c - every exported cxl_ function, given NULL or out-of-range
 * arguments, returns a status and never aborts; results are never NaN or
 * infinite; out-parameters are untouched on failure.
 *
 * The walk is table driven: each function has an adapter that maps an
 * array of numbers (its numeric arguments) and a NULL mask (its pointer
 * arguments, in signature order) to a call, copying every output into an
 * array of doubles pre-filled with a sentinel.  For every table row:
 *   1. the good arguments must succeed with finite outputs;
 *   2. each pointer argument NULL in turn must fail (or, for an output
 *      documented as optional, succeed), the other outputs untouched;
 *   3. each numeric argument in turn gets every "bad" value of its kind
 *      (NaN, +-inf, wrong sign, outside its documented range, an unknown
 *      enum value ...): the call must fail with the outputs untouched;
 *   4. each numeric argument in turn gets every "odd" value of its kind
 *      (0, +-DBL_MAX, 1e308, the smallest subnormal ...): the call may
 *      fail (outputs untouched) or succeed, but never with a NaN or an
 *      infinity in its outputs; an odd value is a valid argument, so its
 *      failure is a range status, never CXL_EINVAL (the list `lenient`
 *      allows CXL_EINVAL where an odd value clashes with another argument,
 *      e.g. a VF tolerance not below a tiny VF);
 *   5. rows of arguments that are bad only together (inner diameter not
 *      smaller than the dielectric, vf_min >= vf_max ...) must fail.
 * Functions returning size_t, void or a string (free, count, field, line,
 * strerror, version) and text or file contents are checked by hand below.
 * tests/api_coverage.sh fails the build when an exported function does not
 * appear in this file or the adapters' files.
 *
 * Layout: this file holds the argument kinds, the one table, the walk, the
 * tests by hand and the set-up; the adapters live beside their module's
 * in tests/check_api_{units,data,stub,pair,loss,array,sweep}.c, and
 * tests/check_api.h declares what they share (and each adapter).
 *
 * GSL's error handler is set to abort loudly: the library must validate
 * its input before any GSL routine could see it.  Expected statuses are
 * the header's documentation (lib/coaxline.h); no numeric reference values
 * are checked here. */
#include <config.h>
#include "check_api.h"

/* ---- argument kinds ----------------------------------------------------- */

typedef struct kind {
    const char *name;
    const double *bad;  /* must be refused */
    size_t nbad;
    const double *odd;  /* refused, or accepted with finite results */
    size_t nodd;
} kind;

#define LIST(...) (const double[]){ __VA_ARGS__ }, \
    sizeof((const double[]){ __VA_ARGS__ }) / sizeof(double)
#define NONE NULL, 0
#define NONFINITE NAN, INFINITY, -INFINITY
#define HUGE_SMALL 1e308, DBL_MAX, DBL_MIN, DBL_TRUE_MIN, 1e-300

/* reals */
static const kind K_FIN = { "finite", LIST(NONFINITE),
    LIST(0.0, -0.0, 1e308, -1e308, DBL_MAX, -DBL_MAX, DBL_TRUE_MIN, -DBL_TRUE_MIN, 1e-300) };
static const kind K_POS = { "> 0", LIST(NONFINITE, 0.0, -0.0, -1.0, -DBL_MAX, -DBL_TRUE_MIN),
    LIST(HUGE_SMALL) };
static const kind K_NONNEG = { ">= 0", LIST(NONFINITE, -1.0, -DBL_MAX, -DBL_TRUE_MIN),
    LIST(0.0, -0.0, HUGE_SMALL) };
static const kind K_VF = { "velocity factor", LIST(NONFINITE, 0.0, -0.5, 1.0000001, 2.0, 66.0, DBL_MAX),
    LIST(1.0, DBL_MIN, DBL_TRUE_MIN, 1e-300) };
static const kind K_ELEV = { "elevation", LIST(NONFINITE, 90.0001, -90.0001, 1e308, -DBL_MAX),
    LIST(90.0, -90.0, 0.0, DBL_TRUE_MIN) };
static const kind K_IMB = { "imbalance dB", LIST(NONFINITE, 200.0001, -200.0001, DBL_MAX, -DBL_MAX),
    LIST(200.0, -200.0, 0.0, DBL_TRUE_MIN) };
static const kind K_SWR = { "swr", LIST(NONFINITE, 0.999, 0.0, -1.0, -DBL_MAX),
    LIST(1.0, 1e308, DBL_MAX) };
static const kind K_GAMMA = { "reflection part", LIST(NONFINITE, 1.5, -1.01, DBL_MAX),
    LIST(1.0, -1.0, 0.0, DBL_TRUE_MIN) };
static const kind K_DEPTH = { "null depth dB", LIST(NONFINITE, 0.0, 1.0, -300.0001, -DBL_MAX, DBL_MAX),
    LIST(-300.0, -DBL_TRUE_MIN, -1e-300) };
static const kind K_RATIO_DB = { "ratio dB", LIST(NONFINITE, 300.0, -300.0, DBL_MAX, -DBL_MAX),
    LIST(299.9, -299.9, 0.0) };
static const kind K_CONSIST = { "consistency", LIST(NONFINITE, 0.0, -0.1, 0.5001, DBL_MAX),
    LIST(0.5, DBL_TRUE_MIN) };
static const kind K_EPS_R = { ">= 1", LIST(NONFINITE, 0.999, 0.0, -1.0, -DBL_MAX),
    LIST(1.0, 1e308, DBL_MAX) };
static const kind K_VF0 = { "velocity factor or 0", LIST(NONFINITE, -0.5, -DBL_TRUE_MIN, 1.0000001, 2.0, DBL_MAX),
    LIST(0.0, -0.0, 1.0, DBL_MIN, DBL_TRUE_MIN, 1e-300) };
static const kind K_TAND = { "loss tangent", LIST(NONFINITE, -0.1, 1.0, 2.0, DBL_MAX),
    LIST(0.0, 0.999999, DBL_TRUE_MIN) };

/* integers: only values an int, unsigned or size_t can hold */
static const kind K_ORDER = { "order", LIST(0, -1, INT_MIN, 1001, INT_MAX), LIST(1000) };
static const kind K_ORDER0 = { "order or 0", LIST(-1, INT_MIN, 1001, INT_MAX), LIST(0, 1000) };
static const kind K_ELEMENT = { "element", LIST(-1, 2, INT_MIN, INT_MAX), NONE };
static const kind K_ELKIND = { "element kind", LIST(-1, 3, 99, INT_MIN, INT_MAX), NONE };
static const kind K_ENUM2 = { "enum of two", LIST(-1, 2, 99, INT_MIN, INT_MAX), NONE };
static const kind K_ENUM3 = { "enum of three", LIST(-1, 3, 99, INT_MIN, INT_MAX), NONE };
static const kind K_BETA = { "Kaiser beta", LIST(NONFINITE, -0.1, 50.0001, DBL_MAX), LIST(0.0, 50.0, DBL_TRUE_MIN) };
static const kind K_SFIT_FLAGS = { "sweepfit flags", LIST(4, 8, 0x80000000u, UINT_MAX), LIST(0) };
static const kind K_FAULT_FLAGS = { "fault flags", LIST(4, 8, 0x80000000u, UINT_MAX), LIST(0, 1, 3) };
static const kind K_REGION = { "region", LIST(-1, 4, INT_MIN, INT_MAX), LIST(0, 3) };
static const kind K_DECIMALS = { "decimals", LIST(-1, 18, INT_MIN, INT_MAX), LIST(0, 17) };
static const kind K_PROP = { "cable property", LIST(-1, 11, INT_MIN, INT_MAX), NONE };
static const kind K_ANYINT = { "any int", NONE, LIST(0, -1, INT_MIN, INT_MAX) };
static const kind K_EFLAGS = { "extrapolate flag", LIST(2, 4, 8, 0x80000000u, UINT_MAX), LIST(0, 1) };
static const kind K_FLAGS = { "loss flags", LIST(4, 8, 0x80000000u, UINT_MAX), LIST(0, 1, 2, 3) };
/* the physical model also takes CXL_LOSS_THIN_SKIN (4) */
static const kind K_MFLAGS = { "model flags", LIST(8, 16, 0x80000000u, UINT_MAX), LIST(0, 1, 2, 3, 4, 7) };
static const kind K_TURNS = { "turns", LIST(0), LIST(1, 1000, UINT_MAX) };
static const kind K_MAXTURNS = { "max turns", LIST(0, 257, UINT_MAX), LIST(1, 256) };
static const kind K_COUNT1 = { "count >= 1 (within the test's buffer)", LIST(0), NONE };
static const kind K_INDEX = { "index", LIST(1e6, 1e15, (double)SIZE_MAX), NONE };
static const kind K_COUNT3 = { "count of 3 readings", LIST(0, 2, 4, 1e6, (double)SIZE_MAX), NONE };
/* yield.c */
static const kind K_VFTOL = { "VF tolerance", LIST(NONFINITE, -0.01, -DBL_TRUE_MIN, 1.0, 2.0, DBL_MAX),
    LIST(0.0, 0.999, DBL_TRUE_MIN) };
static const kind K_DBTOL = { "dB tolerance", LIST(NONFINITE, -0.5, 200.0001, DBL_MAX),
    LIST(0.0, 200.0, DBL_TRUE_MIN) };
static const kind K_PHTOL = { "phase tolerance", LIST(NONFINITE, -1.0, 180.0001, DBL_MAX),
    LIST(0.0, 180.0, DBL_TRUE_MIN) };
static const kind K_TRIALS = { "trials", LIST(0, 100000001, 1e15, (double)SIZE_MAX), LIST(1) };
static const kind K_SEED = { "seed", NONE, LIST(0, 1, 4294967295.0) };
static const kind K_THREADS = { "threads", LIST(257, UINT_MAX), LIST(0, 1, 256) };
static const kind K_BUFSIZE = { "buffer size", LIST(0), LIST(1, 2, 5) };
static const kind K_TEXTSIZE = { "text size (within the text)", NONE, LIST(0, 1) };

/* ---- the table -------------------------------------------------------- */

typedef cxl_status (*call_fn)(const double *a, double *o, unsigned nulls);

typedef struct api_case {
    const char *fn;
    call_fn call;
    size_t nargs;
    double good[MAXARGS];
    const kind *kinds[MAXARGS];
    unsigned nptr;            /* pointer arguments, in signature order */
    unsigned optional;        /* mask: pointers documented as optional */
    size_t nout;              /* outputs written to o[0..nout-1] */
    size_t nbadrows;
    double badrows[3][MAXARGS];
} api_case;

/* Functions where an odd value may make a bad combination with the good
 * arguments, so CXL_EINVAL is allowed for it (see step 4 below). */
static const char *const lenient[] = {
    "cxl_stub_set_vf_range",      /* a VF of 1 above vf_max, a tiny vf_max */
    "cxl_pair_phase_uncertainty", /* a tiny VF under vf_tol, a huge vf_tol */
    "cxl_pair_check",             /* the same */
    "cxl_pair_load_check",        /* the same */
    "cxl_duo_set_feed",    /* a frequency of 0 with an end-fire feed */
    "cxl_hybrid_response",        /* |Gamma| of 1 with another one */
    "cxl_trim_add_reading",       /* order 0 among given orders */
    "cxl_sweep_resonances",       /* a length of 0 with a VF guess */
    "cxl_sweepfit_new",           /* a load or fixture VF without its flag */
};

static int is_lenient(const char *fn)
{
    for (size_t i = 0; i < sizeof lenient / sizeof lenient[0]; i++)
        if (strcmp(fn, lenient[i]) == 0) return 1;
    return 0;
}

char sentinel_object;
const char sentinel_text[] = "sentinel";

/* Global objects the walk works on, built once in main(). */
cxl_bands *g_bands;
cxl_catalog *g_cat;
size_t g_user;          /* a user cable with two loss points */
cxl_stub *g_stub;       /* readings on one length */
cxl_stub_result *g_res1;
cxl_stub_result *g_res2; /* readings on two lengths: fixture fitted */
cxl_loss_fit *g_fit;
cxl_loss_model *g_model;
cxl_duo *g_pair;  /* end-fire pair of long wires */
cxl_array *g_array;      /* three elements, one fed by a modelled line */
cxl_loss_model *g_clad;  /* g_model with a copper-clad steel centre */
cxl_drift *g_drift;      /* VF at three frequencies */
cxl_trim *g_trim;        /* a piece read at three orders, with a target */
cxl_trim_result *g_trim_res;
char *g_sweep_text;      /* an open stub, 10 m at VF 0.66, 1-40 MHz */
cxl_sweep *g_sweep;
cxl_sweep_res *g_sres;
cxl_fault *g_fault;      /* profile of g_sweep */
cxl_harness *g_harness;  /* planned: two elements, drums of 30 m and 20 m */
cxl_yield *g_yield;      /* all four tolerances, a few trials on 2 threads */
cxl_sweepfit *g_sfit;    /* g_sweep fitted as a 10 m open line */

const char good_bands_csv[] =
    "band,service,region,low_khz,high_khz,footnote,source\n"
    "160m,amateur,1,1810,2000,,invented test row\n";
const char good_cables_csv[] = "name,vf\nbench-spool,0.83\n";
const char good_loss_csv[] =
    "name,freq_mhz,loss_db_per_100m\nbench-spool,1.8,1.2\nbench-spool,30,5.5\n";

#define F 1.83e6 /* a frequency in the 160 m band */
#define C CXL_C_M_PER_S

static api_case cases[] = {
    /* units.c */
    { "cxl_units_parse_number", call_parse_number, 0, {0}, {0}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_units_parse_length", call_parse_length, 1, {CXL_UNITS_IMPERIAL}, {&K_ENUM2}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_units_parse_freq", call_parse_freq, 0, {0}, {0}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_units_parse_time", call_parse_time, 0, {0}, {0}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_units_format_fixed", call_format_fixed, 3, {-12.25, 3, 600},
      {&K_FIN, &K_DECIMALS, &K_BUFSIZE}, 1, 0, 1, 0, {{0}} },
    { "cxl_units_format_roundtrip", call_format_roundtrip, 2, {-12.25, 600},
      {&K_FIN, &K_BUFSIZE}, 1, 0, 1, 0, {{0}} },
    { "cxl_units_format_imperial", call_format_imperial, 2, {8.0, 600},
      {&K_FIN, &K_BUFSIZE}, 1, 0, 1, 0, {{0}} },
    /* line.c */
    { "cxl_line_delay_from_length", call_delay_from_length, 2, {10, 0.8}, {&K_NONNEG, &K_VF}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_length_from_delay", call_length_from_delay, 2, {33e-9, 0.8}, {&K_NONNEG, &K_VF}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_degrees_from_length", call_degrees_from_length, 3, {10, 0.8, F},
      {&K_FIN, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_length_from_degrees", call_length_from_degrees, 3, {90, 0.66, F},
      {&K_FIN, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_degrees_from_delay", call_degrees_from_delay, 2, {33e-9, F}, {&K_FIN, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_delay_from_offset", call_delay_from_offset, 1, {10}, {&K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_line_cut_length", call_cut_length, 4, {33e-9, 0.8, 0.1, 0.7},
      {&K_POS, &K_VF, &K_NONNEG, &K_VF}, 1, 0, 1,
      1, {{33e-9, 0.8, 10.0, 0.7}} /* the allowance alone is longer */ },
    { "cxl_line_quarter_wave_freq", call_quarter_wave, 2, {8, 0.8}, {&K_POS, &K_VF}, 1, 0, 1, 0, {{0}} },
    /* csv.c */
    { "cxl_csv_reader_new_stream", call_reader_new_stream, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_csv_reader_new_buffer", call_reader_new_buffer, 1, {8}, {&K_TEXTSIZE}, 2, 0, 1, 0, {{0}} },
    { "cxl_csv_reader_next", call_reader_next, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_csv_write_field", call_write_field, 1, {1}, {&K_ANYINT}, 2, 0, 0, 0, {{0}} },
    /* band.c */
    { "cxl_bands_new", call_bands_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_bands_new_stream", call_bands_new_stream, 0, {0}, {0}, 3, 0x4, 1, 0, {{0}} },
    { "cxl_bands_get", call_bands_get, 1, {0}, {&K_INDEX}, 8, 0xFE, 7, 0, {{0}} },
    { "cxl_bands_name", call_bands_name, 0, {0}, {0}, 3, 0, 1, 0, {{0}} },
    { "cxl_bands_edges", call_bands_edges, 2, {0, 1}, {&K_REGION, &K_ANYINT}, 4, 0, 2, 0, {{0}} },
    /* stub.c */
    { "cxl_stub_wavelengths", call_stub_wavelengths, 2, {CXL_STUB_OPEN, 3}, {&K_ENUM2, &K_ORDER}, 1, 0, 1, 0, {{0}} },
    { "cxl_stub_vf_from_resonance", call_stub_vf_from_resonance, 6,
      {CXL_STUB_OPEN, 1, 10.0, 0.25 * 0.66 * C / 10.5, 0.5, 0.66},
      {&K_ENUM2, &K_ORDER, &K_POS, &K_POS, &K_NONNEG, &K_VF}, 1, 0, 1,
      2, {{CXL_STUB_OPEN, 1, 10.0, 0.25 * C / 5.0, 10.0, 0.66}, /* fixture alone longer */
          {CXL_STUB_OPEN, 1, 10.0, 0.25 * C / 5.0, 0.0, 0.66}} /* VF above 1 */ },
    { "cxl_stub_resonance_freq", call_stub_resonance_freq, 6,
      {CXL_STUB_SHORT, 2, 10.0, 0.66, 0.5, 0.66},
      {&K_ENUM2, &K_ORDER, &K_POS, &K_VF, &K_NONNEG, &K_VF}, 1, 0, 1, 0, {{0}} },
    { "cxl_stub_new", call_stub_new, 1, {CXL_STUB_SHORT}, {&K_ENUM2}, 1, 0, 1, 0, {{0}} },
    { "cxl_stub_set_fixture", call_stub_set_fixture, 2, {0.3, 0.66}, {&K_NONNEG, &K_VF}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_set_tolerances", call_stub_set_tolerances, 2, {0.005, 1e3}, {&K_NONNEG, &K_NONNEG}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_set_vf_range", call_stub_set_vf_range, 2, {0.6, 0.9}, {&K_VF, &K_VF}, 1, 0, 0,
      2, {{0.9, 0.6}, {0.7, 0.7}} },
    { "cxl_stub_set_consistency", call_stub_set_consistency, 1, {0.05}, {&K_CONSIST}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_set_orders", call_stub_set_orders, 1, {CXL_STUB_ORDERS_BEST_FIT}, {&K_ENUM2}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_add_reading", call_stub_add_reading, 3, {10.0, 4.9e6, 1}, {&K_POS, &K_POS, &K_ORDER0}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_infer_orders", call_stub_infer_orders, 1, {3}, {&K_COUNT3}, 2, 0, 3, 0, {{0}} },
    { "cxl_stub_fit", call_stub_fit, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_stub_reset", call_stub_reset, 1, {CXL_STUB_SHORT}, {&K_ENUM2}, 1, 0, 0, 0, {{0}} },
    { "cxl_stub_result_new", call_stub_result_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_stub_fit_into", call_stub_fit_into, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_stub_result_vf", call_stub_result_vf, 0, {0}, {0}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_stub_result_vf_budget", call_stub_result_vf_budget, 0, {0}, {0}, 4, 0xE, 3, 0, {{0}} },
    { "cxl_stub_result_fixture", call_stub_result_fixture, 0, {0}, {0}, 4, 0xC, 3, 0, {{0}} },
    { "cxl_stub_result_flags", call_stub_result_flags, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_stub_result_reading", call_stub_result_reading, 1, {2}, {&K_INDEX}, 7, 0x7E, 6, 0, {{0}} },
    { "cxl_stub_result_vf_at", call_stub_result_vf_at, 1, {3.5e6}, {&K_POS}, 4, 0x8, 3, 0, {{0}} },
    /* pair.c */
    { "cxl_pair_phase_error", call_pair_phase_error, 4, {10.1, 10.0, 0.66, F},
      {&K_POS, &K_POS, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_pair_phase_error_ref_deg", call_pair_phase_error_ref_deg, 5, {10.1, 90, F, 0.66, 3.6e6},
      {&K_POS, &K_POS, &K_POS, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_pair_max_mismatch", call_pair_max_mismatch, 3, {5, 0.66, F}, {&K_POS, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_pair_phase_uncertainty", call_pair_phase_uncertainty, 6, {10.1, 10.0, 0.66, F, 0.005, 0.01},
      {&K_POS, &K_POS, &K_VF, &K_POS, &K_NONNEG, &K_NONNEG}, 1, 0, 1,
      1, {{10.1, 10.0, 0.66, F, 0.005, 0.66}} /* vf_tol not below vf */ },
    { "cxl_pair_verdict", call_pair_verdict, 3, {1.5, 0.3, 2}, {&K_FIN, &K_NONNEG, &K_POS}, 1, 0, 1,
      0, {{0}} },
    { "cxl_pair_check", call_pair_check, 8, {10.0, 10.02, 2, 5, 0.66, F, 0.005, 0.01},
      {&K_POS, &K_POS, &K_COUNT1, &K_POS, &K_VF, &K_POS, &K_NONNEG, &K_NONNEG}, 5, 0, 4,
      2, {{10.0, 10.02, 1, 5, 0.66, F, 0.005, 0.01}, {10.0, 10.02, 2, 5, 0.66, F, 0.005, 0.7}} },
    { "cxl_pair_load_new_lossless", call_pair_load_new_lossless, 3, {50, 75, 10},
      {&K_POS, &K_NONNEG, &K_FIN}, 1, 0, 1, 1, {{50, 0, 0}} /* a short */ },
    { "cxl_pair_load_new_model", call_pair_load_new_model, 2, {75, -10}, {&K_NONNEG, &K_FIN}, 2, 0,
      1, 1, {{0, 0}} /* a short */ },
    { "cxl_pair_load_transfer", call_pair_load_transfer, 3, {30, 0.66, F},
      {&K_NONNEG, &K_VF, &K_POS}, 4, 0x8, 3, 0, {{0}} },
    { "cxl_pair_load_transfer", call_pair_load_transfer_model, 3, {30, 0.66, 10e6},
      {&K_NONNEG, &K_VF, &K_POS}, 4, 0x8, 3, 1, {{30, 0.66, 1e3}} /* below the model's range */ },
    { "cxl_pair_load_check", call_pair_load_check, 8, {10.0, 10.02, 2, 5, 0.66, F, 0.005, 0.01},
      {&K_POS, &K_POS, &K_COUNT1, &K_POS, &K_VF, &K_POS, &K_NONNEG, &K_NONNEG}, 7, 0, 5,
      2, {{10.0, 10.02, 1, 5, 0.66, F, 0.005, 0.01}, {10.0, 10.02, 2, 5, 0.66, F, 0.005, 0.7}} },
    { "cxl_pair_load_max_mismatch", call_pair_load_max_mismatch, 4, {5, 10.0, 0.66, F},
      {&K_POS, &K_POS, &K_VF, &K_POS}, 2, 0, 1, 0, {{0}} },
    /* catalog.c */
    { "cxl_catalog_new", call_catalog_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_catalog_load_cables", call_catalog_load_cables, 0, {0}, {0}, 5, 0x1C, 1, 0, {{0}} },
    { "cxl_catalog_load_loss", call_catalog_load_loss, 0, {0}, {0}, 5, 0x1C, 1, 0, {{0}} },
    { "cxl_catalog_find", call_catalog_find, 0, {0}, {0}, 3, 0, 1, 0, {{0}} },
    { "cxl_catalog_name", call_catalog_name, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_catalog_dielectric", call_catalog_dielectric, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_catalog_source", call_catalog_source, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_catalog_is_builtin", call_catalog_is_builtin, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_catalog_value", call_catalog_value, 2, {0, CXL_CABLE_VF}, {&K_INDEX, &K_PROP}, 2, 0, 1, 0, {{0}} },
    { "cxl_catalog_loss_point", call_catalog_loss_point, 2, {0, 1}, {&K_INDEX, &K_INDEX}, 4, 0x8, 3, 0, {{0}} },
    /* loss.c */
    { "cxl_loss_fit_new", call_loss_fit_new, 5, {1.8e6, 30e6, 0.012, 0.055, 2},
      {&K_POS, &K_POS, &K_POS, &K_POS, &K_COUNT1}, 3, 0, 2,
      2, {{1.8e6, 30e6, 0.012, 0.055, 1}, {30e6, 30e6, 0.012, 0.055, 2}} },
    { "cxl_loss_fit_new_cable", call_loss_fit_new_cable, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_fit_coefficients", call_loss_fit_coefficients, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_fit_usable_range", call_loss_fit_usable_range, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_cable_new", call_loss_cable_new, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_cable_kind", call_loss_cable_kind, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_cable_range", call_loss_cable_range, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_cable_db_per_m", call_loss_cable_db_per_m, 2, {50e6, 0}, {&K_POS, &K_EFLAGS}, 2, 0, 1,
      1, {{1e6, 0}} /* below the table's usable range */ },
    { "cxl_loss_cable_difference", call_loss_cable_difference, 3, {20, 20.3, 50e6},
      {&K_NONNEG, &K_NONNEG, &K_POS}, 2, 0, 1, 1, {{20, 20.3, 1e6}} /* below the range */ },
    { "cxl_loss_fit_range", call_loss_fit_range, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_fit_point", call_loss_fit_point, 1, {1}, {&K_INDEX}, 4, 0, 3, 0, {{0}} },
    { "cxl_loss_fit_max_relative_residual", call_loss_fit_max_relative_residual, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_fit_eval", call_loss_fit_eval, 2, {10e6, 0}, {&K_POS, &K_FLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_fit_eval", call_loss_fit_eval, 2, {10e6, CXL_LOSS_EXTRAPOLATE}, {&K_POS, &K_FLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_model_new", call_loss_model_new, 6, {0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0},
      {&K_POS, &K_POS, &K_EPS_R, &K_TAND, &K_POS, &K_POS}, 1, 0, 3,
      2, {{2.95e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0}, {3e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0}} },
    { "cxl_loss_model_new_cable", call_loss_model_new_cable, 1, {0}, {&K_INDEX}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_model_set_clad", call_loss_model_set_clad, 3, {0.02e-3, 5e6, 100},
      {&K_NONNEG, &K_POS, &K_EPS_R}, 1, 0, 2, 1, {{0.5e-3, 5e6, 100}} /* thicker than the radius; 0 = bare core */ },
    { "cxl_loss_model_range", call_loss_model_range, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_model_rlgc", call_loss_model_rlgc, 2, {10e6, 0}, {&K_POS, &K_MFLAGS}, 5, 0, 4, 0, {{0}} },
    { "cxl_loss_model_rlgc", call_loss_model_rlgc, 2, {10e6, 3}, {&K_POS, &K_MFLAGS}, 5, 0, 4, 0, {{0}} },
    { "cxl_loss_model_gamma", call_loss_model_gamma, 2, {10e6, 0}, {&K_POS, &K_MFLAGS}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_model_gamma", call_loss_model_gamma, 2, {10e6, 1}, {&K_POS, &K_MFLAGS}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_model_attenuation", call_loss_model_attenuation, 2, {10e6, 0}, {&K_POS, &K_MFLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_model_attenuation", call_loss_model_attenuation, 2, {10e6, 1}, {&K_POS, &K_MFLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_model_z0", call_loss_model_z0, 2, {10e6, 0}, {&K_POS, &K_MFLAGS}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_model_z0", call_loss_model_z0, 2, {10e6, 1}, {&K_POS, &K_MFLAGS}, 3, 0, 2, 0, {{0}} },
    { "cxl_loss_model_vf", call_loss_model_vf, 2, {10e6, 0}, {&K_POS, &K_MFLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_model_vf", call_loss_model_vf, 2, {10e6, 1}, {&K_POS, &K_MFLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_loss_skin_depth_m", call_loss_skin_depth, 3, {F, 58e6, 1.0}, {&K_POS, &K_POS, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_loss_total_db", call_loss_total_db, 2, {1.5, 2.0}, {&K_NONNEG, &K_SWR}, 1, 0, 1, 0, {{0}} },
    { "cxl_loss_run_db", call_loss_run_db, 3, {0.02, 50, 2.0}, {&K_NONNEG, &K_POS, &K_SWR}, 2, 0, 2, 0, {{0}} },
    /* array.c */
    { "cxl_duo_new", call_pair_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_copy", call_pair_copy, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_set_geometry", call_pair_set_geometry, 2, {10, 40}, {&K_NONNEG, &K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_delay", call_pair_set_delay, 2, {1, 100e-9}, {&K_ELEMENT, &K_NONNEG}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_delay_deg", call_pair_set_delay_deg, 3, {1, 90, F},
      {&K_ELEMENT, &K_NONNEG, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_phase_offset", call_pair_set_phase_offset, 2, {1, 5}, {&K_ELEMENT, &K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_feed", call_pair_set_feed, 2, {CXL_FEED_CROSSFIRE, 0}, {&K_ENUM2, &K_NONNEG},
      1, 0, 4, 0, {{0}} },
    { "cxl_duo_set_feed", call_pair_set_feed, 2, {CXL_FEED_ENDFIRE, F}, {&K_ENUM2, &K_NONNEG},
      1, 0, 4, 1, {{CXL_FEED_ENDFIRE, 0}} /* end-fire needs its frequency */ },
    { "cxl_duo_feed", call_pair_feed, 1, {1}, {&K_ELEMENT}, 3, 0, 2, 0, {{0}} },
    { "cxl_duo_built_phase", call_pair_built_phase, 6, {0, 60e-9, 1e-9, 62e-9, 2, F},
      {&K_NONNEG, &K_NONNEG, &K_NONNEG, &K_NONNEG, &K_FIN, &K_POS}, 3, 0, 1, 0, {{0}} },
    { "cxl_duo_set_flip", call_pair_set_flip, 2, {1, 1}, {&K_ELEMENT, &K_ANYINT}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_imbalance", call_pair_set_imbalance, 1, {1}, {&K_IMB}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_isotropic", call_pair_set_isotropic, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_set_long_wire", call_pair_set_long_wire, 2, {80, 0.7}, {&K_POS, &K_VF}, 1, 0, 1, 0, {{0}} },
    { "cxl_duo_field", call_array_field, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV}, 3, 0, 2, 0, {{0}} },
    { "cxl_duo_response", call_array_response, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_gain", call_array_gain, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_forward_gain", call_array_forward_gain, 2, {F, 15}, {&K_POS, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_pattern", call_array_pattern, 3, {F, 15, 4}, {&K_POS, &K_ELEV, &K_COUNT1}, 2, 0, 4, 0, {{0}} },
    { "cxl_duo_front_to_back", call_array_front_to_back, 2, {F, 15}, {&K_POS, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_rear_null", call_array_rear_null, 2, {F, 15}, {&K_POS, &K_ELEV}, 3, 0, 2, 0, {{0}} },
    { "cxl_duo_peak", call_array_peak, 1, {F}, {&K_POS}, 3, 0, 2, 0, {{0}} },
    { "cxl_duo_directivity", call_array_directivity, 1, {F}, {&K_POS}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_rdf", call_array_rdf, 1, {F}, {&K_POS}, 2, 0, 1, 0, {{0}} },
    { "cxl_duo_null_depth", call_array_null_depth, 2, {2, 0.5}, {&K_FIN, &K_IMB}, 1, 0, 1, 0, {{0}} },
    { "cxl_yield_new", call_yield_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_yield_set_tolerances", call_yield_set_tolerances, 4, {0.1, 0.01, 0.5, 3},
      {&K_NONNEG, &K_VFTOL, &K_DBTOL, &K_PHTOL}, 1, 0, 1, 0, {{0}} },
    { "cxl_yield_set_goal_front_to_back", call_yield_set_goal_front_to_back, 1, {20},
      {&K_RATIO_DB}, 1, 0, 1, 0, {{0}} },
    { "cxl_yield_set_goal_null", call_yield_set_goal_null, 1, {-25}, {&K_DEPTH}, 1, 0, 1, 0, {{0}} },
    { "cxl_yield_set_run", call_yield_set_run, 3, {500, 7, 2}, {&K_TRIALS, &K_SEED, &K_THREADS},
      1, 0, 1, 0, {{0}} },
    { "cxl_yield_eval", call_yield_eval, 2, {F, 15}, {&K_POS, &K_ELEV}, 8, 0xC0, 6, 0, {{0}} },
    { "cxl_array_new", call_array_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_copy", call_array_copy, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_array_add", call_array_add, 3, {3, -4, 0}, {&K_FIN, &K_FIN, &K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_set_position", call_array_set_position, 4, {1, 3, -4, 1},
      {&K_INDEX, &K_FIN, &K_FIN, &K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_set_delay", call_array_set_delay, 2, {1, 50e-9}, {&K_INDEX, &K_NONNEG}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_set_line", call_array_set_line, 3, {1, 12, 0.66}, {&K_INDEX, &K_NONNEG, &K_VF},
      1, 0, 1, 0, {{0}} },
    { "cxl_array_set_line_model", call_array_set_line_model, 2, {1, 12}, {&K_INDEX, &K_NONNEG},
      2, 0, 1, 0, {{0}} },
    { "cxl_array_set_reversed", call_array_set_reversed, 2, {1, 1}, {&K_INDEX, &K_ANYINT}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_set_weight", call_array_set_weight, 2, {1, -1.5}, {&K_INDEX, &K_IMB}, 1, 0, 1, 0, {{0}} },
    { "cxl_array_set_phase_offset", call_array_set_phase_offset, 2, {1, 5}, {&K_INDEX, &K_FIN},
      1, 0, 1, 0, {{0}} },
    { "cxl_array_set_element", call_array_set_element, 3, {1, 80, 0.7}, {&K_ELKIND, &K_POS, &K_VF},
      1, 0, 1, 0, {{0}} },
    { "cxl_array_max_freq", call_array_max_freq, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_field", call_array_eval_field, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV}, 3, 0, 2, 0, {{0}} },
    { "cxl_array_eval_response", call_array_eval_response, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV},
      2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_gain", call_array_eval_gain, 3, {F, 30, 15}, {&K_POS, &K_FIN, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_pattern", call_array_eval_pattern, 3, {F, 15, 4}, {&K_POS, &K_ELEV, &K_COUNT1},
      2, 0, 4, 0, {{0}} },
    { "cxl_array_eval_front_to_back", call_array_eval_front_to_back, 2, {F, 15}, {&K_POS, &K_ELEV},
      2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_rear_null", call_array_eval_rear_null, 2, {F, 15}, {&K_POS, &K_ELEV}, 3, 0, 2, 0, {{0}} },
    { "cxl_array_eval_beamwidth", call_array_eval_beamwidth, 2, {F, 15}, {&K_POS, &K_ELEV}, 2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_peak", call_array_eval_peak, 1, {F}, {&K_POS}, 3, 0, 2, 0, {{0}} },
    { "cxl_array_eval_directivity", call_array_eval_directivity, 1, {F}, {&K_POS}, 2, 0, 1, 0, {{0}} },
    { "cxl_array_eval_rdf", call_array_eval_rdf, 2, {F, 15}, {&K_POS, &K_ELEV}, 3, 0, 2, 0, {{0}} },
    /* budget.c */
    { "cxl_budget_phase_for_null", call_budget_phase_for_null, 2, {-30, 0.2}, {&K_DEPTH, &K_IMB}, 1, 0, 1,
      1, {{-40, 3.0}} /* the imbalance alone misses -40 dB */ },
    { "cxl_budget_phase_for_front_to_back", call_budget_phase_for_front_to_back, 3, {3, F, 15},
      {&K_RATIO_DB, &K_POS, &K_ELEV}, 2, 0, 1, 1, {{299, F, 15}} /* the pair never reaches it */ },
    { "cxl_budget_phase_for_rear_null", call_budget_phase_for_rear_null, 3, {-3, F, 15},
      {&K_DEPTH, &K_POS, &K_ELEV}, 2, 0, 1, 1, {{-299, F, 15}} /* the pair never reaches it */ },
    { "cxl_budget_length_for_phase", call_budget_length_for_phase, 3, {5, 0.66, F},
      {&K_NONNEG, &K_VF, &K_POS}, 1, 0, 1, 0, {{0}} },
    /* hybrid.c */
    { "cxl_hybrid_inphase", call_hybrid_inphase, 1, {75}, {&K_POS}, 2, 0, 2, 0, {{0}} },
    { "cxl_hybrid_turns_ratio", call_hybrid_turns_ratio, 2, {37.5, 75}, {&K_POS, &K_POS}, 1, 0, 1, 0, {{0}} },
    { "cxl_hybrid_match", call_hybrid_match, 4, {37.5, 75, 2, 3}, {&K_POS, &K_POS, &K_TURNS, &K_TURNS}, 3, 0, 3, 0, {{0}} },
    { "cxl_hybrid_turns_search", call_hybrid_turns_search, 4, {37.5, 75, 10, 4},
      {&K_POS, &K_POS, &K_MAXTURNS, &K_COUNT1}, 3, 0, 9, 0, {{0}} },
    { "cxl_hybrid_response", call_hybrid_response, 4, {0.1, 0.05, -0.2, 0.0},
      {&K_GAMMA, &K_GAMMA, &K_GAMMA, &K_GAMMA}, 2, 0, 2,
      1, {{0.8, 0.8, 0, 0}} /* |Gamma| above 1 */ },
    /* transfer.c */
    { "cxl_transfer_ratio", call_transfer_ratio, 7, {30, 50, -2, 0.01, 0.05, 75, 10},
      {&K_NONNEG, &K_POS, &K_FIN, &K_NONNEG, &K_POS, &K_NONNEG, &K_FIN}, 2, 0, 2,
      2, {{30, 50, -2, 0.01, 0.05, 0, 0}, /* a shorted load */
          {0.75 * M_PI, 50, 0, 0, 1, 0, 50}} /* j50 three eighths back: a short at the input */ },
    { "cxl_transfer_delay", call_transfer_delay, 3, {0.5, -0.5, 45}, {&K_FIN, &K_FIN, &K_FIN}, 2, 0, 2,
      1, {{0, 0, 45}} /* no voltage, no phase */ },
    { "cxl_transfer_lossless", call_transfer_lossless, 6, {30, 50, 0.66, F, 75, 10},
      {&K_NONNEG, &K_POS, &K_VF, &K_POS, &K_NONNEG, &K_FIN}, 3, 0x4, 3,
      1, {{30, 50, 0.66, F, 0, 0}} },
    { "cxl_transfer_model", call_transfer_model, 5, {30, 10e6, 0, 75, 10},
      {&K_NONNEG, &K_POS, &K_MFLAGS, &K_NONNEG, &K_FIN}, 4, 0x8, 3,
      2, {{30, 1e3, 0, 75, 10}, /* below the model's range */ {30, 10e6, 0, 0, 0}} },
    { "cxl_transfer_model", call_transfer_model, 5, {30, 10e6, CXL_LOSS_EXTRAPOLATE, 75, 10},
      {&K_NONNEG, &K_POS, &K_MFLAGS, &K_NONNEG, &K_FIN}, 4, 0x8, 3, 0, {{0}} },
    { "cxl_transfer_input_impedance", call_transfer_input_impedance, 7, {30, 50, -2, 0.01, 0.05, 75, 10},
      {&K_NONNEG, &K_POS, &K_FIN, &K_NONNEG, &K_POS, &K_NONNEG, &K_FIN}, 2, 0, 2,
      1, {{0.5 * M_PI, 50, 0, 0, 1, 0, 0}} /* a shorted quarter wave: open at the input */ },
    { "cxl_transfer_stub_resonance", call_transfer_stub_resonance, 4, {0, CXL_STUB_OPEN, 1, 30},
      {&K_MFLAGS, &K_ENUM2, &K_ORDER, &K_POS}, 2, 0, 1,
      1, {{0, CXL_STUB_OPEN, 1, 1e5}} /* resonance below the model's range */ },
    { "cxl_transfer_stub_resonance", call_transfer_stub_resonance, 4,
      {CXL_LOSS_EXTRAPOLATE, CXL_STUB_SHORT, 3, 30},
      {&K_MFLAGS, &K_ENUM2, &K_ORDER, &K_POS}, 2, 0, 1, 0, {{0}} },
    { "cxl_transfer_stub_dip", call_transfer_stub_dip, 6,
      {CXL_LOSS_EXTRAPOLATE, CXL_STUB_OPEN, 2, 30, CXL_DIP_MIN_SWR, 25},
      {&K_MFLAGS, &K_ENUM2, &K_ORDER, &K_POS, &K_ENUM3, &K_POS}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_transfer_stub_dip", call_transfer_stub_dip, 6,
      {CXL_LOSS_EXTRAPOLATE, CXL_STUB_SHORT, 1, 30, CXL_DIP_MIN_Z, 50},
      {&K_MFLAGS, &K_ENUM2, &K_ORDER, &K_POS, &K_ENUM3, &K_POS}, 3, 0x4, 2, 0, {{0}} },
    /* loss.c: clad crossover */
    { "cxl_loss_model_clad_crossover", call_loss_model_clad_crossover, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    /* drift.c */
    { "cxl_drift_new", call_drift_new, 7, {1.8e6, 7e6, 0.655, 0.66, 0.002, 0.001, 2},
      {&K_POS, &K_POS, &K_VF, &K_VF, &K_POS, &K_POS, &K_COUNT1}, 4, 0x4, 5,
      2, {{7e6, 7e6, 0.655, 0.66, 0.002, 0.001, 2}, /* one frequency */
          {1.8e6, 7e6, 0.655, 0.66, 0.002, 0.001, 1}} },
    { "cxl_drift_new_stub", call_drift_new_stub, 1, {1e3}, {&K_NONNEG}, 2, 0, 5, 0, {{0}} },
    { "cxl_drift_coefficients", call_drift_coefficients, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_drift_range", call_drift_range, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_drift_vf", call_drift_vf, 1, {3.5e6}, {&K_POS}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_drift_allowance", call_drift_allowance, 2, {7e6, 1.83e6}, {&K_POS, &K_POS}, 2, 0, 2,
      1, {{7e6, 1e4}} /* below the law's range */ },
    /* sweep.c */
    { "cxl_sweep_read", call_sweep_read, 0, {0}, {0}, 4, 0xC, 1, 0, {{0}} },
    { "cxl_sweep_read_buffer", call_sweep_read_buffer, 1, {1e9}, {&K_TEXTSIZE}, 4, 0xC, 1, 0, {{0}} },
    { "cxl_sweep_info", call_sweep_info, 0, {0}, {0}, 6, 0x3E, 5, 0, {{0}} },
    { "cxl_sweep_point", call_sweep_point, 2, {5, 50}, {&K_INDEX, &K_POS}, 6, 0x3E, 5, 0, {{0}} },
    { "cxl_sweep_magnitude", call_sweep_magnitude, 2, {5, 75}, {&K_INDEX, &K_POS}, 3, 0x2, 2, 0, {{0}} },
    { "cxl_sweep_resonances", call_sweep_resonances, 4, {50, CXL_STUB_OPEN, 10, 0.66},
      {&K_POS, &K_ENUM2, &K_NONNEG, &K_VF0}, 2, 0, 2, 2,
      {{50, CXL_STUB_OPEN, 10, 0}, {50, CXL_STUB_SHORT, 0, 0.66}} },
    { "cxl_sweep_res_get", call_sweep_res_get, 1, {0}, {&K_INDEX}, 7, 0x7E, 6, 0, {{0}} },
    { "cxl_sweep_res_readings", call_sweep_res_readings, 1, {CXL_SWEEP_X_ZERO}, {&K_ENUM3}, 4, 0, 1, 0, {{0}} },
    /* sweepfit.c */
    { "cxl_sweepfit_new", call_sweepfit_new, 6, {10, CXL_STUB_OPEN, 0, 0, 0, 0},
      {&K_POS, &K_ENUM2, &K_NONNEG, &K_FIN, &K_VF0, &K_SFIT_FLAGS}, 2, 0, 1, 0, {{0}} },
    { "cxl_sweepfit_line", call_sweepfit_line, 0, {0}, {0}, 7, 0x7E, 6, 0, {{0}} },
    { "cxl_sweepfit_loss_coefficients", call_sweepfit_loss_coefficients, 0, {0}, {0}, 5, 0x1E, 4,
      0, {{0}} },
    { "cxl_sweepfit_fixture", call_sweepfit_fixture, 0, {0}, {0}, 3, 0x6, 2, 0, {{0}} },
    { "cxl_sweepfit_vf", call_sweepfit_vf, 1, {10e6}, {&K_POS}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_sweepfit_loss", call_sweepfit_loss, 1, {10e6}, {&K_POS}, 3, 0x4, 2, 0, {{0}} },
    { "cxl_sweepfit_quality", call_sweepfit_quality, 0, {0}, {0}, 6, 0x3E, 5, 0, {{0}} },
    /* fault.c */
    { "cxl_fault_new", call_fault_new, 6, {50, 0.66, CXL_FAULT_HANN, 6, 0.01, 0},
      {&K_POS, &K_VF0, &K_ENUM3, &K_BETA, &K_NONNEG, &K_FAULT_FLAGS}, 3, 0x2, 1, 0, {{0}} },
    { "cxl_fault_info", call_fault_info, 0, {0}, {0}, 6, 0x3E, 5, 0, {{0}} },
    { "cxl_fault_point", call_fault_point, 1, {3}, {&K_INDEX}, 5, 0x1E, 4, 0, {{0}} },
    { "cxl_fault_peak", call_fault_peak, 1, {0}, {&K_INDEX}, 5, 0x1E, 4, 0, {{0}} },
    /* trim.c */
    { "cxl_trim_new", call_trim_new, 2, {CXL_STUB_OPEN, TRIM_LEN}, {&K_ENUM2, &K_POS}, 1, 0, 11, 0, {{0}} },
    { "cxl_trim_set_fixture", call_trim_set_fixture, 3, {0.3, 0.7, 0.005},
      {&K_NONNEG, &K_VF0, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_fixture", call_trim_set_fixture, 3, {0.3, 0, 0.005},
      {&K_NONNEG, &K_VF0, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_fixture", call_trim_set_fixture_1, 3, {0.3, 0.7, 0.005},
      {&K_NONNEG, &K_VF0, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_model", call_trim_set_model, 0, {0}, {0}, 2, 0x2, 10, 0, {{0}} },
    { "cxl_trim_set_resolution", call_trim_set_resolution, 1, {1e3}, {&K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_reading", call_trim_set_reading, 2, {CXL_DIP_MIN_SWR, 50}, {&K_ENUM3, &K_POS}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_allowance", call_trim_set_allowance, 2, {0.1, 0.8}, {&K_NONNEG, &K_VF0}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_allowance", call_trim_set_allowance_1, 2, {0.1, 0}, {&K_NONNEG, &K_VF0}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_set_resolution", call_trim_set_resolution_1, 1, {1e3}, {&K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_add_reading", call_trim_add_reading, 2, {1.75 * 0.66 * C / TRIM_LEN, 4},
      {&K_POS, &K_ORDER0}, 1, 0, 10,
      3, {{0.25 * 0.66 * C / TRIM_LEN, 4}, /* a frequency twice */
          {1.75 * 0.66 * C / TRIM_LEN, 3}, /* an order twice */
          {1.75 * 0.66 * C / TRIM_LEN, 0}} /* unknown among given orders */ },
    { "cxl_trim_target_degrees", call_trim_target_degrees, 2, {90, F}, {&K_POS, &K_POS}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_target_delay", call_trim_target_delay, 2, {100e-9, 0}, {&K_POS, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_target_delay", call_trim_target_delay, 2, {100e-9, F}, {&K_POS, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_target_delay", call_trim_target_delay_1, 2, {100e-9, F}, {&K_POS, &K_NONNEG}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_target_resonance", call_trim_target_resonance, 3, {CXL_STUB_OPEN, 1, 1.9e6},
      {&K_ENUM2, &K_ORDER, &K_POS}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_solve", call_trim_solve, 0, {0}, {0}, 2, 0, 11, 0, {{0}} },
    { "cxl_trim_reset", call_trim_reset, 2, {CXL_STUB_OPEN, TRIM_LEN}, {&K_ENUM2, &K_POS}, 1, 0, 10, 0, {{0}} },
    { "cxl_trim_result_new", call_trim_result_new, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_trim_solve_into", call_trim_solve_into, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_trim_result_cut", call_trim_result_cut, 0, {0}, {0}, 5, 0x1E, 4, 0, {{0}} },
    { "cxl_trim_result_vf", call_trim_result_vf, 0, {0}, {0}, 4, 0xE, 3, 0, {{0}} },
    { "cxl_trim_result_flags", call_trim_result_flags, 0, {0}, {0}, 2, 0, 1, 0, {{0}} },
    { "cxl_trim_result_reading", call_trim_result_reading, 1, {1}, {&K_INDEX}, 6, 0x3E, 5, 0, {{0}} },
    { "cxl_harness_new", call_harness_new, 1, {0.66}, {&K_VF}, 1, 0, 1, 0, {{0}} },
    { "cxl_harness_add_element", call_harness_add_element, 3, {5, -5, 20e-9},
      {&K_FIN, &K_FIN, &K_NONNEG}, 2, 0x2, 1, 0, {{0}} },
    { "cxl_harness_set_combiner", call_harness_set_combiner, 2, {1, -2}, {&K_FIN, &K_FIN}, 1, 0, 1, 0, {{0}} },
    { "cxl_harness_set_cuts", call_harness_set_cuts, 3, {2, 0.1, 0.01},
      {&K_NONNEG, &K_NONNEG, &K_NONNEG}, 1, 0, 1, 0, {{0}} },
    { "cxl_harness_add_drum", call_harness_add_drum, 1, {50}, {&K_POS}, 2, 0x2, 1, 0, {{0}} },
    { "cxl_harness_plan", call_harness_plan, 0, {0}, {0}, 1, 0, 1, 0, {{0}} },
    { "cxl_harness_piece", call_harness_piece, 1, {1}, {&K_INDEX}, 6, 0, 5, 0, {{0}} },
    { "cxl_harness_feed_run", call_harness_feed_run, 0, {0}, {0}, 3, 0, 2, 0, {{0}} },
    { "cxl_harness_drum", call_harness_drum, 1, {1}, {&K_INDEX}, 3, 0, 2, 0, {{0}} },
};
#define NCASES (sizeof cases / sizeof cases[0])

/* ---- the walk --------------------------------------------------------- */

static int valid_status(cxl_status st)
{
    return (int)st >= (int)CXL_OK && (int)st <= (int)CXL_EINCONSISTENT;
}

static void fill(double *o)
{
    for (size_t k = 0; k < NOUT; k++) o[k] = SENT;
}

static void fmt_args(char *buf, size_t size, const double *a, size_t n)
{
    size_t used = 0;
    buf[0] = '\0';
    for (size_t i = 0; i < n && used < size; i++) {
        int w = snprintf(buf + used, size - used, "%s%.17g", i ? ", " : "", a[i]);
        if (w < 0) break;
        used += (size_t)w;
    }
}

/* Refused: a failing, valid status with every output untouched. */
static void expect_refused(const api_case *c, const double *a, unsigned nulls, const char *why)
{
    double o[NOUT];
    char args[512];
    fill(o);
    cxl_status st = c->call(a, o, nulls);
    fmt_args(args, sizeof args, a, c->nargs);
    ck_assert_msg(valid_status(st), "%s(%s) nulls=%#x: status %d is not a cxl_status",
                  c->fn, args, nulls, (int)st);
    ck_assert_msg(st != CXL_OK, "%s(%s) nulls=%#x accepted %s", c->fn, args, nulls, why);
    for (size_t k = 0; k < NOUT; k++)
        ck_assert_msg(o[k] == SENT, "%s(%s) nulls=%#x failed with %s but wrote output %zu",
                      c->fn, args, nulls, cxl_strerror(st), k);
}

/* Accepted or refused; never a NaN or infinity, never a half-written
 * output on failure. */
static void expect_safe(const api_case *c, const double *a, unsigned nulls, int must_pass)
{
    /* an odd value is a valid argument: refused for its range, never as
     * an invalid one (unless the row says it can clash with another) */
    int strict = !must_pass && !is_lenient(c->fn);
    double o[NOUT];
    char args[512];
    fill(o);
    cxl_status st = c->call(a, o, nulls);
    fmt_args(args, sizeof args, a, c->nargs);
    ck_assert_msg(valid_status(st), "%s(%s) nulls=%#x: status %d is not a cxl_status",
                  c->fn, args, nulls, (int)st);
    if (strict)
        ck_assert_msg(st != CXL_EINVAL, "%s(%s) nulls=%#x: a valid odd value refused as %s",
                      c->fn, args, nulls, cxl_strerror(st));
    if (must_pass)
        ck_assert_msg(st == CXL_OK, "%s(%s) nulls=%#x refused good arguments: %s",
                      c->fn, args, nulls, cxl_strerror(st));
    for (size_t k = 0; k < NOUT; k++) {
        if (st == CXL_OK)
            ck_assert_msg(isfinite(o[k]), "%s(%s) nulls=%#x: output %zu is %g",
                          c->fn, args, nulls, k, o[k]);
        else
            ck_assert_msg(o[k] == SENT, "%s(%s) failed with %s but wrote output %zu",
                          c->fn, args, cxl_strerror(st), k);
    }
}

START_TEST(walk_function)
{
    const api_case *c = &cases[_i];
    double a[MAXARGS];
    /* 1. good arguments */
    expect_safe(c, c->good, 0, 1);
    /* 2. NULL for each pointer in turn */
    for (unsigned j = 0; j < c->nptr; j++) {
        if (c->optional & (1u << j)) expect_safe(c, c->good, 1u << j, 1);
        else expect_refused(c, c->good, 1u << j, "a NULL pointer");
    }
    if (c->optional) expect_safe(c, c->good, c->optional, 1);
    /* 3 and 4. each numeric argument in turn */
    for (size_t i = 0; i < c->nargs; i++) {
        const kind *k = c->kinds[i];
        ck_assert_ptr_nonnull(k);
        for (size_t v = 0; v < k->nbad; v++) {
            memcpy(a, c->good, sizeof a);
            a[i] = k->bad[v];
            expect_refused(c, a, 0, k->name);
        }
        for (size_t v = 0; v < k->nodd; v++) {
            memcpy(a, c->good, sizeof a);
            a[i] = k->odd[v];
            expect_safe(c, a, 0, 0);
        }
    }
    /* 5. arguments bad together */
    for (size_t r = 0; r < c->nbadrows; r++)
        expect_refused(c, c->badrows[r], 0, "a bad combination");
}
END_TEST

/* ---- functions outside the table -------------------------------------- */

START_TEST(strings_and_version)
{
    ck_assert_str_eq(cxl_version(), CXL_VERSION_STRING);
    /* every status has its own text; anything else is "unknown status" */
    for (int s = CXL_OK; s <= CXL_EINCONSISTENT; s++)
        ck_assert_str_ne(cxl_strerror((cxl_status)s), "unknown status");
    const int outside[] = { -1, CXL_EINCONSISTENT + 1, 1000, INT_MAX, INT_MIN };
    for (size_t i = 0; i < sizeof outside / sizeof outside[0]; i++) {
        const char *t = cxl_strerror((cxl_status)outside[i]);
        ck_assert_ptr_nonnull(t);
        ck_assert_str_eq(t, "unknown status");
    }
}
END_TEST

START_TEST(free_and_count_null)
{
    /* freeing NULL is a no-op, counting NULL gives 0 */
    cxl_csv_reader_free(NULL);
    cxl_bands_free(NULL);
    cxl_stub_free(NULL);
    cxl_stub_result_free(NULL);
    cxl_catalog_free(NULL);
    cxl_loss_fit_free(NULL);
    cxl_loss_model_free(NULL);
    cxl_duo_free(NULL);
    cxl_array_free(NULL);
    ck_assert_uint_eq(cxl_array_count(NULL), 0);
    ck_assert_uint_eq(cxl_array_count(g_array), 3);
    cxl_drift_free(NULL);
    cxl_trim_free(NULL);
    cxl_trim_result_free(NULL);
    cxl_sweep_free(NULL);
    cxl_sweep_res_free(NULL);
    ck_assert_uint_eq(cxl_sweep_count(NULL), 0);
    ck_assert_uint_eq(cxl_sweep_res_count(NULL), 0);
    cxl_fault_free(NULL);
    cxl_sweepfit_free(NULL);
    ck_assert_uint_eq(cxl_fault_count(NULL), 0);
    ck_assert_uint_eq(cxl_fault_peak_count(NULL), 0);
    ck_assert_uint_ge(cxl_fault_count(g_fault), 1024);
    ck_assert_uint_eq(cxl_sweep_count(g_sweep), 391);
    ck_assert_uint_gt(cxl_sweep_res_count(g_sres), 3);
    ck_assert_uint_eq(cxl_trim_count(NULL), 0);
    ck_assert_uint_eq(cxl_trim_result_count(NULL), 0);
    ck_assert_uint_eq(cxl_trim_count(g_trim), 3);
    ck_assert_uint_eq(cxl_trim_result_count(g_trim_res), 3);
    ck_assert_uint_eq(cxl_csv_reader_nfields(NULL), 0);
    ck_assert_ptr_null(cxl_csv_reader_field(NULL, 0));
    ck_assert_uint_eq(cxl_csv_reader_line(NULL), 0);
    ck_assert_int_eq(cxl_csv_reader_stopped(NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_csv_reader_set_separator(NULL, ','), CXL_EINVAL);
    ck_assert_int_eq(cxl_csv_reader_separator(NULL), 0);
    ck_assert_int_eq(cxl_csv_reader_bom(NULL), 0);
    ck_assert_uint_eq(cxl_bands_count(NULL), 0);
    ck_assert_uint_eq(cxl_stub_count(NULL), 0);
    ck_assert_uint_eq(cxl_stub_result_count(NULL), 0);
    ck_assert_uint_gt(cxl_bands_count(g_bands), 0);
    ck_assert_uint_eq(cxl_stub_count(g_stub), 3);
    /* counts are size_t: 0 for NULL (and for a cable index past the end) */
    ck_assert_uint_eq(cxl_catalog_count(NULL), 0);
    ck_assert_uint_gt(cxl_catalog_count(g_cat), g_user);
    ck_assert_uint_eq(cxl_catalog_loss_count(NULL, 0), 0);
    ck_assert_uint_ge(cxl_catalog_loss_count(g_cat, g_user), 2);
    ck_assert_uint_eq(cxl_catalog_loss_count(g_cat, cxl_catalog_count(g_cat)), 0);
    ck_assert_uint_eq(cxl_catalog_loss_count(g_cat, SIZE_MAX), 0);
    ck_assert_uint_eq(cxl_loss_fit_count(NULL), 0);
    ck_assert_uint_eq(cxl_loss_fit_count(g_fit), 2);
    ck_assert_uint_eq(cxl_stub_result_count(g_res1), 3);
}
END_TEST

START_TEST(csv_reader_bounds)
{
    static const char text[] = "a,b\n";
    cxl_csv_reader *r = NULL;
    int has = 0;
    ck_assert_int_eq(cxl_csv_reader_new_buffer(text, sizeof text - 1, &r), CXL_OK);
    /* a separator other than ',' ';' TAB or 0 is refused and changes nothing */
    const int bad_sep[] = { '|', ' ', '"', '\n', -1, 256, INT_MAX };
    for (size_t i = 0; i < sizeof bad_sep / sizeof bad_sep[0]; i++)
        ck_assert_int_eq(cxl_csv_reader_set_separator(r, bad_sep[i]), CXL_EINVAL);
    ck_assert_int_eq(cxl_csv_reader_separator(r), ',');
    ck_assert_int_eq(cxl_csv_reader_stopped(r), CXL_OK);
    ck_assert_int_eq(cxl_csv_reader_bom(r), 0);
    /* before the first record: no fields */
    ck_assert_uint_eq(cxl_csv_reader_nfields(r), 0);
    ck_assert_ptr_null(cxl_csv_reader_field(r, 0));
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 1);
    ck_assert_uint_eq(cxl_csv_reader_nfields(r), 2);
    ck_assert_str_eq(cxl_csv_reader_field(r, 1), "b");
    ck_assert_ptr_null(cxl_csv_reader_field(r, 2));
    ck_assert_ptr_null(cxl_csv_reader_field(r, SIZE_MAX));
    ck_assert_uint_eq(cxl_csv_reader_line(r), 1);
    /* end of input, asked again: still the end */
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 0);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 0);
    cxl_csv_reader_free(r);
    /* NULL text is an empty buffer only with size 0 */
    ck_assert_int_eq(cxl_csv_reader_new_buffer(NULL, 0, &r), CXL_OK);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 0);
    cxl_csv_reader_free(r);
    r = SENT_PTR;
    ck_assert_int_ne(cxl_csv_reader_new_buffer(NULL, 1, &r), CXL_OK);
    ck_assert_ptr_eq(r, SENT_PTR);
}
END_TEST

/* A malformed record fails without touching *has_row, and reading goes on. */
START_TEST(csv_reader_malformed)
{
    static const char *const bad[] = {
        "\"open quote,x\n",           /* never closed */
        "\"a\"b,c\n",                 /* text after a closing quote */
        "a,\0b\n",                    /* NUL byte (length given below) */
    };
    const size_t len[] = { strlen(bad[0]), strlen(bad[1]), 5 };
    for (size_t i = 0; i < 3; i++) {
        char buf[64];
        memcpy(buf, bad[i], len[i]);
        memcpy(buf + len[i], "ok,1\n", 5);
        cxl_csv_reader *r = NULL;
        int has = (int)SENT;
        ck_assert_int_eq(cxl_csv_reader_new_buffer(buf, len[i] + 5, &r), CXL_OK);
        cxl_status st = cxl_csv_reader_next(r, &has);
        ck_assert_msg(st == CXL_EPARSE, "case %zu: %s", i, cxl_strerror(st));
        ck_assert_msg(has == (int)SENT, "case %zu: has_row written on failure", i);
        if (i > 0) {
            /* the reader resynchronises on the next line (a quote never
             * closed swallows the rest of the input instead) */
            ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
            ck_assert_int_eq(has, 1);
            ck_assert_str_eq(cxl_csv_reader_field(r, 0), "ok");
        }
        cxl_csv_reader_free(r);
    }
    /* a record longer than the limit: CXL_ETOOLONG, then the next record */
    size_t big = CXL_CSV_MAX_RECORD + 100;
    char *text = malloc(big + 16);
    memset(text, 'x', big);
    memcpy(text + big, "\nok,1\n", 6);
    cxl_csv_reader *r = NULL;
    int has = (int)SENT;
    ck_assert_int_eq(cxl_csv_reader_new_buffer(text, big + 6, &r), CXL_OK);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_ETOOLONG);
    ck_assert_int_eq(has, (int)SENT);
    ck_assert_int_eq(cxl_csv_reader_next(r, &has), CXL_OK);
    ck_assert_int_eq(has, 1);
    ck_assert_str_eq(cxl_csv_reader_field(r, 0), "ok");
    cxl_csv_reader_free(r);
    free(text);
}
END_TEST

START_TEST(csv_write_errors)
{
    /* a stream that cannot be written: CXL_EIO, not a crash */
    FILE *ro = fopen("/dev/null", "r");
    ck_assert_ptr_nonnull(ro);
    ck_assert_int_eq(cxl_csv_write_field(ro, "x", 0), CXL_EIO);
    fclose(ro);
    /* the empty text is a valid, empty field */
    FILE *fp = tmpfile();
    ck_assert_int_eq(cxl_csv_write_field(fp, "", 1), CXL_OK);
    ck_assert_int_eq((int)ftell(fp), 0);
    fclose(fp);
}
END_TEST

/* Text that is not a number, length, frequency or time. */
START_TEST(parse_bad_text)
{
    static const char *const bad[] = {
        "", " ", "\t", "nan", "NaN", "inf", "-inf", "infinity", "1e999", "-1e999",
        "0x10", "1,5", "1.2.3", "--1", "+-1", "1e", "e5", ".", "-", "1 2",
        "\xff\xfe", "1\xc3", "12\xe2\x80\xaf" "5", "\xef\xbb\xbf" "1",
        "1/0", "3/0in", "1/2/3in", "3m 2ft", "2ft 3m", "5 furlongs", "10 m m",
    };
    char huge[2048];
    memset(huge, '9', sizeof huge - 1);
    huge[sizeof huge - 1] = '\0';
    for (size_t i = 0; i <= sizeof bad / sizeof bad[0]; i++) {
        const char *t = i < sizeof bad / sizeof bad[0] ? bad[i] : huge;
        double v = SENT;
        size_t pos = SIZE_MAX;
        cxl_status st = cxl_units_parse_length(t, CXL_UNITS_METRIC, &v, &pos);
        ck_assert_msg(st == CXL_EPARSE || st == CXL_ERANGE, "length '%s': %s", t, cxl_strerror(st));
        ck_assert_msg(v == SENT, "length '%s' wrote its output", t);
        ck_assert_msg(pos <= strlen(t), "length '%s': error position %zu", t, pos);
        st = cxl_units_parse_freq(t, &v, NULL);
        ck_assert_msg(st != CXL_OK && v == SENT, "freq '%s': %s", t, cxl_strerror(st));
        st = cxl_units_parse_time(t, &v, NULL);
        ck_assert_msg(st != CXL_OK && v == SENT, "time '%s': %s", t, cxl_strerror(st));
        st = cxl_units_parse_number(t, &v, NULL);
        ck_assert_msg(st != CXL_OK && v == SENT, "number '%s': %s", t, cxl_strerror(st));
    }
    /* a number too small to represent is refused, not silently zero */
    double v = SENT;
    ck_assert_int_eq(cxl_units_parse_freq("1e-400MHz", &v, NULL), CXL_ERANGE);
    ck_assert_int_eq(cxl_units_parse_length("1e-400m", CXL_UNITS_METRIC, &v, NULL), CXL_ERANGE);
    ck_assert_int_eq(cxl_units_parse_number("1e-400", &v, NULL), CXL_ERANGE);
    ck_assert(v == SENT);
}
END_TEST

START_TEST(bands_bad_names_and_files)
{
    static const char *const names[] = {
        "", " ", "xyz", "161m", "0", "-160m", "160mm", "\xff", "a-very-long-band-name-indeed",
    };
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
        double lo = SENT, hi = SENT;
        cxl_status st = cxl_bands_edges(g_bands, names[i], 0, 1, &lo, &hi);
        ck_assert_msg(st == CXL_ENOTFOUND, "'%s': %s", names[i], cxl_strerror(st));
        ck_assert(lo == SENT && hi == SENT);
    }
    /* the index just past the end */
    double lo = SENT;
    ck_assert_int_ne(cxl_bands_get(g_bands, cxl_bands_count(g_bands), NULL, NULL, NULL, &lo,
                                   NULL, NULL, NULL), CXL_OK);
    ck_assert(lo == SENT);
    static const char *const files[] = {
        "",                                                             /* empty */
        "band,service,region,low_khz,high_khz,footnote,source\n",       /* no rows */
        "band,service,region,low_khz,high_khz,source\n160m,amateur,1,1810,2000,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,4,1810,2000,,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,2000,1810,,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,1810,2000,,\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,nan,2000,,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,1e999,2000,,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,military,1,1810,2000,,x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,1810,2000,,\"x\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,1810\n",
        "band,service,region,low_khz,high_khz,footnote,source\n160m,amateur,1,1810,1e306,,x\n",
    };
    for (size_t i = 0; i < sizeof files / sizeof files[0]; i++) {
        FILE *fp = text_stream(files[i][0] ? files[i] : "\n");
        cxl_bands *b = SENT_PTR;
        size_t line = SIZE_MAX;
        cxl_status st = cxl_bands_new_stream(fp, &b, &line);
        fclose(fp);
        ck_assert_msg(st != CXL_OK, "band file %zu accepted", i);
        ck_assert_msg(b == SENT_PTR, "band file %zu: handle written on failure", i);
    }
}
END_TEST

/* Malformed user cable files: refused, catalog unchanged, one line of text. */
START_TEST(catalog_bad_files)
{
    /* len 0: the text is a C string; otherwise it holds a NUL byte */
    static const struct { const char *text; size_t len; cxl_status want; } bad[] = {
        { "\n", 0, CXL_EPARSE },                                 /* no header */
        { "name,vf,colour\nx,0.8,red\n", 0, CXL_EPARSE },        /* unknown column */
        { "name,vf,vf\nx,0.8,0.8\n", 0, CXL_EPARSE },            /* column twice */
        { "name,z0_ohm\nx,50\n", 0, CXL_EPARSE },                /* vf column missing */
        { "name,vf\nx,\n", 0, CXL_EPARSE },                      /* vf value missing */
        { "name,vf\n,0.8\n", 0, CXL_EPARSE },                    /* name missing */
        { "name,vf\nx,0.8\nX,0.7\n", 0, CXL_EDUPLICATE },        /* same name, other case */
        { "name,vf\nRG-58,0.8\n", 0, CXL_EDUPLICATE },           /* a built-in name */
        { "name,vf\nx,1.2\n", 0, CXL_ERANGE },
        { "name,vf\nx,nan\n", 0, CXL_EPARSE },
        { "name,vf\nx,1e999\n", 0, CXL_ERANGE },
        { "name,vf\nx,0,8\n", 0, CXL_EPARSE },                   /* comma decimal: 3 fields */
        { "name,vf\n\"x,0.8\n", 0, CXL_EPARSE },                 /* quote never closed */
        { "name,vf\nx\0,0.8\n", 15, CXL_EPARSE },                /* NUL byte */
        { "name,vf,inner_diameter_mm,dielectric_diameter_mm\nx,0.8,3,2\n", 0, CXL_ERANGE },
        { "name,vf,clad_thickness_mm\nx,0.8,0.1\n", 0, CXL_EPARSE }, /* clad without core */
    };
    cxl_catalog *cat = NULL;
    size_t before, after;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    before = cxl_catalog_count(cat);
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        size_t len = bad[i].len ? bad[i].len : strlen(bad[i].text);
        FILE *fp = fmemopen((void *)bad[i].text, len, "r");
        ck_assert_ptr_nonnull(fp);
        char msg[256];
        size_t line = SIZE_MAX;
        msg[0] = 'Z';
        cxl_status st = cxl_catalog_load_cables(cat, fp, "bad.csv", &line, msg, sizeof msg);
        fclose(fp);
        ck_assert_msg(st == bad[i].want, "cable file %zu: %s, wanted %s (%s)", i,
                      cxl_strerror(st), cxl_strerror(bad[i].want), msg);
        ck_assert_msg(line != SIZE_MAX && line >= 1, "cable file %zu: no error line", i);
        ck_assert_msg(strncmp(msg, "bad.csv:", 8) == 0 && !strchr(msg, '\n'),
                      "cable file %zu: message '%s'", i, msg);
        after = cxl_catalog_count(cat);
        ck_assert_uint_eq(after, before);
    }
    /* a header without rows adds nothing and is not an error */
    FILE *fp = text_stream("name,vf\n");
    ck_assert_int_eq(cxl_catalog_load_cables(cat, fp, NULL, NULL, NULL, 0), CXL_OK);
    fclose(fp);
    after = cxl_catalog_count(cat);
    ck_assert_uint_eq(after, before);
    cxl_catalog_free(cat);
}
END_TEST

START_TEST(catalog_bad_loss_files)
{
    static const char *const bad[] = {
        "name,freq_mhz\nbench-spool,10\n",                                  /* column missing */
        "name,freq_mhz,loss_db_per_100m\nnobody,10,1\n",                    /* unknown cable */
        "name,freq_mhz,loss_db_per_100m\nRG-58,10,1\n",                     /* built-in table */
        "name,freq_mhz,loss_db_per_100m\nbench-spool,1.8,1\n",              /* frequency twice */
        "name,freq_mhz,loss_db_per_100m\nbench-spool,10,1\nbench-spool,10,2\n",
        "name,freq_mhz,loss_db_per_100m\nbench-spool,,1\n",                 /* value missing */
        "name,freq_mhz,loss_db_per_100m\nbench-spool,-10,1\n",
        "name,freq_mhz,loss_db_per_100m\nbench-spool,10,0\n",
        "name,freq_mhz,loss_db_per_100m\nbench-spool,1e305,1\n",            /* infinite in Hz */
        "name,freq_mhz,loss_db_per_100m\nbench-spool,10,nan\n",
    };
    size_t points_before;
    points_before = cxl_catalog_loss_count(g_cat, g_user);
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        FILE *fp = text_stream(bad[i]);
        char msg[256] = "";
        cxl_status st = cxl_catalog_load_loss(g_cat, fp, "loss.csv", NULL, msg, sizeof msg);
        fclose(fp);
        ck_assert_msg(st != CXL_OK, "loss file %zu accepted", i);
        ck_assert_msg(msg[0] != '\0', "loss file %zu: no message", i);
        size_t n;
        n = cxl_catalog_loss_count(g_cat, g_user);
        ck_assert_uint_eq(n, points_before);
    }
    /* names that are not there */
    static const char *const names[] = { "", " ", "\xff", "RG-58 ", "nobody" };
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
        size_t idx = SIZE_MAX;
        ck_assert_int_eq(cxl_catalog_find(g_cat, names[i], &idx), CXL_ENOTFOUND);
        ck_assert_uint_eq(idx, SIZE_MAX);
    }
    /* the index just past the end, and a cable without points */
    size_t n, idx;
    double v = SENT;
    n = cxl_catalog_count(g_cat);
    ck_assert_int_eq(cxl_catalog_value(g_cat, n, CXL_CABLE_VF, &v), CXL_ERANGE);
    ck_assert(v == SENT);
    const char *t = sentinel_text;
    ck_assert_int_eq(cxl_catalog_name(g_cat, n, &t), CXL_ERANGE);
    ck_assert_int_eq(cxl_catalog_dielectric(g_cat, n, &t), CXL_ERANGE);
    ck_assert_int_eq(cxl_catalog_source(g_cat, n, &t), CXL_ERANGE);
    ck_assert_ptr_eq(t, sentinel_text);
    ck_assert_int_eq(cxl_catalog_find(g_cat, "bare-spool", &idx), CXL_OK);
    cxl_loss_fit *fit = SENT_PTR;
    ck_assert_int_eq(cxl_loss_fit_new_cable(g_cat, idx, &fit), CXL_ENOTFOUND);
    cxl_loss_model *m = SENT_PTR;
    ck_assert_int_eq(cxl_loss_model_new_cable(g_cat, idx, &m), CXL_ENOTFOUND);
    ck_assert_ptr_eq(fit, SENT_PTR);
    ck_assert_ptr_eq(m, SENT_PTR);
    ck_assert_int_eq(cxl_catalog_value(g_cat, idx, CXL_CABLE_Z0_OHM, &v), CXL_ENOTFOUND);
    ck_assert(v == SENT);
}
END_TEST

START_TEST(stub_bad_sets)
{
    cxl_stub *s = NULL;
    cxl_stub_result *r = SENT_PTR;
    int orders[1] = { (int)SENT };
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    /* no readings */
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_infer_orders(s, orders, 0), CXL_EINVAL);
    /* mixed given and missing orders, repeated and descending readings */
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 5e6, 1), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 0), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 5e6, 2), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 4e6, 2), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 15e6, 1), CXL_EINVAL);
    ck_assert_uint_eq(cxl_stub_count(s), 1);
    cxl_stub_free(s);
    /* a reading no plausible VF explains: a 10 m cable resonating at
     * 100 kHz would need a VF far below 0.5 for every order */
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_OPEN, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 10.0, 1e5, 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_fit(s, &r), CXL_ERANGE);
    ck_assert_int_eq(cxl_stub_infer_orders(s, orders, 1), CXL_ERANGE);
    ck_assert_int_eq(orders[0], (int)SENT);
    size_t bad = 7;
    ck_assert_int_eq(cxl_stub_implausible_reading(s, &bad), CXL_OK);
    ck_assert_uint_eq(bad, 0);
    ck_assert_int_eq(cxl_stub_implausible_reading(NULL, &bad), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_implausible_reading(s, NULL), CXL_EINVAL);
    ck_assert_int_eq(cxl_stub_implausible_reading(g_stub, &bad), CXL_ENOTFOUND);
    ck_assert_uint_eq(bad, 0);
    cxl_stub_free(s);
    /* extreme but finite readings reach GSL only as finite numbers */
    ck_assert_int_eq(cxl_stub_new(CXL_STUB_SHORT, &s), CXL_OK);
    ck_assert_int_eq(cxl_stub_set_vf_range(s, DBL_MIN, 1.0), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, DBL_MIN, DBL_MAX, 0), CXL_OK);
    ck_assert_int_eq(cxl_stub_add_reading(s, 1e308, DBL_MIN, 0), CXL_OK);
    cxl_status st = cxl_stub_fit(s, &r);
    if (st == CXL_OK) {
        double vf, err;
        ck_assert_int_eq(cxl_stub_result_vf(r, &vf, &err), CXL_OK);
        ck_assert(isfinite(vf) && isfinite(err));
        cxl_stub_result_free(r);
    } else {
        ck_assert_ptr_eq(r, SENT_PTR);
    }
    cxl_stub_free(s);
    /* a result without a fitted fixture */
    double x = SENT;
    ck_assert_int_eq(cxl_stub_result_fixture(g_res1, &x, NULL, NULL), CXL_ENOTFOUND);
    ck_assert(x == SENT);
    /* the reading index just past the end */
    ck_assert_int_eq(cxl_stub_result_reading(g_res1, 3, &x, NULL, NULL, NULL, NULL, NULL),
                     CXL_EINVAL);
    ck_assert(x == SENT);
}
END_TEST

START_TEST(loss_fit_odd_tables)
{
    /* points that ask GSL to fit nonsense: refused or finite */
    const double f[][3] = { { 1e6, 2e6, 3e6 }, { DBL_MIN, 1.0, DBL_MAX },
                            { 1e6, 1e6 * (1 + DBL_EPSILON), 1e6 * (1 + 2 * DBL_EPSILON) } };
    const double l[][3] = { { 1e-300, 1e300, 1.0 }, { DBL_MIN, 1.0, DBL_MAX },
                            { 0.01, 0.02, 0.03 } };
    for (size_t i = 0; i < 3; i++) {
        cxl_loss_fit *fit = SENT_PTR;
        cxl_status st = cxl_loss_fit_new(f[i], l[i], 3, &fit);
        if (st != CXL_OK) {
            ck_assert_ptr_eq(fit, SENT_PTR);
            continue;
        }
        double a, b, rel;
        ck_assert_int_eq(cxl_loss_fit_coefficients(fit, &a, &b), CXL_OK);
        ck_assert_msg(isfinite(a) && isfinite(b), "table %zu: a=%g b=%g", i, a, b);
        ck_assert_int_eq(cxl_loss_fit_max_relative_residual(fit, &rel), CXL_OK);
        ck_assert_msg(isfinite(rel), "table %zu: residual %g", i, rel);
        cxl_loss_fit_free(fit);
    }
    /* the point index just past the end */
    double v = SENT, t = SENT, res = SENT;
    ck_assert_int_eq(cxl_loss_fit_point(g_fit, 2, &v, &t, &res), CXL_ERANGE);
    ck_assert(v == SENT && t == SENT && res == SENT);
}
END_TEST

/* Arguments that are each valid but overflow together: CXL_ERANGE (or a
 * finite result), never CXL_OK with an infinity in an output. */
START_TEST(overflow_never_ok)
{
    const double v[] = { DBL_MIN / 4, 1e-300, 1e-150, 1.0, 1e150, 1e300, DBL_MAX };
    const size_t nv = sizeof v / sizeof v[0];
    /* every two-point table from those values, in frequency and loss */
    for (size_t i = 0; i < nv * nv * nv * nv; i++) {
        double f[2] = { v[i % nv], v[i / nv % nv] };
        double l[2] = { v[i / (nv * nv) % nv], v[i / (nv * nv * nv)] };
        cxl_loss_fit *fit = SENT_PTR;
        cxl_status st = cxl_loss_fit_new(f, l, 2, &fit);
        if (st != CXL_OK) {
            ck_assert_ptr_eq(fit, SENT_PTR);
            continue;
        }
        double a, b, rel, fr, tab, res;
        ck_assert_int_eq(cxl_loss_fit_coefficients(fit, &a, &b), CXL_OK);
        ck_assert_int_eq(cxl_loss_fit_max_relative_residual(fit, &rel), CXL_OK);
        ck_assert_msg(isfinite(a) && isfinite(b) && isfinite(rel),
                      "f %g %g, loss %g %g: a=%g b=%g residual %g", f[0], f[1], l[0], l[1],
                      a, b, rel);
        for (size_t k = 0; k < 2; k++) {
            ck_assert_int_eq(cxl_loss_fit_point(fit, k, &fr, &tab, &res), CXL_OK);
            ck_assert_msg(isfinite(res), "f %g %g, loss %g %g: residual %zu is %g", f[0], f[1],
                          l[0], l[1], k, res);
        }
        cxl_loss_fit_free(fit);
    }
    double out = SENT;
    ck_assert_int_eq(cxl_stub_resonance_freq(CXL_STUB_OPEN, 1, 4.9e-324, 0.66, 0.0, 0.66, &out),
                     CXL_ERANGE);
    ck_assert(out == SENT);
    double db = SENT, deg = SENT;
    ck_assert_int_eq(cxl_transfer_delay(DBL_MAX, DBL_MAX, 0.0, &db, &deg), CXL_ERANGE);
    ck_assert_int_eq(cxl_transfer_delay(-DBL_MAX, DBL_MAX, DBL_MAX, &db, &deg), CXL_ERANGE);
    ck_assert(db == SENT && deg == SENT);
    ck_assert_int_eq(cxl_transfer_delay(1.0, 0.0, DBL_MAX, &db, &deg), CXL_OK);
    ck_assert(isfinite(db) && isfinite(deg));
}
END_TEST

/* Trims the solver must refuse, with the result handle untouched. */
START_TEST(trim_bad_sets)
{
    cxl_trim_result *r = SENT_PTR;
    /* no readings; no target */
    cxl_trim *t = fresh_trim(0, 1);
    ck_assert_uint_eq(cxl_trim_count(t), 0);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINVAL);
    cxl_trim_free(t);
    t = fresh_trim(3, 0);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINVAL);
    cxl_trim_free(t);
    /* given orders that fall as the frequency rises */
    ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, TRIM_LEN, &t), CXL_OK);
    ck_assert_int_eq(cxl_trim_add_reading(t, trim_reading_hz(1), 2), CXL_OK);
    ck_assert_int_eq(cxl_trim_add_reading(t, trim_reading_hz(2), 1), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_EINCONSISTENT);
    cxl_trim_free(t);
    /* a reading no plausible VF explains: 30 m resonating at 100 kHz */
    ck_assert_int_eq(cxl_trim_new(CXL_STUB_OPEN, TRIM_LEN, &t), CXL_OK);
    ck_assert_int_eq(cxl_trim_add_reading(t, 1e5, 1), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 1.83e6), CXL_OK);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_ERANGE);
    cxl_trim_free(t);
    /* a reference that is shorter than the fixture it was read through */
    t = fresh_trim(3, 0);
    ck_assert_int_eq(cxl_trim_set_fixture(t, 50.0, 1.0, 0.0), CXL_OK);
    ck_assert_int_eq(cxl_trim_target_resonance(t, CXL_STUB_OPEN, 1, 30e6), CXL_OK);
    cxl_status st = cxl_trim_solve(t, &r);
    ck_assert_msg(st == CXL_ERANGE, "%s", cxl_strerror(st));
    cxl_trim_free(t);
    ck_assert_ptr_eq(r, SENT_PTR);
    /* the reading index just past the end */
    double f = SENT;
    ck_assert_int_eq(cxl_trim_result_reading(g_trim_res, 3, &f, NULL, NULL, NULL, NULL),
                     CXL_EINVAL);
    ck_assert(f == SENT);
    /* the setters refuse without changing what was set */
    t = fresh_trim(3, 1);
    ck_assert_int_eq(cxl_trim_target_degrees(t, -90.0, 1.83e6), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_target_degrees(t, 90.0, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_target_resonance(t, (cxl_stub_end)7, 1, 1.9e6), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_set_fixture(t, 0.3, 1.5, 0.0), CXL_EINVAL);
    ck_assert_int_eq(cxl_trim_solve(t, &r), CXL_OK);
    double cut_ref, cut;
    ck_assert_int_eq(cxl_trim_result_cut(g_trim_res, &cut_ref, NULL, NULL, NULL), CXL_OK);
    ck_assert_int_eq(cxl_trim_result_cut(r, &cut, NULL, NULL, NULL), CXL_OK);
    ck_assert(cut == cut_ref);
    cxl_trim_result_free(r);
    cxl_trim_free(t);
}
END_TEST

START_TEST(clad_and_drift_ranges)
{
    double f = SENT;
    /* no cladding at all; a cladding of thickness 0 (a bare steel centre) */
    ck_assert_int_eq(cxl_loss_model_clad_crossover(g_model, &f), CXL_ENOTFOUND);
    cxl_loss_model *m = NULL;
    ck_assert_int_eq(cxl_loss_model_new(0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0, &m), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_set_clad(m, 0.0, 5.8e6, 100.0), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_clad_crossover(m, &f), CXL_ERANGE);
    ck_assert(f == SENT);
    /* the thinnest cladding there is: a crossover too high to state, or
     * a finite one */
    ck_assert_int_eq(cxl_loss_model_set_clad(m, DBL_TRUE_MIN, 5.8e6, 100.0), CXL_OK);
    cxl_status st = cxl_loss_model_clad_crossover(m, &f);
    ck_assert(st == CXL_ERANGE ? f == SENT : st == CXL_OK && isfinite(f));
    cxl_loss_model_free(m);
    /* a steep trend leaves (0, 1] at low frequency: VF 0.5 at 1 MHz and
     * 0.75 at 4 MHz make VF = 1 - 0.5/sqrt(f in MHz), below 0 at 10 kHz */
    const double df[2] = { 1e6, 4e6 }, dv[2] = { 0.5, 0.75 };
    cxl_drift *d = NULL;
    double v = SENT, e = SENT;
    ck_assert_int_eq(cxl_drift_new(df, dv, NULL, 2, &d), CXL_OK);
    ck_assert_int_eq(cxl_drift_vf(d, 1e4, &v, &e), CXL_ERANGE);
    ck_assert_int_eq(cxl_drift_vf(d, DBL_TRUE_MIN, &v, &e), CXL_ERANGE);
    ck_assert(v == SENT && e == SENT);
    cxl_drift_free(d);
    /* errors that differ by hundreds of decades: refused or finite */
    const double ee[2][2] = { { 1e-300, 1.0 }, { DBL_TRUE_MIN, 0.5 } };
    for (int i = 0; i < 2; i++) {
        d = SENT_PTR;
        st = cxl_drift_new(df, dv, ee[i], 2, &d);
        if (st != CXL_OK) {
            ck_assert_ptr_eq(d, SENT_PTR);
            continue;
        }
        double vh, dr;
        ck_assert_int_eq(cxl_drift_coefficients(d, &vh, &dr), CXL_OK);
        ck_assert(isfinite(vh) && isfinite(dr));
        if (cxl_drift_vf(d, 2e6, &v, &e) == CXL_OK) ck_assert(isfinite(v) && isfinite(e));
        cxl_drift_free(d);
    }
}
END_TEST

/* harness.c: free, count and the plan's life (by hand: size_t, void) */
START_TEST(harness_by_hand)
{
    cxl_harness_free(NULL);
    ck_assert_uint_eq(cxl_harness_piece_count(NULL), 0);
    /* two feed runs and one delay line */
    ck_assert_uint_eq(cxl_harness_piece_count(g_harness), 3);
    cxl_harness *h = NULL;
    ck_assert_int_eq(cxl_harness_new(0.66, &h), CXL_OK);
    ck_assert_uint_eq(cxl_harness_piece_count(h), 0);
    double m = SENT, t = SENT;
    ck_assert_int_eq(cxl_harness_feed_run(h, &m, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_harness_plan(h), CXL_EINVAL);
    /* the element bound */
    for (int i = 0; i < CXL_HARNESS_MAX_ELEMENTS; i++)
        ck_assert_int_eq(cxl_harness_add_element(h, i, 0.0, 0.0, NULL), CXL_OK);
    ck_assert_int_eq(cxl_harness_add_element(h, -1.0, 0.0, 0.0, NULL), CXL_ERANGE);
    for (int i = 0; i < CXL_HARNESS_MAX_DRUMS; i++)
        ck_assert_int_eq(cxl_harness_add_drum(h, 1e6, NULL), CXL_OK);
    ck_assert_int_eq(cxl_harness_add_drum(h, 1.0, NULL), CXL_ERANGE);
    ck_assert_int_eq(cxl_harness_set_cuts(h, 1.0, 0.0, 0.0), CXL_OK);
    ck_assert_int_eq(cxl_harness_plan(h), CXL_OK);
    ck_assert_uint_eq(cxl_harness_piece_count(h), CXL_HARNESS_MAX_ELEMENTS);
    ck_assert_double_eq(m, SENT);
    cxl_harness_free(h);
}
END_TEST

/* ---- set-up ------------------------------------------------------------- */

static void gsl_abort_loudly(const char *reason, const char *file, int line, int gsl_errno)
{
    fprintf(stderr, "GSL error reached through libcoaxline: %s (%s:%d, GSL code %d)\n",
            reason, file, line, gsl_errno);
    abort();
}

/* Set-up runs outside any test, where Check's assertions do not work. */
#define NEED(expr)                                                           \
    do {                                                                     \
        if (!(expr)) {                                                       \
            fprintf(stderr, "set-up failed: %s\n", #expr);                   \
            exit(EXIT_FAILURE);                                              \
        }                                                                    \
    } while (0)

static void setup_objects(void)
{
    NEED(cxl_bands_new(&g_bands) == CXL_OK);
    NEED(cxl_catalog_new(&g_cat) == CXL_OK);
    FILE *fp = text_stream("name,vf\nbench-spool,0.83\nbare-spool,0.8\n");
    NEED(cxl_catalog_load_cables(g_cat, fp, NULL, NULL, NULL, 0) == CXL_OK);
    fclose(fp);
    fp = text_stream(good_loss_csv);
    NEED(cxl_catalog_load_loss(g_cat, fp, NULL, NULL, NULL, 0) == CXL_OK);
    fclose(fp);
    NEED(cxl_catalog_find(g_cat, "bench-spool", &g_user) == CXL_OK);

    /* open stub, 10 m, VF 0.66: readings at orders 1, 2, 3 */
    NEED(cxl_stub_new(CXL_STUB_OPEN, &g_stub) == CXL_OK);
    for (int n = 1; n <= 3; n++)
        NEED(cxl_stub_add_reading(g_stub, 10.0, (2 * n - 1) / 4.0 * 0.66 * C / 10.0, n) == CXL_OK);
    NEED(cxl_stub_fit(g_stub, &g_res1) == CXL_OK);
    /* two lengths with 0.3 m of unknown fixture (free space) */
    cxl_stub *s2 = NULL;
    NEED(cxl_stub_new(CXL_STUB_OPEN, &s2) == CXL_OK);
    const double lens[2] = { 10.0, 8.0 };
    for (int i = 0; i < 2; i++)
        for (int n = 1; n <= 2; n++)
            NEED(cxl_stub_add_reading(s2, lens[i], (2 * n - 1) / 4.0 * C / (lens[i] / 0.66 + 0.3),
                                      n) == CXL_OK);
    NEED(cxl_stub_fit(s2, &g_res2) == CXL_OK);
    cxl_stub_free(s2);

    const double f[2] = { 1.8e6, 30e6 }, l[2] = { 0.012, 0.055 };
    NEED(cxl_loss_fit_new(f, l, 2, &g_fit) == CXL_OK);
    NEED(cxl_loss_model_new(0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0, &g_model) == CXL_OK);

    /* end-fire pair of 60 m long wires, 40 m stagger, the front element
     * delayed by the stagger so that arrivals from the front add */
    NEED(cxl_duo_new(&g_pair) == CXL_OK);
    NEED(cxl_duo_set_geometry(g_pair, 5.0, 40.0) == CXL_OK);
    NEED(cxl_duo_set_delay(g_pair, 0, 40.0 / C) == CXL_OK);
    NEED(cxl_duo_set_long_wire(g_pair, 60.0, 0.8) == CXL_OK);
    NEED(cxl_array_new(&g_array) == CXL_OK);
    NEED(cxl_array_add(g_array, 0.0, 0.0, 0.0, NULL) == CXL_OK);
    NEED(cxl_array_add(g_array, -20.0, 5.0, 0.0, NULL) == CXL_OK);
    NEED(cxl_array_add(g_array, -20.0, -5.0, 0.0, NULL) == CXL_OK);
    NEED(cxl_array_set_line(g_array, 1, 13.2, 0.66) == CXL_OK);
    NEED(cxl_array_set_line_model(g_array, 2, 13.2, g_model) == CXL_OK);
    NEED(cxl_array_set_reversed(g_array, 1, 1) == CXL_OK);
    NEED(cxl_harness_new(0.66, &g_harness) == CXL_OK);
    NEED(cxl_harness_add_element(g_harness, 10.0, 0.0, 50e-9, NULL) == CXL_OK);
    NEED(cxl_harness_add_element(g_harness, -10.0, 0.0, 0.0, NULL) == CXL_OK);
    NEED(cxl_harness_set_cuts(g_harness, 1.0, 0.05, 0.003) == CXL_OK);
    NEED(cxl_harness_add_drum(g_harness, 30.0, NULL) == CXL_OK);
    NEED(cxl_harness_add_drum(g_harness, 20.0, NULL) == CXL_OK);
    NEED(cxl_harness_plan(g_harness) == CXL_OK);
    NEED(cxl_yield_new(&g_yield) == CXL_OK);
    NEED(cxl_yield_set_tolerances(g_yield, 0.1, 0.01, 0.5, 3.0) == CXL_OK);
    NEED(cxl_yield_set_goal_front_to_back(g_yield, 10.0) == CXL_OK);
    NEED(cxl_yield_set_run(g_yield, 40, 3, 2) == CXL_OK);

    /* the same cable with 0.05 mm of copper over steel (sigma 5.8e6 S/m,
     * mu_r 100; invented round values) */
    NEED(cxl_loss_model_new(0.81e-3, 2.95e-3, 2.25, 2e-4, 58e6, 1.0, &g_clad) == CXL_OK);
    NEED(cxl_loss_model_set_clad(g_clad, 0.05e-3, 5.8e6, 100.0) == CXL_OK);
    const double df[3] = { 1.8e6, 3.6e6, 7.1e6 }, dv[3] = { 0.655, 0.658, 0.66 };
    NEED(cxl_drift_new(df, dv, NULL, 3, &g_drift) == CXL_OK);
    g_trim = NULL;
    NEED(cxl_trim_new(CXL_STUB_OPEN, TRIM_LEN, &g_trim) == CXL_OK);
    NEED(cxl_trim_set_resolution(g_trim, 1e3) == CXL_OK);
    for (int n = 1; n <= 3; n++)
        NEED(cxl_trim_add_reading(g_trim, trim_reading_hz(n), n) == CXL_OK);
    NEED(cxl_trim_target_degrees(g_trim, 90.0, 1.83e6) == CXL_OK);
    NEED(cxl_trim_solve(g_trim, &g_trim_res) == CXL_OK);
    /* an open stub: Z = -j 50 cot(beta l), 10 m at VF 0.66, 1-40 MHz in
     * 0.1 MHz steps, slightly lossy (Gamma scaled by 0.98) */
    size_t cap = 400 * 64 + 64, used = 0;
    g_sweep_text = malloc(cap);
    NEED(g_sweep_text != NULL);
    /* integers with an exponent: no decimal mark, whatever the locale */
    used += (size_t)snprintf(g_sweep_text, cap, "! stub\n# kHz S RI R 50\n");
    for (int i = 0; i < 391; i++) {
        double f = 1e6 + 1e5 * i, ph = -2 * 2 * M_PI * f * 10.0 / (0.66 * C);
        used += (size_t)snprintf(g_sweep_text + used, cap - used, "%d %lde-9 %lde-9\n",
                                 1000 + 100 * i, lround(0.98e9 * cos(ph)),
                                 lround(0.98e9 * sin(ph)));
    }
    NEED(cxl_sweep_read_buffer(g_sweep_text, used, &g_sweep, NULL, NULL, 0) == CXL_OK);
    NEED(cxl_sweep_resonances(g_sweep, 50.0, CXL_STUB_OPEN, 0, 0, &g_sres) == CXL_OK);
    NEED(cxl_sweep_res_count(g_sres) > 3);
    NEED(cxl_fault_new(g_sweep, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &g_fault) == CXL_OK);
    NEED(cxl_fault_peak_count(g_fault) > 0);
    NEED(cxl_sweepfit_new(g_sweep, 10.0, CXL_STUB_OPEN, 0, 0, 0, 0, &g_sfit) == CXL_OK);
}

/* How many probes the table makes (printed for the record). */
static size_t count_probes(void)
{
    size_t n = 0;
    for (size_t i = 0; i < NCASES; i++) {
        const api_case *c = &cases[i];
        n += 1 + c->nptr + (c->optional != 0) + c->nbadrows;
        for (size_t k = 0; k < c->nargs; k++) n += c->kinds[k]->nbad + c->kinds[k]->nodd;
    }
    return n;
}

int main(void)
{
    gsl_set_error_handler(gsl_abort_loudly);
    /* walk under a comma-decimal locale where there is one: parsing and
     * formatting must not notice */
    if (!setlocale(LC_ALL, "de_DE.UTF-8"))
        fprintf(stderr, "note: de_DE.UTF-8 not available, walking in the C locale\n");
    setup_objects();
    size_t distinct = 0;
    for (size_t i = 0; i < NCASES; i++)
        distinct += i == 0 || strcmp(cases[i].fn, cases[i - 1].fn) != 0;
    printf("walking %zu functions in %zu table rows, %zu probes\n", distinct, NCASES,
           count_probes());

    Suite *s = suite_create("api");
    TCase *tc = tcase_create("walk");
    tcase_set_timeout(tc, 120);
    tcase_add_loop_test(tc, walk_function, 0, (int)NCASES);
    suite_add_tcase(s, tc);
    TCase *hand = tcase_create("by hand");
    tcase_set_timeout(hand, 60);
    tcase_add_test(hand, strings_and_version);
    tcase_add_test(hand, free_and_count_null);
    tcase_add_test(hand, csv_reader_bounds);
    tcase_add_test(hand, csv_reader_malformed);
    tcase_add_test(hand, csv_write_errors);
    tcase_add_test(hand, parse_bad_text);
    tcase_add_test(hand, bands_bad_names_and_files);
    tcase_add_test(hand, catalog_bad_files);
    tcase_add_test(hand, catalog_bad_loss_files);
    tcase_add_test(hand, stub_bad_sets);
    tcase_add_test(hand, loss_fit_odd_tables);
    tcase_add_test(hand, overflow_never_ok);
    tcase_add_test(hand, trim_bad_sets);
    tcase_add_test(hand, clad_and_drift_ranges);
    tcase_add_test(hand, harness_by_hand);
    suite_add_tcase(s, hand);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);

    cxl_fault_free(g_fault);
    cxl_sweepfit_free(g_sfit);
    cxl_sweep_res_free(g_sres);
    cxl_sweep_free(g_sweep);
    free(g_sweep_text);
    cxl_trim_result_free(g_trim_res);
    cxl_trim_free(g_trim);
    cxl_drift_free(g_drift);
    cxl_loss_model_free(g_clad);
    cxl_duo_free(g_pair);
    cxl_yield_free(g_yield);
    cxl_yield_free(NULL);
    cxl_array_free(g_array);
    cxl_loss_model_free(g_model);
    cxl_loss_fit_free(g_fit);
    cxl_stub_result_free(g_res2);
    cxl_stub_result_free(g_res1);
    cxl_stub_free(g_stub);
    cxl_catalog_free(g_cat);
    cxl_bands_free(g_bands);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
