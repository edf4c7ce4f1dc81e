"""chem_golden.py: malformed FCIDUMP and basis-set files, each with its exact
expected message (tests/golden/fcidump/*.err, tests/golden/basis/*.err; the
messages name the file, line, column and field).  Every bad file must give
exit status 1 and exactly its golden stderr.

Also the one good file, tests/golden/fcidump/good.fcidump: the H2 STO-3G
integrals at R = 1.4 bohr as printed to 4 decimals in Szabo & Ostlund, Modern
Quantum Chemistry (1989), section 3.5 (recalled from memory), must give
E(HF) = -1.1167 and E(full CI) = -1.1373 (their values, from memory) to 1e-4.

Set CAIRN_GOLDEN_UPDATE=1 to rewrite the .err files (then review the diff)."""
import glob
import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import DRIVER, SRC, Checker, driver

c = Checker()
update = os.environ.get("CAIRN_GOLDEN_UPDATE") == "1"
cases = []
for f in sorted(glob.glob(os.path.join(SRC, "tests", "golden", "fcidump", "*.fcidump"))):
    if not f.endswith("good.fcidump"):
        cases.append((f, ["--fcidump", os.path.basename(f), "--no-ccsd"]))
for f in sorted(glob.glob(os.path.join(SRC, "tests", "golden", "basis", "*.gbs"))):
    cases.append((f, ["--atoms", "H 0 0 0; H 0 0 1.4", "--basis-file", os.path.basename(f)]))
for path, args in cases:
    d = os.path.dirname(path)
    r = subprocess.run([DRIVER] + args, capture_output=True, text=True, cwd=d)
    golden = os.path.splitext(path)[0] + ".err"
    if update:
        open(golden, "w").write(r.stderr)
    want = open(golden).read() if os.path.exists(golden) else None
    name = os.path.relpath(path, os.path.join(SRC, "tests", "golden"))
    c.true("%s: exit status 1" % name, r.returncode == 1)
    ok = c.true("%s: message as in %s" % (name, os.path.basename(golden)), want is not None and r.stderr == want)
    if not ok:
        sys.stdout.write("--- expected\n%s--- got\n%s" % (want, r.stderr))
c.true("at least 15 malformed files", len(cases) >= 15)

gd = os.path.join(SRC, "tests", "golden", "fcidump")
rc, out, _ = driver("--fcidump", "good.fcidump", cwd=gd)
c.close("good.fcidump E(HF) vs Szabo-Ostlund -1.1167 (from memory)", out and out["hf"], -1.1167, 1e-4)
c.close("good.fcidump E(FCI) vs Szabo-Ostlund -1.1373 (from memory)", out and out["exact"], -1.1373, 1e-4)
c.finish()
