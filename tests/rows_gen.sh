#!/bin/sh
# rows_gen.sh - write an N-row batch CSV of vf, trim or loss for the
# allocation test (tests/alloc_rows.sh) and the byte comparison
# (tests/bench/same_bytes_rows.sh).  The values are invented, varied from
# row to row; with "bad" every 97th row is refused (an unknown end, cable
# or a unit-less length), so error rows sit between good ones.
# usage: rows_gen.sh vf|trim|loss N [bad]
mode=$1 n=$2 bad=${3:-}
awk -v mode="$mode" -v n="$n" -v bad="$bad" 'BEGIN {
    if (mode == "vf") {
        print "label,length,end,resonance,fixture,fixture-vf,freq-step"
        for (i = 1; i <= n; i++) {
            len = 10 + (i % 50) * 0.1; f1 = 0.66 * 299.792458 / (4 * len)
            end = i % 2 ? "open" : "short"; if (bad && i % 97 == 0) end = "closed"
            if (end == "short") f1 = 2 * f1
            if (i % 2) r = sprintf("%.4fMHz;%.4fMHz;%.4fMHz", f1, 3 * f1, 5 * f1)
            else r = sprintf("1:%.4fMHz;2:%.4fMHz;3:%.4fMHz", f1, 2 * f1, 3 * f1)
            printf "row %d,%.2fm,%s,%s,%s,%s,1kHz\n", i, len, end, r, i % 3 ? "" : "0.1m", i % 3 ? "" : "0.7"
        }
    } else if (mode == "trim") {
        print "label,length,end,resonance,order,resolution,degrees,freq,delay"
        for (i = 1; i <= n; i++) {
            len = 30 + (i % 40) * 0.05; f1 = 0.66 * 299.792458 / (4 * len)
            lt = sprintf("%.2fm", len); if (bad && i % 97 == 0) lt = sprintf("%.2f", len) "furlong"
            r = sprintf("%.4fMHz;%.4fMHz", f1, 3 * f1)
            if (i % 2) printf "piece %d,%s,open,%s,1;2,1kHz,90,%.3fMHz,\n", i, lt, r, f1 * 1.05
            else printf "piece %d,%s,open,%s,,,,,%dns\n", i, lt, r, 90 + i % 20
        }
    } else {
        print "label,cable,length,band,freq,swr,model"
        split("RG-58,RG-213,RG-11-foam,RG-6-foam", cab, ",")
        for (i = 1; i <= n; i++) {
            c = cab[1 + i % 4]; if (bad && i % 97 == 0) c = "RG-999"
            printf "run %d,%s,%dm,%s,,%.1f,\n", i, c, 10 + i % 90, i % 2 ? "80m" : "160m", 1 + (i % 5) * 0.5
        }
    }
}'
