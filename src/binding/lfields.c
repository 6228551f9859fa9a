/*
** $Id: lfields.c $
** The bottom of the Lua binding: the raising helpers and messages, and
** the readers of one field of an option table (a number, a string, the
** allowed keys); every other binding file builds on these.
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"


/*
** Raise a Lua error with a printf-style message (formatted by C, so %g
** works, unlike lua_pushfstring).  Never returns.
*/
int lbl_fail (lua_State *L, const char *fmt, ...) {
  char msg[MSGSIZE];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  luaL_error(L, "%s", msg);
  LBL_UNREACHABLE();
}


/*
** Raise "bad argument #1 to 'fname' (msg)", the message of luaL_argerror,
** with a fixed function name so that it reads the same however the
** function was reached (brakelight.dsdk{...} or pcall(brakelight.dsdk, t)).
** Every library function takes its options as argument #1.  Never returns.
*/
int lbl_argfail (lua_State *L, const char *fname, const char *fmt, ...) {
  char msg[MSGSIZE];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  luaL_error(L, "bad argument #1 to '%s' (%s)", fname, msg);
  LBL_UNREACHABLE();
}


/*
** Describe the Lua value at idx for a message, into buf: numbers as
** written, strings quoted, booleans by value, anything else by type name.
** Touches no stack slot.
*/
void lbl_checktext (lua_State *L, int idx, const char *fname,
                    const char *what) {
  char v[80];
  size_t len;
  const char *s = lua_tolstring(L, idx, &len);
  size_t at = strlen(s);
  if (at != len)
    lbl_argfail(L, fname, "%s contains a NUL byte at byte %zu; allowed: text "
                "without NUL bytes, got %s (%zu bytes)", what, at + 1,
                lbl_showval(L, idx, v, sizeof v), len);
}


const char *lbl_showval (lua_State *L, int idx, char *buf, size_t n) {
  switch (lua_type(L, idx)) {
    case LUA_TNUMBER:
      if (lua_isinteger(L, idx))
        snprintf(buf, n, "%lld", (long long)lua_tointeger(L, idx));
      else
        snprintf(buf, n, "%.14g", (double)lua_tonumber(L, idx));
      break;
    case LUA_TSTRING:
      snprintf(buf, n, "'%.60s'", lua_tostring(L, idx));
      break;
    case LUA_TBOOLEAN:
      snprintf(buf, n, "%s", lua_toboolean(L, idx) ? "true" : "false");
      break;
    case LUA_TNONE:
      snprintf(buf, n, "no value");
      break;
    default:
      snprintf(buf, n, "%s", luaL_typename(L, idx));
      break;
  }
  return buf;
}


/*
** Append s to the ", "-separated list in buf (size n), truncating safely.
*/
void lbl_addname (char *buf, size_t n, const char *s) {
  size_t len = strlen(buf);
  if (len + 1 < n)
    snprintf(buf + len, n - len, "%s%s", len > 0 ? ", " : "", s);
}


/* Names of a NULL-terminated key list, ", "-separated. */
static const char *keynames (const char *const keys[], char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; keys[i] != NULL; i++)
    lbl_addname(buf, n, keys[i]);
  return buf;
}


/*
** Check that every key of the table at absolute index t is one of `keys`
** (NULL-terminated).  `what` names the kind of key in the message
** ("option", "particle field").  Raises on the first stranger, so that a
** typo in a scan never passes silently.
*/
void lbl_checkkeys (lua_State *L, int t, const char *fname,
                    const char *what, const char *const keys[]) {
  char names[NAMESIZE], v[80];
  lua_pushnil(L);  /* first key */
  while (lua_next(L, t) != 0) {  /* key at -2, value at -1 */
    int i, known = 0;
    if (lua_type(L, -2) == LUA_TSTRING) {
      const char *key = lua_tostring(L, -2);  /* a string: no conversion */
      for (i = 0; keys[i] != NULL && !known; i++)
        known = (strcmp(key, keys[i]) == 0);
      if (!known)
        lbl_argfail(L, fname, "unknown %s '%.60s'; allowed: %s", what, key,
                keynames(keys, names, sizeof names));
    }
    else
      lbl_argfail(L, fname, "%s names must be strings, got key %s; allowed: %s",
              what, lbl_showval(L, -2, v, sizeof v),
              keynames(keys, names, sizeof names));
    lua_pop(L, 1);  /* remove value, keep key for lua_next */
  }
}


/*
** Read field `key` of the table at absolute index t as a number into *x.
** Returns 0 (and leaves *x) if the field is nil, 1 if it was read; raises
** if it holds something else.  `prefix` ("" or "particle.") qualifies the
** field name in messages.  Stack unchanged.
*/
int lbl_getnum (lua_State *L, int t, const char *fname,
                const char *prefix, const char *key, double *x) {
  char v[80];
  int tp = lua_getfield(L, t, key);
  if (tp == LUA_TNIL) {
    lua_pop(L, 1);
    return 0;
  }
  if (tp != LUA_TNUMBER)
    lbl_argfail(L, fname, "field '%s%s' must be a number, got %s", prefix, key,
            lbl_showval(L, -1, v, sizeof v));
  *x = (double)lua_tonumber(L, -1);
  lua_pop(L, 1);
  return 1;
}


/*
** As lbl_getnum, but the field is required: `meaning` says what it is in the
** message for a missing field.
*/
double lbl_neednum (lua_State *L, int t, const char *fname,
                    const char *prefix, const char *key,
                    const char *meaning) {
  double x = 0;
  if (!lbl_getnum(L, t, fname, prefix, key, &x))
    lbl_argfail(L, fname, "missing required field '%s%s' (%s)", prefix, key,
            meaning);
  return x;
}


/*
** Read field `key` of the table at absolute index t as a string into buf
** (size n, so that it outlives the Lua value: an __index function may
** answer with a string nothing else holds); returns NULL if nil, raises
** if it holds something else, a NUL byte, or n bytes or more.  Stack
** unchanged.
*/
const char *lbl_getstr (lua_State *L, int t, const char *fname,
                        const char *key, char *buf, size_t n) {
  char v[80], what[64];
  const char *s;
  size_t len;
  int tp = lua_getfield(L, t, key);
  if (tp == LUA_TNIL) {
    lua_pop(L, 1);
    return NULL;
  }
  if (tp != LUA_TSTRING)
    lbl_argfail(L, fname, "field '%s' must be a string, got %s", key,
            lbl_showval(L, -1, v, sizeof v));
  snprintf(what, sizeof what, "field '%s'", key);
  lbl_checktext(L, -1, fname, what);
  s = lua_tolstring(L, -1, &len);
  if (len >= n)
    lbl_argfail(L, fname, "field '%s' is %zu bytes long; allowed: at most "
                "%zu bytes, got %s", key, len, n - 1,
                lbl_showval(L, -1, v, sizeof v));
  memcpy(buf, s, len + 1);
  lua_pop(L, 1);
  return buf;
}
