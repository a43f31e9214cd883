"""Writes the workbooks Intake's workbook tests read (tests/fixtures/workbooks), and beside
each the text its chosen sheet must read as, worked out here from the same Python values.

The workbooks are written by other programs' libraries, so the cells' storage (shared
strings, serial dates in the 1900 and 1904 systems, date formats, OpenDocument's ISO dates,
the old binary format) is theirs, not ours: openpyxl 3.1.5 (.xlsx), odfpy 1.4.1 (.ods),
xlwt 1.3.0 (.xls), run with Python 3. Run from the repository's root:

    pip install openpyxl==3.1.5 odfpy==1.4.1 xlwt==1.3.0
    python3 scripts/workbook_fixtures.py

The data is the demo scenario's shop (invented), a few months of three items.
"""

import datetime as dt
import os

OUT = "tests/fixtures/workbooks"

MONTHS = [dt.date(2024, m, 1) for m in range(1, 13)] + [dt.date(2025, m, 1) for m in range(1, 7)]
ITEMS = ["Seed packets", "Frost cloth", "Garden twine, 50 m"]


def quantity(i, k):
    """A made-up quantity: whole for the first two items, halves for the third."""
    base = [40, 12, 7.5][i]
    return base + (k * 7 + i * 3) % 11 + (0.5 if i == 2 and k % 2 else 0)


def rows():
    """Long rows: month (a date), item, quantity."""
    return [(m, item, quantity(i, k)) for k, m in enumerate(MONTHS) for i, item in enumerate(ITEMS)]


def number(v):
    """A number as the engine writes it: whole without decimals, else Python's shortest."""
    return str(int(v)) if float(v).is_integer() else repr(float(v))


def quoted(cell):
    return '"' + cell.replace('"', '""') + '"' if any(c in cell for c in ',"\n\r') else cell


def expected_sales(title_row):
    """The Sales sheet's text: a title line, an empty line, the header, the rows."""
    lines = []
    if title_row:
        lines += [quoted("Fernhollow Garden Supply, monthly units"), ""]
    lines.append("Month,Item,Units sold")
    for m, item, q in rows():
        lines.append(",".join([m.isoformat(), quoted(item), number(q)]))
    return "\n".join(lines) + "\n"


STOCK = [("Seed packets", 120, 0), ("Frost cloth", 8, 20), ("Garden twine, 50 m", 15.5, 0)]


def expected_stock():
    lines = ["Item,On hand,On order"]
    lines += [",".join([quoted(n), number(h), number(o)]) for n, h, o in STOCK]
    return "\n".join(lines) + "\n"


def xlsx(path, epoch_1904=False):
    import openpyxl
    from openpyxl.utils.datetime import CALENDAR_MAC_1904

    wb = openpyxl.Workbook()
    notes = wb.active
    notes.title = "Read me"
    notes["A1"] = "Units sold per month; stock counted on the last day."
    sales = wb.create_sheet("Sales")
    if epoch_1904:
        wb.epoch = CALENDAR_MAC_1904
    sales.append(["Fernhollow Garden Supply, monthly units"])
    sales.append([])
    sales.append(["Month", "Item", "Units sold"])
    for m, item, q in rows():
        sales.append([dt.datetime(m.year, m.month, m.day), item, q])
        sales.cell(row=sales.max_row, column=1).number_format = "mmm yyyy"
        # Shown as money: the number is read, the format is not.
        sales.cell(row=sales.max_row, column=3).number_format = "#,##0.00"
    stock = wb.create_sheet("Stock")
    stock.append(["Item", "On hand", "On order"])
    for row in STOCK:
        stock.append(list(row))
    wb.save(path)


def ods(path):
    from odf.opendocument import OpenDocumentSpreadsheet
    from odf.table import Table, TableRow, TableCell
    from odf.text import P

    doc = OpenDocumentSpreadsheet()

    def cell(value):
        if isinstance(value, dt.date):
            c = TableCell(valuetype="date", datevalue=value.isoformat())
            c.addElement(P(text=value.isoformat()))
        elif isinstance(value, (int, float)):
            c = TableCell(valuetype="float", value=value)
            c.addElement(P(text=str(value)))
        else:
            c = TableCell(valuetype="string")
            c.addElement(P(text=value))
        return c

    for name, table_rows in [
        ("Sales", [["Month", "Item", "Units sold"]] + [list(r) for r in rows()]),
        ("Stock", [["Item", "On hand", "On order"]] + [list(r) for r in STOCK]),
    ]:
        table = Table(name=name)
        for r in table_rows:
            tr = TableRow()
            for v in r:
                tr.addElement(cell(v))
            table.addElement(tr)
        doc.spreadsheet.addElement(table)
    doc.save(path)


def xls(path):
    import xlwt

    wb = xlwt.Workbook()
    sales = wb.add_sheet("Sales")
    date_style = xlwt.easyxf(num_format_str="YYYY-MM-DD")
    for j, h in enumerate(["Month", "Item", "Units sold"]):
        sales.write(0, j, h)
    for i, (m, item, q) in enumerate(rows(), start=1):
        sales.write(i, 0, dt.datetime(m.year, m.month, m.day), date_style)
        sales.write(i, 1, item)
        sales.write(i, 2, q)
    wb.save(path)


def review_shapes():
    """Shapes a review found misread or refused unhelpfully (2026-12-05), each written as the
    libraries write them: formulas saved without results, a hidden backup sheet, one sheet per
    year, item names merged down their months, an OpenDocument time column, a line break in a
    cell above a bad one, a chart sheet beside the sales, two stock counts."""
    import openpyxl

    def sales_sheet(ws, months, base=0):
        ws.append(["Month", "Item", "Units sold"])
        for k, m in enumerate(months):
            for i, item in enumerate(ITEMS[:2]):
                ws.append([dt.datetime(m.year, m.month, 1), item, quantity(i, k) + base])

    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Sales"
    ws.append(["Month", "Item", "Packs", "Per pack", "Units sold"])
    for k, m in enumerate(MONTHS[:6]):
        ws.append([dt.datetime(m.year, m.month, 1), ITEMS[0], 4 + k, 12, None])
        ws.cell(row=ws.max_row, column=5).value = f"=C{ws.max_row}*D{ws.max_row}"
    wb.save(f"{OUT}/formulas.xlsx")

    wb = openpyxl.Workbook()
    sales_sheet(wb.active, MONTHS[12:])
    wb.active.title = "Sales"
    backup = wb.create_sheet("Sales backup")
    sales_sheet(backup, MONTHS)
    backup.sheet_state = "hidden"
    wb.save(f"{OUT}/hidden_backup.xlsx")

    wb = openpyxl.Workbook()
    wb.active.title = "2024"
    sales_sheet(wb.active, MONTHS[:12])
    sales_sheet(wb.create_sheet("2025"), MONTHS[12:])
    wb.save(f"{OUT}/year_sheets.xlsx")

    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Sales"
    ws.append(["Item", "Month", "Units sold"])
    for i, item in enumerate(ITEMS[:2]):
        first = ws.max_row + 1
        for k, m in enumerate(MONTHS[:6]):
            ws.append([item if k == 0 else None, dt.datetime(m.year, m.month, 1), quantity(i, k)])
        ws.merge_cells(start_row=first, start_column=1, end_row=first + 5, end_column=1)
    wb.save(f"{OUT}/merged_items.xlsx")
    with open(f"{OUT}/merged_items.csv", "w") as f:
        lines = ["Item,Month,Units sold"]
        for i, item in enumerate(ITEMS[:2]):
            lines += [f"{item},{m.isoformat()},{number(quantity(i, k))}" for k, m in enumerate(MONTHS[:6])]
        f.write("\n".join(lines) + "\n")

    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Sales"
    ws.append(["Month", "Item", "Units sold"])
    ws.append([dt.datetime(2024, 1, 1), "Seed\npackets", 4])
    ws.append([dt.datetime(2024, 2, 1), "Seed\npackets", "ten"])
    wb.save(f"{OUT}/line_break.xlsx")

    # Display formats: money and percent shown, so written with their signs.
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Sales"
    ws.append(["Month", "Units sold", "Takings", "Share"])
    for k, m in enumerate(MONTHS[:6]):
        ws.append([dt.datetime(m.year, m.month, 1), quantity(0, k), quantity(0, k) * 2.5, 0.125])
        ws.cell(row=ws.max_row, column=3).number_format = '"$"#,##0.00'
        ws.cell(row=ws.max_row, column=4).number_format = "0.0%"
    wb.save(f"{OUT}/formats.xlsx")
    with open(f"{OUT}/formats.csv", "w") as f:
        lines = ["Month,Units sold,Takings,Share"]
        lines += [
            f"{m.isoformat()},{number(quantity(0, k))},${number(quantity(0, k) * 2.5)},12.5%"
            for k, m in enumerate(MONTHS[:6])
        ]
        f.write("\n".join(lines) + "\n")
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Stock"
    ws.append(["Item", "On hand", "On order"])
    ws.append([ITEMS[0], 120, 0])
    ws.cell(row=2, column=2).number_format = "[$€-407] #,##0"
    wb.save(f"{OUT}/money_on_hand.xlsx")

    from openpyxl.chart import LineChart, Reference

    wb = openpyxl.Workbook()
    sales_sheet(wb.active, MONTHS[:6])
    wb.active.title = "Sales"
    chart = LineChart()
    chart.add_data(Reference(wb.active, min_col=3, min_row=1, max_row=7), titles_from_data=True)
    wb.create_chartsheet("Chart").add_chart(chart)
    wb.save(f"{OUT}/chart_sheet.xlsx")

    wb = openpyxl.Workbook()
    wb.active.title = "Count 2024-11"
    for name, on_hand in [("Count 2024-11", 500), ("Count 2024-12", 2)]:
        ws = wb[name] if name in wb.sheetnames else wb.create_sheet(name)
        ws.append(["Item", "On hand"])
        ws.append([ITEMS[0], on_hand])
    wb.save(f"{OUT}/two_counts.xlsx")

    rows = [["Date", "Time", "Item", "Qty"]]
    for day in range(1, 4):
        for hour, qty in [(9, 2), (14, 3)]:
            rows.append([dt.date(2024, 2, day), f"PT{hour:02d}H15M00S", ITEMS[0], qty])
    ods_rows(f"{OUT}/times.ods", rows)
    ods_rows(f"{OUT}/formula.ods", rows + [[dt.date(2024, 2, 4), "PT10H00M00S", ITEMS[0], "of:=1+2"]])


def ods_rows(path, rows):
    """One OpenDocument sheet "Sales" of `rows`: dates, whole numbers, times ("PT..."),
    formulas ("of:=...", saved without a value) and text."""
    from odf.opendocument import OpenDocumentSpreadsheet
    from odf.table import Table, TableRow, TableCell
    from odf.text import P

    doc = OpenDocumentSpreadsheet()
    table = Table(name="Sales")
    for r in rows:
        tr = TableRow()
        for v in r:
            if isinstance(v, dt.date):
                c = TableCell(valuetype="date", datevalue=v.isoformat())
            elif isinstance(v, int):
                c = TableCell(valuetype="float", value=v)
            elif v.startswith("PT"):
                c = TableCell(valuetype="time", timevalue=v)
            elif v.startswith("of:="):
                c = TableCell(formula=v)
            else:
                c = TableCell(valuetype="string")
                c.addElement(P(text=v))
            tr.addElement(c)
        table.addElement(tr)
    doc.spreadsheet.addElement(table)
    doc.save(path)


def main():
    os.makedirs(OUT, exist_ok=True)
    xlsx(f"{OUT}/sales.xlsx")
    xlsx(f"{OUT}/sales_1904.xlsx", epoch_1904=True)
    ods(f"{OUT}/sales.ods")
    # Refused: its reader is not offered (it failed on damaged files).
    xls(f"{OUT}/sales.xls")
    review_shapes()
    with open(f"{OUT}/sales_with_title.csv", "w") as f:
        f.write(expected_sales(True))
    with open(f"{OUT}/sales_plain.csv", "w") as f:
        f.write(expected_sales(False))
    with open(f"{OUT}/stock.csv", "w") as f:
        f.write(expected_stock())
    # Not a workbook: a zip archive of a CSV file.
    import zipfile

    with zipfile.ZipFile(f"{OUT}/sales_csv.zip", "w") as z:
        z.writestr("sales.csv", expected_sales(False))


if __name__ == "__main__":
    main()
