/*
** bl_target.h -- a material as the target of a projectile: every
** observable of the library for a whole material (the sum over its
** elements with their weights), callable from C
** See Copyright Notice in LICENSE
**
** A bl_target holds one case per element of the material (bl_case), the
** tables of the chosen method (bl_he), the weights (atoms per formula
** unit) and the medium's suppression.  Cross sections are per formula
** unit of the material (bl_material.h, "formula unit"); multiply by
** bl_material_per_gram for cm^2/g.  Every function returns a status and
** never prints or aborts; on a hard failure the result names the element
** and photon energy where it happened (bl_tresult.Z, .k) and keeps that
** element's estimate (.fail).  A non-convergence status (bl_status_soft)
** means the result is the best estimate, with BL_WARN_TOLERANCE set.
**
** Ownership: the caller owns each bl_target, on the stack or the heap
** (it is large: about 130 KB with BL_MATERIAL_MAXCOMP elements), fills it
** with
** bl_target_setup and bl_target_prepare and gives back the references it
** holds with bl_target_release.  Thread safety: a prepared target is read
** only; several threads may compute with one target at once, each with its
** own workspace (bl_quad).
*/
#ifndef BL_TARGET_H
#define BL_TARGET_H

#include <stddef.h>

#include "bl_dcs.h"
#include "bl_material.h"
#include "bl_method.h"
#include "bl_models.h"
#include "bl_particle.h"
#include "bl_quad.h"
#include "bl_result.h"
#include "bl_suppress.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What a target computes at one photon energy. */
enum {
  BL_TARGET_DK       = 0,   /* dsigma/dk, mb/MeV (suppression applied) */
  BL_TARGET_ANGULAR  = 1,   /* d2sigma/(dk dOmega_k), mb/(MeV sr) */
  BL_TARGET_FULL     = 2    /* d3sigma/(dk dOmega_k dOmega_p), mb/(MeV sr^2) */
};

typedef struct bl_target {
  bl_particle particle;
  bl_material material;
  double T;                            /* kinetic energy, MeV */
  int method;                          /* BL_METHOD_* of dsigma/dk */
  bl_suppress sup;                     /* mode BL_SUPPRESS_NONE: none */
  int n;                               /* elements */
  double atoms[BL_MATERIAL_MAXCOMP];   /* per formula unit */
  bl_case c[BL_MATERIAL_MAXCOMP];
  bl_he he[BL_MATERIAL_MAXCOMP];       /* high-energy tables (prepare) */
  unsigned warn;                       /* warnings of every case */
  int estatic;                         /* 1: angular values keep the static
                                       ** term's shape for the bound
                                       ** electron part, scaled by R(k) (the
                                       ** event sampler's; flagged
                                       ** BL_WARN_ESHAPE); 0 (set up): the
                                       ** exact one (bl_method_angular_e) */
} bl_target;

/*
** The result of a target computation.  r is the sum over the elements:
** values and errors weighted and added, warnings and applied corrections
** united, method that of the last element.  Also over every element
** result that entered (for integrals, every point of the integrand):
** zborn, the largest Z whose result carried BL_WARN_BORN (0: none); supp,
** the smallest suppression factor applied (1: none); used, the bits
** 1 << BL_METHOD_* of the methods used.  Z names the element of a hard
** failure (else the last element computed, or for integrals over k the
** first element), k its photon energy (MeV), fail that element's result.
*/
typedef struct bl_tresult {
  bl_result r;
  int zborn;
  double supp;
  unsigned used;
  int Z;
  double k;
  bl_result fail;
  double eshare;   /* with BL_WARN_ESHAPE: the share of r.val that the
                   ** flagged electron parts carry; 0 otherwise */
  double eborn;    /* with BL_WARN_EBORN (method "partial"), for dsigma/dk
                   ** points and spectra: the share of r.val that the
                   ** electron parts added by Born carry; 0 otherwise (and
                   ** for integrals over k) */
} bl_tresult;

/*
** Set up target t: projectile p on material m (at least one element) at
** kinetic energy T (MeV), screening model `screening` with parameters
** `params` (NULL: defaults), target options o (NULL: bl_opts_bare), method
** (BL_METHOD_*) and suppression sup (NULL: none; else from
** bl_suppress_init for this medium and projectile).  No table is built
** yet: call bl_target_prepare.  On failure t->Z-like information is in
** *failZ (if not NULL): the element whose case was refused.
** exceptions: those of bl_case_setup, BL_EDOMAIN (empty material, unknown
** method, NULL argument)
*/
int bl_target_setup (bl_target *t, const bl_particle *p,
                     const bl_material *m, const bl_model *screening,
                     const double *params, double T, const bl_opts *o,
                     int method, const bl_suppress *sup, int *failZ);

/*
** Build or fetch the tables the method needs for every element
** (bl_method_prepare; the first use of an element costs milliseconds, of a
** nuclear-size node up to a second), with workspace q.
** exceptions: those of bl_method_prepare; *failZ as above
*/
int bl_target_prepare (bl_target *t, bl_quad *q, int *failZ);

/* Give back the references t holds on the process-wide table cache
** (bl_he_release of every element).  NULL-safe; t may be set up again
** afterwards.  A failed bl_target_prepare has already released t. */
void bl_target_release (bl_target *t);

/*
** One point of `kind` (BL_TARGET_*) at photon energy k (MeV) and, for
** BL_TARGET_ANGULAR, photon angle theta_k; for BL_TARGET_FULL also the
** final-particle angle theta_p and azimuth phi (radians, see
** bl_dcs_full_e).  dsigma/dk uses the method of t and its suppression;
** the angular forms are the Born integral.  q may be NULL for
** BL_TARGET_FULL.
** exceptions: the first hard failure of an element (out->Z, out->k,
** out->fail), BL_ENONFINITE (an element gave a non-finite value), or the
** last soft status (out filled, BL_WARN_TOLERANCE set)
*/
int bl_target_point_e (const bl_target *t, int kind, double k, double theta_k,
                       double theta_p, double phi, bl_quad *q,
                       bl_tresult *out);

/* dsigma/dk of the target at k: bl_target_point_e with BL_TARGET_DK. */
int bl_target_dk_e (const bl_target *t, double k, bl_quad *q,
                    bl_tresult *out);

/*
** The exact-Born dsigma/dk of the target at k, against which warnings
** size what a method or the point charge leaves out: every element by
** the Born integral (BL_METHOD_BORN) with its corrections, or without
** them when plain is non-zero; with the projectile's charge form factor
** of root-mean-square radius `radius` fm when radius > 0
** (bl_case_set_formfactor).  Exceptions as bl_target_dk_e; BL_EDOMAIN for
** radius < 0 or q NULL.
*/
int bl_target_born_dk_e (const bl_target *t, double k, int plain,
                         double radius, bl_quad *q, bl_tresult *out);

/*
** dsigma/dk at the n photon energies k[0..n-1] on nthreads threads per
** element (bl_spectrum_method_e: bit for bit the same for any count);
** out[i] and status[i] (status may be NULL) per point.  Allocates scratch
** space for n results.  Returns BL_SUCCESS, the first hard failure in the
** order element by element, point by point (that point's out->Z, ->k,
** ->fail say where), or BL_ENOMEM.  With the workspace's stop flag set
** (bl_quad_set_stop) it returns BL_EINTR; the points finished over every
** element are complete in out[] and every other point has status
** BL_EINTR (a target of several elements finishes none before its last
** element has begun).
*/
int bl_target_spectrum_e (const bl_target *t, size_t n, const double *k,
                          int nthreads, bl_quad *q, bl_tresult *out,
                          int *status);

/*
** Integrals over the photon energy, kmin < k < kmax (0 <= kmin < kmax <=
** T), at the tolerance of q (the points take half of it: see
** bl_kintegral_e).  kind BL_TARGET_DK integrates dsigma/dk, kind
** BL_TARGET_ANGULAR d2sigma/(dk dOmega) at photon angle theta_k.  Moment
** 0 into *r0 and moment 1 (int k f dk) into *r1 on shared points; either
** may be NULL, not both.  Breakpoints come from bl_method_breaks, those
** whose jump cannot matter at the tolerance dropped.  q's tolerance is
** restored before return.
** exceptions: as bl_kintegral2_e; a hard failure names its element and k
*/
int bl_target_kintegral_e (const bl_target *t, int kind, double theta_k,
                           double kmin, double kmax, bl_quad *q,
                           bl_tresult *r0, bl_tresult *r1);

/*
** The integrated observables.
** cross_section: sigma (mb per formula unit) of photons with kmin < k <
**   kmax and the first moment (MeV mb); bl_target_mean_k gives the mean
**   photon energy and its error from them.
** energy_loss: the radiative stopping power int_0^T k dsigma/dk dk,
**   MeV mb per formula unit (times bl_material_per_gram: MeV cm^2/g).
** dsdomega: dsigma/dOmega_k (mb/sr) of photons kmin < k < kmax at
**   theta_k.
*/
int bl_target_cross_section_e (const bl_target *t, double kmin, double kmax,
                               bl_quad *q, bl_tresult *sigma,
                               bl_tresult *moment1);
void bl_target_mean_k (const bl_result *sigma, const bl_result *moment1,
                       double kmin, double kmax, double *mean, double *err);
int bl_target_energy_loss_e (const bl_target *t, bl_quad *q,
                             bl_tresult *out);
int bl_target_dsdomega_e (const bl_target *t, double kmin, double kmax,
                          double theta_k, bl_quad *q, bl_tresult *out);

/* Most bins of one photon_yield; thin-radiator range (warn above it). */
#define BL_YIELD_MAXBINS 100000
#define BL_YIELD_THIN_X0 0.05
enum { BL_SPACING_LINEAR = 0, BL_SPACING_LOG = 1 };

/*
** Photons per incident particle emitted in nbins bins of photon energy
** between kmin and kmax (linear or logarithmic spacing) by a thin
** radiator of `thickness` g/cm^2 of the target's material:
** edges[0..nbins] receives the bin edges (exact ends), out[i] the photons
** of bin i.  Stops at the first bin that fails hard; *failbin (if not
** NULL) is its index (-1: none).  A bin that only missed the tolerance
** carries BL_WARN_TOLERANCE and the call still returns BL_SUCCESS.
** exceptions: the hard failure of a bin (as bl_target_kintegral_e),
** BL_EDOMAIN for nbins outside 1..BL_YIELD_MAXBINS or kmin <= 0 with log
** spacing
*/
int bl_target_photon_yield_e (const bl_target *t, double thickness,
                              double kmin, double kmax, int nbins,
                              int spacing, bl_quad *q, double *edges,
                              bl_tresult *out, int *failbin);

/*
** The work one request may plan, in integrand calls (about an hour on one
** core), and an estimate of what n points of `share` dsigma/dk points each
** cost on a target of nelem elements at tolerance rtol.
*/
#define BL_WORK_MAX 1e10
#define BL_WORK_NS_PER_CALL 400.0   /* rough cost of one call, for messages */
#define BL_WORK_ANGULAR 0.02        /* an angular point / a dsigma/dk point */
#define BL_WORK_KINTEGRAL 45.0      /* points of one integral over k */
double bl_work_estimate (double rtol, int nelem, double n, double share);

/* The work one integral over k (cross_section, energy_loss) may plan, in
** integrand calls (about 100 s on one core): a single integral cannot be
** split over a scan, so its bound is tighter than BL_WORK_MAX. */
#define BL_WORK_INTEGRAL_MAX 2.5e8

/* The share of one adaptive integral over k at tolerance rtol, in
** dsigma/dk points: BL_WORK_KINTEGRAL at rtol >= 1e-3, growing by 10^0.1
** per decade below (measured, src/core/target/target.c). */
double bl_work_kintegral (double rtol);

#ifdef __cplusplus
}
#endif

#endif
