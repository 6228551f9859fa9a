/*
** man_example.c -- the program of brakelight(3), section EXAMPLES: an
** electron of 20 MeV on lead tungstate (PbWO4) through bl_target.
** Prints dsigma/dk at k = 5 MeV (mb/MeV per formula unit), the
** radiative energy loss (MeV mb per formula unit and MeV cm^2/g) and
** the photons per electron of a 0.2 g/cm^2 radiator in two bins from
** 1 to 20 MeV (per electron); values and error estimates with 17
** significant digits.
** Build: cc man_example.c $(pkg-config --cflags --libs brakelight)
** scripts/check-install.sh checks that this file is the example of
** the man page and compares its numbers with those of the Lua module.
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>

#include <brakelight.h>

/*
** 1 if the program may go on: success, or a soft status (best
** estimate, tolerance not reached: said on stderr).  0 on a hard
** failure, with the element Z and photon energy k (MeV) when known.
*/
static int check (const char *what, int st, int Z, double k) {
  if (st == BL_SUCCESS)
    return 1;
  if (bl_status_soft(st)) {
    fprintf(stderr, "man_example: %s: %s (estimate kept)\n", what,
            bl_strerror(st));
    return 1;
  }
  if (Z > 0)
    fprintf(stderr, "man_example: %s: %s (Z = %d, k = %g MeV)\n",
            what, bl_strerror(st), Z, k);
  else
    fprintf(stderr, "man_example: %s: %s\n", what, bl_strerror(st));
  return 0;
}

int main (void) {
  static bl_target t;            /* about 130 KB: not on the stack */
  const bl_particle *e = bl_particle_find("electron");
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_material m;
  bl_parse_error perr;
  bl_tresult dk, loss, bins[2];
  double edges[3], T = 20.0, k = 5.0;
  bl_quad *q;
  int st, failZ, failbin, i, ret = EXIT_FAILURE;
  if (e == NULL || hf == NULL) {
    fprintf(stderr, "man_example: no electron or hartree-fock\n");
    return EXIT_FAILURE;
  }
  st = bl_material_lookup(&m, "PbWO4", &perr);
  if (st != BL_SUCCESS) {
    fprintf(stderr, "man_example: PbWO4: %s (%s at byte %zu)\n",
            bl_strerror(st), perr.reason ? perr.reason : "?", perr.pos);
    return EXIT_FAILURE;
  }
  q = bl_quad_alloc(1000);       /* relative tolerance 1e-4 */
  if (q == NULL)
    return check("bl_quad_alloc", BL_ENOMEM, 0, 0.0), EXIT_FAILURE;
  st = bl_target_setup(&t, e, &m, hf, NULL, T, &bl_opts_default,
                       BL_METHOD_AUTO, NULL, &failZ);
  if (!check("bl_target_setup", st, failZ, 0.0))
    goto noprep;
  st = bl_target_prepare(&t, q, &failZ);
  if (!check("bl_target_prepare", st, failZ, 0.0))
    goto noprep;                 /* a failed prepare holds nothing */
  st = bl_target_dk_e(&t, k, q, &dk);
  if (!check("bl_target_dk_e", st, dk.Z, dk.k))
    goto done;
  printf("dsdk %.17g +- %.17g mb/MeV\n", dk.r.val, dk.r.err);
  st = bl_target_energy_loss_e(&t, q, &loss);
  if (!check("bl_target_energy_loss_e", st, loss.Z, loss.k))
    goto done;
  printf("energy_loss %.17g +- %.17g MeV mb\n", loss.r.val,
         loss.r.err);
  printf("dedx %.17g MeV cm2/g\n",
         loss.r.val * bl_material_per_gram(&m));
  st = bl_target_photon_yield_e(&t, 0.2, 1.0, T, 2, BL_SPACING_LINEAR,
                                q, edges, bins, &failbin);
  if (!check("bl_target_photon_yield_e", st,
             failbin >= 0 ? bins[failbin].Z : 0,
             failbin >= 0 ? bins[failbin].k : 0.0))
    goto done;
  for (i = 0; i < 2; i++)
    printf("photons %g-%g MeV %.17g +- %.17g\n", edges[i],
           edges[i + 1], bins[i].r.val, bins[i].r.err);
  ret = EXIT_SUCCESS;
done:
  bl_target_release(&t);
noprep:
  bl_quad_free(q);
  return ret;
}
