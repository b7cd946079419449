#!/usr/bin/env python3
"""Writes data/species.txt (and data/elements.txt) from the NASA Glenn thermodynamic database.

Usage:
    tools/extract_species.py PATH/TO/nasa-glenn-thermo.inp [DATA_DIR]

The input is the NASA Glenn (CEA) database in the 9-coefficient format described in
McBride, Zehe & Gordon, NASA/TP-2002-211556 (2002), Appendix A. The script picks the
gas-phase records of the species listed in SPECIES below, drops any interval that starts
at or above MAX_TEMPERATURE (the 6000-20000 K fits: no machine meets such temperatures
and an ideal gas of intact molecules means little there), and writes them in the project's
own line-oriented format, which src/fluids/species_library.cpp reads. Coefficients are
copied digit for digit (only the Fortran exponent letter D becomes e), so nothing is
rounded on the way.

It also writes data/elements.txt: the atomic weights the database itself uses (taken from
its monatomic gas records), which the loader needs to work out molar masses of records in
the 7-coefficient format, which carry none.

The database file itself is not part of the repository; run this script again when it
changes, and review the diff of data/species.txt.
"""

import re
import sys
from pathlib import Path

MAX_TEMPERATURE = 6000.0  # K; intervals starting at or above this are left out

# (database name, aliases users may write instead). Gas-phase records only.
SPECIES = [
    ("N2", []),
    ("O2", []),
    ("Ar", []),
    ("CO2", []),
    ("H2O", []),
    ("CH4", []),
    ("C2H6", []),
    ("C3H8", []),
    ("C4H10,n-butane", ["n-C4H10"]),
    ("C4H10,isobutane", ["i-C4H10"]),
    ("C5H12,n-pentane", ["n-C5H12"]),
    ("C5H12,i-pentane", ["i-C5H12"]),
    ("C6H14,n-hexane", ["n-C6H14"]),
    ("H2", []),
    ("He", []),
    ("CO", []),
    ("H2S", []),
    ("NH3", []),
    ("SO2", []),
    ("Ne", []),
    ("Kr", []),
    ("Xe", []),
    ("C2H4", []),
    ("C3H6,propylene", ["C3H6"]),
    ("NO", []),
    ("NO2", []),
    ("N2O", []),
]


class Record:
    """One species record of the 9-coefficient format, fields as text."""

    def __init__(self, name, comment, code, formula, phase, molar_mass, intervals, line):
        self.name = name
        self.comment = comment
        self.code = code
        self.formula = formula  # [(symbol, count)]
        self.phase = phase
        self.molar_mass = molar_mass  # text, g/mol
        self.intervals = intervals  # [(t_low, t_high, [a0..a6, b1, b2])] as text
        self.line = line


def field(line, first, last):
    """Columns first..last (1-based, inclusive) of a fixed-column line, stripped."""
    return line[first - 1:last].strip()


def fortran_number(text):
    """A Fortran real as written in the database ("1.384646189D-05"), as Python text."""
    return text.replace("D", "e").replace("d", "e")


def read_records(path):
    lines = Path(path).read_text(encoding="ascii", errors="strict").splitlines()
    records = []
    i = 0
    # Skip the comment header up to the 'thermo' line; the line after it holds the global
    # temperature ranges and the date of the database.
    while i < len(lines) and not lines[i].lower().startswith("thermo"):
        i += 1
    database_date = lines[i + 1].split()[-1] if i + 1 < len(lines) else "unknown"
    i += 2
    while i < len(lines):
        line = lines[i]
        if not line.strip() or line.startswith("!"):
            i += 1
            continue
        if line.startswith("END"):
            i += 1
            continue
        name = line[:24].split()[0]
        comment = line[18:80].strip()
        second = lines[i + 1]
        count = int(field(second, 1, 2))
        code = field(second, 4, 9)
        formula = []
        for k in range(5):
            symbol = field(second, 11 + 8 * k, 12 + 8 * k)
            amount = field(second, 13 + 8 * k, 18 + 8 * k)
            if symbol and float(amount) != 0.0:
                formula.append((symbol, float(amount)))
        phase = int(field(second, 52, 52) or "0")
        molar_mass = field(second, 53, 65)
        intervals = []
        if count == 0:
            i += 3  # name, formula line, one temperature line (assigned enthalpy only)
        else:
            for k in range(count):
                t_line = lines[i + 2 + 3 * k]
                c_line = lines[i + 3 + 3 * k]
                d_line = lines[i + 4 + 3 * k]
                t_low = field(t_line, 1, 11)
                t_high = field(t_line, 12, 22)
                coefficients = [fortran_number(field(c_line, 1 + 16 * j, 16 + 16 * j)) for j in range(5)]
                coefficients += [fortran_number(field(d_line, 1, 16)), fortran_number(field(d_line, 17, 32))]
                coefficients += [fortran_number(field(d_line, 49, 64)), fortran_number(field(d_line, 65, 80))]
                intervals.append((t_low, t_high, coefficients))
            i += 2 + 3 * count
        records.append(Record(name, comment, code, formula, phase, molar_mass, intervals, i + 1))
    return records, database_date


def gas_record(records, name):
    found = [r for r in records if r.name == name and r.phase == 0 and r.intervals]
    if len(found) != 1:
        sys.exit(f"extract_species: expected one gas-phase record named {name!r}, found {len(found)}")
    return found[0]


def write_species(records, database_date, out_path, source_name):
    out = []
    out.append("# shaftwork built-in species: NASA 9-coefficient ideal-gas polynomials.")
    out.append("#")
    out.append("# Figures from the NASA Glenn thermodynamic database (the CEA program's thermo.inp),")
    out.append("# B. J. McBride, M. J. Zehe and S. Gordon, \"NASA Glenn Coefficients for Calculating")
    out.append("# Thermodynamic Properties of Individual Species\", NASA/TP-2002-211556 (2002).")
    out.append(f"# Extracted from {source_name} (database dated {database_date}) by")
    out.append("# tools/extract_species.py; coefficients are copied digit for digit. Intervals above")
    out.append("# 6000 K are left out. Each species' 'source' line repeats the record's own reference")
    out.append("# text and its reference-date code (the database's key: g = NASA Glenn, tpis = Gurvich")
    out.append("# et al., j = NIST-JANAF (Chase 1998), n = TRC tables, followed by month/year).")
    out.append("#")
    out.append("# Format (read by src/fluids/species_library.cpp; docs/properties.md explains it):")
    out.append("#   species NAME                 starts a block; NAME as the database spells it")
    out.append("#   alias OTHER_NAME             zero or more further names for the same species")
    out.append("#   molar_mass VALUE g/mol       or kg/mol")
    out.append("#   source TEXT                  where the figures come from (one line)")
    out.append("#   interval T_low T_high a0 a1 a2 a3 a4 a5 a6 b1 b2")
    out.append("#                                one line per temperature interval, ascending and")
    out.append("#                                contiguous; T in K; the equations are")
    out.append("#     cp/R = a0/T^2 + a1/T + a2 + a3 T + a4 T^2 + a5 T^3 + a6 T^4")
    out.append("#     H/RT = -a0/T^2 + a1 ln(T)/T + a2 + a3 T/2 + a4 T^2/3 + a5 T^3/4 + a6 T^4/5 + b1/T")
    out.append("#     S/R  = -a0/(2 T^2) - a1/T + a2 ln T + a3 T + a4 T^2/2 + a5 T^3/3 + a6 T^4/4 + b2")
    out.append("#   end                          closes the block")
    out.append("# '#' starts a comment line; blank lines are ignored.")
    for name, aliases in SPECIES:
        record = gas_record(records, name)
        kept = [iv for iv in record.intervals if float(iv[0]) < MAX_TEMPERATURE]
        out.append("")
        out.append(f"species {record.name}")
        for alias in aliases:
            out.append(f"alias {alias}")
        out.append(f"molar_mass {record.molar_mass} g/mol")
        out.append(f"source NASA Glenn thermo.inp record {record.name}, code {record.code}: {record.comment}")
        for t_low, t_high, coefficients in kept:
            out.append(f"interval {t_low} {t_high} " + " ".join(coefficients))
        out.append("end")
    Path(out_path).write_text("\n".join(out) + "\n", encoding="ascii")


def write_elements(records, out_path, source_name):
    """Atomic weights from the database's own monatomic (and electron) gas records."""
    rows = []
    for record in records:
        if record.phase != 0 or not record.intervals or len(record.formula) != 1:
            continue
        symbol, amount = record.formula[0]
        if amount != 1.0:
            continue
        if re.fullmatch(r"[A-Z][a-z]?", record.name) and record.name.upper() == symbol.upper():
            rows.append((record.name, record.molar_mass))
        elif record.name == "e-" and symbol.upper() == "E":
            rows.append(("E", record.molar_mass))
    out = []
    out.append("# Atomic weights, g/mol, as the NASA Glenn thermodynamic database uses them (taken from")
    out.append("# the molecular weight of its monatomic gas records; E is the electron).")
    out.append(f"# Extracted from {source_name} by tools/extract_species.py. The species loader uses")
    out.append("# them for the molar mass of records in the 7-coefficient (CHEMKIN) format, which give")
    out.append("# only the elemental formula. Symbols match case-insensitively (CHEMKIN files write AR).")
    out.append("# Format: element SYMBOL ATOMIC_WEIGHT")
    for symbol, weight in sorted(set(rows)):
        out.append(f"element {symbol} {weight}")
    Path(out_path).write_text("\n".join(out) + "\n", encoding="ascii")


def main(argv):
    if len(argv) not in (2, 3):
        sys.exit(__doc__)
    source = Path(argv[1])
    data_dir = Path(argv[2]) if len(argv) == 3 else Path(__file__).resolve().parent.parent / "data"
    records, database_date = read_records(source)
    write_species(records, database_date, data_dir / "species.txt", source.name)
    write_elements(records, data_dir / "elements.txt", source.name)


if __name__ == "__main__":
    main(sys.argv)
