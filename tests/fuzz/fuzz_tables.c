/* fuzz_tables.c - libFuzzer target for the user table loaders: cable
 * catalog rows, attenuation points, band tables and analyzer sweeps
 * (cxl_sweep_read_buffer, then the resonances, the distance-to-fault
 * profile and, on short sweeps, the whole-sweep fit).  The first byte picks
 * the loader (its value modulo 4); the rest is the file. */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include "coaxline.h"

/* A sweep read whole or refused with its line; what is read gives finite
 * numbers everywhere. */
static int sweep_file(const uint8_t *data, size_t size)
{
    cxl_sweep *s = NULL;
    size_t line = 0;
    char msg[256];
    if (cxl_sweep_read_buffer((const char *)data, size, &s, &line, msg, sizeof msg) != CXL_OK) {
        if (s) abort(); /* nothing half-read */
        return 0;
    }
    size_t n = cxl_sweep_count(s);
    if (n == 0) abort();
    cxl_sweep_res *r = NULL;
    if (cxl_sweep_resonances(s, 50.0, CXL_STUB_OPEN, 0, 0, &r) == CXL_OK) {
        for (size_t i = 0; i < cxl_sweep_res_count(r); i++) {
            double f, e, v;
            if (cxl_sweep_res_get(r, i, NULL, NULL, NULL, &f, &e, &v) != CXL_OK ||
                !isfinite(f) || !isfinite(e) || !isfinite(v))
                abort();
        }
        cxl_sweep_res_free(r);
    }
    cxl_fault *fl = NULL;
    if (cxl_fault_new(s, 50.0, 0.66, NULL, CXL_FAULT_HANN, 0, 0, 0, &fl) == CXL_OK) {
        double d, g;
        if (cxl_fault_point(fl, 0, &d, &g, NULL, NULL) != CXL_OK || !isfinite(g)) abort();
        cxl_fault_free(fl);
    }
    /* the fit iterates over every point: short sweeps keep a run fast */
    cxl_sweepfit *fit = NULL;
    if (n <= 400 && cxl_sweepfit_new(s, 10.0, CXL_STUB_OPEN, 0, 0, 0, 0, &fit) == CXL_OK) {
        double vf, z0, rms;
        cxl_sweepfit_line(fit, &vf, NULL, NULL, NULL, &z0, NULL);
        cxl_sweepfit_quality(fit, &rms, NULL, NULL, NULL, NULL);
        if (!(vf > 0 && vf <= 1) || !(z0 > 0) || !isfinite(rms)) abort();
        cxl_sweepfit_free(fit);
    }
    cxl_sweep_free(s);
    return 0;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1) return 0;
    int which = data[0] % 4;
    if (which == 3) return sweep_file(data + 1, size - 1);
    FILE *fp = fmemopen((void *)(data + 1), size - 1 ? size - 1 : 1, "rb");
    if (!fp) return 0;
    if (size == 1) fgetc(fp); /* empty file */
    char msg[256];
    size_t line = 0;
    if (which == 2) {
        cxl_bands *b = NULL;
        if (cxl_bands_new_stream(fp, &b, &line) == CXL_OK) {
            for (size_t i = 0; i < cxl_bands_count(b); i++) {
                double lo, hi;
                if (cxl_bands_get(b, i, NULL, NULL, NULL, &lo, &hi, NULL, NULL) == CXL_OK &&
                    !(isfinite(lo) && isfinite(hi) && lo < hi))
                    abort();
            }
            cxl_bands_free(b);
        }
        fclose(fp);
        return 0;
    }
    cxl_catalog *cat = NULL;
    if (cxl_catalog_new(&cat) != CXL_OK) abort();
    size_t before = 0, after = 0;
    before = cxl_catalog_count(cat);
    cxl_status st;
    if (which == 0) {
        st = cxl_catalog_load_cables(cat, fp, "fuzz.csv", &line, msg, sizeof msg);
    } else {
        /* points need a user cable to attach to */
        static const char spool[] = "name,vf\nspool,0.8\nother,0.66\n";
        FILE *sp = fmemopen((void *)spool, sizeof spool - 1, "rb");
        if (!sp || cxl_catalog_load_cables(cat, sp, NULL, NULL, NULL, 0) != CXL_OK) abort();
        fclose(sp);
        before = cxl_catalog_count(cat);
        st = cxl_catalog_load_loss(cat, fp, "fuzz.csv", &line, msg, sizeof msg);
    }
    after = cxl_catalog_count(cat);
    if (st != CXL_OK && after != before) abort(); /* all or nothing */
    for (size_t i = 0; i < after; i++) {
        double vf;
        if (cxl_catalog_value(cat, i, CXL_CABLE_VF, &vf) == CXL_OK && !(vf > 0 && vf <= 1)) abort();
        cxl_loss_fit *fit = NULL;
        if (cxl_loss_fit_new_cable(cat, i, &fit) == CXL_OK) {
            double lo, hi, db;
            if (cxl_loss_fit_range(fit, &lo, &hi) == CXL_OK &&
                cxl_loss_fit_eval(fit, sqrt(lo * hi), 0, &db) == CXL_OK && !isfinite(db))
                abort();
            cxl_loss_fit_free(fit);
        }
    }
    cxl_catalog_free(cat);
    fclose(fp);
    return 0;
}
