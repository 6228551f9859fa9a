/*
** $Id: runner.c $
** brakelight.c -- standalone runner: a small Lua 5.4 interpreter with the
** brakelight module built in and the project's lua/ helpers on package.path
** See Copyright Notice in LICENSE
*/

#include <errno.h>
#include <fcntl.h>
#include <limits.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include <gsl/gsl_errno.h>

#include <lua.h>
#include <lauxlib.h>
#include <lualib.h>

#include "brakelight.h"
#include "brakelight/lbrakelight.h"

#define PROGNAME     "brakelight"
#define LUAPATH_ENV  "BRAKELIGHT_LUA_PATH"
#define SESSION_MOD  "brakelight.session"    /* package.loaded entry */
#define MANIFEST_ENV "BRAKELIGHT_WORKER_MANIFEST"  /* set for -j workers */
#define PROGRESS_ENV "BRAKELIGHT_WORKER_PROGRESS"  /* set for -j workers */
#define MAXJOBS      256

#ifndef PATH_MAX
#define PATH_MAX 4096
#endif


/*
** Options found on the command line.  Indices point into argv.
*/
typedef struct options {
  int script;        /* index of the script name in argv; 0 if none */
  int has_e;         /* at least one -e */
  int help;          /* -h or --help */
  int version;       /* --version */
  int quiet;         /* -q or --quiet: no progress output */
  long shard, shards;  /* --shard I/N; 0 if absent */
  long jobs;         /* -j N; 0 if absent */
  int jopt, jlen;    /* argv index of -j and its length (1 or 2 entries) */
  int merge;         /* argv index of --merge; 0 if absent */
} options;


/*
** Where the shard of this process comes from, and how progress is shown;
** published to Lua as package.loaded["brakelight.session"].
*/
typedef struct session {
  long shard, shards;      /* this process runs shard `shard` of `shards` */
  const char *from;        /* "option", "slurm", "workers" or "none" */
  const char *progress;    /* "bar", "lines" or "off" */
  const char *manifest;    /* -j worker: file listing its outputs; or NULL */
  long worker, workers;    /* -j worker index and count; 0 if not a worker */
  int quiet, tty;
} session;


/* State for the signal handlers: the running Lua state, the signal. */
static lua_State *globalL = NULL;
static volatile sig_atomic_t gotsignal = 0;
static pid_t workerpid[MAXJOBS];
static volatile sig_atomic_t nworkerpid = 0;


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
    "       %s --merge OUTPUT SHARD-FILE...\n"
    "\n"
    "options:\n"
    "  -e CODE      run the Lua code CODE (may be repeated; runs before the script)\n"
    "  --shard I/N  run shard I of N of every scan (1 <= I <= N); without it the\n"
    "               Slurm job-array variables SLURM_ARRAY_TASK_ID with\n"
    "               SLURM_ARRAY_TASK_MIN/MAX or SLURM_ARRAY_TASK_COUNT choose it\n"
    "  -j N         run N local workers (shards 1..N of N), merge their outputs,\n"
    "               then run the script once more on the merged results\n"
    "  -q, --quiet  no progress output on stderr\n"
    "  --merge OUTPUT FILE...  join shard files of one scan into OUTPUT; fails\n"
    "               when a point is missing or appears twice\n"
    "  -h, --help   print this help and exit\n"
    "  --version    print the version and exit\n"
    "  --           stop handling options\n"
    "  -            read the script from standard input\n"
    "\n"
    "The script's arguments are in the global table 'arg' (script name at\n"
    "arg[0]) and in '...'.  The project's lua/ directory is on package.path;\n"
    "%s=DIR puts DIR first (a value containing '?' is used as\n"
    "Lua path templates).\n",
    PROGNAME, LUA_VERSION_MAJOR, LUA_VERSION_MINOR, PROGNAME, LUAPATH_ENV);
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
** Parse a non-negative decimal integer that fills all of 's'.  Returns 1
** and sets *v on success, 0 otherwise.
*/
static int parselong (const char *s, long *v) {
  char *end;
  if (s == NULL || *s < '0' || *s > '9')
    return 0;
  errno = 0;
  *v = strtol(s, &end, 10);
  return *end == '\0' && errno == 0;
}


/*
** Parse "I/N" with 1 <= I <= N.  Returns 1 and sets *i, *n; 0 if malformed.
*/
static int parseshard (const char *s, long *i, long *n) {
  char buf[64];
  char *slash;
  if (strlen(s) >= sizeof buf)
    return 0;
  strcpy(buf, s);
  slash = strchr(buf, '/');
  if (slash == NULL)
    return 0;
  *slash = '\0';
  return parselong(buf, i) && parselong(slash + 1, n) && *n >= 1 &&
         *i >= 1 && *i <= *n;
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
    if (strcmp(a, "--merge") == 0) {  /* the rest are file names */
      if (argc - i < 3) {
        usage_error("--merge needs an output file and at least one shard "
                    "file", NULL);
        return 0;
      }
      o->merge = i;
      return 1;
    }
    if (strcmp(a, "--quiet") == 0 || strcmp(a, "-q") == 0) {
      o->quiet = 1;
      continue;
    }
    if (strcmp(a, "--shard") == 0 || strncmp(a, "--shard=", 8) == 0) {
      const char *v = a[7] == '=' ? a + 8 : argv[++i];
      if (v == NULL || !parseshard(v, &o->shard, &o->shards)) {
        usage_error("bad value for --shard (expected I/N with 1 <= I <= N), "
                    "got", v != NULL ? v : "nothing");
        return 0;
      }
      continue;
    }
    if (strncmp(a, "-j", 2) == 0) {
      const char *v = a[2] != '\0' ? a + 2 : argv[i + 1];
      char *end;
      o->jopt = i;
      o->jlen = a[2] != '\0' ? 1 : 2;
      if (a[2] == '\0')
        i++;
      errno = 0;
      o->jobs = v != NULL ? strtol(v, &end, 10) : 0;
      if (v == NULL || *v == '\0' || *end != '\0' || errno != 0 ||
          o->jobs < 1 || o->jobs > MAXJOBS) {
        char what[64];
        snprintf(what, sizeof what, "bad value for -j (expected a worker "
                 "count 1..%d), got", MAXJOBS);
        usage_error(what, v != NULL ? v : "nothing");
        return 0;
      }
      continue;
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
**   3. <exe dir>/../share/brakelight/lua   (an installed prefix: recipes);
**   4. <exe dir>/../share/lua/5.4          (an installed prefix: helpers).
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
    snprintf(cand, sizeof cand, "%s/share/lua/%s.%s", up, LUA_VERSION_MAJOR,
             LUA_VERSION_MINOR);  /* helpers of `make install PREFIX=...` */
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
** Read the Slurm job-array variable 'name' as a non-negative integer.
** Returns 1 and sets *v when set and valid, 0 when unset; -1 when set but
** malformed (message in err).
*/
static int slurmvar (const char *name, long *v, char *err, size_t n) {
  const char *s = getenv(name);
  if (s == NULL || s[0] == '\0')
    return 0;
  if (!parselong(s, v)) {
    snprintf(err, n, "%s='%s' is not a non-negative integer", name, s);
    return -1;
  }
  return 1;
}


/*
** Choose the shard from the Slurm job-array variables.  With
** SLURM_ARRAY_TASK_MIN and _MAX (Slurm sets both for every array), the
** tasks min, min+step, ..., max are shards 1..count (step 1 unless
** SLURM_ARRAY_TASK_COUNT says otherwise); with SLURM_ARRAY_TASK_COUNT
** alone, task ids run 0..count-1.  Returns 1 and sets *i, *cnt when a
** shard is selected, 0 when SLURM_ARRAY_TASK_ID is unset, -1 with a
** message in err when the variables do not describe a regular array.
*/
static int slurmshard (long *i, long *cnt, char *err, size_t n) {
  long id, count = 0, lo = 0, hi = 0, step = 1;
  int hid, hcount, hlo, hhi;
  hid = slurmvar("SLURM_ARRAY_TASK_ID", &id, err, n);
  if (hid <= 0)
    return hid;
  if ((hcount = slurmvar("SLURM_ARRAY_TASK_COUNT", &count, err, n)) < 0 ||
      (hlo = slurmvar("SLURM_ARRAY_TASK_MIN", &lo, err, n)) < 0 ||
      (hhi = slurmvar("SLURM_ARRAY_TASK_MAX", &hi, err, n)) < 0)
    return -1;
  if (hlo && hhi) {
    if (hi < lo) {
      snprintf(err, n, "SLURM_ARRAY_TASK_MAX=%ld is below "
               "SLURM_ARRAY_TASK_MIN=%ld", hi, lo);
      return -1;
    }
    if (hcount && count > 1) {
      if ((hi - lo) % (count - 1) != 0 || hi == lo) {
        snprintf(err, n, "job array %ld-%ld with %ld tasks is not evenly "
                 "spaced; give --shard I/N", lo, hi, count);
        return -1;
      }
      step = (hi - lo) / (count - 1);
    }
    else if (hcount && count == 1 && hi != lo) {
      snprintf(err, n, "SLURM_ARRAY_TASK_COUNT=1 but the array spans "
               "%ld-%ld; give --shard I/N", lo, hi);
      return -1;
    }
    else if (hcount && count < 1) {
      snprintf(err, n, "SLURM_ARRAY_TASK_COUNT=%ld must be at least 1", count);
      return -1;
    }
    else
      count = hi - lo + 1;
    if (id < lo || id > hi || (id - lo) % step != 0) {
      snprintf(err, n, "SLURM_ARRAY_TASK_ID=%ld is not a task of the array "
               "%ld-%ld step %ld", id, lo, hi, step);
      return -1;
    }
    *i = (id - lo) / step + 1;
    *cnt = count;
    return 1;
  }
  if (hcount) {
    if (count < 1 || id >= count) {
      snprintf(err, n, "SLURM_ARRAY_TASK_ID=%ld is outside 0..%ld "
               "(SLURM_ARRAY_TASK_COUNT=%ld, no SLURM_ARRAY_TASK_MIN/MAX); "
               "give --shard I/N", id, count - 1, count);
      return -1;
    }
    *i = id + 1;
    *cnt = count;
    return 1;
  }
  snprintf(err, n, "SLURM_ARRAY_TASK_ID=%ld is set, but neither "
           "SLURM_ARRAY_TASK_COUNT nor SLURM_ARRAY_TASK_MIN/MAX: the number "
           "of shards is unknown; give --shard I/N", id);
  return -1;
}


/*
** Monotonic clock in seconds (any origin), for rates and time left.
** Lua: session.clock() -> number
*/
static int l_clock (lua_State *L) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  lua_pushnumber(L, (lua_Number)ts.tv_sec + 1e-9 * (lua_Number)ts.tv_nsec);
  return 1;
}


/*
** Publish the session as package.loaded["brakelight.session"], a table
**   { shard =, shards =, shard_from =, quiet =, stderr_tty =, progress =,
**     worker =, workers =, manifest =, script =, version =, clock = }
** read by the Lua helpers (brakelight.scan).
*/
static void pushsession (lua_State *L, const session *ss, const char *script) {
  luaL_getsubtable(L, LUA_REGISTRYINDEX, LUA_LOADED_TABLE);  /* LOADED */
  lua_createtable(L, 0, 12);
  lua_pushinteger(L, ss->shard);
  lua_setfield(L, -2, "shard");
  lua_pushinteger(L, ss->shards);
  lua_setfield(L, -2, "shards");
  lua_pushstring(L, ss->from);
  lua_setfield(L, -2, "shard_from");
  lua_pushboolean(L, ss->quiet);
  lua_setfield(L, -2, "quiet");
  lua_pushboolean(L, ss->tty);
  lua_setfield(L, -2, "stderr_tty");
  lua_pushstring(L, ss->progress);
  lua_setfield(L, -2, "progress");
  if (ss->workers > 0) {
    lua_pushinteger(L, ss->worker);
    lua_setfield(L, -2, "worker");
    lua_pushinteger(L, ss->workers);
    lua_setfield(L, -2, "workers");
  }
  if (ss->manifest != NULL) {
    lua_pushstring(L, ss->manifest);
    lua_setfield(L, -2, "manifest");
  }
  if (script != NULL) {
    lua_pushstring(L, script);
    lua_setfield(L, -2, "script");
  }
  lua_pushliteral(L, BL_VERSION);
  lua_setfield(L, -2, "version");
  lua_pushcfunction(L, l_clock);
  lua_setfield(L, -2, "clock");
  lua_setfield(L, -2, SESSION_MOD);  /* LOADED[SESSION_MOD] = session */
  lua_pop(L, 1);  /* remove LOADED */
}


/*
** Hook set by the signal handler: stop the script with an error (which a
** scan catches to save its points before passing it on).
*/
static void lstop (lua_State *L, lua_Debug *ar) {
  (void)ar;
  lua_sethook(L, NULL, 0, 0);  /* reset hook */
  luaL_error(L, "interrupted by signal %d", (int)gotsignal);
}


/*
** SIGINT/SIGTERM while Lua runs: restore the default action (a second
** signal kills) and ask Lua to stop at the next instruction.
*/
static void laction (int sig) {
  int flag = LUA_MASKCALL | LUA_MASKRET | LUA_MASKLINE | LUA_MASKCOUNT;
  signal(sig, SIG_DFL);
  gotsignal = sig;
  if (globalL != NULL)
    lua_sethook(globalL, lstop, flag, 1);
}


/* SIGINT/SIGTERM while -j workers run: pass SIGTERM on, remember. */
static void jaction (int sig) {
  sig_atomic_t k;
  gotsignal = sig;
  if (sig == SIGTERM)
    for (k = 0; k < nworkerpid; k++)
      kill(workerpid[k], SIGTERM);
}


/* Install handler h for SIGINT and SIGTERM. */
static void setsignals (void (*h) (int)) {
  struct sigaction sa;
  memset(&sa, 0, sizeof sa);
  sa.sa_handler = h;
  sigemptyset(&sa.sa_mask);
  sigaction(SIGINT, &sa, NULL);
  sigaction(SIGTERM, &sa, NULL);
}


/*
** Run the Lua chunk 'code' with the strings argv[first..last-1] as
** arguments, under the message handler.  Returns the status (reported).
*/
static int runchunk (lua_State *L, const char *code, const char *name,
                     char **argv, int first, int last) {
  int i, status = luaL_loadbuffer(L, code, strlen(code), name);
  if (status == LUA_OK) {
    luaL_checkstack(L, last - first + 1, "too many arguments");
    for (i = first; i < last; i++)
      lua_pushstring(L, argv[i]);
    status = docall(L, last - first);
  }
  return report(L, status);
}


/*
** brakelight --merge OUTPUT FILE...: join shard files (brakelight.merge).
*/
static int domerge (lua_State *L, char **argv, int argc, int at, int quiet) {
  static const char code[] =
    "local quiet, out = ...\n"
    "local inputs = table.pack(select(3, ...))\n"
    "local info = require('brakelight.merge').files(out, inputs)\n"
    "if quiet ~= '1' then\n"
    "  io.stderr:write(string.format('" PROGNAME ": merged %d points "
    "(%d records) from %d file(s) into %s\\n', info.points, info.records,"
    " info.inputs, out))\n"
    "end\n";
  lua_pushstring(L, quiet ? "1" : "0");
  (void)argc;
  if (luaL_loadbuffer(L, code, strlen(code), "=merge") != LUA_OK)
    return report(L, LUA_ERRSYNTAX);
  lua_insert(L, -2);  /* chunk below the quiet flag */
  {
    int i, status;
    luaL_checkstack(L, argc - at, "too many files");
    for (i = at + 1; i < argc; i++)
      lua_pushstring(L, argv[i]);
    status = lua_pcall(L, argc - at, 0, 0);  /* no traceback: a plain message */
    return report(L, status);
  }
}


/*
** Path of the running executable (for the -j workers) into buf.
*/
static const char *selfexe (const char *argv0, char *buf, size_t n) {
  ssize_t len = readlink("/proc/self/exe", buf, n - 1);
  if (len > 0) {
    buf[len] = '\0';
    return buf;
  }
  return argv0;
}


/*
** -j N: start N copies of this runner, worker w with "--shard w/N" and the
** rest of the command line (without -j), its standard output discarded
** (the final pass prints), progress shown by worker 1 only (shards are
** round robin, so shard 1 tracks the whole).  Each worker lists its
** outputs in a manifest file; when all succeed, every output is merged
** from its shard files (brakelight.merge.manifests).  Returns 1 on
** success, 0 after reporting which workers failed.
*/
static int runworkers (lua_State *L, char **argv, int argc, const options *o,
                       const session *ss) {
  char dir[PATH_MAX], exe[PATH_MAX], man[PATH_MAX + 32], shard[48];
  const char *tmp = getenv("TMPDIR");
  char **wargv;
  long w, nj = o->jobs;
  int i, k, ok = 1;
  snprintf(dir, sizeof dir, "%s/brakelight-j.XXXXXX",
           (tmp != NULL && tmp[0] != '\0') ? tmp : "/tmp");
  if (mkdtemp(dir) == NULL) {
    char msg[PATH_MAX + 64];
    snprintf(msg, sizeof msg, "-j: cannot make a directory for the worker "
             "manifests in %s: %s", tmp != NULL ? tmp : "/tmp", strerror(errno));
    l_message(msg);
    return 0;
  }
  wargv = (char **)malloc(sizeof(char *) * (size_t)(argc + 4));
  if (wargv == NULL) {
    l_message("-j: not enough memory");
    rmdir(dir);
    return 0;
  }
  selfexe(argv[0], exe, sizeof exe);
  fflush(stdout);
  fflush(stderr);
  setsignals(jaction);
  nworkerpid = 0;
  for (w = 1; w <= nj; w++) {
    pid_t pid;
    snprintf(man, sizeof man, "%s/manifest.%ld", dir, w);
    snprintf(shard, sizeof shard, "%ld/%ld", w, nj);
    k = 0;
    wargv[k++] = exe;
    wargv[k++] = (char *)"--shard";
    wargv[k++] = shard;
    for (i = 1; i < argc; i++) {
      if (i >= o->jopt && i < o->jopt + o->jlen)
        continue;  /* drop -j N */
      wargv[k++] = argv[i];
    }
    wargv[k] = NULL;
    pid = fork();
    if (pid == 0) {  /* worker */
      int fd = open("/dev/null", O_WRONLY);
      if (fd >= 0) {
        dup2(fd, STDOUT_FILENO);
        close(fd);
      }
      setenv(MANIFEST_ENV, man, 1);
      setenv(PROGRESS_ENV, w == 1 ? ss->progress : "off", 1);
      signal(SIGINT, SIG_DFL);
      signal(SIGTERM, SIG_DFL);
      execv(exe, wargv);
      fprintf(stderr, "%s: -j: cannot run %s: %s\n", PROGNAME, exe,
              strerror(errno));
      _exit(127);
    }
    if (pid < 0) {
      char msg[128];
      snprintf(msg, sizeof msg, "-j: cannot start worker %ld: %s", w,
               strerror(errno));
      l_message(msg);
      ok = 0;
      break;
    }
    workerpid[nworkerpid] = pid;
    nworkerpid = nworkerpid + 1;
  }
  for (k = 0; k < nworkerpid; k++) {  /* wait for every worker */
    int st;
    pid_t r;
    do
      r = waitpid(workerpid[k], &st, 0);
    while (r < 0 && errno == EINTR);
    if (r < 0 || !WIFEXITED(st) || WEXITSTATUS(st) != 0) {
      char msg[128];
      if (r >= 0 && WIFSIGNALED(st))
        snprintf(msg, sizeof msg, "worker %d of %ld (--shard %d/%ld) was "
                 "killed by signal %d", k + 1, nj, k + 1, nj, WTERMSIG(st));
      else
        snprintf(msg, sizeof msg, "worker %d of %ld (--shard %d/%ld) failed "
                 "(exit status %d)", k + 1, nj, k + 1, nj,
                 r >= 0 ? WEXITSTATUS(st) : -1);
      l_message(msg);
      ok = 0;
    }
  }
  setsignals(laction);
  free(wargv);
  if (!ok || gotsignal)
    l_message("-j: nothing merged; the shard files are kept: run the same "
              "command again to resume");
  else {  /* merge the outputs listed in the manifests */
    static const char code[] =
      "local quiet, dir, n = ...\n"
      "local list = {}\n"
      "for w = 1, tonumber(n) do list[w] = dir .. '/manifest.' .. w end\n"
      "for _, info in ipairs(require('brakelight.merge').manifests(list)) do\n"
      "  if quiet ~= '1' then\n"
      "    io.stderr:write(string.format('" PROGNAME ": -j: merged %d "
      "points from %d shard files into %s\\n', info.points, info.inputs,"
      " info.output))\n"
      "  end\n"
      "end\n";
    char nbuf[24], *av[3];
    snprintf(nbuf, sizeof nbuf, "%ld", nj);
    av[0] = (char *)(o->quiet ? "1" : "0");
    av[1] = dir;
    av[2] = nbuf;
    ok = runchunk(L, code, "=-j merge", av, 0, 3) == LUA_OK;
  }
  for (w = 1; w <= nj; w++) {
    snprintf(man, sizeof man, "%s/manifest.%ld", dir, w);
    remove(man);
  }
  rmdir(dir);
  return ok && !gotsignal;
}


/*
** Fill the session from the options, the Slurm variables and the -j
** worker variables (which are then removed from the environment, so the
** script's own children do not inherit them).  Returns 1, or 0 after
** reporting an inconsistent set-up.
*/
static int makesession (const options *o, session *ss) {
  static char manifest[PATH_MAX];
  static char progress[8];
  const char *m = getenv(MANIFEST_ENV);
  const char *p = getenv(PROGRESS_ENV);
  char err[256];
  long i, n;
  int sl;
  memset(ss, 0, sizeof *ss);
  ss->quiet = o->quiet;
  ss->tty = isatty(STDERR_FILENO);
  ss->progress = o->quiet ? "off" : (ss->tty ? "bar" : "lines");
  ss->shard = ss->shards = 1;
  ss->from = "none";
  sl = slurmshard(&i, &n, err, sizeof err);
  if (o->shard > 0) {
    ss->shard = o->shard;
    ss->shards = o->shards;
    ss->from = "option";
  }
  else if (sl < 0) {
    l_message(err);
    return 0;
  }
  else if (sl > 0) {
    ss->shard = i;
    ss->shards = n;
    ss->from = "slurm";
  }
  if (o->jobs > 0 && (o->shard > 0 || sl > 0)) {
    l_message(o->shard > 0 ? "-j cannot be combined with --shard"
              : "-j cannot be combined with a Slurm job array "
                "(SLURM_ARRAY_TASK_ID is set): give one or the other");
    return 0;
  }
  if (m != NULL && m[0] != '\0' && strlen(m) < sizeof manifest) {
    strcpy(manifest, m);
    ss->manifest = manifest;
    ss->worker = ss->shard;
    ss->workers = ss->shards;
    ss->from = "workers";
    if (p != NULL && strlen(p) < sizeof progress) {
      strcpy(progress, p);
      if (!o->quiet)
        ss->progress = progress;
    }
  }
  unsetenv(MANIFEST_ENV);
  unsetenv(PROGRESS_ENV);
  return 1;
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
  session ss;
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
  if (o.script == 0 && !o.has_e && !o.merge) {
    usage_error("no script given", NULL);
    return 0;
  }
  if (!makesession(&o, &ss))
    return 0;
  luaL_checkversion(L);
  luaL_openlibs(L);  /* open standard libraries */
  luaL_requiref(L, BL_MODNAME, luaopen_brakelight, 0);  /* LOADED[modname] = module */
  lua_pop(L, 1);  /* remove module; 'require' finds it in LOADED */
  setluapath(L, argv[0]);  /* brakelight.scan, ... come from luaopen_brakelight */
  globalL = L;
  setsignals(laction);
  if (o.merge) {
    if (domerge(L, argv, argc, o.merge, o.quiet) != LUA_OK)
      return 0;
    lua_pushboolean(L, 1);
    return 1;
  }
  if (o.jobs > 0) {
    if (!runworkers(L, argv, argc, &o, &ss))
      return 0;
    ss.from = "workers";  /* final pass: shard 1 of 1, on merged outputs */
  }
  pushsession(L, &ss, o.script > 0 ? argv[o.script] : NULL);
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
