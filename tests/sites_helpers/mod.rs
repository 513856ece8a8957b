//! Site look-ups shared by the tests of the sites area.

use acidsite::mol::Molecule;
use acidsite::sites::{find_sites, Site, SiteReport};

/// The site report of a test SMILES (which must parse).
pub fn report(smiles: &str) -> SiteReport {
    find_sites(&Molecule::from_smiles(smiles).expect("test SMILES parses"))
}

/// The site holding `atom` (0-based input order).
pub fn site(smiles: &str, atom: usize) -> Site {
    report(smiles)
        .sites
        .into_iter()
        .find(|s| s.atoms.contains(&atom))
        .unwrap_or_else(|| panic!("{smiles}: no site on atom {atom}"))
}

/// The site containing `atom`, or a site whose atom is symmetry-equivalent
/// (the report lists equivalent hydrogens once).
pub fn site_for(mol: &Molecule, sites: &[Site], atom: usize) -> Option<Site> {
    if let Some(s) = sites.iter().find(|s| s.atoms.contains(&atom)) {
        return Some(s.clone());
    }
    let classes = mol.symmetry_classes();
    let c = classes.get(atom)?;
    sites
        .iter()
        .find(|s| s.atoms.iter().any(|&a| classes.get(a) == Some(c)))
        .cloned()
}
