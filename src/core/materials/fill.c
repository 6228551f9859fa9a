/*
** fill.c -- elements as materials, mixtures, the common fill step of
** every material, and Tsai's radiation length
** See Copyright Notice in LICENSE
**
** Formula unit.  Cross sections of a material are per formula unit: the
** sum over components of atoms * (cross section per atom).  An element's
** formula unit is one atom and a formula's is its molecule ("H2O": 2 H +
** 1 O).  A mixture, and a standard composition (which is a mixture given
** by mass fractions), is scaled to one average atom (the atoms sum to 1).
** Why: a mixture has no molecule, and any other choice would depend on how
** it was written; with one average atom, the same brass given by mass
** fractions or by atom fractions is the same material to the last digits
** (tests/test_materials.c), and per-gram results (per_gram factor,
** N_A / molar_mass) never depend on the choice anyway.
*/

#include <math.h>
#include <string.h>

#include <xraylib.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_errno.h"
#include "materials/internal.h"

#define SUMTOL 1e-6   /* allowed |sum of fractions - 1| without normalize */


void bl_mat_setname (char *dst, const char *src) {
  size_t n = src ? strlen(src) : 0;
  if (n > BL_MATERIAL_NAMELEN - 1)
    n = BL_MATERIAL_NAMELEN - 1;
  if (n > 0)
    memcpy(dst, src, n);
  dst[n] = '\0';
}


int bl_mat_fill (bl_material *m, const double atoms[BL_ZMAX + 1],
                 const char *name) {
  int Z, n = 0;
  double M = 0;
  memset(m, 0, sizeof *m);
  bl_mat_setname(m->name, name);
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    if (!(atoms[Z] > 0))
      continue;
    if (n == BL_MATERIAL_MAXCOMP) {
      m->n = 0;
      return BL_EDOMAIN;
    }
    m->comp[n].Z = Z;
    m->comp[n].A = bl_element_mass(Z);
    m->comp[n].atoms = atoms[Z];
    M += atoms[Z] * m->comp[n].A;
    n++;
  }
  if (n == 0)
    return BL_EDOMAIN;
  m->n = n;
  m->molar_mass = M;
  for (Z = 0; Z < n; Z++)
    m->comp[Z].mass_fraction = m->comp[Z].atoms * m->comp[Z].A / M;
  return BL_SUCCESS;
}


void bl_mat_setA (bl_material *m, int Z, double A) {
  double M = 0;
  int i, found = 0;
  for (i = 0; i < m->n; i++)
    if (m->comp[i].Z == Z) {
      m->comp[i].A = A;
      found = 1;
    }
  if (!found)
    return;
  for (i = 0; i < m->n; i++)
    M += m->comp[i].atoms * m->comp[i].A;
  m->molar_mass = M;
  for (i = 0; i < m->n; i++)
    m->comp[i].mass_fraction = m->comp[i].atoms * m->comp[i].A / M;
}


/*
** Density from xraylib's ElementDensity (g/cm^3; its gases are at room
** temperature and 1 atm, e.g. N 1.165e-3), 0 where it has none (Es, Fm).
*/
int bl_material_element (bl_material *m, int Z) {
  double atoms[BL_ZMAX + 1] = {0};
  double rho;
  if (m == NULL)
    return BL_EDOMAIN;
  if (Z < 1 || Z > BL_ZMAX) {
    memset(m, 0, sizeof *m);
    return BL_EDOMAIN;
  }
  atoms[Z] = 1;
  bl_mat_fill(m, atoms, bl_element_symbol(Z));
  rho = ElementDensity(Z, NULL);  /* NULL: no error object, nothing printed */
  m->density = (rho > 0 && isfinite(rho)) ? rho : 0;
  return BL_SUCCESS;
}


/*
** Formula units of each part per unit of the mixture: by mass, w_p / M_p
** (formula units per gram); by number, the fraction itself.  Summed over
** parts into atoms per element, then scaled to one average atom.  A part
** whose component has an atomic weight other than the element's (an
** effective element, "standard_rock") passes it on: the component's A is
** then the atom-weighted mean over the parts (mass[Z] / atoms[Z]).
*/
int bl_material_mixture (bl_material *m, int n, const bl_material *parts,
                         const double *fractions, int by_mass, int normalize,
                         int *bad) {
  double atoms[BL_ZMAX + 1] = {0}, mass[BL_ZMAX + 1] = {0};
  unsigned char ownA[BL_ZMAX + 1] = {0};
  double sum = 0, total = 0, A;
  int i, j, Z, st, distinct = 0;
  int dummy;
  if (bad == NULL)
    bad = &dummy;
  *bad = -1;
  if (m == NULL)
    return BL_EDOMAIN;
  memset(m, 0, sizeof *m);
  if (n < 1 || parts == NULL || fractions == NULL)
    return BL_EDOMAIN;
  for (i = 0; i < n; i++) {
    const bl_material *p = &parts[i];
    if (!(isfinite(fractions[i]) && fractions[i] > 0)
        || !(p->n >= 1 && p->n <= BL_MATERIAL_MAXCOMP)
        || !(p->molar_mass > 0 && isfinite(p->molar_mass))) {
      *bad = i;
      return BL_EDOMAIN;
    }
    sum += fractions[i];
  }
  if (!isfinite(sum) || (!normalize && fabs(sum - 1) > SUMTOL))
    return BL_EDOMAIN;  /* *bad = -1: the sum */
  for (i = 0; i < n; i++) {
    const bl_material *p = &parts[i];
    double units = by_mass ? fractions[i] / p->molar_mass : fractions[i];
    for (j = 0; j < p->n; j++) {
      Z = p->comp[j].Z;
      if (Z < 1 || Z > BL_ZMAX || !(p->comp[j].atoms > 0)) {
        *bad = i;
        return BL_EDOMAIN;
      }
      if (atoms[Z] == 0 && ++distinct > BL_MATERIAL_MAXCOMP) {
        *bad = i;
        return BL_EDOMAIN;
      }
      A = p->comp[j].A;
      if (isfinite(A) && A > 0 && A != bl_element_mass(Z))
        ownA[Z] = 1;  /* else the element's own weight */
      else
        A = bl_element_mass(Z);
      atoms[Z] += units * p->comp[j].atoms;
      mass[Z] += units * p->comp[j].atoms * A;
    }
  }
  for (Z = 1; Z <= BL_ZMAX; Z++)
    total += atoms[Z];
  for (Z = 1; Z <= BL_ZMAX; Z++)
    atoms[Z] /= total;
  st = bl_mat_fill(m, atoms, "mixture");
  for (Z = 1; Z <= BL_ZMAX && st == BL_SUCCESS; Z++)
    if (ownA[Z])
      bl_mat_setA(m, Z, mass[Z] / (atoms[Z] * total));
  return st;
}


/*
** 1/X0 = 4 alpha r_e^2 (N_A / A) { Z^2 [L_rad - f(Z alpha)] + Z L'_rad }
** per element (Tsai 1974, Rev. Mod. Phys. 46, 815; the form of the Review
** of Particle Physics, passage of particles through matter), and
** 1/X0 = sum_i w_i / X0_i over mass fractions w_i for a compound.
** K = 1 / (4 alpha r_e^2 N_A) = 716.4076 g/cm^2 per g/mol from the CODATA
** 2018 constants of bl_const.h (716.408 g/cm^2 in the Review of Particle
** Physics, passage of particles through matter, from memory).
*/
double bl_radiation_length (const bl_material *m) {
  const double re = BL_RE_FM * 1e-13;  /* cm */
  const double K = 1.0 / (4 * BL_ALPHA * re * re * BL_NA);
  double inv = 0;
  int i;
  if (m == NULL || m->n < 1)
    return 0;
  for (i = 0; i < m->n; i++) {
    const bl_component *c = &m->comp[i];
    double Z = c->Z;
    double t = Z * Z * (bl_lrad(c->Z) - bl_coulomb_f(Z * BL_ALPHA))
             + Z * bl_lrad_prime(c->Z);
    inv += c->mass_fraction * t / (K * c->A);
  }
  return inv > 0 ? 1 / inv : 0;
}


double bl_material_per_gram (const bl_material *m) {
  if (m == NULL || !(m->molar_mass > 0.0))
    return 0.0;
  return BL_NA / m->molar_mass * 1e-27;   /* 1 mb = 1e-27 cm^2 */
}
