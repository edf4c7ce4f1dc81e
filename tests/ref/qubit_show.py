"""qubit_show.py — `cairn show --hamiltonian [--json]` end to end.

Source: psi4 1.3 (Debian package, run live) for the SCF, FCI and FCIDUMP of
H2O in STO-3G.  Checks:
  - for every encoding, with and without `taper`: the JSON terms, constant,
    qubit counts and sector equal the library's (the check driver) exactly, and
    the text form spells the same numbers (shortest round trip);
  - the tapered Hamiltonian's lowest eigenvalue equals psi4's FCI energy to
    1e-8, and `encoding parity taper` removes at least two qubits, among them
    particle-number parity;
  - malformed Pauli text in a recipe (`word X0 Q1`, a repeated qubit, a qubit
    beyond the register) gets a diagnostic at the recipe span (file:line:col
    and a caret under the token);
  - every example recipe shows its Hamiltonian (text and JSON), and
    `cairn show FILE` without --hamiltonian still gives the generator table;
    bad options and missing files exit 2.
"""
import glob
import json
import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import qubit_common as qc  # noqa: E402

CAIRN = os.environ.get("CAIRN", os.path.join(qc.builddir(), "cairn"))


def cairn(*args, cwd=None):
    r = subprocess.run([CAIRN, "--color=never"] + list(args), stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                       universal_newlines=True, cwd=cwd)
    return r.returncode, r.stdout, r.stderr


def recipe(tmp, name, body):
    path = os.path.join(tmp, name)
    with open(path, "w") as f:
        f.write("cairn 1\n" + body)
    return path


def terms_of(j):
    n, const, terms = qc.parse_sum(j)
    return const, {(x, z): c for x, z, c in terms}


def text_terms(out):
    """(word -> coefficient) from the text form's term lines."""
    got = {}
    constant = None
    for line in out.splitlines():
        if line.startswith("terms: "):
            constant = float(line.split("the constant ")[1].split()[0])
        elif line.startswith("  ") and not line.startswith("  removed") and not line.startswith("  the ") \
                and not line.startswith("  no "):
            f = line.split(None, 1)
            got[f[1].strip()] = float(f[0])
    return constant, got


def check_hamiltonians(tmp, fcidump, e_fci):
    for enc in qc.ENCODINGS:
        for taper in (False, True):
            rpath = recipe(tmp, "w.cairn", 'integrals "%s"\nencoding %s%s\nreference hartree-fock\n'
                           % (os.path.basename(fcidump), enc, " taper" if taper else ""))
            rc, out, err = cairn("show", "--hamiltonian", "--json", rpath)
            if rc != 0:
                qc.fail("show --json %s taper=%s: exit %d: %s" % (enc, taper, rc, err))
            j = json.loads(out)
            lib = qc.driver(fcidump, enc, taper=taper)
            ref = lib["taper"]["hamiltonian"] if taper else lib["hamiltonian"]
            if j["qubits"] != ref["qubits"] or j["encoding"] != enc or j["nterms"] != len(ref["terms"]):
                qc.fail("show %s: counts differ from the library's" % enc)
            if terms_of(j) != terms_of(ref):
                qc.fail("show %s taper=%s: terms differ from the library's" % (enc, taper))
            if taper:
                t = lib["taper"]
                if j["removed"] != t["removed"] or j["sector"] != t["sector"] or \
                        [s["why"] for s in j["symmetries"]] != t["why"]:
                    qc.fail("show %s: removed symmetries differ from the library's" % enc)
                if j["qubits_before"] - j["removed"] != j["qubits"]:
                    qc.fail("show %s: qubit counts do not add up" % enc)
                e = qc.lowest(qc.sum_matrix(j))
                if abs(e - e_fci) > 1e-8:
                    qc.fail("show %s taper: lowest eigenvalue %.12f, psi4 FCI %.12f" % (enc, e, e_fci))
                if enc == "parity" and (j["removed"] < 2 or "particle-number parity" not in t["why"]):
                    qc.fail("parity taper removed %d qubits" % j["removed"])
            rc, out, err = cairn("show", "--hamiltonian", rpath)
            if rc != 0:
                qc.fail("show text %s: exit %d: %s" % (enc, rc, err))
            constant, got = text_terms(out)
            want = {t["pauli"]: t["coeff"] for t in j["terms"]}
            if got != want or constant != j["constant"]:
                qc.fail("show %s: the text form does not spell the JSON numbers" % enc)
            print("ok show %-13s taper=%-5s %2d qubits %4d terms" % (enc, taper, j["qubits"], j["nterms"]))


def check_diagnostics(tmp):
    cases = [("X0 Q1", 11, 2, "`Q1` is not a Pauli letter"),
             ("X0 Y3 Z3", 14, 2, "qubit 3 appears twice"),
             ("X0 Z20", 11, 3, "qubit 20 is beyond the register")]
    for word, col, width, msg in cases:
        rpath = recipe(tmp, "bad.cairn", 'integrals "h2o.fcidump"\nencoding jordan-wigner\npool {\n  word %s\n}\n'
                       % word)
        rc, out, err = cairn("check", rpath)
        loc = "%s:5:%d: error: " % (rpath, col)
        caret = " " * (col - 1) + "^" * width
        if rc != 1 or loc + msg not in err or not any(l.endswith(caret) for l in err.splitlines()):
            qc.fail("`word %s`: expected %s%s... with a caret, got exit %d:\n%s" % (word, loc, msg, rc, err))
        print("ok diagnostic for `word %s`" % word)


def check_commands(tmp):
    rpath = recipe(tmp, "g.cairn", 'integrals "h2o.fcidump"\nencoding parity\npool {\n  doubles\n}\n')
    rc, out, err = cairn("show", rpath)
    if rc != 0 or not out.strip():
        qc.fail("`cairn show FILE` (the generator table): exit %d: %s" % (rc, err))
    rc, out, err = cairn("show", "--hamiltonian", "--bogus", rpath)
    if rc != 2:
        qc.fail("unknown option: exit %d" % rc)
    rc, out, err = cairn("show", "--hamiltonian", os.path.join(tmp, "missing.cairn"))
    if rc != 2 or "missing.cairn" not in err:
        qc.fail("missing file: exit %d: %s" % (rc, err))
    examples = sorted(glob.glob(os.path.join(os.environ.get("CAIRN_SRCDIR", "."), "examples", "*.cairn")))
    for ex in examples:
        rc, out, err = cairn("show", "--hamiltonian", ex, cwd=os.path.dirname(ex))
        if rc != 0 or "terms: " not in out:
            qc.fail("example %s (text): exit %d: %s" % (ex, rc, err))
        rc, out, err = cairn("show", "--hamiltonian", "--json", ex, cwd=os.path.dirname(ex))
        if rc != 0:
            qc.fail("example %s: exit %d: %s" % (ex, rc, err))
        j = json.loads(out)
        for p in j.get("points", [j]):
            if p["qubits"] < 1 or not p["terms"]:
                qc.fail("example %s: empty Hamiltonian" % ex)
        print("ok example %s" % os.path.basename(ex))


def main():
    tmp = qc.tmpdir()
    geom = "0 1\nO 0 0 0\nH 0 0.7586 0.5872\nH 0 -0.7586 0.5872\nunits angstrom"
    path, e_scf, e_fci = qc.psi4_run(geom, "sto-3g", tmp, "h2o")
    check_hamiltonians(tmp, path, e_fci)
    check_diagnostics(tmp)
    check_commands(tmp)
    print("PASS")


if __name__ == "__main__":
    main()
