"""chem_bench.py: chemistry benchmark (make bench; not a test).

1. Integrals + RHF for water/cc-pVDZ (24 functions) and ethylene/cc-pVDZ
   (48 functions): cairn's chem_bench process end to end beside psi4's own
   program (`psi4 -n 2 input.dat`) end to end and psi4's energy('scf') call
   inside one Python process, measured in this run, same geometry, basis and
   convergence (scf_type pk, e/d_convergence 1e-10, symmetry c1).
2. The exact solver for (8e,8o) and (12e,12o): linear H8 and H12 chains,
   STO-3G, 1.8 bohr spacing (12e,12o is 853,776 determinants), beside psi4's
   energy('fci') end to end; cairn stops at a residual norm of 1e-6, psi4 is
   given r_convergence 1e-6 (its default, 1e-4, stops earlier).

Medians of CAIRN_BENCH_REPEATS runs (default 5; 3 for the exact solver, 1
for (12e,12o)).  Wall and CPU seconds (CPU = user + system of the child
process), ratios psi4 / cairn (above 1: cairn faster).  Both sides get two
threads.  On a machine shared with other work the wall times are noisy; the
CPU times less so."""
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
import json

BUILD = sys.argv[1] if len(sys.argv) > 1 else "."
BENCH = os.path.join(BUILD, "tests", "bench", "chem_bench")
REPEATS = int(os.environ.get("CAIRN_BENCH_REPEATS", "5"))
ENV = dict(os.environ, OMP_NUM_THREADS="2", OPENBLAS_NUM_THREADS="1")

WATER = "O 0 0 0; H 0 1.4311481284763563 1.1081132768623532; H 0 -1.4311481284763563 1.1081132768623532"
ETHYLENE = ("C 0 0 1.2651; C 0 0 -1.2651; H 0 1.7435 2.3309; H 0 -1.7435 2.3309; "
            "H 0 1.7435 -2.3309; H 0 -1.7435 -2.3309")


def chain(n):
    return "; ".join("H 0 0 %r" % (1.8 * i) for i in range(n))


def timed(cmd, cwd=None):
    """Run cmd; (wall seconds, CPU seconds of the child, stdout)."""
    r0 = resource.getrusage(resource.RUSAGE_CHILDREN)
    t0 = time.perf_counter()
    p = subprocess.run(cmd, capture_output=True, text=True, cwd=cwd, env=ENV)
    wall = time.perf_counter() - t0
    r1 = resource.getrusage(resource.RUSAGE_CHILDREN)
    if p.returncode != 0:
        sys.stderr.write(p.stderr)
        raise SystemExit("benchmark command failed: %s" % " ".join(cmd[:3]))
    cpu = (r1.ru_utime - r0.ru_utime) + (r1.ru_stime - r0.ru_stime)
    return wall, cpu, p.stdout


def psi4_input(geom, basis, method):
    atoms = "\n".join(a.strip() for a in geom.split(";"))
    # near the residual cairn stops at (1e-6)
    extra = "set r_convergence 1e-6\n" if method == "fci" else ""
    return ("memory 2 gb\nmolecule {\n0 1\n%s\nunits bohr\nsymmetry c1\nno_reorient\nno_com\n}\n"
            "set basis %s\nset scf_type pk\nset e_convergence 1e-10\nset d_convergence 1e-10\n%s"
            "energy('%s')\n" % (atoms, basis, extra, method))


def psi4_cli(geom, basis, method, n):
    d = tempfile.mkdtemp(prefix="cairn-bench-psi4-")
    open(os.path.join(d, "in.dat"), "w").write(psi4_input(geom, basis, method))
    runs = [timed(["psi4", "-n", "2", "in.dat", "-o", "out.dat"], cwd=d)[:2] for _ in range(n)]
    subprocess.run(["rm", "-rf", d])
    return runs


def psi4_inprocess(geom, basis, n):
    sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
    import psi4
    d = tempfile.mkdtemp(prefix="cairn-bench-psi4-")
    psi4.set_output_file(os.path.join(d, "out.txt"), False)
    psi4.core.be_quiet()
    psi4.core.IOManager.shared_object().set_default_path(d)
    psi4.set_num_threads(2)
    walls = []
    for _ in range(n):
        psi4.core.clean()
        psi4.geometry("0 1\n%s\nunits bohr\nsymmetry c1\nno_reorient\nno_com\n" % geom.replace(";", "\n"))
        psi4.set_options({"basis": basis, "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10})
        t0 = time.perf_counter()
        e = psi4.energy("scf")
        walls.append(time.perf_counter() - t0)
    return walls, e


def med(xs):
    return statistics.median(xs)


print("cairn chemistry benchmark: %d repeats, medians; 2 threads each; ratio = psi4 / cairn" % REPEATS)
print("host: %s, %d cores, load average %.2f" % (os.uname().nodename, os.cpu_count(), os.getloadavg()[0]))
print()
print("%-22s %4s | %-28s | %-28s | %-12s | %s" % ("integrals + RHF", "nbf", "cairn wall / cpu (s)",
                                                  "psi4 program wall / cpu (s)", "psi4 energy()",
                                                  "ratio wall, cpu, in-process"))
for name, geom in (("H2O / cc-pVDZ", WATER), ("C2H4 / cc-pVDZ", ETHYLENE)):
    ours = [timed([BENCH, "scf", "cc-pvdz", geom]) for _ in range(REPEATS)]
    info = json.loads(ours[-1][2])
    cli = psi4_cli(geom, "cc-pvdz", "scf", REPEATS)
    inproc, e_psi4 = psi4_inprocess(geom, "cc-pvdz", REPEATS)
    ow, oc = med([o[0] for o in ours]), med([o[1] for o in ours])
    pw, pc = med([c[0] for c in cli]), med([c[1] for c in cli])
    pi = med(inproc)
    print("%-22s %4d | %8.3f / %8.3f          | %8.3f / %8.3f          | %8.3f     | %.1fx, %.1fx, %.1fx" % (
        name, info["nbf"], ow, oc, pw, pc, pi, pw / ow, pc / oc, pi / ow))
    print("%-22s      | inside cairn: integrals %.3f s, SCF %.3f s (%d iterations); "
          "E = %.10f, psi4 %.10f" % ("", med([json.loads(o[2])["integrals_s"] for o in ours]),
                                    med([json.loads(o[2])["scf_s"] for o in ours]), info["iterations"],
                                    info["hf"], e_psi4))
print()
print("%-22s %8s | %-28s | %-28s | %s" % ("exact solver", "dets", "cairn wall / cpu (s)", "psi4 fci wall / cpu (s)",
                                         "ratio wall, cpu; cairn peak RSS"))
for name, n, reps in (("(8e,8o) H8 STO-3G", 8, 3), ("(12e,12o) H12 STO-3G", 12, 1)):
    reps = min(reps, REPEATS)
    ours = [timed([BENCH, "exact", "sto-3g", chain(n)]) for _ in range(reps)]
    info = json.loads(ours[-1][2])
    cli = psi4_cli(chain(n), "sto-3g", "fci", reps)
    ow, oc = med([o[0] for o in ours]), med([o[1] for o in ours])
    pw, pc = med([c[0] for c in cli]), med([c[1] for c in cli])
    print("%-22s %8d | %8.3f / %8.3f          | %8.3f / %8.3f          | %.2fx, %.2fx; %.0f MB" % (
        name, info["determinants"], ow, oc, pw, pc, pw / ow, pc / oc, info["peak_rss_mb"]))
    print("%-22s          | solver alone %.3f s; E(exact) = %.10f" % ("", med([json.loads(o[2])["exact_s"] for o in ours]),
                                                                    info["exact"]))
