#!/usr/bin/python3
"""`cairn show` on every example: the ranked generator table in text and JSON.

Checks: exit status 0; the JSON has the fields DESIGN.md names for each
generator (index, kind, text, gradient, symmetry, cnot, line) in program
order; the order follows the recipe (`order by gradient` and `grow` list
decreasing |gradient|, `order by rank` increasing rank, ties in pool order);
the CNOT figure is sum 2(w - 1) over the generator's words (common practice:
a CNOT ladder per Pauli exponential); the same recipe gives the same bytes on
a second run; the text table lists the same generators.
"""
import glob
import json
import os
import subprocess
import sys


def run(args, cwd):
    return subprocess.run([os.environ["CAIRN"]] + args, cwd=cwd, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                          text=True)


def main():
    src = os.environ.get("CAIRN_SRCDIR", ".")
    examples = sorted(glob.glob(os.path.join(src, "examples", "*.cairn")))
    failures = []
    if not examples:
        failures.append("no examples found")
    for path in examples:
        d, f = os.path.dirname(path), os.path.basename(path)
        a = run(["show", "--json", f], d)
        b = run(["show", "--json", f], d)
        t = run(["show", f], d)
        if a.returncode != 0 or t.returncode != 0:
            failures.append("%s: exit %d/%d: %s" % (f, a.returncode, t.returncode, a.stderr[-400:]))
            continue
        if a.stdout != b.stdout:
            failures.append("%s: two runs differ" % f)
        j = json.loads(a.stdout)
        gens = j["generators"]
        if not gens:
            failures.append("%s: empty table" % f)
        text = open(path).read()
        order = "written"
        for key in ("order by gradient", "order by rank"):
            if key in text:
                order = key.split()[-1]
        if j.get("grow"):
            order = "gradient"
        for i, g in enumerate(gens):
            for k in ("index", "kind", "text", "gradient", "symmetry", "cnot", "line"):
                if k not in g:
                    failures.append("%s: generator %d has no %s" % (f, i, k))
            if g["index"] != i:
                failures.append("%s: index %r at position %d" % (f, g["index"], i))
            cnot = sum(2 * (len(w["pauli"].split()) - 1) for w in g["words"])
            if cnot != g["cnot"]:
                failures.append("%s %s: cnot %d, words give %d" % (f, g["text"], g["cnot"], cnot))
            if g["text"] not in t.stdout:
                failures.append("%s: %s missing from the text table" % (f, g["text"]))
        key = lambda g: round(abs(g["gradient"]) / 1e-12)  # noqa: E731  (the tie rule of pool.h)
        for x, y in zip(gens, gens[1:]):
            if order == "gradient" and key(x) < key(y):
                failures.append("%s: %s before %s breaks gradient order" % (f, x["text"], y["text"]))
            if order == "rank" and (x["rank"], -key(x)) > (y["rank"], -key(y)):
                failures.append("%s: %s before %s breaks rank order" % (f, x["text"], y["text"]))
        print("%-22s %3d generators (pool %d), order %s" % (f, len(gens), j["pool"], order))
    for m in failures[:30]:
        print("FAIL:", m)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
