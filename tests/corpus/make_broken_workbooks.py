#!/usr/bin/env python3
"""Writes the spreadsheet files of the broken-file corpus (tests/corpus/broken/).

One defect per file, as for the CSV files there; expected.tsv lists the
problem each one must give (line = the sheet's row, column = the header
name). Run it again after changing tests/e2e/xlsx_file.py; the output is
byte-for-byte reproducible.
"""
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "..", "e2e"))
import xlsx_file as x  # noqa: E402

OUT = os.path.join(HERE, "broken")
HEAD = ["unit_id", "sample_date", "h2_ppm", "ch4_ppm"]
DAY = x.Date(x.serial_1900(2026, 3, 14))


def oil(*rows, **kw):
    return x.workbook([("oil_lab", [HEAD] + list(rows))], **kw)


def write(name, data):
    with open(os.path.join(OUT, name), "wb") as f:
        f.write(data)


write("xlsx_formula_without_value.xlsx", oil(["T1", DAY, 12, x.Formula("C2*2")]))
write("xlsx_error_value.xlsx", oil(["T1", DAY, x.Error("#DIV/0!"), 3]))
write("xlsx_merged_cells.xlsx", oil(["T1", DAY, 12, 3], merged=["C1:D1"]))
write("xlsx_second_header_row.xlsx", oil(["", "", "ppm", "ppm"], ["T1", DAY, 12, 3]))
write("xlsx_value_outside_table.xlsx", x.workbook([("oil_lab", [HEAD, ["T1", DAY, 12, 3, "checked"]])]))
write("xlsx_serial_60.xlsx", oil(["T1", x.Date(60), 12, 3]))
write("xlsx_bad_gas_inline_strings.xlsx", x.workbook([("oil_lab", [HEAD, ["T1", "2026-03-14", "-4", "3"]])],
                                                     shared=False))
write("xlsx_empty_sheet.xlsx", x.workbook([("oil_lab", [])]))
good = oil(["T1", DAY, 12, 3])
write("xlsx_truncated.xlsx", good[: len(good) // 2])
# A password-protected workbook is an OLE compound file, like an old .xls:
# both begin with the same signature.
write("xlsx_old_binary.xls", bytes([0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1]) + bytes(504))
