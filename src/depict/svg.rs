//! The SVG writer: a drawing as a chemist draws it (carbon as a vertex,
//! heteroatoms with their hydrogens, Kekulé bonds with the second line of a
//! ring double bond inside the ring), with the acidic sites marked by rank
//! and the advice target ringed.
//!
//! Marks are coded by shape and lightness as well as hue, so they read in
//! greyscale and for colour-blind readers: rank 1 a dark blue disc, rank 2
//! a lighter amber disc with an outline, rank 3 and lower a pale grey disc
//! with a dotted outline; every mark also has its text label (`#1 26.4`:
//! rank and DMSO pKa). The target is a black dashed ring with the word
//! `target`.

use super::geom::Point;
use super::labels::{charge_text, label, text_width, HSide, Label};
use super::Layout;
use crate::mol::Molecule;
use crate::report::Record;
use std::fmt::Write;

/// One acidic site to mark.
#[derive(Debug, Clone, PartialEq)]
pub struct SiteMark {
    /// Rank (1 = most acidic).
    pub rank: u32,
    /// Atoms of the site (0-based input order); the label goes on the first.
    pub atoms: Vec<usize>,
    /// DMSO pKa estimate shown in the label, if any.
    pub pka: Option<f64>,
}

/// What to mark on a drawing.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Marks {
    /// Acidic sites, marked by rank.
    pub sites: Vec<SiteMark>,
    /// Atoms of the advice target, ringed and labelled `target`.
    pub target: Option<Vec<usize>>,
}

impl Marks {
    /// The sites and the advice target of an analysis record (none for a
    /// failed record). Background (unactivated alkane, aryl, vinyl …) C–H sites are not
    /// marked (an advice target is still ringed).
    pub fn from_record(rec: &Record) -> Marks {
        let sites = rec
            .sites
            .as_deref()
            .unwrap_or(&[])
            .iter()
            .filter(|s| !s.background)
            .map(|s| SiteMark {
                rank: s.rank,
                atoms: s.atoms.clone(),
                pka: s.pka_dmso,
            })
            .collect();
        let target = rec
            .advice
            .as_ref()
            .and_then(|a| a.as_ref())
            .map(|a| a.target.clone())
            .filter(|t| !t.is_empty());
        Marks { sites, target }
    }
}

/// Drawing options.
#[derive(Debug, Clone, PartialEq)]
pub struct SvgOptions {
    /// Pixels per bond length.
    pub bond_px: f64,
    /// Atom label font size in pixels.
    pub font_px: f64,
    /// Show the sites ranked up to this (the target's site is always shown).
    pub max_sites: usize,
}

impl Default for SvgOptions {
    fn default() -> Self {
        SvgOptions {
            bond_px: 36.0,
            font_px: 14.0,
            max_sites: 5,
        }
    }
}

const INK: &str = "#111";
const HALO: &str = "fill=\"#111\" stroke=\"#fff\" stroke-width=\"3\" paint-order=\"stroke\" stroke-linejoin=\"round\"";

/// Write the SVG drawing of `mol` at `layout` with `marks`. Every atom is a
/// `<g>` element carrying `data-atom` (0-based input index), `data-x` and
/// `data-y` (its drawing coordinates in pixels); bonds are `<path>`s
/// carrying `data-bond`; a stereo wedge also carries `data-stereo`
/// (`wedge`: a filled triangle, `hash`: stripes) and `data-narrow` (the
/// stereocentre at its narrow end). Atoms missing from the layout are
/// drawn at the origin.
pub fn svg(mol: &Molecule, layout: &Layout, marks: &Marks, opts: &SvgOptions) -> String {
    let n = mol.atom_count();
    let bond = if opts.bond_px.is_finite() && opts.bond_px > 1.0 {
        opts.bond_px.min(400.0)
    } else {
        36.0
    };
    let fs = if opts.font_px.is_finite() && opts.font_px > 1.0 {
        opts.font_px.min(200.0)
    } else {
        bond * 0.39
    };
    let margin = bond * 0.9;
    let raw: Vec<Point> = (0..n)
        .map(|i| {
            layout
                .points
                .get(i)
                .copied()
                .filter(|p| p.is_finite())
                .unwrap_or_default()
        })
        .collect();
    let pts: Vec<Point> = raw
        .iter()
        .map(|p| Point::new(p.x * bond + margin, p.y * bond + margin))
        .collect();
    let labels: Vec<Option<Label>> = (0..n).map(|i| label(mol, i, &pts)).collect();

    // Mark labels first: their boxes widen the picture.
    let target = marks.target.as_deref().unwrap_or(&[]);
    let shown: Vec<&SiteMark> = marks
        .sites
        .iter()
        .filter(|s| {
            (s.rank as usize) <= opts.max_sites || s.atoms.iter().any(|a| target.contains(a))
        })
        .collect();
    let mfs = (fs * 0.8).max(8.0);
    let mut boxes: Vec<(Point, Point)> = Vec::new();
    let mut texts: Vec<(Point, Vec<String>)> = Vec::new();
    let mut target_labelled = false;
    for s in &shown {
        let Some(&a) = s.atoms.iter().find(|&&a| a < n) else {
            continue;
        };
        let mut lines = vec![match s.pka {
            Some(p) => format!("#{} {:.1}", s.rank, p),
            None => format!("#{}", s.rank),
        }];
        if !target_labelled && s.atoms.iter().any(|x| target.contains(x)) {
            lines.push("target".to_string());
            target_labelled = true;
        }
        let (c, b) = place_text(mol, &pts, &labels, a, &lines, fs, mfs, bond, &boxes, target);
        boxes.push(b);
        texts.push((c, lines));
    }
    if !target_labelled {
        if let Some(&a) = target.iter().find(|&&a| a < n) {
            let lines = vec!["target".to_string()];
            let (c, b) = place_text(mol, &pts, &labels, a, &lines, fs, mfs, bond, &boxes, target);
            boxes.push(b);
            texts.push((c, lines));
        }
    }

    let (mut lo, mut hi) = (Point::new(0.0, 0.0), Point::new(0.0, 0.0));
    if n > 0 {
        lo = Point::new(f64::MAX, f64::MAX);
        hi = Point::new(f64::MIN, f64::MIN);
        for p in &pts {
            lo = Point::new(lo.x.min(p.x - margin), lo.y.min(p.y - margin));
            hi = Point::new(hi.x.max(p.x + margin), hi.y.max(p.y + margin));
        }
    }
    for (a, b) in &boxes {
        lo = Point::new(lo.x.min(a.x - 4.0), lo.y.min(a.y - 4.0));
        hi = Point::new(hi.x.max(b.x + 4.0), hi.y.max(b.y + 4.0));
    }
    let (w, h) = ((hi.x - lo.x).max(1.0), (hi.y - lo.y).max(1.0));
    let mut out = String::with_capacity(300 + n * 160);
    let _ = write!(
        out,
        r#"<svg xmlns="http://www.w3.org/2000/svg" class="acidsite-drawing" viewBox="{} {} {} {}" width="{}" height="{}" font-family="DejaVu Sans, Arial, Helvetica, sans-serif">"#,
        f(lo.x),
        f(lo.y),
        f(w),
        f(h),
        w.round(),
        h.round()
    );
    let _ = write!(
        out,
        r##"<rect x="{}" y="{}" width="{}" height="{}" fill="#fff"/>"##,
        f(lo.x),
        f(lo.y),
        f(w),
        f(h)
    );

    // Site marks (under the bonds), lowest rank drawn last.
    out.push_str(r#"<g class="sites">"#);
    let rad = bond * 0.36;
    for s in shown.iter().rev() {
        let style = match s.rank {
            1 => r##"fill="#2b5d9e" fill-opacity="0.55""##,
            2 => r##"fill="#e0a838" fill-opacity="0.5" stroke="#9a6b10" stroke-width="1""##,
            _ => {
                r##"fill="#9a9a9a" fill-opacity="0.25" stroke="#555" stroke-width="1" stroke-dasharray="1.5 2""##
            }
        };
        for &a in s.atoms.iter().filter(|&&a| a < n) {
            let _ = write!(
                out,
                r#"<circle class="site rank-{}" cx="{}" cy="{}" r="{}" {style}/>"#,
                s.rank,
                f(pts[a].x),
                f(pts[a].y),
                f(rad)
            );
        }
    }
    for &a in target.iter().filter(|&&a| a < n) {
        let _ = write!(
            out,
            r#"<circle class="target" cx="{}" cy="{}" r="{}" fill="none" stroke="{INK}" stroke-width="2" stroke-dasharray="5 3"/>"#,
            f(pts[a].x),
            f(pts[a].y),
            f(bond * 0.52)
        );
    }
    out.push_str("</g>");

    // Bonds.
    let _ = write!(
        out,
        r#"<g class="bonds" stroke="{INK}" stroke-width="{}" stroke-linecap="round" fill="none">"#,
        f((bond / 24.0).clamp(1.0, 4.0))
    );
    let wedges = super::stereo::wedges(mol, layout);
    for (k, b) in mol.bonds.iter().enumerate() {
        let [i, j] = b.atoms;
        if let Some(w) = wedges.iter().find(|w| w.bond == k) {
            let (kind, d) = wedge_path(&pts, &labels, w, fs, bond);
            let fill = if w.hash { "none" } else { INK };
            let _ = write!(
                out,
                r#"<path data-bond="{k}" data-atoms="{i} {j}" data-stereo="{kind}" data-narrow="{}" d="{d}" fill="{fill}" stroke-linejoin="round"/>"#,
                w.centre
            );
            continue;
        }
        let d = bond_path(mol, &pts, &labels, k, fs, bond);
        let _ = write!(
            out,
            r#"<path data-bond="{k}" data-atoms="{i} {j}" d="{d}"/>"#
        );
    }
    out.push_str("</g>");

    // Atoms: one group each, with the label text for labelled atoms.
    let _ = write!(
        out,
        r#"<g class="atoms" font-size="{}" fill="{INK}">"#,
        f(fs)
    );
    for i in 0..n {
        let p = pts[i];
        let _ = write!(
            out,
            r#"<g data-atom="{i}" data-x="{}" data-y="{}"><circle cx="{}" cy="{}" r="{}" fill="none"/>"#,
            f(p.x),
            f(p.y),
            f(p.x),
            f(p.y),
            f(fs * 0.5)
        );
        if let Some(l) = &labels[i] {
            write_label(&mut out, l, p, fs);
        }
        out.push_str("</g>");
    }
    out.push_str("</g>");

    // Mark labels on top.
    let _ = write!(
        out,
        r#"<g class="site-labels" font-size="{}" font-weight="bold">"#,
        f(mfs)
    );
    for (c, lines) in &texts {
        let total = lines.len() as f64 * mfs * 1.15;
        for (k, line) in lines.iter().enumerate() {
            let y = c.y - total / 2.0 + mfs * (0.85 + 1.15 * k as f64);
            let _ = write!(
                out,
                r#"<text x="{}" y="{}" text-anchor="middle" {HALO}>{}</text>"#,
                f(c.x),
                f(y),
                line
            );
        }
    }
    out.push_str("</g></svg>");
    out
}

/// A number for the SVG text: one decimal, no trailing `.0`.
fn f(x: f64) -> String {
    let r = (x * 10.0).round() / 10.0;
    if r == r.trunc() {
        format!("{}", r as i64)
    } else {
        format!("{r:.1}")
    }
}

/// Radius around a labelled atom that bonds stop short of.
fn clip_radius(l: &Option<Label>, fs: f64) -> f64 {
    match l {
        Some(l) if l.element.len() > 1 => fs * 0.72,
        Some(_) => fs * 0.58,
        None => 0.0,
    }
}

/// Kind (`wedge` or `hash`) and path data of a wedge: a filled triangle,
/// or stripes across the bond widening from the centre, so both read in
/// greyscale.
fn wedge_path(
    pts: &[Point],
    labels: &[Option<Label>],
    w: &super::Wedge,
    fs: f64,
    bond: f64,
) -> (&'static str, String) {
    let (pc, pf) = (pts[w.centre], pts[w.far]);
    let len = pc.dist(pf);
    let kind = if w.hash { "hash" } else { "wedge" };
    let (rc, rf) = (
        clip_radius(&labels[w.centre], fs),
        clip_radius(&labels[w.far], fs),
    );
    if len < 1e-6 || rc + rf >= len * 0.9 {
        return (kind, format!("M{} {}", f(pc.x), f(pc.y)));
    }
    let u = (pf - pc) * (1.0 / len);
    let a = pc + u * rc;
    // The wide end stops a little further from a label, so stripes and
    // text do not touch.
    let gap = if labels[w.far].is_some() {
        bond * 0.08
    } else {
        0.0
    };
    let e = pf - u * (rf + gap);
    let nrm = u.perp();
    let half = bond * 0.1;
    if !w.hash {
        let (e1, e2) = (e + nrm * half, e - nrm * half);
        let d = format!(
            "M{} {}L{} {}L{} {}Z",
            f(a.x),
            f(a.y),
            f(e1.x),
            f(e1.y),
            f(e2.x),
            f(e2.y)
        );
        return (kind, d);
    }
    let span = a.dist(e);
    let stripes = ((span / (bond * 0.14)).round() as usize).clamp(3, 12);
    let mut d = String::new();
    for s in 1..=stripes {
        let t = s as f64 / stripes as f64;
        let c = a + (e - a) * t;
        let h = half * t;
        let (p1, p2) = (c + nrm * h, c - nrm * h);
        let _ = write!(d, "M{} {}L{} {}", f(p1.x), f(p1.y), f(p2.x), f(p2.y));
    }
    (kind, d)
}

/// Path data for bond `k`.
fn bond_path(
    mol: &Molecule,
    pts: &[Point],
    labels: &[Option<Label>],
    k: usize,
    fs: f64,
    bond: f64,
) -> String {
    let b = &mol.bonds[k];
    let [i, j] = b.atoms;
    let (pi, pj) = (pts[i], pts[j]);
    let len = pi.dist(pj);
    if len < 1e-6 {
        return format!("M{} {}", f(pi.x), f(pi.y));
    }
    let u = (pj - pi) * (1.0 / len);
    let (ri, rj) = (clip_radius(&labels[i], fs), clip_radius(&labels[j], fs));
    if ri + rj >= len * 0.9 {
        return format!("M{} {}", f(pi.x), f(pi.y));
    }
    let a = pi + u * ri;
    let e = pj - u * rj;
    let seg = |p: Point, q: Point| format!("M{} {}L{} {}", f(p.x), f(p.y), f(q.x), f(q.y));
    let gap = bond * 0.17;
    let nrm = u.perp();
    match b.kekule {
        2 => {
            let side = double_side(mol, pts, labels, k);
            if side == 0.0 {
                let o = nrm * (gap / 2.0);
                seg(a + o, e + o) + &seg(a - o, e - o)
            } else {
                let o = nrm * (gap * side);
                let trim_i = if labels[i].is_some() {
                    0.0
                } else {
                    bond * 0.13
                };
                let trim_j = if labels[j].is_some() {
                    0.0
                } else {
                    bond * 0.13
                };
                seg(a, e) + &seg(a + o + u * trim_i, e + o - u * trim_j)
            }
        }
        3 | 4 => {
            let o = nrm * gap;
            seg(a, e) + &seg(a + o, e + o) + &seg(a - o, e - o)
        }
        _ => seg(a, e),
    }
}

/// Side (±1 along the bond's normal, 0 = centred) for the second line of a
/// double bond: inside the smallest ring holding it, else towards the side
/// with more neighbours; centred at a terminal heteroatom.
fn double_side(mol: &Molecule, pts: &[Point], labels: &[Option<Label>], k: usize) -> f64 {
    let [i, j] = mol.bonds[k].atoms;
    let dir = pts[j] - pts[i];
    if mol.bond_in_ring(k) {
        let ring = mol
            .rings()
            .filter(|r| r.contains(&i) && r.contains(&j))
            .min_by_key(|r| r.len());
        if let Some(r) = ring {
            let c = super::geom::centroid(r.iter().map(|&a| pts[a]));
            let s = dir.cross(c - pts[i]);
            return if s >= 0.0 { 1.0 } else { -1.0 };
        }
    }
    let (di, dj) = (mol.degree(i), mol.degree(j));
    if (di == 1 && labels[i].is_some()) || (dj == 1 && labels[j].is_some()) || (di == 1 && dj == 1)
    {
        return 0.0;
    }
    let mut sum = 0.0;
    for (x, other) in [(i, j), (j, i)] {
        for nb in mol.neighbors(x) {
            if nb.atom != other {
                let c = dir.cross(pts[nb.atom] - pts[i]);
                if c.abs() > 1e-6 {
                    sum += c.signum();
                }
            }
        }
    }
    if sum > 0.0 {
        1.0
    } else if sum < 0.0 {
        -1.0
    } else {
        0.0
    }
}

/// Write the label text of an atom at `p`.
fn write_label(out: &mut String, l: &Label, p: Point, fs: f64) {
    let base = p.y + fs * 0.36;
    let ew = text_width(l.element) * fs;
    let sub = fs * 0.7;
    let _ = write!(
        out,
        r#"<text x="{}" y="{}" text-anchor="middle">{}</text>"#,
        f(p.x),
        f(base),
        l.element
    );
    let hcount = if l.hydrogens > 1 {
        l.hydrogens.to_string()
    } else {
        String::new()
    };
    let hw = if l.hydrogens > 0 {
        (0.68 + 0.56 * hcount.len() as f64 * 0.7) * fs
    } else {
        0.0
    };
    let hsub = |x: f64, y: f64, anchor: &str| {
        let mut s = format!(
            r#"<text x="{}" y="{}" text-anchor="{anchor}">H"#,
            f(x),
            f(y)
        );
        if !hcount.is_empty() {
            let _ = write!(
                s,
                r#"<tspan dy="{}" font-size="{}">{}</tspan>"#,
                f(fs * 0.25),
                f(sub),
                hcount
            );
        }
        s.push_str("</text>");
        s
    };
    let mut right_end = p.x + ew / 2.0;
    let mut left_end = p.x - ew / 2.0;
    if l.hydrogens > 0 {
        match l.h_side {
            HSide::Right => {
                out.push_str(&hsub(right_end, base, "start"));
                right_end += hw;
            }
            HSide::Left => {
                out.push_str(&hsub(left_end - hw, base, "start"));
                left_end -= hw;
            }
            HSide::Above => out.push_str(&hsub(p.x - fs * 0.34, base - fs * 1.05, "start")),
            HSide::Below => out.push_str(&hsub(p.x - fs * 0.34, base + fs * 1.05, "start")),
        }
    }
    if l.charge != 0 {
        let _ = write!(
            out,
            r#"<text x="{}" y="{}" font-size="{}" text-anchor="start">{}</text>"#,
            f(right_end + fs * 0.02),
            f(base - fs * 0.5),
            f(sub),
            charge_text(l.charge)
        );
    }
    if let Some(iso) = l.isotope {
        let _ = write!(
            out,
            r#"<text x="{}" y="{}" font-size="{}" text-anchor="end">{iso}</text>"#,
            f(left_end - fs * 0.02),
            f(base - fs * 0.5),
            f(sub)
        );
    }
}

/// Place a mark label near atom `a`: the free direction where the text box
/// stays clear of atoms, bonds and other mark labels. Returns the text
/// centre and its box (top-left, bottom-right).
#[allow(clippy::too_many_arguments)]
fn place_text(
    mol: &Molecule,
    pts: &[Point],
    labels: &[Option<Label>],
    a: usize,
    lines: &[String],
    fs: f64,
    mfs: f64,
    bond: f64,
    boxes: &[(Point, Point)],
    target: &[usize],
) -> (Point, (Point, Point)) {
    let w = lines.iter().map(|l| text_width(l)).fold(0.0, f64::max) * mfs;
    let h = lines.len() as f64 * mfs * 1.15;
    let mut best: Option<(f64, Point)> = None;
    // Nearby atoms, bond sample points and atom label boxes.
    let mut label_boxes: Vec<(Point, Point)> = Vec::new();
    let near: Vec<Point> = {
        let mut v = Vec::new();
        for (i, p) in pts.iter().enumerate() {
            if p.dist(pts[a]) < bond * 4.0 {
                v.push(*p);
                if let Some(l) = &labels[i] {
                    label_boxes.push(label_box(l, *p, fs));
                }
            }
        }
        for b in &mol.bonds {
            let (p, q) = (pts[b.atoms[0]], pts[b.atoms[1]]);
            if p.dist(pts[a]) < bond * 4.0 {
                for t in 1..6 {
                    v.push(p + (q - p) * (t as f64 / 6.0));
                }
            }
        }
        v
    };
    let ring_centres: Vec<(Point, f64)> = mol
        .rings()
        .filter(|r| r.len() <= 8 && r.iter().any(|&x| pts[x].dist(pts[a]) < bond * 3.0))
        .map(|r| {
            let c = super::geom::centroid(r.iter().map(|&x| pts[x]));
            (c, pts[r[0]].dist(c))
        })
        .collect();
    for step in 0..24 {
        // Start up and to the right, then go round.
        let ang = -std::f64::consts::FRAC_PI_4 + step as f64 * std::f64::consts::PI / 12.0;
        let d = Point::polar(ang);
        let ringed = if target.contains(&a) { 0.66 } else { 0.5 };
        let reach = bond * ringed + (d.x.abs() * w / 2.0).max(d.y.abs() * h / 2.0);
        let c = pts[a] + d * reach;
        let (lo, hi) = (
            Point::new(c.x - w / 2.0, c.y - h / 2.0),
            Point::new(c.x + w / 2.0, c.y + h / 2.0),
        );
        let clear = bond * 0.3;
        let mut score = 0.0;
        for p in &near {
            let dx = (lo.x - p.x).max(0.0).max(p.x - hi.x);
            let dy = (lo.y - p.y).max(0.0).max(p.y - hi.y);
            let dd = dx.hypot(dy);
            if dd < clear {
                score += clear - dd;
            }
        }
        for (blo, bhi) in label_boxes.iter() {
            // Atom labels keep a small gap around them.
            let pad = mfs * 0.35;
            let ox = (hi.x.min(bhi.x + pad) - lo.x.max(blo.x - pad)).max(0.0);
            let oy = (hi.y.min(bhi.y + pad) - lo.y.max(blo.y - pad)).max(0.0);
            score += ox * oy * 0.5;
        }
        for (blo, bhi) in boxes {
            let ox = (hi.x.min(bhi.x) - lo.x.max(blo.x)).max(0.0);
            let oy = (hi.y.min(bhi.y) - lo.y.max(blo.y)).max(0.0);
            score += ox * oy * 0.5;
        }
        // Outside small rings rather than in their middle.
        for (rc, rr) in &ring_centres {
            if c.dist(*rc) < *rr {
                score += bond * 0.3;
            }
        }
        score += step as f64 * 1e-3;
        if best.is_none_or(|(s, _)| score < s) {
            best = Some((score, c));
        }
    }
    let c = best.map(|b| b.1).unwrap_or(pts[a]);
    (
        c,
        (
            Point::new(c.x - w / 2.0, c.y - h / 2.0),
            Point::new(c.x + w / 2.0, c.y + h / 2.0),
        ),
    )
}

/// The box an atom label covers (top-left, bottom-right), hydrogens included.
fn label_box(l: &Label, p: Point, fs: f64) -> (Point, Point) {
    let ew = text_width(l.element) * fs / 2.0 + fs * 0.1;
    let hw = if l.hydrogens > 0 {
        fs * (0.68 + if l.hydrogens > 1 { 0.4 } else { 0.0 })
    } else {
        0.0
    };
    let (mut lo, mut hi) = (
        Point::new(p.x - ew, p.y - fs * 0.6),
        Point::new(p.x + ew, p.y + fs * 0.6),
    );
    match l.h_side {
        HSide::Right => hi.x += hw,
        HSide::Left => lo.x -= hw,
        HSide::Above if l.hydrogens > 0 => lo.y -= fs,
        HSide::Below if l.hydrogens > 0 => hi.y += fs,
        _ => {}
    }
    if l.charge != 0 {
        hi.x += fs * 0.6;
    }
    (lo, hi)
}
