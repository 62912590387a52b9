#!/usr/bin/env python3
"""Reference data from sympy (a general-purpose library from the Debian archive, python3-sympy)
for test/external/sympy-reference.test.ts: random functions of 2..8 inputs, with sympy's
SOPform term and literal counts and, without don't-cares, its ANFform monomials.

  python3 scripts/sympy_reference.py          write test/external/data/sympy-reference.json
  python3 scripts/sympy_reference.py --check  regenerate in memory; exit 1 if it differs
  python3 scripts/sympy_reference.py --time   read [{"n","on","dc"}...] on stdin, print
                                              [{"ms","terms","literals"}...] (for bench/sop)

Combination k: the first variable is the most significant bit (as in the engine). A monomial
is a bit mask in the same positions (first variable = bit n-1); 0 is the constant TRUE.
"""
import json
import random
import sys
import time
from pathlib import Path

import sympy
from sympy import And, Or, Not, Symbol, Xor, symbols
from sympy.logic.boolalg import ANFform, BooleanFalse, BooleanTrue, SOPform

OUT = Path(__file__).resolve().parent.parent / "test" / "external" / "data" / "sympy-reference.json"
SEED = 20240611
COUNT = 300


def literal_count(term):
    if isinstance(term, (Symbol, Not)):
        return 1
    if isinstance(term, And):
        return len(term.args)
    raise ValueError(f"unexpected product term {term}")


def sop_cost(expr):
    """(terms, literals) of a sum of products as sympy prints it."""
    if isinstance(expr, BooleanFalse):
        return 0, 0
    if isinstance(expr, BooleanTrue):
        return 1, 0
    terms = expr.args if isinstance(expr, Or) else (expr,)
    return len(terms), sum(literal_count(t) for t in terms)


def anf_monomials(expr, variables):
    """ANFform's XOR of ANDs as sorted monomial masks."""
    n = len(variables)
    bit = {v: 1 << (n - 1 - i) for i, v in enumerate(variables)}
    if isinstance(expr, BooleanFalse):
        return []
    parts = expr.args if isinstance(expr, Xor) else (expr,)
    out = []
    for p in parts:
        if isinstance(p, BooleanTrue):
            out.append(0)
        elif isinstance(p, Symbol):
            out.append(bit[p])
        elif isinstance(p, And):
            out.append(sum(bit[a] for a in p.args))
        else:
            raise ValueError(f"unexpected ANF term {p}")
    return sorted(out)


def generate():
    rng = random.Random(SEED)
    cases = []
    for i in range(COUNT):
        n = rng.randint(2, 8)
        with_dc = i % 2 == 1
        variables = symbols(" ".join(f"x{j}" for j in range(n)))
        density = rng.choice([0.2, 0.5, 0.8])
        minterms, dontcares = [], []
        for k in range(1 << n):
            r = rng.random()
            if with_dc and r < 0.15:
                dontcares.append(k)
            elif rng.random() < density:
                minterms.append(k)
        terms, literals = sop_cost(SOPform(list(variables), minterms, dontcares))
        case = {"n": n, "on": minterms, "dc": dontcares, "sopTerms": terms, "sopLiterals": literals}
        if not with_dc:
            on = set(minterms)
            values = [1 if k in on else 0 for k in range(1 << n)]
            case["anf"] = anf_monomials(ANFform(list(variables), values), list(variables))
        cases.append(case)
    return {
        "source": f"sympy {sympy.__version__} (sympy.logic.boolalg SOPform, ANFform)",
        "seed": SEED,
        "cases": cases,
    }


def render(data):
    lines = ",\n".join(json.dumps(c, separators=(",", ":")) for c in data["cases"])
    head = json.dumps({k: v for k, v in data.items() if k != "cases"}, separators=(",", ":"))[:-1]
    return f'{head},"cases":[\n{lines}\n]}}\n'


def time_sopform():
    out = []
    for case in json.load(sys.stdin):
        variables = list(symbols(" ".join(f"x{j}" for j in range(case["n"]))))
        start = time.perf_counter()
        expr = SOPform(variables, case["on"], case["dc"])
        ms = (time.perf_counter() - start) * 1000
        terms, literals = sop_cost(expr)
        out.append({"ms": ms, "terms": terms, "literals": literals})
    print(json.dumps({"source": f"sympy {sympy.__version__}", "results": out}))


def main():
    if "--time" in sys.argv[1:]:
        time_sopform()
        return
    data = generate()
    text = render(data)
    if "--check" in sys.argv[1:]:
        committed = json.loads(OUT.read_text()) if OUT.exists() else {"source": "nothing", "cases": None}
        if committed.get("seed") != data["seed"] or committed["cases"] != data["cases"]:
            print(
                f"{OUT.name} differs from what {data['source']} gives now (committed: {committed['source']}).\n"
                "Run `python3 scripts/sympy_reference.py` and review the change.",
                file=sys.stderr,
            )
            sys.exit(1)
        note = "" if committed["source"] == data["source"] else f"; file written with {committed['source']}"
        print(f"{OUT.name} matches {data['source']} ({COUNT} functions{note})")
        return
    OUT.parent.mkdir(parents=True, exist_ok=True)
    OUT.write_text(text)
    print(f"wrote {OUT} ({COUNT} functions)")


if __name__ == "__main__":
    main()
