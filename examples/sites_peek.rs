fn main() {
    for s in std::env::args().skip(1) {
        let m = acidsite::mol::Molecule::from_smiles(&s).unwrap();
        let r = acidsite::sites::find_sites(&m);
        println!("{s}  top_c={:?} top={:?}", r.top_carbon, r.top_overall);
        for x in &r.sites {
            let rules: Vec<String> = x.rules.iter().map(|u| format!("{}({:?}/{:?})", u.id, u.dmso, u.water)).collect();
            println!("  {:?} {} H{} {:<28} dmso={:?} water={:?} ±{} {:?} {}", x.atoms, x.element, x.hydrogens, x.class, x.pka_dmso, x.pka_water, x.uncertainty, x.regio, rules.join(" "));
        }
    }
}
