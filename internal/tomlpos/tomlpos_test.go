package tomlpos

import (
	"testing"

	"github.com/BurntSushi/toml"
)

func TestLine(t *testing.T) {
	src := []byte(`title = "x"
[mixture]
fuel = { CH4 = 1 }
# a comment
temprature = "300 K"

[fuels.jet]
formula = "C11H22"
[fuels.jet.cracking]
method = "yields"
`)
	for _, c := range []struct {
		key  toml.Key
		want int
	}{
		{toml.Key{"title"}, 1},
		{toml.Key{"mixture"}, 2},
		{toml.Key{"mixture", "temprature"}, 5},
		{toml.Key{"fuels", "jet", "formula"}, 8},
		{toml.Key{"fuels", "jet", "cracking", "method"}, 10},
		{toml.Key{"mixture", "fuel", "CH4"}, 3},
		{toml.Key{"nowhere"}, 0},
	} {
		if got := Line(src, c.key); got != c.want {
			t.Errorf("Line(%v) = %d, want %d", c.key, got, c.want)
		}
	}
}
