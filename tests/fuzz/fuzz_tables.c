/* fuzz_tables.c - libFuzzer target for the user table loaders: cable
 * catalog rows, attenuation points and band tables.  The first byte picks
 * the loader; the rest is the file. */
#include <config.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include "coaxline.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1) return 0;
    int which = data[0] % 3;
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
    cxl_catalog_count(cat, &before);
    cxl_status st;
    if (which == 0) {
        st = cxl_catalog_load_cables(cat, fp, "fuzz.csv", &line, msg, sizeof msg);
    } else {
        /* points need a user cable to attach to */
        static const char spool[] = "name,vf\nspool,0.8\nother,0.66\n";
        FILE *sp = fmemopen((void *)spool, sizeof spool - 1, "rb");
        if (!sp || cxl_catalog_load_cables(cat, sp, NULL, NULL, NULL, 0) != CXL_OK) abort();
        fclose(sp);
        cxl_catalog_count(cat, &before);
        st = cxl_catalog_load_loss(cat, fp, "fuzz.csv", &line, msg, sizeof msg);
    }
    cxl_catalog_count(cat, &after);
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
