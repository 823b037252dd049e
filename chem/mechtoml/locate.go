package mechtoml

import (
	"strconv"
	"strings"
)

// The TOML decoder gives values without positions, and keeps one position
// per key name, not per element of an array of tables. locate recovers the
// line of every key and array element by a second, light scan of the text
// (already known to be valid TOML): it follows table headers, dotted keys,
// inline tables, arrays and strings, and records each path with indices,
// e.g. reaction.3.falloff.low.A -> line. It never fails; a path it could not
// place simply has no entry, and messages then fall back to its parent.

// pathSep joins path segments in the index; it cannot occur in a key.
const pathSep = "\x00"

func joinPath(p []string) string { return strings.Join(p, pathSep) }

type locator struct {
	keys  bool // record keys and array elements, not only table headers
	s     string
	i     int
	line  int
	lines map[string]int // path -> 1-based line
	count map[string]int // array-of-tables path -> elements so far
}

// locate returns the line of every key path in text, or, without keys,
// of every table and array-of-tables element header only (enough for
// Origins, and cheaper).
func locate(text string, keys bool) map[string]int {
	lc := &locator{keys: keys, s: text, line: 1, lines: make(map[string]int, 256), count: map[string]int{}}
	var table []string
	for lc.i < len(lc.s) {
		lc.skipSpace(true)
		if lc.i >= len(lc.s) {
			break
		}
		start := lc.i
		if lc.s[lc.i] == '[' {
			array := lc.i+1 < len(lc.s) && lc.s[lc.i+1] == '['
			line := lc.line
			lc.i++
			if array {
				lc.i++
			}
			keys := lc.keyPath()
			lc.skipLine()
			table = lc.header(keys, array, line)
			continue
		}
		line := lc.line
		keys := lc.keyPath()
		lc.skipSpace(false)
		if len(keys) == 0 || lc.i >= len(lc.s) || lc.s[lc.i] != '=' {
			lc.skipLine()
			if lc.i == start {
				lc.i++
			}
			continue
		}
		lc.i++
		path := append(append([]string(nil), table...), keys...)
		lc.recordDotted(len(table), path, line)
		lc.value(path)
		lc.skipLine()
	}
	return lc.lines
}

func (lc *locator) record(path []string, line int) {
	k := joinPath(path)
	if _, ok := lc.lines[k]; !ok {
		lc.lines[k] = line
	}
}

// recordDotted records a dotted key a.b.c = ... and its implied tables.
func (lc *locator) recordDotted(base int, path []string, line int) {
	if !lc.keys {
		return
	}
	for j := base + 1; j <= len(path); j++ {
		lc.record(path[:j], line)
	}
}

// header resolves a [table] or [[array]] header to its indexed path: every
// prefix that is an array of tables refers to its latest element.
func (lc *locator) header(keys []string, array bool, line int) []string {
	var cur []string
	for j, k := range keys {
		cur = append(cur, k)
		if j == len(keys)-1 {
			break
		}
		if n, ok := lc.count[joinPath(cur)]; ok && n > 0 {
			cur = append(cur, strconv.Itoa(n-1))
		}
	}
	if array {
		key := joinPath(cur)
		n := lc.count[key]
		lc.count[key] = n + 1
		lc.record(cur, line)
		cur = append(cur, strconv.Itoa(n))
	}
	lc.record(cur, line)
	return cur
}

// skipSpace skips blanks, and with newlines also line ends and comments.
func (lc *locator) skipSpace(newlines bool) {
	for lc.i < len(lc.s) {
		switch lc.s[lc.i] {
		case ' ', '\t', '\r':
			lc.i++
		case '\n':
			if !newlines {
				return
			}
			lc.line++
			lc.i++
		case '#':
			if !newlines {
				return
			}
			for lc.i < len(lc.s) && lc.s[lc.i] != '\n' {
				lc.i++
			}
		default:
			return
		}
	}
}

// skipLine moves past the next line end.
func (lc *locator) skipLine() {
	for lc.i < len(lc.s) {
		c := lc.s[lc.i]
		lc.i++
		if c == '\n' {
			lc.line++
			return
		}
	}
}

// keyPath reads a (dotted) key; it stops before '=', ']' or anything else.
func (lc *locator) keyPath() []string {
	var keys []string
	for {
		lc.skipSpace(false)
		if lc.i >= len(lc.s) {
			return keys
		}
		var k string
		switch lc.s[lc.i] {
		case '"':
			k = lc.basicString()
		case '\'':
			k = lc.literalString()
		default:
			j := lc.i
			for j < len(lc.s) && !strings.ContainsRune(" \t\r\n=.[]\"'#,{}", rune(lc.s[j])) {
				j++
			}
			if j == lc.i {
				return keys
			}
			k = lc.s[lc.i:j]
			lc.i = j
		}
		keys = append(keys, k)
		lc.skipSpace(false)
		if lc.i >= len(lc.s) || lc.s[lc.i] != '.' {
			return keys
		}
		lc.i++
	}
}

// basicString reads a one-line "..." string and returns its content
// (escapes decoded where Go's rules agree with TOML's, else left as is).
func (lc *locator) basicString() string {
	start := lc.i
	lc.i++
	for lc.i < len(lc.s) && lc.s[lc.i] != '"' && lc.s[lc.i] != '\n' {
		if lc.s[lc.i] == '\\' {
			lc.i++
		}
		lc.i++
	}
	if lc.i > len(lc.s) {
		lc.i = len(lc.s)
	}
	raw := lc.s[start:lc.i]
	if lc.i < len(lc.s) && lc.s[lc.i] == '"' {
		lc.i++
		raw += `"`
	}
	if u, err := strconv.Unquote(raw); err == nil {
		return u
	}
	return strings.Trim(raw, `"`)
}

// literalString reads a one-line '...' string.
func (lc *locator) literalString() string {
	lc.i++
	start := lc.i
	for lc.i < len(lc.s) && lc.s[lc.i] != '\'' && lc.s[lc.i] != '\n' {
		lc.i++
	}
	k := lc.s[start:lc.i]
	if lc.i < len(lc.s) && lc.s[lc.i] == '\'' {
		lc.i++
	}
	return k
}

// multiline skips a """...""" or ”'...”' string whose opening delimiter
// has been consumed.
func (lc *locator) multiline(q byte) {
	delim := strings.Repeat(string(q), 3)
	for lc.i < len(lc.s) {
		c := lc.s[lc.i]
		switch {
		case c == '\\' && q == '"':
			lc.i++
			if lc.i < len(lc.s) && lc.s[lc.i] == '\n' {
				lc.line++
			}
			lc.i++
		case c == '\n':
			lc.line++
			lc.i++
		case strings.HasPrefix(lc.s[lc.i:], delim):
			lc.i += 3
			// Up to two more quotes belong to the content before the delimiter.
			for n := 0; n < 2 && lc.i < len(lc.s) && lc.s[lc.i] == q; n++ {
				lc.i++
			}
			return
		default:
			lc.i++
		}
	}
}

// nextElement moves to the next element of an array or inline table,
// past blanks, comments and commas. It returns false at the closing
// bracket (consumed) or at the end of the text.
func (lc *locator) nextElement(closing byte) bool {
	for {
		lc.skipSpace(true)
		if lc.i >= len(lc.s) {
			return false
		}
		switch lc.s[lc.i] {
		case closing:
			lc.i++
			return false
		case ',':
			lc.i++
		default:
			return true
		}
	}
}

// value skips one value, recording the keys of inline tables and the
// elements of arrays below path.
func (lc *locator) value(path []string) {
	lc.skipSpace(false)
	if lc.i >= len(lc.s) {
		return
	}
	switch c := lc.s[lc.i]; {
	case c == '"' || c == '\'':
		if strings.HasPrefix(lc.s[lc.i:], strings.Repeat(string(c), 3)) {
			lc.i += 3
			lc.multiline(c)
		} else if c == '"' {
			lc.basicString()
		} else {
			lc.literalString()
		}
	case c == '[':
		lc.i++
		for n := 0; lc.nextElement(']'); n++ {
			var p []string // nil: nothing below is recorded
			if lc.keys || len(path) == 1 {
				p = append(append(p, path...), strconv.Itoa(n))
				lc.record(p, lc.line)
			}
			before := lc.i
			lc.value(p)
			if lc.i == before {
				lc.i++
			}
		}
	case c == '{':
		lc.i++
		for lc.nextElement('}') {
			line := lc.line
			before := lc.i
			keys := lc.keyPath()
			lc.skipSpace(false)
			if len(keys) == 0 || lc.i >= len(lc.s) || lc.s[lc.i] != '=' {
				if lc.i == before {
					lc.i++
				}
				continue
			}
			lc.i++
			var p []string
			if lc.keys {
				p = append(append(p, path...), keys...)
				lc.recordDotted(len(path), p, line)
			}
			lc.value(p)
		}
	default:
		for lc.i < len(lc.s) && !strings.ContainsRune(",]}#\n", rune(lc.s[lc.i])) {
			lc.i++
		}
	}
}
