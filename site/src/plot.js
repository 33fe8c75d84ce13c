// @ts-check
// plot.js: small hand-drawn SVG charts for the copoly page (the buttons that save them are in
// download.js and figures.js).
//
// No plotting library: a chart is a few dozen SVG elements with presentation attributes (fill,
// stroke, font-*) and no style attributes, so it obeys the page's Content-Security-Policy, prints
// crisply and saves as a standalone SVG that looks the same outside the page.

/** @type {"http://www.w3.org/2000/svg"} */
const NS = "http://www.w3.org/2000/svg";
const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";
const INK = "#1f2933";
const MUTED = "#52606d";
const GRID = "#e4e7eb";
const TITLE_CHAR = 8.6; // estimated width in pixels of a 15 px bold title character
let clipCount = 0;

/** @typedef {"circle" | "square" | "diamond" | "triangle" | "triangle-down" | "cross"} Shape */

/**
 * @typedef {{type: "line", x: number[], y: number[], color: string, width?: number, dash?: string | null, role?: string}
 *   | {type: "bars", x0: number[], x1: number[], y: number[], color: string, stroke?: string}
 *   | {type: "band", y0: number, y1: number, color: string, opacity?: number}
 *   | {type: "vline", x: number, color: string, dash?: string, text?: string}
 *   | {type: "point", x: number, y: number, color: string, shape?: Shape, r?: number, text?: string, anchor?: "start" | "end"}
 *   | {type: "points", x: number[], y: number[], color: string, shape?: Shape, r?: number, hollow?: boolean}
 *   | {type: "segments", x0: number[], y0: number[], x1: number[], y1: number[], color: string, width?: number, dash?: string}
 *   | {type: "polygon", points: number[][], color: string, opacity?: number, stroke?: string, width?: number, role?: string}
 *   | {type: "hline", y: number, color: string, dash?: string}} Layer
 * One layer of a chart: a line, bars from y = 0, a horizontal band across the plot, a vertical
 * line with a label at the top, one marker with a label, markers without labels, line segments,
 * a closed filled outline, or a horizontal line across the plot.
 */

/**
 * @typedef {object} LegendEntry
 * @property {string} label
 * @property {string} color
 * @property {"line" | "box" | "point"} [kind]  default "line"
 * @property {string} [dash]
 * @property {number} [width]
 * @property {Shape} [shape]
 * @property {boolean} [hollow]
 * @property {number} [opacity]
 * @property {string} [stroke]
 */

/**
 * @typedef {object} Axis
 * @property {number} min
 * @property {number} max
 * @property {string} [label]
 * @property {number} [ticks]    about how many ticks
 * @property {boolean} [integer] whole numbers only
 * @property {(v: number) => string} [format]
 */

/**
 * @typedef {object} ChartSpec
 * @property {string} [title]
 * @property {number} [width]
 * @property {number} [height]
 * @property {Axis} x
 * @property {Axis} y
 * @property {Layer[]} [layers]
 * @property {LegendEntry[]} [legend]
 */

/**
 * el makes an SVG element with attributes; text (if given) is set with textContent.
 * @template {keyof SVGElementTagNameMap} K
 * @param {K} name
 * @param {Record<string, string | number | null | undefined>} [attrs]
 * @param {string} [text]
 * @returns {SVGElementTagNameMap[K]}
 */
function el(name, attrs, text) {
  const e = document.createElementNS(NS, name);
  for (const [k, v] of Object.entries(attrs || {})) {
    if (v !== undefined && v !== null) e.setAttribute(k, String(v));
  }
  if (text !== undefined) e.textContent = text;
  return e;
}

/**
 * wrap splits text into lines of at most about maxWidth pixels, estimating the width of a
 * character of the title font as charWidth.
 * @param {string} text @param {number} maxWidth @param {number} charWidth
 */
function wrap(text, maxWidth, charWidth) {
  const max = Math.max(10, Math.floor(maxWidth / charWidth));
  const lines = [];
  let line = "";
  for (const word of text.split(/\s+/)) {
    if (line && (line + " " + word).length > max) { lines.push(line); line = word; } else line = line ? line + " " + word : word;
  }
  if (line) lines.push(line);
  return lines;
}

/** titleHeight is the room above the plot for a title wrapped to width.
 * @param {string | undefined} text @param {number} width */
function titleHeight(text, width) {
  return text ? 40 + (wrap(text, width, TITLE_CHAR).length - 1) * 19 : 16;
}

/** title draws the title, wrapped to width, at the top.
 * @param {SVGElement} svg @param {string | undefined} text @param {number} x @param {number} width */
function title(svg, text, x, width) {
  if (!text) return;
  wrap(text, width, TITLE_CHAR).forEach((line, i) => {
    svg.append(el("text", { x, y: 22 + i * 19, "font-size": 15, "font-weight": 600, fill: INK }, line));
  });
}

/** niceStep is 1, 2 or 5 times a power of ten, near span/count. @param {number} span @param {number} count */
function niceStep(span, count) {
  const raw = span / Math.max(1, count);
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const m = raw / p;
  return (m < 1.5 ? 1 : m < 3 ? 2 : m < 7 ? 5 : 10) * p;
}

/**
 * ticks returns tick values in [min, max] and the decimals needed to print them.
 * @param {number} min @param {number} max @param {number} count
 * @returns {{values: number[], decimals: number}}
 */
function ticks(min, max, count) {
  if (!(max > min)) return { values: [min], decimals: 2 };
  const step = niceStep(max - min, count);
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const values = [];
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) {
    values.push(Number(v.toFixed(decimals + 2)));
  }
  return { values, decimals };
}

/**
 * range pads [lo, hi] of the finite values and keeps it inside [floor, ceil] when given.
 * @param {Iterable<number>} values
 * @param {{minSpan?: number, pad?: number, floor?: number, ceil?: number}} opts
 * @returns {[number, number]}
 */
export function range(values, opts) {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) {
    if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  }
  if (!Number.isFinite(lo)) { lo = 0; hi = 1; }
  let span = hi - lo;
  if (span < (opts.minSpan || 1e-6)) {
    const mid = (lo + hi) / 2, half = (opts.minSpan || 0.02) / 2;
    lo = mid - half; hi = mid + half; span = hi - lo;
  }
  lo -= span * (opts.pad ?? 0.08);
  hi += span * (opts.pad ?? 0.08);
  if (opts.floor !== undefined) lo = Math.max(lo, opts.floor);
  if (opts.ceil !== undefined) hi = Math.min(hi, opts.ceil);
  return [lo, hi];
}

/**
 * legend lays out legend entries left to right, wrapping, below the x-axis label.
 * @param {SVGElement} svg @param {LegendEntry[]} entries
 * @param {number} x0 @param {number} y0 @param {number} maxWidth
 */
function legend(svg, entries, x0, y0, maxWidth) {
  let x = x0, y = y0;
  for (const e of entries) {
    const w = 34 + 6.8 * e.label.length + 18;
    if (x > x0 && x + w > x0 + maxWidth) { x = x0; y += 20; }
    const g = el("g", { transform: `translate(${x},${y})` });
    if (e.kind === "box") {
      g.append(el("rect", { x: 4, y: -6, width: 22, height: 12, fill: e.color, "fill-opacity": e.opacity ?? 1,
        stroke: e.stroke || "none" }));
    } else if (e.kind === "point") {
      g.append(marker(15, 0, e.shape || "circle", e.color, 5, e.hollow));
    } else {
      g.append(el("line", { x1: 2, y1: 0, x2: 28, y2: 0, stroke: e.color, "stroke-width": e.width || 2.5,
        "stroke-dasharray": e.dash || null }));
    }
    g.append(el("text", { x: 34, y: 4.5, "font-size": 13, fill: INK }, e.label));
    svg.append(g);
    x += w;
  }
  return y;
}

/**
 * marker draws one data marker; hollow draws its outline only.
 * @param {number} x @param {number} y @param {Shape | undefined} shape @param {string} color
 * @param {number} r @param {boolean} [hollow]
 */
function marker(x, y, shape, color, r, hollow) {
  const paint = hollow
    ? { fill: "#ffffff", stroke: color, "stroke-width": 1.8 }
    : { fill: color, stroke: "#ffffff", "stroke-width": 1.5 };
  /** @param {string} d */
  const path = (d) => el("path", { d, ...paint });
  switch (shape) {
    case "diamond":
      return path(`M${x},${y - r * 1.3}L${x + r * 1.3},${y}L${x},${y + r * 1.3}L${x - r * 1.3},${y}Z`);
    case "square":
      return el("rect", { x: x - r, y: y - r, width: 2 * r, height: 2 * r, ...paint });
    case "triangle":
      return path(`M${x},${y - r * 1.25}L${x + r * 1.15},${y + r * 0.8}L${x - r * 1.15},${y + r * 0.8}Z`);
    case "triangle-down":
      return path(`M${x},${y + r * 1.25}L${x + r * 1.15},${y - r * 0.8}L${x - r * 1.15},${y - r * 0.8}Z`);
    case "cross": {
      const a = r * 1.1;
      return el("path", { d: `M${x - a},${y - a}L${x + a},${y + a}M${x - a},${y + a}L${x + a},${y - a}`,
        fill: "none", stroke: color, "stroke-width": 2.6, "stroke-linecap": "round" });
    }
  }
  return el("circle", { cx: x, cy: y, r, ...paint });
}

/**
 * chart draws an x–y chart (see ChartSpec and Layer).
 * @param {ChartSpec} spec
 * @returns {SVGSVGElement}
 */
export function chart(spec) {
  const W = spec.width || 600, H = spec.height || 400;
  const entries = spec.legend || [];
  const m = { l: 66, r: 20, t: 0, b: 56 };
  m.t = titleHeight(spec.title, W - m.l - m.r);
  // Reserve rows for the legend below the axis label.
  let rows = 0;
  if (entries.length) {
    rows = 1;
    let x = 0;
    for (const e of entries) {
      const w = 34 + 6.8 * e.label.length + 18;
      if (x > 0 && x + w > W - m.l - m.r) { rows++; x = 0; }
      x += w;
    }
  }
  m.b += rows * 20 + (rows ? 6 : 0);
  const pw = W - m.l - m.r, ph = H - m.t - m.b;
  const { min: x0, max: x1 } = spec.x, { min: y0, max: y1 } = spec.y;
  /** @param {number} v */
  const sx = (v) => m.l + ((v - x0) / (x1 - x0)) * pw;
  /** @param {number} v */
  const sy = (v) => m.t + ph - ((v - y0) / (y1 - y0)) * ph;

  const svg = el("svg", { xmlns: NS, width: W, height: H, viewBox: `0 0 ${W} ${H}`, role: "img",
    "font-family": FONT, "aria-label": spec.title || "chart" });
  svg.append(el("rect", { x: 0, y: 0, width: W, height: H, fill: "#ffffff" }));
  title(svg, spec.title, m.l, W - m.l - m.r);

  // Grid, ticks and tick labels.
  const xt = spec.x.integer ? integerTicks(x0, x1) : ticks(x0, x1, spec.x.ticks || 6);
  const yt = ticks(y0, y1, spec.y.ticks || 5);
  const axes = el("g", { "font-size": 12, fill: MUTED });
  for (const v of xt.values) {
    const X = sx(v);
    axes.append(el("line", { x1: X, y1: m.t, x2: X, y2: m.t + ph, stroke: GRID, "stroke-width": 1 }));
    axes.append(el("line", { x1: X, y1: m.t + ph, x2: X, y2: m.t + ph + 5, stroke: MUTED, "stroke-width": 1 }));
    axes.append(el("text", { x: X, y: m.t + ph + 19, "text-anchor": "middle" },
      spec.x.format ? spec.x.format(v) : v.toFixed(xt.decimals)));
  }
  for (const v of yt.values) {
    const Y = sy(v);
    axes.append(el("line", { x1: m.l, y1: Y, x2: m.l + pw, y2: Y, stroke: GRID, "stroke-width": 1 }));
    axes.append(el("line", { x1: m.l - 5, y1: Y, x2: m.l, y2: Y, stroke: MUTED, "stroke-width": 1 }));
    axes.append(el("text", { x: m.l - 8, y: Y + 4, "text-anchor": "end" },
      spec.y.format ? spec.y.format(v) : v.toFixed(yt.decimals)));
  }
  svg.append(axes);
  svg.append(el("rect", { x: m.l, y: m.t, width: pw, height: ph, fill: "none", stroke: MUTED, "stroke-width": 1 }));
  svg.append(el("text", { x: m.l + pw / 2, y: m.t + ph + 40, "text-anchor": "middle", "font-size": 13, fill: INK },
    spec.x.label || ""));
  svg.append(el("text", { x: 0, y: 0, transform: `translate(18,${m.t + ph / 2}) rotate(-90)`, "text-anchor": "middle",
    "font-size": 13, fill: INK }, spec.y.label || ""));

  // Data, clipped to the plot area.
  const clipId = `copoly-clip-${++clipCount}`;
  const defs = el("defs");
  const clip = el("clipPath", { id: clipId });
  clip.append(el("rect", { x: m.l, y: m.t, width: pw, height: ph }));
  defs.append(clip);
  svg.append(defs);
  const data = el("g", { "clip-path": `url(#${clipId})` });
  const labels = el("g", { "font-size": 12, fill: INK });
  for (const layer of spec.layers || []) {
    switch (layer.type) {
      case "band":
        data.append(el("rect", { x: m.l, width: pw, y: sy(layer.y1), height: Math.max(0, sy(layer.y0) - sy(layer.y1)),
          fill: layer.color, "fill-opacity": layer.opacity ?? 0.2 }));
        break;
      case "bars":
        for (let i = 0; i < layer.y.length; i++) {
          const X0 = sx(layer.x0[i]), X1 = sx(layer.x1[i]), Y = sy(Math.max(y0, layer.y[i]));
          data.append(el("rect", { x: Math.min(X0, X1), y: Y, width: Math.abs(X1 - X0), height: Math.max(0, sy(y0) - Y),
            fill: layer.color, stroke: layer.stroke || "#ffffff", "stroke-width": layer.stroke ? 1 : 0.5 }));
        }
        break;
      case "line": {
        let d = "";
        let pen = false;
        for (let i = 0; i < layer.x.length; i++) {
          const xv = layer.x[i], yv = layer.y[i];
          if (!Number.isFinite(xv) || !Number.isFinite(yv)) { pen = false; continue; }
          d += `${pen ? "L" : "M"}${sx(xv).toFixed(2)},${sy(yv).toFixed(2)}`;
          pen = true;
        }
        data.append(el("path", { d, fill: "none", stroke: layer.color, "stroke-width": layer.width || 2.5,
          "stroke-dasharray": layer.dash || null, "stroke-linejoin": "round", "stroke-linecap": "round", "data-role": layer.role || null }));
        break;
      }
      case "vline": {
        const X = sx(layer.x);
        data.append(el("line", { x1: X, y1: m.t, x2: X, y2: m.t + ph, stroke: layer.color, "stroke-width": 1.8,
          "stroke-dasharray": layer.dash || "6 4" }));
        if (layer.text) {
          const right = X < m.l + pw * 0.6;
          labels.append(el("text", { x: right ? X + 6 : X - 6, y: m.t + 16, "text-anchor": right ? "start" : "end",
            fill: layer.color, "font-weight": 600 }, layer.text));
        }
        break;
      }
      case "points":
        for (let i = 0; i < layer.x.length; i++) {
          if (!Number.isFinite(layer.x[i]) || !Number.isFinite(layer.y[i])) continue;
          data.append(marker(sx(layer.x[i]), sy(layer.y[i]), layer.shape, layer.color, layer.r || 5, layer.hollow));
        }
        break;
      case "segments":
        for (let i = 0; i < layer.x0.length; i++) {
          const v = [layer.x0[i], layer.y0[i], layer.x1[i], layer.y1[i]];
          if (!v.every(Number.isFinite)) continue;
          data.append(el("line", { x1: sx(v[0]), y1: sy(v[1]), x2: sx(v[2]), y2: sy(v[3]), stroke: layer.color,
            "stroke-width": layer.width || 1.2, "stroke-dasharray": layer.dash || null }));
        }
        break;
      case "polygon": {
        const pts = layer.points.filter((q) => Number.isFinite(q[0]) && Number.isFinite(q[1]))
          .map((q) => `${sx(q[0]).toFixed(2)},${sy(q[1]).toFixed(2)}`);
        if (pts.length < 3) break;
        data.append(el("polygon", { points: pts.join(" "), fill: layer.color, "fill-opacity": layer.opacity ?? 0.18,
          stroke: layer.stroke || layer.color, "stroke-width": layer.width || 1.8, "stroke-linejoin": "round",
          "data-role": layer.role || null }));
        break;
      }
      case "hline": {
        const Y = sy(layer.y);
        data.append(el("line", { x1: m.l, y1: Y, x2: m.l + pw, y2: Y, stroke: layer.color, "stroke-width": 1.5,
          "stroke-dasharray": layer.dash || "6 4" }));
        break;
      }
      case "point": {
        const X = sx(layer.x), Y = sy(layer.y);
        data.append(marker(X, Y, layer.shape, layer.color, layer.r || 6));
        if (layer.text) {
          const anchor = layer.anchor || (X < m.l + pw * 0.6 ? "start" : "end");
          const dx = anchor === "start" ? 11 : -11;
          const dy = Y < m.t + 24 ? 18 : -9;
          labels.append(el("text", { x: X + dx, y: Y + dy, "text-anchor": anchor, fill: INK, stroke: "#ffffff",
            "stroke-width": 4, "paint-order": "stroke", "stroke-linejoin": "round" }, layer.text));
        }
        break;
      }
    }
  }
  svg.append(data, labels);
  if (entries.length) legend(svg, entries, m.l, m.t + ph + 62, pw);
  return svg;
}

/**
 * integerTicks labels whole numbers only, at most about 12 of them.
 * @param {number} min @param {number} max
 * @returns {{values: number[], decimals: number}}
 */
function integerTicks(min, max) {
  const lo = Math.ceil(min), hi = Math.floor(max);
  const step = Math.max(1, Math.ceil((hi - lo + 1) / 12));
  const values = [];
  for (let v = lo; v <= hi; v += step) values.push(v);
  return { values, decimals: 0 };
}

/**
 * @typedef {object} StripsSpec
 * @property {string} [title]
 * @property {number} [width]
 * @property {string[]} chains  each chain as a string of "1" and "2"
 * @property {[string, string]} colors  of M1 and M2 units
 * @property {string} [xLabel]
 * @property {LegendEntry[]} legend
 */

/**
 * strips draws sample chains as rows of coloured units: one row per chain, one cell per unit,
 * runs of the same monomer merged into one rectangle.
 * @param {StripsSpec} spec
 * @returns {SVGSVGElement}
 */
export function strips(spec) {
  const W = spec.width || 600;
  const chains = spec.chains;
  const n = Math.max(1, ...chains.map((c) => c.length));
  const m = { l: 66, r: 20, t: 0 };
  m.t = titleHeight(spec.title, W - m.l - m.r);
  const rowH = 14, gap = 5;
  const ph = chains.length * (rowH + gap) - gap;
  const H = m.t + ph + 40 + 28;
  const pw = W - m.l - m.r;
  const cell = pw / n;
  const svg = el("svg", { xmlns: NS, width: W, height: H, viewBox: `0 0 ${W} ${H}`, role: "img",
    "font-family": FONT, "aria-label": spec.title || "sample chains" });
  svg.append(el("rect", { x: 0, y: 0, width: W, height: H, fill: "#ffffff" }));
  title(svg, spec.title, m.l, W - m.l - m.r);
  const g = el("g", { "font-size": 12, fill: MUTED });
  // Each run of one monomer is a rectangle; all the runs of one monomer are one path (two
  // elements for the whole picture, where one per run made hundreds).
  const runs = ["", ""];
  chains.forEach((chain, row) => {
    const y = m.t + row * (rowH + gap);
    g.append(el("text", { x: m.l - 8, y: y + rowH - 3, "text-anchor": "end" }, String(row + 1)));
    let start = 0;
    for (let i = 1; i <= chain.length; i++) {
      if (i === chain.length || chain[i] !== chain[start]) {
        const unit = chain[start] === "1" ? 0 : 1;
        runs[unit] += `M${(m.l + start * cell).toFixed(2)} ${y}h${((i - start) * cell).toFixed(2)}v${rowH}H${(m.l + start * cell).toFixed(2)}z`;
        start = i;
      }
    }
  });
  runs.forEach((d, unit) => {
    if (d) g.append(el("path", { d, fill: spec.colors[unit], stroke: "#ffffff", "stroke-width": 0.6 }));
  });
  const axisY = m.t + ph + 6;
  const every = niceStep(n, 6);
  for (let v = 0; v <= n; v += every) {
    g.append(el("text", { x: m.l + v * cell, y: axisY + 12, "text-anchor": "middle" }, String(v)));
  }
  g.append(el("text", { x: m.l + pw / 2, y: axisY + 28, "text-anchor": "middle", "font-size": 13, fill: INK },
    spec.xLabel || "unit along the chain"));
  g.append(el("text", { x: 0, y: 0, transform: `translate(18,${m.t + ph / 2}) rotate(-90)`, "text-anchor": "middle",
    "font-size": 13, fill: INK }, "chain"));
  svg.append(g);
  legend(svg, spec.legend, m.l, H - 12, pw);
  return svg;
}
