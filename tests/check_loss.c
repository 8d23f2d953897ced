/* check_loss - fitted and physical loss models, mismatch loss, skin depth. */
#include <config.h>
#include <check.h>
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_math.h>
#include "coaxline.h"

#define CU 58.0e6                       /* S/m, IEC 60028 */
#define MU0 (4e-7 * M_PI)               /* H/m; CODATA 2018 differs by 5.5e-10 relative */
#define EPS0 8.8541878128e-12           /* F/m, CODATA 2018 */
#define C0 299792458.0                  /* m/s, exact (SI) */
#define FT_PER_100M (100.0 / 0.3048)

/* ---- skin depth --------------------------------------------------------------- */

START_TEST(test_skin_depth_copper)
{
    double d;
    /* Copper: delta = 0.0661 / sqrt(f) m (Hayt and Buck, Engineering
     * Electromagnetics, 8th ed., sec. 11.4, skin effect, from memory);
     * 66.1 um at 1 MHz (REFERENCES.md, from sigma = 58.0 MS/m). */
    ck_assert_int_eq(cxl_loss_skin_depth_m(1e6, CU, 1.0, &d), CXL_OK);
    ck_assert_double_eq_tol(d, 66.1e-6, 0.05e-6);
    ck_assert_int_eq(cxl_loss_skin_depth_m(60.0, CU, 1.0, &d), CXL_OK);
    ck_assert_double_eq_tol(d, 0.0661 / sqrt(60.0), 0.00005 / sqrt(60.0));
    /* delta scales as 1/sqrt(mu_r): definition 1/sqrt(pi f mu sigma) */
    double d100;
    ck_assert_int_eq(cxl_loss_skin_depth_m(1e6, CU, 100.0, &d100), CXL_OK);
    ck_assert_double_eq_tol(d100, 66.1e-7, 0.05e-7);
    ck_assert_int_eq(cxl_loss_skin_depth_m(0.0, CU, 1.0, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_skin_depth_m(1e6, -CU, 1.0, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_skin_depth_m(1e6, CU, NAN, &d), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_skin_depth_m(1e6, CU, 1.0, NULL), CXL_EINVAL);
}
END_TEST

/* ---- physical model ------------------------------------------------------------- */

static cxl_loss_model *model(double d, double dd, double eps, double tan_d)
{
    cxl_loss_model *m = NULL;
    ck_assert_int_eq(cxl_loss_model_new(d, dd, eps, tan_d, CU, 1.0, &m), CXL_OK);
    return m;
}

START_TEST(test_z0_from_diameters)
{
    /* Lossless coax Z0 = (eta0 / (2 pi sqrt(eps_r))) ln(D/d) (Pozar, Microwave
     * Engineering, 4th ed., sec. 2.1, from memory); eta0 = sqrt(mu0/eps0).
     * At 1 GHz on copper R/(omega L) < 1e-2, so Re Z0 is within 1e-5 of it
     * (second order) and Im Z0 ~ -Z0 R/(2 omega L).
     * The handbook form 138 log10(D/d)/sqrt(eps_r) (Reference Data for
     * Engineers, 9th ed., transmission-line chapter, from memory) rounds
     * 59.9585 ln 10 = 138.06 to 138: 0.05 %. */
    const double geo[][3] = {{0.81e-3, 2.95e-3, 2.25}, {2.26e-3, 7.24e-3, 2.25},
                             {1.02e-3, 4.57e-3, 1.487}, {0.30e-3, 1.60e-3, 2.1}};
    for (size_t k = 0; k < sizeof geo / sizeof geo[0]; k++) {
        cxl_loss_model *m = model(geo[k][0], geo[k][1], geo[k][2], 0.0);
        double zr, zi;
        ck_assert_int_eq(cxl_loss_model_z0(m, 1e9, CXL_LOSS_EXTERNAL_L_ONLY, &zr, &zi), CXL_OK);
        double eta0 = sqrt(MU0 / EPS0);
        double ideal = eta0 / (2.0 * M_PI * sqrt(geo[k][2])) * log(geo[k][1] / geo[k][0]);
        ck_assert_double_eq_tol(zr, ideal, 1e-5 * ideal);
        ck_assert(zi < 0.0 && zi > -5e-3 * ideal); /* R adds a small -j part */
        double handbook = 138.0 * log10(geo[k][1] / geo[k][0]) / sqrt(geo[k][2]);
        ck_assert_double_eq_tol(zr, handbook, 1e-3 * handbook);
        cxl_loss_model_free(m);
    }
}
END_TEST

START_TEST(test_rlgc_against_table_2_1)
{
    /* Pozar, Microwave Engineering, 4th ed., Table 2.1 (coax), from memory:
     * R = Rs/(2 pi) (1/a + 1/b), Rs = 1/(sigma delta); C = 2 pi eps/ln(b/a);
     * G = 2 pi omega eps''/ln(b/a) = omega C tan(delta).  For a TEM line
     * v = 1/sqrt(L C) = c/sqrt(eps_r) with the external L (Pozar sec. 2.1). */
    double a = 0.405e-3, b = 1.475e-3, f = 7.1e6, eps = 2.25, tan_d = 2e-4;
    cxl_loss_model *m = model(2 * a, 2 * b, eps, tan_d);
    double r, l, g, c, delta;
    ck_assert_int_eq(cxl_loss_skin_depth_m(f, CU, 1.0, &delta), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_rlgc(m, f, CXL_LOSS_EXTERNAL_L_ONLY | CXL_LOSS_THIN_SKIN,
                                         &r, &l, &g, &c), CXL_OK);
    double rs = 1.0 / (CU * delta);
    ck_assert_double_eq_tol(r, rs / (2 * M_PI) * (1 / a + 1 / b), 1e-9 * r);
    /* The default Bessel form tends to it: with z = (1 + j) r/delta,
     * z I0/(2 I1) = z/2 + 1/4 + 3/(16 z) + ... and
     * z K0/K1 = z - 1/2 + 3/(8 z) + ... (the ratio of the series of
     * Abramowitz and Stegun 9.7.1, 9.7.2, hand expanded), 1/z^2 being
     * imaginary, so R = thin-skin + 1/(4 sigma pi a^2) (1 + 3 delta/(8 a))
     * - 1/(4 sigma pi b^2) (1 - 3 delta/(4 b)) up to (delta/a)^3 terms:
     * a/delta = 16.7 here. */
    double rb;
    ck_assert_int_eq(cxl_loss_model_rlgc(m, f, CXL_LOSS_EXTERNAL_L_ONLY, &rb, &l, &g, &c), CXL_OK);
    double first = rs / (2 * M_PI) * (1 / a + 1 / b) +
                   (1 + 3 * delta / (8 * a)) / (4 * CU * M_PI * a * a) -
                   (1 - 3 * delta / (4 * b)) / (4 * CU * M_PI * b * b);
    ck_assert_double_eq_tol(rb, first, 2e-5 * rb);
    ck_assert(rb > r * 1.02); /* about 2.3 % above the thin-skin form at 7.1 MHz */
    ck_assert_double_eq_tol(c, 2 * M_PI * EPS0 * eps / log(b / a), 1e-9 * c);
    ck_assert_double_eq_tol(g, 2 * M_PI * f * c * tan_d, 1e-12 * g);
    ck_assert_double_eq_tol(1.0 / sqrt(l * c), C0 / sqrt(eps), 1e-9 * C0);
    cxl_loss_model_free(m);
}
END_TEST

START_TEST(test_internal_inductance)
{
    /* Skin-effect regime: Zs = (1 + j) Rs, so L_int = R/omega; with
     * Rs = 1/(sigma delta) and delta^2 = 2/(omega mu0 sigma) that is
     * L_int = mu0 delta/(4 pi) (1/a + 1/b): the inductance of a layer
     * delta/2 thick in each conductor (Ramo, Whinnery and Van Duzer, Fields
     * and Waves in Communication Electronics, 3rd ed., ch. 5, internal
     * impedance of a good conductor, from memory). */
    double a = 1.13e-3, b = 3.62e-3;
    cxl_loss_model *m = model(2 * a, 2 * b, 2.25, 0.0);
    const double freqs[] = {1.8e6, 3.6e6, 14e6, 50e6};
    for (size_t k = 0; k < 4; k++) {
        double r, l_all, l_ext, g, c, delta;
        ck_assert_int_eq(cxl_loss_model_rlgc(m, freqs[k], CXL_LOSS_THIN_SKIN, &r, &l_all, &g, &c), CXL_OK);
        ck_assert_int_eq(cxl_loss_model_rlgc(m, freqs[k], CXL_LOSS_EXTERNAL_L_ONLY, &r, &l_ext, &g, &c), CXL_OK);
        ck_assert_int_eq(cxl_loss_skin_depth_m(freqs[k], CU, 1.0, &delta), CXL_OK);
        double want = MU0 * delta / (4 * M_PI) * (1 / a + 1 / b);
        ck_assert_double_eq_tol(l_all - l_ext, want, 1e-6 * want);
        /* external L = mu0/(2 pi) ln(b/a) (Pozar Table 2.1) */
        ck_assert_double_eq_tol(l_ext, MU0 / (2 * M_PI) * log(b / a), 1e-12);
    }
    /* The Bessel form at low frequency: a round wire's internal inductance
     * tends to mu0/(8 pi) and its resistance to 1/(sigma pi a^2) (Ramo,
     * Whinnery and Van Duzer, 3rd ed., ch. 5, from memory); the thick outer
     * wall adds R = omega mu0/8 and L = mu0/(2 pi) (ln(sqrt(2) delta/b) -
     * gamma_Euler) from K0/K1 ~ z (-ln(z/2) - gamma) (Abramowitz and
     * Stegun 9.6.13, 9.6.11, leading terms).  At 0.01 Hz b/delta = 0.0055,
     * and the next terms are of order (a/delta)^4 and (b/delta)^2 ln. */
    const double f_dc = 0.01;
    double r, l_all, l_ext, g, c, delta;
    ck_assert_int_eq(cxl_loss_model_rlgc(m, f_dc, CXL_LOSS_EXTRAPOLATE, &r, &l_all, &g, &c), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_rlgc(m, f_dc, CXL_LOSS_EXTRAPOLATE | CXL_LOSS_EXTERNAL_L_ONLY,
                                         &r, &l_ext, &g, &c), CXL_OK);
    ck_assert_int_eq(cxl_loss_skin_depth_m(f_dc, CU, 1.0, &delta), CXL_OK);
    double r_want = 1.0 / (CU * M_PI * a * a) + 2 * M_PI * f_dc * MU0 / 8;
    double l_want = MU0 / (8 * M_PI) +
                    MU0 / (2 * M_PI) * (log(sqrt(2.0) * delta / b) - 0.5772156649015329);
    ck_assert_double_eq_tol(r, r_want, 1e-3 * r_want);
    ck_assert_double_eq_tol(l_all - l_ext, l_want, 2e-3 * l_want);
    cxl_loss_model_free(m);
}
END_TEST

START_TEST(test_low_loss_attenuation_terms)
{
    /* Pozar, 4th ed., sec. 2.7 (low-loss line), from memory:
     * alpha_c = R/(2 Z0), alpha_d = pi sqrt(eps_r) f tan(delta)/c Np/m.
     * The exact gamma must agree within 1 % where loss is low. */
    double d = 2.26e-3, dd = 7.24e-3, eps = 2.25, tan_d = 1e-3;
    cxl_loss_model *m0 = model(d, dd, eps, 0.0), *m1 = model(d, dd, eps, tan_d);
    const double freqs[] = {3.5e6, 10e6, 30e6, 100e6};
    for (size_t k = 0; k < 4; k++) {
        double f = freqs[k], a0, a1, beta, r, l, g, c;
        ck_assert_int_eq(cxl_loss_model_gamma(m0, f, CXL_LOSS_EXTERNAL_L_ONLY, &a0, &beta), CXL_OK);
        ck_assert_int_eq(cxl_loss_model_gamma(m1, f, CXL_LOSS_EXTERNAL_L_ONLY, &a1, &beta), CXL_OK);
        double alpha_d = M_PI * sqrt(eps) * f * tan_d / C0;
        ck_assert_double_eq_tol(a1 - a0, alpha_d, 0.01 * alpha_d);
        ck_assert_int_eq(cxl_loss_model_rlgc(m0, f, CXL_LOSS_EXTERNAL_L_ONLY, &r, &l, &g, &c), CXL_OK);
        double alpha_c = r / (2 * sqrt(l / c));
        ck_assert_double_eq_tol(a0, alpha_c, 0.01 * alpha_c);
        double db;
        ck_assert_int_eq(cxl_loss_model_attenuation(m0, f, CXL_LOSS_EXTERNAL_L_ONLY, &db), CXL_OK);
        ck_assert_double_eq_tol(db, 20 * log10(exp(1.0)) * a0, 1e-12 * db); /* 8.686 dB/Np */
    }
    cxl_loss_model_free(m0);
    cxl_loss_model_free(m1);
}
END_TEST

START_TEST(test_phase_velocity_lower_at_low_frequency)
{
    /* Exact gamma with R ~ sqrt(f): v = omega/beta falls below c/sqrt(eps_r)
     * as R/(omega L) grows toward low frequency (Pozar sec. 2.7, from memory;
     * DESIGN.md).  Solid-PE RG-58 geometry from the catalog. */
    cxl_catalog *cat;
    size_t i;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-58", &i), CXL_OK);
    cxl_loss_model *m;
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, i, &m), CXL_OK);
    double v18, v100, v1g, eps;
    ck_assert_int_eq(cxl_loss_model_vf(m, 1.8e6, 0, &v18), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_vf(m, 100e6, 0, &v100), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_vf(m, 1e9, 0, &v1g), CXL_OK);
    ck_assert_int_eq(cxl_catalog_value(cat, i, CXL_CABLE_RELATIVE_PERMITTIVITY, &eps), CXL_OK);
    printf("RG-58 model VF: 1.8 MHz %.6f, 100 MHz %.6f, 1 GHz %.6f, "
           "1.8-100 MHz difference %.3f %%\n", v18, v100, v1g, 100 * (v100 - v18) / v100);
    ck_assert(v18 < v100 && v100 < v1g);
    /* where R/(omega L) is small the TEM value v = c/sqrt(eps_r) holds
     * (Pozar, 4th ed., sec. 2.1, from memory); 0.5 % covers what is left */
    ck_assert_double_eq_tol(v1g, 1 / sqrt(eps), 0.005 / sqrt(eps));
    /* with neither internal L nor R the line would be dispersion-free, so the
     * drop comes from the loss terms: still below without internal L */
    double v18_ext, v100_ext;
    ck_assert_int_eq(cxl_loss_model_vf(m, 1.8e6, CXL_LOSS_EXTERNAL_L_ONLY, &v18_ext), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_vf(m, 100e6, CXL_LOSS_EXTERNAL_L_ONLY, &v100_ext), CXL_OK);
    ck_assert(v18_ext < v100_ext && v18 < v18_ext);
    cxl_loss_model_free(m);
    cxl_catalog_free(cat);
}
END_TEST

START_TEST(test_clad_conductor)
{
    /* Layer over a second metal as a line section (input impedance of a
     * lossy line, Zin = Z0 (ZL + Z0 tanh(gl))/(Z0 + ZL tanh(gl)), Pozar 4th
     * ed. sec. 2.7, from memory).  Exact identities: same metal under the
     * layer -> plain copper for any thickness; a layer many skin depths
     * thick -> copper too.  DESIGN.md: copper-clad steel loses far more
     * than copper below about 5 MHz. */
    double d = 1.02e-3, dd = 4.57e-3, r_cu, r_cl, l, g, c;
    cxl_loss_model *cu = model(d, dd, 1.487, 0.0), *cl = model(d, dd, 1.487, 0.0);
    ck_assert_int_eq(cxl_loss_model_set_clad(cl, 0.02e-3, CU, 1.0), CXL_OK);
    /* the clad centre keeps the planar form: compare with copper's */
    ck_assert_int_eq(cxl_loss_model_rlgc(cu, 2e6, CXL_LOSS_THIN_SKIN, &r_cu, &l, &g, &c), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_rlgc(cl, 2e6, CXL_LOSS_THIN_SKIN, &r_cl, &l, &g, &c), CXL_OK);
    ck_assert_double_eq_tol(r_cl, r_cu, 1e-12 * r_cu);
    /* steel core: sigma and mu_r of the order of 5.8 MS/m and 100 (from memory) */
    ck_assert_int_eq(cxl_loss_model_set_clad(cl, 0.03e-3, 5.8e6, 100.0), CXL_OK);
    double ratio[2];
    const double f[2] = {1.8e6, 200e6};
    for (int k = 0; k < 2; k++) {
        ck_assert_int_eq(cxl_loss_model_rlgc(cu, f[k], CXL_LOSS_THIN_SKIN, &r_cu, &l, &g, &c), CXL_OK);
        ck_assert_int_eq(cxl_loss_model_rlgc(cl, f[k], CXL_LOSS_THIN_SKIN, &r_cl, &l, &g, &c), CXL_OK);
        ratio[k] = r_cl / r_cu;
    }
    printf("clad 0.03 mm over steel: R/R_copper %.3f at 1.8 MHz, %.5f at 200 MHz\n",
           ratio[0], ratio[1]);
    ck_assert(ratio[0] > 1.2);
    /* copper skin depth at 200 MHz is 4.7 um (1/sqrt(pi f mu0 sigma)), so
     * 30 um is over 6 skin depths and the steel is not seen (the exact
     * identity above in the limit) */
    ck_assert_double_eq_tol(ratio[1], 1.0, 1e-3);
    ck_assert_int_eq(cxl_loss_model_set_clad(cl, 0.6e-3, 5.8e6, 100.0), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_model_set_clad(cl, 0.01e-3, 5.8e6, 0.5), CXL_ERANGE);
    cxl_loss_model_free(cu);
    cxl_loss_model_free(cl);
}
END_TEST

START_TEST(test_model_range_and_errors)
{
    cxl_loss_model *m = model(0.81e-3, 2.95e-3, 2.25, 2e-4);
    double lo, hi, v, re, im;
    ck_assert_int_eq(cxl_loss_model_range(m, &lo, &hi), CXL_OK);
    /* inner radius = 1 skin depth (the library's documented validity floor,
     * coaxline.h: below it a real braid's thickness matters, which the
     * thick-wall K0/K1 form does not know; a choice, common practice, no
     * source); TE11 cut-off near
     * c/(pi (a + b) sqrt(eps_r)), i.e. k_c ~ 2/(a + b) (Pozar, 4th ed., coax
     * higher-order modes, from memory): 3.3839e10 Hz here, so 1 Hz is
     * rounding only */
    double delta;
    ck_assert_int_eq(cxl_loss_skin_depth_m(lo, CU, 1.0, &delta), CXL_OK);
    ck_assert_double_eq_tol(delta, 0.405e-3, 1e-12);
    ck_assert_double_eq_tol(hi, C0 / (M_PI * 1.88e-3 * 1.5), 1.0);
    ck_assert_int_eq(cxl_loss_model_attenuation(m, lo * 0.9, 0, &v), CXL_EEXTRAPOLATE);
    ck_assert_int_eq(cxl_loss_model_attenuation(m, lo * 0.9, CXL_LOSS_EXTRAPOLATE, &v), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_z0(m, hi * 1.1, 0, &re, &im), CXL_EEXTRAPOLATE);
    ck_assert_int_eq(cxl_loss_model_vf(m, 0.0, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_model_vf(m, NAN, 0, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_model_vf(m, 1e7, 0x80u, &v), CXL_EINVAL);
    cxl_loss_model_free(m);
    cxl_loss_model *bad = NULL;
    ck_assert_int_eq(cxl_loss_model_new(3e-3, 2.9e-3, 2.25, 0, CU, 1, &bad), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_model_new(1e-3, 2.9e-3, 0.5, 0, CU, 1, &bad), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_model_new(-1e-3, 2.9e-3, 2.25, 0, CU, 1, &bad), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_model_new(1e-3, 2.9e-3, 2.25, 0, 0.0, 1, &bad), CXL_EINVAL);
    ck_assert_ptr_null(bad);
}
END_TEST

/* ---- fitted model ---------------------------------------------------------------- */

START_TEST(test_fit_recovers_coefficients)
{
    /* Points made from a known a, b: the fit must return them (exact model,
     * common practice, no source); residuals are then at rounding level. */
    double a = 1.3e-5, b = 2.2e-10, f[6], y[6];
    for (int i = 0; i < 6; i++) {
        f[i] = 1e6 * pow(3.0, i);
        y[i] = a * sqrt(f[i]) + b * f[i];
    }
    cxl_loss_fit *fit;
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 6, &fit), CXL_OK);
    double ga, gb, lo, hi, rel;
    ck_assert_int_eq(cxl_loss_fit_coefficients(fit, &ga, &gb), CXL_OK);
    ck_assert_double_eq_tol(ga, a, 1e-9 * a);
    ck_assert_double_eq_tol(gb, b, 1e-8 * b);
    ck_assert_int_eq(cxl_loss_fit_range(fit, &lo, &hi), CXL_OK);
    ck_assert_double_eq(lo, 1e6);      /* first point, 3^0 MHz */
    ck_assert_double_eq(hi, 243e6);    /* last point, 3^5 MHz */
    ck_assert_int_eq(cxl_loss_fit_max_relative_residual(fit, &rel), CXL_OK);
    ck_assert(rel < 1e-12);
    cxl_loss_fit_free(fit);
    /* one point off by 5 %: it shows in the residuals */
    y[3] *= 1.05;
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 6, &fit), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_max_relative_residual(fit, &rel), CXL_OK);
    ck_assert(rel > 0.01 && rel < 0.05);
    double pf, pt, pr;
    ck_assert_int_eq(cxl_loss_fit_point(fit, 3, &pf, &pt, &pr), CXL_OK);
    ck_assert_double_eq(pf, 27e6);     /* point 3: 3^3 MHz */
    ck_assert(pr < 0.0); /* the fit stays below the raised point */
    ck_assert_int_eq(cxl_loss_fit_point(fit, 6, &pf, &pt, &pr), CXL_ERANGE);
    cxl_loss_fit_free(fit);
}
END_TEST

START_TEST(test_fit_errors)
{
    cxl_loss_fit *fit = NULL;
    double f[3] = {10e6, 10e6, 10e6}, y[3] = {0.01, 0.011, 0.012};
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 1, &fit), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 3, &fit), CXL_ERANGE); /* one frequency */
    f[1] = -3e6;
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 3, &fit), CXL_EINVAL);
    f[1] = 30e6;
    y[2] = NAN;
    ck_assert_int_eq(cxl_loss_fit_new(f, y, 3, &fit), CXL_EINVAL);
    ck_assert_ptr_null(fit);
    cxl_catalog *cat;
    size_t i;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-316", &i), CXL_OK); /* no table */
    ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_ENOTFOUND);
    cxl_catalog_free(cat);
}
END_TEST

/* The table value of catalog cable i at freq_hz (within 1 Hz), in dB/100
 * ft; -1 when the table has no point there. */
static double table_point_db_100ft(const cxl_catalog *cat, size_t i, double freq_hz)
{
    size_t np;
    np = cxl_catalog_loss_count(cat, i);
    for (size_t p = 0; p < np; p++) {
        double f, l;
        ck_assert_int_eq(cxl_catalog_loss_point(cat, i, p, &f, &l, NULL), CXL_OK);
        if (fabs(f - freq_hz) <= 1.0) return l * 30.48; /* dB/m -> dB/100 ft */
    }
    return -1.0;
}

START_TEST(test_catalog_loss_against_published_table)
{
    /* ARRL General Class License Manual, Table 6-1 Feedline Characteristics,
     * corrected table on the ARRL web page for chapter 6: typical matched loss
     * in dB/100 ft at 30 and 150 MHz, 3 significant figures (tolerance: half
     * a unit in the last digit plus the dB/100 m rounding in the data file). */
    static const struct { const char *name; double l30, l150; } pub[] = {
        {"RG-174", 4.56, 10.3}, {"RG-58", 2.47, 5.63}, {"RG-8X", 1.96, 4.53},
        {"RG-213", 1.08, 2.53}, {"RG-59", 1.79, 4.11},
    };
    cxl_catalog *cat;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    for (size_t k = 0; k < sizeof pub / sizeof pub[0]; k++) {
        size_t i, np;
        ck_assert_int_eq(cxl_catalog_find(cat, pub[k].name, &i), CXL_OK);
        np = cxl_catalog_loss_count(cat, i);
        /* the table holds the published points themselves */
        ck_assert_double_eq_tol(table_point_db_100ft(cat, i, 30e6), pub[k].l30,
                                pub[k].l30 < 10 ? 0.006 : 0.06);
        ck_assert_double_eq_tol(table_point_db_100ft(cat, i, 150e6), pub[k].l150,
                                pub[k].l150 < 10 ? 0.006 : 0.06);
        cxl_loss_fit *fit;
        ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_OK);
        double l30, l150, rel;
        ck_assert_int_eq(cxl_loss_fit_eval(fit, 30e6, 0, &l30), CXL_OK);
        ck_assert_int_eq(cxl_loss_fit_eval(fit, 150e6, 0, &l150), CXL_OK);
        ck_assert_int_eq(cxl_loss_fit_max_relative_residual(fit, &rel), CXL_OK);
        printf("%-7s %zu points, fit max relative residual %.2f %%\n", pub[k].name, np, 100 * rel);
        if (np == 2) {
            /* two parameters through two points: exact (common practice, no source) */
            ck_assert(rel < 0.005);
            ck_assert_double_eq_tol(l30 * 30.48, pub[k].l30, pub[k].l30 < 10 ? 0.006 : 0.06);
            ck_assert_double_eq_tol(l150 * 30.48, pub[k].l150, pub[k].l150 < 10 ? 0.006 : 0.06);
        } else {
            /* Tables grown with low-frequency points from other sources
             * (data/cable_loss.csv: a handbook table to 0.1 dB/100 ft, from
             * memory, and a graph reading): constructions sold under one RG
             * number differ by several per cent (common practice, no source),
             * so the one curve a sqrt(f) + b f stays within 5 % of them all. */
            ck_assert(rel < 0.05);
            ck_assert_double_eq_tol(l30 * 30.48, pub[k].l30, 0.05 * pub[k].l30);
            ck_assert_double_eq_tol(l150 * 30.48, pub[k].l150, 0.05 * pub[k].l150);
        }
        /* the physical model with ideal smooth copper is a lower bound: braid
         * and stranding add some 20-60 % (common practice, from memory) */
        cxl_loss_model *m;
        double phys;
        ck_assert_int_eq(cxl_loss_model_new_cable(cat, i, &m), CXL_OK);
        ck_assert_int_eq(cxl_loss_model_attenuation(m, 30e6, 0, &phys), CXL_OK);
        printf("%-7s 30 MHz: table %.2f dB/100 ft, physical (ideal copper) %.2f, ratio %.2f\n",
               pub[k].name, pub[k].l30, phys * 30.48, pub[k].l30 / (phys * 30.48));
        ck_assert(phys < l30 && phys > l30 / 1.8);
        cxl_loss_model_free(m);
        cxl_loss_fit_free(fit);
    }
    cxl_catalog_free(cat);
}
END_TEST

START_TEST(test_catalog_low_band_points)
{
    /* The low-frequency points of data/cable_loss.csv, in dB/100 ft as their
     * sources give them: ARRL Handbook table of nominal line characteristics
     * (from memory, 0.1 dB/100 ft resolution, so +-0.05) and the ARRL
     * Handbook 2000 attenuation graph read at 10 MHz (as quoted, 2
     * significant figures).  The file stores them in dB/100 m to 5
     * significant figures. */
    static const struct { const char *name; double f_mhz, db_100ft; } pts[] = {
        {"RG-213", 1, 0.2}, {"RG-213", 10, 0.66}, {"RG-58", 1, 0.4}, {"RG-58", 10, 1.4},
        {"RG-6-foam", 1, 0.2}, {"RG-6-foam", 10, 0.7}, {"RG-6-foam", 100, 1.8},
    };
    cxl_catalog *cat;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    for (size_t k = 0; k < sizeof pts / sizeof pts[0]; k++) {
        size_t i;
        ck_assert_int_eq(cxl_catalog_find(cat, pts[k].name, &i), CXL_OK);
        ck_assert_double_eq_tol(table_point_db_100ft(cat, i, pts[k].f_mhz * 1e6),
                                pts[k].db_100ft, 1e-4 * pts[k].db_100ft);
        cxl_loss_fit *fit;
        ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_OK);
        double v;
        /* the fit reaches the point and stays within 8 % of it: the source
         * resolution (25 % at 0.2 dB/100 ft, 7 % at 0.7) and the spread
         * between sources above (common practice, no source) */
        ck_assert_int_eq(cxl_loss_fit_eval(fit, pts[k].f_mhz * 1e6, 0, &v), CXL_OK);
        ck_assert_double_eq_tol(v * 30.48, pts[k].db_100ft, 0.08 * pts[k].db_100ft);
        /* the 160 m band (1.8-2.0 MHz, ITU RR Art. 5) is now inside the table */
        ck_assert_int_eq(cxl_loss_fit_eval(fit, 1.8e6, 0, &v), CXL_OK);
        ck_assert_int_eq(cxl_loss_fit_eval(fit, 2.0e6, 0, &v), CXL_OK);
        cxl_loss_fit_free(fit);
    }
    cxl_catalog_free(cat);
}
END_TEST

START_TEST(test_fit_range)
{
    cxl_catalog *cat;
    size_t i;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    /* RG-59 keeps only the two Table 6-1 points (copper-clad steel centre:
     * an a sqrt(f) + b f curve would not hold below a few MHz) */
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-59", &i), CXL_OK);
    cxl_loss_fit *fit;
    ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_OK);
    double lo, hi, v;
    ck_assert_int_eq(cxl_loss_fit_range(fit, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(lo, 30e6, 1e-6);
    ck_assert_double_eq_tol(hi, 150e6, 1e-6);
    /* margin of 10 % each side (cxl_loss_fit_usable_range) */
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 28e6, 0, &v), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 160e6, 0, &v), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 1.8e6, 0, &v), CXL_EEXTRAPOLATE);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 170e6, 0, &v), CXL_EEXTRAPOLATE);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 1.8e6, CXL_LOSS_EXTRAPOLATE, &v), CXL_OK);
    ck_assert(v > 0.0);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, -1.0, CXL_LOSS_EXTRAPOLATE, &v), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 50e6, 0x40u, &v), CXL_EINVAL);
    cxl_loss_fit_free(fit);
    /* RG-58 now starts at 1 MHz: 0.95 MHz is inside the margin, 0.85 not */
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-58", &i), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_range(fit, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(lo, 1e6, 1e-6);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 0.95e6, 0, &v), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_eval(fit, 0.85e6, 0, &v), CXL_EEXTRAPOLATE);
    cxl_loss_fit_free(fit);
    cxl_catalog_free(cat);
}
END_TEST

/* ---- mismatch loss --------------------------------------------------------------- */

/* Power into the line and into the load from the voltage and current waves
 * on a line of real Z0: V(z) = V+ (e^{-g z} + G e^{g z}), I(z) = V+/Z0
 * (e^{-g z} - G e^{g z}), load at z = 0, input at z = -l, P = Re(V I*)/2
 * (Pozar, 4th ed., sec. 2.7, from memory).  Total loss = 10 log10(Pin/PL). */
static double wave_total_loss_db(double matched_db, double swr, double gamma_phase)
{
    double mag = (swr - 1) / (swr + 1), z0 = 50.0;
    double alpha_l = matched_db / (20 * log10(exp(1.0))), beta_l = 7.3;
    gsl_complex G = gsl_complex_polar(mag, gamma_phase);
    gsl_complex gl = gsl_complex_rect(alpha_l, beta_l);
    gsl_complex fwd = gsl_complex_exp(gl), back = gsl_complex_mul(G, gsl_complex_exp(gsl_complex_negative(gl)));
    gsl_complex v_in = gsl_complex_add(fwd, back), i_in = gsl_complex_div_real(gsl_complex_sub(fwd, back), z0);
    gsl_complex v_l = gsl_complex_add_real(G, 1.0);
    gsl_complex i_l = gsl_complex_div_real(gsl_complex_sub(gsl_complex_rect(1, 0), G), z0);
    double p_in = GSL_REAL(gsl_complex_mul(v_in, gsl_complex_conjugate(i_in))) / 2;
    double p_l = GSL_REAL(gsl_complex_mul(v_l, gsl_complex_conjugate(i_l))) / 2;
    return 10 * log10(p_in / p_l);
}

START_TEST(test_total_loss)
{
    double t, ml;
    const double cases[][2] = {{0.5, 1.5}, {1.5, 3.0}, {3.0, 3.0}, {0.2, 10.0}, {6.0, 2.0}};
    for (size_t k = 0; k < 5; k++) {
        ck_assert_int_eq(cxl_loss_total_db(cases[k][0], cases[k][1], &t), CXL_OK);
        double w = wave_total_loss_db(cases[k][0], cases[k][1], 0.7 * (double)k);
        ck_assert_double_eq_tol(t, w, 1e-9 * w);
    }
    /* matched load: total = matched loss (definition) */
    ck_assert_int_eq(cxl_loss_total_db(2.5, 1.0, &t), CXL_OK);
    ck_assert_double_eq_tol(t, 2.5, 1e-14);   /* SWR 1: |G| = 0 */
    /* very long line: the reflected power is lost too, so the excess tends to
     * the mismatch loss 10 log10(1/(1 - |G|^2)) (Pozar sec. 2.3, from memory);
     * SWR 3: |G| = 0.5, 1.2494 dB */
    ck_assert_int_eq(cxl_loss_total_db(200.0, 3.0, &t), CXL_OK);
    ck_assert_double_eq_tol(t - 200.0, 10 * log10(1 / 0.75), 1e-9);
    /* run: 30 m at 0.05 dB/m */
    double total;
    ck_assert_int_eq(cxl_loss_run_db(0.05, 30.0, 2.0, &ml, &total), CXL_OK);
    ck_assert_double_eq_tol(ml, 1.5, 1e-14);   /* 0.05 dB/m * 30 m */
    ck_assert_double_eq_tol(total, wave_total_loss_db(1.5, 2.0, 1.0), 1e-9);
    /* errors: length, SWR, NaN */
    ck_assert_int_eq(cxl_loss_run_db(0.05, 0.0, 2.0, &ml, &total), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_run_db(0.05, -3.0, 2.0, &ml, &total), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_run_db(-0.05, 3.0, 2.0, &ml, &total), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_run_db(0.05, 3.0, 0.9, &ml, &total), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_total_db(1.0, 0.99, &t), CXL_ERANGE);
    ck_assert_int_eq(cxl_loss_total_db(1.0, NAN, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_total_db(1.0, INFINITY, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_total_db(-1.0, 2.0, &t), CXL_EINVAL);
    ck_assert_int_eq(cxl_loss_total_db(1.0, 2.0, NULL), CXL_EINVAL);
}
END_TEST

START_TEST(test_loss_cable_choice)
{
    /* RG-174 has an attenuation table (data/cable_loss.csv: ARRL General
     * Class License Manual, Table 6-1, typical values): the fit is used,
     * usable 10 % beyond the table's ends, and it gives the table's 30 MHz
     * value 14.961 dB/100 m within 5 % (a bound on the fit's residual
     * there, common practice, no source) */
    cxl_catalog *cat = NULL;
    size_t i;
    cxl_loss_cable *l = NULL;
    cxl_loss_kind kind;
    double lo, hi, flo, fhi, db;
    ck_assert_int_eq(cxl_catalog_new(&cat), CXL_OK);
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-174", &i), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_new(cat, i, &l), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_kind(l, &kind), CXL_OK);
    ck_assert_int_eq(kind, CXL_LOSS_KIND_FIT);
    cxl_loss_fit *fit = NULL;
    ck_assert_int_eq(cxl_loss_fit_new_cable(cat, i, &fit), CXL_OK);
    ck_assert_int_eq(cxl_loss_fit_range(fit, &flo, &fhi), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_range(l, &lo, &hi), CXL_OK);
    ck_assert_double_eq_tol(lo, flo / 1.1, 1e-9 * flo);
    ck_assert_double_eq_tol(hi, fhi * 1.1, 1e-9 * fhi);
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 30e6, 0, &db), CXL_OK);
    ck_assert_double_eq_tol(db, 0.14961, 0.05 * 0.14961);
    /* outside the usable range: refused unless asked */
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 0.98 * lo, 0, &db), CXL_EEXTRAPOLATE);
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 0.98 * lo, CXL_LOSS_EXTRAPOLATE, &db), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 1.02 * lo, 0, &db), CXL_OK);
    /* the difference of two lines is the loss of the extra length */
    double diff, per_m;
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 50e6, 0, &per_m), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_difference(l, 20.0, 23.0, 50e6, &diff), CXL_OK);
    ck_assert_double_eq_tol(diff, 3.0 * per_m, 1e-12);
    ck_assert_int_eq(cxl_loss_cable_difference(l, 20.0, 23.0, 1e6, &diff), CXL_EEXTRAPOLATE);
    cxl_loss_fit_free(fit);
    cxl_loss_cable_free(l);
    /* RG-316 has no table: the physical model and its own range */
    cxl_loss_model *m = NULL;
    ck_assert_int_eq(cxl_catalog_find(cat, "RG-316", &i), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_new(cat, i, &l), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_kind(l, &kind), CXL_OK);
    ck_assert_int_eq(kind, CXL_LOSS_KIND_PHYSICAL);
    ck_assert_int_eq(cxl_loss_model_new_cable(cat, i, &m), CXL_OK);
    ck_assert_int_eq(cxl_loss_model_range(m, &flo, &fhi), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_range(l, &lo, &hi), CXL_OK);
    ck_assert_double_eq(lo, flo);
    ck_assert_double_eq(hi, fhi);
    double mdb;
    ck_assert_int_eq(cxl_loss_model_attenuation(m, 10e6, 0, &mdb), CXL_OK);
    ck_assert_int_eq(cxl_loss_cable_db_per_m(l, 10e6, 0, &db), CXL_OK);
    ck_assert_double_eq(db, mdb);
    cxl_loss_model_free(m);
    cxl_loss_cable_free(l);
    cxl_catalog_free(cat);
}
END_TEST

int main(void)
{
    gsl_set_error_handler(NULL); /* GSL's default: abort, so a stray error is loud */
    Suite *s = suite_create("loss");
    TCase *tc = tcase_create("models");
    tcase_add_test(tc, test_skin_depth_copper);
    tcase_add_test(tc, test_loss_cable_choice);
    tcase_add_test(tc, test_z0_from_diameters);
    tcase_add_test(tc, test_rlgc_against_table_2_1);
    tcase_add_test(tc, test_internal_inductance);
    tcase_add_test(tc, test_low_loss_attenuation_terms);
    tcase_add_test(tc, test_phase_velocity_lower_at_low_frequency);
    tcase_add_test(tc, test_clad_conductor);
    tcase_add_test(tc, test_model_range_and_errors);
    tcase_add_test(tc, test_fit_recovers_coefficients);
    tcase_add_test(tc, test_fit_errors);
    tcase_add_test(tc, test_catalog_loss_against_published_table);
    tcase_add_test(tc, test_catalog_low_band_points);
    tcase_add_test(tc, test_fit_range);
    tcase_add_test(tc, test_total_loss);
    suite_add_tcase(s, tc);
    SRunner *sr = srunner_create(s);
    srunner_run_all(sr, CK_NORMAL);
    int nf = srunner_ntests_failed(sr);
    srunner_free(sr);
    return nf ? EXIT_FAILURE : EXIT_SUCCESS;
}
