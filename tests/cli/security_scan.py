#!/usr/bin/python3
"""Source scan behind tests/cli/security_grep.sh.

1. SQL: every place that hands SQL text to SQLite (Statement(db, SQL),
   Database::exec(SQL), sqlite3_exec / sqlite3_prepare*, exec_retrying) must
   pass a string literal, or an expression on the allow-list below with the
   reason it cannot carry a value. Any fmt::format or `+` that builds text
   containing SQL keywords must be on the allow-list too. Values always go
   through bound parameters.
2. No shell-outs: no system(), popen(), exec*(), fork(), posix_spawn in src/.

Comments and the contents of string literals are blanked before matching, so
prose cannot trigger or hide a finding. Usage: security_scan.py SRC_DIR;
exit 1 with one line per finding. An allow-list entry that matches nothing is
a finding too (stale entries must go).
"""
import os
import re
import sys

# SQL arguments that are not literals: (file relative to src/, the argument exactly): reason
ALLOWED_ARGUMENTS = {
    ("library/sqlite.cc", "sql.data()"):
        "Statement's constructor: passes its own argument on (each caller is scanned)",
    ("library/sqlite.cc", "owned.c_str()"):
        "Database::exec: passes its own argument on (each caller is scanned)",
    ("library/sqlite.cc", "sql"):
        "exec_retrying: passes its own argument on (its callers give literals)",
    ("library/stats.cc", "sql"):
        "the count() lambda, called with literals only",
    ("library/check.cc", "rule.sql"):
        "kRules: a constexpr table of string literals",
    ("library/query.cc", "count_sql"):
        "find_couplings: assembled from the fixed pieces allowed below, with '?' placeholders; values are bound",
    ("library/query.cc", "rows_sql"):
        "find_couplings: assembled from the fixed pieces allowed below, with '?' placeholders; values are bound",
    ("library/store.cc", "compound_couplings_query()"):
        "a fixed query: literals and coupling_columns() (coupling_row.cc), one '?' placeholder",
    ("library/schema.cc", "read_text_file(m.path.string())"):
        "the shipped migration files schema/NNN_name.sql",
}
# Statements that build SQL text from pieces: (file, text the statement contains): reason
ALLOWED_BUILDING = {
    ("library/query.cc", 'coupling_columns("k")'):
        "literal text joined with coupling_columns(), a fixed column list (coupling_row.cc)",
    ("library/query.cc", '"SELECT count(*)" + from_where'):
        "from_where: the literal FROM clause and the literal conditions added below",
    ("library/query.cc", 'from_where += " AND " + clause'):
        "clause is one of the literal conditions passed to add() in the same function",
    ("library/query.cc", 'term("k.isotope_a", x)'):
        "the four terms come from term(): a literal column name in a literal template with '?'",
    ("library/query.cc", 'add("c.id IN (SELECT value FROM json_each(?))", ids + "]")'):
        "the '+' builds the bound value (a JSON array of compound ids), not SQL text",
    ("library/query.cc", "return std::isdigit"):
        "term(): column is one of the literals k.isotope_a / k.isotope_b; the value is bound",
    ("library/coupling_row.cc", '"SELECT " + coupling_columns("k")'):
        "compound_couplings_query(): literal text joined with coupling_columns(), a fixed column list",
    ("library/schema.cc", 'fmt::format("PRAGMA user_version = {}", m.version)'):
        "m.version is an int parsed from the migration's file name; PRAGMA takes no bound parameters",
    ("library/sqlite_test.cc", "std::string(coupling) +"):
        "unit test: joins two literals to write out-of-range rows on purpose",
    ("library/sqlite_test.cc", "O'Brien; DROP TABLE t"):
        "unit test data: a hostile text that is bound as a parameter, never run as SQL",
}

SQL_CALL = re.compile(r"\b(?:Statement\s+\w+\s*\(|Statement\s*\(|(?:\.|->)exec\s*\(|sqlite3_exec\s*\(|"
                      r"sqlite3_prepare\w*\s*\(|exec_retrying\s*\()")
SQL_WORDS = re.compile(r"\b(SELECT|INSERT|UPDATE|DELETE|WHERE|PRAGMA|CREATE|DROP|ALTER|ATTACH|VALUES|FROM|JOIN|AND)\b|= \?")
SHELL = re.compile(r"(?<![\w.>:])(?:std::)?(system|popen|execl|execlp|execle|execv|execvp|execvpe|fork|vfork|"
                   r"posix_spawn|posix_spawnp|wordexp)\s*\(")


def blank(code):
    """Comments removed and string-literal contents replaced by spaces (quotes kept), same offsets."""
    out, i, n = [], 0, len(code)
    while i < n:
        c = code[i]
        if code.startswith("//", i):
            j = code.find("\n", i)
            j = n if j < 0 else j
            out.append(" " * (j - i))
            i = j
        elif code.startswith("/*", i):
            j = code.find("*/", i + 2)
            j = n if j < 0 else j + 2
            out.append("".join(ch if ch == "\n" else " " for ch in code[i:j]))
            i = j
        elif code.startswith('R"', i):
            k = code.find("(", i)
            delim = ")" + code[i + 2:k] + '"'
            j = code.find(delim, k)
            j = n if j < 0 else j + len(delim)
            out.append('"' + "".join(ch if ch == "\n" else " " for ch in code[i + 1:j - 1]) + '"')
            i = j
        elif c in "\"'":
            j = i + 1
            while j < n and code[j] != c:
                j += 2 if code[j] == "\\" else 1
            out.append(c + " " * (j - i - 1) + c)
            i = j + 1
        else:
            out.append(c)
            i += 1
    return "".join(out)


def argument(code, start, index):
    """The text of argument `index` (0-based) of the call whose '(' is at start - 1."""
    depth, args, begin = 0, [], start
    for j in range(start, len(code)):
        ch = code[j]
        if ch in "([{":
            depth += 1
        elif ch in ")]}":
            if depth == 0:
                args.append((begin, j))
                break
            depth -= 1
        elif ch == "," and depth == 0:
            args.append((begin, j))
            begin = j + 1
    if index >= len(args):
        return None
    b, e = args[index]
    while b < e and code[b].isspace():
        b += 1
    return b, e


def is_literal(blanked, b, e):
    """Adjacent string literals only (C++ joins them)."""
    return re.fullmatch(r'(?:\s*"[^"]*"\s*)+', blanked[b:e]) is not None


def scan(src):
    findings, used = [], set()
    for dirpath, _, files in os.walk(src):
        for name in sorted(files):
            if not name.endswith((".cc", ".h", ".cpp", ".hpp")):
                continue
            path = os.path.join(dirpath, name)
            rel = os.path.relpath(path, src)
            code = open(path, encoding="utf-8").read()
            blanked = blank(code)

            def where(offset):
                return f"{rel}:{code.count(chr(10), 0, offset) + 1}"

            def allowed(text, exact):
                # A SQL argument must equal its entry; a statement building SQL must contain its entry.
                for (f, entry) in ALLOWED_ARGUMENTS if exact else ALLOWED_BUILDING:
                    if f == rel and (entry == text if exact else entry in text):
                        used.add((f, entry))
                        return True
                return False

            for m in SQL_CALL.finditer(blanked):
                call = m.group(0)
                # The SQL is argument 1 of Statement(db, SQL), exec_retrying(db, SQL), sqlite3_exec(db, SQL, ...),
                # sqlite3_prepare*(db, SQL, ...); argument 0 of .exec(SQL) / ->exec(SQL).
                index = 0 if call.lstrip(".->").startswith("exec") and "retrying" not in call else 1
                span = argument(blanked, m.end(), index)
                if span is None:
                    continue  # a declaration such as Statement(const Statement&)
                b, e = span
                text = code[b:e].strip()
                if text.startswith(("const ", "Database&", "std::string_view", "Statement&")):
                    continue  # a declaration, not a call
                if is_literal(blanked, b, e) or allowed(text, True):
                    continue
                if re.search(r"\+|fmt::format", blanked[b:e]):
                    # Built from pieces: the statement must be on the building allow-list.
                    s0 = max(blanked.rfind(ch, 0, b) for ch in ";{}") + 1
                    s1 = min([k for k in (blanked.find(ch, e) for ch in ";{}") if k >= 0] + [len(code)])
                    if allowed(code[s0:s1], False):
                        continue
                findings.append(f"{where(b)}: SQL argument is not a literal: {text[:80]}")

            # Statements that build text containing SQL keywords with fmt::format or '+'.
            bounds = [0] + [m.end() for m in re.finditer(r"[;{}]", blanked)] + [len(blanked)]
            for b, e in zip(bounds, bounds[1:]):
                raw, bare = code[b:e], blanked[b:e]
                in_literals = SQL_WORDS.search(raw) and not SQL_WORDS.search(bare)
                if not in_literals or not re.search(r"(?<!\+)\+(?![+])|fmt::format", bare):
                    continue
                if allowed(raw, False):
                    continue
                offset = b + len(raw) - len(raw.lstrip())
                findings.append(f"{where(offset)}: SQL text built from pieces: {' '.join(raw.split())[:100]}")

            for m in SHELL.finditer(blanked):
                findings.append(f"{where(m.start())}: shell-out or process start: {m.group(1)}(")
    return findings, used


def main():
    src = sys.argv[1]
    findings, used = scan(src)
    if os.path.basename(os.path.normpath(src)) == "src":
        for key in [*ALLOWED_ARGUMENTS, *ALLOWED_BUILDING]:
            if key not in used:
                findings.append(f"{key[0]}: allow-list entry matches nothing (remove it): {key[1]}")
    for f in findings:
        print(f)
    sys.exit(1 if findings else 0)


if __name__ == "__main__":
    main()
