"""report_keywords.py — helper of the report checks (imported, not a test):
the keywords of the recipe language, read from the front end itself, and the
names it gives a meaning to (vocabulary v1 of the design notes)."""
import glob
import os
import re

WORD = re.compile(r"^[a-z][a-z0-9]*(-[a-z][a-z0-9]*)*$")

# Names with a meaning in the language that the scanner reads as plain names.
VOCABULARY = """
jordan-wigner bravyi-kitaev parity taper hartree-fock mean-field
particles spin-z spin-squared singles doubles entanglers qubit generalized
paired spin-adapted lbfgs slsqp bobyqa cobyla nelder-mead tolerance iterations
starts seed guess zeros mp2 listing qasm2 qasm3
""".split()


def scanner_keywords(src):
    """Keywords as the front end defines them: the quoted words of the
    scanner's rules (grammar/recipe.l), the "`word`" aliases of the grammar's
    tokens (grammar/recipe.y) and the {"word", TOKEN} keyword table of the
    scanner (src/front/*.c)."""
    lex = os.path.join(src, "grammar", "recipe.l")
    words = set()
    text = open(lex).read()
    rules = text.split("%%")[1] if "%%" in text else text
    words |= {w for w in re.findall(r'"([^"\\\n]+)"', rules) if WORD.match(w)}
    yy = os.path.join(src, "grammar", "recipe.y")
    words |= {w for w in re.findall(r'"`([^`"]+)`"', open(yy).read()) if WORD.match(w)}
    for c in glob.glob(os.path.join(src, "src", "front", "*.c")):
        table = re.findall(r'\{\s*"([^"]+)"\s*,\s*[A-Z][A-Z0-9_]*\s*\}', open(c).read())
        words |= {w for w in table if WORD.match(w)}
    return words
