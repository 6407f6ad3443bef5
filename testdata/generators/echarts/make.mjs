// Draws the ECharts charts of Standout's generator corpus, rendered to SVG
// on the server (ECharts' SSR mode: no DOM, no browser).
//
//     cd testdata/generators/echarts && npm ci && node make.mjs
//
// Every chart plots invented data in colours of our own. The truth written
// beside the SVGs (truth.json) is derived from the data plotted, never read
// back from the SVG: the discrete marks by type, the set of their fills,
// the number of legend entries, whether a colour bar was drawn, and, where
// one mark is highlighted (or one group), its fill.
import * as echarts from "echarts";
import { writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const out = dirname(fileURLToPath(import.meta.url));
const [SLATE, BRICK, MOSS, OCHRE, PLUM, TEAL] = ["#3b6e8f", "#c8553d", "#6a994e", "#e0a458", "#8e5572", "#4f8a8b"];
const [ASH, FLARE] = ["#a7a9ac", "#d1495b"];
const truth = {};

// A small seeded generator (mulberry32), so the data are the same on
// every run.
function rng(seed) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = rng(20261202);
const between = (a, b) => a + (b - a) * rand();
const int = (a, b) => Math.floor(between(a, b + 1));

function save(name, option, marks, fills, legend = 0, highlight = "", colourBar = false) {
  const chart = echarts.init(null, null, { renderer: "svg", ssr: true, width: 640, height: 400 });
  chart.setOption({ animation: false, ...option });
  writeFileSync(join(out, name), chart.renderToSVGString() + "\n");
  chart.dispose();
  const t = { marks_by_type: marks, fills_resolved: [...new Set(fills.map((c) => c.toLowerCase()))].sort(), legend_entries: legend };
  if (highlight) t.highlight = highlight;
  if (colourBar) t.colour_bar = true;
  truth[name] = t;
}

// Invented daily footfall at a market; one day highlighted.
function barHighlight() {
  const days = Array.from({ length: 14 }, (_, i) => `d${i + 1}`);
  const colours = days.map((_, i) => (i === 10 ? FLARE : ASH));
  save("bar-highlight.svg", {
    xAxis: { type: "category", data: days },
    yAxis: { type: "value" },
    series: [{ type: "bar", data: days.map((_, i) => ({ value: int(20, 90), itemStyle: { color: colours[i] } })) }],
  }, { bar: days.length }, colours, 0, FLARE);
}

// Two invented bakeries' loaves per month, with a legend.
function groupedBars() {
  const months = ["Jan", "Feb", "Mar", "Apr", "May", "Jun"];
  save("grouped-bars.svg", {
    legend: { data: ["east bakery", "west bakery"] },
    xAxis: { type: "category", data: months },
    yAxis: { type: "value" },
    series: [
      { name: "east bakery", type: "bar", color: SLATE, data: months.map(() => int(50, 200)) },
      { name: "west bakery", type: "bar", color: OCHRE, data: months.map(() => int(50, 200)) },
    ],
  }, { bar: 12 }, [SLATE, OCHRE], 2);
}

// Three invented tide gauges, lines with symbols and a legend.
function lineLegend() {
  const hours = Array.from({ length: 10 }, (_, i) => `${i * 2}h`);
  const series = [["harbour", TEAL], ["estuary", BRICK], ["pier", PLUM]].map(([name, color]) => ({
    name, type: "line", color, symbol: "circle", symbolSize: 6, data: hours.map(() => between(0, 5).toFixed(2)),
  }));
  save("line-legend.svg", {
    legend: {},
    xAxis: { type: "category", data: hours },
    yAxis: { type: "value" },
    series,
  }, { line: 3, dot: 30 }, [TEAL, BRICK, PLUM], 3);
}

// 80 invented allotments by size and yield, one highlighted.
function scatterHighlight() {
  const data = Array.from({ length: 80 }, (_, i) => ({
    value: [between(0, 100), between(0, 50)], itemStyle: { color: i === 23 ? FLARE : ASH },
  }));
  save("scatter-highlight.svg", {
    xAxis: { type: "value" }, yAxis: { type: "value" },
    series: [{ type: "scatter", symbolSize: 9, data }],
  }, { dot: 80 }, [ASH, FLARE], 0, FLARE);
}

// 3,000 invented weather-balloon readings drawn in ECharts' large mode:
// one compound path, a subpath per point.
function largeScatter() {
  const data = Array.from({ length: 3000 }, () => {
    const x = between(-3, 3);
    return [x, x * 0.5 + between(-1, 1)];
  });
  save("large-scatter.svg", {
    xAxis: { type: "value" }, yAxis: { type: "value" },
    series: [{ type: "scatter", large: true, largeThreshold: 500, symbolSize: 4, color: MOSS, data }],
  }, { dot: 3000 }, [MOSS]);
}

// Shares of an invented library's loans by section.
function pie() {
  const colours = [SLATE, BRICK, MOSS, OCHRE, PLUM];
  save("pie.svg", {
    series: [{ type: "pie", radius: "60%", data: ["maps", "poetry", "atlases", "comics", "cookery"].map((name, i) => ({ name, value: int(10, 60), itemStyle: { color: colours[i] } })) }],
  }, { arc: 5 }, colours);
}

function donutLegend() {
  const colours = [TEAL, OCHRE, PLUM, SLATE];
  const names = ["walk", "cycle", "tram", "ferry"];
  save("donut-legend.svg", {
    legend: { bottom: 0 },
    series: [{ type: "pie", radius: ["40%", "65%"], label: { show: false }, data: names.map((name, i) => ({ name, value: int(10, 60), itemStyle: { color: colours[i] } })) }],
  }, { arc: 4 }, colours, 4);
}

// An invented week of hourly tram loads, with a continuous colour bar.
function heatmap() {
  const [days, hours] = [7, 12];
  const data = [];
  for (let d = 0; d < days; d++) for (let h = 0; h < hours; h++) data.push([h, d, int(0, 10)]);
  // Colours of each value on the visual map's two-colour ramp; the values
  // are integers 0..10, so the fills are the ramp at those steps.
  const [lo, hi] = [[0xf4, 0xef, 0xe1], [0x7a, 0x2e, 0x3b]];
  const fills = [...new Set(data.map((d) => d[2]))].map((v) => {
    const c = lo.map((a, k) => Math.round(a + ((hi[k] - a) * v) / 10));
    return `rgba(${c.join(",")},1)`;
  });
  save("heatmap-colourbar.svg", {
    xAxis: { type: "category", data: Array.from({ length: hours }, (_, i) => `${i}h`) },
    yAxis: { type: "category", data: ["Mo", "Tu", "We", "Th", "Fr", "Sa", "Su"] },
    visualMap: { min: 0, max: 10, calculable: true, orient: "horizontal", left: "center", bottom: 0, inRange: { color: ["#f4efe1", "#7a2e3b"] } },
    grid: { bottom: 90 },
    series: [{ type: "heatmap", data }],
  }, { cell: days * hours }, fills.map(toHex), 0, "", true);
}

function toHex(rgba) {
  const [r, g, b] = rgba.match(/\d+/g).map(Number);
  return "#" + [r, g, b].map((v) => v.toString(16).padStart(2, "0")).join("");
}

barHighlight();
groupedBars();
lineLegend();
scatterHighlight();
largeScatter();
pie();
donutLegend();
heatmap();
writeFileSync(join(out, "truth.json"), JSON.stringify({ generator: `echarts ${echarts.version}`, charts: truth }, null, 1) + "\n");
