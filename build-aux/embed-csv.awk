# embed-csv.awk - turn a data file into a C string constant, byte for byte.
# Usage: LC_ALL=C awk -v name=bands -f embed-csv.awk data/bands.csv > data-bands.c
BEGIN {
    for (i = 1; i < 256; i++) ord[sprintf("%c", i)] = i
    printf "/* Generated from the data file by embed-csv.awk; do not edit. */\n"
    printf "#include <stddef.h>\n"
    printf "extern const char cxl__data_%s[];\n", name
    printf "extern const size_t cxl__data_%s_size;\n", name
    printf "const char cxl__data_%s[] =\n", name
}
{
    out = ""
    n = length($0)
    for (i = 1; i <= n; i++) {
        ch = substr($0, i, 1)
        if (ch == "\\") out = out "\\\\"
        else if (ch == "\"") out = out "\\\""
        else if (ord[ch] < 32 || ord[ch] > 126) out = out sprintf("\\%03o", ord[ch])
        else out = out ch
    }
    printf "    \"%s\\n\"\n", out
}
END {
    printf "    \"\";\n"
    printf "const size_t cxl__data_%s_size = sizeof cxl__data_%s - 1;\n", name, name
}
