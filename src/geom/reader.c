/* src/geom/reader.c
 * Reader for plain x-y coordinate files (format: docs/file-formats.md).
 *
 * Lines: blank lines and lines whose first non-blank character is '#' are skipped; a '#'
 * after data starts a comment. The first other line may be a title (any text that is not two
 * numbers). Every further line holds exactly two numbers, x and y, separated by blanks, tabs
 * or a comma. An optional first data row of two whole numbers n1 n2 with n1 + n2 equal to the
 * number of rows that follow is read as the point counts of two surfaces. Every rejected line
 * is reported with its 1-based line number and the offending field.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Files larger than this are refused before parsing (a coordinate file of 1e6 points is
 * about 40 MB). */
#define READER_MAX_BYTES ((size_t)256 * 1024 * 1024)

typedef struct pointbuf {
  double *x, *y;
  long *line;
  size_t n, cap;
} pointbuf;

static int pb_push(pointbuf *pb, double x, double y, long line)
{
  if (pb->n == pb->cap) {
    size_t cap = pb->cap ? 2 * pb->cap : 256;
    double *nx = realloc(pb->x, cap * sizeof *nx);
    if (nx == NULL) return -1;
    pb->x = nx;
    double *ny = realloc(pb->y, cap * sizeof *ny);
    if (ny == NULL) return -1;
    pb->y = ny;
    long *nl = realloc(pb->line, cap * sizeof *nl);
    if (nl == NULL) return -1;
    pb->line = nl;
    pb->cap = cap;
  }
  pb->x[pb->n] = x;
  pb->y[pb->n] = y;
  pb->line[pb->n] = line;
  pb->n++;
  return 0;
}

static void pb_free(pointbuf *pb)
{
  free(pb->x);
  free(pb->y);
  free(pb->line);
}

/* Split a line (NUL-terminated, comment removed) into at most 8 fields. */
static int split_fields(char *s, char **f, int maxf)
{
  int nf = 0;
  char *p = s;
  while (*p != '\0') {
    while (*p == ' ' || *p == '\t' || *p == ',' || *p == '\r' || *p == ';') {
      p++;
    }
    if (*p == '\0') break;
    if (nf < maxf) f[nf] = p;
    nf++;
    while (*p != '\0' && *p != ' ' && *p != '\t' && *p != ',' && *p != '\r' && *p != ';') {
      p++;
    }
    if (*p != '\0') {
      *p++ = '\0';
    }
  }
  return nf;
}

/* 0 ok, 1 not a number, 2 non-finite */
static int parse_num(const char *s, double *v)
{
  char *end = NULL;
  errno = 0;
  double d = strtod(s, &end);
  if (end == s || *end != '\0') return 1;
  if (!isfinite(d) || errno == ERANGE) {
    /* ERANGE with a tiny result (underflow) is harmless */
    if (errno == ERANGE && isfinite(d) && fabs(d) < 1.0) {
      *v = d;
      return 0;
    }
    return 2;
  }
  *v = d;
  return 0;
}

ascr_status ascr_geom_section_parse(const char *text, size_t len, const char *name,
                                    ascr_geom_section **out, ascr_geom_load_info *info,
                                    ascr_errbuf *err)
{
  const char *src = name != NULL ? name : "input";
  if (out == NULL) {
    return core_fail(err, ASCR_EINVAL, "%s: NULL output pointer", src);
  }
  *out = NULL;
  if (text == NULL && len > 0) {
    return core_fail(err, ASCR_EINVAL, "%s: NULL text", src);
  }
  if (memchr(text != NULL ? text : "", '\0', len) != NULL) {
    const char *z = memchr(text, '\0', len);
    long ln = 1;
    for (const char *p = text; p < z; p++) ln += (*p == '\n');
    return core_fail(err, ASCR_EPARSE, "%s:%ld: binary data (a NUL byte); expected a text file "
                     "of x y coordinates", src, ln);
  }
  char title[sizeof(((ascr_geom_load_info *)0)->title)] = "";
  pointbuf pb = {0};
  ascr_status st = ASCR_OK;
  char *buf = NULL;
  size_t bufcap = 0;
  long lineno = 0;
  int seen_content = 0;
  size_t pos = 0;
  while (pos < len) {
    size_t e = pos;
    while (e < len && text[e] != '\n') e++;
    size_t ll = e - pos;
    lineno++;
    if (ll + 1 > bufcap) {
      size_t nc = ll + 64;
      char *nb = realloc(buf, nc);
      if (nb == NULL) {
        st = core_fail(err, ASCR_ENOMEM, "%s:%ld: out of memory", src, lineno);
        goto fail;
      }
      buf = nb;
      bufcap = nc;
    }
    memcpy(buf, text + pos, ll);
    buf[ll] = '\0';
    pos = e + 1;
    char *hash = strchr(buf, '#');
    if (hash != NULL) *hash = '\0';
    char *f[8];
    int nf = split_fields(buf, f, 8);
    if (nf == 0) continue;
    double vx = 0.0, vy = 0.0;
    int rx = parse_num(f[0], &vx);
    int ry = nf >= 2 ? parse_num(f[1], &vy) : 1;
    if (!seen_content) {
      seen_content = 1;
      if (nf != 2 || rx == 1 || ry == 1) {
        /* a title line: keep the raw text without the line break */
        size_t tl = ll < sizeof title - 1 ? ll : sizeof title - 1;
        memcpy(title, text + (pos - ll - 1), tl);
        title[tl] = '\0';
        while (tl > 0 && (title[tl - 1] == '\r' || isspace((unsigned char)title[tl - 1]))) {
          title[--tl] = '\0';
        }
        continue;
      }
    }
    if (nf != 2) {
      st = core_fail(err, ASCR_EPARSE,
                     "%s:%ld: expected two numbers (x y), found %d field%s", src, lineno, nf,
                     nf == 1 ? "" : "s");
      goto fail;
    }
    if (rx != 0) {
      st = core_fail(err, ASCR_EPARSE, "%s:%ld: field x: %s value '%.40s'", src, lineno,
                     rx == 2 ? "non-finite" : "non-numeric", f[0]);
      goto fail;
    }
    if (ry != 0) {
      st = core_fail(err, ASCR_EPARSE, "%s:%ld: field y: %s value '%.40s'", src, lineno,
                     ry == 2 ? "non-finite" : "non-numeric", f[1]);
      goto fail;
    }
    if (pb_push(&pb, vx, vy, lineno) != 0) {
      st = core_fail(err, ASCR_ENOMEM, "%s:%ld: out of memory", src, lineno);
      goto fail;
    }
  }
  size_t split = 0;
  const double *px = pb.x, *py = pb.y;
  const long *pl = pb.line;
  size_t np = pb.n;
  if (np >= 1) {
    double a = pb.x[0], b = pb.y[0];
    if (a >= 2 && b >= 2 && a == floor(a) && b == floor(b) && a + b == (double)(np - 1)) {
      split = (size_t)a;
      px++; py++; pl++; np--;
    }
  }
  if (np == 0) {
    st = core_fail(err, ASCR_EGEOM, "%s: no coordinate rows found", src);
    goto fail;
  }
  if (info != NULL) {
    memset(info, 0, sizeof *info);
    memcpy(info->title, title, sizeof title);
  }
  const char *nm = title[0] != '\0' ? title : src;
  st = geom_build(px, py, pl, np, split, src, nm, out, info, err);
fail:
  free(buf);
  pb_free(&pb);
  return st;
}

ascr_status ascr_geom_section_read(const char *path, ascr_geom_section **out,
                                   ascr_geom_load_info *info, ascr_errbuf *err)
{
  if (out == NULL || path == NULL) {
    return core_fail(err, ASCR_EINVAL, "read section: NULL argument");
  }
  *out = NULL;
  FILE *fp = fopen(path, "rb");
  if (fp == NULL) {
    return core_fail(err, ASCR_EIO, "%s: cannot open: %s", path, strerror(errno));
  }
  char *text = NULL;
  size_t len = 0, cap = 0;
  ascr_status st = ASCR_OK;
  for (;;) {
    if (len + 65536 > cap) {
      size_t nc = cap ? 2 * cap : 131072;
      if (nc > READER_MAX_BYTES + 65536) {
        st = core_fail(err, ASCR_EIO, "%s: file larger than %zu MiB; not a coordinate file?",
                       path, READER_MAX_BYTES >> 20);
        break;
      }
      char *nt = realloc(text, nc);
      if (nt == NULL) {
        st = core_fail(err, ASCR_ENOMEM, "%s: out of memory reading the file", path);
        break;
      }
      text = nt;
      cap = nc;
    }
    size_t got = fread(text + len, 1, cap - len, fp);
    len += got;
    if (got == 0) {
      if (ferror(fp)) {
        st = core_fail(err, ASCR_EIO, "%s: read error: %s", path, strerror(errno));
      }
      break;
    }
  }
  fclose(fp);
  if (st == ASCR_OK) {
    st = ascr_geom_section_parse(text, len, path, out, info, err);
  }
  free(text);
  return st;
}
