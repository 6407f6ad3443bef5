"""Draws the matplotlib charts of Standout's generator corpus.

Run with Debian's python3 and python3-matplotlib (3.6):

    /usr/bin/python3 testdata/generators/matplotlib/make.py

Every chart plots invented data in colours of our own. The truth written
beside the SVGs (truth.json) is derived from the data plotted, never read
back from the SVG: the discrete marks by type, the set of their fills, the
number of legend entries, whether a colour bar was drawn, and, where one
mark is highlighted (or one group), its fill.
Text stays as glyph outlines (svg.fonttype "path", matplotlib's default),
the class of SVG this corpus exists to test.
"""
import json
import math
import os
import random

import matplotlib

matplotlib.use("svg")
import matplotlib.pyplot as plt  # noqa: E402
from matplotlib.colors import LinearSegmentedColormap, Normalize, to_hex  # noqa: E402

plt.rcParams["svg.hashsalt"] = "standout"
plt.rcParams["svg.fonttype"] = "path"
plt.rcParams["font.size"] = 10

OUT = os.path.dirname(os.path.abspath(__file__))
# Colours of our own.
SLATE, BRICK, MOSS, OCHRE, PLUM, TEAL = "#3b6e8f", "#c8553d", "#6a994e", "#e0a458", "#8e5572", "#4f8a8b"
ASH, FLARE = "#a7a9ac", "#d1495b"
truth = {}


def hexes(colours):
    return sorted({to_hex(c) for c in colours})


def save(fig, name, marks, fills, legend=0, highlight=None, colour_bar=False):
    fig.savefig(os.path.join(OUT, name), format="svg", metadata={"Date": None})
    plt.close(fig)
    t = {"marks_by_type": marks, "fills_resolved": hexes(fills), "legend_entries": legend}
    if highlight:
        t["highlight"] = to_hex(highlight)
    if colour_bar:
        t["colour_bar"] = True
    truth[name] = t


def bar_highlight(rng):
    # Weekly visits to an invented lighthouse museum; week 9 stands out.
    weeks = list(range(1, 13))
    visits = [rng.randint(40, 90) for _ in weeks]
    colours = [FLARE if w == 9 else ASH for w in weeks]
    fig, ax = plt.subplots(figsize=(6.4, 4))
    ax.bar(weeks, visits, color=colours)
    ax.set_xlabel("week")
    ax.set_ylabel("visitors")
    save(fig, "bar-highlight.svg", {"bar": len(weeks)}, colours, highlight=FLARE)


def scatter_highlight(rng):
    # 100 invented orchards, one far sweeter; L-shaped axes (top and right
    # spines hidden).
    xs = [rng.uniform(0, 10) for _ in range(100)]
    ys = [rng.uniform(0, 10) for _ in range(100)]
    colours = [ASH] * 100
    colours[37] = FLARE
    fig, ax = plt.subplots(figsize=(6, 4.5))
    ax.scatter(xs, ys, c=colours, s=30)
    ax.spines["top"].set_visible(False)
    ax.spines["right"].set_visible(False)
    save(fig, "scatter-highlight.svg", {"dot": 100}, colours, highlight=FLARE)


def scatter_legend(rng):
    # Three invented kinds of kite, by span and weight.
    fig, ax = plt.subplots(figsize=(6.4, 4.8))
    fills, n = [], 0
    for name, colour in (("box kite", SLATE), ("delta", BRICK), ("sled", MOSS)):
        k = rng.randint(15, 25)
        ax.scatter([rng.gauss(5, 2) for _ in range(k)], [rng.gauss(3, 1) for _ in range(k)], color=colour, s=25, label=name)
        fills.append(colour)
        n += k
    ax.legend()
    save(fig, "scatter-legend.svg", {"dot": n}, fills, legend=3)


def line_legend(rng):
    # Monthly rainfall at three invented hill stations, lines with dots.
    months = list(range(1, 13))
    fig, ax = plt.subplots(figsize=(6.4, 4))
    fills = []
    for name, colour in (("upper", TEAL), ("middle", OCHRE), ("lower", PLUM)):
        ax.plot(months, [rng.uniform(20, 120) for _ in months], color=colour, marker="o", label=name)
        fills.append(colour)
    ax.legend(loc="upper left")
    save(fig, "line-legend.svg", {"line": 3, "dot": 36}, fills, legend=3)


def grouped_bars(rng):
    # Invented ferry tickets per quarter on two routes.
    fig, ax = plt.subplots(figsize=(6.4, 4))
    qs = [0, 1, 2, 3]
    ax.bar([q - 0.2 for q in qs], [rng.randint(10, 50) for _ in qs], width=0.4, color=SLATE, label="north route")
    ax.bar([q + 0.2 for q in qs], [rng.randint(10, 50) for _ in qs], width=0.4, color=OCHRE, label="south route")
    ax.set_xticks(qs, ["Q1", "Q2", "Q3", "Q4"])
    ax.legend()
    save(fig, "grouped-bars.svg", {"bar": 8}, [SLATE, OCHRE], legend=2)


def pie(rng):
    # Shares of an invented co-op's harvest; wedges are cubic Béziers.
    parts = [rng.randint(5, 30) for _ in range(5)]
    colours = [SLATE, BRICK, MOSS, OCHRE, PLUM]
    fig, ax = plt.subplots(figsize=(4.8, 4.8))
    ax.pie(parts, colors=colours, labels=["pears", "plums", "quince", "figs", "sloes"])
    save(fig, "pie.svg", {"arc": 5}, colours)


def donut(rng):
    parts = [rng.randint(5, 30) for _ in range(4)]
    colours = [TEAL, OCHRE, PLUM, ASH]
    fig, ax = plt.subplots(figsize=(4.8, 4.8))
    ax.pie(parts, colors=colours, wedgeprops={"width": 0.4, "edgecolor": "white"})
    save(fig, "donut.svg", {"arc": 4}, colours)


def pie_highlight(rng):
    # One wedge of six in a strong colour, the rest in one pale colour.
    parts = [rng.randint(8, 20) for _ in range(6)]
    colours = ["#c9d6df"] * 6
    colours[2] = FLARE
    fig, ax = plt.subplots(figsize=(4.8, 4.8))
    ax.pie(parts, colors=colours, wedgeprops={"edgecolor": "white"})
    save(fig, "pie-highlight.svg", {"arc": 6}, colours, highlight=FLARE)


def heatmap(rng):
    # An invented week of hourly tram loads, with a colour bar. The colour
    # map runs between two colours of our own.
    cmap = LinearSegmentedColormap.from_list("standout", ["#f4efe1", "#7a2e3b"], N=256)
    rows, cols = 7, 12
    data = [[rng.uniform(0, 100) for _ in range(cols)] for _ in range(rows)]
    fig, ax = plt.subplots(figsize=(7, 4))
    mesh = ax.pcolormesh(data, cmap=cmap, vmin=0, vmax=100)
    fig.colorbar(mesh, ax=ax)
    norm = Normalize(0, 100)
    fills = [cmap(norm(v)) for row in data for v in row]
    save(fig, "heatmap-colourbar.svg", {"cell": rows * cols}, fills, colour_bar=True)


def dense_scatter(rng):
    # 1,500 invented sensor readings in one colour, 12 flagged in another.
    n = 1500
    xs = [rng.gauss(0, 1) for _ in range(n)]
    ys = [x * 0.6 + rng.gauss(0, 0.8) for x in xs]
    colours = [TEAL] * n
    for i in range(0, 120, 10):
        colours[i] = BRICK
    fig, ax = plt.subplots(figsize=(6.4, 4.8))
    ax.scatter(xs, ys, c=colours, s=8)
    save(fig, "dense-scatter.svg", {"dot": n}, colours)


def hbar_framed(rng):
    # Horizontal bars in a frame of all four spines.
    names = ["Alder", "Birch", "Cedar", "Elm", "Fir", "Hazel", "Larch"]
    vals = [rng.randint(3, 40) for _ in names]
    fig, ax = plt.subplots(figsize=(6.4, 4))
    ax.barh(names, vals, color=MOSS)
    save(fig, "hbar-framed.svg", {"bar": len(names)}, [MOSS])


def main():
    rng = random.Random(20261202)
    for make in (bar_highlight, scatter_highlight, scatter_legend, line_legend, grouped_bars,
                 pie, donut, pie_highlight, heatmap, dense_scatter, hbar_framed):
        make(rng)
    with open(os.path.join(OUT, "truth.json"), "w") as f:
        json.dump({"generator": "matplotlib " + matplotlib.__version__, "charts": truth}, f, indent=1, sort_keys=True)
        f.write("\n")


main()
