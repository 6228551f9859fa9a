/*
** bench_pwfast.c -- the partial-wave dsigma/dk by the direct l sum and
** by the Born subtraction, side by side: value, err, l_i reached, pairs
** and CPU seconds per point
** See Copyright Notice in LICENSE
**
** Built and run by `make bench-pwfast`; not a test.
**
**   bench_pwfast [-r RTOL] [-m both|sub|direct] Z:T:y:z ...
**     one line per point and method (Hartree-Fock screening, point
**     nucleus, electron mass, charge z = -1 or +1, T in MeV):
**     "Z T y z method dsdk err l_i pairs seconds status"
**   without points: Au and Cu at 1 MeV, y = 0.1, 0.3, 0.5, 0.9, e-.
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "partial/dsdk.h"

static double cpu (void) {
  return (double)clock() / CLOCKS_PER_SEC;
}

/* One point by one method, printed. */
static void point (int Z, double T, double y, double z, double rtol,
                   int method) {
  const bl_model *m = bl_model_find("hartree-fock");
  bl_yukawa yk;
  bl_pwpot v;
  bl_pwinfo info;
  double ds = 0.0, err = 0.0, t0, zza = z * Z * BL_ALPHA;
  int st;
  memset(&info, 0, sizeof info);
  if (m == NULL || m->yukawa(Z, NULL, &yk) != BL_SUCCESS
      || bl_pwpot_init(&v, zza, &yk, BL_ME_MEV, 0.0, 1e-9 * fabs(zza))) {
    printf("%d %g %g %g setup failed\n", Z, T, y, z);
    return;
  }
  t0 = cpu();
  st = bl_pw_dsdk_m(&v, BL_ME_MEV, z, T, y * T, rtol, method, &ds, &err,
                    &info);
  printf("%d %g %g %+g %s %.9g %.3g %d %ld %.2f %d\n", Z, T, y, z,
         info.method == BL_PW_BORNSUB ? "sub" : "direct", ds, err,
         info.lmax, info.pairs, cpu() - t0, st);
  fflush(stdout);
}

int main (int argc, char **argv) {
  double rtol = 1e-3;
  int i, npt = 0, both = 1, only = BL_PW_BORNSUB;
  static const char *const def[] = {
    "79:1:0.1:-1", "79:1:0.3:-1", "79:1:0.5:-1", "79:1:0.9:-1",
    "29:1:0.1:-1", "29:1:0.3:-1", "29:1:0.5:-1", "29:1:0.9:-1", NULL
  };
  for (i = 1; i < argc; i++) {
    if (strcmp(argv[i], "-r") == 0 && i + 1 < argc)
      rtol = atof(argv[++i]);
    else if (strcmp(argv[i], "-m") == 0 && i + 1 < argc) {
      i++;
      both = strcmp(argv[i], "both") == 0;
      only = strcmp(argv[i], "direct") == 0 ? BL_PW_DIRECT : BL_PW_BORNSUB;
    } else
      npt++;
  }
  gsl_set_error_handler_off();
  printf("# Z T y z method dsdk err l_i pairs cpu_s status (rtol %g)\n",
         rtol);
  for (i = 1; npt == 0 ? def[i - 1] != NULL : i < argc; i++) {
    const char *a = npt == 0 ? def[i - 1] : argv[i];
    int Z;
    double T, y, z;
    if (npt && (strcmp(a, "-r") == 0 || strcmp(a, "-m") == 0)) {
      i++;
      continue;
    }
    if (sscanf(a, "%d:%lf:%lf:%lf", &Z, &T, &y, &z) != 4) {
      fprintf(stderr, "bench_pwfast: bad point '%s' (Z:T:y:z)\n", a);
      return 1;
    }
    if (both || only == BL_PW_DIRECT)
      point(Z, T, y, z, rtol, BL_PW_DIRECT);
    if (both || only == BL_PW_BORNSUB)
      point(Z, T, y, z, rtol, BL_PW_BORNSUB);
  }
  return 0;
}
