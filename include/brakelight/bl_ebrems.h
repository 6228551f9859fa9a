/*
** bl_ebrems.h -- bremsstrahlung of a projectile on a free electron at rest:
** the exact tree-level (lowest-order QED) cross section with recoil, all
** diagrams, exchange (e-) and annihilation (e+)
** See Copyright Notice in LICENSE
**
** Process: a(p1) + e-(p2) -> a(p3) + e-(p4) + photon(k), the electron at
** rest in the lab, the projectile along +z.  Radiation from both lines; for
** an electron projectile the exchange diagrams (relative sign -1, identical
** final particles: factor 1/2 on the full phase space); for a positron the
** annihilation-channel diagrams (relative sign -1).  The squared matrix
** element is summed numerically over every spin state and two photon
** polarisations (DEVELOPERS.md, "Electron-target bremsstrahlung").
**
** Angles.  theta_k: photon against the beam (lab).  theta_s, phi_s: the
** direction of the outgoing projectile in the rest frame of p3 + p4, polar
** axis along the momentum of p3 + p4 (= p1 + p2 - k), azimuth measured from
** the half-plane that holds the photon.  Units: MeV, mb, sr.
*/
#ifndef BL_EBREMS_H
#define BL_EBREMS_H

#include "brakelight/bl_models.h"
#include "brakelight/bl_particle.h"
#include "brakelight/bl_quad.h"
#include "brakelight/bl_result.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Which diagrams: a projectile distinguishable from the electron, an
** electron (exchange), a positron (annihilation). */
enum {
  BL_EBREMS_OTHER    = 0,
  BL_EBREMS_ELECTRON = 1,
  BL_EBREMS_POSITRON = 2
};

/* One projectile at one energy on a free electron at rest.  Filled by
** bl_ebrems_init; read-only afterwards.  Inside: units of m_e (hbar = c =
** m_e = 1). */
typedef struct bl_ebrems {
  int kind;         /* BL_EBREMS_* (electron / positron: the mass is BL_ME_MEV
                    ** and |charge| = 1, spin 1/2) */
  int spin2;        /* twice the spin: 0 or 1 */
  double z;         /* projectile charge (units of e) */
  double m;         /* projectile mass / m_e */
  double t0, e0, p0;  /* kinetic energy, total energy, momentum / m_e */
  double T;         /* kinetic energy, MeV */
  double ymax;      /* k_max / T = 1 / (1 + E0 - p0) (E0, p0 in m_e) */
  int Z;            /* binding (bl_ebrems_set_binding): the element, 0 for
                    ** a free electron */
  bl_yukawa inc;    /* its S(q)/Z = sum alpha_i q^2 / (b_i^2 + q^2), b_i
                    ** in m_e (from the model's incoherent function) */
  int radiate;      /* which lines radiate (BL_EBREMS_RAD_*): both (0, set
                    ** by bl_ebrems_init); a diagnostic may keep one line
                    ** only for a projectile other than e-/e+ (kind
                    ** BL_EBREMS_OTHER: each line's radiation is a
                    ** gauge-invariant set); ignored for e-/e+ */
} bl_ebrems;

/* Values of bl_ebrems.radiate. */
enum {
  BL_EBREMS_RAD_BOTH       = 0,
  BL_EBREMS_RAD_PROJECTILE = 1,   /* the projectile's radiation only */
  BL_EBREMS_RAD_ELECTRON   = 2    /* the struck electron's only */
};

/* The largest kinetic energy accepted (MeV): a bound on the rounding of
** the gauge cancellations at the smallest momentum transfers.  The
** amplitudes are evaluated in the rest frame of p3 + p4 (gamma ~ sqrt(E0)
** there), with the struck electron's transfer given exactly and, from a
** Lorentz factor 100 up, its current in the axial gauge of the radiating
** line (amp.c).  Against the quadruple-precision trace route of
** tests/ref/ebquad.c, |M|^2 keeps (worst of 40 random points at and near
** the poles, measured) 1e-9 for e+- at 10 GeV, 1e-8 at 100 GeV, 1.1e-5
** at 1 TeV, but only 5e-2 at 10 TeV; 5e-11 for a muon at 10 TeV.  Hence
** electrons and positrons up to BL_EBREMS_T_MAX_E = 1 TeV, other
** projectiles up to BL_EBREMS_T_MAX = 10 TeV (DEVELOPERS.md,
** "Electron-target bremsstrahlung"). */
#define BL_EBREMS_T_MAX 1e7
#define BL_EBREMS_T_MAX_E 1e6

/* Set up projectile p at kinetic energy T (MeV).  BL_EDOMAIN if p is not a
** valid particle (bl_particle_check) or T is not in (0, BL_EBREMS_T_MAX]
** ((0, BL_EBREMS_T_MAX_E] for an electron or a positron). */
int bl_ebrems_init (bl_ebrems *c, const bl_particle *p, double T);

/*
** Binding of the target electron: every cross section below is multiplied,
** point by point, by S(q, Z)/Z, the incoherent scattering function of
** element Z of the screening model `model` (its `incoherent` function;
** params NULL: the model's defaults) per electron, q the momentum the
** struck electron carries away (lab = atom rest frame: |p4|; for an
** electron projectile the slower of the two final electrons, so that the
** weight is symmetric under their exchange).  The values are then per
** atomic electron of Z (times Z for the atom).  The treatment of Haug
** (2008, Eur. Phys. J. D 49, 193; with his formula in the tabulations of
** Seltzer & Berger 1985, Nucl. Instrum. Meth. B 12, 95): it suppresses
** the small momentum transfers, where the electron is not free; it keeps
** the free-electron kinematics (end point, no Doppler broadening by the
** bound electron's motion) and holds where the energy given to the
** electron, ~ q^2 / 2 m_e, is large against its binding energy over most
** of the cross section (DEVELOPERS.md, "Electron-target bremsstrahlung").
** Z = 0 or model NULL: binding off (the free electron).  BL_EDOMAIN if Z
** is outside 0..BL_ZMAX; BL_EMODEL if the model has no incoherent
** function (none) or gives a bad one; c unchanged then.
*/
int bl_ebrems_set_binding (bl_ebrems *c, int Z, const bl_model *model,
                           const double *params);

/* The photon end point k_max (MeV): T m_e / (m_e + E0 - p0), with
** E0 - p0 = m^2 / (E0 + p0); dsigma/dk is exactly 0 above it. */
double bl_ebrems_kmax (const bl_ebrems *c);

/* Sum over all spins and both photon polarisations of |M|^2 (including
** e^6 = (4 pi alpha)^3; units m_e^-2) at the final momenta p3, p4, k
** (four-vectors (E, px, py, pz) in units of m_e, lab frame; p1 and p2 are
** those of c).  Momentum conservation is the caller's: not checked.  The
** free electron (binding is not applied here).  Evaluated as given, in the
** lab: at high energy the rounding of the lab components themselves
** limits it near the struck electron's pole (measured against
** tests/ref/ebquad.c, worst of 21 points: 1.4e-7 for e- at 10 GeV, 2e-5
** at 100 GeV, 1e-3 at 1 TeV); the cross sections below do not use this
** route.
** BL_EDOMAIN if a momentum is not finite; BL_ENONFINITE if the value is not
** finite (a propagator at zero). */
int bl_ebrems_msq (const bl_ebrems *c, const double p3[4], const double p4[4],
                   const double k[4], double *msq);

/* Fully differential cross section d5sigma/(dk dOmega_k dOmega_s)
** (mb/(MeV sr^2)) at photon energy k (MeV) and the angles above (rad).
** 0 at and beyond the end point of this photon direction.  BL_EDOMAIN
** (with *val = 0) unless 0 < k, 0 <= theta_k, theta_s <= pi, phi_s finite. */
int bl_ebrems_point (const bl_ebrems *c, double k, double theta_k,
                     double theta_s, double phi_s, double *val);

/* Fully differential cross section in the lab's variables,
** d5sigma/(dk dOmega_k dOmega_p) (mb/(MeV sr^2)): photon energy k (MeV),
** photon polar angle theta_k (azimuth 0), the projectile's final
** direction (theta_p, phi) (rad, from the beam axis; for e- the faster of
** the two final electrons), the struck electron's momentum and the
** projectile's energy fixed by conservation (one or two projectile
** momenta; both counted).  Binding as set.  0 beyond the end point of
** this photon direction and where no projectile momentum fits.  Its
** integral over Omega_p is bl_ebrems_angular_e.  BL_EDOMAIN (*val = 0)
** unless 0 < k, 0 <= theta_k, theta_p <= pi, phi finite. */
int bl_ebrems_full (const bl_ebrems *c, double k, double theta_k,
                    double theta_p, double phi, double *val);

/* Photon angular distribution d2sigma/(dk dOmega_k) (mb/(MeV sr)) at k
** (MeV) and theta_k (rad), integrated over Omega_s at the tolerance of q.
** BL_EDOMAIN unless 0 < k and 0 <= theta_k <= pi; BL_ENOTCONV when the
** tolerance is not met (out filled, BL_WARN_TOLERANCE); BL_EINTR if q's
** stop flag is set. */
int bl_ebrems_angular_e (const bl_ebrems *c, double k, double theta_k,
                         bl_quad *q, bl_result *out);

/* Photon spectrum dsigma/dk (mb/MeV) at k (MeV), integrated over the photon
** direction and Omega_s at the tolerance of q; exactly 0 for k >= k_max.
** Status as bl_ebrems_angular_e. */
int bl_ebrems_dk_e (const bl_ebrems *c, double k, bl_quad *q, bl_result *out);

#ifdef __cplusplus
}
#endif

#endif
