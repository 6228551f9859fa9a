/*
** bl_sampler.h -- bremsstrahlung events drawn from the fully differential
** cross section of a target, and the counter-based random numbers they use
** See Copyright Notice in LICENSE
**
** A bl_sampler draws events (photon, outgoing projectile, momentum given to
** the atom) of a projectile on a target (bl_target: an element or a
** material) with photon energies kmin < k < kmax, from the fully
** differential value of the target's method (bl_method_full_scaled_e: the
** distorted waves for BL_METHOD_DISTORTED, the Born cross section for
** every other method; the atomic electrons' part with the static
** kinematics).  Setup builds an adaptive proposal per element over
** the mapped variables of the Born integrator (src/core/sampler/); then
** events come unweighted (accept-reject) or weighted.
**
** What the events include: the fully differential value with the Elwert
** factor where the case applies it; not the suppression of the medium
** (LPM, dielectric).  The Coulomb correction is known for dsigma/dk only:
** by default the events leave it out, and their sigma is what
** bl_target_cross_section_e gives with the correction off; with
** conf.coulomb = 1 the nuclear part of the value at photon energy k is
** multiplied by 1 - Delta(k)/dsigma_N/dk (Delta the correction, dsigma_N
** the nuclear part's Born dsigma/dk, tabulated at BL_SAMPLER_COULOMB_NODES
** energies of the window, interpolated in ln(k/(E0 - k))) where the case's
** option applies the correction: sigma then follows the library's, and
** the correction is spread over the angles like the Born value (an
** approximation: its angular shape is not known here).  Static field: on
** the nucleus the atom takes the momentum q = p0 - p - k and no energy
** (its recoil energy q^2/2M is neglected), so E0 = E + k.  Atomic
** electrons: where the element's bound electron part is the exact term
** (bl_method_eexact, unless t->estatic) the events on them follow that
** term's own fully differential distribution (bl_method_full_e's
** electron part; drawn in the rest frame of the final projectile and
** electron) with the struck electron's recoil: q is its momentum, E0 + m_e
** = E + k + (q^2 + m_e^2)^1/2, recoil = 1 (the electron free and at rest
** in the kinematics; its binding weighs the rate only).  Elsewhere (e-/e+
** above 1 TeV, others above 10 TeV, masses between 2 m_e and 100 MeV, or
** t->estatic) the electron part keeps the static atom's kinematics and
** the static term's angular shape scaled to dsigma/dk (recoil = 0).
**
** Reproducibility: events are made in blocks of BL_SAMPLER_BLOCK; block b
** of a run uses its own random stream (seed, b), so event i is the same
** for a given seed whatever the number of threads, and any range of blocks
** (a shard, a Slurm array task) is computed alone.  Setup uses streams of
** its own, disjoint from every event stream.
**
** Thread safety: a sampler is read only once made; bl_sampler_events may
** run on several threads at once (it starts its own threads too).
*/
#ifndef BL_SAMPLER_H
#define BL_SAMPLER_H

#include <stddef.h>
#include <stdint.h>

#include "bl_target.h"

#ifdef __cplusplus
extern "C" {
#endif

/*
** Random numbers: Philox4x32-10 (Salmon, Moraes, Dror & Shaw 2011,
** "Parallel random numbers: as easy as 1, 2, 3", SC11), a counter-based
** generator: output block = a keyed bijection of a 128-bit counter, so
** distinct counters never repeat an input.  Key = the 64-bit seed; counter
** = (draw index, 64 bits; stream, 64 bits): every stream holds 2^64 blocks
** of four 32-bit words, and streams of one seed are disjoint by
** construction.  It passes TestU01's BigCrush (same reference).
*/
typedef struct bl_rng {
  uint32_t key[2];
  uint64_t stream, ctr;
  uint32_t buf[4];
  int used;                /* words of buf already used (4: none left) */
} bl_rng;

/* One Philox4x32-10 block: out = bijection of ctr under key. */
void bl_philox4x32_10 (const uint32_t ctr[4], const uint32_t key[2],
                       uint32_t out[4]);
/* Start stream `stream` of `seed` at its first draw. */
void bl_rng_init (bl_rng *r, uint64_t seed, uint64_t stream);
/* The next 64 random bits, and a uniform double in [0, 1) with 53 random
** bits. */
uint64_t bl_rng_u64 (bl_rng *r);
double bl_rng_uniform (bl_rng *r);

/* Photon energies of the Coulomb factor's table (conf.coulomb). */
#define BL_SAMPLER_COULOMB_NODES 24

/* Events per block (the unit of streams, threads and shards). */
#define BL_SAMPLER_BLOCK 256
/* Most events one bl_sampler_events call returns. */
#define BL_SAMPLER_MAXCALL 100000000

/* How events are drawn. */
enum {
  BL_SAMPLE_UNWEIGHTED = 0,   /* accept-reject: equal weights but overweights */
  BL_SAMPLE_WEIGHTED   = 1    /* one trial each, weight = f / proposal */
};

/* Where the event's momentum transfer went (the target-factor term). */
enum { BL_HIT_NUCLEUS = 0, BL_HIT_ELECTRON = 1 };

/*
** Settings of the proposal (bl_sampler_conf_default fills the defaults):
** iterations and points of the grid training, cells per dimension of the
** envelope (k, photon angle, particle angle, azimuth), trial points per
** cell, and the safety factor on each cell's largest weight seen.
*/
typedef struct bl_sampler_conf {
  int iterations;          /* grid training passes (default 5) */
  int points;              /* points per pass and element (default 10000) */
  int cells[4];            /* cells per dimension (default 8, 6, 6, 4) */
  int cellpoints;          /* trial points per cell (default 200) */
  double safety;           /* envelope = safety x largest weight seen (1.3) */
  int coulomb;             /* 1: the Coulomb correction as a factor of k on
                           ** the nuclear part where the case's option
                           ** applies it (default 0: none); see below */
} bl_sampler_conf;

void bl_sampler_conf_default (bl_sampler_conf *conf);

/*
** One event, lab frame, beam along +z, MeV: four-momenta (E, px, py, pz)
** of the beam particle p0, the photon k and the outgoing projectile p, the
** momentum q given to the atom (p0 = k + p + q, E0 = k_E + p_E: static
** field; for an event with recoil, below, the struck electron's momentum),
** the element struck (index into the material and Z), whether the
** nucleus or an atomic electron took q (BL_HIT_*), the photon-frame
** variables drawn (k, h0 = 1 - cos(theta_k), h = 1 - cos of the angle
** between p and k, phi in [0, 2 pi)), the weight (mb; see
** bl_sampler_events) and the event's number in its run.
*/
typedef struct bl_event {
  double p0[4], k[4], p[4], q[3];
  int elem, Z, hit;
  double kk, h0, h, phi;
  double weight;
  uint64_t id;
  int recoil;      /* 1: an atomic electron took q with its recoil (the
                   ** exact bound electron term): q is its momentum and
                   ** E0 + m_e = k_E + p_E + (q^2 + m_e^2)^1/2; 0: static */
} bl_event;

/*
** The statistics of one bl_sampler_events call (summed over its blocks in
** block order: the same whatever the thread count): trials (proposals),
** events made, sum_w and sum_w2 of the trial estimates (mb) in the
** weighted mode; overweights (unweighted events whose weight exceeded
** their cell's envelope) and excess (the sum over them of weight/envelope
** - 1); sum_r and sum_r2 of r = max(1, weight/envelope) over accepted
** events; nonfinite, trials whose value was not finite (counted as 0).
*/
typedef struct bl_sample_stats {
  uint64_t trials, events, overweights, nonfinite;
  double sum_w, sum_w2, sum_r, sum_r2, excess;
} bl_sample_stats;

typedef struct bl_sampler bl_sampler;   /* opaque */

/*
** Build a sampler for target t (set up; not released before the sampler
** is freed is not required: the sampler copies what it needs) and photon
** energies kmin < k < kmax (MeV, 0 < kmin < kmax <= T), with the settings
** conf (NULL: defaults) and the setup's random streams of `seed`.  Costs
** about 2e5 evaluations of the fully differential value per channel: one
** per element, two where its bound electron part is the exact term
** (bl_method_eexact, unless t->estatic): the nucleus alone, and the
** electrons with their recoil.
** exceptions: BL_EDOMAIN (NULL arguments, a bad window or setting, a
** target of method "partial", which has no angles),
** BL_ENOMEM, BL_ENONFINITE (no finite non-zero value found, or a cross
** section that is not finite); *out is NULL on failure
*/
int bl_sampler_new (const bl_target *t, double kmin, double kmax,
                    uint64_t seed, const bl_sampler_conf *conf,
                    bl_sampler **out);

/* Free s (NULL: nothing). */
void bl_sampler_free (bl_sampler *s);

/*
** What setup found: sigma (mb per formula unit) of the window and its
** statistical error from the envelope's trial points; the envelope's
** integral (what the unweighted mode proposes against) so that
** sigma/envelope is the expected unweighting efficiency; per element i
** (0 .. nelem-1) its share of sigma; the method used (BL_METHOD_BORN or
** BL_METHOD_DISTORTED) and the warnings of the target; evaluations spent.
*/
typedef struct bl_sampler_info {
  double sigma, err, envelope;
  int nelem;
  double share[BL_MATERIAL_MAXCOMP];
  int method;
  unsigned warn;
  uint64_t evaluations;
  double kmin, kmax;
  uint64_t seed;
} bl_sampler_info;

int bl_sampler_info_get (const bl_sampler *s, bl_sampler_info *out);

/*
** Events first .. first+n-1 of a run of `total` events (first + n <=
** total) in `mode`, made on nthreads threads (0: one per processor; the
** events do not depend on it), into ev[0..n-1]; statistics into *stats
** (may be NULL).  Event i comes from block i / BL_SAMPLER_BLOCK (random
** stream i / BL_SAMPLER_BLOCK of the seed); a range that starts inside a
** block makes that block's earlier events again and drops them.
** Weights (mb): weighted mode, f/g / total (f the value, g the proposal
** density), so that the weights of a run sum to an estimate of sigma;
** unweighted mode, r sigma_setup / total with r = max(1, f/envelope): 1
** for all but the overweights, whose excess keeps the sample unbiased
** when the weights are used (their share is in stats).
** exceptions: BL_EDOMAIN (bad range, NULL s or ev), BL_ENOMEM
*/
int bl_sampler_events (const bl_sampler *s, int mode, uint64_t first,
                       size_t n, uint64_t total, int nthreads, bl_event *ev,
                       bl_sample_stats *stats);

/*
** The cross section a run's statistics estimate, with its error (mb):
** weighted, the sum of weights (err from their spread); unweighted,
** envelope x sum_r / trials (err from the binomial spread of the trials).
** Either is unbiased; the unweighted one needs trials > 0.
*/
void bl_sampler_sigma (const bl_sampler *s, int mode,
                       const bl_sample_stats *st, uint64_t total,
                       double *sigma, double *err);

/* Add the statistics b to a (block order is the caller's). */
void bl_sample_stats_add (bl_sample_stats *a, const bl_sample_stats *b);

/*
** The value the sampler draws from, at photon-frame variables of element
** i: d3sigma/(dk dOmega_k dOmega_p) in mb/(MeV sr^2) (atoms per formula
** unit not included) at photon energy k (MeV), h0 = 1 - cos(theta_k), h =
** 1 - cos(angle of p to k), phi (azimuth around k between the (k, p0) and
** (k, p) planes); for tests against bl_method_full_scaled_e.
** exceptions: BL_EDOMAIN
*/
int bl_sampler_value (const bl_sampler *s, int i, double k, double h0,
                      double h, double phi, double *out);

#ifdef __cplusplus
}
#endif

#endif
