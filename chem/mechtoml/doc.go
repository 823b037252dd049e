// Package mechtoml reads and writes flame1d's own reaction-mechanism file
// format, a TOML document described key by key in docs/mechanism-format.md.
//
// One file holds a whole chem.Mechanism: name, description (citation and
// provenance text, kept verbatim), elements, an optional [validity] table
// (the fuels and conditions the mechanism was validated for), species
// (atoms, NASA-7 polynomials, phase, optional kinetic-theory transport
// parameters) and reactions of every form chem models, each with an
// optional rate-constant uncertainty factor. Each reaction is a [[reaction]]
// table whose equation ("H + O2 (+M) <=> HO2 (+M)") gives its participants,
// direction and third body, with the rate data in sub-tables; the equation
// parser is the one the keyword-block importer uses.
//
// Key names say what a value is, and carry its unit where the unit is
// fixed (lj_well_depth_K, lj_diameter_angstrom or lj_diameter_m). Numbers
// are converted to SI at this edge. Rate data are read in the units
// declared once in [default_units] (activation_energy, concentration,
// pressure) unless a value carries its own unit as a string
// ("35 kcal/mol", "1.2e17 cm^6/mol^2/s", "10 atm"). Write then Read gives
// back the same mechanism bit for bit: the writer uses the chemists' units
// only for values whose conversion it has checked to be exactly
// reversible, and SI for the rest.
package mechtoml
