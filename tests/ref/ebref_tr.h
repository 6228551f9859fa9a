/*
** ebref_tr.h -- the trace route of tests/ref/ebref.c, written once for any
** floating type (included by ebref.c in long double and by ebquad.c in
** __float128; tests only)
** See Copyright Notice in LICENSE
**
** The includer defines: real (a real floating type), cld (its complex
** type), TR_CONJ, TR_CREAL (conjugate, real part), TR_PI, TR_ALPHA (in
** real precision) and TR_MSQ (the name of the static function made here).
** Every momentum, matrix and sum is carried in real.
*/

typedef cld mat[4][4];

static const real G[4] = {1, -1, -1, -1};   /* the metric's diagonal */

static real rdot (const real a[4], const real b[4]) {
  return a[0] * b[0] - a[1] * b[1] - a[2] * b[2] - a[3] * b[3];
}

/* chiral representation: gamma^0 = [[0, 1], [1, 0]],
** gamma^i = [[0, sigma_i], [-sigma_i, 0]] */
static void gam (int mu, mat g) {
  static const cld s[4][2][2] = {
    {{1, 0}, {0, 1}},
    {{0, 1}, {1, 0}},
    {{0, -I}, {I, 0}},
    {{1, 0}, {0, -1}}};
  int i, j;
  memset(g, 0, sizeof(mat));
  for (i = 0; i < 2; i++)
    for (j = 0; j < 2; j++) {
      g[i][j + 2] = s[mu][i][j];
      g[i + 2][j] = mu == 0 ? s[mu][i][j] : -s[mu][i][j];
    }
}

static void mmul (const mat a, const mat b, mat c) {
  mat t;
  int i, j, l;
  for (i = 0; i < 4; i++)
    for (j = 0; j < 4; j++) {
      cld x = 0;
      for (l = 0; l < 4; l++)
        x += a[i][l] * b[l][j];
      t[i][j] = x;
    }
  memcpy(c, t, sizeof(mat));
}

static void madd (mat a, const mat b, cld f) {
  int i, j;
  for (i = 0; i < 4; i++)
    for (j = 0; j < 4; j++)
      a[i][j] += f * b[i][j];
}

/* p/ + c (sum over mu of g_mumu gamma^mu p^mu) */
static void sl (const real p[4], real c, mat out) {
  mat g;
  int mu, i;
  memset(out, 0, sizeof(mat));
  for (mu = 0; mu < 4; mu++) {
    gam(mu, g);
    madd(out, g, G[mu] * p[mu]);
  }
  for (i = 0; i < 4; i++)
    out[i][i] += c;
}

/* Dirac adjoint gamma^0 A^dagger gamma^0 */
static void bar (const mat a, mat out) {
  mat g0, t;
  int i, j;
  gam(0, g0);
  for (i = 0; i < 4; i++)
    for (j = 0; j < 4; j++)
      t[i][j] = TR_CONJ(a[j][i]);
  mmul(g0, t, t);
  mmul(t, g0, out);
}

/* A bracket [wbar(L) X w(R)] of one term: labels 0..3 (p1..p4); for a
** scalar line the bracket is the number x (labels < 0). */
typedef struct brk {
  int L, R;
  mat X[4];            /* per virtual-photon index mu */
  cld x[4];   /* scalar line */
} brk;

typedef struct term {
  brk b[2];
  real c;
} term;

/* Fermion line with flow pin -> pout, mass m: the plain vertex gamma^mu,
** or the emission of a photon of polarisation e_rho (contravariant unit
** vector) and momentum k. */
static void fline (brk *B, int L, int R, const real pin[4],
                   const real pout[4], real m, int rad, int rho,
                   const real k[4]) {
  int mu, i;
  B->L = L;
  B->R = R;
  for (mu = 0; mu < 4; mu++) {
    mat gm;
    gam(mu, gm);
    if (!rad) {
      memcpy(B->X[mu], gm, sizeof(mat));
    } else {
      mat er, sa, sb, t1, t2;
      real a[4], b[4];
      for (i = 0; i < 4; i++) {
        a[i] = pout[i] + k[i];
        b[i] = pin[i] - k[i];
      }
      gam(rho, er);   /* eps/ with eps^nu = delta^nu_rho: g_rhorho gamma^rho */
      for (i = 0; i < 16; i++)
        er[i / 4][i % 4] *= G[rho];
      sl(a, m, sa);
      sl(b, m, sb);
      mmul(er, sa, t1);
      mmul(t1, gm, t1);
      mmul(gm, sb, t2);
      mmul(t2, er, t2);
      memset(B->X[mu], 0, sizeof(mat));
      madd(B->X[mu], t1, 1.0 / (2.0 * rdot(pout, k)));
      madd(B->X[mu], t2, 1.0 / (-2.0 * rdot(pin, k)));
    }
  }
}

static void sline (brk *B, const real pin[4], const real pout[4], int rad,
                   int rho, const real k[4]) {
  int mu;
  real e[4] = {0, 0, 0, 0}, a[4], b[4];
  B->L = B->R = -1;
  e[rho] = 1.0;
  for (mu = 0; mu < 4; mu++) {
    a[mu] = 2.0 * pout[mu] + k[mu];
    b[mu] = 2.0 * pin[mu] - k[mu];
  }
  for (mu = 0; mu < 4; mu++) {
    real s = pin[mu] + pout[mu];
    if (!rad)
      B->x[mu] = s;
    else
      B->x[mu] = rdot(a, e) * (s + k[mu]) / (2.0 * rdot(pout, k))
                 + rdot(b, e) * (s - k[mu]) / (-2.0 * rdot(pin, k))
                 - 2.0 * e[mu];
  }
}

/* one line of a pair: momenta in flow form, labels, mass, scalar */
typedef struct end {
  int L, R, scalar;
  real pin[4], pout[4], m, Q;
} end;

static void mkend (end *E, const real p[5][4], int L, int antiL, int R,
                   int antiR, real m, real Q, int scalar) {
  int i;
  for (i = 0; i < 4; i++) {
    E->pout[i] = antiL ? -p[L][i] : p[L][i];
    E->pin[i] = antiR ? -p[R][i] : p[R][i];
  }
  E->L = L; E->R = R; E->m = m; E->Q = Q; E->scalar = scalar;
}

static void mkbrk (brk *B, const end *E, int rad, int rho, const real k[4]) {
  if (E->scalar)
    sline(B, E->pin, E->pout, rad, rho, k);
  else
    fline(B, E->L, E->R, E->pin, E->pout, E->m, rad, rho, k);
}

static real q2 (const end *E) {
  real d[4];
  int i;
  for (i = 0; i < 4; i++)
    d[i] = E->pout[i] - E->pin[i];
  return rdot(d, d);
}

/* two terms (radiation from X, from Y) of the pair X, Y with sign */
static int pair (term *t, const end *X, const end *Y, real sign, int rho,
                 const real k[4]) {
  mkbrk(&t[0].b[0], X, 1, rho, k);
  mkbrk(&t[0].b[1], Y, 0, rho, k);
  t[0].c = sign * X->Q * Y->Q * X->Q / q2(Y);
  mkbrk(&t[1].b[0], X, 0, rho, k);
  mkbrk(&t[1].b[1], Y, 1, rho, k);
  t[1].c = sign * X->Q * Y->Q * Y->Q / q2(X);
  return 2;
}

/* sum over spins of (term t at mu)(term u at nu)^*: the brackets of t and
** the adjoint brackets of u, chained into loops through the projectors
** sum_s w(p) wbar(p) = p/ + m (particle) or p/ - m (antiparticle). */
static cld spinsum (const term *t, int mu, const term *u, int nu,
                               const real sgnm[4], const real p[5][4]) {
  mat X[4];
  int L[4], R[4], n = 0, used[4] = {0, 0, 0, 0}, i;
  cld f = 1.0;
  for (i = 0; i < 2; i++) {
    const brk *b = &t->b[i], *c = &u->b[i];
    if (b->L < 0)
      f *= b->x[mu];
    else {
      memcpy(X[n], b->X[mu], sizeof(mat));
      L[n] = b->L; R[n] = b->R; n++;
    }
    if (c->L < 0)
      f *= TR_CONJ(c->x[nu]);
    else {
      bar(c->X[nu], X[n]);
      L[n] = c->R; R[n] = c->L; n++;
    }
  }
  for (i = 0; i < n; i++) {
    int cur = i, j;
    mat A, P;
    cld tr = 0;
    if (used[i])
      continue;
    memcpy(A, X[i], sizeof(mat));
    used[i] = 1;
    for (;;) {
      int lab = R[cur], nx = -1;
      sl(p[lab], sgnm[lab], P);
      mmul(A, P, A);
      for (j = 0; j < n; j++)
        if (!used[j] && L[j] == lab) { nx = j; break; }
      if (nx < 0)
        break;
      mmul(A, X[nx], A);
      used[nx] = 1;
      cur = nx;
    }
    for (j = 0; j < 4; j++)
      tr += A[j][j];
    f *= tr;
  }
  return f;
}

static real TR_MSQ (int kind, real m, real z, int spin2,
                    const real p[5][4]) {
  real sgnm[4] = {m, 1.0, m, 1.0}, sum = 0.0, e2 = 4 * TR_PI * TR_ALPHA;
  int rho;
  for (rho = 0; rho < 4; rho++) {
    term t[4];
    end X, Y;
    int n = 0, a, b, mu, nu;
    cld s = 0;
    if (kind == 2) {
      sgnm[0] = -1.0; sgnm[2] = -1.0;
      mkend(&X, p, 0, 1, 2, 1, 1.0, -1.0, 0);   /* vbar(p1) ... v(p3) */
      mkend(&Y, p, 3, 0, 1, 0, 1.0, -1.0, 0);   /* ubar(p4) ... u(p2) */
      n += pair(t + n, &X, &Y, 1.0, rho, p[4]);
      mkend(&X, p, 0, 1, 1, 0, 1.0, -1.0, 0);   /* vbar(p1) ... u(p2) */
      mkend(&Y, p, 3, 0, 2, 1, 1.0, -1.0, 0);   /* ubar(p4) ... v(p3) */
      n += pair(t + n, &X, &Y, -1.0, rho, p[4]);
    } else {
      mkend(&X, p, 2, 0, 0, 0, m, kind == 1 ? -1.0 : z, spin2 == 0);
      mkend(&Y, p, 3, 0, 1, 0, 1.0, -1.0, 0);
      n += pair(t + n, &X, &Y, 1.0, rho, p[4]);
      if (kind == 1) {
        mkend(&X, p, 3, 0, 0, 0, 1.0, -1.0, 0);
        mkend(&Y, p, 2, 0, 1, 0, 1.0, -1.0, 0);
        n += pair(t + n, &X, &Y, -1.0, rho, p[4]);
      }
    }
    for (a = 0; a < n; a++)
      for (b = 0; b < n; b++)
        for (mu = 0; mu < 4; mu++)
          for (nu = 0; nu < 4; nu++)
            s += t[a].c * t[b].c * G[mu] * G[nu]
                 * spinsum(&t[a], mu, &t[b], nu, sgnm, p);
    /* polarisation sum: -g^{rho rho} |M(e_rho)|^2 */
    sum += -G[rho] * TR_CREAL(s);
  }
  return sum * e2 * e2 * e2;
}

