/*
** bl_errno.h -- status codes of the brakelight core
** See Copyright Notice in LICENSE
*/
#ifndef BL_ERRNO_H
#define BL_ERRNO_H

#ifdef __cplusplus
extern "C" {
#endif

/*
** Fallible core functions return an int status: 0 on success.  GSL codes
** (GSL_EMAXITER, GSL_EROUND, ...) pass through unchanged; the codes of our
** own sit above every GSL code.  A NULL pointer where the prototype does
** not say NULL is allowed is BL_EDOMAIN (functions without a status return
** their "none" value: 0, -1, NULL, 1.0 for a factor, or do nothing); never
** a crash (tests/test_base.c, health::null_*).
*/
enum {
  BL_SUCCESS  = 0,
  BL_EDOMAIN  = 1001,   /* an argument is outside its allowed range */
  BL_EUNKNOWN = 1002,   /* unknown name (materials; the particle, element
                        ** and model look-ups return NULL or 0 instead) */
  BL_ENOMEM   = 1003,   /* allocation failed */
  BL_EMODEL   = 1004,   /* model cannot serve this request */
  BL_ENOTCONV = 1005,   /* integral did not reach the requested tolerance */
  BL_ENONFINITE = 1006, /* a computation gave a non-finite value */
  BL_EAMBIGUOUS = 1007, /* a name with two readings (material names:
                        ** "PB", lead or phosphorus + boron) */
  BL_EINTR    = 1008    /* stopped by the workspace's stop flag
                        ** (bl_quad_set_stop) before it computed */
};

/* Message for a status code: ours or GSL's.  Never NULL, static storage. */
const char *bl_strerror (int status);

/* 1 if status means "best estimate available, tolerance not reached"
** (BL_ENOTCONV and GSL's EMAXITER, EROUND, ESING, ETOL, EDIVERGE), 0
** otherwise (success or a hard failure). */
int bl_status_soft (int status);

#ifdef __cplusplus
}
#endif

#endif
