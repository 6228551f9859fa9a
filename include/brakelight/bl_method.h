/*
** bl_method.h -- high-energy (small-angle) dsigma/dk from screening functions,
** Tsai's complete-screening formula, and the choice between methods
** See Copyright Notice in LICENSE
*/

#ifndef BL_METHOD_H
#define BL_METHOD_H

#include "bl_dcs.h"
#include "bl_ebrems.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Methods of dsigma/dk.  Stable ids. */
enum {
  BL_METHOD_BORN        = 0,   /* exact first-order Born integral */
  BL_METHOD_HIGH_ENERGY = 1,   /* screening functions, small angles */
  BL_METHOD_COMPLETE    = 2,   /* Tsai's complete-screening formula */
  BL_METHOD_AUTO        = 3,   /* distorted or high-energy, per point */
  BL_METHOD_DISTORTED   = 4,   /* Sommerfeld-Maue distorted waves */
  BL_METHOD_PARTIAL     = 5    /* exact partial waves (dsigma/dk of spin-1/2
                               ** projectiles of the electron mass) */
};
#define BL_METHOD_COUNT 6

/* Where method "partial" holds (bl_partial_check): spin 1/2, a mass within
** BL_PARTIAL_MASS_TOL MeV of BL_ME_MEV (any charge), 0 < T <=
** BL_PARTIAL_T_MAX MeV, nucleus point or uniform.  Its relative tolerance
** is the workspace's, clamped to [BL_PARTIAL_RTOL_MIN, BL_PARTIAL_RTOL_MAX]
** (the range of the partial-wave sums). */
#define BL_PARTIAL_T_MAX     3.0
#define BL_PARTIAL_MASS_TOL  1e-6
#define BL_PARTIAL_RTOL_MIN  1e-6
#define BL_PARTIAL_RTOL_MAX  0.1

/* Below k = BL_PARTIAL_SOFT_Y T method "partial" gives the Born value of
** the elastic part times its partial-wave/Born ratio at that k (the cost
** of the partial waves grows like T/k and their memory with it; by Low's
** theorem the ratio tends to a constant as k -> 0), the ratio's change
** from BL_PARTIAL_SOFT_Y2 T in sys, BL_WARN_PWSOFT. */
#define BL_PARTIAL_SOFT_Y    0.02
#define BL_PARTIAL_SOFT_Y2   0.05

/* Below k = BL_DW_SOFT_Y T the distorted-wave method gives the Born value
** times its distorted/Born ratio at BL_DW_SOFT_Y T (the soft terms of the
** amplitudes cancel beyond double precision there; BL_WARN_SOFT). */
#define BL_DW_SOFT_Y 1e-9

/*
** Where the closed forms hold.  "auto" takes the high-energy method where
** the final gamma = E/m is at least bl_he_gamma_min: BL_HE_GAMMA_MIN and,
** with a uniform nucleus of radius R (x = m R / hbar c <= BL_HE_MR_MAX),
** at least BL_HE_GAMMA_MR x and BL_HE_GAMMA_MR3 x^(1/3).  The nuclear-size
** correction is calibrated at gamma -> infinity; at finite gamma it is
** off by about 2 (x / gamma^3)^(1/2) (measured, src/core/methods/
** highenergy.c), and for Delta > hbar c / (2 R) not known at all.  There
** it agrees with the Born integral within 1e-3 (worst measured 6.5e-4)
** for masses from m_e to 1 TeV, spin 0 and 1/2, Z = 1...100, every
** screening model (tests/test_methods.c); the difference falls like
** 0.27/gamma.  Complete screening also needs Tsai's screening
** variable 100 m_e k / (E0 E Z^1/3) <= BL_COMPLETE_TSAI_GAMMA_MAX (where
** the Thomas-Fermi form departs from its limit by about 0.5 %) and a
** nucleus point-like at q ~ m: m R <= BL_COMPLETE_MR_MAX hbar c.
*/
#define BL_HE_GAMMA_MIN            500.0
#define BL_HE_GAMMA_MR             3.0
#define BL_HE_GAMMA_MR3            250.0
#define BL_COMPLETE_TSAI_GAMMA_MAX 0.02
#define BL_COMPLETE_MR_MAX         0.1
#define BL_HE_MR_MAX               1e6

/* Lua-facing name of a method id ("born", "high-energy", ...); NULL if
** unknown.  Method id of a name; -1 if unknown. */
const char *bl_method_name (int method);
int bl_method_find (const char *name);

/*
** Tabulated screening integrals of one Yukawa representation (cached and
** shared between threads; see src/core/methods/).  Opaque.
*/
typedef struct bl_hetab bl_hetab;

/* Nuclear-size correction of phi1, phi2 at one node of a grid in the
** projectile mass times the nuclear radius, per spin (a constant table in
** the library, src/core/methods/nuc_table.c).  Opaque. */

/* Room in a bl_he for the field of method "partial", in doubles. */
#define BL_PW_FIELD_SIZE 40

/* Most unreferenced screening tables the cache keeps for reuse; beyond,
** the one released longest ago is freed (about 8 KB each). */
#define BL_METHOD_CACHE_IDLE 64
typedef struct bl_nuctab bl_nuctab;

/*
** What the high-energy method needs besides the case: the screening
** tables of the nuclear (elastic) part and of the atomic electrons, the
** tails of their integrals beyond q = m, and the nuclear-size correction.
** Plain data apart from the pointers, which point into the process-wide
** cache.  Ownership: a bl_he filled by bl_he_prepare or bl_method_prepare
** holds one reference on each table and node it points to; give it back
** with bl_he_release once the bl_he is no longer used (the cache keeps
** the entry for reuse or frees it, never while referenced).  A copy made
** by assignment shares the references of its original: release exactly
** one of them, and do not use the others afterwards.  A bl_he that is
** never released only keeps its entries alive (as before references
** existed).
*/
typedef struct bl_he {
  int ready;                  /* filled by bl_he_prepare */
  const bl_hetab *el, *e;     /* NULL: unscreened / no electron field */
  double tail_el[4], tail_e[4];
  int nnuc;                   /* 0: point nucleus; else 4 grid nodes in */
  const bl_nuctab *nuc[4];    /* m R with cubic weights nucw */
  double nucw[4];
  double maxerr;              /* worst interpolation error of the tables
                              ** (absolute, in units of phi) */
  int pwready;                /* method "partial": pw holds the case's
                              ** field (bl_method_prepare) */
  double pw[BL_PW_FIELD_SIZE];  /* that field, opaque (its layout is the
                              ** partial-wave room's, src/core/methods/
                              ** partial.c) */
} bl_he;

/*
** Fill *h for case c: fetch the screening tables of (Z, model) from the
** cache or build them (about 10 ms each, once per process; thread-safe),
** taking one reference on each (see bl_he above).
** The nuclear-size correction of a uniform nucleus comes from a table in
** the library (calibrated once on the Born integral per node of a grid in
** m R and spin, by make nuc-table); q is not used and may be NULL.
** BL_SUCCESS, BL_EDOMAIN (NULL c or h), BL_ENOMEM or a model's failure;
** on failure h holds no reference (cleared).
*/
int bl_he_prepare (const bl_case *c, bl_quad *q, bl_he *h);

/*
** Give back the references of h (from bl_he_prepare or bl_method_prepare)
** and clear it (h->ready = 0).  NULL, or a cleared h, is a no-op.
** Thread-safe.
*/
void bl_he_release (bl_he *h);

/*
** Free every cached screening table that no bl_he references (those in
** use stay valid).  Thread-safe.  bl_method_cache_count: the tables held
** now, referenced or not.
*/
void bl_method_cache_clear (void);
size_t bl_method_cache_count (void);

/*
** Prepare *h for `method` on case c: bl_he_prepare for high-energy, and
** for auto where some photon energy can take it (gamma0 >= the switch);
** for partial the case's field (h->pwready = 1; microseconds, left
** unset where bl_partial_check refuses the case, whose points then
** return BL_EDOMAIN); otherwise h is cleared (h->ready = 0) at no cost.
** Status as bl_he_prepare; release h with bl_he_release.
*/
int bl_method_prepare (const bl_case *c, int method, bl_quad *q, bl_he *h);

/* dsigma/dk (mb/MeV) by the screening-function form.  Warns
** (BL_WARN_METHOD) where the small-angle form does not hold.
** exceptions: BL_EDOMAIN */
int bl_he_dk_e (const bl_case *c, const bl_he *h, double k,
                bl_result *out);

/* dsigma/dk (mb/MeV) by Tsai's complete-screening formula (Tsai 1974,
** eq. 3.83), spin 0 through 1 + v^2 -> 2 v.  exceptions: BL_EDOMAIN */
int bl_complete_dk_e (const bl_case *c, double k, bl_result *out);

/*
** Method "partial": 0 if it takes projectile p on Z at kinetic energy T
** (MeV) with target options o (NULL: bl_opts_bare), else BL_EDOMAIN with
** a message naming the parameter, its value and the allowed range in
** msg[0..size-1] (msg may be NULL): spin 1/2 and a mass within
** BL_PARTIAL_MASS_TOL MeV of BL_ME_MEV, 0 < T <= BL_PARTIAL_T_MAX, Z in
** 1..100, nucleus point or uniform (the incoherent nucleus is refused),
** and with a point nucleus |z| Z alpha < 1 (the waves kappa = -+1).
*/
int bl_partial_check (const bl_particle *p, int Z, double T,
                      const bl_opts *o, char *msg, size_t size);

/*
** dsigma/dk (mb/MeV) by method "partial" (src/core/methods/partial.c):
** the exact partial-wave value in the case's field (screening's Yukawa
** form, nucleus point or uniform: the elastic part (Z F_N - F)^2 to all
** orders in z Z alpha), plus, with the atomic electrons on, their part
** as the Born room has it (bl_partial_epart_e; BL_WARN_EBORN); below
** BL_PARTIAL_SOFT_Y T the elastic part is its Born value times the
** partial-wave/Born ratio there (sys, BL_WARN_PWSOFT).  h: the
** field from bl_method_prepare, or NULL (made here, 20 us).  Relative
** tolerance: q's, clamped to [BL_PARTIAL_RTOL_MIN, BL_PARTIAL_RTOL_MAX].
** Seconds per point (0.1-0.6 s at 10 keV on Au, 2-60 s at 1 MeV, CPU).
** exceptions: BL_EDOMAIN (bl_partial_check, k not in (0, T), NULL c, q
** or out), BL_ENOTCONV (sums not converged: value filled, tolerance
** warning), BL_ENOMEM, BL_ENONFINITE, the Born integrals' codes
*/
int bl_partial_dk_e (const bl_case *c, const bl_he *h, double k,
                     bl_quad *q, bl_result *out);

/*
** The atomic-electron part that method "partial" adds at photon energy
** k: Born with the electrons minus Born without them (both without the
** Elwert factor and the Coulomb correction, the case's nucleus), as the
** distorted-wave method adds it; for e-/e+ the bound electron term the
** case scales (bl_case_eratio).  0 (no integral) where the case has no
** electrons or bl_case_eratio(c, k) is 0.  exceptions: BL_EDOMAIN and
** the Born integrals' codes (out still filled where soft)
*/
int bl_partial_epart_e (const bl_case *c, double k, bl_quad *q,
                        bl_result *out);

/* 1 if the high-energy method holds at photon energy k of case c to
** 1e-3 (the switch of method "auto"): the final gamma is at least
** bl_he_gamma_min(c); 0 otherwise. */
int bl_he_valid (const bl_case *c, double k);

/* The smallest final gamma = E/m where the high-energy method holds for
** case c: BL_HE_GAMMA_MIN, or with a uniform nucleus (x = m R / hbar c)
** BL_HE_GAMMA_MR x or BL_HE_GAMMA_MR3 x^(1/3) if larger; HUGE_VAL where
** the nuclear-size table ends (x > BL_HE_MR_MAX) or c is NULL. */
double bl_he_gamma_min (const bl_case *c);

/*
** dsigma/dk by `method` (BL_METHOD_*); h may be NULL for born,
** complete, distorted and partial (which then makes its field per call).
** out->method is the method actually used.
** exceptions: as the method's function
*/
int bl_method_dk_e (const bl_case *c, const bl_he *h, int method, double k,
                    bl_quad *q, bl_result *out);

/*
** d2sigma/(dk dOmega_k) and the fully differential cross section by
** `method`: the distorted-wave method's own (BL_METHOD_DISTORTED), the
** Born integrals for every other method (the closed forms have no
** angles) but "partial", which gives dsigma/dk only: BL_EDOMAIN (out
** cleared).  Arguments, units and exceptions as bl_dcs_angular_e and
** bl_dcs_full_e.  Where bl_method_eexact(c), the angular distribution's
** electron part is the exact bound electron term's own distribution
** (bl_ebrems_angular_e times Z) added to the method's nuclear part, and
** so is the fully differential value's (bl_ebrems_full times Z: the
** projectile's energy and the struck electron's momentum from
** conservation, so the electron part's projectile is not at E0 - k).
*/
int bl_method_angular_e (const bl_case *c, int method, double k,
                         double theta_k, bl_quad *q, bl_result *out);
int bl_method_full_e (const bl_case *c, int method, double k, double theta_k,
                      double theta_p, double phi, bl_result *out);

/* The fully differential value by `method` with the electron part the
** static term's (projectile at E0 - k) scaled by R(k): what
** bl_method_full_e gives where not bl_method_eexact, and the kinematics of
** the event sampler's events on atomic electrons. */
int bl_method_full_scaled_e (const bl_case *c, int method, double k,
                             double theta_k, double theta_p, double phi,
                             bl_result *out);

/* 1 if the angular distribution of case c takes its electron part from
** the exact bound electron term: a projectile with the table's bound
** term (c->ebt) and electrons on, T within bl_ebrems_init's range (1 TeV
** for e-/e+, 10 TeV for the others); 0 otherwise (then R(k) times the
** static term's shape, as for dsigma/dk). */
int bl_method_eexact (const bl_case *c);

/* The angular distribution by `method` with the electron part the static
** term's shape scaled by R(k) (what bl_method_angular_e gives where not
** bl_method_eexact): cheaper, and the shape of the event sampler's
** events on atomic electrons. */
int bl_method_angular_scaled_e (const bl_case *c, int method, double k,
                                double theta_k, bl_quad *q, bl_result *out);

/* The exact bound electron term of case c into e: its projectile on one
** bound electron of c's element (bl_ebrems_init at c's T), binding by the
** case's S(q) (bl_ebrems_set_binding), the radiation the case counts
** (c->opts.eradiation).  BL_EDOMAIN where bl_ebrems refuses the case
** (not where bl_method_eexact). */
int bl_method_eterm (const bl_case *c, bl_ebrems *e);

/* The case c set up again without its atomic electrons (the nuclear part
** alone, screened as before) into cn.  Exceptions of bl_case_setup. */
int bl_method_nuclear (const bl_case *c, bl_case *cn);

/* How far R(k) may stray from 1 before a value with the static term's
** angular shape is flagged (BL_WARN_ESHAPE): where R = 1 the recoil is
** negligible and the static shape is the bound term's. */
#define BL_ESHAPE_R 0.01

/* 1 if a value at k that keeps the static term's angular shape for the
** bound electron term (the angular distribution and the fully
** differential value where not bl_method_eexact) misplaces it: the case has
** the bound term (c->ebt), electrons on, and 0 < R(k) with |R(k) - 1| >
** BL_ESHAPE_R (from the end point on the electron part is 0). */
int bl_method_eshape (const bl_case *c, double k);

/*
** Photon energies (MeV) where dsigma/dk of case c by `method` jumps or
** bends: the Coulomb correction switching off ("coulomb" automatic), for
** "auto" the change of method, and for e-/e+ with electrons the two kinks
** of the bound electron term before its end point (bl_case_eratio).  Writes at most nmax into k and a bound on the
** relative size of each jump into jump; returns the count.
*/
int bl_method_breaks (const bl_case *c, const bl_he *h, int method,
                      double *k, double *jump, int nmax);

#ifdef __cplusplus
}
#endif

#endif
