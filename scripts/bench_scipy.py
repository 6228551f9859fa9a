#!/usr/bin/python3
"""bench_scipy.py -- independent SciPy version of the dsigma/dk integral.

Part of `make bench` (scripts/bench.sh); not a test.  It integrates the
fully differential first-order Born cross section of a spin-1/2 projectile
of electron mass on a screened atom (exponential screening) over the photon
and final-particle directions with nested scipy.integrate.quad calls, and
prints the value and the wall time per point, for comparison with the C
core (same integral, same relative tolerance).

Formula (Bethe & Heitler 1934; Koch & Motz 1959, 2BN), units
hbar = c = m = 1, k along z, theta0 = angle(p0, k), theta = angle(p, k),
phi = azimuth between the (p0, k) and (p, k) planes:

  d3sigma/(dk dOmega_k dOmega_p) = alpha r0^2/(4 pi^2) (p/(p0 k)) G(q)/q^4 B
  B = 4 |E0 u - E u0|^2 - q^2 |u - u0|^2 + 2 k^2 |p_perp - p0_perp|^2 / (D D0)
  u = p_perp/D, D = E - p cos(theta); u0 = p0_perp/D0, D0 = E0 - p0 cos(theta0)
  G(q) = Z^2 (1 - F/Z)^2,  F/Z = 1/(1 + (q a)^2),  a = 111 Z^(-1/3)
         (Schiff 1951; a in units of hbar/(m_e c) = 1 here since m = m_e)
  dOmega_k dOmega_p = 2 pi sin(theta0) dtheta0 sin(theta) dtheta dphi,
  phi over [0, 2 pi] = 2 x [0, pi] by symmetry.

Cancellation-free kinematics (DEVELOPERS.md, kinematics): E - p cos(theta) =
1/(E + p) + 2 p sin^2(theta/2); q_z = (p0 - p - k) - 2 p0 sin^2(theta0/2)
+ 2 p sin^2(theta/2) with p0 - p - k = k [1/(E0 + p0) + 1/(E + p)]/(p0 + p);
|q_perp|^2 = (p0 sin(theta0) - p sin(theta))^2 + 4 p0 p sin(theta0)
sin(theta) sin^2(phi/2); p = sqrt(t (t + 2)) from the kinetic energy t.

usage: bench_scipy.py [--rtol R] [--Z Z] POINT...   POINT = T:y (T in MeV)
output: one line per point, "T y dsdk seconds", dsdk in mb/MeV
"""

import math
import sys
import time

try:
    from scipy import integrate
except ImportError:
    sys.stderr.write("bench_scipy: scipy is not importable by %s\n"
                     % sys.executable)
    sys.exit(3)

ALPHA = 1 / 137.035999084      # CODATA 2018
RE2_MB = 79.407877             # r_e^2 in mb (CODATA 2018, r_e = 2.8179403262 fm)
ME_MEV = 0.51099895000         # m_e c^2, MeV (CODATA 2018)


def dsdk(T, y, Z, rtol, screening="exponential"):
    """dsigma/dk (mb/MeV) of an electron-mass spin-1/2 projectile of kinetic
    energy T (MeV) emitting k = y T on atom Z with exponential screening
    (screening="none": bare point nucleus, G = Z^2, for checking against
    Koch & Motz 3BN)."""
    m = ME_MEV
    t0 = T / m
    k = y * t0
    t = t0 - k
    E0, E = 1 + t0, 1 + t
    p0, p = math.sqrt(t0 * (t0 + 2)), math.sqrt(t * (t + 2))
    qmin = k * (1 / (E0 + p0) + 1 / (E + p)) / (p0 + p)   # p0 - p - k
    a = 111.0 * Z ** (-1.0 / 3.0)
    a2 = a * a
    screened = screening == "exponential"
    pref = ALPHA * RE2_MB / (4 * math.pi ** 2) * p / (p0 * k)

    def f_phi(phi, th, th0):
        # fully differential cross section without the prefactor, times the
        # solid-angle weights sin(th0) sin(th) (and 2 pi for the k azimuth)
        s0, s = math.sin(th0), math.sin(th)
        h0, h = math.sin(th0 / 2) ** 2, math.sin(th / 2) ** 2
        hp = math.sin(phi / 2) ** 2
        D0 = 1 / (E0 + p0) + 2 * p0 * h0
        D = 1 / (E + p) + 2 * p * h
        qz = qmin - 2 * p0 * h0 + 2 * p * h
        qperp2 = (p0 * s0 - p * s) ** 2 + 4 * p0 * p * s0 * s * hp
        q2 = qz * qz + qperp2
        # G/q^4 with G = Z^2 (q^2 a^2 / (1 + q^2 a^2))^2: finite as q -> 0
        if screened:
            gq4 = Z * Z * a2 * a2 / (1 + q2 * a2) ** 2
        else:
            gq4 = Z * Z / (q2 * q2)
        # |E0 u - E u0|^2 and |u - u0|^2 written as (x - y)^2 + 4 x y sin^2(phi/2)
        us, u0s = p * s / D, p0 * s0 / D0
        A, Bv = E0 * us, E * u0s
        w1 = (A - Bv) ** 2 + 4 * A * Bv * hp
        w2 = (us - u0s) ** 2 + 4 * us * u0s * hp
        br = 4 * w1 - q2 * w2 + 2 * k * k * qperp2 / (D * D0)
        return gq4 * br * s0 * s

    # the integrand peaks at photon angles ~ 1/E0, particle angles ~ 1/E
    # around the photon and near the beam direction (theta ~ theta0, phi ~ 0)
    def pts(lo, hi, cand):
        return sorted({c for c in cand if lo < c < hi})

    def f_theta(th, th0):
        # azimuthal width of the q-peak: |q_perp| ~ max(|p0 s0 - p s|, qmin)
        ss = p0 * p * math.sin(th0) * math.sin(th)
        qw = max(abs(p0 * math.sin(th0) - p * math.sin(th)), qmin)
        phc = qw / math.sqrt(ss) if ss > 0 else math.pi
        v, _ = integrate.quad(f_phi, 0, math.pi, args=(th, th0),
                              epsabs=0, epsrel=rtol, limit=200,
                              points=pts(0, math.pi, [phc, 10 * phc]))
        return 2 * v

    def f_theta0(th0):
        # particle along the photon (theta ~ 1/E) or along the beam
        # (p sin(theta) = p0 sin(theta0))
        x = p0 * math.sin(th0) / p
        thb = math.asin(x) if x < 1 else math.pi / 2
        v, _ = integrate.quad(f_theta, 0, math.pi, args=(th0,),
                              epsabs=0, epsrel=rtol, limit=200,
                              points=pts(0, math.pi, [1 / E, 10 / E, thb,
                                                      0.5 * thb, 2 * thb]))
        return v

    v, _ = integrate.quad(f_theta0, 0, math.pi, epsabs=0, epsrel=rtol,
                          limit=200,
                          points=pts(0, math.pi, [1 / E0, 10 / E0, 100 / E0]))
    return 2 * math.pi * pref * v / m       # per MeV of photon energy


def main(argv):
    rtol, Z, points = 1e-4, 82, []
    i = 0
    while i < len(argv):
        if argv[i] == "--rtol":
            rtol = float(argv[i + 1])
            i += 2
        elif argv[i] == "--Z":
            Z = int(argv[i + 1])
            i += 2
        else:
            T, y = argv[i].split(":")
            points.append((float(T), float(y)))
            i += 1
    if not points:
        sys.stderr.write(__doc__.split("usage: ")[1])
        return 2
    for T, y in points:
        start = time.perf_counter()
        val = dsdk(T, y, Z, rtol)
        secs = time.perf_counter() - start
        print("%g %g %.10e %.6f" % (T, y, val, secs), flush=True)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
