/* bessel.c - ratios of modified Bessel functions of complex argument, for
 * the internal impedance of round conductors (loss.c).  GSL has these
 * functions for real arguments only.
 *
 * Two scaled ratios, chosen so that neither overflows at small or large
 * |z| and both tend to simple limits:
 *   cxl__bessel_i_ratio(z) = z I0(z) / (2 I1(z))   (1 at z -> 0, z/2 at large z)
 *   cxl__bessel_k_ratio(z) = z K0(z) / K1(z)       (0 at z -> 0, z at large z)
 *
 * Small |z|: the ascending series, Abramowitz and Stegun, Handbook of
 * Mathematical Functions, 9.6.10 (I0, I1), 9.6.13 (K0) and 9.6.11 with
 * n = 1 (K1).  Large |z|: the asymptotic expansions 9.7.1 (I) and 9.7.2
 * (K), whose exponential and 1/sqrt(2 pi z) factors cancel in the ratio,
 * so only the bracketed series are summed.  CXL__BESSEL_I_ASYMPT_MIN and
 * CXL__BESSEL_K_ASYMPT_MIN (lib/internal.h) are the switch-over |z|,
 * measured against scipy by tests/bessel_compare.py.
 */
#include <config.h>
#include <math.h>
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include "internal.h"

#define EULER_GAMMA 0.57721566490153286061
#define SERIES_MAX_TERMS 200

/* z I0(z) / (2 I1(z)) from A&S 9.6.10:
 *   I0(z) = sum t^k / (k!)^2,  I1(z) = (z/2) sum t^k / (k! (k+1)!),  t = z^2/4,
 * so the factor z/2 cancels and the ratio is the quotient of the two sums. */
gsl_complex cxl__bessel_i_ratio_series(gsl_complex z)
{
    gsl_complex t = gsl_complex_mul_real(gsl_complex_mul(z, z), 0.25);
    gsl_complex s0 = gsl_complex_rect(1.0, 0.0), s1 = s0;
    gsl_complex term0 = s0, term1 = s0; /* t^k/(k!)^2 and t^k/(k!(k+1)!) */
    for (int k = 1; k < SERIES_MAX_TERMS; k++) {
        term0 = gsl_complex_mul_real(gsl_complex_mul(term0, t), 1.0 / ((double)k * k));
        term1 = gsl_complex_mul_real(gsl_complex_mul(term1, t), 1.0 / ((double)k * (k + 1)));
        s0 = gsl_complex_add(s0, term0);
        s1 = gsl_complex_add(s1, term1);
        if (gsl_complex_abs(term0) <= 1e-17 * gsl_complex_abs(s0) &&
            gsl_complex_abs(term1) <= 1e-17 * gsl_complex_abs(s1))
            break;
    }
    return gsl_complex_div(s0, s1);
}

/* z K0(z) / K1(z) from the ascending series, t = z^2/4, H_k = 1 + ... + 1/k:
 *   K0(z) = -(ln(z/2) + gamma) I0(z) + sum_{k>=1} H_k t^k / (k!)^2      (A&S 9.6.13)
 *   K1(z) = 1/z + ln(z/2) I1(z)
 *           - (z/4) sum_{k>=0} [psi(k+1) + psi(k+2)] t^k / (k! (k+1)!)   (A&S 9.6.11, n = 1)
 * with psi(k+1) = -gamma + H_k (A&S 6.3.2), so the bracket is
 * H_k + H_{k+1} - 2 gamma.  z K1(z) is summed directly, so no 1/z appears. */
gsl_complex cxl__bessel_k_ratio_series(gsl_complex z)
{
    gsl_complex t = gsl_complex_mul_real(gsl_complex_mul(z, z), 0.25);
    gsl_complex lnz2 = gsl_complex_log(gsl_complex_mul_real(z, 0.5));
    gsl_complex i0 = gsl_complex_rect(1.0, 0.0); /* sum t^k/(k!)^2 = I0 */
    gsl_complex i1s = i0;                        /* sum t^k/(k!(k+1)!) = 2 I1 / z */
    gsl_complex h0 = gsl_complex_rect(0.0, 0.0); /* sum H_k t^k/(k!)^2 */
    gsl_complex p1 = gsl_complex_rect(1.0 - 2.0 * EULER_GAMMA, 0.0); /* k = 0: H_0 + H_1 - 2 gamma */
    gsl_complex term0 = i0, term1 = i0;
    double hk = 0.0;
    for (int k = 1; k < SERIES_MAX_TERMS; k++) {
        term0 = gsl_complex_mul_real(gsl_complex_mul(term0, t), 1.0 / ((double)k * k));
        term1 = gsl_complex_mul_real(gsl_complex_mul(term1, t), 1.0 / ((double)k * (k + 1)));
        hk += 1.0 / k;
        double hk1 = hk + 1.0 / (k + 1);
        i0 = gsl_complex_add(i0, term0);
        i1s = gsl_complex_add(i1s, term1);
        h0 = gsl_complex_add(h0, gsl_complex_mul_real(term0, hk));
        p1 = gsl_complex_add(p1, gsl_complex_mul_real(term1, hk + hk1 - 2.0 * EULER_GAMMA));
        if (gsl_complex_abs(term0) * (hk1 + 1.0) <= 1e-17 * gsl_complex_abs(i0) &&
            gsl_complex_abs(term1) * (hk1 + 1.0) <= 1e-17 * gsl_complex_abs(i1s))
            break;
    }
    /* K0 = -(ln(z/2) + gamma) I0 + h0 */
    gsl_complex k0 = gsl_complex_sub(h0, gsl_complex_mul(gsl_complex_add_real(lnz2, EULER_GAMMA), i0));
    /* z K1 = 1 + ln(z/2) z I1 - (z^2/4) p1, with z I1 = (z^2/2) i1s = 2 t i1s */
    gsl_complex zi1 = gsl_complex_mul_real(gsl_complex_mul(t, i1s), 2.0);
    gsl_complex zk1 = gsl_complex_add_real(
        gsl_complex_sub(gsl_complex_mul(lnz2, zi1), gsl_complex_mul(t, p1)), 1.0);
    return gsl_complex_div(gsl_complex_mul(gsl_complex_mul(z, z), k0), zk1);
}

/* The bracketed series of A&S 9.7.1 (sign = -1) and 9.7.2 (sign = +1) for
 * order nu, mu = 4 nu^2:
 *   1 + sign (mu - 1)/(8z) + (mu - 1)(mu - 9)/(2! (8z)^2) + sign ...
 * summed while the terms decrease (the series diverges; its error is below
 * the first term left out). */
static gsl_complex asympt_bracket(gsl_complex z, int nu, double sign)
{
    double mu = 4.0 * nu * nu;
    gsl_complex inv8z = gsl_complex_inverse(gsl_complex_mul_real(z, 8.0));
    gsl_complex sum = gsl_complex_rect(1.0, 0.0), term = sum;
    double last = 1.0;
    for (int k = 1; k < SERIES_MAX_TERMS; k++) {
        double odd = 2.0 * k - 1.0;
        gsl_complex next = gsl_complex_mul_real(gsl_complex_mul(term, inv8z),
                                                sign * (mu - odd * odd) / k);
        double mag = gsl_complex_abs(next);
        if (mag >= last) break;      /* smallest term reached */
        term = next;
        sum = gsl_complex_add(sum, term);
        last = mag;
        if (mag <= 1e-17) break;
    }
    return sum;
}

/* z I0 / (2 I1): the common factor e^z / sqrt(2 pi z) of 9.7.1 cancels. */
gsl_complex cxl__bessel_i_ratio_asympt(gsl_complex z)
{
    gsl_complex r = gsl_complex_div(asympt_bracket(z, 0, -1.0), asympt_bracket(z, 1, -1.0));
    return gsl_complex_mul(gsl_complex_mul_real(z, 0.5), r);
}

/* z K0 / K1: the common factor sqrt(pi/(2z)) e^-z of 9.7.2 cancels. */
gsl_complex cxl__bessel_k_ratio_asympt(gsl_complex z)
{
    gsl_complex r = gsl_complex_div(asympt_bracket(z, 0, 1.0), asympt_bracket(z, 1, 1.0));
    return gsl_complex_mul(z, r);
}

gsl_complex cxl__bessel_i_ratio(gsl_complex z)
{
    return gsl_complex_abs(z) < CXL__BESSEL_I_ASYMPT_MIN ? cxl__bessel_i_ratio_series(z)
                                                         : cxl__bessel_i_ratio_asympt(z);
}

gsl_complex cxl__bessel_k_ratio(gsl_complex z)
{
    return gsl_complex_abs(z) < CXL__BESSEL_K_ASYMPT_MIN ? cxl__bessel_k_ratio_series(z)
                                                         : cxl__bessel_k_ratio_asympt(z);
}
