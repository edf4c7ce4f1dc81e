#!/usr/bin/python3
"""report_editors.py — the editor support highlights every keyword of the
recipe language.

- Vim (editors/vim): vim itself, run headless with editors/vim on its
  runtimepath, detects a *.cairn file as filetype cairn and gives every
  keyword of the scanner and every name of the vocabulary a highlight group
  of the right kind; comments, strings, numbers, Pauli words, bit strings and
  basis names get theirs.
- TextMate grammar (editors/textmate/cairn.tmLanguage.json): valid JSON, every
  pattern compiles, and every keyword is matched whole by a keyword-class
  pattern.
Keywords are read from the front end (see report_keywords.py).  Exit 77 only
when vim is not installed, after the checks that do not need it passed.
"""
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from report_keywords import VOCABULARY, scanner_keywords  # noqa: E402

SRC = os.environ.get("CAIRN_SRCDIR", ".")
failures, skips = [], []


def fail(msg):
    failures.append(msg)
    print("FAIL:", msg)


def words():
    kw = scanner_keywords(SRC)
    if len(kw) < 30:
        fail(f"only {len(kw)} keywords found in the front end: the extraction no longer fits the scanner")
    return sorted(kw | set(VOCABULARY))


PROBE = r"""
let out = [&filetype]
for lnum in range(1, line('$'))
  call add(out, synIDattr(synID(lnum, 1, 1), "name"))
endfor
call writefile(out, '%s')
qa!
"""

KINDS = {"cairnStatement", "cairnKeyword", "cairnUnit", "cairnFunction", "cairnValue"}


def check_vim(ws):
    vim = shutil.which("vim")
    if not vim:
        skips.append("vim is not installed: the Vim syntax file was not loaded")
        return
    work = tempfile.mkdtemp(prefix="cairn-vim-")
    try:
        # one probe per line, each starting at column 1: (text, groups allowed)
        probes = [(w, KINDS) for w in ws]
        probes += [("# a comment", {"cairnComment"}), ('"x.gbs"', {"cairnString"}), ("1.5e-3", {"cairnNumber"}),
                   ("X12", {"cairnPauli"}), ("qubits", {""}), ("r", {""})]
        recipe = os.path.join(work, "probe.cairn")
        with open(recipe, "w") as f:
            f.write("\n".join(t for t, _ in probes) + "\n")
        out = os.path.join(work, "out.txt")
        script = os.path.join(work, "probe.vim")
        with open(script, "w") as f:
            f.write(PROBE % out)
        rtp = os.path.join(os.path.abspath(SRC), "editors", "vim")
        subprocess.run([vim, "-Nu", "NONE", "-i", "NONE", "-es", "-c", f"set rtp^={rtp}", "-c", "filetype plugin on",
                        "-c", "syntax on", "-c", f"e {recipe}", "-c", f"source {script}"],
                       stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL, timeout=60)
        got = open(out).read().split("\n")
        if got[0] != "cairn":
            fail(f"vim does not detect *.cairn as filetype cairn (got {got[0]!r})")
        if len(got) - 1 < len(probes):
            fail(f"vim reported {len(got) - 1} highlight groups for {len(probes)} probe lines")
        for (text, allowed), group in zip(probes, got[1:]):
            if group not in allowed:
                fail(f"vim highlights {text!r} as {group or 'nothing'!r}, expected one of {sorted(allowed)}")
        # bits and basis names are highlighted after their keyword
        with open(recipe, "w") as f:
            f.write("reference bits 1100\nbasis 6-31g*\nbasis file \"x.gbs\"\n")
        cols = {1: 16, 2: 7, 3: 12}
        with open(script, "w") as f:
            f.write("let out = []\n" + "".join(f"call add(out, synIDattr(synID({l}, {c}, 1), 'name'))\n"
                                            for l, c in cols.items()) + f"call writefile(out, '{out}')\nqa!\n")
        subprocess.run([vim, "-Nu", "NONE", "-i", "NONE", "-es", "-c", f"set rtp^={rtp}", "-c", "syntax on", "-c",
                        f"e {recipe}", "-c", f"source {script}"], stdin=subprocess.DEVNULL,
                       stdout=subprocess.DEVNULL, timeout=60)
        got = open(out).read().split("\n")
        if len(got) < len(cols):
            fail(f"vim reported {len(got)} highlight groups for {len(cols)} probes")
        for want, g in zip(("cairnBits", "cairnBasis", "cairnString"), got):
            if g != want:
                fail(f"vim: expected {want}, got {g!r}")
        print(f"vim: {len(probes)} probes highlighted as expected" if not failures else "vim: see failures")
    finally:
        shutil.rmtree(work, ignore_errors=True)


def check_textmate(ws):
    path = os.path.join(SRC, "editors", "textmate", "cairn.tmLanguage.json")
    g = json.load(open(path))
    if g.get("scopeName") != "source.cairn" or "cairn" not in g.get("fileTypes", []):
        fail("TextMate grammar: scopeName source.cairn and fileTypes [cairn] expected")
    repo = g["repository"]
    for name in [p["include"][1:] for p in g["patterns"]]:
        if name not in repo:
            fail(f"TextMate grammar: #{name} is included but not defined")
    pats = {}
    for name, rule in repo.items():
        for key in ("match", "begin", "end"):
            if key in rule:
                try:
                    pats.setdefault(name, []).append(re.compile(rule[key]))
                except re.error as e:
                    fail(f"TextMate grammar: #{name} {key} does not compile: {e}")
    classes = ("statement", "keyword", "unit", "function", "value")
    for w in ws:
        ok = False
        for c in classes:
            for p in pats.get(c, []):
                text = w + "(" if c == "function" else w
                m = p.match(text)
                ok |= bool(m) and m.end() == len(w)
        if not ok:
            fail(f"TextMate grammar: no keyword pattern matches {w!r} whole")
    for w in ("spin-zz", "xparity", "lets"):
        if any(p.search(w) for c in classes for p in pats.get(c, [])):
            fail(f"TextMate grammar: a keyword pattern matches inside {w!r}")
    print(f"TextMate grammar: {len(ws)} words matched")


def main():
    ws = words()
    check_textmate(ws)
    check_vim(ws)
    if failures:
        print(f"{len(failures)} check(s) failed")
        return 1
    for s in skips:
        print("SKIP:", s)
    return 77 if skips else 0


sys.exit(main())
