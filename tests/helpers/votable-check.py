"""An independent reader for Lanewise's exports: Debian's astropy parses a VOTable against the
standard (every astropy warning is an error), checks each UCD against the IVOA UCD1+ word list
and each unit as a VOUnit, and the decimals of every value of a field with a `precision`; a CSV
given beside it is read with Python's csv module and astropy.table, and its cells of those
fields are checked the same way.

    /usr/bin/python3 tests/helpers/votable-check.py export.vot [export.csv]

Prints JSON: {"fields": [...], "rows": [[...]], "csv": {"header": [...], "rows": [[...]]}};
exits non-zero with the reason on the first violation.
"""

import csv
import json
import math
import re
import sys
import warnings
import xml.etree.ElementTree as ET

import numpy as np
from astropy import units
from astropy.io.votable import parse, ucd
from astropy.table import Table

NS = "{http://www.ivoa.net/xml/VOTable/v1.3}"


def fail(message):
    sys.stderr.write(message + "\n")
    sys.exit(1)


def plain(value):
    """A cell as JSON: masked and NaN → None, numpy scalars → Python values."""
    if value is np.ma.masked:
        return None
    if isinstance(value, np.generic):
        value = value.item()
    if isinstance(value, bytes):
        value = value.decode("utf-8")
    if isinstance(value, float) and math.isnan(value):
        return None
    return value


def within(text, decimals):
    return text == "" or re.fullmatch(r"-?\d+(\.\d{1,%d})?" % decimals, text) is not None


def main(vot_path, csv_path=None):
    warnings.simplefilter("error")
    votable = parse(vot_path, verify="exception")
    table = votable.get_first_table()
    fields = []
    for f in table.fields:
        if f.ucd:
            try:
                ucd.parse_ucd(f.ucd, check_controlled_vocabulary=True, has_colon=False)
            except ValueError as e:
                fail(f"field {f.name}: UCD {f.ucd!r} is not UCD1+: {e}")
        if f.unit is not None:
            units.Unit(str(f.unit), format="vounit")
        fields.append(
            {
                "name": f.name,
                "id": f.ID,
                "datatype": f.datatype,
                "arraysize": f.arraysize,
                "precision": f.precision,
                "unit": None if f.unit is None else f.unit.to_string(),
                "ucd": f.ucd,
                "description": f.description,
            }
        )

    # The raw TD text of every floating-point field with a precision: no wider than stated.
    tree = ET.parse(vot_path)
    for tr_index, tr in enumerate(tree.iter(NS + "TR")):
        tds = tr.findall(NS + "TD")
        for f, td in zip(fields, tds):
            if f["precision"] is not None and not within(td.text or "", int(f["precision"])):
                fail(f"row {tr_index + 1}, field {f['name']}: {td.text!r} is wider than {f['precision']} decimals")

    data = table.array
    columns = data.dtype.names
    rows = [[plain(data[columns[k]][i]) for k in range(len(fields))] for i in range(len(data))]
    out = {"fields": fields, "rows": rows}

    if csv_path:
        with open(csv_path, newline="", encoding="utf-8") as fh:
            records = list(csv.reader(fh))
        header, body = records[0], records[1:]
        precision = {f["name"]: f["precision"] for f in fields if f["precision"] is not None}
        for r_index, record in enumerate(body):
            if len(record) != len(header):
                fail(f"CSV row {r_index + 1} has {len(record)} cells, the header {len(header)}")
            for name, cell in zip(header, record):
                if name in precision and not within(cell, int(precision[name])):
                    fail(f"CSV row {r_index + 1}, column {name}: {cell!r} is wider than {precision[name]} decimals")
        read = Table.read(csv_path, format="ascii.csv", encoding="utf-8")
        if read.colnames != header or len(read) != len(body):
            fail(f"astropy reads the CSV as {len(read)} rows of {read.colnames}")
        out["csv"] = {"header": header, "rows": body}

    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main(*sys.argv[1:])
