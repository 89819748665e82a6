/* src/cli/cli_tables.c
 * Section tables for the rotor commands (see cli_tables.h): options in, the library's
 * pipeline called, its notes and errors out.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli_tables.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

void cli_table_opts_init(cli_table_opts *o)
{
  memset(o, 0, sizeof *o);
  cli_visc_opts_init(&o->vo);
  ascr_curve_request d = ascr_curve_request_defaults(1e5);
  o->alpha_lo = d.alpha_lo_deg;
  o->alpha_hi = d.alpha_hi_deg;
  o->alpha_step = d.alpha_step_deg;
  o->panels = d.n_panels; /* 0: by Re */
}

const char *cli_default_cache_dir(void)
{
  static char buf[4096];
  const char *e = getenv("AIRSCREW_CACHE_DIR");
  if (e != NULL && e[0] != '\0') {
    snprintf(buf, sizeof buf, "%s", e);
    return buf;
  }
  e = getenv("XDG_CACHE_HOME");
  if (e != NULL && e[0] == '/') {
    snprintf(buf, sizeof buf, "%s/airscrew", e);
    return buf;
  }
  e = getenv("HOME");
  if (e != NULL && e[0] == '/') {
    snprintf(buf, sizeof buf, "%s/.cache/airscrew", e);
    return buf;
  }
  return NULL;
}

/* the temporary cache file of an entry being stored: removed by the interrupt handler */
static void temp_file(const char *path, void *ctx)
{
  (void)ctx;
  if (path != NULL) cli_temp_begin(path);
  else cli_temp_end();
}

static void progress(size_t done, size_t todo, void *ctx)
{
  (void)ctx;
  if (done == 1) fprintf(stderr, "computing %zu section polar curve(s) with the viscous solver...\n", todo);
  fprintf(stderr, "\r  %zu/%zu curves", done, todo);
  if (done == todo) fputc('\n', stderr);
  fflush(stderr);
}

void cli_tables_free(cli_tables *t) { ascr_blade_tables_free(t); }

int cli_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p, double rpm_lo,
                       double rpm_hi, double v_lo, double v_hi, const cli_table_opts *o,
                       cli_tables *out)
{
  ascr_blade_tables_options to = ascr_blade_tables_options_defaults();
  ascr_visc_params vp = cli_visc_params(&o->vo, 1e5, 0.0);
  to.cache_dir = o->cache_dir;
  to.curve.ncrit = vp.ncrit;
  to.curve.trip_upper = vp.trip_upper;
  to.curve.trip_lower = vp.trip_lower;
  to.curve.alpha_lo_deg = o->alpha_lo;
  to.curve.alpha_hi_deg = o->alpha_hi;
  to.curve.alpha_step_deg = o->alpha_step;
  to.curve.n_panels = o->panels;
  to.n_files = o->n_files;
  to.file_section = o->file_section;
  to.file_path = o->file_path;
  to.progress = cli_isatty(stderr) ? progress : NULL;
  to.temp_file = temp_file;
  ascr_errbuf err;
  ascr_status st = ascr_blade_tables_prepare(b, p, rpm_lo, rpm_hi, v_lo, v_hi, &to, out, &err);
  for (size_t i = 0; i < out->n_notes; i++) cli_warn("%s", out->notes[i]);
  if (st == ASCR_OK) return 0;
  cli_error("%s", err.msg);
  int rc;
  switch (out->failed) {
  case ASCR_TABLES_ARGUMENTS: rc = st == ASCR_EINVAL ? CLI_EXIT_USAGE : cli_exit_for(st); break;
  case ASCR_TABLES_SECTION:
    rc = st == ASCR_EINVAL || st == ASCR_EDOM || st == ASCR_EIO ? CLI_EXIT_INPUT : cli_exit_for(st);
    break;
  case ASCR_TABLES_FILE: rc = CLI_EXIT_INPUT; break;
  case ASCR_TABLES_TABLE: rc = st == ASCR_EDOM ? CLI_EXIT_ANALYSIS : cli_exit_for(st); break;
  default: rc = cli_exit_for(st); break;
  }
  ascr_blade_tables_free(out);
  return rc;
}
