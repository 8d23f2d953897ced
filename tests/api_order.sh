#!/bin/sh
# One argument order for the same quantities in lib/coaxline.h (the rule is
# written at the top of the header and in DEVELOPERS.md):
#   the handle; the quantity the function converts or judges; the line
#   (its Z0 and VF); the frequency and the direction; what is at the line's
#   ends and how well the inputs are known; then the outputs.
# Each parameter named in the table below has its rank; a prototype whose
# ranked parameters are not in rising order fails, so two doubles swapped
# in a new function (vf before a length, a frequency before a vf) cannot
# slip in.  Outputs (non-const pointers other than the leading handle)
# must come after every ranked input.  Names not in the table are not
# ranked: add a name here when a new function brings one of these roles.
hdr="${COAXLINE_SRCDIR:-.}/lib/coaxline.h"
[ -f "$hdr" ] || { echo "FAIL: $hdr not found"; echo "0 passed, 1 failed"; exit 1; }

# rank  names (exact parameter names)
table='
1 length_m lengths_m reference_m length_a_m length_b_m delay_s offset_m design_delay_s built_delay_s
1 phase_deg phase_error_deg reference_deg reference_freq_hz tolerance_deg extra_phase_deg depth_db ratio_db
2 z0_ohm z0_re_ohm z0_im_ohm alpha_np_per_m beta_rad_per_m vf
3 freq_hz azimuth_deg elevation_deg
4 fixture_m fixture_vf fixture_tol_m allowance_m allowance_vf length_tol_m vf_tol load_re_ohm load_im_ohm
'

# One prototype a line: comments and preprocessor lines removed, joined.
protos=$(awk -f "${COAXLINE_SRCDIR:-.}/tests/api_decls.awk" "$hdr" |
    sed 's/[[:space:]][[:space:]]*/ /g' |
    awk '/cxl_[a-z][a-z0-9_]* ?\(/ && !/typedef/')

result=$(printf '%s\n' "$protos" | awk -v table="$table" '
BEGIN {
    n = split(table, rows, "\n")
    for (i = 1; i <= n; i++) {
        m = split(rows[i], w, " ")
        for (k = 2; k <= m; k++) rank[w[k]] = w[1]
    }
    fail = 0; checked = 0
}
{
    name = $0; sub(/ ?\(.*/, "", name); sub(/.* \**/, "", name)
    args = $0; sub(/^[^(]*\(/, "", args); sub(/\)[^)]*$/, "", args)
    np = split(args, p, ",")
    best = 0; bestname = ""; firstout = ""; ranked = 0
    for (k = 1; k <= np; k++) {
        a = p[k]; gsub(/^ +| +$/, "", a)
        pn = a; sub(/.*[ *]/, "", pn); sub(/\[.*/, "", pn)
        isout = (a ~ /\*/ && a !~ /^const /)
        if (isout && k == 1 && a ~ /^cxl_/) isout = 0   # the handle
        if (isout) { if (firstout == "") firstout = pn; continue }
        if (!(pn in rank)) continue
        ranked++
        if (firstout != "") {
            printf "FAIL: %s: input %s comes after the output %s\n", name, pn, firstout
            fail++
        }
        if (rank[pn] < best) {
            printf "FAIL: %s: %s (rank %d) comes after %s (rank %d)\n", name, pn, rank[pn], bestname, best
            fail++
        }
        if (rank[pn] >= best) { best = rank[pn]; bestname = pn }
    }
    if (ranked > 0) checked++
}
END {
    printf "functions with ranked parameters: %d\n", checked
    if (checked < 40) { printf "FAIL: only %d functions ranked: is the header parsed?\n", checked; fail++ }
    printf "%d failed\n", fail
}')
echo "$result"
case "$result" in *FAIL:*) exit 1 ;; esac
exit 0
