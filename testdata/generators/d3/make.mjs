// Draws the D3 charts of Standout's generator corpus: chart code of the
// kind a graphics desk writes by hand, run under jsdom as a DOM shim.
//
//     cd testdata/generators/d3 && npm ci && node make.mjs
//
// Every chart plots invented data in colours of our own. The truth written
// beside the SVGs (truth.json) is derived from the data plotted, never read
// back from the SVG: the discrete marks by type, the set of their fills,
// the number of legend entries, whether a colour bar was drawn, and, where
// one mark is highlighted (or one group), its fill.
import * as d3 from "d3";
import { JSDOM } from "jsdom";
import { writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const out = dirname(fileURLToPath(import.meta.url));
const [SLATE, BRICK, MOSS, OCHRE, PLUM, TEAL] = ["#3b6e8f", "#c8553d", "#6a994e", "#e0a458", "#8e5572", "#4f8a8b"];
const [ASH, FLARE, INK] = ["#a7a9ac", "#d1495b", "#333333"];
const truth = {};
const rand = d3.randomLcg(0.20261202);
const between = (a, b) => a + (b - a) * rand();
const [W, H] = [640, 400];
const margin = { top: 20, right: 150, bottom: 40, left: 50 };

function svgRoot() {
  const dom = new JSDOM("<!DOCTYPE html><body></body>");
  return d3.select(dom.window.document.body).append("svg")
    .attr("xmlns", "http://www.w3.org/2000/svg")
    .attr("width", W).attr("height", H).attr("viewBox", `0 0 ${W} ${H}`)
    .style("font-family", "sans-serif").style("font-size", "11px");
}

function save(name, svg, marks, fills, legend = 0, highlight = "", colourBar = false) {
  writeFileSync(join(out, name), svg.node().outerHTML + "\n");
  const t = { marks_by_type: marks, fills_resolved: [...new Set(fills)].sort(), legend_entries: legend };
  if (highlight) t.highlight = highlight;
  if (colourBar) t.colour_bar = true;
  truth[name] = t;
}

// Axes as a desk draws them: two <line> spines meeting at the origin, and
// tick labels without tick marks.
function lAxes(svg, x, y) {
  const g = svg.append("g").attr("class", "frame").attr("stroke", INK);
  g.append("line").attr("x1", x.range()[0]).attr("x2", x.range()[1]).attr("y1", y.range()[0]).attr("y2", y.range()[0]);
  g.append("line").attr("x1", x.range()[0]).attr("x2", x.range()[0]).attr("y1", y.range()[0]).attr("y2", y.range()[1]);
  const t = svg.append("g").attr("fill", INK);
  for (const v of x.ticks(5)) t.append("text").attr("x", x(v)).attr("y", y.range()[0] + 16).attr("text-anchor", "middle").text(v);
  for (const v of y.ticks(5)) t.append("text").attr("x", x.range()[0] - 6).attr("y", y(v) + 4).attr("text-anchor", "end").text(v);
}

// A legend from plain shapes: a rounded frame, then per entry a swatch
// (a square, or a line with a dot on it) and a label.
function legend(svg, entries, icon) {
  const g = svg.append("g").attr("transform", `translate(${W - margin.right + 20},${margin.top})`);
  g.append("rect").attr("width", 110).attr("height", 12 + entries.length * 20).attr("rx", 6)
    .attr("fill", "#ffffff").attr("stroke", "#bbbbbb");
  entries.forEach(([label, colour], i) => {
    const row = g.append("g").attr("transform", `translate(10,${16 + i * 20})`);
    if (icon === "square") row.append("rect").attr("y", -6).attr("width", 12).attr("height", 12).attr("fill", colour);
    else {
      row.append("line").attr("x1", 0).attr("x2", 18).attr("stroke", colour).attr("stroke-width", 2);
      row.append("circle").attr("cx", 9).attr("r", 3.5).attr("fill", colour);
    }
    row.append("text").attr("x", 26).attr("y", 4).attr("fill", INK).text(label);
  });
}

// Invented wells by depth and yield on L-shaped axes, some flagged in red:
// 100 with 11 flagged, and 120 with one.
function wellScatter(name, n, flagged) {
  const svg = svgRoot();
  const x = d3.scaleLinear([0, 100], [margin.left, W - margin.right]);
  const y = d3.scaleLinear([0, 50], [H - margin.bottom, margin.top]);
  lAxes(svg, x, y);
  const colours = d3.range(n).map((i) => (flagged(i) ? FLARE : ASH));
  svg.append("g").selectAll("circle").data(d3.range(n)).join("circle")
    .attr("cx", () => x(between(2, 98))).attr("cy", () => y(between(2, 48))).attr("r", 4).attr("fill", (i) => colours[i]);
  save(name, svg, { dot: n }, colours, 0, FLARE);
}

// Three invented river gauges, lines with dots, and a legend of
// line-plus-dot icons in a rounded frame.
function linesLegend() {
  const svg = svgRoot();
  const x = d3.scaleLinear([0, 11], [margin.left, W - margin.right]);
  const y = d3.scaleLinear([0, 10], [H - margin.bottom, margin.top]);
  lAxes(svg, x, y);
  const series = [["upper ford", TEAL], ["mill weir", BRICK], ["sea lock", PLUM]];
  for (const [, colour] of series) {
    const vals = d3.range(12).map(() => between(1, 9));
    svg.append("path").attr("d", d3.line((v, i) => x(i), (v) => y(v))(vals)).attr("fill", "none").attr("stroke", colour).attr("stroke-width", 2);
    svg.append("g").selectAll("circle").data(vals).join("circle").attr("cx", (v, i) => x(i)).attr("cy", (v) => y(v)).attr("r", 3).attr("fill", colour);
  }
  legend(svg, series, "line");
  save("lines-legend.svg", svg, { line: 3, dot: 36 }, series.map((s) => s[1]), 3);
}

// Invented stalls' takings as bars, with a legend of squares in a frame.
function barsLegend() {
  const svg = svgRoot();
  const kinds = [["fruit", MOSS], ["bread", OCHRE], ["fish", SLATE]];
  const x = d3.scaleBand(d3.range(9), [margin.left, W - margin.right]).padding(0.2);
  const y = d3.scaleLinear([0, 100], [H - margin.bottom, margin.top]);
  lAxes(svg, d3.scaleLinear([0, 9], [margin.left, W - margin.right]), y);
  const colours = d3.range(9).map((i) => kinds[i % 3][1]);
  svg.append("g").selectAll("rect").data(d3.range(9)).join("rect")
    .attr("x", (i) => x(i)).attr("width", x.bandwidth())
    .attr("y", () => y(between(20, 95))).attr("height", function () { return H - margin.bottom - this.getAttribute("y"); })
    .attr("fill", (i) => colours[i]);
  legend(svg, kinds, "square");
  save("bars-legend.svg", svg, { bar: 9 }, colours, 3);
}

// Invented bubbles exported as a desktop tool draws circles: one open
// elliptical arc on a unit circle, placed and scaled by matrix(...).
function bubbles() {
  const svg = svgRoot();
  const x = d3.scaleLinear([0, 10], [margin.left, W - margin.right]);
  const y = d3.scaleLinear([0, 10], [H - margin.bottom, margin.top]);
  lAxes(svg, x, y);
  const colours = d3.range(14).map((i) => (i === 6 ? FLARE : ASH));
  const g = svg.append("g");
  for (let i = 0; i < 14; i++) {
    const [cx, cy, r] = [x(0.5 + i * 0.68), y(between(2, 8)), between(8, 22)];
    g.append("path").attr("d", "M1,0A1,1,0,1,1,0.99995,-0.01")
      .attr("transform", `matrix(${r},0,0,${r},${cx.toFixed(2)},${cy.toFixed(2)})`)
      .attr("fill", colours[i]).attr("fill-opacity", 1).attr("stroke", "#ffffff").attr("stroke-width", 0.1);
  }
  save("bubbles-arc.svg", svg, { dot: 14 }, colours, 0, FLARE);
}

// An invented heat map of beach visits with a colour bar drawn as a ramp
// of small rects, an outline and two range handles.
function heatmapBar() {
  const svg = svgRoot();
  const [cols, rows] = [10, 6];
  const colour = d3.interpolateRgb("#eef3e8", "#2f5d50");
  const cell = 36;
  const fills = [];
  const g = svg.append("g").attr("transform", `translate(${margin.left},${margin.top})`);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const v = Math.round(between(0, 10)) / 10;
      const fill = d3.color(colour(v)).formatHex();
      fills.push(fill);
      g.append("rect").attr("x", c * cell).attr("y", r * cell).attr("width", cell - 1).attr("height", cell - 1).attr("fill", fill);
    }
  }
  const bar = svg.append("g").attr("transform", `translate(${W - 110},${margin.top})`);
  for (let k = 0; k < 24; k++) {
    bar.append("rect").attr("x", 0).attr("y", k * 9).attr("width", 16).attr("height", 9).attr("fill", d3.color(colour(1 - k / 23)).formatHex());
  }
  bar.append("rect").attr("x", 0).attr("y", 0).attr("width", 16).attr("height", 216).attr("fill", "none").attr("stroke", INK);
  for (const yy of [0, 216]) bar.append("path").attr("d", `M-6,${yy - 4}L0,${yy}L-6,${yy + 4}Z`).attr("fill", INK);
  for (const [k, label] of [[0, "10"], [216, "0"]]) bar.append("text").attr("x", 22).attr("y", k + 4).attr("fill", INK).text(label);
  save("heatmap-colourbar.svg", svg, { cell: rows * cols }, fills, 0, "", true);
}

// An invented budget as a donut (d3.arc: elliptical-arc commands) with a
// legend of squares in a frame.
function donutLegend() {
  const svg = svgRoot();
  const parts = [["rent", SLATE], ["food", MOSS], ["fares", OCHRE], ["books", PLUM], ["other", ASH]];
  const pie = d3.pie().sort(null)(parts.map(() => between(5, 30)));
  const arc = d3.arc().innerRadius(70).outerRadius(140);
  svg.append("g").attr("transform", `translate(${margin.left + 160},${H / 2})`).selectAll("path").data(pie).join("path")
    .attr("d", arc).attr("fill", (d, i) => parts[i][1]).attr("stroke", "#ffffff");
  legend(svg, parts, "square");
  save("donut-legend.svg", svg, { arc: parts.length }, parts.map((p) => p[1]), parts.length);
}

// Invented monthly ferry crossings as columns with rounded tops (paths of
// lines and arcs), one in its own colour, on D3's own axes: the line
// along each axis is a bracket with the outer ticks at its ends, and the
// value axis's ticks run across the plot as gridlines.
function barsD3Axes() {
  const svg = svgRoot();
  const months = d3.range(12);
  const x = d3.scaleBand(months, [margin.left, W - margin.right]).padding(0.25);
  const y = d3.scaleLinear([0, 100], [H - margin.bottom, margin.top]);
  svg.append("g").attr("transform", `translate(0,${H - margin.bottom})`).call(d3.axisBottom(x).tickFormat((m) => `m${m + 1}`));
  svg.append("g").attr("transform", `translate(${margin.left},0)`).call(d3.axisLeft(y).ticks(5).tickSizeInner(-(W - margin.left - margin.right)))
    .call((g) => g.selectAll(".tick line").attr("stroke", "#dddddd"));
  const colours = months.map((m) => (m === 7 ? FLARE : ASH));
  const r = 4;
  svg.append("g").selectAll("path").data(months).join("path")
    .attr("d", (m) => {
      const [x0, w, top, base] = [x(m), x.bandwidth(), y(between(25, 95)), y(0)];
      return `M${x0},${base}V${top + r}A${r},${r},0,0,1,${x0 + r},${top}H${x0 + w - r}A${r},${r},0,0,1,${x0 + w},${top + r}V${base}Z`;
    })
    .attr("fill", (m) => colours[m]);
  save("bars-d3axes.svg", svg, { bar: 12 }, colours, 0, FLARE);
}

// Invented tide readings zoomed to the morning: the plot area is clipped
// (a <clipPath> of one <rect>), and the readings outside the zoomed
// domain stay in the markup, drawn outside it; a hover line waits left of
// the plot, inside the clipped group. The truth counts the readings
// inside the domain.
function scatterZoomed() {
  const svg = svgRoot();
  const x = d3.scaleLinear([6, 12], [margin.left, W - margin.right]);
  const y = d3.scaleLinear([0, 4], [H - margin.bottom, margin.top]);
  svg.append("g").attr("transform", `translate(0,${H - margin.bottom})`).call(d3.axisBottom(x));
  svg.append("g").attr("transform", `translate(${margin.left},0)`).call(d3.axisLeft(y).ticks(4));
  svg.append("defs").append("clipPath").attr("id", "plot-area").append("rect")
    .attr("x", margin.left).attr("y", margin.top).attr("width", W - margin.left - margin.right).attr("height", H - margin.top - margin.bottom);
  const plot = svg.append("g").attr("clip-path", "url(#plot-area)");
  plot.append("line").attr("x1", margin.left - 10).attr("x2", margin.left - 10).attr("y1", margin.top).attr("y2", H - margin.bottom).attr("stroke", "#aaaaaa");
  const readings = d3.range(80).map((i) => [i * 0.25, between(0.5, 3.5)]);
  const inside = readings.filter(([h]) => h >= 6 && h <= 12);
  plot.append("g").attr("fill", SLATE).selectAll("circle").data(readings).join("circle")
    .attr("cx", ([h]) => x(h).toFixed(2)).attr("cy", ([, v]) => y(v).toFixed(2)).attr("r", 4);
  save("scatter-zoomed.svg", svg, { dot: inside.length }, inside.map(() => SLATE));
}

wellScatter("scatter-spines.svg", 100, (i) => i % 9 === 4);
wellScatter("scatter-one.svg", 120, (i) => i === 57);
linesLegend();
barsLegend();
bubbles();
heatmapBar();
donutLegend();
barsD3Axes();
scatterZoomed();
writeFileSync(join(out, "truth.json"), JSON.stringify({ generator: "d3 7.9.0 under jsdom 24.1.3", charts: truth }, null, 1) + "\n");
