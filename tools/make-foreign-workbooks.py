#!/usr/bin/env python3
"""Writes the workbooks of fixtures/workbooks/ in the shapes other spreadsheet writers use, with
Python's standard zipfile only (no spreadsheet library: PyPI is out of reach here).

  python3 tools/make-foreign-workbooks.py

See fixtures/workbooks/README.md for what each file imitates. The data are the isothermal demo
run's readings (fixtures/runs/isothermal.json), so an import can be checked value by value.
"""
import json
import os
import zipfile
from datetime import datetime, timedelta
from xml.sax.saxutils import escape

ROOT = os.path.join(os.path.dirname(__file__), '..')
OUT = os.path.join(ROOT, 'fixtures', 'workbooks')
RUN = json.load(open(os.path.join(ROOT, 'fixtures', 'runs', 'isothermal.json'), encoding='utf-8'))
R = RUN['readings']
HEADERS = [('time', 'Time (s)'), ('pressure', 'P (kPa)'), ('displacement', 'Piston position [mm]'),
           ('temperature', 'T/°C'), ('voltage', 'U/V'), ('current', 'Heater current (mA)')]
N = len(R['time']['values'])
NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main'
RNS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships'
PKG = 'http://schemas.openxmlformats.org/package/2006/relationships'
FIXED_TIME = (2026, 3, 14, 9, 0, 0)  # zip entry dates, so the bytes do not change between runs


def col(i):
    s = ''
    i += 1
    while i:
        i, r = divmod(i - 1, 26)
        s = chr(65 + r) + s
    return s


def write(path, parts):
    with zipfile.ZipFile(path, 'w', zipfile.ZIP_DEFLATED) as z:
        for name, text in parts:
            info = zipfile.ZipInfo(name, FIXED_TIME)
            info.compress_type = zipfile.ZIP_DEFLATED
            z.writestr(info, text.encode('utf-8'))


def content_types(shared):
    return ('<?xml version="1.0" encoding="UTF-8"?>\n'
            '<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">'
            '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>'
            '<Default Extension="xml" ContentType="application/xml"/>'
            '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>'
            '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>'
            '<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>'
            + ('<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/>' if shared else '')
            + '</Types>')


ROOT_RELS = (f'<?xml version="1.0" encoding="UTF-8"?>\n<Relationships xmlns="{PKG}">'
             f'<Relationship Id="rId1" Type="{RNS}/officeDocument" Target="xl/workbook.xml"/></Relationships>')


def styles(date_format):
    # Style 0: general; style 1: a date-time number format (custom id 164), as date cells get.
    numfmts = f'<numFmts count="1"><numFmt numFmtId="164" formatCode="{escape(date_format)}"/></numFmts>' if date_format else ''
    xfs = '<xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/>'
    if date_format:
        xfs += '<xf numFmtId="164" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/>'
    count = 2 if date_format else 1
    return (f'<?xml version="1.0" encoding="UTF-8"?>\n<styleSheet xmlns="{NS}">{numfmts}'
            '<fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts>'
            '<fills count="2"><fill><patternFill/></fill><fill><patternFill patternType="gray125"/></fill></fills>'
            '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>'
            '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>'
            f'<cellXfs count="{count}">{xfs}</cellXfs>'
            '<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>')


class Sheet:
    """Cells of one sheet; text goes to shared strings or inline, as the writer being imitated does."""

    def __init__(self, inline):
        self.inline = inline
        self.strings = []
        self.index = {}
        self.rows = []

    def text(self, ref, s):
        if self.inline:
            return f'<c r="{ref}" t="inlineStr"><is><t>{escape(s)}</t></is></c>'
        if s not in self.index:
            self.index[s] = len(self.strings)
            self.strings.append(s)
        return f'<c r="{ref}" t="s"><v>{self.index[s]}</v></c>'

    def add(self, cells):
        n = len(self.rows) + 1
        out = []
        for i, v in enumerate(cells):
            ref = f'{col(i)}{n}'
            if v is None:
                continue
            if isinstance(v, str):
                out.append(self.text(ref, v))
            elif isinstance(v, tuple):  # ('date', serial)
                out.append(f'<c r="{ref}" s="1" t="n"><v>{repr(v[1])}</v></c>')
            else:
                out.append(f'<c r="{ref}" t="n"><v>{repr(v)}</v></c>')
        self.rows.append(f'<row r="{n}">{"".join(out)}</row>')

    def xml(self, merges=()):
        merge = ''.join(f'<mergeCell ref="{m}"/>' for m in merges)
        merge = f'<mergeCells count="{len(merges)}">{merge}</mergeCells>' if merges else ''
        return (f'<?xml version="1.0" encoding="UTF-8"?>\n<worksheet xmlns="{NS}">'
                '<sheetPr><outlinePr summaryBelow="1" summaryRight="1"/><pageSetUpPr/></sheetPr>'
                f'<sheetFormatPr baseColWidth="8" defaultRowHeight="15"/><sheetData>{"".join(self.rows)}</sheetData>{merge}'
                '<pageMargins left="0.75" right="0.75" top="1" bottom="1" header="0.5" footer="0.5"/></worksheet>')

    def shared(self):
        items = ''.join(f'<si><t>{escape(s)}</t></si>' for s in self.strings)
        return f'<?xml version="1.0" encoding="UTF-8"?>\n<sst xmlns="{NS}" uniqueCount="{len(self.strings)}">{items}</sst>'


def workbook(sheet_name):
    return (f'<?xml version="1.0" encoding="UTF-8"?>\n<workbook xmlns="{NS}">'
            '<workbookPr/><workbookProtection/><bookViews><workbookView visibility="visible" minimized="0" showHorizontalScroll="1" '
            'showVerticalScroll="1" showSheetTabs="1" tabRatio="600" firstSheet="0" activeTab="0" autoFilterDateGrouping="1"/></bookViews>'
            f'<sheets><sheet xmlns:r="{RNS}" name="{escape(sheet_name)}" sheetId="1" state="visible" r:id="rId1"/></sheets>'
            '<definedNames/><calcPr calcId="124519" fullCalcOnLoad="1"/></workbook>')


def workbook_rels(absolute, shared):
    # The shape openpyxl writes: targets absolute from the package root.
    p = '/xl/' if absolute else ''
    rels = [f'<Relationship Id="rId1" Type="{RNS}/worksheet" Target="{p}worksheets/sheet1.xml"/>',
            f'<Relationship Id="rId2" Type="{RNS}/styles" Target="{p}styles.xml"/>']
    if shared:
        rels.append(f'<Relationship Id="rId3" Type="{RNS}/sharedStrings" Target="{p}sharedStrings.xml"/>')
    return f'<?xml version="1.0" encoding="UTF-8"?>\n<Relationships xmlns="{PKG}">{"".join(rels)}</Relationships>'


def readings_sheet(inline, dates):
    sheet = Sheet(inline)
    sheet.add(['Harrowgate piston cell PC-3, logger export'])
    sheet.add([])
    start = datetime(2026, 3, 14, 10, 0, 0)
    heads = [('time', 'Timestamp')] + HEADERS[1:] if dates else HEADERS
    sheet.add([h for _, h in heads])
    for i in range(N):
        row = []
        for k, _ in HEADERS:
            v = R[k]['values'][i]
            if k == 'time' and dates:
                t = start + timedelta(seconds=v)
                # A date serial: days since 1899-12-30 (the 1900 date system).
                row.append(('date', (t - datetime(1899, 12, 30)).total_seconds() / 86400))
            else:
                row.append(v)
        sheet.add(row)
    return sheet


def openpyxl_shaped(path, dates):
    sheet = readings_sheet(inline=False, dates=dates)
    write(path, [
        ('docProps/app.xml', '<?xml version="1.0" encoding="UTF-8"?>\n<Properties xmlns="http://schemas.openxmlformats.org/officeDocument/2006/extended-properties"><Application>tools/make-foreign-workbooks.py</Application></Properties>'),
        ('docProps/core.xml', '<?xml version="1.0" encoding="UTF-8"?>\n<cp:coreProperties xmlns:cp="http://schemas.openxmlformats.org/package/2006/metadata/core-properties" xmlns:dc="http://purl.org/dc/elements/1.1/"><dc:creator>logger</dc:creator></cp:coreProperties>'),
        ('xl/theme/theme1.xml', '<?xml version="1.0" encoding="UTF-8"?>\n<a:theme xmlns:a="http://schemas.openxmlformats.org/drawingml/2006/main" name="Office Theme"><a:themeElements/></a:theme>'),
        ('xl/worksheets/sheet1.xml', sheet.xml(merges=['A1:D1'])),
        ('xl/sharedStrings.xml', sheet.shared()),
        ('xl/styles.xml', styles('yyyy-mm-dd h:mm:ss' if dates else None)),
        ('xl/workbook.xml', workbook('Log')),
        ('xl/_rels/workbook.xml.rels', workbook_rels(absolute=True, shared=True)),
        ('_rels/.rels', ROOT_RELS),
        ('[Content_Types].xml', content_types(shared=True)),
    ])


def inline_strings(path):
    sheet = readings_sheet(inline=True, dates=False)
    write(path, [
        ('[Content_Types].xml', content_types(shared=False)),
        ('_rels/.rels', ROOT_RELS),
        ('xl/workbook.xml', workbook('Data')),
        ('xl/_rels/workbook.xml.rels', workbook_rels(absolute=False, shared=False)),
        ('xl/styles.xml', styles(None)),
        ('xl/worksheets/sheet1.xml', sheet.xml()),
    ])


if __name__ == '__main__':
    os.makedirs(OUT, exist_ok=True)
    openpyxl_shaped(os.path.join(OUT, 'absolute-targets-shared-strings.xlsx'), dates=False)
    openpyxl_shaped(os.path.join(OUT, 'absolute-targets-date-serials.xlsx'), dates=True)
    inline_strings(os.path.join(OUT, 'inline-strings.xlsx'))
    print('wrote', sorted(os.listdir(OUT)))
