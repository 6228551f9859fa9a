/*
** $Id: brakelight.c $
** brakelight.c -- standalone runner: a small Lua 5.4 interpreter with the
** brakelight module built in and the project's lua/ helpers on package.path
** See Copyright Notice in LICENSE
*/

#include <limits.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include <gsl/gsl_errno.h>

#include <lua.h>
#include <lauxlib.h>
#include <lualib.h>

#include "brakelight.h"
#include "lbrakelight.h"

#define PROGNAME     "brakelight"
#define LUAPATH_ENV  "BRAKELIGHT_LUA_PATH"

#ifndef PATH_MAX
#define PATH_MAX 4096
#endif


/*
** Options found on the command line.  Indices point into argv.
** Room for later options (a shard I/N, a worker count -j N, a quiet flag):
** each would be one field here and one case in collectargs.
*/
typedef struct options {
  int script;        /* index of the script name in argv; 0 if none */
  int has_e;         /* at least one -e */
  int help;          /* -h or --help */
  int version;       /* --version */
} options;


/*
** Print a message on stderr, prefixed by the program name, and flush.
*/
static void l_message (const char *msg) {
  fprintf(stderr, "%s: %s\n", PROGNAME, msg);
  fflush(stderr);
}


/*
** If 'status' is not OK, print the error object on top of the stack (a
** string, put there by msghandler) and pop it.  Returns 'status'.
*/
static int report (lua_State *L, int status) {
  if (status != LUA_OK) {
    const char *msg = lua_tostring(L, -1);
    if (msg == NULL)
      msg = "(error object is not a string)";
    l_message(msg);
    lua_pop(L, 1);  /* remove message */
  }
  return status;
}


/*
** Message handler for docall: turn the error object into a string (using
** __tostring when it has one) and append a traceback.
*/
static int msghandler (lua_State *L) {
  const char *msg = lua_tostring(L, 1);
  if (msg == NULL) {  /* error object is not a string? */
    if (luaL_callmeta(L, 1, "__tostring") &&  /* does it have a __tostring? */
        lua_type(L, -1) == LUA_TSTRING)       /* that produces a string? */
      return 1;  /* that is the message */
    msg = lua_pushfstring(L, "(error object is a %s value)",
                          luaL_typename(L, 1));
  }
  luaL_traceback(L, L, msg, 1);  /* append a standard traceback */
  return 1;  /* return the traceback */
}


/*
** Call the function on the stack (below its 'narg' arguments) in protected
** mode, with msghandler installed below it.  Leaves no results.
*/
static int docall (lua_State *L, int narg) {
  int status;
  int base = lua_gettop(L) - narg;  /* function index */
  lua_pushcfunction(L, msghandler);  /* push message handler */
  lua_insert(L, base);  /* put it under function and args */
  status = lua_pcall(L, narg, 0, base);
  lua_remove(L, base);  /* remove message handler from the stack */
  return status;
}


/*
** Print the usage block on 'f'.
*/
static void print_usage (FILE *f) {
  fprintf(f,
    "usage: %s [options] [script [args...]]\n"
    "Run a Lua %s.%s script with the brakelight module (require \"brakelight\").\n"
    "\n"
    "options:\n"
    "  -e CODE      run the Lua code CODE (may be repeated; runs before the script)\n"
    "  -h, --help   print this help and exit\n"
    "  --version    print the version and exit\n"
    "  --           stop handling options\n"
    "  -            read the script from standard input\n"
    "\n"
    "The script's arguments are in the global table 'arg' (script name at\n"
    "arg[0]) and in '...'.  The project's lua/ directory is on package.path;\n"
    "%s=DIR puts DIR first (a value containing '?' is used as\n"
    "Lua path templates).\n",
    PROGNAME, LUA_VERSION_MAJOR, LUA_VERSION_MINOR, LUAPATH_ENV);
  fflush(f);
}


/*
** Report a bad command line on stderr: the reason, the offending argument
** (NULL if none), then the usage block.
*/
static void usage_error (const char *reason, const char *what) {
  if (what != NULL)
    fprintf(stderr, "%s: %s '%s'\n", PROGNAME, reason, what);
  else
    fprintf(stderr, "%s: %s\n", PROGNAME, reason);
  print_usage(stderr);
}


/*
** Scan the options in argv[1..argc-1] up to the script name ("-e CODE" and
** "-eCODE" both work).  Fills 'o';
** returns 1 if the command line is valid, 0 after printing the reason and
** the usage block on stderr.
*/
static int collectargs (char **argv, int argc, options *o) {
  int i;
  memset(o, 0, sizeof *o);
  for (i = 1; i < argc; i++) {
    const char *a = argv[i];
    if (a[0] != '-' || a[1] == '\0') {  /* not an option, or "-" (stdin)? */
      o->script = i;
      return 1;
    }
    if (strcmp(a, "--") == 0) {  /* end of options */
      if (i + 1 < argc)
        o->script = i + 1;
      return 1;
    }
    else if (strcmp(a, "--help") == 0 || strcmp(a, "-h") == 0)
      o->help = 1;
    else if (strcmp(a, "--version") == 0)
      o->version = 1;
    else if (strncmp(a, "-e", 2) == 0) {
      o->has_e = 1;
      if (a[2] == '\0') {  /* code in the next argument? */
        i++;
        if (i >= argc || argv[i] == NULL) {
          usage_error("missing argument to option", a);
          return 0;
        }
      }
    }
    else {
      usage_error("unrecognized option", a);
      return 0;
    }
  }
  return 1;
}


/*
** Build the global 'arg' exactly as the stock interpreter does: the script
** name at index 0, its arguments at 1..n, the program name and the options
** at negative indices.  Without a script, argv[0] sits at index 0 and every
** option at a positive index.
*/
static void createargtable (lua_State *L, char **argv, int argc, int script) {
  int i, narg;  /* with no script (script == 0) argv[0] goes to index 0 */
  narg = argc - (script + 1);  /* number of positive indices */
  lua_createtable(L, narg, script + 1);
  for (i = 0; i < argc; i++) {
    lua_pushstring(L, argv[i]);
    lua_rawseti(L, -2, i - script);
  }
  lua_setglobal(L, "arg");
}


/*
** Is 'path' an existing directory?
*/
static int isdir (const char *path) {
  struct stat st;
  return stat(path, &st) == 0 && S_ISDIR(st.st_mode);
}


/*
** Parent of the directory holding the running executable (for build/brakelight
** that is the source tree; for PREFIX/bin/brakelight it is PREFIX), without
** trailing slash, into 'buf' (size n).  /proc/self/exe gives the executable
** with every symbolic link resolved; without /proc, argv[0] is used when it
** holds a slash.  Returns 1 on success, 0 if the place cannot be found.
*/
static int exeparent (const char *argv0, char *buf, size_t n) {
  char *slash;
  ssize_t len = readlink("/proc/self/exe", buf, n - 1);
  if (len > 0)
    buf[len] = '\0';
  else if (argv0 != NULL && strchr(argv0, '/') != NULL && strlen(argv0) < n)
    strcpy(buf, argv0);
  else
    return 0;
  slash = strrchr(buf, '/');  /* cut the executable's name */
  *slash = '\0';
  slash = strrchr(buf, '/');  /* cut its directory */
  if (slash != NULL && buf[0] == '/')  /* absolute: go up by removing */
    *slash = '\0';
  else if (strlen(buf) + 4 < n)  /* relative (argv[0]): go up with ".." */
    strcat(buf, "/..");
  else
    return 0;
  return 1;
}


/*
** Push the Lua path templates for directory 'dir' ("dir/?.lua;dir/?/init.lua;")
** if 'dir' exists; push nothing otherwise.  Returns the number of values
** pushed (0 or 1).
*/
static int pushdirtemplates (lua_State *L, const char *dir) {
  if (!isdir(dir))
    return 0;
  lua_pushfstring(L, "%s/?.lua;%s/?/init.lua;", dir, dir);
  return 1;
}


/*
** Put the project's Lua helpers in front of package.path, in this order:
**   1. $BRAKELIGHT_LUA_PATH: a directory, or Lua templates if it holds '?';
**   2. <exe dir>/../lua            (the runner in build/ of a source tree);
**   3. <exe dir>/../share/brakelight/lua   (an installed prefix).
** Directories that do not exist are skipped.
*/
static void setluapath (lua_State *L, const char *argv0) {
  char up[PATH_MAX];
  char cand[PATH_MAX + 32];
  const char *env = getenv(LUAPATH_ENV);
  int n = 0;
  if (env != NULL && env[0] != '\0') {
    if (strchr(env, '?') != NULL) {  /* templates given as they are */
      lua_pushstring(L, env);
      lua_pushliteral(L, ";");
      n += 2;
    }
    else
      n += pushdirtemplates(L, env);
  }
  if (exeparent(argv0, up, sizeof up)) {
    snprintf(cand, sizeof cand, "%s/lua", up);
    n += pushdirtemplates(L, cand);
    snprintf(cand, sizeof cand, "%s/share/brakelight/lua", up);
    n += pushdirtemplates(L, cand);
  }
  lua_getglobal(L, "package");
  lua_getfield(L, -1, "path");  /* old path */
  lua_remove(L, -2);  /* remove 'package' */
  lua_concat(L, n + 1);  /* new templates .. old path */
  lua_getglobal(L, "package");
  lua_insert(L, -2);  /* package, newpath */
  lua_setfield(L, -2, "path");  /* package.path = newpath */
  lua_pop(L, 1);  /* remove 'package' */
}


/*
** Run the -e chunks of the command line in order.  Returns 1 if all ran
** without error, 0 after reporting the first error.
*/
static int runargs (lua_State *L, char **argv, int n) {
  int i;
  for (i = 1; i < n; i++) {
    if (strncmp(argv[i], "-e", 2) == 0) {
      const char *code = argv[i][2] != '\0' ? argv[i] + 2 : argv[++i];
      int status = luaL_loadbuffer(L, code, strlen(code), "=(command line)");
      if (status == LUA_OK)
        status = docall(L, 0);
      if (report(L, status) != LUA_OK)
        return 0;
    }
  }
  return 1;
}


/*
** Push the script's arguments (the positive entries of 'arg') and return
** their number.
*/
static int pushargs (lua_State *L) {
  int i, n;
  if (lua_getglobal(L, "arg") != LUA_TTABLE)
    luaL_error(L, "'arg' is not a table");
  n = (int)luaL_len(L, -1);
  luaL_checkstack(L, n + 3, "too many arguments to script");
  for (i = 1; i <= n; i++)
    lua_rawgeti(L, -i, i);
  lua_remove(L, -i);  /* remove table from the stack */
  return n;
}


/*
** Load and run the script argv[script] ("-" reads standard input, unless it
** came after "--") with its arguments.
*/
static int handle_script (lua_State *L, char **argv, int script) {
  int status;
  const char *fname = argv[script];
  if (strcmp(fname, "-") == 0 && strcmp(argv[script - 1], "--") != 0)
    fname = NULL;  /* stdin */
  status = luaL_loadfile(L, fname);
  if (status == LUA_OK) {
    int n = pushargs(L);  /* push arguments to script */
    status = docall(L, n);
  }
  return report(L, status);
}


/*
** Main body, run in protected mode so that errors in the set-up are caught
** too.  Receives argc (integer) and argv (light userdata); returns true
** (pushes a boolean) when everything ran without error.
*/
static int pmain (lua_State *L) {
  int argc = (int)lua_tointeger(L, 1);
  char **argv = (char **)lua_touserdata(L, 2);
  options o;
  if (!collectargs(argv, argc, &o))
    return 0;  /* bad command line: usage already printed; result false */
  if (o.help) {
    print_usage(stdout);
    lua_pushboolean(L, 1);
    return 1;
  }
  if (o.version) {
    printf("%s %s (Lua %s.%s)\n", PROGNAME, BL_VERSION,
           LUA_VERSION_MAJOR, LUA_VERSION_MINOR);
    fflush(stdout);
    lua_pushboolean(L, 1);
    return 1;
  }
  if (o.script == 0 && !o.has_e) {
    usage_error("no script given", NULL);
    return 0;
  }
  luaL_checkversion(L);
  luaL_openlibs(L);  /* open standard libraries */
  luaL_requiref(L, BL_MODNAME, luaopen_brakelight, 0);  /* LOADED[modname] = module */
  lua_pop(L, 1);  /* remove module; 'require' finds it in LOADED */
  setluapath(L, argv[0]);
  createargtable(L, argv, argc, o.script);
  lua_gc(L, LUA_GCRESTART);  /* start GC... */
  lua_gc(L, LUA_GCGEN, 0, 0);  /* ...in generational mode */
  if (!runargs(L, argv, o.script > 0 ? o.script : argc))
    return 0;  /* something failed */
  if (o.script > 0 && handle_script(L, argv, o.script) != LUA_OK)
    return 0;
  lua_pushboolean(L, 1);  /* signal no errors */
  return 1;
}


int main (int argc, char **argv) {
  int status, result;
  lua_State *L;
  gsl_set_error_handler_off();  /* process-wide: GSL returns codes, never aborts */
  L = luaL_newstate();  /* create state */
  if (L == NULL) {
    l_message("cannot create state: not enough memory");
    return EXIT_FAILURE;
  }
  lua_gc(L, LUA_GCSTOP);  /* stop GC while building state */
  lua_pushcfunction(L, &pmain);  /* to call 'pmain' in protected mode */
  lua_pushinteger(L, argc);  /* 1st argument */
  lua_pushlightuserdata(L, argv);  /* 2nd argument */
  status = lua_pcall(L, 2, 1, 0);  /* do the call */
  result = lua_toboolean(L, -1);  /* get result */
  report(L, status);
  lua_close(L);
  return (result && status == LUA_OK) ? EXIT_SUCCESS : EXIT_FAILURE;
}
