"""Stationary moments of the two-node tanh diffusion checked in
tests/sim/tanh_reference_test.cc, by numerical quadrature (SciPy 1.10,
numpy 1.24; run with /usr/bin/python3, prints the values).

Model (sim/diffusion_model.h, tanh family, c = 0):
    dX1 = -th1 X1 dt + sig dW1
    dX2 = (-th2 X2 + k tanh(X1)) dt + sig dW2
X1 is Ornstein-Uhlenbeck, stationary N(0, s^2), s^2 = sig^2 / (2 th1), with
correlation exp(-th1 |tau|) (Gardiner, Handbook of Stochastic Methods,
sec. 4.4.4). X2 is X1's tanh filtered by exp(-th2 u) plus independent OU
noise, so (derived here, not from a source):
    Var X2 = sig^2 / (2 th2) + (k^2 / th2) int_0^inf C(tau) exp(-th2 tau) dtau,
    C(tau) = E[tanh X1(0) tanh X1(tau)] (a bivariate normal expectation,
             Gauss-Hermite with 80 x 80 nodes);
    Cov(X1, X2) = k E[X tanh X] / (th1 + th2), X ~ N(0, s^2)
(E[X1(t) | X1(t - u)] = exp(-th1 u) X1(t - u)).
"""
import numpy as np
from numpy.polynomial.hermite_e import hermegauss
from scipy import integrate

TH1, TH2, SIG, K = 1.0, 1.0, 1.0, 1.5
S = SIG / np.sqrt(2 * TH1)
NODES, WEIGHTS = hermegauss(80)
WEIGHTS = WEIGHTS / np.sqrt(2 * np.pi)


def tanh_autocovariance(tau):
    r = np.exp(-TH1 * tau)
    z1, z2 = np.meshgrid(NODES, NODES, indexing="ij")
    w = np.outer(WEIGHTS, WEIGHTS)
    return np.sum(w * np.tanh(S * z1) * np.tanh(S * (r * z1 + np.sqrt(1 - r * r) * z2)))


def gaussian(f):
    return integrate.quad(lambda x: f(x) * np.exp(-x * x / (2 * S * S)) / np.sqrt(2 * np.pi * S * S),
                          -np.inf, np.inf)[0]


if __name__ == "__main__":
    tail = integrate.quad(lambda t: tanh_autocovariance(t) * np.exp(-TH2 * t), 0, np.inf, limit=200)[0]
    print("Var X2 =", repr(SIG**2 / (2 * TH2) + K**2 / TH2 * tail))
    print("Cov(X1, X2) =", repr(K * gaussian(lambda x: x * np.tanh(x)) / (TH1 + TH2)))
