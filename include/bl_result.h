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
  BL_WARN_VALIDITY  = 1u << 3   /* a model or correction used outside its validity */
};
#define BL_WARN_COUNT 4

typedef struct bl_result {
  double val;     /* best estimate */
  double err;     /* absolute error estimate (>= 0) */
  unsigned warn;  /* BL_WARN_* bits */
} bl_result;

/* Short English text for one warning bit (e.g. BL_WARN_BORN); NULL if unknown. */
const char *bl_warn_text (unsigned bit);

#ifdef __cplusplus
}
#endif

#endif
