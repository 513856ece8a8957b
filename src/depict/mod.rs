//! 2D structure drawings: a layout of our own and an SVG writer with the
//! acidic sites marked. No I/O.
//!
//! [`layout`] gives every atom a point (one bond = 1.0 layout unit, y
//! downward, 0-based input order); [`svg()`] writes a drawing from a
//! molecule, its layout and the marks to show ([`Marks`], e.g. built from an
//! analysis record with [`Marks::from_record`]). The two are separate so a
//! web page or another program can use the coordinates alone.
//!
//! ```
//! use acidsite::depict::{self, Marks, SvgOptions};
//! use acidsite::mol::Molecule;
//!
//! let m = Molecule::from_smiles("CC1CCCCC1=O").unwrap();
//! let lay = depict::layout(&m);
//! assert_eq!(lay.points.len(), m.atom_count());
//! let marks = Marks { sites: vec![depict::SiteMark { rank: 1, atoms: vec![5], pka: Some(26.4) }],
//!                     target: Some(vec![5]) };
//! let svg = depict::svg(&m, &lay, &marks, &SvgOptions::default());
//! assert!(svg.starts_with("<svg") && svg.contains(r#"data-atom="5""#));
//! assert!(svg.contains("#1 26.4"));
//! ```
//!
//! # Layout
//! Per connected component: ring systems first (`rings`: regular polygons,
//! fused, spiro and bridged rings placed by their shared atoms, a
//! macrocycle as one large ring), then chains and substituents (`chains`:
//! 120° zig-zags, linear triple bonds and cumulenes, substituents spread
//! over the free angle at each atom), then a clean-up pass (`cleanup`:
//! flips and turns about bonds outside rings, stretching as the last
//! resort) against atom clashes and bond crossings. Each component is then
//! turned so its long axis is horizontal (in 30° steps, so rings keep a
//! tidy orientation) and the components are set side by side in input
//! order. Everything is deterministic: the same SMILES gives the same
//! drawing.
//!
//! # Stereo
//! Written stereo is drawn (`stereo`): double bonds with a configuration
//! get their substituents on the written sides (the smaller side mirrored
//! after placement and after the clean-up, which refuses moves that undo
//! one), and [`wedges`] gives one solid or hashed wedge per tetrahedral
//! centre, chosen on the finished coordinates so the drawing reads as the
//! input. The SVG marks them with `data-stereo="wedge|hash"` and
//! `data-narrow` (the centre). `tests/depict_stereo.rs` reads the
//! configurations back from the SVG; RDKit agrees on 400 of 400 ChEMBL
//! molecules (`tests/reference/depict_stereo.py`).
//!
//! # Quality
//! [`assess`] computes three defects (atom clash, bond crossing, bond length
//! off by more than 30 %); `tests/depict_quality.rs` compares their shares
//! with RDKit's on a fixed sample of real molecules.

mod chains;
mod cleanup;
mod geom;
mod labels;
mod quality;
mod rings;
mod stereo;
mod svg;

pub use geom::{segments_cross, Point};
pub use quality::{assess, Quality};
pub use stereo::{wedges, Wedge};
pub use svg::{svg, Marks, SiteMark, SvgOptions};

use crate::mol::Molecule;
use std::f64::consts::PI;

/// Gap between components set side by side, in bond lengths.
const COMPONENT_GAP: f64 = 1.6;

/// The 2D coordinates of a molecule's atoms.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Layout {
    /// One point per atom, 0-based input order; one bond is about 1.0 long,
    /// y grows downward. The drawing's top-left corner is at (0, 0).
    pub points: Vec<Point>,
}

impl Layout {
    /// Smallest and largest coordinates: ((min x, min y), (max x, max y)).
    pub fn bounds(&self) -> (Point, Point) {
        let mut lo = Point::new(f64::INFINITY, f64::INFINITY);
        let mut hi = Point::new(f64::NEG_INFINITY, f64::NEG_INFINITY);
        for p in &self.points {
            lo = Point::new(lo.x.min(p.x), lo.y.min(p.y));
            hi = Point::new(hi.x.max(p.x), hi.y.max(p.y));
        }
        if self.points.is_empty() {
            (Point::default(), Point::default())
        } else {
            (lo, hi)
        }
    }
}

/// Lay out `mol` in 2D. Never panics; every coordinate is finite.
pub fn layout(mol: &Molecule) -> Layout {
    let n = mol.atom_count();
    let (systems, sys_of) = rings::ring_systems(mol);
    let mut placer = chains::Placer::new(mol, &systems, &sys_of);
    let mut comps: Vec<Vec<usize>> = vec![Vec::new(); mol.component_count().max(1)];
    for a in 0..n {
        if let Some(c) = comps.get_mut(mol.component_of(a)) {
            c.push(a);
        }
    }
    let mut pos = vec![Point::default(); n];
    let mut x_offset = 0.0;
    for atoms in comps.iter().filter(|c| !c.is_empty()) {
        placer.place_component(atoms);
        let mut pts = placer.pos.clone();
        stereo::fix_double_bonds(mol, atoms, &mut pts);
        cleanup::clean(mol, atoms, &mut pts);
        stereo::fix_double_bonds(mol, atoms, &mut pts);
        orient(atoms, &mut pts);
        // Place right of the previous component, centred on y = 0.
        let (mut lo, mut hi) = (
            Point::new(f64::MAX, f64::MAX),
            Point::new(f64::MIN, f64::MIN),
        );
        for &a in atoms {
            let p = if pts[a].is_finite() {
                pts[a]
            } else {
                Point::default()
            };
            pts[a] = p;
            lo = Point::new(lo.x.min(p.x), lo.y.min(p.y));
            hi = Point::new(hi.x.max(p.x), hi.y.max(p.y));
        }
        let shift = Point::new(x_offset - lo.x, -(lo.y + hi.y) / 2.0);
        for &a in atoms {
            pos[a] = pts[a] + shift;
        }
        x_offset += hi.x - lo.x + COMPONENT_GAP;
    }
    // Top-left corner at the origin.
    let mut lay = Layout { points: pos };
    let (lo, _) = lay.bounds();
    for p in &mut lay.points {
        *p = *p - lo;
    }
    lay
}

/// Turn the component so its long axis is horizontal, in steps of 30°.
fn orient(atoms: &[usize], pos: &mut [Point]) {
    if atoms.len() < 3 {
        if let [a, b] = atoms {
            // A two-atom component: horizontal.
            let ang = (pos[*b] - pos[*a]).angle();
            for &i in atoms {
                pos[i] = (pos[i] - pos[*a]).rotate(-ang) + pos[*a];
            }
        }
        return;
    }
    let c = geom::centroid(atoms.iter().map(|&a| pos[a]));
    let (mut sxx, mut syy, mut sxy) = (0.0, 0.0, 0.0);
    for &a in atoms {
        let d = pos[a] - c;
        sxx += d.x * d.x;
        syy += d.y * d.y;
        sxy += d.x * d.y;
    }
    let theta = 0.5 * (2.0 * sxy).atan2(sxx - syy);
    let step = PI / 6.0;
    let rot = -(theta / step).round() * step;
    if rot.abs() > 1e-9 && rot.is_finite() {
        for &a in atoms {
            pos[a] = (pos[a] - c).rotate(rot) + c;
        }
    }
}
