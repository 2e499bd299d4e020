#!/usr/bin/env python3
"""Recalculates heatdeck workbooks in LibreOffice Calc and compares.

Two commands:

  xlsx_recalc.py dump WORKBOOK
      Prints the workbook as JSON (sheets, cells with formula / value /
      type, notes, defined names, document properties) for the C++ tests.

  xlsx_recalc.py check --heatdeck BIN --workdir DIR DECK[|NAME=LITERAL|auto] ...
      For each deck: heatdeck writes the workbook and the JSON results; the
      cached value of every quantity, display value and check cell must
      equal the JSON.  Then the cached values of all formula cells are
      removed and LibreOffice (headless, a throw-away profile set to
      recalculate on load) computes them: each must equal the value
      heatdeck cached, to 1e-9 relative.  Then the input NAME is changed to
      LITERAL in a copy of the deck, heatdeck evaluates that copy, the
      input cells (and the cells that hold heatdeck's values because no
      formula exists) are set to its values in the workbook, LibreOffice
      recalculates, and every formula cell must equal the new JSON results.

Exit status 0 when everything agrees; 1 with a list of disagreements.
Only the Python standard library is used (zipfile, xml.etree).
"""

import argparse
import json
import math
import os
import re
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET
import zipfile

NS = {
    "m": "http://schemas.openxmlformats.org/spreadsheetml/2006/main",
    "r": "http://schemas.openxmlformats.org/officeDocument/2006/relationships",
    "rel": "http://schemas.openxmlformats.org/package/2006/relationships",
}
REL_TYPE_COMMENTS = (
    "http://schemas.openxmlformats.org/officeDocument/2006/relationships/comments")
RTOL = 1e-9
CACHE_RTOL = 1e-12  # cached values are printed with 16 significant digits
# LibreOffice 7.4's BESSELK is a polynomial approximation: against
# scipy.special.kv its values at x = 0.465 and 1.033 (orders 0 and 1) are off
# by 1.0e-9 to 8.4e-9 relative (measured here; BESSELI agrees to 1e-15).
# Cells that depend on BESSELK are held to this looser tolerance, and the
# script says how many.
BESSELK_RTOL = 1e-7
# A difference of nearly equal terms keeps only the digits the terms do not
# share, in any spreadsheet: it is compared to this tolerance relative to the
# terms (see Tolerance), some thousand times the rounding of a double.
CANCEL_RTOL = 1e-12


# ---------------------------------------------------------------- reading


def _text(el):
    """All text of an element (shared strings may be split into runs)."""
    return "".join(t.text or "" for t in el.iter("{%s}t" % NS["m"]))


def _rels(z, part):
    folder, name = os.path.split(part)
    path = os.path.join(folder, "_rels", name + ".rels")
    if path not in z.namelist():
        return {}
    out = {}
    for rel in ET.fromstring(z.read(path)).findall("rel:Relationship", NS):
        target = rel.get("Target")
        if not target.startswith("/"):
            target = os.path.normpath(os.path.join(folder, target))
        else:
            target = target[1:]
        out[rel.get("Id")] = (rel.get("Type"), target)
    return out


def col_row(ref):
    m = re.fullmatch(r"\$?([A-Z]+)\$?(\d+)", ref)
    col = 0
    for ch in m.group(1):
        col = col * 26 + ord(ch) - 64
    return col - 1, int(m.group(2)) - 1


def ref_of(col, row):
    letters = ""
    c = col + 1
    while c > 0:
        c, rem = divmod(c - 1, 26)
        letters = chr(65 + rem) + letters
    return "%s%d" % (letters, row + 1)


def read_workbook(path):
    """The workbook as plain data: sheets in order, with cells and notes."""
    with zipfile.ZipFile(path) as z:
        strings = []
        if "xl/sharedStrings.xml" in z.namelist():
            for si in ET.fromstring(z.read("xl/sharedStrings.xml")).findall("m:si", NS):
                strings.append(_text(si))
        wb = ET.fromstring(z.read("xl/workbook.xml"))
        rels = _rels(z, "xl/workbook.xml")
        sheets = []
        for sh in wb.find("m:sheets", NS).findall("m:sheet", NS):
            part = rels[sh.get("{%s}id" % NS["r"])][1]
            sheets.append({"name": sh.get("name"), "part": part, "cells": {}, "notes": {}})
        for sheet in sheets:
            root = ET.fromstring(z.read(sheet["part"]))
            for c in root.iter("{%s}c" % NS["m"]):
                cell = {"t": c.get("t", "n"), "s": int(c.get("s", "0"))}
                f = c.find("m:f", NS)
                if f is not None:
                    cell["f"] = f.text or ""
                v = c.find("m:v", NS)
                if cell["t"] == "s" and v is not None:
                    cell["v"] = strings[int(v.text)]
                elif cell["t"] == "inlineStr":
                    cell["v"] = _text(c.find("m:is", NS))
                elif v is not None:
                    cell["v"] = v.text if cell["t"] in ("str", "e") else (
                        v.text == "1" if cell["t"] == "b" else float(v.text))
                sheet["cells"][c.get("r")] = cell
            for rid, (rtype, target) in _rels(z, sheet["part"]).items():
                if rtype != REL_TYPE_COMMENTS:
                    continue
                croot = ET.fromstring(z.read(target))
                for cm in croot.iter("{%s}comment" % NS["m"]):
                    sheet["notes"][cm.get("ref")] = _text(cm.find("m:text", NS))
        names = []
        dn = wb.find("m:definedNames", NS)
        if dn is not None:
            for d in dn.findall("m:definedName", NS):
                target = d.text
                m = re.fullmatch(r"'?(.*?)'?!(\$?[A-Z]+\$?\d+)", target)
                local = d.get("localSheetId")
                names.append({
                    "name": d.get("name"),
                    "local": None if local is None else int(local),
                    "sheet": m.group(1).replace("''", "'") if m else None,
                    "ref": m.group(2).replace("$", "") if m else None,
                    "target": target,
                })
        core = z.read("docProps/core.xml").decode() if "docProps/core.xml" in z.namelist() else ""
        charts = {n: z.read(n).decode() for n in sorted(z.namelist())
                  if n.startswith("xl/charts/chart")}
        parts = sorted(z.namelist())
    return {"sheets": sheets, "names": names, "core": core, "charts": charts, "parts": parts}


# ---------------------------------------------------------------- editing


def rewrite(src, dst, edits_by_part, strip_formula_values):
    """Copies src to dst: drops the cached values of formula cells when asked,
    and sets <v> of the cells in edits_by_part {part: {ref: number}}."""

    def edit_cell(match, edits):
        cell = match.group(0)
        ref = re.search(r'\br="([A-Z]+\d+)"', cell).group(1)
        has_f = "<f" in cell
        if strip_formula_values and has_f:
            cell = re.sub(r"<v>[^<]*</v>", "", cell)
            cell = re.sub(r'\st="(str|n|e|b)"', "", cell, count=1)
        if ref in edits:
            if has_f:
                raise ValueError("cannot set the formula cell " + ref)
            cell = re.sub(r"<v>[^<]*</v>", "<v>%s</v>" % repr(float(edits[ref])), cell)
        return cell

    with zipfile.ZipFile(src) as zin, zipfile.ZipFile(dst, "w", zipfile.ZIP_DEFLATED) as zout:
        for info in zin.infolist():
            data = zin.read(info.filename)
            if info.filename.startswith("xl/worksheets/sheet"):
                edits = edits_by_part.get(info.filename, {})
                text = data.decode("utf-8")
                text = re.sub(r"<c [^>]*?(?:/>|>.*?</c>)",
                              lambda m: edit_cell(m, edits), text, flags=re.S)
                data = text.encode("utf-8")
            zout.writestr(info, data)


# ---------------------------------------------------------------- LibreOffice

RECALC_ALWAYS = """<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry"
 xmlns:xs="http://www.w3.org/2001/XMLSchema"
 xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load">
<prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
"""


def recalc(files, outdir, profile):
    """Opens each file in LibreOffice (headless) and saves it as xlsx in outdir."""
    os.makedirs(os.path.join(profile, "user"), exist_ok=True)
    with open(os.path.join(profile, "user", "registrymodifications.xcu"), "w") as f:
        f.write(RECALC_ALWAYS)
    os.makedirs(outdir, exist_ok=True)
    cmd = ["soffice", "-env:UserInstallation=file://" + os.path.abspath(profile),
           "--headless", "--norestore", "--convert-to", "xlsx:Calc MS Excel 2007 XML",
           "--outdir", outdir] + files
    proc = subprocess.run(cmd, stdout=subprocess.PIPE, stderr=subprocess.STDOUT, text=True,
                          timeout=600)
    for f in files:
        out = os.path.join(outdir, os.path.basename(f))
        if not os.path.exists(out):
            raise RuntimeError("LibreOffice did not convert %s:\n%s" % (f, proc.stdout))
    return [os.path.join(outdir, os.path.basename(f)) for f in files]


# ---------------------------------------------------------------- checking


def close(a, b, rtol, scale=0.0):
    """a equals b to rtol relative, or to CANCEL_RTOL relative to scale (the
    magnitude of the terms a difference was computed from)."""
    if isinstance(a, str) or isinstance(b, str):
        return a == b
    if a is None or b is None:
        return False
    return abs(a - b) <= max(rtol * max(abs(a), abs(b)), CANCEL_RTOL * scale) or a == b


def run_heatdeck(binary, deck, outdir):
    os.makedirs(outdir, exist_ok=True)
    proc = subprocess.run([binary, "run", deck, "-o", outdir, "-f", "xlsx", "-f", "json"],
                          stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    stem = os.path.splitext(os.path.basename(deck))[0]
    xlsx = os.path.join(outdir, stem + ".xlsx")
    js = os.path.join(outdir, stem + ".json")
    if proc.returncode not in (0, 1) or not os.path.exists(xlsx):
        raise RuntimeError("heatdeck failed on %s (%d):\n%s%s" %
                           (deck, proc.returncode, proc.stdout, proc.stderr))
    with open(js) as f:
        return xlsx, json.load(f)


class Layout:
    """Where heatdeck's values sit in a workbook: the expected value of
    every formula cell and the cells that hold inputs or heatdeck's values,
    for the results `res` (heatdeck's JSON)."""

    def __init__(self, book, res):
        self.book = book
        self.expected = {}  # (sheet index, ref) -> value
        self.inputs = {}  # (sheet index, ref) -> SI value of a given
        self.values = {}  # (sheet index, ref) -> heatdeck's value in a non-formula cell
        self.errors = []
        sheets = book["sheets"]
        calc_sheets = self._calc_sheets()
        for case_index, si in enumerate(calc_sheets):
            case = res["cases"][case_index]
            cells = sheets[si]["cells"]
            by_name = {}
            for n in book["names"]:
                if n["ref"] is None or n["sheet"] != sheets[si]["name"]:
                    continue
                if case_index > 0 and n["local"] != si:
                    continue
                if case_index == 0 and n["local"] is not None:
                    continue
                by_name[n["ref"]] = n["name"]
            # Quantities: the SI cell's row names the quantity in column A.
            rows_by_symbol = {}
            for ref, cell in cells.items():
                col, row = col_row(ref)
                if col == 0 and cell.get("t") == "s" and ref_of(2, row) in by_name:
                    rows_by_symbol.setdefault(cell["v"], []).append(row)
            for q in case["quantities"]:
                rows = rows_by_symbol.get(q["name"], [])
                if len(rows) != 1:
                    self.errors.append("%s: quantity %s has %d rows" %
                                       (sheets[si]["name"], q["name"], len(rows)))
                    continue
                row = rows[0]
                si_ref, disp_ref = ref_of(2, row), ref_of(4, row)
                self._expect(si, si_ref, q["si_value"], q["kind"])
                self._expect(si, disp_ref, q["value"], "calc")
            # Checks: rows whose verdict column F holds PASS/FAIL under a
            # "Check" header; matched to the JSON by condition and description.
            check_rows = []
            for ref, cell in cells.items():
                col, row = col_row(ref)
                if col == 5 and "f" in cell and cell["f"].startswith("IF("):
                    check_rows.append(row)
                if col == 5 and "f" not in cell and cell.get("v") in ("PASS", "FAIL"):
                    check_rows.append(row)
            check_rows.sort()
            unused = list(check_rows)
            for chk in case["checks"]:
                desc = chk["description"]
                if chk.get("template"):
                    desc = ("[%s] %s" % (chk["template"], desc)).rstrip()
                match = None
                for row in unused:
                    a = cells.get(ref_of(0, row), {}).get("v")
                    b = cells.get(ref_of(1, row), {}).get("v", "")
                    if a == chk["expression"] and b == desc:
                        match = row
                        break
                if match is None:
                    self.errors.append("%s: no row for the check %r" %
                                       (sheets[si]["name"], chk["expression"]))
                    continue
                unused.remove(match)
                verdict = None if chk["pass"] is None else ("PASS" if chk["pass"] else "FAIL")
                self._expect(si, ref_of(5, match), verdict, "calc")
                if chk["lhs_si"] is not None:
                    for col, value in ((2, chk["lhs_si"]), (4, chk["rhs_si"]),
                                       (6, chk["margin"])):
                        self._expect(si, ref_of(col, match), value, "calc")
        # The summary: a row per case with COUNTIF formulas and the verdict.
        summary = sheets[0]["cells"]
        total_failed = 0
        for ref, cell in summary.items():
            col, row = col_row(ref)
            if col == 3 and cell.get("f", "").startswith("COUNTIF("):
                name = summary.get(ref_of(0, row), {}).get("v")
                case = next((c for c in res["cases"] if c["name"] == name), None)
                if case is None:
                    self.errors.append("summary row %d names no case" % (row + 1))
                    continue
                passed = sum(1 for c in case["checks"] if c["pass"] is True)
                failed = sum(1 for c in case["checks"] if c["pass"] is False)
                self.expected[(0, ref)] = float(passed)
                self.expected[(0, ref_of(4, row))] = float(failed)
            if col == 1 and cell.get("f", "").startswith("IF(SUM("):
                failed = sum(1 for c in res["cases"] for k in c["checks"] if k["pass"] is False)
                self.expected[(0, ref)] = "Every check passes" if failed == 0 else "A check fails"
        # Every formula cell must have an expected value.
        for si, sheet in enumerate(sheets):
            for ref, cell in sheet["cells"].items():
                if "f" in cell and (si, ref) not in self.expected:
                    self.errors.append("%s!%s: formula %r is not mapped to a result" %
                                       (sheet["name"], ref, cell["f"]))

    def _calc_sheets(self):
        """Sheet indices of the case sheets, in case order: the sheets whose
        cells the defined names point at (the first has workbook names)."""
        out = []
        for si, sheet in enumerate(self.book["sheets"]):
            if any(n["sheet"] == sheet["name"] for n in self.book["names"]):
                out.append(si)
        return out

    def _expect(self, si, ref, value, kind):
        cell = self.book["sheets"][si]["cells"].get(ref)
        if cell is None:
            self.errors.append("%s!%s: no cell" % (self.book["sheets"][si]["name"], ref))
            return
        if value is None:
            return  # heatdeck has no value (a failed quantity): nothing to compare
        if "f" in cell:
            self.expected[(si, ref)] = value
        elif kind == "given":
            self.inputs[(si, ref)] = value
        else:
            self.values[(si, ref)] = value


def _references(book):
    """For every formula cell: the cells its formula reads (by defined name,
    or by reference on its own sheet), and its top-level additive terms
    (after ABS( ), a sign and parentheses are peeled off) as cells, numbers,
    or None for a compound term."""
    names = {}
    for n in book["names"]:
        if n["ref"] is None:
            continue
        sheet = next(i for i, s in enumerate(book["sheets"]) if s["name"] == n["sheet"])
        names[(n["name"].upper(), n["local"])] = (sheet, n["ref"])

    def target(token, si):
        t = names.get((token.upper(), si)) or names.get((token.upper(), None))
        if t is None and re.fullmatch(r"[A-Z]{1,3}\d+", token):
            t = (si, token)
        return t

    def peel(f):
        while True:
            f = f.strip()
            if f.startswith("-"):
                f = f[1:]
            elif f.startswith("ABS(") and _closing(f, 3) == len(f) - 1:
                f = f[4:-1]
            elif f.startswith("(") and _closing(f, 0) == len(f) - 1:
                f = f[1:-1]
            else:
                return f

    out = {}
    for si, sheet in enumerate(book["sheets"]):
        for ref, cell in sheet["cells"].items():
            if "f" not in cell:
                continue
            f = re.sub(r'"[^"]*"', "", cell["f"])
            reads = set()
            for token in re.findall(r"[A-Za-z_][A-Za-z0-9_.]*", f):
                t = target(token, si)
                if t:
                    reads.add(t)
            terms = []
            for term in _split_additive(peel(f)):
                term = peel(term)
                if re.fullmatch(r"[\d.]+(?:E[-+]?\d+)?", term):
                    terms.append(float(term))
                elif re.fullmatch(r"[A-Za-z_][A-Za-z0-9_.]*", term):
                    terms.append(target(term, si))
                else:
                    terms.append(None)
            out[(si, ref)] = (reads, terms if len(terms) > 1 else [], cell["f"])
    return out


def _closing(f, i):
    """Index of the parenthesis closing the one at f[i]."""
    depth = 0
    for j in range(i, len(f)):
        depth += {"(": 1, ")": -1}.get(f[j], 0)
        if depth == 0:
            return j
    return -1


def _split_additive(f):
    """f split at its top-level + and - (not inside parentheses, not the
    sign of an exponent such as 1E-09, not a unary sign)."""
    parts, depth, start = [], 0, 0
    for i, ch in enumerate(f):
        if ch == "(":
            depth += 1
        elif ch == ")":
            depth -= 1
        elif ch in "+-" and depth == 0 and i > start:
            prev = f[i - 1]
            if prev in "*/^(,<>=+-":
                continue  # a unary sign
            if prev == "E" and i >= 2 and f[i - 2].isdigit():
                continue  # an exponent
            parts.append(f[start:i])
            start = i + 1
    parts.append(f[start:])
    return parts


class Tolerance:
    """Per formula cell, the magnitude of the terms it was computed from, to
    which CANCEL_RTOL applies (RTOL applies to the value itself, whichever
    is looser wins).

    A difference of nearly equal terms (an energy balance's residual, a
    margin, a display value in degC) carries the rounding of its terms, so
    its error is relative to them, not to its own small value; and a value
    computed from such a cell inherits its relative error.  So, with v the
    cell's value (heatdeck's):
      - a formula whose top level adds or subtracts terms: the largest of
        |v| and the magnitudes of the terms that are single cells or numbers;
      - any other formula: |v| times the largest ratio magnitude/|value| of
        the cells it reads (1 when none lost digits).
    A product keeps its relative tolerance, so nothing is loosened unless a
    cancellation upstream makes it so.  Cells that depend on BESSELK get
    BESSELK_RTOL (see above) instead of RTOL.
    """

    def __init__(self, book, values):
        self.refs = _references(book)
        self.values = values  # (sheet, ref) -> number, for every numeric cell
        self.memo = {}
        self.besselk = set()
        for key in self.refs:
            if self._bessel(key, set()):
                self.besselk.add(key)

    def _bessel(self, key, seen):
        if key not in self.refs or key in seen:
            return False
        seen.add(key)
        reads, _, f = self.refs[key]
        return "BESSELK(" in f.upper() or any(self._bessel(r, seen) for r in reads)

    def magnitude(self, key):
        if key in self.memo:
            return self.memo[key]
        self.memo[key] = 0.0  # a cycle (none expected) reads as no widening
        v = abs(self.values.get(key, 0.0) or 0.0)
        if key not in self.refs:
            self.memo[key] = v
            return v
        reads, terms, _ = self.refs[key]
        if terms:
            m = v
            for t in terms:
                if isinstance(t, float):
                    m = max(m, abs(t))
                elif t is not None:
                    m = max(m, self.magnitude(t))
        else:
            ratio = 1.0
            for r in reads:
                rv = abs(self.values.get(r, 0.0) or 0.0)
                if rv > 0:
                    ratio = max(ratio, self.magnitude(r) / rv)
            m = v * ratio
        self.memo[key] = m
        return m


def numeric_values(book):
    return {(si, ref): c["v"] for si, s in enumerate(book["sheets"])
            for ref, c in s["cells"].items() if isinstance(c.get("v"), float)}


WORST = [0.0, ""]  # the largest |difference| / allowed seen, and where


def compare(book, expected, label, rtol, tolerance=None):
    """Mismatches between the cells of book and the expected values, to rtol
    relative (to the magnitudes of a Tolerance, when given)."""
    errors = []
    for (si, ref), want in sorted(expected.items()):
        sheet = book["sheets"][si]
        got = sheet["cells"].get(ref, {}).get("v")
        tol, scale = rtol, 0.0
        if tolerance is not None:
            scale = tolerance.magnitude((si, ref))
            if (si, ref) in tolerance.besselk:
                tol = BESSELK_RTOL
        if isinstance(got, float) and isinstance(want, float):
            allowed = max(tol * max(abs(got), abs(want)), CANCEL_RTOL * scale)
            if allowed > 0 and abs(got - want) / allowed > WORST[0]:
                WORST[:] = [abs(got - want) / allowed, "%s %s!%s" % (label, sheet["name"], ref)]
        if not close(got, want, tol, scale):
            errors.append("%s: %s!%s = %r (formula %s), expected %r" %
                          (label, sheet["name"], ref, got, sheet["cells"].get(ref, {}).get("f"),
                           want))
    return errors


GIVEN = (r"^(\s*given\s+%s\s*=\s*)([-+]?[\d.]+(?:[eE][-+]?\d+)?)"
         r"((?: ?(?!source\b)[^\s\"]+)?)")


def auto_assignment(deck):
    """NAME=LITERAL for the deck's first given: its number times 1.1, same unit."""
    with open(deck) as f:
        for line in f:
            m = re.match(GIVEN % r"([A-Za-z_]\w*)", line)
            if m:
                return "%s=%r%s" % (m.group(2), float(m.group(3)) * 1.1, m.group(4))
    raise RuntimeError("%s has no given to change" % deck)


def changed_deck(deck, assignment, folder, work):
    """A copy of the deck's folder (without the work folder, should it lie
    inside) in `folder` with NAME's given literal replaced; returns the
    copy's deck path."""
    name, literal = assignment.split("=", 1)
    src_dir = os.path.dirname(os.path.abspath(deck))
    dst_dir = os.path.join(folder, "deck")
    shutil.copytree(src_dir, dst_dir, ignore=lambda d, names: [
        n for n in names if os.path.abspath(os.path.join(d, n)) == work])
    path = os.path.join(dst_dir, os.path.basename(deck))
    with open(path) as f:
        text = f.read()
    pattern = re.compile(GIVEN % re.escape(name), re.M)
    text, n = pattern.subn(lambda m: m.group(1) + literal, text)
    if n != 1:
        raise RuntimeError("%s: found %d 'given %s' lines" % (deck, n, name))
    with open(path, "w") as f:
        f.write(text)
    return path


def check(args):
    work = os.path.abspath(args.workdir)
    os.makedirs(work, exist_ok=True)
    errors = []
    jobs = []
    for spec in args.decks:
        deck, _, assignment = spec.partition("|")
        if assignment == "auto":
            assignment = auto_assignment(deck)
        tag = "%d_%s" % (len(jobs), os.path.splitext(os.path.basename(deck))[0])
        folder = os.path.join(work, tag)
        shutil.rmtree(folder, ignore_errors=True)
        xlsx, res = run_heatdeck(args.heatdeck, deck, os.path.join(folder, "base"))
        book = read_workbook(xlsx)
        layout = Layout(book, res)
        errors += ["%s: %s" % (deck, e) for e in layout.errors]
        # Cached values are heatdeck's.
        errors += compare(book, layout.expected, deck + " (cached)", CACHE_RTOL)
        errors += compare(book, layout.inputs, deck + " (inputs)", CACHE_RTOL)
        errors += compare(book, layout.values, deck + " (values)", CACHE_RTOL)
        formulas = sum(1 for s in book["sheets"] for c in s["cells"].values() if "f" in c)
        stripped = os.path.join(folder, "stripped", tag + ".xlsx")
        os.makedirs(os.path.dirname(stripped))
        rewrite(xlsx, stripped, {}, True)
        job = {"deck": deck, "tag": tag, "book": book, "stripped": stripped,
               "formulas": formulas, "layout": layout}
        if assignment:
            new_deck = changed_deck(deck, assignment, folder, work)
            _, res2 = run_heatdeck(args.heatdeck, new_deck, os.path.join(folder, "changed"))
            layout2 = Layout(book, res2)
            errors += ["%s (changed): %s" % (deck, e) for e in layout2.errors]
            edits = {}
            for (si, ref), v in list(layout2.inputs.items()) + list(layout2.values.items()):
                edits.setdefault(book["sheets"][si]["part"], {})[ref] = v
            changed = os.path.join(folder, "changed_book", tag + "_changed.xlsx")
            os.makedirs(os.path.dirname(changed))
            rewrite(xlsx, changed, edits, True)
            moved = sum(1 for k, v in layout2.expected.items()
                        if not close(v, layout.expected.get(k), 1e-6))
            if moved == 0:
                errors.append("%s: changing %s moves no formula cell" % (deck, assignment))
            job.update(changed=changed, layout2=layout2, assignment=assignment, moved=moved)
        jobs.append(job)

    # One LibreOffice run converts every file: starting it costs most of the time.
    profile = os.path.join(work, "lo_profile")
    changed_jobs = [j for j in jobs if "changed" in j]
    outs = recalc([j["stripped"] for j in jobs] + [j["changed"] for j in changed_jobs],
                  os.path.join(work, "recalc"), profile)
    for job, out in zip(jobs, outs):
        book = read_workbook(out)
        expected = {(si, ref): c["v"] for si, s in enumerate(job["book"]["sheets"])
                    for ref, c in s["cells"].items() if "f" in c and "v" in c
                    and c["v"] not in ("#N/A",)}
        tolerance = Tolerance(job["book"], numeric_values(job["book"]))
        errors += compare(book, expected, job["deck"] + " (recalculated)", RTOL, tolerance)
        ratios = [tolerance.magnitude(k) / abs(v) for k, v in expected.items()
                  if isinstance(v, float) and v != 0]
        widened = sum(1 for r in ratios if r > 1.000001)
        print("%s: %d formula cells recalculated by LibreOffice (%d depend on BESSELK; "
              "%d with terms larger than their value, by up to %.3g times)" %
              (job["deck"], len(expected), len(tolerance.besselk), widened,
               max(ratios, default=1.0)))
    for job, out in zip(changed_jobs, outs[len(jobs):]):
        book = read_workbook(out)
        values = numeric_values(job["book"])
        values.update({k: v for k, v in job["layout2"].expected.items() if isinstance(v, float)})
        values.update(job["layout2"].inputs)
        values.update(job["layout2"].values)
        errors += compare(book, job["layout2"].expected,
                          "%s (with %s)" % (job["deck"], job["assignment"]), RTOL,
                          Tolerance(job["book"], values))
        print("%s: with %s, %d formula cells checked, %d moved" %
              (job["deck"], job["assignment"], len(job["layout2"].expected), job["moved"]))
    print("largest difference: %.3g of its tolerance (%s)" % tuple(WORST))
    for e in errors:
        print("MISMATCH " + e)
    print("%d mismatches" % len(errors))
    return 1 if errors else 0


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    sub = parser.add_subparsers(dest="command", required=True)
    d = sub.add_parser("dump")
    d.add_argument("workbook")
    c = sub.add_parser("check")
    c.add_argument("--heatdeck", required=True)
    c.add_argument("--workdir", required=True)
    c.add_argument("decks", nargs="+",
                   help="DECK, DECK|NAME=LITERAL, or DECK|auto (the first given times 1.1)")
    args = parser.parse_args()
    if args.command == "dump":
        json.dump(read_workbook(args.workbook), sys.stdout, indent=1, sort_keys=True)
        print()
        return 0
    return check(args)


if __name__ == "__main__":
    sys.exit(main())
