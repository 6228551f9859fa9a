/*
** radlog.c -- Tsai's radiation logarithms and the Coulomb correction
** See Copyright Notice in LICENSE
**
** Complete-screening constants of the Thomas-Fermi atom (Tsai 1974, Rev. Mod.
** Phys. 46, 815): L_rad = ln(184.15 Z^-1/3),
** L'_rad = ln(1194 Z^-2/3) for Z >= 5, and his values from Hartree-Fock and
** exact wave functions for Z = 1..4.
*/

#include <math.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_element.h"

static const double lrad_light[5] = {0.0, 5.31, 4.79, 4.74, 4.71};
static const double lradp_light[5] = {0.0, 6.144, 5.621, 5.805, 5.924};


double bl_lrad (int Z) {
  if (Z < 1)
    return 0.0;
  return Z <= 4 ? lrad_light[Z] : log(184.15 / cbrt((double)Z));
}


double bl_lrad_prime (int Z) {
  double c;
  if (Z < 1)
    return 0.0;
  if (Z <= 4)
    return lradp_light[Z];
  c = cbrt((double)Z);
  return log(1194.0 / (c * c));
}


/*
** Davies, Bethe & Maximon (1954), in the fitted form Tsai (1974) gives:
**   f(a) = a^2 [1/(1 + a^2) + 0.20206 - 0.0369 a^2 + 0.0083 a^4 - 0.002 a^6],
** a = z Z alpha.  Even in a: the same for both signs of the charge.
*/
double bl_coulomb_f (double a) {
  double a2 = a * a;
  return a2 * (1.0 / (1.0 + a2) + 0.20206 + a2 * (-0.0369 + a2 * (0.0083
               - 0.002 * a2)));
}
