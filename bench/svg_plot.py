"""A minimal log-log line plot in SVG for bench/compare.py (no matplotlib, no vicinal).

write_panels(path, {panel title: {series label: [(size, seconds), ...]}}):
one panel per entry, side by side, with decade grid lines and a legend.
"""
import math

COLOURS = ["#1f5fa8", "#c2452d", "#2e8b57", "#8a5fb0"]
W, H, PAD_L, PAD_B, PAD_T, PAD_R = 300, 240, 56, 40, 28, 12


def _decades(lo, hi):
    return range(math.floor(math.log10(lo)), math.ceil(math.log10(hi)) + 1)


def _panel(x0, title, lines):
    pts = [p for pts in lines.values() for p in pts if p[0] > 0 and p[1] > 0]
    if not pts:
        return []
    xs, ys = [p[0] for p in pts], [p[1] for p in pts]
    dx, dy = list(_decades(min(xs), max(xs))), list(_decades(min(ys), max(ys)))
    if len(dx) < 2:
        dx.append(dx[0] + 1)
    if len(dy) < 2:
        dy.append(dy[0] + 1)
    pw, ph = W - PAD_L - PAD_R, H - PAD_T - PAD_B

    def X(v):
        return x0 + PAD_L + (math.log10(v) - dx[0]) / (dx[-1] - dx[0]) * pw

    def Y(v):
        return PAD_T + ph - (math.log10(v) - dy[0]) / (dy[-1] - dy[0]) * ph

    out = [f'<text x="{x0 + W / 2:.1f}" y="16" text-anchor="middle" font-size="12">{title}</text>',
           f'<rect x="{x0 + PAD_L}" y="{PAD_T}" width="{pw}" height="{ph}" fill="none" stroke="#444"/>']
    for d in dx:
        x = X(10.0 ** d)
        out.append(f'<line x1="{x:.1f}" y1="{PAD_T}" x2="{x:.1f}" y2="{PAD_T + ph}" stroke="#ddd"/>')
        out.append(f'<text x="{x:.1f}" y="{PAD_T + ph + 14}" text-anchor="middle" font-size="10">1e{d}</text>')
    for d in dy:
        y = Y(10.0 ** d)
        out.append(f'<line x1="{x0 + PAD_L}" y1="{y:.1f}" x2="{x0 + PAD_L + pw}" y2="{y:.1f}" stroke="#ddd"/>')
        out.append(f'<text x="{x0 + PAD_L - 4}" y="{y + 3:.1f}" text-anchor="end" font-size="10">1e{d} s</text>')
    for i, (label, series) in enumerate(lines.items()):
        colour = COLOURS[i % len(COLOURS)]
        series = sorted(p for p in series if p[0] > 0 and p[1] > 0)
        path = " ".join(f"{'M' if j == 0 else 'L'}{X(n):.1f},{Y(t):.1f}" for j, (n, t) in enumerate(series))
        out.append(f'<path d="{path}" fill="none" stroke="{colour}" stroke-width="1.5"/>')
        out += [f'<circle cx="{X(n):.1f}" cy="{Y(t):.1f}" r="2.5" fill="{colour}"/>' for n, t in series]
        out.append(f'<text x="{x0 + PAD_L + 6}" y="{PAD_T + 14 + 12 * i}" font-size="10" fill="{colour}">{label}</text>')
    out.append(f'<text x="{x0 + PAD_L + pw / 2:.1f}" y="{H - 6}" text-anchor="middle" font-size="10">size</text>')
    return out


def write_panels(path, panels):
    body = []
    for i, (title, lines) in enumerate(panels.items()):
        body += _panel(i * W, title, lines)
    svg = (f'<svg xmlns="http://www.w3.org/2000/svg" width="{W * len(panels)}" height="{H}" '
           f'font-family="sans-serif">\n<rect width="100%" height="100%" fill="white"/>\n' + "\n".join(body) + "\n</svg>\n")
    with open(path, "w") as f:
        f.write(svg)
