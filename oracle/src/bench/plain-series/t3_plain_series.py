#!/usr/bin/env python3
"""The alternative a practitioner has: the plain truncated eigenfunction series of NAFEMS T3
(TNSB Rev. 3, 1990), vectorised with numpy, for comparison with `eigencheck eval` whole process
against whole process.

u(x,t) = (x/L) b(t) + sum_n v_n(t) sin(n pi x/L), b = 100 sin(w t), w = pi/40, and
v_n(t) = -(2 (-1)^(n+1) / (n pi)) * 100 w (lam cos wt + w sin wt - lam e^(-lam t)) / (lam^2 + w^2),
lam = alpha (n pi/L)^2 (the Duhamel integral of the lifting's source in closed form).

usage: t3_plain_series.py MODES POINTS.csv OUT.csv
"""
import sys
import numpy as np

L, K, RHO_C = 0.1, 35.0, 7200 * 440.5
ALPHA = K / RHO_C
W = np.pi / 40


def main():
    modes = int(sys.argv[1])
    data = np.loadtxt(sys.argv[2], delimiter=",", comments="#", skiprows=1)
    x, t = data[:, 0], data[:, 1]
    u = x / L * 100 * np.sin(W * t)
    chunk = 256
    for start in range(1, modes + 1, chunk):
        n = np.arange(start, min(modes, start + chunk - 1) + 1, dtype=float)
        lam = ALPHA * (n * np.pi / L) ** 2
        sign = np.where(n % 2 == 1, 1.0, -1.0)
        tt = t[:, None]
        v = -(2 * sign / (n * np.pi)) * 100 * W * (lam * np.cos(W * tt) + W * np.sin(W * tt)
                                                  - lam * np.exp(-lam * tt)) / (lam ** 2 + W ** 2)
        u += np.sum(v * np.sin(np.outer(x, n * np.pi / L)), axis=1)
    np.savetxt(sys.argv[3], np.column_stack([x, t, u]), delimiter=",", header="x,t,u", comments="", fmt="%.17g")


if __name__ == "__main__":
    main()
