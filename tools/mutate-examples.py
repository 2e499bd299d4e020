#!/usr/bin/env python3
"""Writes the mutated-deck corpus of the CLI golden tests.

Each deck in examples/ is broken in small, typical ways -- cut off in the
middle of a token, a line deleted, a definition written twice, two tokens
swapped, a unit of the wrong dimension, an unbalanced parenthesis, stray
bytes, a `given` without its unit, a misspelt keyword, function, unit or
template path, a lost quote or line continuation, a broken number or
comparison -- and written to tests/cli/golden/mutated/ as

    mut_<example>_<NN>_<mutation>.deck

with a first line saying what was done (line numbers as in the example).  The output depends only on the
example decks and the fixed seed, so running the script again writes the
same bytes.  Most mutations leave a deck with errors (exit status 2); one
that happens to stay valid is kept too: its expected status and JSON are
recorded like the others'.  After running it, write the expected files
with tools/refresh-golden.sh and review them.

    tools/mutate-examples.py [--out DIR] [--per-deck N]

Only the Python standard library is used.
"""

import argparse
import os
import random
import re
import shutil
import sys
import zlib

SEED = 20240611
REPO = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))

TOKEN = re.compile(
    r'"[^"\n]*"?'  # a string (possibly unterminated)
    r"|[A-Za-z_][A-Za-z0-9_.]*"  # a name or keyword
    r"|\d+(?:\.\d*)?(?:[eE][+-]?\d+)?"  # a number
    r"|<=|>=|==|!=|[-+*/^(),=<>:\\]"  # operators and punctuation
)
NAME = re.compile(r"[A-Za-z_][A-Za-z0-9_]*")

# Units of a literal and a unit of another dimension to put in their place.
WRONG_UNIT = {
    "kg/s": "m",
    "degC": "kg",
    "K": "m/s",
    "kW": "kg/s",
    "W": "Pa",
    "kW/K": "kJ/kg",
    "W/K": "m^2",
    "kJ/(kg*K)": "W/(m*K)",
    "W/(m*K)": "kJ/(kg*K)",
    "W/(m^2*K)": "W/m",
    "m^2*K/W": "K/W",
    "mm": "kg",
    "m": "s",
    "bar": "degC",
    "kPa": "kW",
    "Pa": "J",
    "m/s": "m^3/s",
    "kg/m^3": "kg",
    "mPa*s": "Pa",
    "m^2": "m^3",
}
MISSPELT_KEYWORD = {
    "given": "gvien",
    "check": "chek",
    "title": "titel",
    "sweep": "swep",
    "solve": "slove",
    "use": "uses",
    "case": "cas",
    "section": "sectoin",
    "table": "tabel",
    "meta": "mета",  # Cyrillic letters that look like Latin ones
    "prefer": "perfer",
    "profile": "profil",
}
GARBAGE = [
    b"\x00",
    b"\x01\x02\x03",
    b"\xff\xfe",
    b"\xc3",  # a lone lead byte
    b"\xe2\x82",  # a cut three-byte sequence
    b"\xc0\xaf",  # an overlong '/'
    b"\xed\xa0\x80",  # a UTF-16 surrogate
    b"\x1b[31m",  # a terminal escape
    b"\x7f",
    b"\xef\xbb\xbf",  # a byte-order mark in the middle
    b"\r",
    b"\x0b\x0c",
    b"$%&",
    b"`~|",
]


def statement_lines(lines):
    """Indexes of lines that hold a statement (not blank, comment or narrative)."""
    out = []
    for i, line in enumerate(lines):
        s = line.strip()
        if s and not s.startswith("#") and not s.startswith(">"):
            out.append(i)
    return out


def tokens(line):
    return [(m.start(), m.end(), m.group(0)) for m in TOKEN.finditer(line)]


def lines_starting(lines, words):
    return [i for i in statement_lines(lines) if lines[i].split(None, 1)[0] in words]


def definitions(lines):
    """(line index, name) of each given and calculated quantity."""
    out = []
    for i in statement_lines(lines):
        m = re.match(r"\s*(?:given\s+)?([A-Za-z_][A-Za-z0-9_]*)\s*=", lines[i])
        if m and m.group(1) not in ("case", "use", "table", "sweep", "solve"):
            out.append((i, m.group(1)))
    return out


def used_later(lines, i, name):
    pattern = re.compile(r"(?<![A-Za-z0-9_.])" + re.escape(name) + r"(?![A-Za-z0-9_])")
    return any(pattern.search(lines[j]) for j in range(i + 1, len(lines)))


# Each mutation takes (lines, rng) and returns (new lines, description), or
# None when it does not apply to this deck.


def m_truncate_mid_token(lines, rng):
    candidates = []
    for i in statement_lines(lines):
        for start, end, text in tokens(lines[i]):
            if end - start >= 3 and not text.startswith('"'):
                candidates.append((i, start, end))
    if not candidates:
        return None
    i, start, end = rng.choice(candidates[len(candidates) // 4 :])
    cut = rng.randint(start + 1, end - 1)
    out = lines[:i] + [lines[i][:cut]]
    return out, f"the file cut off inside a token on line {i + 1}, column {cut + 1}, no newline"


def m_delete_line(lines, rng):
    defs = [(i, n) for i, n in definitions(lines) if used_later(lines, i, n)]
    if not defs:
        return None
    i, name = rng.choice(defs)
    return lines[:i] + lines[i + 1 :], f"line {i + 1} (the definition of '{name}') deleted"


def m_duplicate_definition(lines, rng):
    defs = definitions(lines)
    if not defs:
        return None
    i, name = rng.choice(defs)
    j = rng.choice([k for k in statement_lines(lines) if k >= i])
    return (
        lines[: j + 1] + [lines[i]] + lines[j + 1 :],
        f"the definition of '{name}' (line {i + 1}) repeated after line {j + 1}",
    )


def m_swap_tokens(lines, rng):
    candidates = []
    for i in statement_lines(lines):
        toks = tokens(lines[i])
        for k in range(1, len(toks) - 1):
            a, b = toks[k], toks[k + 1]
            if a[2] != b[2] and not a[2].startswith('"') and not b[2].startswith('"'):
                if a[2] in "*/+-^=(" or b[2] in "*/+-^=(":
                    candidates.append((i, a, b))
    if not candidates:
        return None
    i, a, b = rng.choice(candidates)
    line = lines[i]
    new = line[: a[0]] + b[2] + line[a[1] : b[0]] + a[2] + line[b[1] :]
    return lines[:i] + [new] + lines[i + 1 :], f"'{a[2]}' and '{b[2]}' swapped on line {i + 1}"


def m_wrong_dimension_unit(lines, rng):
    candidates = []
    for i in lines_starting(lines, ("given",)):
        m = re.match(r"(\s*given\s+\w+\s*=\s*-?[0-9.eE+-]+\s+)(\S+)", lines[i])
        if m and m.group(2) in WRONG_UNIT:
            candidates.append((i, m))
    if not candidates:
        return None
    i, m = rng.choice(candidates)
    unit = m.group(2)
    new = lines[i][: m.start(2)] + WRONG_UNIT[unit] + lines[i][m.end(2) :]
    return (
        lines[:i] + [new] + lines[i + 1 :],
        f"the unit {unit} on line {i + 1} replaced by {WRONG_UNIT[unit]}",
    )


def m_unbalanced_paren(lines, rng):
    candidates = [i for i in statement_lines(lines) if "=" in lines[i] or "check" in lines[i]]
    if not candidates:
        return None
    i = rng.choice(candidates)
    toks = [t for t in tokens(lines[i]) if not t[2].startswith('"')]
    start = toks[rng.randrange(1, len(toks))][0] if len(toks) > 1 else len(lines[i])
    paren = rng.choice("()")
    new = lines[i][:start] + paren + lines[i][start:]
    return lines[:i] + [new] + lines[i + 1 :], f"a stray '{paren}' on line {i + 1}"


def m_garbage_bytes(lines, rng):
    i = rng.choice(statement_lines(lines))
    junk = rng.choice(GARBAGE)
    at = rng.randint(0, len(lines[i].encode("utf-8")))
    raw = lines[i].encode("utf-8")
    new = (raw[:at] + junk + raw[at:]).decode("utf-8", "surrogateescape")
    return (
        lines[:i] + [new] + lines[i + 1 :],
        f"bytes {junk.hex(' ')} inserted on line {i + 1} at byte {at + 1}",
    )


def m_drop_given_unit(lines, rng):
    candidates = []
    for i in lines_starting(lines, ("given",)):
        m = re.match(r"(\s*given\s+\w+\s*=\s*-?[0-9.eE+-]+)(\s+)([^\s\"]+)", lines[i])
        if m and m.group(3) not in ("in", "source"):
            candidates.append((i, m))
    if not candidates:
        return None
    i, m = rng.choice(candidates)
    new = lines[i][: m.end(1)] + lines[i][m.end(3) :]
    return lines[:i] + [new] + lines[i + 1 :], f"the unit {m.group(3)} of line {i + 1} dropped"


def m_misspelt_keyword(lines, rng):
    candidates = lines_starting(lines, tuple(MISSPELT_KEYWORD))
    if not candidates:
        return None
    i = rng.choice(candidates)
    word = lines[i].split(None, 1)[0]
    new = lines[i].replace(word, MISSPELT_KEYWORD[word], 1)
    return lines[:i] + [new] + lines[i + 1 :], f"'{word}' misspelt on line {i + 1}"


def m_misspelt_function(lines, rng):
    candidates = []
    for i in statement_lines(lines):
        for m in re.finditer(r"([A-Za-z_][A-Za-z0-9_]{3,})\(", lines[i]):
            if "." not in m.group(1) and m.group(1) not in ("given",):
                candidates.append((i, m))
    if not candidates:
        return None
    i, m = rng.choice(candidates)
    name = m.group(1)
    k = rng.randrange(1, len(name) - 1)
    bad = name[:k] + name[k + 1 :]
    new = lines[i][: m.start(1)] + bad + lines[i][m.end(1) :]
    return lines[:i] + [new] + lines[i + 1 :], f"'{name}' written '{bad}' on line {i + 1}"


def m_misspelt_unit(lines, rng):
    candidates = []
    for i in statement_lines(lines):
        for m in re.finditer(r"(?<=[0-9] )(kg/s|degC|kW|W/K|mm|bar|kJ/\(kg\*K\)|m\^2\*K/W|kg/m\^3)", lines[i]):
            candidates.append((i, m))
    if not candidates:
        return None
    i, m = rng.choice(candidates)
    unit = m.group(1)
    bad = {"kg/s": "kgs", "degC": "degc", "kW": "kw", "W/K": "W/k", "mm": "mmm", "bar": "bars",
           "kJ/(kg*K)": "kJ/(kgK)", "m^2*K/W": "m^2*K/w", "kg/m^3": "kg/m3"}[unit]
    new = lines[i][: m.start(1)] + bad + lines[i][m.end(1) :]
    return lines[:i] + [new] + lines[i + 1 :], f"the unit {unit} written {bad} on line {i + 1}"


def m_lost_quote(lines, rng):
    candidates = [i for i in statement_lines(lines) if lines[i].count('"') >= 2]
    if not candidates:
        return None
    i = rng.choice(candidates)
    at = lines[i].rfind('"')
    new = lines[i][:at] + lines[i][at + 1 :]
    return lines[:i] + [new] + lines[i + 1 :], f"the closing quote on line {i + 1} lost"


def m_lost_continuation(lines, rng):
    candidates = [i for i in statement_lines(lines) if lines[i].rstrip().endswith("\\")]
    if not candidates:
        return None
    i = rng.choice(candidates)
    new = lines[i].rstrip()[:-1].rstrip()
    return lines[:i] + [new] + lines[i + 1 :], f"the line continuation of line {i + 1} lost"


def m_broken_number(lines, rng):
    candidates = []
    for i in statement_lines(lines):
        for m in re.finditer(r"(?<![A-Za-z0-9_.])\d+\.\d+(?![A-Za-z0-9_.])", lines[i]):
            candidates.append((i, m))
    if not candidates:
        return None
    i, m = rng.choice(candidates)
    num = m.group(0)
    bad = rng.choice([num.replace(".", "..", 1), num + "e", num.replace(".", ",", 1), num + ".5"])
    new = lines[i][: m.start()] + bad + lines[i][m.end() :]
    return lines[:i] + [new] + lines[i + 1 :], f"the number {num} written {bad} on line {i + 1}"


def m_broken_comparison(lines, rng):
    candidates = [i for i in lines_starting(lines, ("check",)) if re.search(r"<=|>=|<|>", lines[i])]
    if not candidates:
        return None
    i = rng.choice(candidates)
    m = re.search(r"<=|>=|<|>", lines[i])
    bad = rng.choice(["", "=", "=>", "<>"])
    new = lines[i][: m.start()] + bad + lines[i][m.end() :]
    return (
        lines[:i] + [new] + lines[i + 1 :],
        f"the comparison '{m.group(0)}' on line {i + 1} written '{bad}'",
    )


def m_missing_equals(lines, rng):
    defs = definitions(lines)
    if not defs:
        return None
    i, name = rng.choice(defs)
    at = lines[i].index("=")
    new = lines[i][:at] + lines[i][at + 1 :]
    return lines[:i] + [new] + lines[i + 1 :], f"the '=' defining '{name}' on line {i + 1} lost"


def m_bad_reference(lines, rng):
    """A use of a template or table path that does not exist or lies outside."""
    candidates = [i for i in lines_starting(lines, ("use", "table")) if '"' in lines[i]]
    if not candidates:
        return None
    i = rng.choice(candidates)
    m = re.search(r'"([^"]*)"', lines[i])
    path = m.group(1)
    bad = rng.choice([path.replace(".", "_x.", 1), "../" + path, "/" + path, path + "/"])
    new = lines[i][: m.start(1)] + bad + lines[i][m.end(1) :]
    return lines[:i] + [new] + lines[i + 1 :], f"the path '{path}' on line {i + 1} written '{bad}'"


def m_bad_sweep(lines, rng):
    candidates = [i for i in lines_starting(lines, ("sweep",))]
    if not candidates:
        return None
    i = rng.choice(candidates)
    line = lines[i]
    m = re.match(r"(\s*sweep\s+\w+\s+)(from\s+.*|over\s+.*)$", line)
    if not m:
        return None
    kind = rng.choice(["step0", "wrong_sign", "huge", "empty_over", "mixed_units"])
    fm = re.match(r"from\s+(\S+)\s+(\S+)\s+to\s+(\S+)\s+(\S+)\s+step\s+(\S+)\s+(\S+)", m.group(2))
    if fm:
        a, ua, b, ub, s, us = fm.groups()
        tail = {
            "step0": f"from {a} {ua} to {b} {ub} step 0 {us}",
            "wrong_sign": f"from {a} {ua} to {b} {ub} step -{s} {us}",
            "huge": f"from {a} {ua} to {b} {ub} step 1e-13 {us}",
            "empty_over": f"from {a} {ua} to {b} {ub} step",
            "mixed_units": f"from {a} {ua} to {b} degC step {s} {us}",
        }[kind]
    else:
        values = [v.strip() for v in m.group(2)[len("over") :].split(",")]
        unit = values[0].split()[-1]
        tail = {
            "step0": f"from 1 {unit} to 2 {unit} step 0 {unit}",
            "wrong_sign": f"from 2 {unit} to 1 {unit} step 0.1 {unit}",
            "huge": f"from 0 {unit} to 1e12 {unit} step 1 {unit}",
            "empty_over": "over",
            "mixed_units": "over " + ", ".join(values[:-1] + [values[-1].split()[0] + " degC"]),
        }[kind]
    return lines[:i] + [m.group(1) + tail] + lines[i + 1 :], f"the sweep on line {i + 1}: {kind}"


MUTATIONS = [
    ("truncate", m_truncate_mid_token),
    ("delete_line", m_delete_line),
    ("duplicate", m_duplicate_definition),
    ("swap_tokens", m_swap_tokens),
    ("wrong_unit", m_wrong_dimension_unit),
    ("paren", m_unbalanced_paren),
    ("garbage", m_garbage_bytes),
    ("drop_unit", m_drop_given_unit),
    ("keyword", m_misspelt_keyword),
    ("function", m_misspelt_function),
    ("unit_typo", m_misspelt_unit),
    ("quote", m_lost_quote),
    ("continuation", m_lost_continuation),
    ("number", m_broken_number),
    ("comparison", m_broken_comparison),
    ("equals", m_missing_equals),
    ("path", m_bad_reference),
    ("sweep", m_bad_sweep),
]


def mutate(stem, lines, per_deck):
    """Yields (file name, bytes) of per_deck mutations of one deck."""
    rng = random.Random(SEED ^ zlib.crc32(stem.encode("utf-8")))
    produced = 0
    k = 0
    while produced < per_deck and k < per_deck * 10:
        name, fn = MUTATIONS[(k + zlib.crc32(stem.encode("utf-8"))) % len(MUTATIONS)]
        k += 1
        result = fn(list(lines), rng)
        if result is None:
            continue
        new_lines, what = result
        header = (
            f"# Mutated from examples/{stem}.deck by tools/mutate-examples.py"
            f" (lines as numbered there): {what}"
        )
        text = "\n".join([header] + new_lines)
        if name != "truncate":
            text += "\n"
        produced += 1
        yield f"mut_{stem}_{produced:02d}_{name}.deck", text.encode("utf-8", "surrogateescape")


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--out", default=os.path.join(REPO, "tests", "cli", "golden", "mutated"))
    ap.add_argument("--per-deck", type=int, default=24)
    args = ap.parse_args()
    examples = os.path.join(REPO, "examples")
    os.makedirs(args.out, exist_ok=True)
    for old in os.listdir(args.out):
        if old.startswith("mut_") and old.endswith(".deck"):
            os.remove(os.path.join(args.out, old))
    count = 0
    for entry in sorted(os.listdir(examples)):
        path = os.path.join(examples, entry)
        if entry.endswith(".csv"):
            # Tables the examples read, so that the mutated decks find them.
            shutil.copyfile(path, os.path.join(args.out, entry))
            continue
        if not entry.endswith(".deck"):
            continue
        with open(path, "rb") as f:
            lines = f.read().decode("utf-8").split("\n")
        if lines and lines[-1] == "":
            lines.pop()
        for name, data in mutate(entry[: -len(".deck")], lines, args.per_deck):
            with open(os.path.join(args.out, name), "wb") as f:
                f.write(data)
            count += 1
    print(f"mutate-examples: wrote {count} decks to {args.out}", file=sys.stderr)


if __name__ == "__main__":
    main()
