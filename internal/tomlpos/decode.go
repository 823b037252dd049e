package tomlpos

import (
	"errors"
	"fmt"
	"strings"

	"github.com/BurntSushi/toml"
)

// Decode decodes the TOML document src into v (as toml.Decode does) and
// names file in errors. A syntax error reads "file:LINE: TOML syntax:
// message" with the line corrected by SyntaxError; a panic inside the
// decoder on malformed input is returned as an error, so no input can
// crash a caller.
func Decode(src []byte, file string, v any) (md toml.MetaData, err error) {
	md, err = DecodeBare(src, v)
	if err == nil {
		return md, nil
	}
	if line, msg, ok := SyntaxError(src, err); ok {
		return md, fmt.Errorf("%s:%d: TOML syntax: %s", file, line, msg)
	}
	return md, fmt.Errorf("%s: %w", file, err)
}

// DecodeBare is toml.Decode with a panic of the decoder on malformed input
// returned as an error; errors are not decorated (see SyntaxError for the
// line of a syntax error).
func DecodeBare(src []byte, v any) (md toml.MetaData, err error) {
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("TOML decoder failed: %v", p)
		}
	}()
	return toml.Decode(string(src), v)
}

// SyntaxError reports whether err is a TOML syntax error and if so its
// 1-based line in src and its message. The decoder counts a line break it
// stumbles on as the start of the next line; the error's byte offset names
// the line that break ends, which is the line returned.
func SyntaxError(src []byte, err error) (line int, msg string, ok bool) {
	var pe toml.ParseError
	if !errors.As(err, &pe) {
		return 0, "", false
	}
	line = pe.Position.Line
	if st := pe.Position.Start; st > 0 && st <= len(src) {
		line = 1 + strings.Count(string(src[:st]), "\n")
	}
	return line, pe.Message, true
}
