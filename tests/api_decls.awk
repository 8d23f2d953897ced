# api_decls.awk - the declarations of a C header, one a line: comments and
# preprocessor lines removed, each declaration ended by its ';'.  Shared by
# tests/api_sets.sh and tests/api_order.sh.
BEGIN { RS = "\001" }
{
    s = $0; out = ""
    while ((i = index(s, "/*")) > 0) {
        out = out substr(s, 1, i - 1) " "; s = substr(s, i + 2)
        j = index(s, "*/"); if (j == 0) { s = ""; break }
        s = substr(s, j + 2)
    }
    n = split(out s, line, "\n"); t = ""
    for (k = 1; k <= n; k++) if (line[k] !~ /^[ \t]*#/) t = t " " line[k]
    m = split(t, decl, ";")
    for (k = 1; k <= m; k++) print decl[k]
}
