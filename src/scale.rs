//! The pKa scales: the one [`Scale`] type of the crate, used by the site
//! estimates, the base catalogue, the equilibrium and the records.

/// A pKa scale: the solvent of the reference measurements.
///
/// Sites carry estimates on [`Scale::Dmso`] and [`Scale::Water`]; bases in
/// the catalogue may also carry a [`Scale::Thf`] value. Ranking sites on
/// THF (which no site estimate has) ranks them as on DMSO, the nearer
/// aprotic scale.
///
/// ```
/// use acidsite::Scale;
/// assert_eq!(Scale::parse("Water"), Some(Scale::Water));
/// assert_eq!(Scale::default().name(), "dmso");
/// assert_eq!(Scale::parse("banana"), None);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Default)]
#[non_exhaustive]
pub enum Scale {
    /// Dimethyl sulfoxide (free ions, Bordwell-type values), the main
    /// scale for carbon acids and the default; serialised as `dmso`.
    #[default]
    Dmso,
    /// Water (aqueous pKa); serialised as `water`.
    Water,
    /// Tetrahydrofuran ion-pair scale (lithium and other metal salts, as
    /// used for amide bases); serialised as `thf`.
    Thf,
}

impl Scale {
    /// Every scale, in the order above.
    pub const ALL: [Scale; 3] = [Scale::Dmso, Scale::Water, Scale::Thf];

    /// Stable lower-case name (`dmso`, `water`, `thf`), as records write it.
    pub fn name(self) -> &'static str {
        match self {
            Scale::Dmso => "dmso",
            Scale::Water => "water",
            Scale::Thf => "thf",
        }
    }

    /// Parse a scale name (case-insensitive: dmso, water or h2o, thf).
    pub fn parse(s: &str) -> Option<Scale> {
        match s.trim().to_ascii_lowercase().as_str() {
            "dmso" => Some(Scale::Dmso),
            "water" | "h2o" => Some(Scale::Water),
            "thf" => Some(Scale::Thf),
            _ => None,
        }
    }
}
