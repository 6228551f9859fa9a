/*
** particle.c -- projectile presets
** See Copyright Notice in LICENSE
*/

#include <math.h>
#include <stddef.h>
#include <strings.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_errno.h"
#include "brakelight/bl_particle.h"

/* Masses: Review of Particle Physics (bl_const.h). */
static const bl_particle electron = {"electron", BL_ME_MEV, -1.0, 0.5, 0};
static const bl_particle positron = {"positron", BL_ME_MEV, +1.0, 0.5, 0};
static const bl_particle muon = {"muon", BL_MMU_MEV, -1.0, 0.5, 0};
static const bl_particle antimuon = {"antimuon", BL_MMU_MEV, +1.0, 0.5, 0};
static const bl_particle pionp = {"pion+", BL_MPI_MEV, +1.0, 0.0,
                                  BL_PARTICLE_COMPOSITE};
static const bl_particle pionm = {"pion-", BL_MPI_MEV, -1.0, 0.0,
                                  BL_PARTICLE_COMPOSITE};
static const bl_particle kaonp = {"kaon+", BL_MK_MEV, +1.0, 0.0,
                                  BL_PARTICLE_COMPOSITE};
static const bl_particle kaonm = {"kaon-", BL_MK_MEV, -1.0, 0.0,
                                  BL_PARTICLE_COMPOSITE};
static const bl_particle proton = {"proton", BL_MP_MEV, +1.0, 0.5,
                                   BL_PARTICLE_COMPOSITE};

const bl_particle *const bl_particles[] = {
  &electron, &positron, &muon, &antimuon, &pionp, &pionm, &kaonp, &kaonm,
  &proton, NULL
};


const bl_particle *bl_particle_find (const char *name) {
  int i;
  if (name == NULL)
    return NULL;
  for (i = 0; bl_particles[i] != NULL; i++)
    if (strcasecmp(name, bl_particles[i]->name) == 0)
      return bl_particles[i];
  return NULL;
}


/*
** Charge radii, fm (Review of Particle Physics, Particle Data Group; values
** from memory, uncertain by about 1 %, the kaon's by 5 %): proton 0.841
** (the muonic-hydrogen value), charged pion 0.659, charged kaon 0.560.
*/
double bl_particle_radius (const bl_particle *p) {
  static const struct { const bl_particle *p; double r; } radii[] = {
    {&pionp, 0.659}, {&pionm, 0.659}, {&kaonp, 0.560}, {&kaonm, 0.560},
    {&proton, 0.841}
  };
  size_t i;
  if (p == NULL || !(p->flags & BL_PARTICLE_COMPOSITE))
    return 0.0;
  for (i = 0; i < sizeof radii / sizeof radii[0]; i++)
    if (p->mass == radii[i].p->mass && p->charge == radii[i].p->charge
        && p->spin == radii[i].p->spin)
      return radii[i].r;
  return 0.0;
}


int bl_particle_check (const bl_particle *p) {
  if (p == NULL || !isfinite(p->mass) || p->mass <= 0.0)
    return BL_EDOMAIN;
  if (!isfinite(p->charge) || p->charge == 0.0)
    return BL_EDOMAIN;
  if (p->spin != 0.0 && p->spin != 0.5)
    return BL_EDOMAIN;
  return BL_SUCCESS;
}
