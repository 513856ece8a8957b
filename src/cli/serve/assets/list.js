// acidsite page, list mode: upload or paste, streamed progress, a table to
// sort and filter, downloads. Uses the helpers of util.js.
"use strict";

(function () {
  var P = window.acidsitePage;
  var $ = P.$, el = P.el, clear = P.clear, fmt = P.fmt, atomsText = P.atomsText;
  var errorMessage = P.errorMessage, postJSON = P.postJSON, importSvg = P.importSvg, download = P.download;
  var state = P.state;

  function listQuery(format) {
    var p = new URLSearchParams();
    p.set("format", format);
    var f = $("file").files[0];
    var layout = $("list-layout").value;
    if (layout) p.set("input", layout);
    else if (f) p.set("input", f.name);
    if (f) p.set("name", f.name);
    var col = $("list-column").value.trim();
    if (col) p.set("column", col);
    if ($("list-sites-only").checked) p.set("sites_only", "true");
    else if ($("list-reaction").value) p.set("reaction", $("list-reaction").value);
    return p.toString();
  }

  var controller = null;
  function runList() {
    var f = $("file").files[0];
    var text = $("paste").value;
    if (!f && !text.trim()) {
      $("list-status").hidden = false;
      showListError("Choose a file or paste some lines first.");
      return;
    }
    var body = f || new Blob([text], { type: "text/plain" });
    var limit = state.options ? state.options.limits.annotate_body_bytes : 10485760;
    $("list-status").hidden = false;
    $("list-error").hidden = true;
    if (body.size > limit) {
      showListError("This file is " + (body.size / 1048576).toFixed(1) + " MB, larger than the page's limit of " +
        Math.round(limit / 1048576) + " MB. Run acidsite annotate FILE on the command line instead (the same records, no size limit).");
      return;
    }
    var query = listQuery("jsonl");
    state.list = { records: [], text: "", body: body, name: f ? f.name : "pasted-list" };
    $("list-result").hidden = true;
    $("list-progress").value = 0;
    $("list-progress").removeAttribute("value");
    $("list-count").textContent = "Sending the list…";
    $("list-cancel").hidden = false;
    controller = new AbortController();
    var started = Date.now();
    fetch("/api/annotate?" + query, { method: "POST", body: body, signal: controller.signal }).then(function (resp) {
      if (!resp.ok) {
        return resp.text().then(function (t) { throw new Error(errorMessage(resp, t)); });
      }
      var lines = parseInt(resp.headers.get("x-acidsite-lines") || "0", 10);
      var reader = resp.body.getReader();
      var decoder = new TextDecoder();
      var partial = "";
      var chunks = [];
      function pump() {
        return reader.read().then(function (r) {
          if (r.done) return;
          var t = decoder.decode(r.value, { stream: true });
          chunks.push(t);
          var parts = (partial + t).split("\n");
          partial = parts.pop();
          parts.forEach(function (line) {
            if (line) state.list.records.push(JSON.parse(line));
          });
          var n = state.list.records.length;
          if (lines > 0) {
            $("list-progress").max = lines;
            $("list-progress").value = Math.min(n, lines);
          }
          $("list-count").textContent = n + " records analysed" + (lines ? " of at most " + lines + " lines" : "") + "…";
          return pump();
        });
      }
      return pump().then(function () {
        if (partial.trim()) state.list.records.push(JSON.parse(partial));
        state.list.text = chunks.join("");
      });
    }).then(function () {
      var recs = state.list.records;
      var failed = recs.filter(function (r) { return !r.ok; }).length;
      $("list-progress").max = 1;
      $("list-progress").value = 1;
      $("list-count").textContent = recs.length + " records, " + (recs.length - failed) + " analysed, " + failed +
        " failed (" + ((Date.now() - started) / 1000).toFixed(1) + " s).";
      fillBaseFilter(recs);
      state.list.limit = 200;
      renderList();
      $("list-result").hidden = false;
    }).catch(function (e) {
      if (e.name === "AbortError") {
        $("list-count").textContent = "Stopped after " + state.list.records.length + " records.";
      } else {
        showListError(e.message);
      }
    }).then(function () {
      $("list-cancel").hidden = true;
      controller = null;
    });
  }

  function showListError(msg) {
    var box = $("list-error");
    box.textContent = "Error: " + msg;
    box.hidden = false;
    $("list-count").textContent = "";
    $("list-progress").value = 0;
  }

  function topSite(rec) {
    var s = (rec.sites || []).filter(function (x) { return x.element === "C"; });
    return s.length ? s[0] : null;
  }
  function baseOf(rec) { return rec.advice && rec.advice.base ? rec.advice.base : ""; }

  function fillBaseFilter(recs) {
    var sel = $("list-base");
    while (sel.options.length > 1) sel.remove(1);
    var seen = {};
    recs.forEach(function (r) { var b = baseOf(r); if (b) seen[b] = (seen[b] || 0) + 1; });
    Object.keys(seen).sort().forEach(function (b) {
      sel.appendChild(el("option", { value: b, text: b + " (" + seen[b] + ")" }));
    });
  }

  function listView() {
    var recs = state.list.records.slice();
    var show = $("list-show").value;
    var base = $("list-base").value;
    var maxPka = parseFloat($("list-pka").value);
    recs = recs.filter(function (r) {
      if (show === "ok" && !r.ok) return false;
      if (show === "failed" && r.ok) return false;
      if (base && baseOf(r) !== base) return false;
      if (isFinite(maxPka)) {
        var t = topSite(r);
        if (!t || t.pka_dmso === null || t.pka_dmso > maxPka) return false;
      }
      return true;
    });
    var sort = $("list-sort").value;
    function pk(r) { var t = topSite(r); return t && t.pka_dmso !== null ? t.pka_dmso : null; }
    if (sort === "pka-asc" || sort === "pka-desc") {
      var sign = sort === "pka-asc" ? 1 : -1;
      recs.sort(function (a, b) {
        var x = pk(a), y = pk(b);
        if (x === null && y === null) return a.line - b.line;
        if (x === null) return 1;
        if (y === null) return -1;
        return sign * (x - y) || a.line - b.line;
      });
    } else if (sort === "base") {
      recs.sort(function (a, b) {
        var x = baseOf(a), y = baseOf(b);
        if (!x && y) return 1;
        if (x && !y) return -1;
        return x < y ? -1 : x > y ? 1 : a.line - b.line;
      });
    }
    return recs;
  }

  var drawQueue = null;
  function renderList() {
    var tb = $("list-table").querySelector("tbody");
    clear(tb);
    var view = listView();
    var limit = state.list.limit;
    if (drawQueue) drawQueue.disconnect();
    drawQueue = "IntersectionObserver" in window ? new IntersectionObserver(function (es) {
      es.forEach(function (e) {
        if (e.isIntersecting) { drawQueue.unobserve(e.target); drawSmall(e.target); }
      });
    }, { rootMargin: "400px 0px" }) : null;
    view.slice(0, limit).forEach(function (r) {
      var t = topSite(r);
      var a = r.advice;
      var notes = "";
      if (!r.ok) notes = "Failed (" + r.error.kind + "): " + r.error.message +
        (r.error.position !== null && r.error.position !== undefined ? " at character " + r.error.position : "");
      else if (!a && r.advice_note) notes = r.advice_note;
      else if (a && a.warnings.length) notes = a.warnings.length + " warning" + (a.warnings.length > 1 ? "s" : "") + ": " + a.warnings.join(" · ");
      var fullNotes = notes;
      if (notes.length > 170) notes = notes.slice(0, 160) + "… (open the molecule for all)";
      var pic = el("td", { cls: "pic" });
      pic.dataset.smiles = r.input;
      var reaction = r.advice && r.advice.reaction;
      var open = el("a", {
        href: "?smiles=" + encodeURIComponent(r.input) + (r.id ? "&name=" + encodeURIComponent(r.id) : "") +
          (reaction ? "&reaction=" + encodeURIComponent(reaction) : ""),
        text: r.input,
      });
      open.title = "open this molecule on its own";
      var tr = el("tr", r.ok ? null : { cls: "failed" },
        el("td", { text: String(r.line) }),
        el("td", { text: r.id || "" }),
        pic,
        el("td", { cls: "smiles" }, open),
        el("td", { text: t ? "#" + t.rank + " C" + atomsText(t.atoms) + " " + t.class : (r.ok ? "none found" : "") }),
        el("td", { cls: "num", text: t ? fmt(t.pka_dmso) : "" }),
        el("td", { text: a ? (a.base || "none qualifies") : "" }),
        el("td", { cls: "num", text: a && a.equivalents !== null ? fmt(a.equivalents, 2) : "" }),
        el("td", { text: a ? a.solvent || "" : "" }),
        el("td", { cls: "notes", text: notes, title: fullNotes }));
      tb.appendChild(tr);
      if (r.ok) {
        if (drawQueue) drawQueue.observe(pic); else drawSmall(pic);
      }
    });
    $("list-shown").textContent = "Showing " + Math.min(limit, view.length) + " of " + view.length +
      " records (of " + state.list.records.length + " in the list).";
    $("list-more").hidden = view.length <= limit;
  }

  function drawSmall(td) {
    if (td.dataset.drawn) return;
    td.dataset.drawn = "1";
    postJSON("/api/draw", { smiles: td.dataset.smiles, bond_px: 18 }).then(function (d) {
      if (!d.resp.ok) return;
      var svg = importSvg(d.text);
      if (svg) {
        svg.setAttribute("role", "img");
        svg.setAttribute("aria-label", "structure");
        td.appendChild(svg);
      }
    });
  }

  function downloadAs(format, ext, type) {
    if (!state.list) return;
    var name = state.list.name.replace(/\.(gz)$/i, "").replace(/\.[^.]*$/, "") || "list";
    if (format === "jsonl") {
      download(new Blob([state.list.text], { type: type }), name + "-acidsite." + ext);
      return;
    }
    $("dl-note").textContent = "Preparing the " + ext.toUpperCase() + " file…";
    fetch("/api/annotate?" + listQuery(format), { method: "POST", body: state.list.body }).then(function (resp) {
      if (!resp.ok) return resp.text().then(function (t) { throw new Error(errorMessage(resp, t)); });
      return resp.blob();
    }).then(function (b) {
      download(new Blob([b], { type: type }), name + "-acidsite." + ext);
      $("dl-note").textContent = "";
    }).catch(function (e) { $("dl-note").textContent = "Download failed: " + e.message; });
  }

  $("list-form").addEventListener("submit", function (ev) { ev.preventDefault(); runList(); });
  $("list-cancel").addEventListener("click", function () { if (controller) controller.abort(); });
  ["list-sort", "list-show", "list-base"].forEach(function (id) {
    $(id).addEventListener("change", function () { if (state.list) { state.list.limit = 200; renderList(); } });
  });
  $("list-pka").addEventListener("input", function () { if (state.list) { state.list.limit = 200; renderList(); } });
  $("list-more").addEventListener("click", function () { state.list.limit += 500; renderList(); });
  $("dl-jsonl").addEventListener("click", function () { downloadAs("jsonl", "jsonl", "application/x-ndjson"); });
  $("dl-csv").addEventListener("click", function () { downloadAs("csv", "csv", "text/csv"); });
  $("dl-html").addEventListener("click", function () { downloadAs("html", "html", "text/html"); });

})();
