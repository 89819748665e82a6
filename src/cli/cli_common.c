/* src/cli/cli_common.c
 * Messages, option-value parsing, section loading and whole-or-nothing output for the CLI.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"

#include <errno.h>
#include <fcntl.h>
#include <math.h>
#include <signal.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

void cli_error(const char *fmt, ...)
{
  va_list ap;
  va_start(ap, fmt);
  fputs("airscrew: error: ", stderr);
  vfprintf(stderr, fmt, ap);
  fputc('\n', stderr);
  va_end(ap);
}

void cli_warn(const char *fmt, ...)
{
  va_list ap;
  va_start(ap, fmt);
  fputs("airscrew: warning: ", stderr);
  vfprintf(stderr, fmt, ap);
  fputc('\n', stderr);
  va_end(ap);
}

int cli_exit_for(ascr_status st)
{
  switch (st) {
  case ASCR_OK: return CLI_EXIT_OK;
  case ASCR_EPARSE:
  case ASCR_EGEOM:
  case ASCR_EIO: return CLI_EXIT_INPUT;
  case ASCR_ESING:
  case ASCR_EMAXITER:
  case ASCR_CONTINUE:
  case ASCR_EDOM: return CLI_EXIT_ANALYSIS;
  case ASCR_EINVAL: return CLI_EXIT_USAGE;
  case ASCR_ENOMEM: return CLI_EXIT_INTERNAL;
  }
  return CLI_EXIT_INTERNAL;
}

int cli_parse_number(const char *text, double *out)
{
  char *end = NULL;
  errno = 0;
  double v = strtod(text, &end);
  if (end == text || *end != '\0' || !isfinite(v) || errno == ERANGE) return 1;
  *out = v;
  return 0;
}

int cli_parse_double(const char *opt, const char *text, double lo, double hi, double *out)
{
  char *end = NULL;
  errno = 0;
  /* decimal only: strtod also reads hexadecimal ("0x10" as 16) */
  if (strpbrk(text, "xXpP") != NULL) {
    cli_error("%s: '%s' is not a decimal number", opt, text);
    return 1;
  }
  double v = strtod(text, &end);
  if (end == text || *end != '\0') {
    cli_error("%s: '%s' is not a number", opt, text);
    return 1;
  }
  /* overflow gives an infinity; underflow (ERANGE with a tiny or zero result, "1e-320") is the
   * number it is */
  if (!isfinite(v)) {
    cli_error("%s: '%s' is not a finite number", opt, text);
    return 1;
  }
  if (v < lo || v > hi) {
    cli_error("%s: %g is outside the accepted range %g .. %g", opt, v, lo, hi);
    return 1;
  }
  *out = v;
  return 0;
}

int cli_parse_size(const char *opt, const char *text, size_t lo, size_t hi, size_t *out)
{
  char *end = NULL;
  errno = 0;
  if (text[0] == '-' || text[0] == '+') {
    cli_error("%s: '%s' is not a whole number", opt, text);
    return 1;
  }
  unsigned long long v = strtoull(text, &end, 10);
  if (end == text || *end != '\0' || errno == ERANGE) {
    cli_error("%s: '%s' is not a whole number", opt, text);
    return 1;
  }
  if (v < lo || v > hi) {
    cli_error("%s: %llu is outside the accepted range %zu .. %zu", opt, v, lo, hi);
    return 1;
  }
  *out = (size_t)v;
  return 0;
}

int cli_load_section(const char *arg, ascr_geom_section **out, ascr_geom_load_info *info,
                     int *from_file)
{
  ascr_errbuf err;
  struct stat sb;
  ascr_status st;
  *from_file = 0;
  if (stat(arg, &sb) == 0) {
    if (S_ISDIR(sb.st_mode)) {
      cli_error("%s: is a folder, not a section file", arg);
      return CLI_EXIT_INPUT;
    }
    *from_file = 1;
    st = ascr_geom_section_read(arg, out, info, &err);
  } else if (ascr_geom_is_spec(arg)) {
    st = ascr_geom_section_from_spec(arg, out, &err);
  } else {
    cli_error("%s: no such file, and not a section spec (naca2412, naca23012, naca0012c, "
              "plate:t=3,f=4,xf=50)", arg);
    return CLI_EXIT_INPUT;
  }
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    return st == ASCR_EINVAL || st == ASCR_EDOM ? CLI_EXIT_INPUT : cli_exit_for(st);
  }
  return 0;
}

int cli_output_open(cli_output *o, const char *path, int force)
{
  memset(o, 0, sizeof *o);
  o->path = path;
  o->force = force;
  if (path != NULL) {
    int rc = cli_output_check(path, force);
    if (rc != 0) return rc;
  }
  o->fp = open_memstream(&o->buf, &o->len);
  if (o->fp == NULL) {
    cli_error("out of memory for the output");
    return CLI_EXIT_INTERNAL;
  }
  return 0;
}

void cli_output_discard(cli_output *o)
{
  if (o->fp != NULL) fclose(o->fp);
  o->fp = NULL;
  free(o->buf);
  o->buf = NULL;
}

int cli_read_file(const char *path, size_t max, const char *what, char **text, size_t *len)
{
  *text = NULL;
  *len = 0;
  /* a regular file only (a FIFO is opened without waiting, then refused; a device may never
   * end), with the limit counted while reading */
  int fd = open(path, O_RDONLY | O_NONBLOCK | O_CLOEXEC);
  if (fd < 0) {
    cli_error("%s: cannot open: %s", path, strerror(errno));
    return CLI_EXIT_INPUT;
  }
  struct stat sb;
  if (fstat(fd, &sb) != 0 || !S_ISREG(sb.st_mode)) {
    close(fd);
    cli_error("%s: not a regular file (a %s file must be one)", path, what);
    return CLI_EXIT_INPUT;
  }
  int fl = fcntl(fd, F_GETFL);
  if (fl >= 0) fcntl(fd, F_SETFL, fl & ~O_NONBLOCK);
  size_t cap = 65536, n = 0;
  char *buf = malloc(cap + 1);
  int rc = buf == NULL ? CLI_EXIT_INTERNAL : 0;
  while (rc == 0) {
    if (n == cap) {
      if (cap > max) break;
      size_t nc = cap * 2 > max + 1 ? max + 1 : cap * 2;
      char *nb = realloc(buf, nc + 1);
      if (nb == NULL) {
        rc = CLI_EXIT_INTERNAL;
        break;
      }
      buf = nb;
      cap = nc;
    }
    ssize_t r = read(fd, buf + n, cap - n);
    if (r < 0) {
      if (errno == EINTR) continue;
      cli_error("%s: read error: %s", path, strerror(errno));
      rc = CLI_EXIT_INPUT;
      break;
    }
    if (r == 0) break;
    n += (size_t)r;
    if (n > max) break;
  }
  close(fd);
  if (rc == CLI_EXIT_INTERNAL) cli_error("out of memory reading %s", path);
  if (rc == 0 && n > max) {
    cli_error("%s: larger than %zu MiB; not a %s file", path, max >> 20, what);
    rc = CLI_EXIT_INPUT;
  }
  if (rc != 0) {
    free(buf);
    return rc;
  }
  buf[n] = '\0';
  *text = buf;
  *len = n;
  return 0;
}

/* ---- temporaries and signals: an interrupted run leaves no temporary file behind ---------- */

static char tmp_path[4200];
static volatile sig_atomic_t tmp_active = 0;

static void on_signal(int sig)
{
  if (tmp_active) unlink(tmp_path); /* async-signal-safe */
  _exit(128 + sig);
}

void cli_signals_install(void)
{
  struct sigaction sa;
  memset(&sa, 0, sizeof sa);
  sa.sa_handler = on_signal;
  sigemptyset(&sa.sa_mask);
  sigaction(SIGINT, &sa, NULL);
  sigaction(SIGTERM, &sa, NULL);
  sigaction(SIGHUP, &sa, NULL);
}

void cli_temp_begin(const char *path)
{
  tmp_active = 0;
  snprintf(tmp_path, sizeof tmp_path, "%s", path);
  tmp_active = 1;
}

void cli_temp_end(void) { tmp_active = 0; }

/* What is at an output path, by lstat (a symbolic link is not followed):
 *   0 nothing, 1 a regular file, 2 a stream (character device or FIFO: written to directly,
 *   never replaced), -1 refused (message printed: folder, symbolic link, block device, socket,
 *   or a regular file without force). *mode receives the existing file's permissions. */
static int output_kind(const char *path, int force, mode_t *mode)
{
  struct stat sb;
  if (lstat(path, &sb) != 0) {
    if (errno == ENOENT) return 0;
    cli_error("%s: cannot examine the output path: %s", path, strerror(errno));
    return -1;
  }
  if (S_ISDIR(sb.st_mode)) {
    cli_error("%s: is a folder; give a file name for the output", path);
    return -1;
  }
  if (S_ISLNK(sb.st_mode)) {
    cli_error("%s: is a symbolic link; outputs are not written through links (give the path "
              "it points to)", path);
    return -1;
  }
  if (S_ISCHR(sb.st_mode) || S_ISFIFO(sb.st_mode)) return 2;
  if (!S_ISREG(sb.st_mode)) {
    cli_error("%s: is a %s; not written to", path, S_ISBLK(sb.st_mode) ? "block device" : "socket");
    return -1;
  }
  if (!force) {
    cli_error("%s: exists; not overwritten (add --force to replace it)", path);
    return -1;
  }
  *mode = sb.st_mode & 07777;
  return 1;
}

int cli_output_check(const char *path, int force)
{
  mode_t mode = 0;
  int kind = output_kind(path, force, &mode);
  if (kind < 0) return CLI_EXIT_OUTPUT;
  if (kind == 2) return 0; /* a device or FIFO is written directly */
  /* a file is written through a temporary beside it: that folder must take new files, checked
   * before anything is computed (issue 17: "-o nodir/p.csv" failed after the whole run) */
  char dir[4200];
  const char *slash = strrchr(path, '/');
  if (slash == NULL) {
    snprintf(dir, sizeof dir, ".");
  } else if (slash == path) {
    snprintf(dir, sizeof dir, "/");
  } else if ((size_t)(slash - path) < sizeof dir) {
    memcpy(dir, path, (size_t)(slash - path));
    dir[slash - path] = '\0';
  } else {
    cli_error("%s: path too long", path);
    return CLI_EXIT_OUTPUT;
  }
  if (!cli_dir_writable(dir)) {
    cli_error("%s: cannot write in the folder %s: %s", path, dir, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  return 0;
}

int cli_dir_writable(const char *dir)
{
  char probe[4200];
  if (snprintf(probe, sizeof probe, "%s/.airscrew-probe-XXXXXX", dir) >= (int)sizeof probe) {
    errno = ENAMETOOLONG;
    return 0;
  }
  int fd = mkstemp(probe);
  if (fd < 0) return 0;
  close(fd);
  unlink(probe);
  return 1;
}

/* All of buf to fd (retried when interrupted); 1 on success. */
static int write_all(int fd, const char *buf, size_t len)
{
  size_t off = 0;
  while (off < len) {
    ssize_t w = write(fd, buf + off, len - off);
    if (w < 0) {
      if (errno == EINTR) continue;
      return 0;
    }
    off += (size_t)w;
  }
  return 1;
}

/* Write buf to a stream (device or FIFO) that exists at path. */
static int write_stream(const char *path, const char *buf, size_t len)
{
  int fd = open(path, O_WRONLY | O_NOCTTY | O_CLOEXEC);
  if (fd < 0) {
    cli_error("%s: cannot open for writing: %s", path, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  int ok = write_all(fd, buf, len);
  if (close(fd) != 0) ok = 0;
  if (!ok) {
    cli_error("%s: write failed: %s", path, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  return 0;
}

int cli_write_atomic(const char *path, const char *buf, size_t len, int force)
{
  mode_t old_mode = 0;
  int kind = output_kind(path, force, &old_mode);
  if (kind < 0) return CLI_EXIT_OUTPUT;
  if (kind == 2) return write_stream(path, buf, len);
  /* the temporary lives in the target's folder under a short name of its own, so that a
   * target name of up to 255 characters still leaves room */
  size_t pl = strlen(path);
  const char *slash = strrchr(path, '/');
  size_t dl = slash != NULL ? (size_t)(slash - path) + 1 : 0;
  if (dl + 32 > sizeof tmp_path || pl + 1 > sizeof tmp_path) {
    cli_error("%s: path too long", path);
    return CLI_EXIT_OUTPUT;
  }
  char tmp[sizeof tmp_path];
  memcpy(tmp, path, dl);
  memcpy(tmp + dl, ".airscrew-tmp-XXXXXX", 21);
  int fd = mkstemp(tmp);
  if (fd < 0) {
    cli_error("%s: cannot create a temporary file beside it: %s", path, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  cli_temp_begin(tmp);
  int rc = 0;
  int ok = write_all(fd, buf, len) && fsync(fd) == 0;
  /* a replaced file keeps its permissions; a new one gets what umask gives (mkstemp makes
   * it 0600) */
  mode_t um = umask(0);
  umask(um);
  if (ok) fchmod(fd, kind == 1 ? old_mode : (0666 & ~um));
  if (close(fd) != 0) ok = 0;
  if (!ok) {
    cli_error("%s: write failed: %s", path, strerror(errno));
    unlink(tmp);
    rc = CLI_EXIT_OUTPUT;
  } else {
    /* the path again, just before the rename: something may have appeared meanwhile */
    mode_t m2 = 0;
    int k2 = output_kind(path, force, &m2);
    if (k2 < 0 || k2 == 2 || (k2 == 1 && kind == 0 && !force)) {
      if (k2 >= 0) cli_error("%s: appeared while running; not overwritten", path);
      unlink(tmp);
      rc = CLI_EXIT_OUTPUT;
    } else if (rename(tmp, path) != 0) {
      cli_error("%s: cannot move the finished output into place: %s", path, strerror(errno));
      unlink(tmp);
      rc = CLI_EXIT_OUTPUT;
    }
  }
  cli_temp_end();
  return rc;
}

int cli_output_commit(cli_output *o)
{
  if (fclose(o->fp) != 0) {
    o->fp = NULL;
    free(o->buf);
    cli_error("out of memory for the output");
    return CLI_EXIT_INTERNAL;
  }
  o->fp = NULL;
  int rc = 0;
  if (o->path == NULL) {
    if (fwrite(o->buf, 1, o->len, stdout) != o->len || fflush(stdout) != 0) {
      cli_error("standard output: write failed: %s", strerror(errno));
      rc = CLI_EXIT_OUTPUT;
    }
  } else {
    rc = cli_write_atomic(o->path, o->buf, o->len, o->force);
  }
  free(o->buf);
  o->buf = NULL;
  return rc;
}

int cli_isatty(FILE *fp) { return isatty(fileno(fp)); }

void cli_getopt_reset(void)
{
#if defined(__GLIBC__)
  optind = 0; /* glibc: reinitialise completely */
#else
  optind = 1;
#endif
}

int cli_parse_list(const char *opt, const char *text, double lo, double hi, double *out,
                   size_t *n)
{
  char buf[512];
  if (strlen(text) >= sizeof buf) {
    cli_error("%s: list too long", opt);
    return 1;
  }
  strcpy(buf, text);
  size_t k = 0;
  char *save = NULL;
  for (char *tok = strtok_r(buf, ",", &save); tok != NULL; tok = strtok_r(NULL, ",", &save)) {
    if (k == CLI_MAX_LIST) {
      cli_error("%s: more than %d values", opt, CLI_MAX_LIST);
      return 1;
    }
    if (cli_parse_double(opt, tok, lo, hi, &out[k])) return 1;
    k++;
  }
  if (k == 0) {
    cli_error("%s: no values in '%s'", opt, text);
    return 1;
  }
  *n = k;
  return 0;
}

int cli_parse_range(const char *opt, const char *text, double lo, double hi, double *a0,
                    double *a1, double *step)
{
  char buf[128];
  if (strlen(text) >= sizeof buf) {
    cli_error("%s: '%s' is too long", opt, text);
    return 1;
  }
  strcpy(buf, text);
  char *p1 = strchr(buf, ':');
  char *p2 = p1 ? strchr(p1 + 1, ':') : NULL;
  if (p1 == NULL || p2 == NULL || strchr(p2 + 1, ':') != NULL) {
    cli_error("%s: '%s' is not START:END:STEP", opt, text);
    return 1;
  }
  *p1 = '\0';
  *p2 = '\0';
  if (cli_parse_double(opt, buf, lo, hi, a0) || cli_parse_double(opt, p1 + 1, lo, hi, a1) ||
      cli_parse_double(opt, p2 + 1, 1e-3, hi - lo, step)) {
    return 1;
  }
  if (*a1 < *a0) {
    cli_error("%s: END %g is below START %g", opt, *a1, *a0);
    return 1;
  }
  if ((*a1 - *a0) / *step > 2000.0) {
    cli_error("%s: more than 2000 angles", opt);
    return 1;
  }
  return 0;
}

int cli_parse_values(const char *opt, const char *text, double lo, double hi, size_t max,
                     double *out, size_t *n)
{
  if (strchr(text, ':') != NULL) {
    double a0, a1, st;
    if (cli_parse_range(opt, text, lo, hi, &a0, &a1, &st)) return 1;
    size_t m = ascr_polar_grid_size(a0, a1, st);
    if (m == 0 || m > max) {
      cli_error("%s: '%s' gives %zu values; 1 .. %zu allowed", opt, text, m, max);
      return 1;
    }
    for (size_t i = 0; i < m; i++) out[i] = a0 + (double)i * st;
    *n = m;
    return 0;
  }
  return cli_parse_list(opt, text, lo, hi, out, n);
}

void cli_visc_opts_init(cli_visc_opts *o)
{
  o->preset = NULL;
  o->ncrit = NAN;
  o->turbulence = NAN;
  o->trip_upper = NAN;
  o->trip_lower = NAN;
}

int cli_visc_opts_parse(cli_visc_opts *o, int code, const char *arg)
{
  /* which of the three set N_crit so far: a second, different one is refused */
  int had_n = !isnan(o->ncrit) && o->preset == NULL, had_t = !isnan(o->turbulence);
  int had_w = o->preset != NULL;
  if ((code == 'N' && (had_t || had_w)) || (code == 'T' && (had_n || had_w)) ||
      (code == 'W' && (had_n || had_t))) {
    cli_error("--ncrit, --turbulence and --transition exclude each other");
    return 1;
  }
  switch (code) {
  case 'N':
    return cli_parse_double("--ncrit", arg, 0.5, 20.0, &o->ncrit);
  case 'T':
    return cli_parse_double("--turbulence", arg, 0.0001, 5.0, &o->turbulence);
  case 'W': {
    const ascr_transition_preset *p = ascr_transition_preset_find(arg);
    if (p == NULL) {
      size_t n;
      const ascr_transition_preset *all = ascr_transition_presets(&n);
      char names[256] = "";
      for (size_t i = 0; i < n; i++) {
        size_t l = strlen(names);
        snprintf(names + l, sizeof names - l, "%s%s", i > 0 ? ", " : "", all[i].name);
      }
      cli_error("--transition: '%s' is not a preset (%s)", arg, names);
      return 1;
    }
    o->preset = p->name;
    o->ncrit = p->ncrit;
    return 0;
  }
  case 'U':
    return cli_parse_double("--trip-upper", arg, 0.0, 1.0, &o->trip_upper);
  case 'L':
    return cli_parse_double("--trip-lower", arg, 0.0, 1.0, &o->trip_lower);
  }
  return 1;
}

ascr_visc_params cli_visc_params(const cli_visc_opts *o, double re, double mach)
{
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = re;
  p.mach = mach;
  if (!isnan(o->ncrit)) p.ncrit = o->ncrit;
  if (!isnan(o->turbulence)) {
    double nc = ascr_bl_ncrit_from_turbulence(o->turbulence);
    p.ncrit = nc < 0.5 ? 0.5 : nc;
  }
  if (!isnan(o->trip_upper)) p.trip_upper = o->trip_upper;
  if (!isnan(o->trip_lower)) p.trip_lower = o->trip_lower;
  return p;
}

int cli_analysis_open(cli_analysis *a, const char *arg, size_t panels)
{
  memset(a, 0, sizeof *a);
  int from_file;
  int rc = cli_load_section(arg, &a->raw, NULL, &from_file);
  if (rc) return rc;
  return cli_analysis_repanel(a, panels);
}

int cli_analysis_repanel(cli_analysis *a, size_t panels)
{
  ascr_visc_solver_free(a->visc);
  ascr_panel_solver_free(a->panel);
  ascr_geom_section_free(a->section);
  a->visc = NULL;
  a->panel = NULL;
  a->section = NULL;
  a->n_panels = panels;
  ascr_errbuf err;
  ascr_geom_repanel_params rp = ascr_geom_repanel_defaults();
  rp.n_panels = panels;
  ascr_status st = ascr_geom_section_repanel(a->raw, &rp, &a->section, &err);
  if (st == ASCR_OK) {
    size_t n = ascr_geom_section_size(a->section);
    a->panel = ascr_panel_solver_alloc(n);
    a->visc = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    if (a->panel == NULL || a->visc == NULL) {
      cli_analysis_close(a);
      cli_error("out of memory");
      return CLI_EXIT_INTERNAL;
    }
    st = ascr_panel_solver_set(a->panel, a->section, &err);
  }
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    cli_analysis_close(a);
    return cli_exit_for(st);
  }
  return 0;
}

void cli_analysis_close(cli_analysis *a)
{
  ascr_visc_solver_free(a->visc);
  ascr_panel_solver_free(a->panel);
  ascr_geom_section_free(a->section);
  ascr_geom_section_free(a->raw);
  memset(a, 0, sizeof *a);
}

json_t *cli_json_num(int ok, double v)
{
  return ok && isfinite(v) ? json_real(v) : json_null();
}

int cli_parse_pair(const char *opt, const char *text, double lo, double hi, double *a, double *b)
{
  char buf[128];
  const char *c = strchr(text, ':');
  if (c == NULL || strlen(text) >= sizeof buf) {
    cli_error("%s: '%s' is not LO:HI", opt, text);
    return 1;
  }
  memcpy(buf, text, (size_t)(c - text));
  buf[c - text] = '\0';
  if (cli_parse_double(opt, buf, lo, hi, a) || cli_parse_double(opt, c + 1, lo, hi, b)) return 1;
  if (!(*b > *a)) {
    cli_error("%s: HI %g must exceed LO %g", opt, *b, *a);
    return 1;
  }
  return 0;
}
