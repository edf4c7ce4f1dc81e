"""water.py — the water study: how many entanglers does the symmetric stretch
of water need for chemical accuracy, and with which recipe?

Water in STO-3G, both O-H bonds stretched together (H-O-H 104.5 degrees),
r = 0.8 ... 2.6 angstrom.  The claim under test (a common claim): qubit coupled
cluster with eight entanglers reaches chemical accuracy along the stretch,
where CCSD falls below the exact curve.  The variants are recipes under
examples/study/ (written by `water.py write`, one file per variant, sharing
water-geometry.cairn and the active-space fragments through `use`):

  active space   (4e,4o) = space-44.cairn, frozen-core full valence (8e,6o) =
                 space-86.cairn
  reference      hartree-fock, mean-field
  screening      `choose N by gradient` (single shot at the reference) or
                 `grow to N until 1e-6` (adaptive), N = 4, 8, 12, 16
  spin           no constraint, or `keep spin-squared penalty 0.5`
  baseline       one-step UCCSD (singles + doubles, choose all, trotter 1)

Every recipe optimizes with `lbfgs ... starts 8 seed 7`; the tables give the
spread of the final energies over the starts.

    /usr/bin/python3 tools/accept/water.py write            # (re)write the recipes
    /usr/bin/python3 tools/accept/water.py check            # recipes up to date?
    /usr/bin/python3 tools/accept/water.py run [-j 2] [--cairn PATH] [--out DIR]
                                              [--reuse] [--only SUBSTR]

`run` calls `cairn run --json` on every variant (reports kept in DIR, default
a temporary directory), and prints the tables in Markdown: the error of the
ansatz against the exact energy of the active space in mEh, marked against
chemical accuracy (1.6 mEh, about 1 kcal/mol; common practice), with <N> and
<S^2> of each state, then a summary and the time the study took.
"""
import concurrent.futures
import json
import os
import resource
import subprocess
import sys
import tempfile
import textwrap
import time

CHEM_ACC = 1.6e-3  # hartree; 1 kcal/mol, common practice
HERE = os.path.dirname(os.path.abspath(__file__))
TOP = os.path.dirname(os.path.dirname(HERE))
STUDY = os.path.join(TOP, "examples", "study")
NS = (4, 8, 12, 16)
SPACES = {"44": "4 electrons in 4 orbitals (8 qubits)",
          "86": "frozen-core full valence, 8 electrons in 6 orbitals (12 qubits)"}
REFS = {"hf": "hartree-fock", "mf": "mean-field"}
MU_S2 = 0.5  # hartree; weight of the spin-squared penalty


def variants():
    """Every variant of the study as (name, dict), in table order."""
    out = []
    for sp in SPACES:
        out.append((f"water-{sp}-uccsd", {"space": sp, "kind": "uccsd"}))
        for pen in (False, True):
            for ref in REFS:
                if pen and ref == "hf":
                    continue  # the penalty is studied on the mean-field reference only
                for sel in ("choose", "grow"):
                    for n in NS:
                        name = f"water-{sp}-{ref}-{sel}-{n:02d}" + ("-s2pen" if pen else "")
                        out.append((name, {"space": sp, "kind": "qcc", "ref": ref, "sel": sel, "n": n,
                                           "pen": pen}))
    return out


def recipe_text(name, v):
    """The recipe of one variant, in canonical layout (cairn fmt)."""
    sp = v["space"]
    if v["kind"] == "uccsd":
        desc = (f"One-step UCCSD: every spin-conserving single and double excitation of the Hartree-Fock "
                f"state, one Trotter step; {SPACES[sp]}.")
    else:
        sel = (f"{v['n']} entanglers chosen by gradient at the reference (single shot)" if v["sel"] == "choose"
               else f"entanglers grown one at a time by gradient, up to {v['n']}")
        desc = (f"Qubit coupled cluster with the {REFS[v['ref']]} reference, {sel}; {SPACES[sp]}"
                + ("; spin-squared penalty." if v["pen"] else "."))
    desc = "Water study, " + desc[0].lower() + desc[1:] + " Written by tools/accept/water.py: edit the script."
    lines = ["cairn 1"] + ["# " + l for l in textwrap.wrap(desc, 76)]
    lines += ["", 'use "water-geometry.cairn"', f'use "space-{sp}.cairn"', "", "encoding jordan-wigner"]
    if v["kind"] == "uccsd":
        lines += ["reference hartree-fock", "", "keep particles exactly", "keep spin-z exactly", "",
                  "pool {", "  singles", "  doubles", "}", "choose all", "order as written", "trotter 1"]
    else:
        lines += [f"reference {REFS[v['ref']]}", ""]
        if v["pen"]:
            lines += [f"keep spin-squared penalty {MU_S2}", ""]
        lines += ["pool {", "  entanglers", "}"]
        lines += [f"choose {v['n']} by gradient" if v["sel"] == "choose" else f"grow to {v['n']} until 1e-6"]
        lines += ["order by gradient" if v["sel"] == "choose" else "order as written", "trotter 1"]
    lines += ["", "optimize lbfgs tolerance 1e-10 iterations 2000 starts 8 seed 7"]
    return "\n".join(lines) + "\n"


def cmd_write():
    for name, v in variants():
        path = os.path.join(STUDY, name + ".cairn")
        with open(path + ".tmp", "w") as f:
            f.write(recipe_text(name, v))
        os.replace(path + ".tmp", path)
    print(f"wrote {len(variants())} recipes to {STUDY}")
    return 0


def cmd_check():
    bad = 0
    for name, v in variants():
        path = os.path.join(STUDY, name + ".cairn")
        try:
            with open(path) as f:
                ok = f.read() == recipe_text(name, v)
        except OSError:
            ok = False
        if not ok:
            print(f"{path}: missing or not what `water.py write` makes")
            bad += 1
    return 1 if bad else 0


def run_one(cairn, name, out, reuse):
    """cairn run --json on one variant; returns (name, report, wall seconds)."""
    rep = os.path.join(out, name + ".json")
    t0 = time.time()
    if not (reuse and os.path.exists(rep)):
        r = subprocess.run([cairn, "run", "--json", rep, os.path.join(STUDY, name + ".cairn")],
                           capture_output=True, text=True)
        if r.returncode not in (0, 1) or not os.path.exists(rep):
            raise RuntimeError(f"cairn run {name}: exit {r.returncode}: {r.stderr}")
    with open(rep) as f:
        return name, json.load(f), time.time() - t0


def mark(err):
    return "✓" if abs(err) <= CHEM_ACC else "✗"


def cell(p):
    """error (mEh) with its mark, then <N> and <S^2> of the state."""
    s = p["symmetry"]
    err = 0.0 if abs(p["error"]) < 1e-9 else p["error"]  # round-off, not a sign
    return f"{err * 1e3:.2f} {mark(p['error'])} · {s['particles']:.3f} · {s['spin_squared']:.2f}"


def reach(pts):
    """The largest r up to which every point from the first is within 1.6 mEh, or None."""
    last = None
    for p in pts:
        if abs(p["error"]) > CHEM_ACC:
            break
        last = rval(p)
    return last


def summary_cell(pts):
    ok = sum(abs(p["error"]) <= CHEM_ACC for p in pts)
    r = reach(pts)
    upto = f"to {r:.1f} Å" if r is not None else "none"
    return f"{ok}/10 · {upto} · {max(abs(p['error']) for p in pts) * 1e3:.1f}"


def spread(p):
    e = p["optimizer"].get("start_energies", [])
    return max(e) - min(e) if e else 0.0


def rval(p):
    return next(iter(p["params"].values()))


def print_tables(reports):
    print("Errors in mEh (ansatz − exact energy of the active space), ✓ within 1.6 mEh "
          "(chemical accuracy, common practice); each cell: error · ⟨N̂⟩ · ⟨Ŝ²⟩.\n")
    for sp, title in SPACES.items():
        u = reports[f"water-{sp}-uccsd"]["points"]
        print(f"### {title}: references\n")
        print("| r / Å | exact / Eh | HF | CCSD | UCCSD (1 step) | CCSD below exact |")
        print("|---|---|---|---|---|---|")
        for p in u:
            e = p["energies"]
            hf = (e["hf"] - e["exact"]) * 1e3
            cc = f"{(e['ccsd'] - e['exact']) * 1e3:.2f}" if "ccsd" in e else "not converged"
            below = "yes" if "ccsd" in e and e["ccsd"] < e["exact"] - 1e-8 else "no"
            print(f"| {rval(p):.1f} | {e['exact']:.8f} | {hf:.2f} | {cc} | {cell(p)} | {below} |")
        print()
        for pen in (False, True):
            for ref in REFS:
                if pen and ref == "hf":
                    continue
                for sel in ("choose", "grow"):
                    names = [f"water-{sp}-{ref}-{sel}-{n:02d}" + ("-s2pen" if pen else "") for n in NS]
                    how = "choose N by gradient" if sel == "choose" else "grow to N until 1e-6"
                    extra = f", keep spin-squared penalty {MU_S2}" if pen else ""
                    print(f"### {title}: reference {REFS[ref]}, {how}{extra}\n")
                    print("| r / Å | " + " | ".join(f"N = {n}" for n in NS) + " |")
                    print("|---|" + "---|" * len(NS))
                    pts = [reports[n]["points"] for n in names]
                    for i in range(len(pts[0])):
                        print(f"| {rval(pts[0][i]):.1f} | " + " | ".join(cell(pt[i]) for pt in pts) + " |")
                    sp_max = max(spread(p) for pt in pts for p in pt)
                    print(f"\nlargest spread of the final energies over the 8 starts: {sp_max * 1e3:.3g} mEh\n")
    print("### Summary\n")
    print("Each cell: points (of 10) within 1.6 mEh · the bond length up to which every point from 0.8 Å is "
          "within · the largest |error| / mEh.\n")
    print("| active space | recipe | " + " | ".join(f"N = {n}" for n in NS) + " |")
    print("|---|---|" + "---|" * len(NS))
    for sp in SPACES:
        u = reports[f"water-{sp}-uccsd"]["points"]
        print(f"| ({sp[0]}e,{sp[1]}o) | UCCSD, 1 step (all generators) | {summary_cell(u)} |" + " |" * (len(NS) - 1))
        for pen in (False, True):
            for ref in REFS:
                if pen and ref == "hf":
                    continue
                for sel in ("choose", "grow"):
                    row = [summary_cell(reports[f"water-{sp}-{ref}-{sel}-{n:02d}" + ("-s2pen" if pen else "")]["points"])
                           for n in NS]
                    what = f"{REFS[ref]}, {sel}" + (", S² penalty" if pen else "")
                    print(f"| ({sp[0]}e,{sp[1]}o) | {what} | " + " | ".join(row) + " |")
    print()
    # mean-field against Hartree-Fock: the same energies?  Per point, the
    # largest difference over both spaces, both screenings and every N.
    diff = {}
    for sp in SPACES:
        for sel in ("choose", "grow"):
            for n in NS:
                a = reports[f"water-{sp}-hf-{sel}-{n:02d}"]["points"]
                b = reports[f"water-{sp}-mf-{sel}-{n:02d}"]["points"]
                for x, y in zip(a, b):
                    d = abs(x["energies"]["ansatz"] - y["energies"]["ansatz"])
                    diff[rval(x)] = max(diff.get(rval(x), 0.0), d)
    print("largest |E(mean-field) − E(hartree-fock)| over both active spaces, both screenings and every N, per r:\n")
    print("| r / Å | " + " | ".join(f"{r:.1f}" for r in diff) + " |")
    print("|---|" + "---|" * len(diff))
    print("| mEh | " + " | ".join(f"{d * 1e3:.2g}" for d in diff.values()) + " |\n")


def cmd_run(args):
    cairn = os.path.join(TOP, "cairn")
    out, jobs, reuse, only = None, 1, False, None
    i = 0
    while i < len(args):
        a = args[i]
        if a == "--cairn":
            cairn = args[i + 1]; i += 1
        elif a == "--out":
            out = args[i + 1]; i += 1
        elif a == "-j":
            jobs = int(args[i + 1]); i += 1
        elif a == "--reuse":
            reuse = True
        elif a == "--only":
            only = args[i + 1]; i += 1
        else:
            print(f"water.py: unknown argument {a}", file=sys.stderr)
            return 2
        i += 1
    tmp = None
    if out is None:
        tmp = tempfile.TemporaryDirectory()
        out = tmp.name
    os.makedirs(out, exist_ok=True)
    names = [n for n, _ in variants() if only is None or only in n]
    t0 = time.time()
    reports, secs = {}, {}
    with concurrent.futures.ThreadPoolExecutor(max_workers=jobs) as ex:
        for name, rep, s in ex.map(lambda n: run_one(cairn, n, out, reuse), names):
            reports[name] = rep
            secs[name] = s
    wall = time.time() - t0
    ru = resource.getrusage(resource.RUSAGE_CHILDREN)
    stamp = os.path.join(out, "study-time.txt")
    if reuse and os.path.exists(stamp):
        with open(stamp) as f:
            timing = f.read().strip() + f" (reports reused from {out})"
    else:
        timing = (f"study: {len(names)} recipes × 10 points, {wall:.0f} s wall, {ru.ru_utime + ru.ru_stime:.0f} s CPU "
                  f"in cairn, -j {jobs}; slowest recipe {max(secs, key=secs.get)} {max(secs.values()):.0f} s")
        if only is None:
            with open(stamp, "w") as f:
                f.write(timing + "\n")
    if only is None:
        print_tables(reports)
    else:
        for n in names:
            print(n, " ".join(f"{rval(p):.1f}:{cell(p)}" for p in reports[n]["points"]))
    print(timing)
    return 0


def main():
    if len(sys.argv) < 2 or sys.argv[1] not in ("write", "check", "run"):
        print("usage: water.py write | check | run [-j N] [--cairn PATH] [--out DIR] [--reuse] [--only SUBSTR]",
              file=sys.stderr)
        return 2
    if sys.argv[1] == "write":
        return cmd_write()
    if sys.argv[1] == "check":
        return cmd_check()
    return cmd_run(sys.argv[2:])


if __name__ == "__main__":
    sys.exit(main())
