/* line.c - delay, physical length and electrical degrees of a line.
 *
 * v = VF * c (phase velocity on the line); delay = L / v;
 * degrees = 360 f L / v.  A free-space offset d delays a wave by d / c.
 * Arguments are finite, but a product of huge ones (or a quotient by a
 * tiny one) need not be: such results are CXL_ERANGE, never infinity.
 */
#include <config.h>
#include <math.h>
#include "coaxline.h"
#include "internal.h"

cxl_status cxl_line_delay_from_length(double length_m, double vf,
                                      double *delay_s)
{
    if (!delay_s || !cxl__finite_nonneg(length_m) || !cxl__valid_vf(vf))
        return CXL_EINVAL;
    return cxl__put_finite(length_m / (vf * CXL_C_M_PER_S), delay_s);
}

cxl_status cxl_line_length_from_delay(double delay_s, double vf,
                                      double *length_m)
{
    if (!length_m || !cxl__finite_nonneg(delay_s) || !cxl__valid_vf(vf))
        return CXL_EINVAL;
    return cxl__put_finite(delay_s * vf * CXL_C_M_PER_S, length_m);
}

cxl_status cxl_line_degrees_from_length(double length_m, double vf,
                                        double freq_hz, double *phase_deg)
{
    if (!phase_deg || !isfinite(length_m) || !cxl__valid_vf(vf) ||
        !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    return cxl__put_finite(360.0 * freq_hz * length_m / (vf * CXL_C_M_PER_S), phase_deg);
}

cxl_status cxl_line_length_from_degrees(double phase_deg, double vf,
                                        double freq_hz, double *length_m)
{
    if (!length_m || !isfinite(phase_deg) || !cxl__valid_vf(vf) ||
        !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    return cxl__put_finite(phase_deg / 360.0 * vf * CXL_C_M_PER_S / freq_hz, length_m);
}

cxl_status cxl_line_degrees_from_delay(double delay_s, double freq_hz,
                                       double *phase_deg)
{
    if (!phase_deg || !isfinite(delay_s) || !cxl__finite_pos(freq_hz))
        return CXL_EINVAL;
    return cxl__put_finite(360.0 * freq_hz * delay_s, phase_deg);
}

cxl_status cxl_line_delay_from_offset(double offset_m, double *delay_s)
{
    if (!delay_s || !isfinite(offset_m))
        return CXL_EINVAL;
    return cxl__put_finite(offset_m / CXL_C_M_PER_S, delay_s);
}

cxl_status cxl_line_cut_length(double delay_s, double vf,
                               double allowance_m, double allowance_vf,
                               double *cut_length_m)
{
    if (!cut_length_m || !cxl__finite_pos(delay_s) || !cxl__valid_vf(vf) ||
        !cxl__finite_nonneg(allowance_m))
        return CXL_EINVAL;
    if (allowance_m > 0.0 && !cxl__valid_vf(allowance_vf))
        return CXL_EINVAL;
    double cable_delay_s = delay_s;
    if (allowance_m > 0.0)
        cable_delay_s -= allowance_m / (allowance_vf * CXL_C_M_PER_S);
    if (!(cable_delay_s > 0.0))
        return CXL_ERANGE;
    return cxl__put_finite(cable_delay_s * vf * CXL_C_M_PER_S, cut_length_m);
}

cxl_status cxl_line_quarter_wave_freq(double length_m, double vf,
                                      double *freq_hz)
{
    if (!freq_hz || !cxl__finite_pos(length_m) || !cxl__valid_vf(vf))
        return CXL_EINVAL;
    return cxl__put_finite(vf * CXL_C_M_PER_S / (4.0 * length_m), freq_hz);
}
