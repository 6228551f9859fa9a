/*
** sampler/internal.h -- the proposal of the event sampler: the maps from
** the unit cube to the photon-frame variables, the grid, the cells and
** the value drawn from (map.c, sampler.c), not public
** See Copyright Notice in LICENSE
*/
#ifndef BL_SAMPLER_INTERNAL_H
#define BL_SAMPLER_INTERNAL_H

#include "methods/internal.h"

#include "brakelight/bl_ebrems.h"
#include "brakelight/bl_sampler.h"

#define SMP_NDIM 4     /* k, photon angle, particle angle, azimuth */
#define SMP_NBIN 64    /* grid bins per dimension */

/* What a channel draws: the element's whole value (the nucleus and the
** atomic electrons' part with static kinematics), its nucleus alone, or
** its bound electrons' exact part (bl_ebrems_full: recoil, end point). */
enum { SMP_ALL = 0, SMP_NUCLEUS = 1, SMP_EXACT = 2 };

/* Most channels: two per element. */
#define SMP_MAXCHAN (2 * BL_MATERIAL_MAXCOMP)

/*
** One channel of an element of the target (kind SMP_*): its case, the
** element, weight, window, grid and cells.  The grid
** maps x in [0, 1)^4 to y in [0, 1)^4 (bin i of dimension d of width
** 1/SMP_NBIN in x holds [edge[d][i], edge[d][i+1]] in y); map.c takes y to
** the physical variables.
*/
typedef struct smp_chan {
  bl_case c;                             /* SMP_NUCLEUS: without electrons */
  int kind, elem;                        /* SMP_*, index in the material */
  bl_ebrems eb;                          /* SMP_EXACT: the exact term */
  double kmax, lnk;                      /* window top (SMP_EXACT: at most
                                         ** the end point), ln(kmax/kmin) */
  double atoms;                          /* per formula unit */
  double edge[SMP_NDIM][SMP_NBIN + 1];
  int hasridge_b;                        /* c.ridge_b is a finite pole */
  /* the Coulomb factor of the nuclear part (conf.coulomb): at x =
  ** ln(k/(cf_E0 - k)) = cf_lo + i cf_step, i < ncf; 1 outside (ncf = 0:
  ** none) */
  int ncf;
  double cf_lo, cf_step, cf_E0, cf[BL_SAMPLER_COULOMB_NODES];
} smp_chan;

/* A point: the photon-frame geometry and what the event needs of it. */
typedef struct smp_point {
  bl_kin kn;
  bl_polar g;
  bl_bracket br;
  double kmev;          /* photon energy, MeV */
  double v, sphi;       /* 1 - cos(phi), sin(phi) >= 0 */
  double qz, dt;        /* q along k, p0 s0 - p s (units of m) */
  double wel, we;       /* the two parts of W at q^2 (Elwert factor in wel) */
  double pe[2][4];      /* SMP_EXACT: the projectile's and the struck
                        ** electron's final four-momenta, MeV, lab frame
                        ** with the photon at azimuth 0 */
  unsigned warn;
} smp_point;

struct bl_sampler {
  int n;                                 /* channels */
  int nelem;                             /* elements */
  int method;                            /* BL_METHOD_BORN or _DISTORTED */
  double kmin, kmax, lnk;                /* window, ln(kmax/kmin) */
  uint64_t seed;
  bl_sampler_conf conf;
  smp_chan ch[SMP_MAXCHAN];
  /* the cells of every channel, channel by channel: ncell per channel */
  int ncell;
  int *celem;                            /* (unused slot kept 0) */
  double *env;                           /* envelope: weight bound per cell */
  double *cumenv;                        /* cumulative env (unweighted) */
  double *prob, *cumprob;                /* weighted mode: cell probabilities */
  double envtot;                         /* sum env * V */
  double sigma, err, share[BL_MATERIAL_MAXCOMP];   /* per element */
  unsigned warn;
  uint64_t evals;
};

/*
** map.c.
** bl_smp_weight: the weight at y (after the grid) of element ch: the value
**   times every Jacobian from the unit cube to (k, Omega_k, Omega_p), in
**   mb; fills *pt.  0 where the kinematics close.
** bl_smp_value: the fully differential value (mb/(MeV sr^2)) at the point pt
**   (its geometry set) for `method`, with the parts of W in pt.
** bl_smp_event: the lab-frame event of point pt with the overall azimuth
**   u_az, the sign of phi u_sign and the hit u_hit (uniforms in [0, 1)).
*/
double bl_smp_weight (const bl_sampler *s, const smp_chan *ch, const double y[4],
                   smp_point *pt);
double bl_smp_value (const bl_sampler *s, const smp_chan *ch, smp_point *pt);
void bl_smp_geometry (const smp_chan *ch, double kmev, double h0, double h,
                   double phi, smp_point *pt);
void bl_smp_event (const smp_chan *ch, const smp_point *pt, double u_az,
                double u_sign, double u_hit, bl_event *ev);

#endif
