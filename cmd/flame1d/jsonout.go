package main

import (
	"encoding/json"
	"io"
)

// writeJSON writes v as indented JSON, the machine-readable form of every
// command's --json output.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}
