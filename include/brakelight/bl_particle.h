/*
** bl_particle.h -- projectiles: mass, charge, spin
** See Copyright Notice in LICENSE
*/
#ifndef BL_PARTICLE_H
#define BL_PARTICLE_H

#ifdef __cplusplus
extern "C" {
#endif

enum {
  BL_PARTICLE_COMPOSITE = 1u << 0   /* hadron: treated as a point charge (form factor ignored) */
};

typedef struct bl_particle {
  const char *name;  /* preset name or user label (borrowed) */
  double mass;       /* MeV, > 0 */
  double charge;     /* in units of the elementary charge, != 0 */
  double spin;       /* 0 or 0.5 */
  unsigned flags;    /* BL_PARTICLE_* */
} bl_particle;

/* NULL-terminated list of presets: electron, positron, muon, antimuon, pion+,
** pion-, kaon+, kaon-, proton. */
extern const bl_particle *const bl_particles[];

/* Preset by name (case-insensitive); NULL if unknown.  Borrowed, static. */
const bl_particle *bl_particle_find (const char *name);

/* Check a user-made particle: BL_SUCCESS, or BL_EDOMAIN if mass <= 0 or not
** finite, charge == 0 or not finite, or spin not 0 / 0.5. */
int bl_particle_check (const bl_particle *p);

/* Root-mean-square charge radius in fm of a composite preset (pions,
** kaons, proton; matched by mass, charge, spin and the composite flag,
** so a copy of a preset counts); 0 for a point-like or user-made
** particle (radius unknown).  Used to estimate the effect of the form
** factor the computations leave out (bl_target_born_dk_e). */
double bl_particle_radius (const bl_particle *p);

#ifdef __cplusplus
}
#endif

#endif
