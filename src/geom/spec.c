/* src/geom/spec.c
 * Generator specs on the command line: "naca2412", "naca0012c" (closed trailing edge),
 * "naca23012", and "plate:t=3,f=4,xf=50,nose=1,taper=20,te=0" (percent of chord; nose in
 * thicknesses; keys may be given in any order and omitted ones take the defaults).
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

/* Points per surface used by the generators before repanelling. */
#define SPEC_POINTS_PER_SIDE 201

int ascr_geom_is_spec(const char *text)
{
  if (text == NULL) return 0;
  if (strncmp(text, "naca", 4) == 0 || strncmp(text, "NACA", 4) == 0) {
    return isdigit((unsigned char)text[4]) != 0;
  }
  return strncmp(text, "plate:", 6) == 0 || strcmp(text, "plate") == 0;
}

static ascr_status parse_plate(const char *spec, ascr_geom_section **out, ascr_errbuf *err)
{
  ascr_geom_plate_params p = ascr_geom_plate_defaults();
  const char *q = spec + 5;
  if (*q == ':') q++;
  char key[16];
  unsigned seen = 0; /* keys given so far, one bit each */
  while (*q != '\0') {
    size_t kl = 0;
    while (*q != '\0' && *q != '=' && *q != ',' && kl + 1 < sizeof key) key[kl++] = *q++;
    key[kl] = '\0';
    if (*q != '=') {
      return core_fail(err, ASCR_EPARSE, "section spec '%s': expected key=value at '%s'", spec,
                       key);
    }
    q++;
    char *end = NULL;
    errno = 0;
    double v = strtod(q, &end);
    if (end == q || (*end != ',' && *end != '\0') || !isfinite(v)) {
      return core_fail(err, ASCR_EPARSE, "section spec '%s': value of '%s' is not a number", spec,
                       key);
    }
    q = end;
    if (*q == ',') q++;
    static const char *const keys[6] = {"t", "f", "xf", "nose", "taper", "te"};
    int which = -1;
    for (int k = 0; k < 6; k++) {
      if (strcmp(key, keys[k]) == 0) which = k;
    }
    if (which < 0) {
      return core_fail(err, ASCR_EPARSE,
                       "section spec '%s': unknown key '%s' (known: t, f, xf, nose, taper, te)",
                       spec, key);
    }
    if (seen & (1u << which)) {
      return core_fail(err, ASCR_EPARSE, "section spec '%s': key '%s' given twice", spec, key);
    }
    seen |= 1u << which;
    switch (which) {
    case 0: p.thickness = v / 100.0; break;
    case 1: p.camber = v / 100.0; break;
    case 2: p.camber_pos = v / 100.0; break;
    case 3: p.nose_length = v; break;
    case 4: p.taper_length = v / 100.0; break;
    default: p.te_thickness = v / 100.0; break;
    }
  }
  ascr_status st = ascr_geom_plate(&p, SPEC_POINTS_PER_SIDE, out, err);
  if (st == ASCR_OK) {
    ascr_geom_section *s = *out;
    snprintf(s->name, sizeof s->name, "%s", spec);
  }
  return st;
}

ascr_status ascr_geom_section_from_spec(const char *spec, ascr_geom_section **out,
                                        ascr_errbuf *err)
{
  if (out == NULL || spec == NULL) {
    return core_fail(err, ASCR_EINVAL, "section spec: NULL argument");
  }
  *out = NULL;
  if (!ascr_geom_is_spec(spec)) {
    return core_fail(err, ASCR_EPARSE,
                     "'%s' is not a section spec (naca2412, naca23012, naca0012c, plate:t=3,f=4,xf=50)",
                     spec);
  }
  if (spec[0] == 'p') {
    return parse_plate(spec, out, err);
  }
  char digits[16];
  size_t nd = strlen(spec + 4);
  int closed = 0;
  if (nd > 0 && (spec[4 + nd - 1] == 'c' || spec[4 + nd - 1] == 'C')) {
    closed = 1;
    nd--;
  }
  if (nd >= sizeof digits) {
    return core_fail(err, ASCR_EPARSE, "section spec '%s': designation too long", spec);
  }
  memcpy(digits, spec + 4, nd);
  digits[nd] = '\0';
  return ascr_geom_naca(digits, closed, SPEC_POINTS_PER_SIDE, out, err);
}

ascr_status ascr_geom_section_open(const char *source, ascr_geom_section **out, ascr_errbuf *err)
{
  if (source == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "section: no source given");
  }
  struct stat sb;
  if (stat(source, &sb) == 0) {
    if (S_ISDIR(sb.st_mode)) {
      return core_fail(err, ASCR_EIO, "%s: is a folder, not a section file", source);
    }
    return ascr_geom_section_read(source, out, NULL, err);
  }
  if (ascr_geom_is_spec(source)) {
    return ascr_geom_section_from_spec(source, out, err);
  }
  return core_fail(err, ASCR_EINVAL,
                   "%s: no such file, and not a section spec (naca2412, naca23012, naca0012c, "
                   "plate:t=3,f=4,xf=50)", source);
}
