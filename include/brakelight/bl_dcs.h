/*
** bl_dcs.h -- Born bremsstrahlung cross sections of a projectile on an atom
** See Copyright Notice in LICENSE
*/
#ifndef BL_DCS_H
#define BL_DCS_H

#include "bl_models.h"
#include "bl_particle.h"
#include "bl_quad.h"
#include "bl_result.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Nucleus models and the three-way switch of the corrections.
** BL_NUCLEUS_UNIFORM: the uniform sphere's elastic (coherent) field,
** Z^2 F_N^2.  BL_NUCLEUS_INCOHERENT: that plus the nucleus's incoherent
** part, the closure sum Z (1 - F_N^2) of Z uncorrelated point protons
** (no Pauli blocking, no excitation energy, no proton size: an upper
** bound, flagged BL_WARN_NINCOH where it counts, m R > 0.1 hbar c), the
** convention of muon bremsstrahlung on nuclei (Kelner, Kokoulin &
** Petrukhin's D_n^(1 - 1/Z)).  */
enum { BL_NUCLEUS_POINT = 0, BL_NUCLEUS_UNIFORM = 1,
       BL_NUCLEUS_INCOHERENT = 2 };
enum { BL_APPLY_OFF = 0, BL_APPLY_ON = 1, BL_APPLY_AUTO = 2 };

/* What the target factor and the corrections include. */
typedef struct bl_opts {
  int electrons;   /* 1: add the field of the atomic electrons, S(q) */
  int nucleus;     /* BL_NUCLEUS_POINT, _UNIFORM or _INCOHERENT */
  double A;        /* mass number for R = 1.2 A^1/3 fm; 0: the standard
                   ** atomic weight rounded */
  int coulomb;     /* BL_APPLY_*: Davies-Bethe-Maximon correction */
  int elwert;      /* BL_APPLY_*: Elwert factor */
  int eradiation;  /* BL_ERAD_*: which radiation the bound electron term
                   ** counts (with electrons on) */
} bl_opts;

/* Values of bl_opts.eradiation.  BL_ERAD_ALL: every diagram of the
** projectile's collision with the struck electron, the electron's own
** radiation included.  BL_ERAD_PROJECTILE: the projectile's radiation only
** (a gauge-invariant subset for any projectile but e-/e+): the convention
** of muon physics, which books the radiation of the knocked-on electron in
** the ionization loss (as a radiative correction to knock-on production).
** Not defined for e-/e+, where exchange (e-) and annihilation (e+) mix the
** two lines: bl_case_setup refuses it there (BL_EDOMAIN).  For particles
** between 2 m_e and BL_EBH_M_MIN, which keep the static-charge term (the
** projectile's radiation in the atomic electrons' static field), both give
** that term. */
enum { BL_ERAD_ALL = 0, BL_ERAD_PROJECTILE = 1 };

/* The plain Born cross section in the screened field of the model: point
** nucleus, no electrons, no corrections (what bl_case_init uses). */
extern const bl_opts bl_opts_bare;

/* The defaults of the Lua module: electrons, uniform nucleus, both
** corrections where valid. */
extern const bl_opts bl_opts_default;

#define BL_POLE_MAX 24
#define BL_TERM_MAX 200
#define BL_EBT_ROW 16   /* room for the electron and muon tables' u nodes */

/* One term c w_i w_j of the target factor, w_i = 1/(pole_i + q^2), with
** pole_i <= pole_j. */
typedef struct bl_term {
  int i, j;
  double c;
} bl_term;

/* One computation: projectile, target atom, kinetic energy.  Filled by
** bl_case_init; plain data, may be copied; nothing to free. */
typedef struct bl_case {
  bl_particle particle;
  int Z;                      /* atomic number of the target */
  const bl_model *screening;
  double params[8];           /* screening-model parameters (defaults filled) */
  double T;                   /* kinetic energy, MeV */
  /* derived */
  double t0;                  /* T / m */
  double norm;                /* z^4 Z^2 alpha r0^2, mb; r0 = alpha hbar/(m c) */
  bl_opts opts;
  double R;                   /* nuclear radius, fm (0: point) */
  /* Target factor W(q^2) = G(q) / (Z^2 q^4) = sum_i s_i w_i
  ** + sum_t c_t w_i w_j, q in units of m; pairs of far-apart poles are
  ** split into singles s_i (partial fractions), the elastic and electron
  ** parts kept apart: */
  int npole;
  double pole[BL_POLE_MAX];   /* in units of m^2 */
  double single_el[BL_POLE_MAX], single_e[BL_POLE_MAX];
  double qmax2;               /* bound on q^2 in the case, units of m^2 */
  int nterm;
  bl_term term[BL_TERM_MAX];
  int nelastic;               /* the first nelastic terms are the nuclear
                              ** (elastic) part, the rest the electrons' */
  double ridge_b;             /* smallest screening pole of the elastic part */
  unsigned warn;              /* warnings that hold for every k (BL_WARN_*) */
  int ebt;                    /* electron term: 0 the static charges as
                              ** they are; 1 (electron), 2 (positron), 3
                              ** (muon), 4 (antimuon), 5 (any other
                              ** projectile from 100 MeV): scaled per k to
                              ** the bound electron term of the table
                              ** (bl_case_eratio) */
  double ekmax;               /* with ebt: the end point on a free
                              ** electron at rest, MeV */
  double ebrow[3][BL_EBT_ROW]; /* with ebt: the table's rows for this Z
                              ** and T (and mass, spin: ebt 5, three
                              ** parts) (src/core/ebrems/table.c) */
  double ebwz, ebwb;          /* with ebt: their Z and blend weights */
  int ebexact;                /* 1: ebt 5 outside its table (mass above
                              ** BL_EBH_M_MAX or T/m below BL_EBH_TAU_MIN)
                              ** at T <= 10 TeV: bl_case_eratio holds the
                              ** edge, and bl_method_dk_e computes the
                              ** exact term at each k instead */
} bl_case;

/* Largest T/m bl_case_setup accepts.  Beyond it the angular scales
** (1/gamma^2 < 1e-30) fall below the rounding of the polar angles and the
** integrals no longer converge; far beyond it (T/m ~ 1e154) the kinematics
** overflow. */
#define BL_T0_MAX 1e15

/* The scale of every cross section of particle p on charge Z:
** z^4 Z^2 alpha r0^2 in mb, r0 = alpha hbar/(m c).  bl_case_setup refuses
** p and Z where it is not a normal double (DBL_MIN..DBL_MAX). */
double bl_case_norm (const bl_particle *p, int Z);

/* Prepare a case.  Returns BL_SUCCESS; BL_EDOMAIN for an invalid particle,
** Z outside 1..100, T not in (0, BL_T0_MAX m], or a particle whose
** normalisation z^4 Z^2 alpha r0^2 is not a normal double; BL_EMODEL if
** the model has no Yukawa form.  `params` may be NULL (defaults). */
int bl_case_init (bl_case *c, const bl_particle *p, int Z,
                  const bl_model *screening, const double *params, double T);

/* The same with the target options o (NULL: bl_opts_bare).  Also
** BL_EDOMAIN for A outside [0, 300], unknown switch values, or
** o->eradiation = BL_ERAD_PROJECTILE for e-/e+ with electrons on.  With a
** model that has no electron field ("none"), electrons are turned off in
** the case (c->opts.electrons = 0), not refused. */
int bl_case_setup (bl_case *c, const bl_particle *p, int Z,
                   const bl_model *screening, const double *params, double T,
                   const bl_opts *o);

/* Rebuild the target factor of a set-up case with the projectile's charge
** form factor, a monopole of root-mean-square radius `radius` fm, on the
** momentum transfer to the atom: W -> F_p(q)^2 W (Born approximation; the
** photon vertex is real, F_p(0) = 1).  Used to estimate what the point
** charge leaves out (bl_target_born_dk_e); no method applies it.
** BL_EDOMAIN for radius <= 0 or not finite; BL_EMODEL if the poles do not
** fit.  Undo it with bl_case_setup. */
int bl_case_set_formfactor (bl_case *c, double radius);

/*
** The factor on the static-charge electron term S(q)/(Z^2 q^4) at photon
** energy k (MeV) that makes it the bound electron term: 1 where the case
** keeps the static charges (c->ebt == 0: electrons off, or a projectile
** lighter than BL_EBH_M_MIN other than e-/e+); else the tabulated ratio of the tree-level
** cross section on a free electron at rest with recoil, radiation of both
** lines, exchange (e-) or annihilation (e+), weighted by the Hartree-Fock
** S(q)/Z of the struck electron (src/core/ebrems/), to the static term,
** per atomic electron: continuous in Z, T and k, exactly 0 at and above
** the end point c->ekmax (DEVELOPERS.md, "Electron-target
** bremsstrahlung", "Wired in", "Muons", "Other projectiles").
** bl_case_setup sets c->ebt = 1, 2, 3, 4 for an electron, a positron, a
** muon, an antimuon (spin 1/2, |charge| 1 and that mass), 5 for any other
** projectile of mass at least BL_EBH_M_MIN (any charge z, spin 0 or 1/2:
** the table's three charge parts, R = R_P + R_I / z + R_E / z^2), with
** electrons on and a model that has an electron field.  With
** opts.eradiation = BL_ERAD_PROJECTILE, muons too take ebt 5 and both
** keep R_P only (the limit z -> infinity of R(z)).  Outside the table of
** ebt 5 the ratio is held at its edge: where T is above 10 TeV the case
** carries BL_WARN_ERANGE; elsewhere (mass above BL_EBH_M_MAX, T/m below
** BL_EBH_TAU_MIN) c->ebexact is set, and bl_method_dk_e (so every
** dsigma/dk and integral of the target room) takes the exact term instead
** (the held value was 7-49 % high for 30 GeV - 1 TeV masses; the event
** sampler, which keeps the held ratio, warns BL_WARN_ERANGE).
*/
#define BL_EBH_M_MIN 100.0     /* MeV: the lowest mass node */
#define BL_EBH_M_MAX 1e4       /* MeV: the highest mass node */
#define BL_EBH_TAU_MIN 0.01    /* T/m of the lowest energy node */
double bl_case_eratio (const bl_case *c, double k);

/* 1 where bl_case_eratio is held below the first u node of its table and
** that is known to be too low: muons (c->ebt 3, 4) from T = 1 GeV at k
** below bl_ebm_u[0] k_max (other projectiles, c->ebt 5: below 1e-3 k_max
** where that is above 10 keV), where the struck electron's radiation keeps
** rising (measured: the true ratio is 3.1 times the held one at 1e-5 k_max
** for 10 GeV, 9.7 times for 1 TeV, 1.00 at 100 MeV; DEVELOPERS.md,
** "Muons"); else 0, and 0 for the projectile's radiation alone
** (BL_ERAD_PROJECTILE: R_P is flat there, held within 2.3 %).  The
** target room flags such points BL_WARN_EHELD.  bl_case_eheld_k: that
** photon energy (MeV), 0 where nothing is held so. */
int bl_case_eheld (const bl_case *c, double k);
double bl_case_eheld_k (const bl_case *c);

/* Uniform sphere of radius R: F_N(x)^2 with x = q R, and the rational
** approximation the core integrates (src/core/born/nucleus.c). */
double bl_nucleus_ff2 (double x);
double bl_nucleus_ff2_fit (double x);

/* Fully differential d3sigma/(dk dOmega_k dOmega_p), mb/(MeV sr^2), at photon
** energy k (MeV, 0 < k < T), photon polar angle theta_k and final-particle
** polar angle theta_p (radians from the beam axis, in [0, pi]) and azimuth
** phi between them around the beam axis.  exceptions: BL_EDOMAIN */
int bl_dcs_full_e (const bl_case *c, double k, double theta_k,
                   double theta_p, double phi, bl_result *out);

/* d2sigma/(dk dOmega_k), mb/(MeV sr), integrated over the final particle.
** exceptions: BL_EDOMAIN, GSL_EMAXITER, GSL_EROUND (out still filled) */
int bl_dcs_angular_e (const bl_case *c, double k, double theta_k,
                      bl_quad *q, bl_result *out);

/* dsigma/dk, mb/MeV, integrated over photon and particle directions.
** exceptions: BL_EDOMAIN, GSL_EMAXITER, GSL_EROUND (out still filled) */
int bl_dcs_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out);

#ifdef __cplusplus
}
#endif

#endif
