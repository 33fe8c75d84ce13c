#!/usr/bin/python3
"""Reference CSV for the copoly table reader, written and read back by Python's csv module.

This script makes two files:

- testdata/table_python.csv: a small table in the form a spreadsheet in a decimal-comma locale
  saves as "CSV": semicolon separators, decimal commas, CRLF line ends, a UTF-8 byte order mark,
  and RFC 4180 quoting of the cells that hold a semicolon, a quote or a line break. It is
  written by csv.writer(delimiter=";", lineterminator="\\r\\n", quoting=csv.QUOTE_MINIMAL).
- testdata/table_python.json: the cells of that file as Python's csv.reader(delimiter=";")
  reads them back (encoding "utf-8-sig", newline=""), each cell stripped of surrounding white
  space with str.strip(), as a JSON array of rows (the header row first).

copoly's bench.ParseBlock must find the same cells (header and rows together). The cell texts are
synthetic, made to exercise quoting; they are not measurements.

Usage
-----
    /usr/bin/python3 testdata/table_python.py           # (re)write both files
    /usr/bin/python3 testdata/table_python.py --check   # recompute; exit 1 if a file differs
"""

import csv
import io
import json
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
CSV_PATH = os.path.join(HERE, "table_python.csv")
JSON_PATH = os.path.join(HERE, "table_python.json")

ROWS = [
    ["label", "f10", "conversion", "F1 (NMR)", "note"],
    ["cell A", "0,25", "0,05", "0,3125", ""],
    ["cell B; with a semicolon", "0,5", "", "0,55", "plain"],
    ['cell C with "quotes"', "0,75", "12,5 %", "0,70", "two\nlines"],
    ["  cell D padded  ", "1e-3", "0,1", "1,5E-2", "x"],
    ["cell E, with a comma", "0,9", "0,2", "0,85", "\u00b0C and \u00e9"],
]


def make():
    buf = io.StringIO(newline="")
    w = csv.writer(buf, delimiter=";", lineterminator="\r\n", quoting=csv.QUOTE_MINIMAL)
    for r in ROWS:
        w.writerow(r)
    data = ("\ufeff" + buf.getvalue()).encode("utf-8")

    rd = csv.reader(io.StringIO(data.decode("utf-8-sig"), newline=""), delimiter=";")
    cells = [[c.strip() for c in r] for r in rd if any(c.strip() for c in r)]
    js = json.dumps(cells, ensure_ascii=False, indent=1) + "\n"
    return data, js.encode("utf-8")


def main():
    data, js = make()
    if "--check" in sys.argv[1:]:
        ok = True
        for path, want in ((CSV_PATH, data), (JSON_PATH, js)):
            with open(path, "rb") as f:
                if f.read() != want:
                    print(f"{path}: differs from a fresh run of {sys.argv[0]}")
                    ok = False
        sys.exit(0 if ok else 1)
    with open(CSV_PATH, "wb") as f:
        f.write(data)
    with open(JSON_PATH, "wb") as f:
        f.write(js)


if __name__ == "__main__":
    main()
