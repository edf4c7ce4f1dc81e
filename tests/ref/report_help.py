#!/usr/bin/python3
"""report_help.py — `cairn help` has an entry for every keyword of the recipe
language, and every example in the help passes `cairn check`.

Keywords are read from the front end itself: the quoted words of the scanner
(grammar/recipe.l), the keyword aliases of the grammar's tokens
(grammar/recipe.y, "`word`"), and the scanner's keyword table
({"word", TOKEN} in src/front/*.c).  The names the front end gives meaning to
(encodings, pool rules, optimizers, ...) are the vocabulary v1 of the design
notes, listed below.  For each word `cairn help WORD` must exit 0 and print a
topic that mentions the word.

Each topic's example is put into a base recipe (water, STO-3G, 4 electrons in
4 orbitals), replacing the base's statements of the same kind, and the result
must pass `cairn check`; every line of the example must come out of
`cairn fmt` unchanged (the help shows canonical layout).
"""
import os
import re
import subprocess
import sys
import tempfile

SRC = os.environ.get("CAIRN_SRCDIR", ".")
CAIRN = os.environ.get("CAIRN", os.path.join(SRC, "cairn"))
failures = []

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from report_keywords import VOCABULARY, scanner_keywords  # noqa: E402


def fail(msg):
    failures.append(msg)
    print("FAIL:", msg)


def help_of(word):
    p = subprocess.run([CAIRN, "help", word], stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    return p.returncode, p.stdout, p.stderr


def topics():
    """(name, example) of every help topic, from `cairn help` and `cairn help NAME`."""
    out = subprocess.run([CAIRN, "help"], stdout=subprocess.PIPE, text=True, check=True).stdout
    names = re.findall(r"^  (\S+) {2,}", out.split("help topics on the recipe language")[1], re.M)
    result = []
    for n in names:
        rc, text, _ = help_of(n)
        if "\nIn recipes:\n\n" in text:  # a command that is also a statement: its usage comes first
            text = text.split("\nIn recipes:\n\n", 1)[1]
        if rc != 0 or not text.startswith(n + ":"):
            fail(f"`cairn help {n}` does not show the topic {n}")
            continue
        body = text.split("\n----\n")[0]
        m = re.search(r"\nexample:\n((?:  .*\n?)+)", body)
        result.append((n, "\n".join(l[2:] for l in m.group(1).rstrip("\n").split("\n")) if m else None))
    return result


BASE = """cairn 1
let r = 0.96 angstrom
atoms angstrom {
  O  0   0                0
  H  0   r*sin(52.25 deg)  r*cos(52.25 deg)
  H  0  -r*sin(52.25 deg)  r*cos(52.25 deg)
}
basis sto-3g
orbitals {
  freeze core
  active 4 electrons in 4 orbitals
}
encoding jordan-wigner
reference hartree-fock
pool {
  doubles
}
choose all
order as written
optimize lbfgs
"""

# Statements an example replaces besides its own kind (they cannot stand together).
CONFLICTS = {"grow": {"choose"}, "choose": {"grow"}, "integrals": {"atoms", "basis", "orbitals", "let"},
             "charge": {"orbitals"}, "use": {"atoms"}}


def statements(text):
    """Split recipe text into (first word, lines) statements; blocks stay whole."""
    out, cur, depth = [], None, 0
    for line in text.split("\n"):
        word = line.split()[0] if line.split() and not line.lstrip().startswith("#") else ""
        if depth == 0:
            cur = [word, [line]]
            out.append(cur)
        else:
            cur[1].append(line)
        depth += line.count("{") - line.count("}")
    return out


def with_example(example):
    """The base recipe with the example in the place of the statements it
    replaces (or after the named numbers, when it replaces none)."""
    ex = statements(example)
    kinds = {w for w, _ in ex if w}
    for k in list(kinds):
        kinds |= CONFLICTS.get(k, set())
    out, placed = [], False
    base = statements(BASE)
    if "cairn" in kinds:
        out, placed = ex[:], True
    for st in base:
        if st[0] in kinds:
            if not placed:
                out += ex
                placed = True
            continue
        out.append(st)
    if not placed:
        last = max(i for i, st in enumerate(out) if st[0] in ("cairn", "let", "vary"))
        out[last + 1:last + 1] = ex
    return "\n".join(l for _, ls in out for l in ls) + "\n"


FCIDUMP = """ &FCI NORB=2,NELEC=2,MS2=0,
  ORBSYM=1,1,
  ISYM=1,
 &END
  0.6746  1  1  1  1
  0.6636  2  2  1  1
  0.6975  2  2  2  2
  0.1813  2  1  2  1
 -1.2528  1  1  0  0
 -0.4759  2  2  0  0
  0.7137  0  0  0  0
"""


def check_examples(tops):
    work = tempfile.mkdtemp(prefix="cairn-help-")
    try:
        # files the examples name: an FCIDUMP (test data, a made-up 2-orbital
        # Hamiltonian: only its header is read by `check`) and a shared fragment
        for name in ("h2o-631g.fcidump",):
            open(os.path.join(work, name), "w").write(FCIDUMP)
        os.makedirs(os.path.join(work, "common"), exist_ok=True)
        geo = "\n".join(l for w, ls in statements(BASE) if w == "atoms" for l in ls)
        open(os.path.join(work, "common", "water-geometry.cairn"), "w").write("cairn 1\n" + geo + "\n")
        base = os.path.join(work, "base.cairn")
        open(base, "w").write(BASE)
        p = subprocess.run([CAIRN, "--color=never", "check", base], stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                           text=True)
        if p.returncode != 0:
            fail("the base recipe of the example check does not pass `cairn check`:\n" + p.stdout)
            return
        n = 0
        for name, ex in tops:
            if ex is None:
                continue
            path = os.path.join(work, f"example-{name}.cairn")
            text = with_example(ex)
            open(path, "w").write(text)
            p = subprocess.run([CAIRN, "--color=never", "check", path], stdout=subprocess.PIPE,
                               stderr=subprocess.STDOUT, text=True)
            if p.returncode != 0:
                fail(f"the example of `cairn help {name}` does not pass `cairn check`:\n{text}\n{p.stdout}")
            # and it is written the way `cairn fmt` writes it: its lines survive formatting
            subprocess.run([CAIRN, "fmt", path], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
            formatted = open(path).read().split("\n")
            for line in ex.split("\n"):
                if line not in formatted:
                    fail(f"the example of `cairn help {name}` is not in `cairn fmt` layout: {line!r}")
            n += 1
        print(f"{n} help examples pass `cairn check` and keep their lines through `cairn fmt`")
    finally:
        subprocess.run(["rm", "-rf", work])


def main():
    kw = scanner_keywords(SRC)
    if len(kw) < 30:
        fail(f"only {len(kw)} keywords found in the front end: the extraction no longer fits the scanner")
    words = set(VOCABULARY) | kw
    for w in sorted(words):
        rc, out, err = help_of(w)
        if rc != 0 or not out.strip():
            fail(f"`cairn help {w}` has no entry (exit {rc}: {err.strip()})")
        elif not re.search(r"(?<![\w-])" + re.escape(w) + r"(?![\w-])", out):
            fail(f"`cairn help {w}` shows a topic that does not mention {w}")
    print(f"{len(words)} words checked ({len(kw)} keywords from the scanner)")
    check_examples(topics())
    if failures:
        print(f"{len(failures)} check(s) failed")
        return 1
    return 0


sys.exit(main())
