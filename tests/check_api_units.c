/* check_api_units.c - the walk's adapters for units.c and line.c (see check_api.c). */
#include <config.h>
#include "check_api.h"

/* units.c: a parse sets the value, or leaves it and sets the position */
#define PARSE_ADAPTER(name, call)                                            \
    ADAPTER(name)                                                            \
    {                                                                        \
        (void)a;                                                             \
        size_t pos = (size_t)SENT;                                           \
        cxl_status st = call;                                                \
        o[1] = (double)pos == SENT ? SENT : 0.0;                             \
        return st;                                                           \
    }
PARSE_ADAPTER(parse_number, cxl_units_parse_number(P(0, " -12.5e1 "), P(1, &o[0]), P(2, &pos)))
PARSE_ADAPTER(parse_length, cxl_units_parse_length(P(0, "41' 6 3/8\""), (cxl_units)to_int(a[0]),
                                                   P(1, &o[0]), P(2, &pos)))
PARSE_ADAPTER(parse_freq, cxl_units_parse_freq(P(0, "1830kHz"), P(1, &o[0]), P(2, &pos)))
PARSE_ADAPTER(parse_time, cxl_units_parse_time(P(0, "33.4ns"), P(1, &o[0]), P(2, &pos)))

/* a[size_arg] is the buffer size given (the buffer holds 600) */
#define FORMAT_ADAPTER(name, size_arg, call)                                 \
    ADAPTER(name)                                                            \
    {                                                                        \
        char buf[600];                                                       \
        memset(buf, 'Z', sizeof buf);                                        \
        size_t size = to_size(a[size_arg]);                                  \
        cxl_status st = call;                                                \
        o[0] = text_out(buf, size, sizeof buf);                              \
        return st;                                                           \
    }
FORMAT_ADAPTER(format_fixed, 2, cxl_units_format_fixed(a[0], to_int(a[1]), P(0, buf), size))
FORMAT_ADAPTER(format_roundtrip, 1, cxl_units_format_roundtrip(a[0], P(0, buf), size))
FORMAT_ADAPTER(format_imperial, 1, cxl_units_format_imperial(a[0], P(0, buf), size))


/* line.c */
ADAPTER(delay_from_length) { return cxl_line_delay_from_length(a[0], a[1], P(0, &o[0])); }
ADAPTER(length_from_delay) { return cxl_line_length_from_delay(a[0], a[1], P(0, &o[0])); }
ADAPTER(degrees_from_length)
{
    return cxl_line_degrees_from_length(a[0], a[1], a[2], P(0, &o[0]));
}
ADAPTER(length_from_degrees)
{
    return cxl_line_length_from_degrees(a[0], a[1], a[2], P(0, &o[0]));
}
ADAPTER(degrees_from_delay) { return cxl_line_degrees_from_delay(a[0], a[1], P(0, &o[0])); }
ADAPTER(delay_from_offset) { return cxl_line_delay_from_offset(a[0], P(0, &o[0])); }
ADAPTER(cut_length) { return cxl_line_cut_length(a[0], a[1], a[2], a[3], P(0, &o[0])); }
ADAPTER(quarter_wave) { return cxl_line_quarter_wave_freq(a[0], a[1], P(0, &o[0])); }
