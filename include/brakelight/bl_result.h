/*
** bl_result.h -- value, error estimate and warning bits
** See Copyright Notice in LICENSE
*/
#ifndef BL_RESULT_H
#define BL_RESULT_H

#ifdef __cplusplus
extern "C" {
#endif

/* Warning bits carried by a result; several may be set at once. */
enum {
  BL_WARN_TOLERANCE = 1u << 0,  /* requested tolerance not reached: err says how far */
  BL_WARN_POINTLIKE = 1u << 1,  /* composite projectile treated as a point charge */
  BL_WARN_BORN      = 1u << 2,  /* z Z alpha / beta not small: first Born approximation poor */
  BL_WARN_VALIDITY  = 1u << 3,  /* reserved: no computation sets it (the
                                 ** specific bits below say what is outside
                                 ** its validity); kept so the bits keep
                                 ** their values */
  BL_WARN_COULOMB   = 1u << 4,  /* Coulomb correction requested outside its validity */
  BL_WARN_ELWERT    = 1u << 5,  /* Elwert factor requested outside its validity */
  BL_WARN_STATIC_E  = 1u << 6,  /* atomic electrons as static charges: no recoil */
  BL_WARN_CLAMPED   = 1u << 7,  /* value below zero (Coulomb correction, or the
                                ** high-energy form outside its range): 0 */
  BL_WARN_METHOD    = 1u << 8,  /* high-energy or complete-screening form used
                                ** where it does not hold */
  BL_WARN_SUPPRESS  = 1u << 9,  /* LPM/dielectric suppression: an approximate
                                ** treatment, see its warning */
  BL_WARN_DISTORTED = 1u << 10, /* distorted waves: estimated model uncertainty
                                ** (sys) above BL_SYS_WARN of the value */
  BL_WARN_SOFT      = 1u << 11, /* distorted waves below k = BL_DW_SOFT_Y T:
                                ** Born times the ratio at that k */
  BL_WARN_EHELD     = 1u << 12, /* bound electron term of a muon (or another
                                ** projectile) below its table's first node
                                ** (bl_case_eheld): held there, too low */
  BL_WARN_ERANGE    = 1u << 13, /* bound electron term of a projectile other
                                ** than e+- and mu+- outside its table's
                                ** mass or energy range: held at the edge */
  BL_WARN_ESHAPE    = 1u << 14, /* an angular or fully differential value
                                ** whose bound electron part keeps the
                                ** static term's angular shape
                                ** (bl_method_eshape) */
  BL_WARN_NINCOH    = 1u << 15, /* the nucleus's incoherent part
                                ** (BL_NUCLEUS_INCOHERENT) counts: the
                                ** closure sum of point protons, an upper
                                ** bound (no Pauli blocking) */
  BL_WARN_EBORN     = 1u << 16, /* method "partial": the atomic-electron
                                ** part is added as the Born room gives
                                ** it (bl_partial_epart_e), not by
                                ** partial waves */
  BL_WARN_PWSOFT    = 1u << 17  /* method "partial" below k =
                                ** BL_PARTIAL_SOFT_Y T: Born times the
                                ** partial-wave/Born ratio at that k */
};
#define BL_WARN_COUNT 18

/* The share of the value above which a model uncertainty (sys) is
** warned about. */
#define BL_SYS_WARN 0.01

/* Corrections actually applied to a result (bl_result.applied). */
enum {
  BL_APPLIED_COULOMB = 1u << 0,  /* Davies-Bethe-Maximon, subtracted */
  BL_APPLIED_ELWERT  = 1u << 1   /* Elwert factor, nuclear part */
};

typedef struct bl_result {
  double val;     /* best estimate */
  double err;     /* absolute error estimate (>= 0) */
  unsigned warn;  /* BL_WARN_* bits */
  unsigned applied;  /* BL_APPLIED_* bits */
  int method;     /* BL_METHOD_* actually used (bl_method.h); 0: born */
  double sys;     /* estimated model uncertainty of val, absolute (>= 0;
                  ** 0 where the method states none) */
} bl_result;

/* Short English text for one warning bit (e.g. BL_WARN_BORN); NULL if unknown. */
const char *bl_warn_text (unsigned bit);

#ifdef __cplusplus
}
#endif

#endif
