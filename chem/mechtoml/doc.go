// Package mechtoml reads and writes flame1d's own reaction-mechanism file
// format, a TOML document described key by key in docs/mechanism-format.md.
//
// One file holds a whole chem.Mechanism: name, description (citation and
// provenance text, kept verbatim), elements, species (atoms, NASA-7
// polynomials, phase, optional transport parameters) and reactions of every
// form chem models. Each reaction is a [[reaction]] table whose equation
// ("H + O2 (+M) <=> HO2 (+M)") gives its participants, direction and third
// body, with the rate data in sub-tables.
//
// Numbers are converted to SI at this edge. Rate data are read in the units
// declared once in the [units] table (energy, quantity, length, pressure)
// unless a value carries its own unit as a string ("35 kcal/mol",
// "1.2e17 cm^6/mol^2/s", "10 atm"); transport data default to K, Å, debye
// and Å^3. Write then Read gives back the same mechanism bit for bit: the
// writer uses the chemists' units only for values whose conversion it has
// checked to be exactly reversible, and SI for the rest.
package mechtoml
