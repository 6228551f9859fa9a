/*
** $Id: lintegrals.c $
** The library functions of the module that integrate over the photon
** energy: brakelight.cross_section, energy_loss, photon_yield.
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"


static const char *const cross_section_keys[] = {
  "particle", "target", "T", "kmin", "kmax", "screening", "rtol", "nucleus",
  "electrons", "coulomb", "elwert", "method", "suppression", NULL
};


static const char *const energy_loss_keys[] = {
  "particle", "target", "T", "screening", "rtol", "nucleus", "electrons",
  "coulomb", "elwert", "method", "suppression", NULL
};


static const char *const photon_yield_keys[] = {
  "particle", "target", "T", "thickness", "kmin", "kmax", "bins", "spacing",
  "screening", "rtol", "nucleus", "electrons", "coulomb", "elwert", "method",
  "suppression", NULL
};


/*
** brakelight.cross_section{..., kmin =, kmax =}
**   -> {sigma, err, sys, mean_k, mean_k_err, kmin, kmax, per_gram, units,
**       settings, warnings}: photons emitted with kmin < k < kmax
*/
int l_cross_section (lua_State *L) {
  static const char *const units[] = {
    "sigma", "mb", "err", "mb", "sys", "mb", "mean_k", "MeV",
    "mean_k_err", "MeV", "kmin", "MeV", "kmax", "MeV", "per_gram", "cm^2/g per mb", NULL
  };
  static const char *const none[] = {NULL};
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_result r0, r1;
  double kmin, kmax, mean, meanerr;
  lbl_readopts(L, "cross_section", cross_section_keys, 1, &o);
  lbl_optwindow(L, &o, &kmin, &kmax);
  lbl_checkintegral(L, &o);
  /* all checks done */
  t = lbl_kstart(L, &o, &q, &w);             /* 2: the target */
  lbl_kintegral(L, &o, t, BL_TARGET_DK, 0.0, kmin, kmax, q, &w, &r0, &r1);
  bl_target_mean_k(&r0, &r1, kmin, kmax, &mean, &meanerr);
  lua_createtable(L, 0, 12);             /* 3: result */
  lbl_setnum(L, 3, "sigma", r0.val);
  lbl_setnum(L, 3, "err", r0.err);
  lbl_setnum(L, 3, "sys", r0.sys);
  lbl_setnum(L, 3, "mean_k", mean);
  lbl_setnum(L, 3, "mean_k_err", meanerr);
  lbl_setnum(L, 3, "kmin", kmin);
  lbl_setnum(L, 3, "kmax", kmax);
  lbl_setnum(L, 3, "per_gram", lbl_pergram(&o));
  lbl_setresult(L, 3, 4, none, units, &o, &w);
  return 1;
}


/*
** brakelight.energy_loss{particle =, target =, T =, ...}
**   -> {dedx, err, sys, per_unit, radiation_length, E_over_X0, note, units,
**       settings, warnings}: the radiative stopping power
**       int_0^T k dsigma/dk dk (note: what it contains)
*/
int l_energy_loss (lua_State *L) {
  static const char *const units[] = {
    "dedx", "MeV cm^2/g", "err", "MeV cm^2/g", "sys", "MeV cm^2/g",
    "per_unit", "MeV mb per formula unit", "radiation_length", "g/cm^2",
    "E_over_X0", "MeV cm^2/g", NULL
  };
  static const char *const none[] = {NULL};
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_result r1;
  double X0;
  lbl_readopts(L, "energy_loss", energy_loss_keys, 1, &o);
  lbl_checkintegral(L, &o);
  /* all checks done */
  t = lbl_kstart(L, &o, &q, &w);             /* 2: the target */
  lbl_kintegral(L, &o, t, BL_TARGET_DK, 0.0, 0.0, o.T, q, &w, NULL, &r1);
  X0 = bl_radiation_length(&o.target);
  lua_createtable(L, 0, 10);             /* 3: result */
  lbl_setnum(L, 3, "dedx", r1.val * lbl_pergram(&o));
  lbl_setnum(L, 3, "err", r1.err * lbl_pergram(&o));
  lbl_setnum(L, 3, "sys", r1.sys * lbl_pergram(&o));
  lbl_setnum(L, 3, "per_unit", r1.val);
  lbl_setnum(L, 3, "radiation_length", X0);
  lbl_setnum(L, 3, "E_over_X0", X0 > 0.0 ? (o.T + o.particle.mass) / X0 : 0.0);
  lua_pushstring(L, o.particle.mass > 2.0 * BL_ME_MEV
                 ? "bremsstrahlung only: e+e- pair production and "
                   "photonuclear interactions also take energy from this "
                   "projectile and are not computed (for muons pair "
                   "production exceeds bremsstrahlung at high energy: "
                   "Review of Particle Physics, passage of particles "
                   "through matter, from memory)"
                 : "bremsstrahlung: the radiative stopping power");
  if (!o.bo.electrons || !(o.particle.mass >= BL_EBH_M_MIN
                            || fabs(o.particle.mass - BL_MMU_MEV)
                               <= 1e-12 * BL_MMU_MEV))
    lua_pushliteral(L, "");   /* no bound electron term: nothing to say */
  else if (o.bo.eradiation == BL_ERAD_PROJECTILE)
    lua_pushliteral(L, "; the electron term counts the projectile's own "
                    "radiation only (electrons = 'projectile'), as muon "
                    "energy-loss tables do");
  else
    lua_pushliteral(L, "; it includes the radiation of the atomic electrons "
                    "the projectile strikes, which muon energy-loss tables "
                    "count in the ionization loss (electrons = 'projectile' "
                    "leaves it out; README, What is computed)");
  lua_concat(L, 2);
  lua_setfield(L, 3, "note");
  lbl_setresult(L, 3, 4, none, units, &o, &w);
  return 1;
}


/*
** brakelight.photon_yield{particle =, target =, T =, thickness =, kmin =,
**   kmax =, bins =, spacing =}
**   -> {edges, k_low, k_high, photons, err, total, thickness,
**       thickness_X0, thickness_cm (with a density), radiation_length,
**       note, units, settings, warnings}: photons per incident particle
**   in each bin of a thin radiator; thickness in g/cm^2, or a string
**   with a unit ("2 mm", "0.1 X0": lbl_tothickness)
*/
int l_photon_yield (lua_State *L) {
  static const char *const units[] = {
    "edges", "MeV", "k_low", "MeV", "k_high", "MeV", "photons",
    "per incident particle", "err", "per incident particle", "total",
    "per incident particle", "thickness", "g/cm^2", "thickness_X0", "1",
    "thickness_cm", "cm", "radiation_length", "g/cm^2", NULL
  };
  static const char *const none[] = {NULL};
  static const char *const note = "thin radiator: the projectile's energy "
    "loss and deflection inside it, photon absorption and multiple "
    "emission are neglected";
  char v[80], at[96];
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_tresult *res;
  double kmin, kmax, th, X0, total = 0.0, *edges;
  lua_Integer nb = 1, i;
  int logsp = 0, isint, st, failbin;
  const char *sp;
  char spbuf[OPTSTRLEN];
  lbl_readopts(L, "photon_yield", photon_yield_keys, 1, &o);
  th = lbl_tothickness(L, 1, o.fname, "thickness", &o.target);
  lbl_optwindow(L, &o, &kmin, &kmax);
  if (lua_getfield(L, 1, "bins") != LUA_TNIL) {
    nb = lua_tointegerx(L, -1, &isint);
    if (!isint || nb < 1 || nb > BL_YIELD_MAXBINS)
      lbl_argfail(L, o.fname, "field 'bins' must be an integer in 1..%d, "
                  "got %s", BL_YIELD_MAXBINS, lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  lbl_checkwork(L, &o, "bins", nb, bl_work_kintegral(o.rtol));
  sp = lbl_getstr(L, 1, o.fname, "spacing", spbuf, sizeof spbuf);
  if (sp != NULL && strcmp(sp, "log") == 0)
    logsp = 1;
  else if (sp != NULL && strcmp(sp, "linear") != 0)
    lbl_argfail(L, o.fname, "unknown spacing '%.60s' in field 'spacing'; "
                "allowed: 'linear' (default), 'log'", sp);
  /* all checks done */
  t = lbl_kstart(L, &o, &q, &w);             /* 2: the target */
  X0 = bl_radiation_length(&o.target);
  edges = (double *)lua_newuserdatauv(L, (size_t)(nb + 1) * sizeof *edges,
                                      0);            /* 3 */
  res = (bl_tresult *)lua_newuserdatauv(L, (size_t)nb * sizeof *res, 0);
  lbl_retol(&o, q);
  st = bl_target_photon_yield_e(t, th, kmin, kmax, (int)nb,
                                logsp ? BL_SPACING_LOG : BL_SPACING_LINEAR, q,
                                edges, res, &failbin);   /* 4: results */
  for (i = 0; i < nb && (failbin < 0 || i <= failbin); i++) {
    int sti = i == failbin ? st : BL_SUCCESS;
    lbl_addtarget(&o, &w, &res[i]);
    if (sti != BL_SUCCESS)
      snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV, at "
               "k = %.6g MeV", edges[i], edges[i + 1], res[i].k);
    else
      snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV",
               edges[i], edges[i + 1]);
    lbl_checkresult(L, &o, sti, &res[i].r, at);
    lbl_addwarn(&w, &res[i].r, edges[i + 1], at);
  }
  lua_createtable(L, (int)nb + 1, 0);    /* 5: edges */
  lua_createtable(L, (int)nb, 0);        /* 6: k_low */
  lua_createtable(L, (int)nb, 0);        /* 7: k_high */
  lua_createtable(L, (int)nb, 0);        /* 8: photons */
  lua_createtable(L, (int)nb, 0);        /* 9: err */
  for (i = 0; i <= nb; i++) {
    lua_pushnumber(L, edges[i]);
    lua_rawseti(L, 5, i + 1);
  }
  for (i = 1; i <= nb; i++) {
    total += res[i - 1].r.val;
    lua_pushnumber(L, edges[i - 1]);
    lua_rawseti(L, 6, i);
    lua_pushnumber(L, edges[i]);
    lua_rawseti(L, 7, i);
    lua_pushnumber(L, res[i - 1].r.val);
    lua_rawseti(L, 8, i);
    lua_pushnumber(L, res[i - 1].r.err);
    lua_rawseti(L, 9, i);
  }
  lua_createtable(L, 0, 16);             /* 10: result */
  lbl_setresult(L, 10, 5, none, units, &o, &w);
  lua_pushvalue(L, 5);
  lua_setfield(L, 10, "edges");
  lua_pushvalue(L, 6);
  lua_setfield(L, 10, "k_low");
  lua_pushvalue(L, 7);
  lua_setfield(L, 10, "k_high");
  lua_pushvalue(L, 8);
  lua_setfield(L, 10, "photons");
  lua_pushvalue(L, 9);
  lua_setfield(L, 10, "err");
  lbl_setnum(L, 10, "total", total);
  lbl_setnum(L, 10, "thickness", th);
  lbl_setnum(L, 10, "radiation_length", X0);
  lbl_setnum(L, 10, "thickness_X0", X0 > 0.0 ? th / X0 : 0.0);
  if (o.target.density > 0.0)
    lbl_setnum(L, 10, "thickness_cm", th / o.target.density);
  lua_pushstring(L, note);
  lua_setfield(L, 10, "note");
  if (X0 > 0.0 && th > BL_YIELD_THIN_X0 * X0) {   /* one more warning */
    char msg[MSGSIZE];
    snprintf(msg, sizeof msg, "the radiator is %.4g radiation lengths "
             "thick, beyond the thin-radiator range (<= %g X0): %s", th / X0,
             BL_YIELD_THIN_X0, note);
    lua_getfield(L, 10, "warnings");
    lua_pushstring(L, msg);
    lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
    lua_pop(L, 1);
  }
  return 1;
}
