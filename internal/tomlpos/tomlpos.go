// Package tomlpos is flame1d's one way of decoding TOML with errors that
// name file and line: Decode (syntax errors with the corrected line, no
// panic escapes) and Line, the source line of a key, for messages about
// keys that decoded but are unknown or invalid (the TOML decoder reports
// positions only for syntax errors).
package tomlpos

import (
	"bufio"
	"bytes"
	"strings"

	"github.com/BurntSushi/toml"
)

// Line returns the 1-based line on which the last element of key is
// defined, searching within the table its prefix names; 0 if not found.
// It understands [table] and [[array]] headers, dotted keys and quoted
// keys well enough for hand-written case and mechanism files.
func Line(src []byte, key toml.Key) int {
	if len(key) == 0 {
		return 0
	}
	want := key[len(key)-1]
	parent := strings.Join(key[:len(key)-1], ".")
	current := ""
	sc := bufio.NewScanner(bytes.NewReader(src))
	sc.Buffer(make([]byte, 1<<20), 1<<26)
	line := 0
	fallback := 0
	for sc.Scan() {
		line++
		t := strings.TrimSpace(sc.Text())
		if t == "" || t[0] == '#' {
			continue
		}
		if strings.HasPrefix(t, "[") {
			h := strings.Trim(t, "[] \t")
			if i := strings.Index(h, "]"); i >= 0 {
				h = h[:i]
			}
			current = normalise(h)
			if current == strings.Join(key, ".") {
				return line
			}
			continue
		}
		eq := strings.Index(t, "=")
		if eq <= 0 {
			continue
		}
		k := normalise(strings.TrimSpace(t[:eq]))
		full := k
		if current != "" {
			full = current + "." + k
		}
		if full == strings.Join(key, ".") || (current == parent && k == want) {
			return line
		}
		// Inline tables: key = { want = ... }
		if strings.HasSuffix(parent, k) && strings.Contains(t[eq:], want) && fallback == 0 {
			fallback = line
		}
	}
	return fallback
}

func normalise(k string) string {
	parts := strings.Split(k, ".")
	for i, p := range parts {
		parts[i] = strings.Trim(strings.TrimSpace(p), `"'`)
	}
	return strings.Join(parts, ".")
}
