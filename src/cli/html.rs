//! `annotate --html REPORT.html`: one self-contained HTML page with a card per
//! record (drawing, id, top site and pKa, base and equivalents, warnings;
//! failed records as errors), in input order.
//!
//! No network, no external scripts or fonts. Each drawing's SVG text sits in
//! a `<script type="text/x-svg">` block (kept as plain text by the browser,
//! not built into elements) and is put in place by a small inline script when
//! its card comes near the viewport; cards use `content-visibility: auto`.
//! Measured in headless Chromium on 10,000 records (60 MB): see README.

use acidsite::report::Record;
use std::fmt::Write;

/// Page start: styles and the heading.
pub fn head(title: &str) -> String {
    format!(
        r#"<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{t}</title>
<style>
body {{ font: 14px/1.35 system-ui, "DejaVu Sans", Arial, sans-serif; margin: 0; background: #f3f3f1; color: #161616; }}
header {{ padding: 12px 18px; background: #fff; border-bottom: 1px solid #ccc; }}
header h1 {{ font-size: 18px; margin: 0 0 4px; }}
header p {{ margin: 0; color: #444; }}
main {{ display: grid; grid-template-columns: repeat(auto-fill, minmax(330px, 1fr)); gap: 12px; padding: 12px 18px; }}
.card {{ background: #fff; border: 1px solid #c8c8c8; border-radius: 6px; padding: 10px 12px; content-visibility: auto; contain-intrinsic-size: auto 420px; }}
.card.err {{ border: 2px solid #8a1c1c; background: #fff6f4; }}
.card h2 {{ font-size: 15px; margin: 0 0 2px; overflow-wrap: anywhere; }}
.card .line {{ color: #555; font-weight: normal; font-size: 12px; }}
.pic {{ height: 230px; display: flex; align-items: center; justify-content: center; }}
.pic svg {{ max-width: 100%; max-height: 230px; height: auto; }}
.smiles {{ font: 12px ui-monospace, "DejaVu Sans Mono", monospace; color: #333; overflow-wrap: anywhere; margin: 4px 0; }}
dl {{ display: grid; grid-template-columns: 6.5em 1fr; gap: 2px 8px; margin: 6px 0 0; }}
dt {{ color: #555; }} dd {{ margin: 0; }}
.warn {{ margin: 6px 0 0; padding-left: 18px; color: #6b3d00; }}
.error {{ color: #8a1c1c; font-weight: bold; }}
.key {{ font-size: 12px; color: #333; margin-top: 6px; }}
.key span {{ display: inline-block; width: 11px; height: 11px; border-radius: 50%; vertical-align: -1px; margin: 0 3px 0 10px; }}
</style></head><body>
<header><h1>{t}</h1>
<p>Acidic sites by rank: <span class="keyitem">#1 dark disc, #2 amber disc with outline, #3 and lower pale dotted disc; dashed ring: the advice target; label: rank and DMSO pKa.</span>
pKa values are estimates from fragment rules (± one standard uncertainty in the JSON record); advice is a planning aid, not a procedure: follow local regulations, the safety data sheets and qualified chemists.</p>
<noscript><p class="error">Drawings appear when scripts are allowed (the page needs no network).</p></noscript>
</header>
<main>
"#,
        t = esc(title)
    )
}

/// Page end: the inline script that puts drawings in place near the viewport.
pub fn tail(records: u64, failed: u64) -> String {
    format!(
        r#"</main>
<footer style="padding: 8px 18px 20px; color: #555">{records} records, {failed} failed.</footer>
<script>
(function () {{
  function show(card) {{
    var t = card.querySelector("script");
    if (t) {{ card.querySelector(".pic").innerHTML = t.textContent; t.remove(); }}
  }}
  var cards = document.querySelectorAll("article.card");
  if (!("IntersectionObserver" in window)) {{ cards.forEach(show); return; }}
  var io = new IntersectionObserver(function (es) {{
    es.forEach(function (e) {{ if (e.isIntersecting) {{ show(e.target); io.unobserve(e.target); }} }});
  }}, {{ rootMargin: "800px 0px" }});
  cards.forEach(function (c) {{ io.observe(c); }});
}})();
</script>
</body></html>
"#
    )
}

/// One record's card; `svg` is its drawing (None for failed records).
pub fn card(rec: &Record, svg: Option<&str>) -> String {
    let mut s = String::with_capacity(svg.map_or(0, str::len) + 800);
    let title = rec
        .id
        .as_deref()
        .map(esc)
        .unwrap_or_else(|| format!("line {}", rec.line));
    if !rec.ok {
        let _ = write!(
            s,
            r#"<article class="card err" id="line-{l}"><h2>{title} <span class="line">line {l}</span></h2><p class="smiles">{smi}</p>"#,
            l = rec.line,
            smi = esc(&rec.input)
        );
        if let Some(e) = &rec.error {
            let at = e
                .position
                .map(|p| format!(" (at character {p})"))
                .unwrap_or_default();
            let _ = write!(
                s,
                r#"<p class="error">error ({}): {}{at}</p>"#,
                esc(&e.kind),
                esc(&e.message)
            );
        }
        s.push_str("</article>\n");
        return s;
    }
    let _ = write!(
        s,
        r#"<article class="card" id="line-{l}"><script type="text/x-svg">{svg}</script><div class="pic"></div><h2>{title} <span class="line">line {l}</span></h2><p class="smiles">{smi}</p><dl>"#,
        l = rec.line,
        svg = svg.unwrap_or(""),
        smi = esc(&rec.input)
    );
    match rec.top_carbon_site() {
        Some(site) => {
            let _ = write!(
                s,
                "<dt>top C–H site</dt><dd>#{} {}{} {} · pKa {} (DMSO)</dd>",
                site.rank,
                esc(&site.element),
                site.atoms
                    .first()
                    .map(|a| a.to_string())
                    .unwrap_or_default(),
                esc(&site.class),
                site.pka_dmso
                    .map(|p| format!("{p:.1}"))
                    .unwrap_or_else(|| "–".into())
            );
        }
        None => s.push_str("<dt>top C–H site</dt><dd>none found</dd>"),
    }
    let advice = rec.advice.as_ref().and_then(|a| a.as_ref());
    match advice.and_then(|a| a.base.as_ref().map(|b| (a, b))) {
        Some((a, base)) => {
            let _ = write!(
                s,
                "<dt>base</dt><dd>{} {} equiv{}</dd>",
                esc(base),
                a.equivalents
                    .map(|e| format!("{e:.2}"))
                    .unwrap_or_else(|| "–".into()),
                a.solvent
                    .as_deref()
                    .map(|v| format!(" in {}", esc(v)))
                    .unwrap_or_default()
            );
        }
        None => {
            let note = rec.advice_note.as_deref().unwrap_or("no base recommended");
            let _ = write!(s, "<dt>base</dt><dd>{}</dd>", esc(note));
        }
    }
    s.push_str("</dl>");
    if let Some(a) = advice {
        if !a.warnings.is_empty() {
            s.push_str(r#"<ul class="warn">"#);
            for w in &a.warnings {
                let _ = write!(s, "<li>{}</li>", esc(w));
            }
            s.push_str("</ul>");
        }
    }
    s.push_str("</article>\n");
    s
}

/// Escape text for HTML element content and attribute values.
pub fn esc(t: &str) -> String {
    let mut o = String::with_capacity(t.len());
    for c in t.chars() {
        match c {
            '&' => o.push_str("&amp;"),
            '<' => o.push_str("&lt;"),
            '>' => o.push_str("&gt;"),
            '"' => o.push_str("&quot;"),
            '\'' => o.push_str("&#39;"),
            c => o.push(c),
        }
    }
    o
}
