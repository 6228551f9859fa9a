/*
** dsdk.c -- an outside C program built against an installed brakelight
** (`pkg-config --cflags --libs brakelight`): one dsigma/dk of a muon on
** carbon through the public API only.  Prints the value and its error
** estimate in mb/MeV ("%.17g %.17g"), or a message on standard error and
** exit status 1.  scripts/check-install.sh builds it against the shared
** and the static library and against the source tree, and compares.
** Usage: dsdk [T k]   (MeV; default 10 1)
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>

#include <brakelight.h>

/*
** Read argv[i] as a number into *x; 0 (with a message) unless the whole
** argument is a number.
*/
static int getnum (char **argv, int i, const char *name, double *x) {
  char *end;
  *x = strtod(argv[i], &end);
  if (end == argv[i] || *end != '\0') {
    fprintf(stderr, "dsdk: argument %d (%s) must be a number in MeV, "
            "got '%s'\n", i, name, argv[i]);
    return 0;
  }
  return 1;
}

int main (int argc, char **argv) {
  double T = 10.0, k = 1.0;
  const bl_particle *p = bl_particle_find("muon");
  const bl_model *m = bl_model_find("hartree-fock");
  bl_case c;
  bl_quad *q;
  bl_result r;
  int st;
  if (argc == 3) {
    if (!getnum(argv, 1, "T", &T) || !getnum(argv, 2, "k", &k))
      return EXIT_FAILURE;
  }
  else if (argc != 1) {
    fprintf(stderr, "dsdk: usage: dsdk [T k]\n");
    return EXIT_FAILURE;
  }
  if (p == NULL || m == NULL) {
    fprintf(stderr, "dsdk: preset muon or model hartree-fock not found\n");
    return EXIT_FAILURE;
  }
  st = bl_case_setup(&c, p, 6, m, NULL, T, &bl_opts_default);
  if (st != BL_SUCCESS) {
    fprintf(stderr, "dsdk: bl_case_setup (T = %g MeV): %s\n", T,
            bl_strerror(st));
    return EXIT_FAILURE;
  }
  q = bl_quad_alloc(1000);  /* the Lua module's workspace size */
  if (q == NULL) {
    fprintf(stderr, "dsdk: bl_quad_alloc: %s\n", bl_strerror(BL_ENOMEM));
    return EXIT_FAILURE;
  }
  st = bl_dcs_dk_e(&c, k, q, &r);  /* default tolerance, 1e-4 */
  bl_quad_free(q);
  if (st != BL_SUCCESS) {
    fprintf(stderr, "dsdk: bl_dcs_dk_e (k = %g MeV): %s\n", k,
            bl_strerror(st));
    return EXIT_FAILURE;
  }
  printf("%.17g %.17g\n", r.val, r.err);
  return EXIT_SUCCESS;
}
