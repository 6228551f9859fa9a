/*
** lsys.c -- what the scan files need of the system and Lua lacks, as the
** module "brakelight.sys" (package.preload, set by luaopen_brakelight), and
** the interrupt flag of the module's computations (lbl_interrupt)
** See Copyright Notice in LICENSE
**
**   sys.fsync(path)        -> true | nil, msg      (a file or a directory)
**   sys.lock(path)         -> lock, previous text | nil, holder text, "held"
**                             | nil, msg, "error"
**   lock:write(text)       -> true | nil, msg      (replaces the contents)
**   lock:release()         removes the lock file and unlocks (idempotent;
**                          also __gc, which unlocks without removing)
**   sys.dir(path)          -> list of the names in directory path (without
**                             "." and ".."), or nil, msg
**   sys.pid()              -> this process's id
**   sys.host()             -> the host name
**   sys.sleep(seconds)     waits (at most 60 s)
**   sys.interrupted()      -> the signal number lbl_interrupt was given, or
**                             false
**
** The lock is an flock(2) on the file `path`, so it is released when its
** process dies, however it dies: a lock file whose process is gone is free
** and the next writer takes it (the text it held says who left it).  The
** file is removed on release; a writer that locked a file since removed
** (it lost that race) opens the new one and tries again.
*/

#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <pthread.h>
#include <signal.h>
#include <stdlib.h>
#include <string.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#include "lbl_compat.h"

#include "brakelight/lbrakelight.h"
#include "lbl_internal.h"

#define LOCKMETA "brakelight.Lock"
#define LOCKTEXT_MAX 4096    /* longest holder text read back */


/* Set by lbl_interrupt (a signal handler) or by onsignal: every workspace
** of the module has it as stop flag.  Process-wide, as signals are. */
static volatile sig_atomic_t stopflag = 0;
static volatile sig_atomic_t sticky = 0;   /* lbl_interrupt was called */

void lbl_interrupt (int sig) {
  sticky = 1;
  stopflag = sig != 0 ? sig : 1;
}


/*
** The guard of a computing call (lbl_guardfield).  The stock interpreters
** (lua.c, luajit.c) catch SIGINT with a handler that only sets a hook,
** which runs when the next Lua instruction does: a long call of the
** module would not see it.  For the length of a call the guard puts its
** own handler before the one there: it sets the stop flag, so the call
** stops at its next point, and passes the signal on to the handler it
** found (lua.c's then raises "interrupted!" in Lua as before; the
** runner's calls lbl_interrupt).  Where there was none (the default
** action), it puts the default back, so a second signal acts at once, and
** guarded raises the signal again when the call has kept what it
** finished.  An ignored signal stays ignored.
*/
static const int guardsig[2] = {SIGINT, SIGTERM};
static struct sigaction before[2];   /* the dispositions the guard found */
static int installed[2];             /* the guard's handler was put there */
static int depth = 0;                /* guarded calls running (a finalizer
                                     ** may run one inside another, and
                                     ** states of other threads theirs) */
static pthread_mutex_t guardlock = PTHREAD_MUTEX_INITIALIZER;

static void onsignal (int sig, siginfo_t *info, void *ctx) {
  const struct sigaction *b = &before[sig == SIGTERM];
  if (!stopflag)
    stopflag = sig;
  if (b->sa_flags & SA_SIGINFO)
    b->sa_sigaction(sig, info, ctx);
  else if (b->sa_handler == SIG_DFL)
    sigaction(sig, b, NULL);   /* async-signal-safe */
  else if (b->sa_handler != SIG_IGN)
    b->sa_handler(sig);
}


static int isours (const struct sigaction *a) {
  return (a->sa_flags & SA_SIGINFO) && a->sa_sigaction == onsignal;
}


static void guard_on (void) {
  struct sigaction sa, cur;
  int i;
  pthread_mutex_lock(&guardlock);
  if (depth++ > 0) {
    pthread_mutex_unlock(&guardlock);
    return;
  }
  if (!sticky)
    stopflag = 0;   /* a signal of an earlier call was handled there */
  memset(&sa, 0, sizeof sa);
  sa.sa_sigaction = onsignal;
  sa.sa_flags = SA_SIGINFO | SA_RESTART;
  sigemptyset(&sa.sa_mask);
  for (i = 0; i < 2; i++) {
    /* before[] is complete before the handler that reads it is in */
    installed[i] = 0;
    if (sigaction(guardsig[i], NULL, &cur) != 0 || isours(&cur)
        || (!(cur.sa_flags & SA_SIGINFO) && cur.sa_handler == SIG_IGN))
      continue;
    before[i] = cur;
    if (sigaction(guardsig[i], &sa, NULL) == 0)
      installed[i] = 1;
  }
  pthread_mutex_unlock(&guardlock);
}


/* Put back what guard_on found; -> the signal whose default action is
** still to be taken (0: none); *passed is 1 if the guard passed a signal
** on to the host's handler. */
static int guard_off (int *passed) {
  struct sigaction cur;
  int i, sig = 0;
  *passed = 0;
  pthread_mutex_lock(&guardlock);
  if (--depth > 0) {
    pthread_mutex_unlock(&guardlock);
    return 0;
  }
  for (i = 0; i < 2; i++) {
    if (!installed[i])
      continue;
    if (sigaction(guardsig[i], NULL, &cur) == 0 && isours(&cur))
      sigaction(guardsig[i], &before[i], NULL);
    if (!sticky && stopflag == guardsig[i]) {
      if (!(before[i].sa_flags & SA_SIGINFO)
          && before[i].sa_handler == SIG_DFL)
        sig = guardsig[i];
      else
        *passed = 1;
    }
    installed[i] = 0;
  }
  pthread_mutex_unlock(&guardlock);
  return sig;
}


/*
** A computing library function, upvalue 1, called with the guard on
** (the arguments and results pass through; an error is raised again as it
** came).  A signal whose action was the default is raised again once the
** call is over: the process ends as it would have, after a spectrum kept
** its finished points.  A call that stopped on a signal passed on to the
** host's handler raises its own error, which says what was kept: the
** hook that lua.c's handler set, which would replace that error by its
** "interrupted!" (or, in LuaJIT, by "error in error handling"), is
** cleared, as its own first run would have cleared it.
*/
static int guarded (lua_State *L) {
  int n = lua_gettop(L), st, sig, passed;
  lua_pushvalue(L, lua_upvalueindex(1));
  lua_insert(L, 1);
  guard_on();
  st = lua_pcall(L, n, LUA_MULTRET, 0);
  sig = guard_off(&passed);
  if (sig != 0)
    raise(sig);
  if (st != 0) {
    if (passed)
      lua_sethook(L, NULL, 0, 0);
    return lua_error(L);
  }
  return lua_gettop(L);
}


void lbl_guardfield (lua_State *L, const char *name) {
  lua_getfield(L, -1, name);
  lua_pushcclosure(L, guarded, 1);
  lua_setfield(L, -2, name);
}

const volatile sig_atomic_t *lbl_stopflag (void) {
  return &stopflag;
}


typedef struct LLock {
  int fd;              /* -1 when released */
  char *path;          /* owned copy, NULL when released */
} LLock;


/* sys.fsync(path) -> true | nil, msg */
static int l_fsync (lua_State *L) {
  const char *path = luaL_checkstring(L, 1);
  int fd = open(path, O_RDONLY), st, e;
  if (fd < 0) {
    lua_pushnil(L);
    lua_pushfstring(L, "%s: %s", path, strerror(errno));
    return 2;
  }
  st = fsync(fd);
  e = errno;
  close(fd);
  if (st != 0 && e != EINVAL && e != EROFS) {  /* EINVAL: no sync there */
    lua_pushnil(L);
    lua_pushfstring(L, "fsync %s: %s", path, strerror(e));
    return 2;
  }
  lua_pushboolean(L, 1);
  return 1;
}


/* Read at most LOCKTEXT_MAX bytes of fd from its start; push them. */
static void pushcontents (lua_State *L, int fd) {
  char buf[LOCKTEXT_MAX];
  ssize_t n, got = 0;
  if (lseek(fd, 0, SEEK_SET) == 0)
    while (got < (ssize_t)sizeof buf
           && (n = read(fd, buf + got, sizeof buf - (size_t)got)) > 0)
      got += n;
  lua_pushlstring(L, buf, (size_t)got);
}


/* sys.lock(path) -> lock, previous | nil, holder, "held" | nil, msg, "error" */
static int l_lock (lua_State *L) {
  const char *path = luaL_checkstring(L, 1);
  LLock *lk = (LLock *)lua_newuserdatauv(L, sizeof *lk, 0);
  int tries;
  lk->fd = -1;
  lk->path = NULL;
  luaL_setmetatable(L, LOCKMETA);
  for (tries = 0; tries < 20; tries++) {
    struct stat a, b;
    int fd = open(path, O_RDWR | O_CREAT | O_CLOEXEC, 0644);
    if (fd < 0) {
      lua_pushnil(L);
      lua_pushfstring(L, "cannot open lock file %s: %s", path, strerror(errno));
      lua_pushliteral(L, "error");
      return 3;
    }
    if (flock(fd, LOCK_EX | LOCK_NB) != 0) {
      int e = errno;
      if (e == EWOULDBLOCK) {
        lua_pushnil(L);
        pushcontents(L, fd);
        close(fd);
        lua_pushliteral(L, "held");
        return 3;
      }
      close(fd);
      lua_pushnil(L);
      lua_pushfstring(L, "cannot lock %s: %s", path, strerror(e));
      lua_pushliteral(L, "error");
      return 3;
    }
    /* locked: is it still the file of that name? (its holder may have
    ** removed it between our open and our flock) */
    if (fstat(fd, &a) == 0 && stat(path, &b) == 0 && a.st_dev == b.st_dev
        && a.st_ino == b.st_ino) {
      size_t n = strlen(path) + 1;
      lk->path = (char *)malloc(n);
      if (lk->path == NULL) {
        close(fd);
        return luaL_error(L, "not enough memory");
      }
      memcpy(lk->path, path, n);
      lk->fd = fd;
      pushcontents(L, fd);     /* what the last holder left */
      return 2;
    }
    close(fd);
  }
  lua_pushnil(L);
  lua_pushfstring(L, "cannot lock %s: it keeps being replaced", path);
  lua_pushliteral(L, "error");
  return 3;
}


/* lock:write(text) -> true | nil, msg: the holder's description */
static int lock_write (lua_State *L) {
  LLock *lk = (LLock *)luaL_checkudata(L, 1, LOCKMETA);
  size_t len, off = 0;
  const char *text = luaL_checklstring(L, 2, &len);
  if (lk->fd < 0)
    return luaL_error(L, "lock already released");
  if (ftruncate(lk->fd, 0) != 0 || lseek(lk->fd, 0, SEEK_SET) != 0)
    goto fail;
  while (off < len) {
    ssize_t n = write(lk->fd, text + off, len - off);
    if (n < 0 && errno == EINTR)
      continue;
    if (n <= 0)
      goto fail;
    off += (size_t)n;
  }
  lua_pushboolean(L, 1);
  return 1;
fail:
  lua_pushnil(L);
  lua_pushfstring(L, "%s: %s", lk->path, strerror(errno));
  return 2;
}


/* lock:release(): remove the file, then unlock (close) */
static int lock_release (lua_State *L) {
  LLock *lk = (LLock *)luaL_checkudata(L, 1, LOCKMETA);
  if (lk->fd >= 0) {
    if (lk->path != NULL)
      unlink(lk->path);        /* while still locked: no one holds it */
    close(lk->fd);
    lk->fd = -1;
  }
  free(lk->path);
  lk->path = NULL;
  return 0;
}


/* __gc: unlock without removing (the file then says who left it) */
static int lock_gc (lua_State *L) {
  LLock *lk = (LLock *)luaL_checkudata(L, 1, LOCKMETA);
  if (lk->fd >= 0)
    close(lk->fd);
  lk->fd = -1;
  free(lk->path);
  lk->path = NULL;
  return 0;
}


/* sys.dir(path) -> {names} | nil, msg */
static int l_dir (lua_State *L) {
  const char *path = luaL_checkstring(L, 1);
  DIR *d;
  struct dirent *e;
  lua_Integer n = 0;
  lua_newtable(L);                    /* before opendir: a raise leaks nothing */
  d = opendir(path);
  if (d == NULL) {
    lua_pushnil(L);
    lua_pushfstring(L, "%s: %s", path, strerror(errno));
    return 2;
  }
  while ((e = readdir(d)) != NULL) {
    if (strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0)
      continue;
    if (!lua_checkstack(L, 2))
      break;
    lua_pushstring(L, e->d_name);     /* may raise (memory): d leaks then */
    lua_rawseti(L, -2, ++n);
  }
  closedir(d);
  return 1;
}


static int l_pid (lua_State *L) {
  lua_pushinteger(L, (lua_Integer)getpid());
  return 1;
}


static int l_host (lua_State *L) {
  char buf[256];
  if (gethostname(buf, sizeof buf) != 0)
    strcpy(buf, "unknown");
  buf[sizeof buf - 1] = '\0';
  lua_pushstring(L, buf);
  return 1;
}


static int l_sleep (lua_State *L) {
  double s = luaL_checknumber(L, 1);
  struct timespec ts;
  if (!(s > 0))
    return 0;
  if (s > 60)
    s = 60;
  ts.tv_sec = (time_t)s;
  ts.tv_nsec = (long)((s - (double)ts.tv_sec) * 1e9);
  nanosleep(&ts, NULL);   /* a signal ends it early: fine */
  return 0;
}


static int l_interrupted (lua_State *L) {
  if (stopflag)
    lua_pushinteger(L, (lua_Integer)stopflag);
  else
    lua_pushboolean(L, 0);
  return 1;
}


static int luaopen_sys (lua_State *L) {
  static const luaL_Reg funcs[] = {
    {"fsync", l_fsync}, {"lock", l_lock}, {"dir", l_dir}, {"pid", l_pid},
    {"host", l_host},
    {"sleep", l_sleep}, {"interrupted", l_interrupted}, {NULL, NULL}
  };
  static const luaL_Reg methods[] = {
    {"write", lock_write}, {"release", lock_release}, {NULL, NULL}
  };
  if (luaL_newmetatable(L, LOCKMETA)) {
    luaL_newlib(L, methods);
    lua_setfield(L, -2, "__index");
    lua_pushcfunction(L, lock_gc);
    lua_setfield(L, -2, "__gc");
  }
  lua_pop(L, 1);
  luaL_newlib(L, funcs);
  return 1;
}


/*
** package.preload["brakelight.sys"] = luaopen_sys, so that
** require "brakelight.sys" works in every host once the module is loaded.
*/
void lbl_sys_open (lua_State *L) {
  if (lua_getglobal(L, "package") == LUA_TTABLE) {
    if (lua_getfield(L, -1, "preload") == LUA_TTABLE) {
      lua_pushcfunction(L, luaopen_sys);
      lua_setfield(L, -2, BL_MODNAME ".sys");
    }
    lua_pop(L, 1);
  }
  lua_pop(L, 1);
}
