package tomlpos

import (
	"strings"
	"testing"
)

func TestDecodeSyntaxLine(t *testing.T) {
	for _, c := range []struct {
		name, src, want string
	}{
		// An unclosed table header: the decoder stumbles on the line break
		// and counts it as line 2; the header is on line 1.
		{"unclosed header", "[mixture\nfuel = 1\n", "f.toml:1: TOML syntax"},
		{"bad value", "a = 1\nb = = 2\n", "f.toml:2: TOML syntax"},
		{"duplicate key", "a = 1\na = 2\n", "f.toml:2: TOML syntax"},
	} {
		var v map[string]any
		_, err := Decode([]byte(c.src), "f.toml", &v)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%s: error %v, want prefix %q", c.name, err, c.want)
		}
	}
	var v struct{ A int }
	if _, err := Decode([]byte(`A = "text"`), "f.toml", &v); err == nil || !strings.HasPrefix(err.Error(), "f.toml: ") {
		t.Errorf("type mismatch: error %v, want one naming the file", err)
	}
	md, err := Decode([]byte("A = 3\nB = 4\n"), "f.toml", &v)
	if err != nil || v.A != 3 || len(md.Undecoded()) != 1 {
		t.Errorf("valid document: %v, A = %d, undecoded %v", err, v.A, md.Undecoded())
	}
}
