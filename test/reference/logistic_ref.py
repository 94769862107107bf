"""The verdict model's fit, computed independently with scipy.

Reads JSON {"X": [[...]], "y": [...], "theta0": [...], "lambda": L} on stdin and prints the θ that
scipy.optimize.minimize (BFGS, analytic gradient) finds for
    sum_i [log(1 + exp(θ·x_i)) - y_i θ·x_i] + (L / 2) ||θ - θ0||²,
the negative log-likelihood of the logistic model with a Gaussian prior centred on θ0.
"""
import json
import sys

import numpy as np
from scipy.optimize import minimize


def main():
    d = json.load(sys.stdin)
    X = np.array(d['X'], dtype=float)
    y = np.array(d['y'], dtype=float)
    t0 = np.array(d['theta0'], dtype=float)
    lam = float(d['lambda'])

    def f(t):
        z = X @ t
        nll = np.sum(np.logaddexp(0.0, z) - y * z) + 0.5 * lam * np.sum((t - t0) ** 2)
        p = 1.0 / (1.0 + np.exp(-z))
        grad = X.T @ (p - y) + lam * (t - t0)
        return nll, grad

    r = minimize(f, t0, jac=True, method='BFGS', options={'gtol': 1e-10, 'maxiter': 10000})
    # BFGS may stop on "precision loss" at the optimum; the gradient's size says whether it got there.
    json.dump({'theta': r.x.tolist(), 'gradNorm': float(np.max(np.abs(f(r.x)[1]))), 'fun': float(r.fun)}, sys.stdout)


main()
