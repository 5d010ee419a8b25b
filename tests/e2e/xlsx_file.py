"""A minimal .xlsx (Office Open XML, ECMA-376 Part 1) writer for tests.

Only what the reader under test needs: one or more worksheets, shared or
inline strings, numbers, dates as serial numbers with a date style, booleans,
error values, formulas with or without a saved value, merged cells and the
1904 date system. Written from the standard's part and element names, with
the standard library's zipfile.

A cell is given as:
  None                       empty
  "text"                     shared string (inline string when shared=False)
  12.5 / 3                   number
  Date(serial) / DateTime(serial)   number with a date / date-time style
  Bool(True)                 boolean
  Error("#N/A")              error value
  Formula("A1*2", cached)    formula, cached value or None (never calculated)
"""
import io
import zipfile
from xml.sax.saxutils import escape


class Date:
    def __init__(self, serial):
        self.serial = serial


class DateTime(Date):
    pass


class Bool:
    def __init__(self, value):
        self.value = value


class Error:
    def __init__(self, code):
        self.code = code


class Formula:
    def __init__(self, formula, cached=None):
        self.formula = formula
        self.cached = cached


def column_letters(n):
    out = ""
    while n > 0:
        n, r = divmod(n - 1, 26)
        out = chr(65 + r) + out
    return out


def serial_1900(year, month, day):
    """Serial number of a date in the 1900 date system (from 1900-03-01 on)."""
    import datetime
    return (datetime.date(year, month, day) - datetime.date(1899, 12, 30)).days


NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"'
RNS = 'xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"'


def _sheet_xml(rows, strings, shared, merged, first_row, first_col):
    out = [f'<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet {NS} {RNS}><sheetData>']
    for i, row in enumerate(rows):
        r = first_row + i
        cells = []
        for j, v in enumerate(row):
            ref = f"{column_letters(first_col + j)}{r}"
            if v is None:
                continue
            if isinstance(v, Bool):
                cells.append(f'<c r="{ref}" t="b"><v>{1 if v.value else 0}</v></c>')
            elif isinstance(v, Error):
                cells.append(f'<c r="{ref}" t="e"><v>{escape(v.code)}</v></c>')
            elif isinstance(v, Formula):
                cached = "" if v.cached is None else f"<v>{v.cached}</v>"
                cells.append(f'<c r="{ref}"><f>{escape(v.formula)}</f>{cached}</c>')
            elif isinstance(v, DateTime):
                cells.append(f'<c r="{ref}" s="2"><v>{v.serial!r}</v></c>')
            elif isinstance(v, Date):
                cells.append(f'<c r="{ref}" s="1"><v>{v.serial!r}</v></c>')
            elif isinstance(v, str):
                if shared:
                    if v not in strings:
                        strings.append(v)
                    cells.append(f'<c r="{ref}" t="s"><v>{strings.index(v)}</v></c>')
                else:
                    cells.append(f'<c r="{ref}" t="inlineStr"><is><t>{escape(v)}</t></is></c>')
            else:
                cells.append(f'<c r="{ref}"><v>{v!r}</v></c>')
        if cells:
            out.append(f'<row r="{r}">' + "".join(cells) + "</row>")
    out.append("</sheetData>")
    if merged:
        out.append(f'<mergeCells count="{len(merged)}">' +
                   "".join(f'<mergeCell ref="{m}"/>' for m in merged) + "</mergeCells>")
    out.append("</worksheet>")
    return "".join(out)


class _Zip(zipfile.ZipFile):
    """Deflated entries with a fixed time, so that a workbook's bytes depend
    on its content only (fixtures regenerate identically)."""

    def __init__(self, buf):
        super().__init__(buf, "w", zipfile.ZIP_DEFLATED)

    def writestr(self, name, data):
        info = zipfile.ZipInfo(name, date_time=(2026, 1, 1, 0, 0, 0))
        info.compress_type = zipfile.ZIP_DEFLATED
        super().writestr(info, data)


def workbook(sheets, shared=True, date1904=False, merged=None, first_row=1, first_col=1):
    """sheets: [(name, rows)]; returns the .xlsx bytes."""
    strings = []
    sheet_xml = [_sheet_xml(rows, strings, shared, merged if k == 0 else None, first_row, first_col)
                 for k, (_, rows) in enumerate(sheets)]
    buf = io.BytesIO()
    with _Zip(buf) as z:
        z.writestr("[Content_Types].xml",
                   '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/'
                   'package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/>'
                   '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.'
                   'relationships+xml"/></Types>')
        z.writestr("_rels/.rels",
                   '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.'
                   'org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.'
                   'org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/>'
                   '</Relationships>')
        pr = '<workbookPr date1904="1"/>' if date1904 else ""
        z.writestr("xl/workbook.xml",
                   f'<?xml version="1.0" encoding="UTF-8"?><workbook {NS} {RNS}>{pr}<sheets>' +
                   "".join(f'<sheet name="{escape(name)}" sheetId="{k + 1}" r:id="rId{k + 1}"/>'
                           for k, (name, _) in enumerate(sheets)) + "</sheets></workbook>")
        rels = "".join(
            f'<Relationship Id="rId{k + 1}" Type="http://schemas.openxmlformats.org/officeDocument/2006/'
            f'relationships/worksheet" Target="worksheets/sheet{k + 1}.xml"/>' for k in range(len(sheets)))
        z.writestr("xl/_rels/workbook.xml.rels",
                   '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.'
                   f'org/package/2006/relationships">{rels}</Relationships>')
        # Cell formats: 0 general, 1 built-in date (14), 2 custom date-time.
        z.writestr("xl/styles.xml",
                   f'<?xml version="1.0" encoding="UTF-8"?><styleSheet {NS}><numFmts count="1">'
                   '<numFmt numFmtId="164" formatCode="dd/mm/yyyy\\ hh:mm"/></numFmts>'
                   '<cellXfs count="3"><xf numFmtId="0"/><xf numFmtId="14" applyNumberFormat="1"/>'
                   '<xf numFmtId="164" applyNumberFormat="1"/></cellXfs></styleSheet>')
        for k, xml in enumerate(sheet_xml):
            z.writestr(f"xl/worksheets/sheet{k + 1}.xml", xml)
        if strings:
            z.writestr("xl/sharedStrings.xml",
                       f'<?xml version="1.0" encoding="UTF-8"?><sst {NS} count="{len(strings)}" '
                       f'uniqueCount="{len(strings)}">' +
                       "".join(f"<si><t>{escape(s)}</t></si>" for s in strings) + "</sst>")
    return buf.getvalue()


def from_csv_rows(rows, date_columns=(), name="Sheet1", **kw):
    """A workbook from CSV-like rows of text; columns in date_columns hold
    ISO dates that become serial numbers with a date style."""
    import datetime
    out = []
    for i, row in enumerate(rows):
        cells = []
        for j, v in enumerate(row):
            if i > 0 and j in date_columns and v:
                d = datetime.date.fromisoformat(v)
                cells.append(Date((d - datetime.date(1899, 12, 30)).days))
            elif i > 0 and v != "":
                try:
                    cells.append(float(v) if "." in v or "e" in v.lower() else int(v))
                except ValueError:
                    cells.append(v)
            else:
                cells.append(v if v != "" else None)
        out.append(cells)
    return workbook([(name, out)], **kw)
