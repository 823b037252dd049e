package output

import (
	"path/filepath"
	"strings"
	"testing"
)

// Every name, however hostile, joined to a folder names a path directly
// inside that folder; names that are already safe are kept; different
// names give different files.
func TestSafeNameStaysInside(t *testing.T) {
	root := filepath.Join("out", "compare")
	seen := map[string]string{}
	for _, name := range []string{
		"../../../X", "..", ".", "", "/etc/passwd", `..\..\win`, "a/b", "a_b", "A_B", "jet\nfuel", "kérosène",
		".hidden", "surrogate", "Jet-A1+2.0", strings.Repeat("x", 300), strings.Repeat("x", 301), "nul\x00byte",
	} {
		s := SafeName(name)
		p := filepath.Join(root, s)
		if filepath.Dir(p) != root || s == "." || s == ".." || s == "" {
			t.Errorf("SafeName(%q) = %q leaves the folder (%s)", name, s, p)
		}
		if len(s) > maxNameBytes || strings.HasPrefix(s, ".") {
			t.Errorf("SafeName(%q) = %q: too long or hidden", name, s)
		}
		if prev, dup := seen[s]; dup {
			t.Errorf("SafeName(%q) = SafeName(%q) = %q", name, prev, s)
		}
		seen[s] = name
	}
	for _, keep := range []string{"surrogate", "Jet-A1+2.0", "a_b", "CH4"} {
		if got := SafeName(keep); got != keep {
			t.Errorf("SafeName(%q) = %q, want it unchanged", keep, got)
		}
	}
}

func TestOneLine(t *testing.T) {
	for in, want := range map[string]string{
		"Lean methane":                    "Lean methane",
		"x\nid,equivalence_ratio [-]\r\n": "x id,equivalence_ratio [-]  ",
		"tab\there\u2028sep\x1b[31m":      "tab here sep [31m",
	} {
		if got := OneLine(in); got != want {
			t.Errorf("OneLine(%q) = %q, want %q", in, got, want)
		}
	}
	long := OneLine(strings.Repeat("é", 1000))
	if len(long) > maxTextBytes+3 || !strings.HasSuffix(long, "...") || !strings.HasPrefix(long, "éé") {
		t.Errorf("long text: %d bytes, %q...", len(long), long[:10])
	}
}
