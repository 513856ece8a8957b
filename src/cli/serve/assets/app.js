// acidsite page: the tabs, the build's options and one molecule (list mode
// is in list.js, the helpers in util.js, loaded before this file). Every
// piece of text from the input or a record goes in with textContent.
"use strict";

(function () {
  var P = window.acidsitePage;
  var $ = P.$, el = P.el, clear = P.clear, fmt = P.fmt, pct = P.pct, temp = P.temp, atomsText = P.atomsText;
  var errorMessage = P.errorMessage, postJSON = P.postJSON, importSvg = P.importSvg, copyText = P.copyText;
  var state = P.state;   // shared with list.js (options, showTab)
  state.rules = null;    // rule id -> rule (from /api/rules, fetched on demand)
  state.record = null;   // last record shown
  state.seq = 0;         // request counter: late answers to old requests are dropped

  // ---------- tabs ----------
  function showTab(which) {
    var one = which === "one";
    $("tab-one").setAttribute("aria-selected", String(one));
    $("tab-list").setAttribute("aria-selected", String(!one));
    $("tab-one").tabIndex = one ? 0 : -1;
    $("tab-list").tabIndex = one ? -1 : 0;
    $("panel-one").hidden = !one;
    $("panel-list").hidden = one;
  }
  $("tab-one").addEventListener("click", function () { showTab("one"); });
  $("tab-list").addEventListener("click", function () { showTab("list"); });
  document.querySelector(".modes").addEventListener("keydown", function (ev) {
    if (ev.key === "ArrowRight" || ev.key === "ArrowLeft") {
      var toList = $("tab-one").getAttribute("aria-selected") === "true";
      showTab(toList ? "list" : "one");
      (toList ? $("tab-list") : $("tab-one")).focus();
    }
  });

  // ---------- options from the build ----------
  function fillSelect(sel, items, label) {
    items.forEach(function (it) {
      var name = typeof it === "string" ? it : it.name;
      sel.appendChild(el("option", { value: name, text: label ? label(it) : name }));
    });
  }
  function loadOptions() {
    return fetch("/api/options").then(function (r) { return r.json(); }).then(function (o) {
      state.options = o;
      var reactions = o.reactions || [];
      var controls = o.controls || [];
      state.reactionSummary = {};
      reactions.forEach(function (r) { state.reactionSummary[r.name] = r.summary || ""; });
      if (reactions.length) {
        fillSelect($("reaction"), reactions, function (r) { return r.name; });
        fillSelect($("list-reaction"), reactions, function (r) { return r.name; });
        $("reaction-field").hidden = false;
        $("list-reaction-field").hidden = false;
      }
      if (controls.length) {
        fillSelect($("control"), controls, function (c) { return c.name; });
        $("control-field").hidden = false;
      }
      fillSelect($("base"), o.bases || [], function (b) {
        return b.name + " (" + b.full_name + ")";
      });
      var mb = Math.round(o.limits.annotate_body_bytes / 1048576);
      $("limit-note").textContent = "";
      $("limit-note").appendChild(document.createTextNode(
        "Up to " + mb + " MB per upload (a gzip file counts at its compressed size and may unpack to at most " +
        Math.round(o.limits.annotate_unpacked_bytes / 1048576) + " MB). For larger files run "));
      $("limit-note").appendChild(el("code", { text: "acidsite annotate FILE" }));
      $("limit-note").appendChild(document.createTextNode(" on the command line: the same records, no size limit."));
      $("build").textContent = "acidsite " + o.version + " · rule set " + o.rule_set + " · records " + o.schema;
    });
  }

  function loadRules() {
    if (state.rules) return Promise.resolve(state.rules);
    return fetch("/api/rules").then(function (r) { return r.json(); }).then(function (j) {
      var m = {};
      (j.rules || []).forEach(function (r) { m[r.id] = { kind: "class rule", r: r }; });
      (j.increments || []).forEach(function (i) { m[i.id] = { kind: "increment", r: i }; });
      state.rules = m;
      state.sources = {};
      (j.sources || []).forEach(function (s) { state.sources[s.key] = s.reference; });
      return m;
    });
  }

  // ---------- one molecule: form and URL ----------
  function formValues() {
    var scale = document.querySelector('input[name="scale"]:checked');
    return {
      smiles: $("smiles").value.trim(),
      name: $("name").value.trim(),
      reaction: $("reaction").value,
      control: $("control").value,
      site: $("site").value,
      base: $("base").value,
      scale: scale ? scale.value : "dmso",
    };
  }
  function updateUrl() {
    var v = formValues();
    var p = new URLSearchParams();
    ["smiles", "name", "reaction", "control", "site", "base"].forEach(function (k) {
      if (v[k]) p.set(k, v[k]);
    });
    if (v.scale !== "dmso") p.set("scale", v.scale);
    var q = p.toString();
    history.replaceState(null, "", q ? "?" + q : location.pathname);
  }
  function setSelect(sel, value) {
    if (!value) { sel.value = ""; return; }
    var found = Array.prototype.some.call(sel.options, function (o) { return o.value === value; });
    if (!found) sel.appendChild(el("option", { value: value, text: value }));
    sel.value = value;
  }
  // The query of a shared link, read by hand: a SMILES pasted into an
  // address unencoded keeps its '+' (a charge, never a space in SMILES) and
  // its '#' (a triple bond, which the browser takes for the start of a
  // fragment; this page uses none, so the fragment is read as more query).
  function linkParams() {
    var raw = location.search.replace(/^\?/, "") + (location.hash || "");
    var map = {};
    raw.split("&").forEach(function (part) {
      if (!part) return;
      var eq = part.indexOf("=");
      var key = eq < 0 ? part : part.slice(0, eq);
      var val = eq < 0 ? "" : part.slice(eq + 1);
      if (key !== "smiles") val = val.replace(/\+/g, " ");
      try { val = decodeURIComponent(val); } catch (e) { /* keep it as written */ }
      try { key = decodeURIComponent(key); } catch (e) { /* keep it as written */ }
      if (!(key in map)) map[key] = val;
    });
    return { get: function (k) { return k in map ? map[k] : null; } };
  }

  function fillFromUrl() {
    var p = linkParams();
    $("smiles").value = p.get("smiles") || "";
    $("name").value = p.get("name") || "";
    // A reaction or control this build does not know (an older build, or a
    // link from a newer one) is left out with a note rather than refused.
    var unknown = [];
    [["reaction", "reaction"], ["control", "control"]].forEach(function (k) {
      var v = p.get(k[0]);
      var known = v && Array.prototype.some.call($(k[0]).options, function (o) { return o.value === v; });
      if (v && !known) unknown.push(k[1] + " “" + v + "”");
      $(k[0]).value = known ? v : "";
    });
    state.linkNote = unknown.length
      ? "The link asks for " + unknown.join(" and ") + ", which this build of acidsite does not know; the advice below does not take it into account."
      : "";
    setSelect($("base"), p.get("base"));
    var site = p.get("site");
    setSelect($("site"), site && /^\d+$/.test(site) ? site : "");
    var scale = p.get("scale") === "water" ? "water" : "dmso";
    document.querySelector('input[name="scale"][value="' + scale + '"]').checked = true;
    if (p.get("list") !== null) showTab("list");
    return !!$("smiles").value.trim();
  }

  // ---------- one molecule: run ----------
  function run() {
    var v = formValues();
    updateUrl();
    if (!v.smiles) {
      $("one-status").textContent = "Type or paste a SMILES first.";
      return;
    }
    var body = { smiles: v.smiles, scale: v.scale };
    if (v.name) body.name = v.name;
    if (v.site !== "") body.site = parseInt(v.site, 10);
    if (v.base) body.base = v.base;
    if (v.reaction) body.reaction = v.reaction;
    if (v.control) body.control = v.control;
    var my = ++state.seq;
    $("one-status").textContent = "Analysing…";
    var scan = postJSON("/api/scan", body);
    var drawing = postJSON("/api/draw", body);
    Promise.all([scan, drawing]).then(function (res) {
      if (my !== state.seq) return;
      var s = res[0], d = res[1];
      $("one-status").textContent = state.linkNote || "";
      if (!s.resp.ok) {
        showRequestError(errorMessage(s.resp, s.text));
        return;
      }
      var rec;
      try { rec = JSON.parse(s.text); } catch (e) { showRequestError("the answer was not JSON"); return; }
      state.record = rec;
      state.recordText = s.text.trim();
      if (!rec.ok) { showRecordError(rec); return; }
      try {
        showRecord(rec, d.resp.ok ? d.text : null);
      } catch (e) {
        showRequestError("the page could not show this result (" + e.message + "); please report it with the SMILES");
      }
    }, function (e) {
      if (my !== state.seq) return;
      $("one-status").textContent = "";
      showRequestError("the server could not be reached (" + e.message + "); is acidsite serve still running?");
    });
  }

  function showRequestError(msg) {
    var box = $("one-error");
    clear(box);
    box.appendChild(el("p", { cls: "what", text: "Error: " + msg }));
    box.hidden = false;
    $("one-result").hidden = true;
  }

  // A record that failed: the message and, when the position is known, the
  // input with a caret under the character.
  function showRecordError(rec) {
    var box = $("one-error");
    clear(box);
    var e = rec.error || { kind: "error", message: "the SMILES could not be analysed" };
    box.appendChild(el("p", { cls: "what", text: "This SMILES could not be read (" + e.kind + "): " + e.message }));
    if (e.position !== null && e.position !== undefined) {
      var chars = Array.from(rec.input || "");
      var pos = Math.min(e.position, chars.length);
      var from = Math.max(0, pos - 60);
      var to = Math.min(chars.length, pos + 40);
      var shown = (from > 0 ? "…" : "") + chars.slice(from, to).join("") + (to < chars.length ? "…" : "");
      var pad = (from > 0 ? 1 : 0) + (pos - from);
      var pre = el("pre", { "aria-label": "the SMILES with the position of the problem marked" });
      pre.appendChild(document.createTextNode(shown + "\n" + " ".repeat(pad)));
      pre.appendChild(el("span", { cls: "caret", text: "^ here (character " + e.position + ", counting from 0)" }));
      box.appendChild(pre);
    }
    box.appendChild(el("p", { cls: "help", text: "Correct the SMILES above and press Enter; the page keeps working." }));
    box.hidden = false;
    $("one-result").hidden = true;
  }

  function showRecord(rec, svgText) {
    $("one-error").hidden = true;
    $("one-result").hidden = false;
    var target = rec.advice ? rec.advice.target : [];
    showDrawing(svgText);
    showFacts(rec);
    showSites(rec, target);
    fillSiteChoices(rec);
    showAdvice(rec);
    showCautions(rec);
  }

  function showDrawing(svgText) {
    var box = $("drawing");
    clear(box);
    var svg = svgText ? importSvg(svgText) : null;
    if (!svg) {
      box.appendChild(el("p", { cls: "help", text: "No drawing for this input." }));
      return;
    }
    svg.setAttribute("role", "group");
    svg.setAttribute("aria-label", "structure drawing with the acidic sites marked");
    // Half as large again as drawn, never wider than the panel (CSS).
    ["width", "height"].forEach(function (k) {
      var v = parseFloat(svg.getAttribute(k));
      if (isFinite(v)) svg.setAttribute(k, String(Math.round(v * 1.5)));
    });
    Array.prototype.forEach.call(svg.querySelectorAll("g[data-atom]"), function (g) {
      var idx = g.getAttribute("data-atom");
      var label = g.querySelector("text");
      g.setAttribute("tabindex", "0");
      g.setAttribute("role", "button");
      g.setAttribute("aria-label", "atom " + idx + " (" + (label ? label.textContent : "C") + "): target its site");
      var title = document.createElementNS("http://www.w3.org/2000/svg", "title");
      title.textContent = "atom " + idx + ": click to target its site";
      g.appendChild(title);
      g.addEventListener("click", function () { chooseAtom(idx); });
      g.addEventListener("keydown", function (ev) {
        if (ev.key === "Enter" || ev.key === " ") { ev.preventDefault(); chooseAtom(idx); }
      });
    });
    box.appendChild(svg);
  }

  function chooseAtom(idx) {
    setSelect($("site"), String(idx));
    run();
  }

  function showFacts(rec) {
    var dl = $("facts");
    clear(dl);
    function add(k, v) { dl.appendChild(el("dt", { text: k })); dl.appendChild(el("dd", { text: v })); }
    if (rec.id) add("name", rec.id);
    add("formula", rec.formula || "–");
    var main = (rec.components || []).filter(function (c) { return c.role === "main"; })[0];
    var others = (rec.components || []).filter(function (c) { return c.role !== "main"; });
    if (main) add("analysed part", main.smiles + (main.formula ? "  (" + main.formula + ")" : ""));
    add("counter-ions", others.length ? others.map(function (c) { return c.smiles; }).join(", ") : "none");
    add("rule set", rec.rule_set || "–");
    if (rec.mapped_smiles) add("sites by rank", rec.mapped_smiles);
  }

  function showSites(rec, target) {
    var tb = $("sites").querySelector("tbody");
    clear(tb);
    var sites = rec.sites || [];
    if (!sites.length) {
      tb.appendChild(el("tr", null, el("td", { colspan: "9", text: "No acidic hydrogen found by the rule set." })));
      return;
    }
    sites.forEach(function (s) {
      var isTarget = s.atoms.some(function (a) { return target.indexOf(a) >= 0; });
      var btn = el("button", { type: "button", cls: "small", "aria-expanded": "false", text: "show" });
      var tr = el("tr", isTarget ? { cls: "target-row" } : null,
        el("td", { text: "#" + s.rank }),
        el("td", { text: s.element + atomsText(s.atoms) }),
        el("td", { text: s.hydrogens + "H" }),
        el("td", { text: s.class }),
        el("td", { cls: "num", text: fmt(s.pka_dmso) }),
        el("td", { cls: "num", text: fmt(s.pka_water) }),
        el("td", { cls: "num", text: "±" + fmt(s.uncertainty) }),
        el("td", { text: s.regio ? s.regio + " side" : "" }),
        el("td", null, btn));
      tb.appendChild(tr);
      var detail = null;
      btn.addEventListener("click", function () {
        if (detail) {
          detail.parentNode.removeChild(detail);
          detail = null;
          btn.textContent = "show";
          btn.setAttribute("aria-expanded", "false");
          return;
        }
        detail = el("tr", { cls: "rules-row" }, el("td", { colspan: "9", text: "loading the rules…" }));
        tr.parentNode.insertBefore(detail, tr.nextSibling);
        btn.textContent = "hide";
        btn.setAttribute("aria-expanded", "true");
        var here = detail;
        loadRules().then(function () {
          if (here !== detail) return;
          var td = here.firstChild;
          clear(td);
          td.appendChild(el("p", { cls: "note", text: "The estimate is the sum of these contributions (DMSO / water):" }));
          var ul = el("ul", { cls: "rules-list" });
          s.rules.forEach(function (r) {
            var info = state.rules[r.id];
            var li = el("li", null, el("strong", { text: r.id }),
              " " + fmt(r.dmso, 2) + " / " + fmt(r.water, 2));
            if (info) {
              var x = info.r;
              var what = info.kind === "class rule"
                ? "class rule: " + x.class + ", SMARTS " + x.smarts + ", ±" + fmt(x.uncertainty)
                : "increment: " + x.substituent + ", ±" + fmt(x.uncertainty);
              li.appendChild(document.createTextNode(" — " + what + "; source " + x.source +
                (state.sources[x.source] ? " (" + state.sources[x.source] + ")" : "") +
                (x.note ? "; " + x.note : "")));
            }
            ul.appendChild(li);
          });
          td.appendChild(ul);
        }, function () { here.firstChild.textContent = "The rules could not be loaded."; });
      });
    });
  }

  function fillSiteChoices(rec) {
    var sel = $("site");
    var keep = sel.value;
    while (sel.options.length > 1) sel.remove(1);
    (rec.sites || []).forEach(function (s) {
      sel.appendChild(el("option", {
        value: String(s.atoms[0]),
        text: "#" + s.rank + " " + s.element + atomsText(s.atoms) + " " + s.class + " (" + fmt(s.pka_dmso) + ")",
      }));
    });
    setSelect(sel, keep);
  }

  function showAdvice(rec) {
    var box = $("advice");
    clear(box);
    var a = rec.advice;
    if (!a) {
      box.appendChild(el("p", { text: rec.advice_note || "No advice for this molecule." }));
      return;
    }
    var head = el("p", { cls: "headline" });
    if (a.base) {
      head.appendChild(el("strong", { text: a.base }));
      head.appendChild(document.createTextNode(" · " + fmt(a.equivalents, 2) + " equiv · " + (a.solvent || "–") +
        " · " + temp(a.temperature_range_c, a.temperature_c)));
    } else {
      head.appendChild(el("strong", { text: "No catalogue base qualifies" }));
    }
    box.appendChild(head);
    var dl = el("dl");
    function add(k, v) {
      dl.appendChild(el("dt", { text: k }));
      dl.appendChild(typeof v === "string" ? el("dd", { text: v }) : el("dd", null, v));
    }
    add("target", "atom " + atomsText(a.target) + " — " + a.target_note);
    if (a.reaction) {
      var planned = el("div", null, el("span", { text: a.reaction + (a.control ? ", " + a.control + " control" : "") +
        (a.mode ? "; base used " + a.mode : "") }));
      if (a.mode_note) planned.appendChild(el("p", { cls: "note", text: a.mode_note }));
      add("planned reaction", planned);
    }
    if (a.base) add("base", a.base + "  " + fmt(a.equivalents, 2) + " equiv");
    var how = el("div", null, el("span", { text: a.equivalents_note }));
    if (a.counted && a.counted.length) {
      var ul = el("ul");
      a.counted.forEach(function (c) {
        ul.appendChild(el("li", { text: c.protons + " H at atom " + atomsText(c.atoms) + " (" + c.class + "): " + c.reason }));
      });
      how.appendChild(ul);
    }
    add("equivalents counted", how);
    add("solvent", a.solvent || "–");
    add("temperature", a.temperature_c !== null && a.temperature_c !== undefined
      ? temp(a.temperature_range_c, a.temperature_c) + ", start at " + fmt(a.temperature_c, 0) + " °C"
      : temp(a.temperature_range_c, a.temperature_c));
    add("at equilibrium", pct(a.conversion) + " of the target deprotonated");
    add("pKa basis", a.scale_note || (a.scale ? a.scale + " scale" : "–"));
    if (a.alternatives && a.alternatives.length) {
      var t = el("table", { cls: "grid" },
        el("thead", null, el("tr", null,
          el("th", { scope: "col", text: "base" }), el("th", { scope: "col", cls: "num", text: "equiv" }),
          el("th", { scope: "col", text: "solvent" }), el("th", { scope: "col", text: "temperature" }),
          el("th", { scope: "col", cls: "num", text: "at equilibrium" }), el("th", { scope: "col", text: "note" }))));
      var tb = el("tbody");
      a.alternatives.forEach(function (x) {
        tb.appendChild(el("tr", null, el("td", { text: x.base }), el("td", { cls: "num", text: fmt(x.equivalents, 2) }),
          el("td", { text: x.solvent }), el("td", { text: temp(x.temperature_range_c) }),
          el("td", { cls: "num", text: pct(x.conversion) }), el("td", { text: x.note })));
      });
      t.appendChild(tb);
      var wrap = el("div", { cls: "table-wrap" }, t);
      if (a.alternatives_omitted) wrap.appendChild(el("p", { cls: "note", text: a.alternatives_omitted + " more acceptable bases not listed (acidsite scan lists them)." }));
      add("also suitable", wrap);
    }
    if (a.rejected && a.rejected.length) {
      // The first few in view, the rest one click away.
      var SHOWN = 6;
      var ur = el("ul");
      var more = el("ul");
      a.rejected.forEach(function (r, i) {
        (i < SHOWN ? ur : more).appendChild(el("li", null, el("strong", { text: r.base }), " (" + r.kind + "): " + r.reason));
      });
      var out = el("div", null, ur);
      if (a.rejected.length > SHOWN) {
        out.appendChild(el("details", null,
          el("summary", { text: (a.rejected.length - SHOWN) + " more ruled out" }), more));
      }
      add("ruled out", out);
    }
    if (a.not_judged && a.not_judged.length) {
      add("not judged", a.not_judged.map(function (n) { return n.base + " (no " + n.missing + ")"; }).join("; "));
    }
    if (a.warnings && a.warnings.length) {
      var uw = el("ul", { cls: "warnings" });
      a.warnings.forEach(function (w) { uw.appendChild(el("li", { text: w })); });
      add("warnings", uw);
    }
    if (a.regio_conditions) {
      var rc = el("div");
      [["kinetic", a.regio_conditions.kinetic], ["thermodynamic", a.regio_conditions.thermodynamic]].forEach(function (p) {
        var x = p[1];
        rc.appendChild(el("p", null, el("strong", { text: p[0] + " enolate (atom " + atomsText(x.favours) + "): " }),
          x.base + ", " + fmt(x.equivalents, 2) + " equiv, " + x.solvent + ", " + temp(x.temperature_range_c) + ". " + x.procedure));
      });
      add("enolate side", rc);
    }
    box.appendChild(dl);
  }

  function showCautions(rec) {
    var box = $("cautions");
    clear(box);
    var list = rec.advice ? rec.advice.cautions || [] : [];
    var hazards = rec.hazards || [];
    hazards.forEach(function (h) {
      box.appendChild(el("div", { cls: "caution" },
        el("p", null, el("span", { cls: "reagent", text: "This substrate" }), " ",
          el("span", { cls: "hz", text: "[" + h.id + "]" })),
        el("p", { text: h.text })));
    });
    if (!list.length) {
      box.appendChild(el("p", { text: hazards.length
        ? "No reagent named. Follow local regulations, the safety data sheet and the judgement of qualified chemists; any reaction needs its own risk assessment."
        : "No reagent named, so no caution. Any reaction still needs its own risk assessment." }));
      return;
    }
    list.forEach(function (c) {
      box.appendChild(el("div", { cls: "caution" },
        el("p", null, el("span", { cls: "reagent", text: c.reagent }), " ",
          el("span", { cls: "hz", text: c.hazards.length ? "[" + c.hazards.join(", ") + "]" : "" })),
        el("p", { text: c.text })));
    });
  }

  $("one-form").addEventListener("submit", function (ev) { ev.preventDefault(); run(); });
  function showReactionSummary() {
    var r = $("reaction").value;
    $("reaction-help").textContent = r && state.reactionSummary ? state.reactionSummary[r] || "" : "";
  }
  $("reaction").addEventListener("change", showReactionSummary);
  ["reaction", "control", "site", "base"].forEach(function (id) {
    $(id).addEventListener("change", function () { if ($("smiles").value.trim()) run(); else updateUrl(); });
  });
  Array.prototype.forEach.call(document.querySelectorAll('input[name="scale"]'), function (r) {
    r.addEventListener("change", function () { if ($("smiles").value.trim()) run(); else updateUrl(); });
  });
  // Once the form is changed by hand, a note about the opening link is stale.
  $("one-form").addEventListener("input", function () { state.linkNote = ""; });
  $("one-form").addEventListener("change", function () { state.linkNote = ""; });
  $("smiles").addEventListener("input", function () {
    // A new molecule: a chosen atom of the old one means nothing any more.
    $("site").value = "";
    updateUrl();
  });
  $("name").addEventListener("input", updateUrl);
  $("copy-json").addEventListener("click", function () {
    if (state.recordText) copyText(state.recordText, $("copy-note"));
  });
  $("copy-mapped").addEventListener("click", function () {
    if (state.record && state.record.mapped_smiles) copyText(state.record.mapped_smiles, $("copy-note"));
  });
  $("copy-link").addEventListener("click", function () { copyText(location.href, $("copy-note")); });

  // ---------- start ----------
  loadOptions().catch(function () {
    $("build").textContent = "The build options could not be loaded; is acidsite serve still running?";
  }).then(function () {
    var filled = fillFromUrl();
    showReactionSummary();
    if (filled) run();
    else $("smiles").focus();
  });
})();
