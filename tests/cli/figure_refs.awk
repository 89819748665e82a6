# tests/cli/figure_refs.awk (used by render_report.sh)
# Per inline figure of an HTML page, as a browser resolves references: a reference "#id" names
# the first element of the document with that id, which must lie in the same <svg> as the
# reference (otherwise the figure is drawn with another figure's glyphs); every figure draws
# text (at least one reference).
{
  line = $0
  while (match(line, /<svg[ >]|id="[^"]*"|href="#[^"]*"/)) {
    tok = substr(line, RSTART, RLENGTH)
    line = substr(line, RSTART + RLENGTH)
    if (tok ~ /^<svg/) { fig++; continue }
    if (tok ~ /^id=/) { id = substr(tok, 5, length(tok) - 5); if (!(id in first)) first[id] = fig }
    else { id = substr(tok, 8, length(tok) - 8); nref++; ref[nref] = id; reff[nref] = fig; uses[fig]++ }
  }
}
END {
  bad = 0
  for (i = 1; i <= nref; i++) {
    if (!(ref[i] in first) || first[ref[i]] != reff[i]) {
      bad++
      if (bad <= 3) printf "figure %d: #%s resolves %s\n", reff[i], ref[i], (ref[i] in first) ? "into figure " first[ref[i]] : "to nothing"
    }
  }
  for (f = 1; f <= fig; f++) if (uses[f] == 0) { bad++; printf "figure %d: no text drawn\n", f }
  printf "%d figures, %d references, %d problems\n", fig, nref, bad
  exit bad > 0
}
