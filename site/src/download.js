// @ts-check
// download.js: the files the page saves (a chart as SVG or PNG, a table as CSV, a project), each
// through a temporary blob: link; nothing leaves the machine.

/**
 * download saves blob under filename through a temporary blob: link.
 * @param {Blob} blob
 * @param {string} filename
 */
export function download(blob, filename) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = filename;
  a.hidden = true;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10000);
}

/** @param {SVGSVGElement} svg */
function svgText(svg) {
  return '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(svg);
}

/**
 * saveSVG saves a chart as a standalone SVG file.
 * @param {SVGSVGElement} svg
 * @param {string} filename
 */
export function saveSVG(svg, filename) {
  download(new Blob([svgText(svg)], { type: "image/svg+xml" }), filename);
}

/**
 * savePNG draws the SVG (through a blob: URL) into a canvas at twice its size and saves that.
 * @param {SVGSVGElement} svg
 * @param {string} filename
 * @returns {Promise<void>}
 */
export function savePNG(svg, filename) {
  return new Promise((resolve, reject) => {
    const scale = 2;
    const w = Number(svg.getAttribute("width")), h = Number(svg.getAttribute("height"));
    const url = URL.createObjectURL(new Blob([svgText(svg)], { type: "image/svg+xml" }));
    const img = new Image();
    img.onload = () => {
      const canvas = document.createElement("canvas");
      canvas.width = w * scale;
      canvas.height = h * scale;
      const ctx = canvas.getContext("2d");
      if (!ctx) {
        URL.revokeObjectURL(url);
        return reject(new Error("the browser could not make a PNG"));
      }
      ctx.fillStyle = "#ffffff";
      ctx.fillRect(0, 0, canvas.width, canvas.height);
      ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
      URL.revokeObjectURL(url);
      canvas.toBlob((blob) => {
        if (blob) { download(blob, filename); resolve(); } else reject(new Error("the browser could not make a PNG"));
      }, "image/png");
    };
    img.onerror = () => { URL.revokeObjectURL(url); reject(new Error("the browser could not draw the chart")); };
    img.src = url;
  });
}

/** @typedef {string | number | null | undefined} CSVValue */

/**
 * csvCell quotes a value for CSV; text that a spreadsheet would run as a formula gets a leading
 * apostrophe.
 * @param {CSVValue} v
 */
export function csvCell(v) {
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : "";
  let s = String(v ?? "");
  if (/^[=+\-@\t\r]/.test(s)) s = "'" + s;
  return /[",\r\n]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
}

/**
 * saveCSV saves rows as a CSV file (CRLF line ends, UTF-8).
 * @param {CSVValue[][]} rows
 * @param {string} filename
 */
export function saveCSV(rows, filename) {
  const text = rows.map((r) => r.map(csvCell).join(",")).join("\r\n") + "\r\n";
  download(new Blob([text], { type: "text/csv;charset=utf-8" }), filename);
}
