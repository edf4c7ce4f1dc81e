#!/usr/bin/python3
"""basis-extract.py: make cairn's shipped basis-set files (data/basis/*.gbs).

Reads the published basis-set figures as distributed in Debian's psi4 package
(/usr/share/psi4/basis/<name>.gbs, Gaussian-94 format), keeps the elements
H-Ar, and writes them in cairn's own Gaussian-94 layout with a provenance
header.  Exponents and coefficients keep their values exactly (each number is
read as a double and written in its shortest round-trip spelling); the
`cartesian`/`spherical` line of the source is kept, because it decides how d
functions are built.

Run from the top of the source tree:  /usr/bin/python3 src/chem/basis-extract.py
"""
import os
import sys

SRC = "/usr/share/psi4/basis"
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "data", "basis")

SYMBOLS = ["H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne",
           "Na", "Mg", "Al", "Si", "P", "S", "Cl", "Ar"]

SETS = {
    "sto-3g": ("STO-3G", [
        "H-Ne: W. J. Hehre, R. F. Stewart, J. A. Pople, J. Chem. Phys. 51, 2657 (1969).",
        "Na-Ar: W. J. Hehre, R. Ditchfield, R. F. Stewart, J. A. Pople,",
        "       J. Chem. Phys. 52, 2769 (1970).",
    ]),
    "6-31g": ("6-31G", [
        "H-Ne: W. J. Hehre, R. Ditchfield, J. A. Pople, J. Chem. Phys. 56, 2257 (1972);",
        "      Li and B: J. D. Dill, J. A. Pople, J. Chem. Phys. 62, 2921 (1975).",
        "Na-Ar: M. M. Francl, W. J. Pietro, W. J. Hehre, J. S. Binkley, M. S. Gordon,",
        "       D. J. DeFrees, J. A. Pople, J. Chem. Phys. 77, 3654 (1982).",
        "He and Ne: sets without a journal publication, as distributed with the figures above.",
    ]),
    "6-31gs": ("6-31G*", [
        "sp part: as 6-31G (Hehre, Ditchfield, Pople, J. Chem. Phys. 56, 2257 (1972);",
        "         Francl et al., J. Chem. Phys. 77, 3654 (1982) for Na-Ar).",
        "d polarization: P. C. Hariharan, J. A. Pople, Theor. Chim. Acta 28, 213 (1973);",
        "         Na-Ar: Francl et al., J. Chem. Phys. 77, 3654 (1982).",
    ]),
    "cc-pvdz": ("cc-pVDZ", [
        "H, Li-Ne: T. H. Dunning, Jr., J. Chem. Phys. 90, 1007 (1989).",
        "He: D. E. Woon, T. H. Dunning, Jr., J. Chem. Phys. 100, 2975 (1994).",
        "Al-Ar: D. E. Woon, T. H. Dunning, Jr., J. Chem. Phys. 98, 1358 (1993).",
        "Li, Be, Na, Mg: B. P. Prascher, D. E. Woon, K. A. Peterson, T. H. Dunning, Jr.,",
        "       A. K. Wilson, Theor. Chem. Acc. 128, 69 (2011).",
    ]),
}


def num(tok):
    return repr(float(tok.replace("D", "E").replace("d", "e")))


def extract(name):
    title, refs = SETS[name]
    with open(os.path.join(SRC, name + ".gbs")) as f:
        lines = [l.rstrip("\n") for l in f]
    kind = None
    blocks = {}
    i = 0
    while i < len(lines):
        t = lines[i].strip()
        i += 1
        if not t or t.startswith("!"):
            continue
        if t.lower() in ("cartesian", "spherical"):
            kind = t.lower()
            continue
        if t == "****":
            continue
        sym = t.split()[0]
        body = []
        while i < len(lines) and lines[i].strip() != "****":
            body.append(lines[i].split())
            i += 1
        blocks[sym] = body
    out = []
    out.append("! %s basis set for H-Ar, Gaussian-94 format, shipped with cairn." % title)
    out.append("!")
    out.append("! Published figures:")
    for r in refs:
        out.append("!   " + r)
    out.append("!")
    out.append("! Made by src/chem/basis-extract.py from the published figures as distributed")
    out.append("! in Debian's psi4 1.3.2 package (/usr/share/psi4/basis/%s.gbs): elements" % name)
    out.append("! H-Ar kept, values unchanged (shortest round-trip spelling), layout ours.")
    out.append("! The next line decides whether d shells have 5 (spherical) or 6 (cartesian)")
    out.append("! functions, as in the source.")
    out.append(kind)
    out.append("****")
    for sym in SYMBOLS:
        body = blocks[sym]
        out.append("%s 0" % sym)
        j = 0
        while j < len(body):
            hdr = body[j]
            j += 1
            typ, n, scale = hdr[0].upper(), int(hdr[1]), float(hdr[2])
            out.append("%s %d %s" % (typ, n, repr(scale)))
            for _ in range(n):
                out.append("  " + "  ".join("%-22s" % num(x) for x in body[j]).rstrip())
                j += 1
        out.append("****")
    with open(os.path.join(OUT, name + ".gbs"), "w") as f:
        f.write("\n".join(out) + "\n")


for n in SETS:
    extract(n)
