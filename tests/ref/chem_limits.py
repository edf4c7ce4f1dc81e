"""chem_limits.py: the exact solver estimates its memory before allocating and
refuses clearly when the determinant space does not fit: H14 in STO-3G
(14 electrons in 14 orbitals, 11,778,624 determinants) under a 2 GiB address
-space limit must fail with exit status 1 and a message giving the space, the
need and what is available, and nothing else.  (3432^2 determinants: common
practice, the count of alpha and beta strings C(14,7) squared.)"""
import os
import re
import resource
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import DRIVER, Checker

c = Checker()


def limit():
    resource.setrlimit(resource.RLIMIT_AS, (2 << 30, 2 << 30))


g = "; ".join("H 0 0 %r" % (1.8 * i) for i in range(14))
r = subprocess.run([DRIVER, "--atoms", g, "--basis", "sto-3g", "--no-mp2", "--no-ccsd"], capture_output=True,
                   text=True, preexec_fn=limit)
c.true("refused with exit status 1", r.returncode == 1)
m = re.fullmatch(r"error: the exact solver for 14 electrons in 14 orbitals \(11778624 determinants\) needs "
                 r"([0-9.]+) GiB; ([0-9.]+) GiB are available\nhelp: choose a smaller active space "
                 r"\(`active N electrons in M orbitals`\)\n", r.stderr)
c.true("the message says what does not fit and what to do (got %r)" % r.stderr, m is not None)
if m:
    c.true("the need exceeds what is available", float(m.group(1)) > float(m.group(2)))
    c.true("what is available is at most the 2 GiB limit", float(m.group(2)) <= 2.0)
c.finish()
