// acidsite page, shared helpers (loaded first). Every piece of text that
// comes from the input or a record is put into the page with textContent
// (never as HTML); the only markup taken from the server is the structure
// drawing, parsed as SVG, checked and imported by importSvg.
"use strict";

window.acidsitePage = (function () {
  function el(tag, attrs) {
    var e = document.createElement(tag);
    if (attrs) {
      Object.keys(attrs).forEach(function (k) {
        if (k === "text") e.textContent = attrs[k];
        else if (k === "cls") e.className = attrs[k];
        else e.setAttribute(k, attrs[k]);
      });
    }
    for (var i = 2; i < arguments.length; i++) {
      var c = arguments[i];
      if (c === null || c === undefined) continue;
      e.appendChild(typeof c === "string" ? document.createTextNode(c) : c);
    }
    return e;
  }
  function clear(node) { while (node.firstChild) node.removeChild(node.firstChild); }
  function fmt(x, digits) {
    if (x === null || x === undefined || !isFinite(x)) return "–";
    return Number(x).toFixed(digits === undefined ? 1 : digits);
  }
  function pct(x) {
    if (x === null || x === undefined) return "–";
    if (x >= 0.9999) return "> 99.99 %";
    if (x < 0.0001) return "< 0.01 %";
    return (100 * x).toFixed(x > 0.99 ? 2 : 1) + " %";
  }
  function temp(range, start) {
    if (!range) return start === null || start === undefined ? "–" : fmt(start, 0) + " °C";
    if (range[0] === range[1]) return fmt(range[0], 0) + " °C";
    return fmt(range[0], 0) + " to " + fmt(range[1], 0) + " °C";
  }
  function atomsText(atoms) {
    return (atoms || []).join(", ");
  }
  function errorMessage(resp, body) {
    try {
      var j = JSON.parse(body);
      if (j && j.error) return j.error.message;
    } catch (e) { /* not JSON */ }
    return "the server answered " + resp.status + " " + resp.statusText;
  }
  function postJSON(path, obj) {
    return fetch(path, {
      method: "POST",
      headers: { "Content-Type": "application/json" },
      body: JSON.stringify(obj),
    }).then(function (r) {
      return r.text().then(function (t) { return { resp: r, text: t }; });
    });
  }

  // Parse SVG text from the server and import it; anything that could run
  // script (script, foreignObject, event attributes, javascript: links) is
  // dropped first.
  function importSvg(text) {
    var doc = new DOMParser().parseFromString(text, "image/svg+xml");
    var root = doc.documentElement;
    if (!root || root.nodeName !== "svg" || doc.getElementsByTagName("parsererror").length) return null;
    Array.prototype.slice.call(root.querySelectorAll("script, foreignObject, iframe, a")).forEach(function (n) {
      n.parentNode.removeChild(n);
    });
    Array.prototype.slice.call(root.querySelectorAll("*")).concat([root]).forEach(function (n) {
      Array.prototype.slice.call(n.attributes).forEach(function (a) {
        if (/^on/i.test(a.name) || /javascript:/i.test(a.value) || a.name === "href" || a.name === "xlink:href") {
          n.removeAttribute(a.name);
        }
      });
    });
    return document.importNode(root, true);
  }

  function copyText(text, note) {
    function done(ok) {
      note.textContent = ok ? "Copied." : "Copy failed: select and copy by hand.";
      setTimeout(function () { note.textContent = ""; }, 2500);
    }
    if (navigator.clipboard && window.isSecureContext) {
      navigator.clipboard.writeText(text).then(function () { done(true); }, function () { fallback(); });
    } else {
      fallback();
    }
    function fallback() {
      var t = el("textarea", { "aria-hidden": "true" });
      t.value = text;
      t.style.position = "fixed";
      t.style.left = "-9999px";
      document.body.appendChild(t);
      t.select();
      var ok = false;
      try { ok = document.execCommand("copy"); } catch (e) { ok = false; }
      document.body.removeChild(t);
      done(ok);
    }
  }

  function download(blob, name) {
    var url = URL.createObjectURL(blob);
    var a = el("a", { href: url, download: name });
    document.body.appendChild(a);
    a.click();
    document.body.removeChild(a);
    setTimeout(function () { URL.revokeObjectURL(url); }, 10000);
  }

  return {
    el: el,
    clear: clear,
    fmt: fmt,
    pct: pct,
    temp: temp,
    atomsText: atomsText,
    errorMessage: errorMessage,
    postJSON: postJSON,
    importSvg: importSvg,
    copyText: copyText,
    download: download,
    $: function (id) { return document.getElementById(id); },
    state: { options: null },
  };
})();
