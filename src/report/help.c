/* help.c — the help topics of the recipe language (help.h).
 *
 * Keep each topic true to the grammar (grammar/recipe.y) and to what
 * src/front/resolve.c decides; tests/ref/report_help.py fails when a keyword
 * of the scanner has no topic, and checks every example against `cairn
 * check`. */
#include "config.h"

#include "cairn/help.h"

#include <string.h>

/* ORDER TOPICS: the order `cairn help` lists them in (a recipe's order). */
static const help_entry topics[] = {
    {"syntax", "", "lines, blocks, names, numbers, strings and comments",
     "  A recipe is a sequence of statements, one per line.  Blocks (`atoms`,\n"
     "  `orbitals`, `pool`) open with `{` at the end of a line and hold one item\n"
     "  per line until a line with `}`.  `#` starts a comment that runs to the\n"
     "  end of the line (`cairn fmt` keeps comments).\n"
     "\n"
     "  Names may contain hyphens between letters (`jordan-wigner`, `spin-z`), so\n"
     "  a subtraction of two names needs spaces: `a - b`.  A sign that follows a\n"
     "  space and touches its operand starts a new value: `0 -r` is two numbers,\n"
     "  `0 - r` is one.  Strings are in double quotes and stay on one line.\n"
     "  Recipes are plain ASCII.\n",
     "# water, symmetric stretch\n"
     "let r = 0.96 angstrom  # a named length",
     "cairn let expressions units"},

    {"cairn", "cairn", "the language version line that opens a recipe",
     "  cairn VERSION\n"
     "\n"
     "  The first line of every recipe names the version of the recipe language\n"
     "  it is written in.  This cairn reads version 1.  In a file read by `use`\n"
     "  the line is optional.\n",
     "cairn 1", "syntax use"},

    {"let", "let", "named numbers, with units",
     "  let NAME = EXPRESSION\n"
     "\n"
     "  Gives a name to a number (a length, an angle, a plain number) that later\n"
     "  statements use.  A name is defined once; a `vary` statement turns a\n"
     "  `let` into the variable of a scan.\n",
     "let r = 0.96 angstrom\n"
     "let half = 104.5 deg/2",
     "vary expressions units"},

    {"expressions", "sin cos tan sqrt exp log", "arithmetic, functions and named numbers in values",
     "  Wherever a number stands, an expression may: numbers (`1.5`, `2e-3`),\n"
     "  names from `let`, parentheses, `+ - * /`, `^` (power, right-associative),\n"
     "  and the functions sin, cos, tan (of an angle: give it a unit, `52.25 deg`,\n"
     "  or radians), sqrt, exp and log (natural logarithm).  A unit after a value\n"
     "  says what it measures (`0.96 angstrom`).\n",
     "let r = 0.96 angstrom\n"
     "let y = r*sin(52.25 deg)",
     "units let syntax"},

    {"units", "angstrom bohr deg rad", "units of lengths and angles",
     "  Lengths: angstrom, bohr (1 bohr = 0.529177210903 angstrom, CODATA 2018).\n"
     "  Angles: deg, rad.  A unit follows the value it applies to: `0.96 angstrom`,\n"
     "  `104.5 deg`.  After `atoms` a unit applies to every coordinate of the\n"
     "  block that has none of its own.  Reports show a scanned value in the unit\n"
     "  of its `let` (or of its `vary`).\n",
     "let r = 1.8 bohr\n"
     "let theta = 104.5 deg",
     "atoms vary expressions"},

    {"vary", "vary from to step", "a scan: run the recipe at every value of a variable",
     "  vary NAME from START to STOP step STEP\n"
     "\n"
     "  NAME is a `let`.  `cairn run` does the whole recipe at each value START,\n"
     "  START+STEP, ... up to STOP, and reports one row per point: a table on the\n"
     "  terminal, a CSV table and an SVG figure of the energies and errors along\n"
     "  the scan (see `cairn help report`).  Without `vary` a recipe is one point.\n",
     "let r = 0.96 angstrom\n"
     "vary r from 0.8 to 2.4 step 0.2",
     "let report"},

    {"atoms", "atoms", "the molecule: one atom per line",
     "  atoms [UNIT] {\n"
     "    SYMBOL X Y Z\n"
     "    ...\n"
     "  }\n"
     "\n"
     "  Each line is an element symbol and three coordinates (expressions; names\n"
     "  from `let` and `vary` may appear).  UNIT (angstrom, the default, or bohr)\n"
     "  applies to the coordinates that carry no unit of their own.  `In` and\n"
     "  `As` are element symbols here, though `in` and `as` are keywords.\n"
     "  Instead of atoms and a basis set, a recipe may read `integrals` from an\n"
     "  FCIDUMP file.\n",
     "atoms angstrom {\n"
     "  O  0   0                 0\n"
     "  H  0   r*sin(52.25 deg)  r*cos(52.25 deg)\n"
     "  H  0  -r*sin(52.25 deg)  r*cos(52.25 deg)\n"
     "}",
     "basis charge multiplicity integrals units"},

    {"charge", "charge", "the total charge of the molecule",
     "  charge N\n"
     "\n"
     "  The number of electrons is the sum of the atomic numbers minus N.\n"
     "  Default 0.\n",
     "charge 1\n"
     "multiplicity 2",
     "multiplicity atoms"},

    {"multiplicity", "multiplicity", "the spin state 2S+1",
     "  multiplicity M\n"
     "\n"
     "  M = 2S+1: 1 singlet, 2 doublet, 3 triplet.  It fixes how many electrons\n"
     "  have each spin (alpha electrons = beta electrons + M - 1), the target of\n"
     "  `keep spin-z` and of `keep spin-squared` (S(S+1)), and the state the\n"
     "  exact reference energy is computed for.  Default 1, or MS2+1 from an\n"
     "  FCIDUMP file; an odd number of electrons needs `multiplicity 2` (or 4...).\n",
     "multiplicity 3", "charge keep"},

    {"basis", "basis file", "the Gaussian basis set",
     "  basis NAME\n"
     "  basis file \"PATH\"\n"
     "\n"
     "  NAME is a basis set cairn ships (such as sto-3g, 6-31g, 6-31g*,\n"
     "  cc-pvdz; names are case-insensitive).  `basis file` reads a basis set\n"
     "  in the Gaussian-94 text format; PATH is relative to the recipe's\n"
     "  directory.  The file's `cartesian` or `spherical` line is honoured.\n",
     "basis sto-3g", "atoms integrals"},

    {"integrals", "integrals", "read the Hamiltonian from an FCIDUMP file",
     "  integrals \"PATH\"\n"
     "\n"
     "  Instead of `atoms` and `basis`: the one- and two-electron integrals, the\n"
     "  orbital count (NORB), the electron count (NELEC) and 2Sz (MS2) come from\n"
     "  an FCIDUMP file (Knowles and Handy, 1989).  PATH is relative to the\n"
     "  recipe's directory.  Orbitals in the recipe are numbered as in the file,\n"
     "  from 1.  `cairn integrals` writes such a file from a recipe.\n",
     "integrals \"h2o-631g.fcidump\"", "orbitals atoms indices"},

    {"orbitals", "orbitals freeze core active electrons in", "the active space: frozen and active orbitals",
     "  orbitals {\n"
     "    freeze core                      | freeze I J ...   (ranges: 1..3)\n"
     "    active N electrons in M orbitals | active orbitals I..J ...\n"
     "  }\n"
     "\n"
     "  Orbitals are numbered from 1 in order of energy, as in FCIDUMP files.\n"
     "  Frozen orbitals stay doubly occupied and fold into the constant energy;\n"
     "  `freeze core` freezes the core shells of each element, `freeze 1 2`\n"
     "  names doubly occupied orbitals.  `active N electrons in M orbitals` keeps\n"
     "  the lowest unfrozen orbitals doubly occupied until N electrons are left,\n"
     "  then takes the next M orbitals; `active orbitals` lists them (occupied\n"
     "  orbitals not listed are kept doubly occupied, so a singly occupied one\n"
     "  must be listed).  Virtual orbitals left out are dropped.  Without an\n"
     "  `orbitals` block every orbital is active.  Each active orbital is two\n"
     "  qubits (before tapering).\n",
     "orbitals {\n"
     "  freeze core\n"
     "  active 4 electrons in 4 orbitals\n"
     "}",
     "indices encoding"},

    {"encoding", "encoding jordan-wigner bravyi-kitaev parity", "the fermion-to-qubit encoding",
     "  encoding jordan-wigner | bravyi-kitaev | parity  [taper]\n"
     "\n"
     "  How spin orbitals become qubits: Jordan-Wigner (1928), Bravyi-Kitaev\n"
     "  (2002, in the construction of Seeley, Richard and Love 2012), or the\n"
     "  parity encoding.  Spin orbital 2p (orbital p, alpha) and 2p+1 (beta)\n"
     "  are qubits 2p and 2p+1.  `taper` then removes the qubits that Z2\n"
     "  symmetries of the Hamiltonian fix (see `cairn help taper`).\n"
     "  Default: jordan-wigner, no tapering.\n",
     "encoding parity taper", "taper indices keep"},

    {"taper", "taper", "remove qubits fixed by Z2 symmetries",
     "  encoding NAME taper\n"
     "\n"
     "  Finds the Z2 symmetries of the encoded Hamiltonian (Pauli words that\n"
     "  commute with every term), fixes them to the sector of the reference\n"
     "  state and removes one qubit for each (Bravyi, Gambetta, Mezzacapo and\n"
     "  Temme, 2017).  Every generator of the pool must commute with the removed\n"
     "  symmetries; `cairn check` reports the rule that breaks one.\n"
     "  `cairn show --hamiltonian` prints the tapered Hamiltonian and the sector.\n",
     "encoding parity taper", "encoding keep"},

    {"reference", "reference hartree-fock mean-field bits", "the state the ansatz starts from",
     "  reference hartree-fock | mean-field | bits BITS\n"
     "\n"
     "  hartree-fock: the Hartree-Fock determinant of the active space, in the\n"
     "  recipe's encoding.  mean-field: the product state of lowest energy,\n"
     "  each qubit rotated on its own (the qubit mean-field reference of qubit\n"
     "  coupled cluster); it is the Hartree-Fock state itself when no rotation\n"
     "  lowers the energy.  bits: an explicit basis state, one character per\n"
     "  qubit, the leftmost character is qubit 0.\n"
     "  Default: hartree-fock.\n",
     "reference bits 11110000", "encoding keep indices"},

    {"keep", "keep particles spin-z spin-squared exactly penalty checked",
     "which symmetries must hold, and how",
     "  keep particles | spin-z | spin-squared  exactly | penalty W | checked TOL\n"
     "\n"
     "  exactly: a static requirement.  Every generator and the reference must\n"
     "  commute with the operator (N, Sz or S^2), computed exactly in the\n"
     "  recipe's encoding; otherwise `cairn check` fails at the pool rule that\n"
     "  breaks it, with a note at the `keep` line.\n"
     "  penalty W: adds W <(X - x0)^2> (W in hartree) to the energy the\n"
     "  optimizer minimizes, x0 being the target value.\n"
     "  checked TOL: `cairn run` measures <X> of the optimized state and reports\n"
     "  a failed check when it is further than TOL from the target.\n"
     "  Targets: the active electrons, Sz = (M-1)/2 and S(S+1) from the\n"
     "  multiplicity M.  A symmetry without `keep` (the default) is neither\n"
     "  enforced nor checked (the report still shows <N>, <Sz> and <S^2>).\n",
     "keep particles exactly\n"
     "keep spin-z exactly\n"
     "keep spin-squared checked 1e-6",
     "symmetry pool multiplicity"},

    {"pool", "pool", "the rules that make the generator pool",
     "  pool {\n"
     "    RULE [OPTION ...]\n"
     "    ...\n"
     "  }\n"
     "\n"
     "  Each line adds generators to the pool, in the order written: singles,\n"
     "  doubles (fermionic excitations), qubit singles, qubit doubles (qubit\n"
     "  excitations), entanglers (Pauli words of the Hamiltonian's flip sets),\n"
     "  word (one Pauli word), excite (one excitation).  Each generator G is\n"
     "  Hermitian and acts as exp(-i theta G / 2).  `choose` then screens the\n"
     "  pool by energy gradient and `order` sorts what was chosen.\n",
     "pool {\n"
     "  singles\n"
     "  doubles\n"
     "}",
     "singles doubles qubit entanglers word excite choose order"},

    {"singles", "singles spin-adapted", "pool rule: fermionic single excitations",
     "  singles [generalized] [spin-adapted]\n"
     "\n"
     "  Spin-conserving single excitations from occupied to virtual spin\n"
     "  orbitals of the reference, each T - T^dagger as one generator (two Pauli\n"
     "  words under Jordan-Wigner).  generalized: between all pairs of orbitals,\n"
     "  not only occupied to virtual.  spin-adapted: the alpha and the beta move\n"
     "  of one orbital pair share one parameter.\n",
     "pool {\n"
     "  singles spin-adapted\n"
     "}",
     "doubles qubit pool"},

    {"doubles", "doubles generalized paired", "pool rule: fermionic double excitations",
     "  doubles [generalized] [paired]\n"
     "\n"
     "  Spin-conserving double excitations from occupied to virtual spin\n"
     "  orbitals (eight Pauli words each under Jordan-Wigner); with `singles`\n"
     "  this is the pool of unitary coupled cluster with singles and doubles\n"
     "  (UCCSD).  generalized: all orbital pairs, not only occupied to virtual.\n"
     "  paired: only pair excitations, both electrons of one orbital to one\n"
     "  orbital (i alpha, i beta -> a alpha, a beta).\n",
     "pool {\n"
     "  doubles paired\n"
     "}",
     "singles qubit pool"},

    {"qubit", "qubit", "pool rules: qubit excitations (no parity strings)",
     "  qubit singles\n"
     "  qubit doubles\n"
     "\n"
     "  Qubit-excitation operators: the same moves as `singles` and `doubles`\n"
     "  but on qubits, without the parity strings of the fermionic operators, so\n"
     "  their circuits are shorter (Yordanov, Arvidsson-Shukur and Barnes, 2020).\n"
     "  With `grow` they make a qubit pool for adaptive growth (Tang et al. 2021).\n",
     "pool {\n"
     "  qubit singles\n"
     "  qubit doubles\n"
     "}",
     "singles doubles grow pool"},

    {"entanglers", "entanglers", "pool rule: one Pauli word per flip set of the Hamiltonian",
     "  entanglers\n"
     "\n"
     "  Groups the Hamiltonian's terms by the qubits they flip (their X and Y\n"
     "  positions) and makes one Pauli word with an odd number of Y letters for\n"
     "  each group: the entanglers of qubit coupled cluster (QCC, 2018), to be\n"
     "  screened by energy gradient with `choose`.  Usually with\n"
     "  `reference mean-field`.\n",
     "pool {\n"
     "  entanglers\n"
     "}",
     "choose reference pool"},

    {"word", "word", "pool rule: one explicit Pauli word",
     "  word P0 P1 ...\n"
     "\n"
     "  One generator: the Pauli word of the letters X, Y, Z each followed by\n"
     "  its qubit, counted from 0 (after tapering, the qubits of the tapered\n"
     "  register).\n",
     "pool {\n"
     "  word X0 Y1 X2 X3\n"
     "}",
     "excite pool indices"},

    {"excite", "excite", "pool rule: one explicit excitation",
     "  excite I J ... -> A B ...\n"
     "\n"
     "  One fermionic excitation from spin orbitals I J ... to A B ... (as many\n"
     "  on each side), counted from 0: spin orbital 2p is orbital p alpha, 2p+1\n"
     "  the same orbital beta (orbital p counted from 0 here).\n",
     "pool {\n"
     "  excite 0 1 -> 4 5\n"
     "}",
     "word pool indices"},

    {"choose", "choose by gradient above all", "which generators of the pool the ansatz keeps",
     "  choose N by gradient\n"
     "  choose gradient above T\n"
     "  choose all\n"
     "\n"
     "  The energy gradient of a generator is dE/dtheta at theta = 0 on the\n"
     "  reference.  `N by gradient` keeps the N generators with the largest\n"
     "  |gradient|; `gradient above T` every generator with |gradient| > T\n"
     "  (hartree); `all` the whole pool (the default).  For adaptive growth see\n"
     "  `grow`.\n",
     "choose 8 by gradient", "grow order pool"},

    {"grow", "grow to until", "adaptive growth of the ansatz by gradient",
     "  grow to N until T\n"
     "\n"
     "  Builds the ansatz one generator at a time: at the current optimized\n"
     "  state, add the pool generator with the largest |gradient|, optimize all\n"
     "  parameters again, and stop when the largest |gradient| is below T\n"
     "  (hartree) or the ansatz has N generators (ADAPT-VQE, Grimsley et al.\n"
     "  2019).  Takes the place of `choose`.  A generator may be chosen again.\n"
     "  The report gives, beside each generator's gradient at the reference,\n"
     "  the gradient it was chosen at (`chosen at`; chosen_gradient in JSON).\n",
     "grow to 30 until 1e-3", "choose qubit pool"},

    {"order", "order as written by gradient rank", "the order in which the chosen generators act",
     "  order as written | order by gradient | order by rank\n"
     "\n"
     "  as written: the order of the pool.  by gradient: decreasing |gradient|.\n"
     "  by rank: lowest excitation rank (the number of qubits a generator moves)\n"
     "  first, then by decreasing |gradient|.  Ties keep the order of the pool.  The\n"
     "  first generator in the order acts first on the reference.\n"
     "  Default: as written.\n",
     "order by gradient", "choose pool trotter"},

    {"trotter", "trotter", "Trotter steps of the generator product",
     "  trotter N\n"
     "\n"
     "  Repeats the whole product of rotations N times with each angle divided\n"
     "  by N (a first-order Trotter product).  N is a whole number >= 1;\n"
     "  default 1.\n",
     "trotter 2", "order"},

    {"optimize", "optimize lbfgs slsqp bobyqa cobyla nelder-mead tolerance iterations starts seed guess zeros mp2",
     "the optimizer of the ansatz parameters",
     "  optimize METHOD [tolerance X] [iterations N] [starts N] [seed N]\n"
     "                  [guess zeros|mp2]\n"
     "\n"
     "  METHOD: lbfgs or slsqp (gradient-based, with exact adjoint gradients of\n"
     "  the statevector), bobyqa, cobyla or nelder-mead (derivative-free); all\n"
     "  from the NLopt library.  tolerance: stop when the energy changes by less\n"
     "  than X hartree.  iterations: the most energy evaluations of one start.\n"
     "  starts: how many starts; the first begins at `guess` (zeros: all angles\n"
     "  0; mp2: amplitudes from second-order perturbation theory), the others at\n"
     "  random angles drawn from `seed`, so runs repeat exactly.  The report\n"
     "  gives the best start and the spread of the final energies.\n"
     "  Defaults: lbfgs tolerance 1e-8 iterations 500 starts 1 seed 7\n"
     "  guess zeros.\n",
     "optimize lbfgs tolerance 1e-8 iterations 500 starts 8 seed 7", "report choose"},

    {"emit", "emit listing qasm2 qasm3", "where `cairn build` writes the gate list",
     "  emit listing | qasm2 | qasm3  \"PATH\"\n"
     "\n"
     "  listing: cairn's own gate listing (stable text, meant for diffs and\n"
     "  review); qasm2: OpenQASM 2.0 (Cross et al. 2017); qasm3: OpenQASM 3.0\n"
     "  (Cross et al. 2022).  PATH is relative to the recipe's directory.  A\n"
     "  recipe may emit several formats.\n",
     "emit listing \"water.gates\"\n"
     "emit qasm3 \"water.qasm\"",
     "report"},

    {"use", "use", "share fragments between recipes",
     "  use \"PATH\"\n"
     "\n"
     "  Reads the statements of another file as if they were written here.\n"
     "  PATH is relative to the directory of the file that uses it.  A file is\n"
     "  read once, however often it is used; a file that uses itself (directly\n"
     "  or through others) is an error.  Diagnostics point into the file where\n"
     "  the text is.  The `cairn 1` line is optional in a used file.\n",
     "use \"common/water-geometry.cairn\"", "syntax"},

    {"indices", "", "how orbitals, spin orbitals, qubits and bits are numbered",
     "  Molecular orbitals in recipes (`freeze 1 2`, `active orbitals 3..6`) are\n"
     "  counted from 1, as in FCIDUMP files.  Spin orbitals, qubits and bits\n"
     "  (`excite 0 1 -> 4 5`, `word X0 Y1`, `bits 1100`) are counted from 0:\n"
     "  spin orbital 2p is orbital p (from 0) with spin alpha, 2p+1 the same\n"
     "  orbital with spin beta.  The leftmost character of a bit string is\n"
     "  qubit 0; in a basis-state index, bit q is qubit q.\n",
     NULL, "orbitals excite word reference"},

    {"symmetry", "", "symmetry signatures of generators",
     "  Every generator gets a signature: whether it commutes with the particle\n"
     "  number N, with Sz, with S^2, and with each Z2 symmetry that tapering\n"
     "  removed, computed exactly in the recipe's encoding.  `keep ... exactly`\n"
     "  and `taper` require the signature; `cairn show` prints it for every\n"
     "  generator.\n",
     NULL, "keep taper"},

    {"report", "", "what `cairn run` prints and writes",
     "  cairn run prints, for each point: the energies (HF, MP2, CCSD, the exact\n"
     "  full CI of the active space, and the ansatz), the error of the ansatz in\n"
     "  mEh against chemical accuracy (1.6 mEh, about 1 kcal/mol), <N>, <Sz>,\n"
     "  <S^2> of the ansatz state and <S^2> of the exact state, the generators\n"
     "  with their gradients and final angles, the optimizer's evaluations and\n"
     "  starts, gate counts, failed checks and the time.  A scan prints a table.\n"
     "  With --json OUT it writes the report as JSON (schema 1), and beside it a\n"
     "  CSV table and an SVG figure (--plot FILE.svg puts them elsewhere; without\n"
     "  --json or --plot no files are written): for a scan, energy against the\n"
     "  varied value and |E - E(exact)| on a log axis with the chemical-accuracy\n"
     "  line; for one point, the error against iteration.\n"
     "\n"
     "  The results are noise-free statevector simulations, and the energies\n"
     "  are exact only within the basis set and the active space.\n",
     NULL, "vary optimize keep"},
};
enum { NTOPICS = (int)(sizeof topics / sizeof topics[0]) };

int help_count(void) { return NTOPICS; }

const help_entry *help_get(int i) { return i >= 0 && i < NTOPICS ? &topics[i] : NULL; }

/* Whether the space-separated list `words` holds `w`. */
static int has_word(const char *words, const char *w) {
  size_t n = strlen(w);
  if (n == 0) return 0;
  for (const char *s = words; *s;) {
    while (*s == ' ') s++;
    size_t k = strcspn(s, " ");
    if (k == n && memcmp(s, w, n) == 0) return 1;
    s += k;
  }
  return 0;
}

/* Print one topic: heading, body, the example indented, related topics. */
static void print_topic(const help_entry *t, FILE *out) {
  fprintf(out, "%s: %s\n\n%s", t->name, t->summary, t->text);
  if (t->example) {
    fprintf(out, "\nexample:\n  ");
    for (const char *s = t->example; *s; s++) {
      fputc(*s, out);
      if (*s == '\n') fputs("  ", out);
    }
    fputc('\n', out);
  }
  if (t->see && *t->see) fprintf(out, "\nsee also: %s\n", t->see);
}

int help_topic(const char *word, FILE *out) {
  int n = 0;
  /* the topic of that name first, then the topics that explain the word */
  for (int i = 0; i < NTOPICS; i++)
    if (strcmp(topics[i].name, word) == 0) {
      print_topic(&topics[i], out);
      n++;
    }
  for (int i = 0; i < NTOPICS; i++) {
    if (strcmp(topics[i].name, word) == 0 || !has_word(topics[i].keywords, word)) continue;
    if (n) fputs("\n----\n\n", out);
    print_topic(&topics[i], out);
    n++;
  }
  return n;
}

int help_find(const char *word) {
  int n = 0;
  for (int i = 0; i < NTOPICS; i++) n += strcmp(topics[i].name, word) == 0 || has_word(topics[i].keywords, word);
  return n;
}

void help_list(FILE *out) {
  for (int i = 0; i < NTOPICS; i++) fprintf(out, "  %-13s %s\n", topics[i].name, topics[i].summary);
}
