package tomlpos

import (
	"errors"
	"fmt"
	"regexp"
	"strings"
	"time"

	"github.com/BurntSushi/toml"
)

// Decode decodes the TOML document src into v (as toml.Decode does) and
// words the decoder's errors for the person who wrote the file: a syntax
// error as "file:LINE: TOML syntax: message" with the line corrected by
// SyntaxError; a value of the wrong type as "file:LINE: key: expected a
// number, got text in quotes" (the decoder's own message names Go types);
// an error from a value's UnmarshalTOML as "file:LINE: key: message". A
// panic inside the decoder on malformed input is returned as an error, so
// no input can crash a caller.
func Decode(src []byte, file string, v any) (md toml.MetaData, err error) {
	md, err = DecodeBare(src, v)
	if err == nil {
		return md, nil
	}
	if line, msg, ok := SyntaxError(src, err); ok {
		// An error from UnmarshalTOML has the type of a syntax error; a
		// decode into a plain map, which has no such method, tells them
		// apart.
		var probe map[string]any
		if _, perr := DecodeBare(src, &probe); perr != nil {
			return md, fmt.Errorf("%s:%d: TOML syntax: %s", file, line, msg)
		}
		var pe toml.ParseError
		errors.As(err, &pe)
		return md, fmt.Errorf("%s: %s: %s", where(src, file, pe.LastKey, pe.Position.Line), pe.LastKey, pe.Message)
	}
	if m := incompatible.FindStringSubmatch(err.Error()); m != nil {
		key := m[2]
		line := 0
		fmt.Sscan(m[1], &line)
		return md, fmt.Errorf("%s: %s: expected %s, got %s", where(src, file, key, line), key, destination(m[4]), tomlValue(m[3]))
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

var incompatible = regexp.MustCompile(`^toml: (?:line (\d+) )?\(last key "(.*)"\): incompatible types: TOML value has type (.+); destination has type (.+)$`)

// where is "file:line" for a key, or "file" when the line is unknown.
func where(src []byte, file, key string, line int) string {
	if l := Line(src, strings.Split(key, ".")); l > 0 {
		line = l
	}
	if line > 0 {
		return fmt.Sprintf("%s:%d", file, line)
	}
	return file
}

// destination words the Go type the decoder wanted.
func destination(goType string) string {
	switch {
	case strings.HasPrefix(goType, "float"):
		return "a number"
	case strings.HasPrefix(goType, "int"), strings.HasPrefix(goType, "uint"):
		return "a whole number"
	case goType == "string":
		return "text in quotes"
	case goType == "bool":
		return "true or false"
	case strings.HasPrefix(goType, "slice"), strings.HasPrefix(goType, "array"), strings.HasPrefix(goType, "[]"):
		return "a list [ ... ]"
	case strings.HasPrefix(goType, "map"), strings.HasPrefix(goType, "struct"), strings.HasPrefix(goType, "table"):
		return "a table"
	}
	return "another kind of value"
}

// tomlValue words the Go type of a decoded TOML value.
func tomlValue(goType string) string {
	switch goType {
	case "string":
		return "text in quotes"
	case "int64":
		return "a whole number"
	case "float64":
		return "a number"
	case "bool":
		return "true or false"
	case "time.Time", "toml.Local", "toml.LocalDate", "toml.LocalTime", "toml.LocalDatetime":
		return "a date or time"
	}
	switch {
	case strings.HasPrefix(goType, "[]"):
		return "a list"
	case strings.HasPrefix(goType, "map"):
		return "a table"
	}
	return "another kind of value"
}

// TypeName words the kind of a decoded TOML value for messages, as in
// "expected a number, got " + TypeName(v).
func TypeName(v any) string {
	switch v.(type) {
	case nil:
		return "nothing"
	case string:
		return "text in quotes"
	case int64:
		return "a whole number"
	case float64:
		return "a number"
	case bool:
		return "true or false"
	case time.Time:
		return "a date or time"
	case map[string]any:
		return "a table"
	case []any, []map[string]any:
		return "a list"
	}
	return "another kind of value"
}
