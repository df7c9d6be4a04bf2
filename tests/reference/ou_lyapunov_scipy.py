"""Reference check: locind's OU stationary covariance and exact transition
against SciPy (Debian python3-scipy 1.10, run with /usr/bin/python3).

- Stationary covariance S solves M S + S M^T + diag(sigma^2) = 0; SciPy's
  scipy.linalg.solve_continuous_lyapunov(M, -diag(sigma^2)) is the reference.
- e^{M h} against scipy.linalg.expm.
- Exact transition covariance Q(h) = S - e^{M h} S e^{M^T h} for a stable M
  (the stationary law is preserved by the transition; Gardiner, Handbook of
  Stochastic Methods, sec. 4.4.6), an identity independent of the block
  matrix exponential locind uses.

Usage: ou_lyapunov_scipy.py PATH_TO_ou_covariance_probe
"""
import subprocess
import sys

import numpy as np
from scipy.linalg import expm, solve_continuous_lyapunov


def random_stable_cases(rng, count):
    cases = []
    while len(cases) < count:
        n = int(rng.integers(1, 9))
        m = np.where(rng.random((n, n)) < 0.35, rng.normal(0.0, 0.8, (n, n)), 0.0)
        np.fill_diagonal(m, -rng.uniform(0.3, 2.5, n))
        if np.max(np.linalg.eigvals(m).real) >= -0.05:
            continue
        sigma = rng.uniform(0.1, 1.5, n)
        step = float(rng.choice([0.01, 0.1, 0.5, 2.0]))
        cases.append((m, sigma, step))
    return cases


def main():
    rng = np.random.default_rng(20240611)
    cases = random_stable_cases(rng, 40)
    text = []
    for m, sigma, step in cases:
        n = len(sigma)
        text.append(f"{n} {step!r}")
        text.append(" ".join(repr(float(x)) for x in m.ravel()))
        text.append(" ".join(repr(float(x)) for x in sigma))
    run = subprocess.run([sys.argv[1]], input="\n".join(text) + "\n", capture_output=True,
                         text=True, check=True)
    lines = run.stdout.strip().split("\n")
    assert len(lines) == 3 * len(cases), "probe printed %d lines" % len(lines)
    worst = 0.0
    for k, (m, sigma, step) in enumerate(cases):
        n = len(sigma)
        ours = [np.array([float(x) for x in lines[3 * k + i].split()]).reshape(n, n) for i in range(3)]
        s_ref = solve_continuous_lyapunov(m, -np.diag(sigma ** 2))
        f_ref = expm(m * step)
        q_ref = s_ref - f_ref @ s_ref @ f_ref.T
        for name, got, ref in (("S", ours[0], s_ref), ("expm", ours[1], f_ref), ("Q", ours[2], q_ref)):
            err = np.max(np.abs(got - ref)) / max(1.0, np.max(np.abs(ref)))
            worst = max(worst, err)
            if err > 1e-8:
                print(f"case {k} (n={n}, step={step}): {name} differs from SciPy by {err:.3g}")
                return 1
    print(f"{len(cases)} cases agree with SciPy; worst relative difference {worst:.3g}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
