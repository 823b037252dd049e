package thermo

import "strings"

// atomicWeights are standard atomic weights in kg/mol: IUPAC CIAAW
// "Standard atomic weights" (2021 abridged, conventional values for
// elements with intervals). Electron mass for E is CODATA 2018.
var atomicWeights = map[string]float64{
	"H": 1.008e-3, "D": 2.014102e-3, "HE": 4.002602e-3, "LI": 6.94e-3,
	"BE": 9.0121831e-3, "B": 10.81e-3, "C": 12.011e-3, "N": 14.007e-3,
	"O": 15.999e-3, "F": 18.998403163e-3, "NE": 20.1797e-3, "NA": 22.98976928e-3,
	"MG": 24.305e-3, "AL": 26.9815384e-3, "SI": 28.085e-3, "P": 30.973761998e-3,
	"S": 32.06e-3, "CL": 35.45e-3, "AR": 39.95e-3, "K": 39.0983e-3,
	"CA": 40.078e-3, "TI": 47.867e-3, "CR": 51.9961e-3, "FE": 55.845e-3,
	"NI": 58.6934e-3, "CU": 63.546e-3, "ZN": 65.38e-3, "BR": 79.904e-3,
	"KR": 83.798e-3, "I": 126.90447e-3, "XE": 131.293e-3,
	"E": 5.48579909065e-7,
}

// AtomicWeight returns the standard atomic weight of an element in kg/mol.
// The symbol is matched case-insensitively ("Ar", "AR", "ar").
func AtomicWeight(symbol string) (float64, bool) {
	w, ok := atomicWeights[strings.ToUpper(symbol)]
	return w, ok
}
