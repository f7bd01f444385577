// steamcell page: adds computing, drawing, previews and uploads to the
// plain HTML. Every request goes to this same server.
"use strict";
(function () {
  const $ = (id) => document.getElementById(id);
  // A token given to the page (?key=…) goes with every request.
  const key = new URLSearchParams(location.search).get("key");
  const withKey = (url) => key ? url + (url.includes("?") ? "&" : "?") + "key=" + encodeURIComponent(key) : url;

  // problemText reads an error answer: RFC 9457 "detail" when present,
  // else the older {"error": {"message"}}.
  async function problemText(res) {
    const text = await res.text();
    try {
      const body = JSON.parse(text);
      if (body.detail) return body.detail;
      if (body.error && body.error.message) return body.error.message;
    } catch (e) { /* not JSON */ }
    return text.trim() || res.status + " " + res.statusText;
  }
  function showError(el, msg) { el.textContent = msg; el.hidden = !msg; }
  function cell(tag, text, attrs) {
    const c = document.createElement(tag);
    c.textContent = text;
    for (const k in attrs || {}) c.setAttribute(k, attrs[k]);
    return c;
  }
  const fmt = (v) => typeof v === "number" ? String(Number(v.toPrecision(7))) : String(v);

  // ---- One state ----
  let lastPoint = null;
  $("calc-form").addEventListener("submit", async (ev) => {
    ev.preventDefault();
    const q = new URLSearchParams();
    q.set($("calc-name1").value, $("calc-value1").value);
    if ($("calc-name2").value === $("calc-name1").value) q.append($("calc-name2").value, $("calc-value2").value);
    else q.set($("calc-name2").value, $("calc-value2").value);
    q.set("units", $("calc-units").value);
    const out = $("answer");
    out.replaceChildren(cell("p", "Computing…"));
    const res = await fetch(withKey("/state?" + q));
    if (!res.ok) {
      out.replaceChildren(cell("p", await problemText(res), { class: "error", role: "alert" }));
      $("calc-add").disabled = true;
      return;
    }
    const a = await res.json();
    const head = cell("p", "", { class: "phase" });
    head.append(cell("strong", a.phase, { id: "answer-phase" }), " · IF97 region " + a.region + " · unit set " + a.unit_set);
    const tbl = document.createElement("table");
    tbl.id = "answer-table";
    tbl.append(cell("caption", "Properties of the state"));
    // With ± on an input the answer carries "u": {symbol: standard uncertainty}.
    const unc = a.u && typeof a.u === "object" ? a.u : null;
    const hr = document.createElement("tr");
    hr.append(cell("th", "Property", { scope: "col" }), cell("th", "Value", { scope: "col" }));
    if (unc) hr.append(cell("th", "Standard uncertainty u", { scope: "col" }));
    hr.append(cell("th", "Unit", { scope: "col" }));
    tbl.append(hr);
    for (const sym in a.units) {
      if (typeof a[sym] !== "number") continue;
      const tr = document.createElement("tr");
      tr.append(cell("th", sym, { scope: "row" }), cell("td", fmt(a[sym]), { "data-sym": sym, class: "num" }));
      if (unc) tr.append(cell("td", typeof unc[sym] === "number" ? fmt(unc[sym]) : "", { "data-u": sym, class: "num" }));
      tr.append(cell("td", a.units[sym]));
      tbl.append(tr);
    }
    const parts = [head, tbl];
    if (unc && a.uncertainty) {
      parts.push(cell("p", "Uncertainty: " + a.uncertainty.applied + (typeof a[a.uncertainty.internal_energy_key] === "number" ? "; internal energy is shown as " + a.uncertainty.internal_energy_key : ""), { class: "note", id: "answer-uncertainty" }));
    }
    if (a.warnings && a.warnings.length) {
      const ul = cell("ul", "", { class: "warnings", "aria-label": "Warnings" });
      for (const w of a.warnings) ul.append(cell("li", w));
      parts.push(ul);
    }
    out.replaceChildren(...parts);
    lastPoint = $("calc-name1").value + "=" + $("calc-value1").value + "," + $("calc-name2").value + "=" + $("calc-value2").value;
    $("calc-add").disabled = false;
  });
  $("calc-add").addEventListener("click", () => {
    if (!lastPoint) return;
    const ta = $("plot-points");
    const n = ta.value.split("\n").filter((l) => l.trim()).length + 1;
    ta.value = (ta.value.trim() ? ta.value.trim() + "\n" : "") + lastPoint + ",label=" + n;
    draw();
    $("diagram").scrollIntoView();
  });

  // ---- Diagram ----
  // pointsFromText turns the pasted list into pt= values: lines of
  // name=value items, or CSV rows under a header of names with units.
  function pointsFromText(text) {
    const lines = text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l);
    if (!lines.length) return [];
    if (lines[0].includes("=")) return lines;
    const split = (l) => l.split(/[,;\t]/).map((c) => c.trim());
    const head = split(lines[0]).map((h) => {
      const m = h.match(/^([^\[(]+)[\[(](.*)[\])]\s*$/);
      return m ? { name: m[1].trim(), unit: m[2].trim() } : { name: h, unit: "" };
    });
    return lines.slice(1).map((l) => split(l).map((c, i) => head[i] ? head[i].name + "=" + c + (head[i].unit && c ? " " + head[i].unit : "") : "").filter((c) => c && !/=$/.test(c)).join(","));
  }
  let view = null; // the JSON form of the picture shown
  let drawing = 0; // the latest draw; an earlier one that ends later is dropped
  function diagramQuery() {
    const q = new URLSearchParams();
    for (const p of pointsFromText($("plot-points").value)) q.append("pt", p);
    if ($("plot-regions").checked) q.set("regions", "1");
    q.set("units", $("calc-units").value);
    for (const k of ["xmin", "xmax", "ymin", "ymax"]) if ($("plot-" + k).value.trim()) q.set(k, $("plot-" + k).value.trim());
    return q.toString();
  }
  async function draw() {
    const mine = ++drawing;
    const kind = $("plot-kind").value;
    const q = diagramQuery();
    const res = await fetch(withKey("/diagram/" + kind + ".json?" + q));
    if (mine !== drawing) return;
    if (!res.ok) { showError($("plot-error"), await problemText(res)); return; }
    showError($("plot-error"), "");
    const next = await res.json();
    if (mine !== drawing) return;
    view = next;
    const img = $("plot-img");
    img.alt = view.title + " diagram of water with " + view.points.length + " points";
    const loaded = new Promise((ok) => { img.onload = ok; img.onerror = ok; });
    img.src = withKey("/diagram/" + kind + ".svg?" + q);
    for (const f of ["svg", "png", "json"]) $("plot-" + f).href = withKey("/diagram/" + kind + "." + f + "?" + q);
    await loaded;
    if (mine !== drawing) return;
    // The range fields read in the axes' units: say which.
    for (const a of ["x", "y"]) {
      const ax = view[a];
      document.querySelector('label[for="plot-' + a + 'min"]').textContent = ax.symbol + (ax.unit ? " in " + ax.unit : "") + " from";
    }
    overlay();
    $("plot-box").dataset.ready = String(mine);
  }
  // frac places a value along an axis as a fraction of the frame.
  function frac(v, ax) {
    if (ax.log) return (Math.log10(v) - Math.log10(ax.min)) / (Math.log10(ax.max) - Math.log10(ax.min));
    return (v - ax.min) / (ax.max - ax.min);
  }
  function unfrac(f, ax) {
    if (ax.log) return Math.pow(10, Math.log10(ax.min) + f * (Math.log10(ax.max) - Math.log10(ax.min)));
    return ax.min + f * (ax.max - ax.min);
  }
  // toPicture gives the position, as fractions of the picture, of (x, y).
  function toPicture(x, y) {
    const fr = view.frame;
    return [fr.Left + (fr.Right - fr.Left) * frac(x, view.x), fr.Bottom - (fr.Bottom - fr.Top) * frac(y, view.y)];
  }
  function fromPicture(fx, fy) {
    const fr = view.frame;
    return [unfrac((fx - fr.Left) / (fr.Right - fr.Left), view.x), unfrac((fr.Bottom - fy) / (fr.Bottom - fr.Top), view.y)];
  }
  // overlay puts a marker over each point the picture draws, so that the
  // pointer finds it; the picture itself is the server's.
  function overlay() {
    const svg = $("plot-overlay");
    svg.setAttribute("viewBox", "0 0 1000 1000");
    svg.setAttribute("preserveAspectRatio", "none");
    svg.replaceChildren();
    for (const p of view.points) {
      const [fx, fy] = toPicture(p.x, p.y);
      if (fx < 0 || fx > 1 || fy < 0 || fy > 1) continue;
      const c = document.createElementNS("http://www.w3.org/2000/svg", "circle");
      c.setAttribute("cx", fx * 1000); c.setAttribute("cy", fy * 1000); c.setAttribute("r", 9);
      c.setAttribute("class", "hit");
      c.dataset.label = p.label || "";
      c.dataset.fx = fx; c.dataset.fy = fy;
      svg.append(c);
    }
  }
  function pointerFraction(ev) {
    const r = $("plot-box").getBoundingClientRect();
    return [(ev.clientX - r.left) / r.width, (ev.clientY - r.top) / r.height];
  }
  function describe(fx, fy) {
    const [x, y] = fromPicture(fx, fy);
    let text = view.x.symbol + " = " + fmt(x) + " " + view.x.unit + ", " + view.y.symbol + " = " + fmt(y) + " " + view.y.unit;
    // Name the nearest point within a few pixels' worth.
    let best = null, bestD = 0.015;
    for (const p of view.points) {
      const [px, py] = toPicture(p.x, p.y);
      const d = Math.hypot(px - fx, py - fy);
      if (d < bestD) { best = p; bestD = d; }
    }
    if (best) {
      text = "point " + (best.label || "") + " (" + best.phase + "): " + Object.keys(best.values).map((k) => k + " = " + fmt(best.values[k])).join(", ");
    }
    return text;
  }
  let drag = null;
  const box = $("plot-box");
  box.addEventListener("pointermove", (ev) => {
    if (!view) return;
    const [fx, fy] = pointerFraction(ev);
    const fr = view.frame;
    if (fx >= fr.Left && fx <= fr.Right && fy >= fr.Top && fy <= fr.Bottom) $("plot-readout").textContent = describe(fx, fy);
    if (drag) {
      const r = $("plot-zoom");
      r.setAttribute("x", Math.min(drag[0], fx) * 1000); r.setAttribute("y", Math.min(drag[1], fy) * 1000);
      r.setAttribute("width", Math.abs(fx - drag[0]) * 1000); r.setAttribute("height", Math.abs(fy - drag[1]) * 1000);
    }
  });
  box.addEventListener("pointerdown", (ev) => {
    if (!view) return;
    drag = pointerFraction(ev);
    const r = document.createElementNS("http://www.w3.org/2000/svg", "rect");
    r.id = "plot-zoom";
    $("plot-overlay").append(r);
    box.setPointerCapture(ev.pointerId);
  });
  box.addEventListener("pointerup", (ev) => {
    if (!drag) return;
    const end = pointerFraction(ev);
    const start = drag;
    drag = null;
    const r = $("plot-zoom");
    if (r) r.remove();
    if (Math.abs(end[0] - start[0]) < 0.02 || Math.abs(end[1] - start[1]) < 0.02) return;
    const a = fromPicture(Math.min(start[0], end[0]), Math.max(start[1], end[1]));
    const b = fromPicture(Math.max(start[0], end[0]), Math.min(start[1], end[1]));
    $("plot-xmin").value = fmt(a[0]); $("plot-xmax").value = fmt(b[0]);
    $("plot-ymin").value = fmt(a[1]); $("plot-ymax").value = fmt(b[1]);
    draw();
  });
  $("plot-form").addEventListener("submit", (ev) => { ev.preventDefault(); draw(); });
  $("plot-kind").addEventListener("change", () => { $("plot-reset").click(); });
  $("plot-regions").addEventListener("change", draw);
  $("plot-reset").addEventListener("click", () => {
    for (const k of ["xmin", "xmax", "ymin", "ymax"]) $("plot-" + k).value = "";
    draw();
  });

  // ---- Steam table ----
  $("table-show").addEventListener("click", async () => {
    const form = $("table-form");
    if (!form.reportValidity()) return;
    const q = new URLSearchParams(new FormData(form));
    for (const [k, v] of [...q]) if (!v.trim()) q.delete(k);
    q.set("format", "json");
    const res = await fetch(withKey("/table?" + q));
    if (!res.ok) { showError($("table-error"), await problemText(res)); $("table-out").replaceChildren(); return; }
    showError($("table-error"), "");
    const t = await res.json();
    const tbl = document.createElement("table");
    tbl.id = "table-result";
    tbl.append(cell("caption", t.title + " · " + t.formulation + " · unit set " + t.unit_set));
    const hr = document.createElement("tr");
    for (const c of t.columns) hr.append(cell("th", c.unit ? c.symbol + " [" + c.unit + "]" : c.symbol, { scope: "col", title: c.name }));
    hr.append(cell("th", "phase", { scope: "col" }), cell("th", "status", { scope: "col" }));
    tbl.append(hr);
    for (const r of t.rows) {
      const tr = document.createElement("tr");
      for (const v of r.values) tr.append(cell("td", v === null ? "" : fmt(v), { class: "num" }));
      tr.append(cell("td", r.phase), cell("td", r.status));
      tbl.append(tr);
    }
    $("table-out").replaceChildren(tbl);
  });

  // ---- Fill a workbook ----
  async function fill(file) {
    showError($("drop-error"), "");
    const link = $("drop-result");
    link.hidden = true;
    $("drop-status").textContent = "Filling " + file.name + "…";
    const res = await fetch(withKey("/workbook?name=" + encodeURIComponent(file.name) + "&units=" + encodeURIComponent($("calc-units").value)), { method: "POST", body: file });
    if (!res.ok) { $("drop-status").textContent = ""; showError($("drop-error"), await problemText(res)); return; }
    const blob = await res.blob();
    const name = file.name.replace(/\.[^.]*$/, "") + "_filled.xlsx";
    if (link.href) URL.revokeObjectURL(link.href);
    link.href = URL.createObjectURL(blob);
    link.download = name;
    link.textContent = "Download " + name;
    link.hidden = false;
    let summary = "";
    try {
      const s = JSON.parse(res.headers.get("Steamcell-Summary") || "null");
      if (s) summary = Object.keys(s).filter((k) => typeof s[k] !== "object").map((k) => k.replace(/_/g, " ") + ": " + s[k]).join(", ");
    } catch (e) { /* no summary */ }
    $("drop-status").textContent = "Filled " + file.name + (summary ? " (" + summary + ")" : "") + ".";
  }
  const drop = $("drop");
  drop.addEventListener("dragover", (ev) => { ev.preventDefault(); drop.classList.add("over"); });
  drop.addEventListener("dragleave", () => drop.classList.remove("over"));
  drop.addEventListener("drop", (ev) => {
    ev.preventDefault();
    drop.classList.remove("over");
    if (ev.dataTransfer.files.length) fill(ev.dataTransfer.files[0]);
  });
  $("drop-file").addEventListener("change", (ev) => { if (ev.target.files.length) fill(ev.target.files[0]); });

  draw();
})();
