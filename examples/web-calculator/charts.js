// The page's two charts, drawn as SVG at the width they are shown at (one SVG unit per
// CSS pixel, so text stays legible on a phone): the profile of the chosen model with the
// point marked, and a flight's dynamic pressure and Mach number against time with the
// maximum q marked (and, when the file gives the velocity's direction, q-alpha in a
// panel of its own below, on its own axis). Colours: the page's own palette (style.css, --series-1 to -3: a deep
// blue, an amber and a charcoal, told apart by lightness as well as hue, so that they
// stay distinct under the common colour-vision deficiencies); the lines also differ in
// dash, and each panel is titled, so colour is never the only cue.

import { quantity, shownValue, unitOf, show, pretty, heading } from "./page.js";
import { largest } from "./thin.js";

const SVG = "http://www.w3.org/2000/svg";

function el(name, attributes, text) {
  const node = document.createElementNS(SVG, name);
  for (const [k, v] of Object.entries(attributes)) node.setAttribute(k, v);
  if (text !== undefined) node.textContent = text;
  return node;
}

/** A step of 1, 2 or 5 times a power of ten, at least `raw`. */
function niceStep(raw) {
  if (!(raw > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (m * p >= raw * (1 - 1e-9)) return m * p;
  return 10 * p;
}

/** The ticks from `low` to `high` at about `count` nice steps. */
function ticks(low, high, count) {
  const step = niceStep((high - low) / count);
  const out = [];
  for (let i = Math.ceil(low / step - 1e-9); i * step <= high + step * 1e-9; i++) out.push(i * step);
  return out;
}

/** An axis from 0 to a round top at least `max`, in about `count` steps: `{top, ticks}`. */
function axis(max, count) {
  const step = niceStep(max / count);
  const top = Math.max(1, Math.ceil(max / step - 1e-9)) * step;
  const out = [];
  for (let i = 0; i * step <= top * (1 + 1e-9); i++) out.push(i * step);
  return { top, ticks: out };
}

/** The width a chart is shown at, CSS px (the last known width while its view is hidden). */
function widthOf(svg) {
  const width = Math.round(svg.getBoundingClientRect().width);
  if (width > 0) svg.dataset.width = String(width);
  return Math.max(300, Number(svg.dataset.width ?? 900));
}

/** Clears a chart to its title and sets its drawing size. */
function reset(svg, width, height) {
  const title = svg.querySelector("title");
  svg.replaceChildren(title);
  svg.setAttribute("viewBox", `0 0 ${width} ${height}`);
}

// --- the profile -----------------------------------------------------------------------

const PANELS = [
  ["temperature", false, "s2"],
  ["pressure", true, "s1"],
  ["density", true, "s3"],
];

/**
 * Draws the profile `profile` (`{altitudesM, columns}` from point.js) with the point of
 * state `s` marked: three panels side by side, or one above another on a narrow screen.
 */
export function drawProfile(svg, profile, s) {
  const width = widthOf(svg);
  const narrow = width < 640;
  const [x0, gap, right, top, plotHeight, below] = narrow ? [54, 0, 14, 30, 190, 40] : [70, 28, 14, 30, 290, 30];
  const panelWidth = narrow ? width - x0 - right : (width - x0 - right - 2 * gap) / 3;
  const block = top + plotHeight + below;
  reset(svg, width, narrow ? 3 * block : block);
  if (!profile) return;
  const { altitudesM, columns } = profile;
  const bottom = altitudesM[0];
  const highest = altitudesM[altitudesM.length - 1];
  const z = s.geometricAltitudeM;
  const altitudeUnit = unitOf("geometric_altitude");
  const axisLabel = altitudeUnit === "m" ? "altitude, km" : `altitude, thousand ${altitudeUnit}`;
  const shownBottom = shownValue("geometric_altitude", bottom);
  const shownTop = shownValue("geometric_altitude", highest);
  PANELS.forEach(([name, log, series], i) => {
    const key = quantity(name).key;
    const left = narrow ? x0 : x0 + i * (panelWidth + gap);
    const y0 = narrow ? i * block + top : top;
    const yOf = (alt) => y0 + plotHeight - ((alt - bottom) / (highest - bottom)) * plotHeight;
    const yShown = (t) => y0 + plotHeight - ((t - shownBottom) / (shownTop - shownBottom)) * plotHeight;
    if (narrow || i === 0) {
      for (const t of ticks(shownBottom, shownTop, narrow ? 4 : 6)) {
        svg.append(el("text", { x: left - 8, y: yShown(t) + 4, "text-anchor": "end" }, show(t / 1000)));
      }
      const mid = y0 + plotHeight / 2;
      svg.append(el("text", { x: 14, y: mid, transform: `rotate(-90 14 ${mid})`, "text-anchor": "middle" }, axisLabel));
    }
    for (const t of ticks(shownBottom, shownTop, narrow ? 4 : 6)) {
      svg.append(el("line", { x1: left, x2: left + panelWidth, y1: yShown(t), y2: yShown(t), class: "grid" }));
    }
    const values = columns[key];
    const f = log ? Math.log10 : (v) => v;
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of values) {
      lo = Math.min(lo, f(v));
      hi = Math.max(hi, f(v));
    }
    if (hi - lo < 1e-12) {
      lo -= 1;
      hi += 1;
    }
    const xOf = (v) => left + ((f(v) - lo) / (hi - lo)) * panelWidth;
    svg.append(el("rect", { x: left, y: y0, width: panelWidth, height: plotHeight, class: "frame" }));
    const points = Array.from(values, (v, j) => `${xOf(v).toFixed(1)},${yOf(altitudesM[j]).toFixed(1)}`).join(" ");
    svg.append(el("polyline", { points, class: `curve ${series}` }));
    const title = `${heading(name)}${log ? " (log scale)" : ""}, ${pretty(unitOf(name))}`;
    svg.append(el("text", { x: left + panelWidth / 2, y: y0 - 9, "text-anchor": "middle", class: "panel-title" }, title));
    const lowValue = log ? 10 ** lo : lo;
    const highValue = log ? 10 ** hi : hi;
    svg.append(el("text", { x: left, y: y0 + plotHeight + 16 }, show(shownValue(name, lowValue))));
    svg.append(el("text", { x: left + panelWidth, y: y0 + plotHeight + 16, "text-anchor": "end" }, show(shownValue(name, highValue))));
    // The current point, where the model defines the quantity there.
    if (s[key] === null || s[key] === undefined) return;
    const cx = xOf(s[key]);
    const cy = yOf(z);
    svg.append(el("line", { x1: left, x2: left + panelWidth, y1: cy, y2: cy, class: `guide ${series}` }));
    svg.append(el("circle", { cx, cy, r: 6, class: `dot ${series}`, "data-marker": key }));
  });
}

// --- the flight ------------------------------------------------------------------------

/** The drawing box of the flight chart at `width`: [left, right margin, top, plot height, below]. */
function flightBox(width) {
  return width < 640 ? [56, 44, 40, 220, 40] : [80, 64, 40, 290, 40];
}

/** The q-alpha panel below the flight chart: [gap above it, its plot height]. */
function qAlphaBox(width) {
  return width < 640 ? [44, 130] : [48, 160];
}

/** How many pixel columns the flight chart's plot has at its current width. */
export function flightColumns(svg) {
  const width = widthOf(svg);
  const [x0, right] = flightBox(width);
  return Math.max(100, Math.round(width - x0 - right));
}

/** A thinned series (thin.js) as an SVG path, broken where a value is NaN. */
function pathOf({ times, values, count }, xOf, yOf) {
  let d = "";
  let pen = "M";
  for (let i = 0; i < count; i++) {
    if (Number.isNaN(values[i])) {
      pen = "M";
      continue;
    }
    d += `${pen}${xOf(times[i]).toFixed(1)},${yOf(values[i]).toFixed(1)}`;
    pen = "L";
  }
  return d;
}

/**
 * Draws a scanned flight: `flight` is the worker's answer (`{summary, chart: {t0, t1, q,
 * mach, highestQ, highestMach}}`), or null for an empty chart.
 */
export function drawFlight(svg, flight) {
  const width = widthOf(svg);
  const [x0, right, y0, height, below] = flightBox(width);
  const plotWidth = width - x0 - right;
  const withQAlpha = Boolean(flight?.chart?.qAlpha) && flight.summary.samples > 0;
  const [qaGap, qaHeight] = qAlphaBox(width);
  reset(svg, width, y0 + height + below + (withQAlpha ? qaGap + qaHeight + below : 0));
  if (!flight || flight.summary.samples === 0) {
    const hint = flight ? "The file names its columns but holds no samples." : "Paste samples, upload a file or load the demo flight to see its loads here.";
    const short = flight ? "No samples." : "No flight yet.";
    svg.append(el("text", { x: width / 2, y: y0 + height / 2, "text-anchor": "middle" }, width < 640 ? short : hint));
    return;
  }
  const { chart, summary } = flight;
  // A single sample spans no time: a second either side of it gives the axis a width.
  const [t0, t1] = chart.t1 > chart.t0 ? [chart.t0, chart.t1] : [chart.t0 - 1, chart.t0 + 1];
  const xOf = (t) => x0 + ((t - t0) / (t1 - t0)) * plotWidth;
  const peak = summary.maxDynamicPressure;
  const qMax = Math.max(peak?.dynamicPressurePa ?? 0, chart.highestQ);
  const machMax = chart.highestMach > 0 ? chart.highestMach : 1;
  // Scales to a round top in the units shown (a flight at rest gets a top of 1).
  const { top: qTop, ticks: qTicks } = axis(qMax > 0 ? shownValue("dynamic_pressure", qMax) : 1, 5);
  const { top: machTop, ticks: machTicks } = axis(machMax, 5);
  const yQ = (q) => y0 + height - (shownValue("dynamic_pressure", q) / qTop) * height;
  const yM = (m) => y0 + height - (m / machTop) * height;
  const pLabel = pretty(unitOf("dynamic_pressure"));
  for (const t of qTicks) {
    const y = y0 + height - (t / qTop) * height;
    svg.append(el("line", { x1: x0, x2: x0 + plotWidth, y1: y, y2: y, class: "grid" }));
    svg.append(el("text", { x: x0 - 8, y: y + 4, "text-anchor": "end" }, show(t)));
  }
  for (const m of machTicks) {
    svg.append(el("text", { x: x0 + plotWidth + 8, y: yM(m) + 4 }, show(m)));
  }
  for (const t of ticks(t0, t1, width < 640 ? 4 : 8)) {
    const x = xOf(t);
    svg.append(el("line", { x1: x, x2: x, y1: y0 + height, y2: y0 + height + 5, class: "frame" }));
    svg.append(el("text", { x, y: y0 + height + 18, "text-anchor": "middle" }, show(t)));
  }
  svg.append(el("text", { x: x0 + plotWidth / 2, y: y0 + height + 34, "text-anchor": "middle" }, "time, s"));
  svg.append(el("rect", { x: x0, y: y0, width: plotWidth, height, class: "frame" }));
  // Axis titles beside the axes where there is room; on a narrow screen the legend
  // carries the unit instead.
  const narrow = width < 640;
  if (!narrow) {
    const mid = y0 + height / 2;
    svg.append(el("text", { x: 14, y: mid, transform: `rotate(-90 14 ${mid})`, "text-anchor": "middle" }, `dynamic pressure, ${pLabel}`));
    const machX = width - 10;
    svg.append(el("text", { x: machX, y: mid, transform: `rotate(90 ${machX} ${mid})`, "text-anchor": "middle" }, "Mach number"));
  }
  // Legend, above the plot so that it never hides a curve.
  const legendX = narrow ? 12 : x0;
  svg.append(el("line", { x1: legendX, x2: legendX + 26, y1: 16, y2: 16, class: "curve s1" }));
  svg.append(el("text", { x: legendX + 32, y: 20 }, narrow ? `dynamic pressure, ${pLabel} (left)` : "dynamic pressure"));
  const machLegend = narrow ? width - 120 : x0 + 180;
  svg.append(el("line", { x1: machLegend, x2: machLegend + 26, y1: 16, y2: 16, class: "curve s2 dashed" }));
  svg.append(el("text", { x: machLegend + 32, y: 20 }, narrow ? "Mach (right)" : "Mach number"));
  svg.append(el("path", { d: pathOf(chart.mach, xOf, yM), class: "curve s2 dashed", "data-series": "mach", "data-points": chart.mach.count }));
  svg.append(
    el("path", {
      d: pathOf(chart.q, xOf, yQ),
      class: "curve s1",
      "data-series": "dynamicPressurePa",
      "data-points": chart.q.count,
      // The highest point drawn: the flight's highest sample when the thinning kept it.
      "data-highest": largest(chart.q.values.subarray(0, chart.q.count)),
    }),
  );
  if (withQAlpha) drawQAlpha(svg, chart, { x0, plotWidth, xOf, t0, t1, top: y0 + height + below + qaGap, height: qaHeight, narrow });
  if (!peak) return;
  const px = xOf(peak.timeS);
  const py = yQ(peak.dynamicPressurePa);
  svg.append(el("polygon", { points: `${px},${py - 8} ${px + 8},${py} ${px},${py + 8} ${px - 8},${py}`, class: "peak", "data-marker": "max-q" }));
  // The label goes where it fits inside the plot: right of the mark, else left of it,
  // else shortened (about 6.5 px per character of 12 px text).
  const full = `max q ${show(shownValue("dynamic_pressure", peak.dynamicPressurePa))} ${pLabel} at ${show(peak.timeS)} s`;
  const fits = (text, room) => text.length * 6.5 <= room;
  const roomRight = x0 + plotWidth - (px + 12);
  const roomLeft = px - 12 - x0;
  const label = fits(full, Math.max(roomRight, roomLeft)) ? full : "max q";
  const onLeft = !fits(label, roomRight) && roomLeft > roomRight;
  const ly = Math.max(y0 + 14, py - 10);
  svg.append(el("text", { x: onLeft ? px - 12 : px + 12, y: ly, "text-anchor": onLeft ? "end" : "start", class: "peak-label" }, label));
}

/**
 * The q-alpha panel under the flight chart, on its own axis from 0 (q-alpha is never
 * negative), sharing the time axis above; drawn from the same per-pixel thinning as q.
 */
function drawQAlpha(svg, chart, { x0, plotWidth, xOf, t0, t1, top, height, narrow }) {
  const label = pretty(unitOf("q_alpha"));
  const highest = chart.highestQAlpha > 0 ? shownValue("q_alpha", chart.highestQAlpha) : 1;
  const { top: qaTop, ticks: qaTicks } = axis(highest, 5);
  const y = (v) => top + height - (shownValue("q_alpha", v) / qaTop) * height;
  for (const t of qaTicks) {
    const ty = top + height - (t / qaTop) * height;
    svg.append(el("line", { x1: x0, x2: x0 + plotWidth, y1: ty, y2: ty, class: "grid" }));
    svg.append(el("text", { x: x0 - 8, y: ty + 4, "text-anchor": "end" }, show(t)));
  }
  for (const t of ticks(t0, t1, narrow ? 4 : 8)) {
    const x = xOf(t);
    svg.append(el("line", { x1: x, x2: x, y1: top + height, y2: top + height + 5, class: "frame" }));
    svg.append(el("text", { x, y: top + height + 18, "text-anchor": "middle" }, show(t)));
  }
  svg.append(el("text", { x: x0 + plotWidth / 2, y: top + height + 34, "text-anchor": "middle" }, "time, s"));
  svg.append(el("rect", { x: x0, y: top, width: plotWidth, height, class: "frame" }));
  // The panel's title names the quantity and its unit, above it at the left.
  svg.append(el("line", { x1: narrow ? 12 : x0, x2: (narrow ? 12 : x0) + 26, y1: top - 14, y2: top - 14, class: "curve s3" }));
  svg.append(el("text", { x: (narrow ? 12 : x0) + 32, y: top - 10, class: "panel-title" }, `${quantity("q_alpha").label}, ${label}`));
  svg.append(
    el("path", {
      d: pathOf(chart.qAlpha, xOf, y),
      class: "curve s3",
      "data-series": "qAlphaPaDeg",
      "data-points": chart.qAlpha.count,
      "data-highest": largest(chart.qAlpha.values.subarray(0, chart.qAlpha.count)),
    }),
  );
}
