// stanchion explore: the page's script.  No library, nothing loaded from elsewhere.
//
// Every request goes to the page's own origin under the page's own path (the token the server printed).
// Slider moves are sent one at a time; while one is under way only the latest move waits.  When a slider
// comes to rest (or a value is typed) the page asks for every analysis ("settle"); that answer is shown only
// if no move came after it.
"use strict";

(function () {
  const state = {sliders: [], byKey: {}, rev: 0, busy: false, pending: null, settleWanted: false,
                 settling: false, confirm: null, planes: [], stopped: false};
  // what the latency benchmark and the tests read
  const probe = {latencies: [], serverMs: [], paths: [], applied: 0, settled: 0, ready: false, errors: 0};
  window.__explore = probe;

  // -- small helpers ------------------------------------------------------------------------------------------
  function el(tag, attrs, ...children) {
    const node = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) {
      if (v === null || v === undefined || v === false) continue;
      if (k === "class") node.className = v;
      else if (k === "text") node.textContent = v;
      else node.setAttribute(k, v === true ? "" : String(v));
    }
    for (const c of children) {
      if (c === null || c === undefined) continue;
      node.append(c instanceof Node ? c : document.createTextNode(String(c)));
    }
    return node;
  }
  const $ = (id) => document.getElementById(id);

  async function api(path, body) {
    const init = body === undefined ? {cache: "no-store"} :
      {method: "POST", cache: "no-store", headers: {"Content-Type": "application/json"}, body: JSON.stringify(body)};
    let r;
    try {
      r = await fetch(path, init);
    } catch (e) {
      serverGone();
      throw e;
    }
    let data = null;
    try { data = await r.json(); } catch (e) { data = {error: `${r.status} ${r.statusText}`}; }
    if (!r.ok) throw new Error(data.error || `${r.status} ${r.statusText}`);
    return data;
  }

  function serverGone() {
    if (state.stopped) return;
    state.stopped = true;
    showError("The explorer's server has stopped (Ctrl-C or idle time). Start `stanchion explore` again.");
  }

  function showError(text) {
    const box = $("error");
    box.textContent = text || "";
    box.hidden = !text;
    document.body.classList.toggle("has-error", !!text);
  }

  // -- the inputs -----------------------------------------------------------------------------------------------
  function buildInputs(sliders, values) {
    const aside = $("inputs");
    aside.replaceChildren();
    let group = null, box = null;
    sliders.forEach((s, i) => {
      if (s.group !== group) {
        group = s.group;
        box = el("fieldset", {class: "group"}, el("legend", {text: group}));
        aside.append(box);
      }
      const range = el("input", {type: "range", min: 0, max: s.steps, step: 1, id: `range-${i}`,
                                 "data-key": s.key, "aria-label": `${s.label} ${s.where}`});
      const text = el("input", {type: "text", id: `text-${i}`, class: "num", "data-key": s.key, spellcheck: "false",
                                "aria-label": `${s.label} value in ${s.unit}`});
      const row = el("div", {class: "slider", id: `slider-${i}`, "data-key": s.key},
        el("div", {class: "slabel"}, el("span", {class: "name", text: s.label}), " ",
           el("span", {class: "where muted", text: s.where})),
        range,
        el("div", {class: "ends muted"}, el("span", {text: s.low}),
           el("span", {text: s.scale === "log" ? "log scale" : ""}), el("span", {text: s.high})),
        el("div", {class: "entry"}, text, " ", el("span", {class: "unit", text: s.unit === "L/" ? "(L/n)" : s.unit}),
           el("span", {class: "given muted", text: `file: ${s.given}`})),
        s.offset_note ? el("div", {class: "muted note", text: s.offset_note}) : null);
      box.append(row);
      state.byKey[s.key] = {range, text, row, slider: s};
      range.addEventListener("input", () => move(s.key, Number(range.value)));
      range.addEventListener("change", () => { state.settleWanted = true; maybeSettle(); });
      if (s.spring) {
        const prepare = () => { if (!state.prepared || state.prepared !== s.key) { state.prepared = s.key;
          api("api/prepare", {key: s.key}).catch(() => {}); } };
        range.addEventListener("pointerdown", prepare);
        range.addEventListener("focus", prepare);
      }
      text.addEventListener("change", () => typed(s.key, text.value));
      text.addEventListener("keydown", (ev) => { if (ev.key === "Enter") text.blur(); });
    });
    showValues(values);
  }

  function showValues(values) {
    for (const [key, v] of Object.entries(values || {})) {
      const w = state.byKey[key];
      if (!w) continue;
      if (document.activeElement !== w.range) w.range.value = v.pos;
      if (document.activeElement !== w.text) w.text.value = v.number;
      w.text.title = v.text;
      w.row.classList.toggle("changed", !!v.changed);
      w.range.setAttribute("aria-valuetext", v.text);
    }
  }

  // -- requests ---------------------------------------------------------------------------------------------------
  function move(key, pos) {
    submit({path: "api/set", body: {key, pos}, t0: performance.now()});
  }

  function typed(key, text) {
    if (!text.trim()) {  // an emptied box: put the value back
      api("api/state").then((d) => showValues(d.values)).catch(() => {});
      return;
    }
    submit({path: "api/set", body: {key, text}, t0: performance.now()});
    state.settleWanted = true;
  }

  function submit(job) {
    if (state.busy) { state.pending = job; return; }
    run(job);
  }

  async function run(job) {
    state.busy = true;
    try {
      const data = await api(job.path, job.body);
      state.rev = data.current_rev;
      apply(data, job.t0);
    } catch (e) {
      probe.errors += 1;
      if (!state.stopped) showError(e.message);
      const w = job.body && state.byKey[job.body.key];
      if (w) api("api/state").then((d) => showValues(d.values)).catch(() => {});
    }
    state.busy = false;
    if (state.pending) {
      const next = state.pending;
      state.pending = null;
      run(next);
    } else {
      maybeSettle();
    }
  }

  function maybeSettle() {
    if (!state.settleWanted || state.busy || state.settling || state.pending) return;
    state.settleWanted = false;
    state.settling = true;
    const rev = state.rev;
    api("api/settle", {}).then((data) => {
      state.settling = false;
      if (data.rev === state.rev && rev === state.rev) {
        apply(data, null);
        probe.settled += 1;
      }
      maybeSettle();
    }).catch((e) => {
      state.settling = false;
      if (!state.stopped) showError(e.message);
    });
  }

  // -- the results ----------------------------------------------------------------------------------------------
  function apply(data, t0) {
    showError(data.error ? `Cannot analyse these values: ${data.error}` : "");
    $("figure").innerHTML = data.figure;   // the server's own drawing
    $("output").classList.toggle("stale", !!data.error);
    if (!data.error) {
      showLoadFactors(data);
      showDesign(data);
      showSegments(data);
      showWarnings(data);
      showOthers(data);
    }
    showValues(data.values);
    const pend = (data.pending || []).map((p) => ({spatial: "thin-walled", imperfect: "imperfect column",
                                                  design: "design check"}[p] || p));
    $("status").textContent = data.path + (data.server_ms >= 0.05 ? `: ${data.server_ms.toFixed(1)} ms on the server` :
      " (computed before)") +
      (pend.length ? ` · ${pend.join(", ")}: when the slider is released` : "");
    probe.applied += 1;
    probe.paths.push(data.path);
    probe.serverMs.push(data.server_ms);
    if (t0 !== null && t0 !== undefined) {
      requestAnimationFrame(() => { probe.latencies.push(performance.now() - t0); });
    }
  }

  function table(head, rows, cls) {
    return el("table", {class: cls || ""},
      el("thead", {}, el("tr", {}, ...head.map((h) => el("th", {text: h})))),
      el("tbody", {}, ...rows));
  }

  function showLoadFactors(data) {
    const rows = data.planes.map((p) => el("tr", {},
      el("td", {text: p.axis + (p.axis === data.governing.axis && data.planes.length > 1 ? " (governs)" : "")}),
      el("td", {class: "big", id: `lf-${p.axis}`, text: p.load_factor}),
      el("td", {class: "muted", text: p.load_factors.slice(1).join(", ") || "-"}),
      el("td", {class: p.converged ? "muted" : "bad", text: p.converged ? `${p.elements} el.` : "NOT CONVERGED",
                title: p.message})));
    const card = $("load-factors");
    card.replaceChildren(el("h2", {text: "Lowest load factors λ"}),
      table(["plane", "λ₁", "higher modes", "mesh"], rows));
    const d = data.design;
    const sway = el("div", {class: "sway"});
    if (!data.has_design) {
      sway.append(el("p", {class: "muted", text: "alpha_cr and its classification need a [design] table " +
        "(the lowest load factor on the design loads)."}));
    } else if (!d) {
      sway.append(el("p", {class: "muted", text: "alpha_cr: updating when the slider is released."}));
    } else {
      sway.append(el("h3", {text: `Sway sensitivity alpha_cr (${d.sway.length ? d.sway[0].source : ""})`}),
        table(["plane", "alpha_cr", "classification"], d.sway.map((w) => el("tr", {},
          el("td", {text: w.axis}), el("td", {id: `alpha-${w.axis}`, text: w.alpha_cr}),
          el("td", {class: w.enough ? "" : "bad", text: w.classification, title: w.reason})))));
    }
    card.append(sway);
  }

  function showDesign(data) {
    const card = $("design");
    const d = data.design;
    if (!data.has_design) {
      card.replaceChildren(el("h2", {text: "Design check"}),
        el("p", {class: "muted", text: "The case has no [design] table: no utilisation and no verdict."}));
      return;
    }
    if (!d) {
      card.replaceChildren(el("h2", {text: "Design check"}),
        el("p", {class: "muted", text: "Waits for the thin-walled analysis: updating when the slider is released."}));
      return;
    }
    const cls = {passes: "pass", fails: "fail"}[d.verdict] || "nv";
    const rows = d.checks.map((c) => el("tr", {class: c.passed ? "" : "badrow"},
      el("td", {text: `${c.segment} ${c.name}`}), el("td", {text: c.axis}), el("td", {text: c.utilisation}),
      el("td", {class: "muted small", text: c.clause})));
    card.replaceChildren(el("h2", {text: `Design check: ${d.standard}`}),
      el("p", {}, "Largest utilisation ", el("span", {class: "big", id: "utilisation", text: d.utilisation}),
         el("br"), el("span", {class: "muted", text: `${d.governing}; case loads × ${d.load_factor}`})),
      el("p", {class: `verdict ${cls}`, id: "verdict", text: d.verdict_line}),
      table(["segment", "axis", "util.", "clause"], rows, "checks"),
      ...d.unchecked.map((u) => el("p", {class: "muted small", text: u})));
  }

  function showSegments(data) {
    const box = $("segments");
    box.replaceChildren(el("h2", {text: "Segments in the lowest mode"}));
    const wrap = el("div", {class: "cards"});
    for (const p of data.planes) {
      const rows = p.segments.map((s) => el("tr", {class: s.meaningful ? "" : "flagged"},
        el("td", {text: `${s.index} ${s.name}`}), el("td", {text: s.N}), el("td", {text: s.N_cr}),
        el("td", {id: `K-${p.axis}-${s.index}`, class: "num", text: s.K}), el("td", {text: s.KL}),
        el("td", {text: s.energy}),
        el("td", {class: "small", text: s.meaningful ? "" : `not meaningful: ${s.note}`, title: s.advice})));
      wrap.append(el("div", {class: "card"}, el("h3", {text: `${p.axis} axis`}),
        table(["segment", `N [${state.force}]`, `N_cr [${state.force}]`, "K", `K L [${state.length}]`,
               "energy", ""], rows)));
    }
    box.append(wrap);
  }

  function showWarnings(data) {
    const box = $("warnings");
    if (!data.warnings.length) {
      box.replaceChildren(el("h2", {text: "Warnings"}), el("p", {class: "muted", text: "none"}));
      return;
    }
    box.replaceChildren(el("h2", {text: "Warnings"}), el("ul", {}, ...data.warnings.map((w) =>
      el("li", {class: w.level === "warning" ? "bad" : ""}, el("span", {class: "tag", text: w.level.toUpperCase()}),
         ` (${w.key}) ${w.text}`))));
  }

  function showOthers(data) {
    const box = $("others");
    const pend = data.pending || [];
    const parts = data.others.map((o) => el("details", {open: true}, el("summary", {text: o.title}),
      el("pre", {text: o.lines.join("\n")})));
    const waiting = pend.filter((p) => p !== "design").map((p) => el("p", {class: "muted",
      text: `${{spatial: "Thin-walled buckling", imperfect: "Imperfect column"}[p] || p}: updating when the ` +
            "slider is released."}));
    box.replaceChildren(...(parts.length || waiting.length ? [el("h2", {text: "Other analyses"})] : []),
      ...parts, ...waiting);
  }

  // -- buttons --------------------------------------------------------------------------------------------------
  function wireButtons() {
    $("reset").addEventListener("click", () => {
      submit({path: "api/reset", body: {}, t0: performance.now()});
      state.settleWanted = true;
    });
    $("save-name").addEventListener("input", () => { state.confirm = null; });
    $("save").addEventListener("click", async () => {
      const body = {name: $("save-name").value, overwrite: $("save-replace").checked};
      if (state.confirm) body.confirm = state.confirm;
      try {
        const r = await api("api/save", body);
        state.confirm = r.confirm || null;
        $("save-message").textContent = r.message;
        $("save-message").className = r.saved ? "ok" : "muted";
      } catch (e) {
        state.confirm = null;
        $("save-message").textContent = e.message;
        $("save-message").className = "bad";
      }
    });
  }

  async function start() {
    wireButtons();
    try {
      const data = await api("api/state");
      state.sliders = data.sliders;
      state.force = data.case.force;
      state.length = data.case.length;
      state.rev = data.result.rev;
      $("title").textContent = data.case.title || "(untitled case)";
      document.title = `${data.case.title || data.case.file} - stanchion explore`;
      $("file").textContent = `${data.case.file} · forces in ${data.case.force}, lengths in ${data.case.length}`;
      const stem = data.case.file.replace(/\.toml$/i, "");
      $("save-name").value = `${stem}-explored.toml`;
      buildInputs(data.sliders, data.values);
      apply(data.result, null);
      $("cautions").replaceChildren(...data.cautions.map((c, i) =>
        el("p", {class: i ? "muted small" : "caution", text: i ? c : `CAUTION: ${c}`})));
      probe.ready = true;
    } catch (e) {
      showError(e.message);
    }
  }

  start();
})();
