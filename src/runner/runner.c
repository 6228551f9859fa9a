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
#define SHARDS_ENV   "BRAKELIGHT_SHARDS"   /* as --shards N */
#define MAXRUNNING   64    /* coroutines tracked for interrupts (nesting) */
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
  long nshards;      /* --shards N (the shard number from Slurm); 0 if absent */
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
  const char *sharderr;    /* why a Slurm array gives no shard, or NULL */
  const char *progress;    /* "bar", "lines" or "off" */
  const char *manifest;    /* -j worker: file listing its outputs; or NULL */
  long worker, workers;    /* -j worker index and count; 0 if not a worker */
  int quiet, tty;
} session;


/*
** State for the signal handlers: the main Lua state, the coroutines being
** resumed (innermost last), the signal (it stays: an interrupt is never
** cleared) and the depth of session.hold sections, during which the
** interrupt waits.
*/
static lua_State *globalL = NULL;
static volatile sig_atomic_t gotsignal = 0;
static lua_State *running[MAXRUNNING];
static volatile sig_atomic_t nrunning = 0;
static volatile sig_atomic_t held = 0;
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
    "  --shard I/N  run shard I of N of every scan (1 <= I <= N); in a Slurm\n"
    "               job array 1-N: --shard \"$SLURM_ARRAY_TASK_ID/N\"\n"
    "  --shards N   N shards, this one is SLURM_ARRAY_TASK_ID (1..N); or set\n"
    "               %s=N.  A job array without N stops any scan\n"
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
    PROGNAME, LUA_VERSION_MAJOR, LUA_VERSION_MINOR, PROGNAME, SHARDS_ENV,
    LUAPATH_ENV);
  fflush(f);
}


/*
** Report a bad command line on stderr in one line: the reason, the
** offending argument (NULL if none) and where the usage is.
*/
static void usage_error (const char *reason, const char *what) {
  if (what != NULL)
    fprintf(stderr, "%s: %s '%s' (try '%s --help')\n", PROGNAME, reason,
            what, PROGNAME);
  else
    fprintf(stderr, "%s: %s (try '%s --help')\n", PROGNAME, reason,
            PROGNAME);
  fflush(stderr);
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
    if (strcmp(a, "--shards") == 0 || strncmp(a, "--shards=", 9) == 0) {
      const char *v = a[8] == '=' ? a + 9 : argv[++i];
      if (v == NULL || !parselong(v, &o->nshards) || o->nshards < 1) {
        usage_error("bad value for --shards (expected a shard count N >= 1), "
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
** The shard of a Slurm job-array task.  The shard count is never guessed
** from the array variables: a partial resubmission (sbatch --array=2, or
** 3,7) describes only the tasks submitted, not the scan.  With N given
** (--shards N or BRAKELIGHT_SHARDS=N) the task id is the shard number,
** 1..N.  Returns 1 and sets *i, *cnt; 0 when SLURM_ARRAY_TASK_ID is unset,
** or set without N (message in err: a scan then stops, other scripts run);
** -1 with a message in err when the values are bad.
*/
static int slurmshard (long nshards, long *i, long *cnt, char *err,
                       size_t n) {
  long id, envn = 0;
  int hid = slurmvar("SLURM_ARRAY_TASK_ID", &id, err, n), hn;
  if (hid <= 0)
    return hid;
  if ((hn = slurmvar(SHARDS_ENV, &envn, err, n)) < 0)
    return -1;
  if (nshards == 0 && hn && envn < 1) {
    snprintf(err, n, "%s=%ld must be a shard count >= 1", SHARDS_ENV, envn);
    return -1;
  }
  if (nshards == 0)
    nshards = hn ? envn : 0;
  if (nshards == 0) {
    snprintf(err, n, "SLURM_ARRAY_TASK_ID=%ld is set, but the number of "
             "shards is not given (the array variables describe the tasks "
             "submitted, which after a partial resubmission are not the "
             "scan): run with --shard \"$SLURM_ARRAY_TASK_ID/N\", or "
             "--shards N, or %s=N, with the array 1-N", id, SHARDS_ENV);
    return 0;
  }
  if (id < 1 || id > nshards) {
    snprintf(err, n, "SLURM_ARRAY_TASK_ID=%ld is not a shard of 1..%ld "
             "(with %ld shards the array must be 1-%ld, or a part of it)",
             id, nshards, nshards, nshards);
    return -1;
  }
  *i = id;
  *cnt = nshards;
  return 1;
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


static int l_interrupted (lua_State *L);
static int l_hold (lua_State *L);
static int l_try (lua_State *L);


/*
** Publish the session as package.loaded["brakelight.session"], a table
**   { shard =, shards =, shard_from =, shard_error =, quiet =,
**     stderr_tty =, progress =, worker =, workers =, manifest =, script =,
**     version =, clock =, interrupted =, hold =, try = }
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
  if (ss->sharderr != NULL) {
    lua_pushstring(L, ss->sharderr);
    lua_setfield(L, -2, "shard_error");
  }
  lua_pushliteral(L, BL_VERSION);
  lua_setfield(L, -2, "version");
  lua_pushcfunction(L, l_clock);
  lua_setfield(L, -2, "clock");
  lua_pushcfunction(L, l_interrupted);
  lua_setfield(L, -2, "interrupted");
  lua_pushcfunction(L, l_hold);
  lua_setfield(L, -2, "hold");
  lua_pushcfunction(L, l_try);
  lua_setfield(L, -2, "try");
  lua_setfield(L, -2, SESSION_MOD);  /* LOADED[SESSION_MOD] = session */
  lua_pop(L, 1);  /* remove LOADED */
}


/*
** Interrupts.  SIGINT/SIGTERM set `gotsignal` for good and a hook on the
** main state and on every coroutine being resumed; the hook raises
** "interrupted by signal N" at every Lua instruction from then on, so a
** pcall in a script may catch the error but cannot go on: the next
** instruction raises again.  Only session.hold(f) sections (a scan saving
** its points) run Lua code undisturbed; the interrupt resumes when they
** end.  The module's computations stop at their next point
** (lbl_interrupt).
*/
/* count hooks only: a call hook would also fire in C functions such as a
** message handler, turning the interrupt into "error in error handling" */
#define STOPMASK LUA_MASKCOUNT

static void lstop (lua_State *L, lua_Debug *ar) {
  (void)ar;
  if (held > 0 || gotsignal == 0)
    return;
  luaL_error(L, "interrupted by signal %d", (int)gotsignal);
}


/* Arm the hook on the main state and every coroutine being resumed. */
static void armhooks (void) {
  sig_atomic_t k;
  if (globalL != NULL)
    lua_sethook(globalL, lstop, STOPMASK, 1);
  for (k = 0; k < nrunning && k < MAXRUNNING; k++)
    lua_sethook(running[k], lstop, STOPMASK, 1);
}


/*
** SIGINT/SIGTERM while Lua runs: restore the default action (a second
** signal kills), note the signal, stop the module's computations and arm
** the hooks (unless a hold section runs: it arms them when it ends).
*/
static void laction (int sig) {
  signal(sig, SIG_DFL);
  gotsignal = sig;
  lbl_interrupt(sig);
  if (held == 0)
    armhooks();
}


/* session.interrupted() -> the signal number, or false */
static int l_interrupted (lua_State *L) {
  if (gotsignal)
    lua_pushinteger(L, (lua_Integer)gotsignal);
  else
    lua_pushboolean(L, 0);
  return 1;
}


/*
** session.hold(f, ...) -> f(...): call f with interrupts held (a signal
** is noted and acted on when the outermost hold ends).  An error of f
** passes through unchanged.
*/
static int l_hold (lua_State *L) {
  int st;
  luaL_checktype(L, 1, LUA_TFUNCTION);
  held = held + 1;
  lua_sethook(L, NULL, 0, 0);   /* this thread: no hook while held */
  st = lua_pcall(L, lua_gettop(L) - 1, LUA_MULTRET, 0);
  held = held - 1;
  if (held == 0 && gotsignal)
    armhooks();
  if (gotsignal)
    lua_sethook(L, lstop, STOPMASK, 1);
  if (st != LUA_OK)
    return lua_error(L);
  return lua_gettop(L);
}


/*
** session.try(body, handler) -> body(): call body; if it raises, call
** handler(error) with interrupts held from that moment (no Lua
** instruction runs between the error and the handler), and return what
** the handler returns or pass its error on.
*/
static int l_try (lua_State *L) {
  int st;
  luaL_checktype(L, 1, LUA_TFUNCTION);
  luaL_checktype(L, 2, LUA_TFUNCTION);
  lua_settop(L, 2);
  lua_pushvalue(L, 1);
  if (lua_pcall(L, 0, LUA_MULTRET, 0) == LUA_OK)
    return lua_gettop(L) - 2;
  held = held + 1;
  lua_sethook(L, NULL, 0, 0);
  lua_pushvalue(L, 2);
  lua_insert(L, -2);                /* handler, error */
  st = lua_pcall(L, 1, LUA_MULTRET, 0);
  held = held - 1;
  if (held == 0 && gotsignal)
    armhooks();
  if (gotsignal)
    lua_sethook(L, lstop, STOPMASK, 1);
  if (st != LUA_OK)
    return lua_error(L);
  return lua_gettop(L) - 2;
}


/*
** coroutine.resume with the coroutine on the `running` list while it
** runs, so that a signal reaches it; and coroutine.wrap made from it.
*/
static int l_resume (lua_State *L) {
  lua_State *co = lua_tothread(L, 1);
  int st, top, k = -1;
  luaL_argexpected(L, co != NULL, 1, "coroutine");
  if (nrunning < MAXRUNNING) {
    k = (int)nrunning;
    running[k] = co;
    nrunning = nrunning + 1;
  }
  if (gotsignal && held == 0)
    lua_sethook(co, lstop, STOPMASK, 1);
  lua_pushvalue(L, lua_upvalueindex(1));  /* the original resume */
  lua_insert(L, 1);
  st = lua_pcall(L, lua_gettop(L) - 1, LUA_MULTRET, 0);
  if (k >= 0)
    nrunning = k;
  if (st != LUA_OK)
    return lua_error(L);
  top = lua_gettop(L);
  return top;
}


static int wrapaux (lua_State *L) {
  int n = lua_gettop(L);
  lua_pushvalue(L, lua_upvalueindex(1));   /* resume */
  lua_pushvalue(L, lua_upvalueindex(2));   /* the coroutine */
  lua_rotate(L, 1, 2);
  lua_call(L, n + 1, LUA_MULTRET);
  if (!lua_toboolean(L, 1)) {   /* error in the coroutine: propagate */
    lua_settop(L, 2);
    if (lua_type(L, 2) == LUA_TSTRING) {  /* as coroutine.wrap: position */
      luaL_where(L, 1);
      lua_insert(L, 2);
      lua_concat(L, 2);
    }
    return lua_error(L);
  }
  return lua_gettop(L) - 1;
}


static int l_wrap (lua_State *L) {
  luaL_checktype(L, 1, LUA_TFUNCTION);
  lua_pushvalue(L, lua_upvalueindex(1));  /* resume (ours) */
  lua_newthread(L);
  lua_pushvalue(L, 1);
  lua_xmove(L, lua_tothread(L, -2), 1);  /* the body into the coroutine */
  lua_pushcclosure(L, wrapaux, 2);
  return 1;
}


/* Replace coroutine.resume and coroutine.wrap by the tracking ones. */
static void trackcoroutines (lua_State *L) {
  if (lua_getglobal(L, "coroutine") != LUA_TTABLE) {
    lua_pop(L, 1);
    return;
  }
  lua_getfield(L, -1, "resume");
  lua_pushcclosure(L, l_resume, 1);       /* coroutine, resume */
  lua_pushvalue(L, -1);
  lua_setfield(L, -3, "resume");
  lua_pushcclosure(L, l_wrap, 1);
  lua_setfield(L, -2, "wrap");
  lua_pop(L, 1);
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
  static char sharderr[512];
  char err[512];
  long i, n;
  int sl;
  memset(ss, 0, sizeof *ss);
  ss->quiet = o->quiet;
  ss->tty = isatty(STDERR_FILENO);
  ss->progress = o->quiet ? "off" : (ss->tty ? "bar" : "lines");
  ss->shard = ss->shards = 1;
  ss->from = "none";
  err[0] = '\0';
  sl = o->shard > 0 ? 0 : slurmshard(o->nshards, &i, &n, err, sizeof err);
  if (o->shard > 0 && o->nshards > 0) {
    l_message("give either --shard I/N or --shards N, not both");
    return 0;
  }
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
  else if (err[0] != '\0') {   /* an array without N: scans refuse */
    snprintf(sharderr, sizeof sharderr, "%s", err);
    ss->sharderr = sharderr;
  }
  else if (o->nshards > 0) {
    l_message("--shards N takes the shard number from SLURM_ARRAY_TASK_ID, "
              "which is not set: give --shard I/N instead");
    return 0;
  }
  if (o->jobs > 0 && (o->shard > 0 || sl > 0)) {
    l_message(o->shard > 0 ? "-j cannot be combined with --shard"
              : "-j cannot be combined with a Slurm job-array shard "
                "(--shards N or " SHARDS_ENV " with SLURM_ARRAY_TASK_ID): "
                "give one or the other");
    return 0;
  }
  if (o->jobs > 0)
    ss->sharderr = NULL;   /* the workers get --shard w/N */
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
  trackcoroutines(L);
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
  lua_sethook(L, NULL, 0, 0);   /* an interrupt: no hook for the finalizers */
  held = 1;
  report(L, status);
  lua_close(L);
  return (result && status == LUA_OK) ? EXIT_SUCCESS : EXIT_FAILURE;
}
