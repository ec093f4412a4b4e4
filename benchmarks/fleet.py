# SPDX-License-Identifier: MIT
"""A synthetic fleet for the benchmark: N vessels' particulars, their stock and a catalogue.

Everything is invented and seeded, so the same arguments write the same bytes on every run:

- ``particulars/vessel_NNNN.toml``: one file per vessel in the README's particulars format,
  a mix of ram (two or four rams), rotary vane and trunnion-cylinder steering gears sized by the
  ship's gross tonnage, with a second, non-steering unit (hatch covers, a crane, a stern door)
  on some ships, lengths in mm or inches and pressures in bar or psi as real files mix them;
- ``stock/vessel_NNNN.csv``: an on-board count of some of each vessel's parts;
- ``catalogue.csv`` and ``catalogue.xlsx``: a supplier catalogue of ``catalogue_rows`` rows in
  the columns ``kit catalogue import`` reads; the fleet's own seal, O-ring and filter parts
  are in it (so they match), the rest are other sizes of the same kinds.

The stock and the matching catalogue rows need the fleet's part keys, which the engine works
out (:func:`kit.engine.requirements.assess_vessel`); the particulars themselves need only this module.

Run ``python -m benchmarks.fleet OUT --vessels 1000`` to write a fleet by itself.
"""

from __future__ import annotations

import argparse
import csv
import math
import random
from pathlib import Path

SEED = 20240601
CATALOGUE_ROWS = 100_000
COMPANIES = ("Synthetic Shipping A/S", "Synthetic Tankers Ltd", "Synthetic Ferries plc", "Synthetic Bulk Carriers SA")
ELEMENTS = ("SYN-RE-063-10", "SYN-RE-100-10", "SYN-PE-040-03", "SYN-PE-063-03", "SYN-OF-160-05")
FLUIDS = ("HM 46", "HM 46", "HM 68", "HV 46", "HV 32", "HEES 46")
# ISO 3320 sizes (mm) in use on steering gear, by gross tonnage band.
RAMS = ((5_000, (125, 140, 160)), (20_000, (160, 180, 200, 220)), (60_000, (220, 250, 280, 320)),
        (10**9, (320, 360, 400, 450)))
BORES = ((5_000, (100, 125)), (20_000, (125, 140, 160)), (60_000, (160, 180, 200)), (10**9, (200, 220, 250)))
RODS = {100: 56, 125: 70, 140: 80, 160: 90, 180: 100, 200: 110, 220: 125, 250: 140}
VANE_BORES = ((5_000, 600), (20_000, 800), (60_000, 1100), (10**9, 1400))
CATALOGUE_COLUMNS = ("supplier_ref", "part_kind", "d", "D", "L", "t", "cut", "id", "cs", "length", "h", "spec",
                     "part_key", "description", "pack", "pack_qty", "price", "currency", "lead_time_days")


def _band(table, gt: float):
    return next(sizes for limit, sizes in table if gt < limit)


def _length(rnd: random.Random, mm: float) -> str:
    """A length as a file would give it: mostly mm, sometimes inches (to 1/100 in)."""
    if rnd.random() < 0.15:
        return f"{mm / 25.4:.2f} in"
    return f"{mm:g} mm"


def _pressure(rnd: random.Random, bar: float) -> str:
    return f"{round(bar * 14.5038 / 50) * 50:g} psi" if rnd.random() < 0.15 else f"{bar:g} bar"


def _flow_lpm(volume_l: float, seconds: float) -> float:
    """Pump flow (L/min, rounded up to 5) that swings ``volume_l`` in ``seconds``."""
    return max(10.0, math.ceil(volume_l / seconds * 60 / 5) * 5)


def _filters(rnd: random.Random, duty: int) -> list[dict]:
    out = [{"position": "return", "elements": 1, "change_interval": "2000 h", "duty": duty},
           {"position": "pressure", "elements": 1, "change_interval": "4000 h", "duty": duty}]
    if rnd.random() < 0.3:
        out.append({"position": "offline", "elements": rnd.choice((1, 2)), "change_interval": "4000 h", "duty": 24})
    for f in out:
        if rnd.random() < 0.6:
            f["element"] = rnd.choice(ELEMENTS)
    return out


def _steering(rnd: random.Random, gt: float, uid: str) -> dict:
    angle = math.radians(35)
    sweep = math.tan(math.radians(35)) + math.tan(math.radians(30))
    bar = rnd.choice((100, 120, 140, 160, 180, 200, 220, 250))
    kind = rnd.choices(("ram", "rotary_vane", "cylinder"), weights=(5, 3, 2))[0]
    unit: dict = {"id": uid, "service": "steering", "actuator": kind, "max_rudder_angle": "35 deg",
                  "working_pressure": _pressure(rnd, bar), "fluid": rnd.choice(FLUIDS), "pumps": 2}
    if kind == "ram":
        d = rnd.choice(_band(RAMS, gt))
        tiller = round(d * rnd.uniform(2.4, 3.0) / 10) * 10
        stroke = math.ceil(2 * tiller * math.tan(angle) * 1.15 / 10) * 10
        count = rnd.choice((2, 2, 4))
        swept = math.pi / 4 * (d / 1000) ** 2 * tiller / 1000 * sweep * 1000 * count / 2
        unit.update(count=count, ram_diameter=_length(rnd, d), stroke=_length(rnd, stroke), tiller_radius=_length(rnd, tiller))
    elif kind == "cylinder":
        bore = rnd.choice(_band(BORES, gt))
        rod = RODS[bore]
        tiller = round(bore * rnd.uniform(3.0, 3.6) / 10) * 10
        stroke = math.ceil(2 * tiller * math.tan(angle) * 1.15 / 10) * 10
        area = math.pi / 4 * ((bore / 1000) ** 2 * 2 - (rod / 1000) ** 2)
        swept = area * tiller / 1000 * sweep * 1000
        unit.update(count=2, bore=_length(rnd, bore), rod=_length(rnd, rod), stroke=_length(rnd, stroke),
                    tiller_radius=_length(rnd, tiller))
    else:
        housing = _band(VANE_BORES, gt) + rnd.choice((0, 50, 100))
        hub = round(housing * 0.55 / 10) * 10
        stock = round(hub * 0.75 / 10) * 10
        vanes = rnd.choice((2, 3))
        height = rnd.choice((300, 350, 400, 450, 500, 600))
        swept = vanes * height / 1000 * ((housing / 2000) ** 2 - (hub / 2000) ** 2) / 2 * math.radians(65) * 2 * 1000
        unit.update(count=1, vanes=vanes, vane_height=_length(rnd, height), housing_bore=_length(rnd, housing),
                    hub_diameter=_length(rnd, hub), stock_diameter=_length(rnd, stock))
    flow = _flow_lpm(swept, rnd.uniform(12, 22))
    reservoir = max(100, round(swept * 4 / 50) * 50)
    unit.update(pump_flow=f"{flow:g} L/min", reservoir=f"{reservoir:g} L", oil_leakage=f"{rnd.choice((0.2, 0.3, 0.5, 0.8)):g} L/day",
                pump_model=f"axial piston, {rnd.choice(('fixed', 'variable'))}, {rnd.choice((28, 45, 71, 100))} cm3/rev")
    if rnd.random() < 0.5:
        unit["system_oil"] = f"{round(reservoir * 1.4 / 10) * 10:g} L"
    else:
        unit["pipe"] = [{"outside_diameter": "33.4 mm", "wall": "3.38 mm", "length": f"{rnd.randint(12, 40)} m"},
                        {"outside_diameter": "48.3 mm", "wall": "3.68 mm", "length": f"{rnd.randint(4, 12)} m"}]
    unit["filter"] = _filters(rnd, 24)
    unit["solenoid"] = [{"voltage": rnd.choice(("24 V DC", "110 V AC", "220 V AC")), "count": 4}]
    unit["hose"] = [{"bore": rnd.choice(("20 mm", "25 mm", "32 mm")), "count": 4}]
    return unit


def _auxiliary(rnd: random.Random, uid: str) -> dict:
    service = rnd.choice(("hatch_cover", "crane", "stern_door"))
    bore = rnd.choice((100, 125, 140, 160))
    return {"id": uid, "service": service, "actuator": "cylinder", "count": rnd.choice((2, 4, 6, 8)),
            "bore": _length(rnd, bore), "rod": _length(rnd, RODS[bore]), "stroke": f"{rnd.choice((600, 800, 1000, 1250))} mm",
            "working_pressure": _pressure(rnd, rnd.choice((160, 180, 210))), "fluid": rnd.choice(FLUIDS[:4]),
            "pumps": 2, "pump_flow": f"{rnd.choice((60, 90, 120))} L/min", "reservoir": f"{rnd.choice((300, 400, 600))} L",
            "system_oil": f"{rnd.choice((500, 700, 900))} L", "filter": _filters(rnd, 12)}


def vessel(rnd: random.Random, n: int) -> dict:
    """One invented vessel's particulars as a TOML-shaped dict."""
    ship_type = rnd.choices(("cargo", "tanker", "passenger"), weights=(6, 3, 1))[0]
    gt = round(rnd.lognormvariate(math.log(25_000), 0.8) / 10) * 10 + 500
    units = [_steering(rnd, gt, "SG1")]
    if ship_type == "passenger" and rnd.random() < 0.5:
        units.append({**_steering(rnd, gt, "SG2"), "id": "SG2"})
    if rnd.random() < 0.4:
        units.append(_auxiliary(rnd, "AUX1"))
    return {"company": {"name": COMPANIES[n % len(COMPANIES)]},
            "vessel": {"id": f"SYN-{n:04d}", "name": f"Synthetic Vessel {n:04d}", "ship_type": ship_type,
                       "gross_tonnage": gt},
            "unit": units}


def _toml_value(value) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    return '"' + str(value).replace("\\", "\\\\").replace('"', '\\"') + '"'


def to_toml(doc: dict) -> str:
    """The few TOML shapes a particulars file uses: tables, arrays of tables, nested arrays."""
    out = ["# Synthetic benchmark data: an invented vessel.", ""]
    for name in ("company", "vessel"):
        out.append(f"[{name}]")
        out += [f"{k} = {_toml_value(v)}" for k, v in doc[name].items()]
        out.append("")
    for unit in doc["unit"]:
        out.append("[[unit]]")
        out += [f"{k} = {_toml_value(v)}" for k, v in unit.items() if not isinstance(v, list)]
        out.append("")
        for k, items in unit.items():
            if isinstance(items, list):
                for item in items:
                    out.append(f"[[unit.{k}]]")
                    out += [f"{ik} = {_toml_value(iv)}" for ik, iv in item.items()]
                    out.append("")
    return "\n".join(out)


def write_particulars(folder: Path, vessels: int, seed: int = SEED) -> list[Path]:
    rnd = random.Random(seed)
    folder.mkdir(parents=True, exist_ok=True)
    paths = []
    for n in range(1, vessels + 1):
        path = folder / f"vessel_{n:04d}.toml"
        path.write_text(to_toml(vessel(rnd, n)), encoding="utf-8")
        paths.append(path)
    return paths


def _fleet_lines(folder: Path):
    """(vessel id, line item) for every requirement of the fleet, from kit's own engine."""
    from kit.files.particulars_file import load_folder
    from kit.engine.requirements import assess_vessel
    from kit.files.policy_file import load_policy

    policy = load_policy(None)
    for v in load_folder(folder):
        for line in assess_vessel(v, 0.0, policy).lines:
            yield v.id, line


def write_stock(folder: Path, lines: list, seed: int = SEED) -> None:
    """An on-board count per vessel: about half its parts, some at two locations."""
    rnd = random.Random(seed + 1)
    folder.mkdir(parents=True, exist_ok=True)
    per_vessel: dict[str, dict[str, object]] = {}
    for vid, line in lines:
        per_vessel.setdefault(vid, {})[line.key] = line
    for vid, parts in per_vessel.items():
        with (folder / f"{vid}.csv").open("w", newline="", encoding="utf-8") as f:
            w = csv.writer(f)
            w.writerow(("part_key", "designation", "location", "quantity", "counted_on"))
            for key, line in parts.items():
                if rnd.random() < 0.5:
                    continue
                for location in (("steering gear room",) if rnd.random() < 0.8 else ("steering gear room", "store")):
                    qty = rnd.randint(0, 4) if line.uom == "pcs" else rnd.randint(0, 200)
                    w.writerow((key, line.designation, location, qty, "2024-05-01"))


def _dims_text(rnd: random.Random, dims: dict[str, float]) -> dict[str, str]:
    return {k: (f"{v / 25.4:.4f} in" if rnd.random() < 0.02 else f"{v:g} mm") for k, v in dims.items()}


def catalogue_rows(lines: list, rows: int, seed: int = SEED) -> list[tuple]:
    """``rows`` catalogue rows: the fleet's parts first (they match), then other sizes."""
    from kit.engine.parts import PART_KINDS

    rnd = random.Random(seed + 2)
    seen: dict[str, object] = {}
    for _, line in lines:
        seen.setdefault(line.key, line)
    out: list[tuple] = []

    def add(kind: str, dims: dict[str, str], spec: str, key: str, description: str, uom: str) -> None:
        n = len(out) + 1
        pack = 1 if uom == "pcs" and rnd.random() < 0.8 else (rnd.choice((2, 5, 10)) if uom == "pcs" else rnd.choice((20, 208, 1000)))
        cells = {"supplier_ref": f"SYN-{n:06d}", "part_kind": kind if not key else "", **dims, "spec": spec,
                 "part_key": key, "description": description, "pack_qty": pack if uom == "pcs" else "",
                 "pack": "" if uom == "pcs" else f"{pack} L",  # oil's pack is a volume (issue 13)
                 "price": f"{rnd.uniform(2, 900) * pack:.2f}", "currency": rnd.choice(("EUR", "EUR", "USD")),
                 "lead_time_days": rnd.randint(2, 60)}
        out.append(tuple(cells.get(c, "") for c in CATALOGUE_COLUMNS))

    for key, line in sorted(seen.items()):
        if len(out) >= rows:
            break
        if line.dims and line.kind in PART_KINDS:
            add(line.kind, _dims_text(rnd, line.dims), line.compound, "", line.designation, line.uom)
        else:
            add("", {}, "", key, line.designation, line.uom)
    compounds = ("NBR", "FKM", "AU", "PTFE", "HNBR", "EPDM")
    while len(out) < rows:
        kind = rnd.choice(("rod_seal", "piston_seal", "wiper", "guide_ring", "o_ring", "stock_seal"))
        if kind == "o_ring":
            cs = rnd.choice((1.78, 2.62, 3.53, 5.33, 6.99, 8.4))
            dims = {"id": round(rnd.uniform(5, 900), 2), "cs": cs}
        else:
            d = rnd.randrange(20, 1000, 5)
            s = rnd.choice((5, 7.5, 10, 12.5, 15, 20))
            dims = {"d": float(d), "D": d + 2 * s, "L": rnd.choice((6.3, 8, 10, 12.5, 16, 20, 25, 32))}
            if kind == "guide_ring":
                dims.update(t=2.5, cut=round(math.pi * (d + 2 * s - 2.5) - 3, 1))
        spec = rnd.choice(compounds)
        add(kind, _dims_text(rnd, dims), spec, "", f"{kind.replace('_', ' ')} {spec}", "pcs")
    return out


def write_catalogue(folder: Path, rows: list[tuple]) -> tuple[Path, Path]:
    """The same rows as ``catalogue.csv`` and ``catalogue.xlsx`` (sheet ``catalogue``)."""
    from openpyxl import Workbook

    csv_path, xlsx_path = folder / "catalogue.csv", folder / "catalogue.xlsx"
    with csv_path.open("w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(CATALOGUE_COLUMNS)
        w.writerows(rows)
    wb = Workbook(write_only=True)
    ws = wb.create_sheet("catalogue")
    ws.append(CATALOGUE_COLUMNS)
    for row in rows:
        ws.append([None if c == "" else c for c in row])
    wb.save(xlsx_path)
    return csv_path, xlsx_path


def generate(out: Path, vessels: int, catalogue: int = CATALOGUE_ROWS, seed: int = SEED) -> dict[str, Path]:
    """Write the whole synthetic fleet under ``out``; return where each part went."""
    out.mkdir(parents=True, exist_ok=True)
    particulars = out / "particulars"
    write_particulars(particulars, vessels, seed)
    lines = list(_fleet_lines(particulars))
    write_stock(out / "stock", lines, seed)
    csv_path, xlsx_path = write_catalogue(out, catalogue_rows(lines, catalogue, seed)) if catalogue else (None, None)
    return {"particulars": particulars, "stock": out / "stock", "catalogue_csv": csv_path, "catalogue_xlsx": xlsx_path}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("out", type=Path)
    parser.add_argument("--vessels", type=int, default=1000)
    parser.add_argument("--catalogue-rows", type=int, default=CATALOGUE_ROWS)
    parser.add_argument("--seed", type=int, default=SEED)
    args = parser.parse_args()
    for name, path in generate(args.out, args.vessels, args.catalogue_rows, args.seed).items():
        print(f"{name}: {path}")


if __name__ == "__main__":
    main()
