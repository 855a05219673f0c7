"""Independent readers for the page's exports (run by tests/e2e/run.mjs when python3 is there).

    python3 export_check.py png FILE.png FILE.rgba WIDTH HEIGHT X0 Y0 BORDER [LINES]
        Decode FILE.png with Pillow and compare its pixels at (X0, Y0) with the raw RGBA8 rows of
        FILE.rgba (WIDTH x HEIGHT, the core's phase_plot "rgba" answer), leaving out BORDER pixels
        at each edge. LINES ("x=12.5,y=40"): lines drawn over the picture on purpose (picture
        coordinates); "off_lines" counts the differing pixels more than 2 pixels from all of them.
        Prints {"size": [w, h], "mode", "compared", "different", "max_delta", "off_lines"}.
    python3 export_check.py csv FILE.csv
        Read FILE.csv with Python's csv module; each cell read by float(), else complex() (a cell
        "a+bi" read as "a+bj"), else kept as text. Prints {"header", "rows"} with complex cells
        as {"re", "im"}.
    python3 export_check.py json FILE.json
        Read FILE.json with Python's json module and print it back (floats by repr: round-trip).
    python3 export_check.py svg FILE.svg
        Parse FILE.svg with xml.etree; decode the embedded PNG <image> (if any) with Pillow.
        Prints {"root", "width", "height", "paths", "texts", "image": {"size", "mode"} | null}.

Pillow (PIL) is an outside decoder; csv, json and xml.etree are the Python standard library.
"""
import base64
import csv
import io
import json
import sys


def read_cell(text):
    try:
        return float(text)
    except ValueError:
        pass
    t = text
    if t.endswith('i') and not t.endswith('inf'):
        t = t[:-1] + 'j'
    if t.endswith('j'):
        try:
            z = complex(t)
            return {'re': z.real, 'im': z.imag}
        except ValueError:
            pass
    return text


def main(argv):
    mode = argv[1]
    if mode == 'png':
        from PIL import Image
        png, raw, w, h, x0, y0, border = argv[2], argv[3], *map(int, argv[4:9])
        lines = [(k, float(v)) for k, v in (p.split('=') for p in argv[9].split(',') if p)] if len(argv) > 9 else []
        off_lines = 0
        img = Image.open(png)
        mode_name = img.mode
        rgba = img.convert('RGBA')
        data = open(raw, 'rb').read()
        assert len(data) == w * h * 4, f'the raw pixels are {len(data)} bytes, not {w}x{h}x4'
        px = rgba.load()
        compared = different = max_delta = 0
        for y in range(border, h - border):
            for x in range(border, w - border):
                got = px[x0 + x, y0 + y]
                i = 4 * (y * w + x)
                want = tuple(data[i:i + 4])
                compared += 1
                d = max(abs(a - b) for a, b in zip(got, want))
                if d:
                    different += 1
                    max_delta = max(max_delta, d)
                    if all(abs((x if k == 'x' else y) + 0.5 - v) > 2 for k, v in lines):
                        off_lines += 1
        print(json.dumps({'size': list(img.size), 'mode': mode_name, 'compared': compared,
                          'different': different, 'max_delta': max_delta, 'off_lines': off_lines}))
    elif mode == 'csv':
        with open(argv[2], newline='', encoding='utf-8') as f:
            rows = list(csv.reader(f))
        out = {'header': rows[0], 'rows': [[read_cell(c) for c in r] for r in rows[1:]]}
        print(json.dumps(out, default=str))
    elif mode == 'json':
        with open(argv[2], encoding='utf-8') as f:
            print(json.dumps(json.load(f)))
    elif mode == 'svg':
        import xml.etree.ElementTree as ET
        root = ET.parse(argv[2]).getroot()
        ns = '{http://www.w3.org/2000/svg}'
        image = None
        for im in root.iter(ns + 'image'):
            href = im.get('href') or im.get('{http://www.w3.org/1999/xlink}href')
            head, b64 = href.split(',', 1)
            assert head == 'data:image/png;base64', head
            from PIL import Image
            pic = Image.open(io.BytesIO(base64.b64decode(b64)))
            image = {'size': list(pic.size), 'mode': pic.mode, 'width': float(im.get('width')), 'height': float(im.get('height'))}
        print(json.dumps({'root': root.tag, 'width': root.get('width'), 'height': root.get('height'),
                          'paths': len(list(root.iter(ns + 'path'))), 'texts': [t.text for t in root.iter(ns + 'text')],
                          'image': image}))
    else:
        raise SystemExit(f'unknown mode {mode}')


if __name__ == '__main__':
    main(sys.argv)
