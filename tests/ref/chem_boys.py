"""chem_boys.py: the Boys function F_m(T) of the integral code against scipy,
F_m(T) = Gamma(m+1/2) P(m+1/2, T) / (2 T^(m+1/2)) with scipy.special.gammainc
(regularized lower incomplete gamma), and F_m(0) = 1/(2m+1) (common practice),
for m = 0..18 over T from 0 to 200, across the table/asymptotic switch at 36.
Relative tolerance 1e-12."""
import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import DRIVER, Checker

from scipy.special import gamma, gammainc

c = Checker()
M = 18
for T in (0.0, 1e-9, 1e-4, 0.024, 0.025, 0.5, 1.0, 2.5, 7.3, 12.0, 20.0, 29.99, 35.97, 35.99, 36.0, 36.01, 50.0,
          100.0, 200.0):
    out = subprocess.run([DRIVER, "--boys", str(M), repr(T)], capture_output=True, text=True, check=True).stdout
    ours = [float(x) for x in out.split()]
    worst = 0.0
    for m in range(M + 1):
        if T == 0.0:
            ref = 1.0 / (2 * m + 1)  # common practice: F_m(0) = 1/(2m+1)
        else:
            a = m + 0.5
            ref = gamma(a) * gammainc(a, T) / (2 * T ** a)  # scipy
        worst = max(worst, abs(ours[m] - ref) / ref)
    c.close("max relative error of F_0..F_%d(%g)" % (M, T), worst, 0.0, 1e-12)
c.finish()
