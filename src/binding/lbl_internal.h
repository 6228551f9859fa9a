/*
** lbl_internal.h -- declarations shared by the binding files
** (src/binding/l*.c), each using only those before it, not public
** See Copyright Notice in LICENSE
*/
#ifndef LBL_INTERNAL_H
#define LBL_INTERNAL_H

#include <signal.h>

#include "lbl_compat.h"

#include "brakelight.h"
#include "brakelight/lbrakelight.h"

#define LBL_MATMETA "brakelight.Material"   /* material object */

/*
** The raising helpers never return (luaL_error longjmps): said to the
** compiler and to the analyzers, with their printf format checked.
*/
#if defined(__GNUC__)
#define LBL_RAISES(f) __attribute__((noreturn, format(printf, f, f + 1)))
#define LBL_UNREACHABLE() __builtin_unreachable()
#else
#define LBL_RAISES(f)
#define LBL_UNREACHABLE() ((void)0)
#endif

/* Raise a Lua error with a printf-style message.  Never returns. */
LBL_RAISES(2) int lbl_fail (lua_State *L, const char *fmt, ...);

/* Raise "bad argument #1 to 'fname' (msg)".  Never returns. */
LBL_RAISES(3) int lbl_argfail (lua_State *L, const char *fname,
                                const char *fmt, ...);

/* Raise "bad argument #1 to 'fname' (<what> contains a NUL byte ...)"
** when the string at idx has an embedded NUL byte (C would read it cut
** short). */
void lbl_checktext (lua_State *L, int idx, const char *fname,
                    const char *what);

/* The Lua value at idx described for a message, into buf (size n). */
const char *lbl_showval (lua_State *L, int idx, char *buf, size_t n);

/*
** Materials (src/binding/lmaterial.c).
** lbl_material_open: create the material metatable and add the material
** functions to the module table at the top of the stack.
** lbl_totarget: read the Lua value at idx as a target -- a material object,
** an element symbol or name, a catalogue key or alias, a chemical formula,
** or an integer Z -- into *out; on bad input raise
** "bad argument #1 to 'fname' (field 'field' ...)" naming the value and what
** is allowed.
** lbl_describe: what *m is and where its density comes from, into buf.
** lbl_tothickness: field `key` of the table at absolute index t as a
** thickness in g/cm^2 of material *m: a number (g/cm^2) or a string
** "<number> <unit>" (um, mm, cm, m with the density; g/cm2; X0); raises
** naming the field, the value and what is allowed.
*/
void lbl_material_open (lua_State *L);
void lbl_totarget (lua_State *L, int idx, const char *fname,
                   const char *field, bl_material *out);
void lbl_describe (const bl_material *m, char *buf, size_t n);
double lbl_tothickness (lua_State *L, int t, const char *fname,
                        const char *key, const bl_material *m);

/*
** Helpers (src/lhelpers.c).  lbl_helpers_open: give the module table at the
** top of the stack the __index metamethod that loads brakelight.scan,
** .plot, .merge, .json ("brakelight.<name>") on first use.
*/
void lbl_helpers_open (lua_State *L);

/*
** The system helpers (src/binding/lsys.c): lbl_sys_open puts
** "brakelight.sys" in package.preload; lbl_stopflag is the flag that
** lbl_interrupt sets, the stop flag of every workspace of the module.
*/
void lbl_sys_open (lua_State *L);
const volatile sig_atomic_t *lbl_stopflag (void);

/*
** Replace field `name` of the table on top, a computing library function,
** by a closure that calls it with SIGINT and SIGTERM guarded, so that a
** long call stops at its next point in any host (src/binding/lsys.c).
*/
void lbl_guardfield (lua_State *L, const char *name);

/* Shared by the binding files (macros, the call's options and warnings). */
#define QUADMETA  "brakelight.Quad"       /* integration workspace */
#define PARTMETA  "brakelight.Particle"   /* particle object */
#define TARGETMETA "brakelight.Target"    /* a call's target (internal) */

#define QUAD_LIMIT   1000     /* subintervals per nesting level */
#define MSGSIZE      1024     /* longest error or warning message */
#define NAMESIZE     512      /* longest "allowed: ..." list */
#define OPTSTRLEN    256      /* longest string option (a name) + 1 */

#define RTOL_DEFAULT BL_QUAD_RTOL_DEFAULT
#define RTOL_MIN     BL_QUAD_RTOL_MIN
#define RTOL_MAX     BL_QUAD_RTOL_MAX
#define SCREENING_DEFAULT "hartree-fock"
#define METHOD_DEFAULT    BL_METHOD_AUTO
#define CUSTOM_NAME       "custom"   /* name of a particle made without one */

/* Everything a computation needs besides its abscissae. */
typedef struct Opts {
  const char *fname;          /* Lua name of the function, for messages */
  bl_particle particle;
  bl_material target;
  int Z;                      /* the component being computed (messages) */
  const bl_model *screening;
  bl_opts bo;                 /* electrons, nucleus, corrections */
  double T;                   /* kinetic energy, MeV */
  double rtol;                /* relative tolerance (integrals only) */
  int userol;                 /* rtol is an option of this function */
  int method;                 /* BL_METHOD_* requested */
  unsigned used;              /* bit 1 << BL_METHOD_* of each method used */
  bl_suppress sup;            /* LPM / dielectric suppression */
  char pname[OPTSTRLEN];      /* the particle's name, owned here */
} Opts;


/* Warnings gathered over the points of one call. */
typedef struct Warnings {
  unsigned bits;       /* union of BL_WARN_* over all points and the case */
  int npts, ntol;      /* points computed / points short of the tolerance */
  double worst;        /* worst relative error estimate among the latter */
  char worstat[64];    /* where it was ("k = 5 MeV") */
  double kborn;        /* largest k flagged BL_WARN_BORN; < 0: none */
  int zborn;           /* largest Z flagged BL_WARN_BORN */
  unsigned applied;    /* union of BL_APPLIED_* over all points */
  double minsup;       /* smallest suppression factor applied */
  double sysrel;       /* largest relative model uncertainty (sys/val) */
  double kwin[2];      /* an integral's photon-energy window; 0 0: points */
  char sysat[64];      /* where it was */
  const bl_target *t;  /* the call's target: the sizes of the POINTLIKE,
                       ** METHOD and CLAMPED warnings are measured on it */
  double kseen;        /* largest k of a point; 0: none */
  double kbit[BL_WARN_COUNT];  /* largest k flagged by each bit; 0: none */
  double eshare;       /* largest share of a point's value carried by an
                       ** electron part flagged BL_WARN_ESHAPE; 0: none
                       ** measured */
  double eborn;        /* largest share of a point's value carried by
                       ** the electron part that method "partial" adds
                       ** as Born (BL_WARN_EBORN); 0: none measured */
  double kclamp;       /* smallest k flagged BL_WARN_CLAMPED (the largest
                       ** is kbit's) */
  int nclamp;          /* points flagged BL_WARN_CLAMPED */
} Warnings;


typedef struct LQuad {
  bl_quad *q;   /* NULL when closed */
} LQuad;


/* Field readers (lfields.c), below everything else. */
int lbl_getnum (lua_State *L, int t, const char *fname,
                const char *prefix, const char *key, double *x);
void lbl_checkkeys (lua_State *L, int t, const char *fname,
                    const char *what, const char *const keys[]);
double lbl_neednum (lua_State *L, int t, const char *fname,
                    const char *prefix, const char *key,
                    const char *meaning);
const char *lbl_getstr (lua_State *L, int t, const char *fname,
                        const char *key, char *buf, size_t n);
void lbl_addname (char *buf, size_t n, const char *s);

/* Options (loptions.c): every value read once into C, checked, then used. */
const char *lbl_methodnames (char *buf, size_t n);
void lbl_readopts (lua_State *L, const char *fname,
                   const char *const keys[], int userol, Opts *o);
double lbl_optrange (lua_State *L, const Opts *o, const char *key,
                     const char *meaning, double lo, double hi, int open,
                     const char *range);
double *lbl_optarray (lua_State *L, const Opts *o, const char *key,
                      double lo, double hi, int open, const char *range,
                      lua_Integer *n);
double lbl_optk (lua_State *L, const Opts *o);
void lbl_optwindow (lua_State *L, const Opts *o, double *kmin,
                    double *kmax);
int lbl_optthreads (lua_State *L, const Opts *o);
void lbl_nocoulomb (lua_State *L, Opts *o);
void lbl_checkwork (lua_State *L, const Opts *o, const char *key,
                    lua_Integer n, double share);
void lbl_checkintegral (lua_State *L, const Opts *o);

/* Particles (lparticle.c). */
const char *lbl_particlenames (char *buf, size_t n);
void lbl_tabparticle (lua_State *L, int t, const char *fname,
                      const char *prefix, bl_particle *p, char *namebuf);
int l_particle (lua_State *L);
extern const luaL_Reg lbl_particle_meta[];

/* Computing and results (lresults.c). */
bl_quad *lbl_getquad (lua_State *L, const Opts *o);
void lbl_retol (const Opts *o, bl_quad *q);
int lbl_target_gc (lua_State *L);
bl_target *lbl_maketarget (lua_State *L, Opts *o, bl_quad *q);
void lbl_checkresult (lua_State *L, const Opts *o, int st,
                      const bl_result *r, const char *where);
void lbl_initwarn (Warnings *w, const bl_target *t);
void lbl_addwarn (Warnings *w, const bl_result *r, double k,
                  const char *at);
void lbl_addtarget (Opts *o, Warnings *w, const bl_tresult *tr);
double lbl_coulomb_mean (const Opts *o, int Z, double kmin, double kmax);
void lbl_computepoint (lua_State *L, Opts *o, const bl_target *t, int kind,
                       double k, double theta_k, double theta_p,
                       double phi, bl_quad *q, Warnings *w,
                       const char *at, bl_result *sum);
void lbl_kintegral (lua_State *L, Opts *o, const bl_target *t, int kind,
                    double theta, double kmin, double kmax, bl_quad *q,
                    Warnings *w, bl_result *r0, bl_result *r1);
bl_target *lbl_kstart (lua_State *L, Opts *o, bl_quad **q, Warnings *w);
void lbl_pushwarnings (lua_State *L, const Opts *o, const Warnings *w);
double lbl_pergram (const Opts *o);
void lbl_pushelectrons (lua_State *L, const Opts *o);
void lbl_pushnucleus (lua_State *L, const Opts *o);
void lbl_setresult (lua_State *L, int t, int first,
                    const char *const names[], const char *const units[],
                    const Opts *o, const Warnings *w);
void lbl_pushinfo (lua_State *L, const Opts *o, const bl_result *r);
void lbl_setbool (lua_State *L, int t, lua_Integer i, int v);
void lbl_setnum (lua_State *L, int t, const char *key, double v);

/* The library functions (lcalls.c, lintegrals.c), registered by luaopen_brakelight. */
int l_dsdk (lua_State *L);
int l_spectrum (lua_State *L);
int l_angular (lua_State *L);
int l_differential (lua_State *L);
int l_methods (lua_State *L);
int l_models (lua_State *L);
int l_cross_section (lua_State *L);
int l_energy_loss (lua_State *L);
int l_photon_yield (lua_State *L);

/* Events (lsampler.c): the sampler metatable, brakelight.sampler. */
void lbl_sampler_open (lua_State *L);
int l_sampler (lua_State *L);

#endif
