#!/usr/bin/env python3
"""Reads a tile-export ZIP with Python's standard library only (zipfile, csv, json), as a check
independent of fflate and of our CSV writer: zipfile.ZipFile.testzip verifies every entry's CRC-32
(PKWARE APPNOTE.TXT), csv.DictReader parses tiles.csv per RFC 4180 quoting. Prints one JSON object:
{ "bad": first corrupt entry or null, "names": [...], "utf8": {name: bool}, "manifest": {...}, "rows": [...] }."""
import csv
import io
import json
import sys
import zipfile

def main(path):
    with zipfile.ZipFile(path) as z:
        bad = z.testzip()
        infos = z.infolist()
        names = [i.filename for i in infos]
        # Bit 11 of the general purpose flag: the name is UTF-8 (APPNOTE.TXT 4.4.4).
        utf8 = {i.filename: bool(i.flag_bits & 0x800) for i in infos}
        manifest = json.loads(z.read('manifest.json').decode('utf-8'))
        text = z.read('tiles.csv').decode('utf-8')
    rows = list(csv.DictReader(io.StringIO(text, newline='')))
    json.dump({'bad': bad, 'names': names, 'utf8': utf8, 'manifest': manifest, 'rows': rows}, sys.stdout, ensure_ascii=False)

if __name__ == '__main__':
    main(sys.argv[1])
