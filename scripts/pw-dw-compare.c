/*
** pw-dw-compare.c -- the distorted-wave and Born dsigma/dk against the
** exact partial waves (src/core/partial/dsdk.c), point by point, for
** electrons and positrons in the field of the nucleus and its screening
** (Hartree-Fock, uniform nucleus, no atomic electrons, no corrections).
** `make pw-compare` builds and runs it; not part of make check (minutes:
** 1 MeV points at small y take about a minute each).
** See Copyright Notice in LICENSE
**
** Usage: pw-dw-compare [-T T_MeV[,T_MeV...]] [-Z Z[,Z...]]
** Prints one line per point: particle, Z, T, y, the partial-wave value
** (mb/MeV) and its error, partial/Born, distorted/Born, partial/distorted.
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "brakelight.h"
#include "distorted/internal.h"
#include "partial/dsdk.h"

#define NMAX 16

/* Parse a comma-separated list of at most NMAX positive numbers into v;
** returns the count, or -1 on a malformed list. */
static int parse_list (const char *s, double *v) {
  int n = 0;
  while (*s != '\0') {
    char *end;
    double x = strtod(s, &end);
    if (end == s || !(x > 0.0) || !isfinite(x) || n == NMAX)
      return -1;
    v[n++] = x;
    s = end;
    if (*s == ',')
      s++;
    else if (*s != '\0')
      return -1;
  }
  return n;
}

/* One point: returns 0, or prints why not and returns -1. */
static int point (const char *particle, int Z, double T, double y,
                  bl_quad *q) {
  bl_opts o = bl_opts_default;
  bl_case c;
  bl_yukawa yk;
  bl_pwpot v;
  bl_result rd, rb;
  double zza, val, err;
  int st;
  o.electrons = 0;
  o.elwert = o.coulomb = BL_APPLY_OFF;
  if (bl_case_setup(&c, bl_particle_find(particle), Z,
                    bl_model_find("hartree-fock"), NULL, T, &o) != BL_SUCCESS
      || c.screening->yukawa(Z, c.params, &yk) != BL_SUCCESS) {
    printf("# %s Z=%d T=%g: no case\n", particle, Z, T);
    return -1;
  }
  zza = c.particle.charge * Z * BL_ALPHA;
  st = bl_pwpot_init(&v, zza, &yk, c.particle.mass, c.R, 1e-9 * fabs(zza));
  if (st == BL_SUCCESS)
    st = bl_pw_dsdk(&v, c.particle.mass, c.particle.charge, T, y * T, 1e-3,
                    &val, &err);
  if ((st != BL_SUCCESS && st != BL_ENOTCONV)
      || bl_dw_dk_e(&c, y * T, q, &rd) != BL_SUCCESS
      || bl_dcs_dk_e(&c, y * T, q, &rb) != BL_SUCCESS) {
    printf("# %s Z=%d T=%g y=%g: failed (partial waves: %d)\n", particle, Z,
           T, y, st);
    return -1;
  }
  printf("  %-8s %3d %7g %5.3f %12.5e %8.1e%s %9.4g %9.4g %9.4g\n", particle,
         Z, T, y, val, err, st == BL_ENOTCONV ? "*" : " ", val / rb.val,
         rd.val / rb.val, val / rd.val);
  fflush(stdout);
  return 0;
}

int main (int argc, char **argv) {
  static const char *const pn[] = {"electron", "positron"};
  static const double ys[] = {0.3, 0.7, 0.95};
  double Ts[NMAX] = {0.01, 0.1}, Zd[NMAX] = {6, 13, 29, 50, 79, 92};
  int nT = 2, nZ = 6, a, i, j, s, k, bad = 0;
  bl_quad *q;
  for (a = 1; a + 1 < argc; a += 2)
    if (strcmp(argv[a], "-T") == 0)
      nT = parse_list(argv[a + 1], Ts);
    else if (strcmp(argv[a], "-Z") == 0)
      nZ = parse_list(argv[a + 1], Zd);
    else
      break;
  if (a != argc || nT < 1 || nZ < 1) {
    fprintf(stderr, "usage: %s [-T T_MeV,...] [-Z Z,...] (at most %d each, "
            "positive)\n", argv[0], NMAX);
    return 2;
  }
  for (i = 0; i < nZ; i++)
    if (Zd[i] != floor(Zd[i]) || Zd[i] > 100) {
      fprintf(stderr, "%s: Z = %g: an integer 1..100\n", argv[0], Zd[i]);
      return 2;
    }
  q = bl_quad_alloc(200);
  if (q == NULL || bl_quad_set_rtol(q, 1e-4) != BL_SUCCESS)
    return 1;
  printf("# dsigma/dk: exact partial waves (rtol 1e-3; * = sums at their "
         "caps) against distorted waves and Born (rtol 1e-4)\n");
  printf("# Hartree-Fock screening, uniform nucleus, no atomic electrons\n");
  printf("# %-8s %3s %7s %5s %12s %8s  %9s %9s %9s\n", "particle", "Z",
         "T/MeV", "y", "partial", "err", "pw/born", "dw/born", "pw/dw");
  for (i = 0; i < nZ; i++)
    for (j = 0; j < nT; j++)
      for (s = 0; s < 2; s++)
        for (k = 0; k < 3; k++)
          bad |= point(pn[s], (int)Zd[i], Ts[j], ys[k], q);
  bl_quad_free(q);
  return bad ? 1 : 0;
}
