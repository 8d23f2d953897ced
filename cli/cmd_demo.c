/* cmd_demo.c - coaxline demo: a worked bench scenario, computed live with
 * the library.  The site, the spool and every number in it are invented
 * for the demonstration. */
#include <config.h>
#include <stdio.h>
#include "cli.h"

static const cli_optdef demo_opts[] = { { NULL, NULL, NULL, 0 } };

/* The invented scenario. */
#define SITE "Heronmere Flats, an imaginary receive site on reclaimed marsh"
#define STAGGER_M 18.0          /* along-axis offset of the rear element */
#define SPOOL_VF 0.83           /* drum of foam 75-ohm cable, as measured */
#define NOMINAL_VF 0.85         /* printed on the drum label */
#define FEED_M 61.5             /* each element's run back to the hut */
#define ALLOWANCE_M 0.12        /* two connectors and a barrel, cable-equivalent */
#define DESIGN_HZ 1.83e6

static int demo_run(cli_ctx *ctx, const cli_args *a)
{
    (void)a;
    FILE *o = ctx->out;
    char b1[96], b2[96];
    double delay_s, cut_m, cut_nominal_m, qw_hz, deg;

    fprintf(o, "coaxline demo: %s\n\n", SITE);
    fprintf(o, "Two wire elements for 160 m are staggered %s m along the line to the\n"
               "wanted direction.  The front element's feed must be delayed by the time a\n"
               "wave takes to cross that offset in free space (crossfire feed: that delay\n"
               "plus a polarity flip at the combiner).\n\n",
            cli_fmt(b1, sizeof b1, STAGGER_M, 1));

    if (cxl_line_delay_from_offset(STAGGER_M, &delay_s) != CXL_OK ||
        cxl_line_cut_length(delay_s, SPOOL_VF, ALLOWANCE_M, SPOOL_VF, &cut_m) != CXL_OK ||
        cxl_line_cut_length(delay_s, NOMINAL_VF, ALLOWANCE_M, NOMINAL_VF, &cut_nominal_m) != CXL_OK ||
        cxl_line_quarter_wave_freq(cut_m, SPOOL_VF, &qw_hz) != CXL_OK ||
        cxl_line_degrees_from_delay(delay_s, DESIGN_HZ, &deg) != CXL_OK)
        return cli_error(ctx, NULL, NULL, "demo computation failed");

    fprintf(o, "1. Delay line\n");
    fprintf(o, "   delay the offset makes       %s ns (%s deg at %s MHz)\n",
            cli_fmt(b1, sizeof b1, delay_s * 1e9, 3), cli_fmt(b2, sizeof b2, deg, 2), "1.83");
    fprintf(o, "   spool VF (measured)          %s, drum label says %s\n",
            cli_fmt(b1, sizeof b1, SPOOL_VF, 2), cli_fmt(b2, sizeof b2, NOMINAL_VF, 2));
    fprintf(o, "   connectors and barrel        %s cable-equivalent\n",
            cli_fmt_length(ctx, b1, sizeof b1, ALLOWANCE_M));
    fprintf(o, "   cut length                   %s\n", cli_fmt_length(ctx, b1, sizeof b1, cut_m));
    fprintf(o, "   had we trusted the label     %s (%s mm too long)\n",
            cli_fmt_length(ctx, b1, sizeof b1, cut_nominal_m),
            cli_fmt(b2, sizeof b2, (cut_nominal_m - cut_m) * 1000.0, 0));
    fprintf(o, "   analyzer check, far end open %s MHz before connectors\n\n",
            cli_fmt(b1, sizeof b1, qw_hz / 1e6, 4));

    fprintf(o, "   same with the command line:\n"
               "   coaxline cut --offset 18m --vf 0.83 --allowance 0.12m --freq 1.83MHz\n\n");

    fprintf(o, "2. Feed lines: both elements come back to the hut on %s m runs cut from the\n"
               "   same drum, so their delays cancel; only their difference matters.\n",
            cli_fmt(b1, sizeof b1, FEED_M, 1));
    return CLI_EXIT_OK;
}

const cli_command cli_cmd_demo = {
    .name = "demo",
    .summary = "a worked scenario at an imaginary receive site",
    .synopsis = "",
    .opts = demo_opts,
    .run = demo_run,
    .batch = 0,
};
