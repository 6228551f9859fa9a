/*
** lbl_internal.h -- declarations shared by the binding files (src/l*.c),
** not public
** See Copyright Notice in LICENSE
*/
#ifndef LBL_INTERNAL_H
#define LBL_INTERNAL_H

#include "lbl_compat.h"

#include "brakelight/bl_material.h"

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
** an element symbol or name, a chemical formula, a standard-composition
** name, or an integer Z -- into *out; on bad input raise
** "bad argument #1 to 'fname' (field 'field' ...)" naming the value and what
** is allowed.
*/
void lbl_material_open (lua_State *L);
void lbl_totarget (lua_State *L, int idx, const char *fname,
                   const char *field, bl_material *out);

/*
** Helpers (src/lhelpers.c).  lbl_helpers_open: give the module table at the
** top of the stack the __index metamethod that loads brakelight.scan,
** .plot, .merge, .json ("brakelight.<name>") on first use.
*/
void lbl_helpers_open (lua_State *L);

#endif
