package output

import (
	"crypto/sha256"
	"encoding/hex"
	"strings"
)

// maxNameBytes bounds a file name derived from a user's text.
const maxNameBytes = 64

// SafeName derives a file or folder name from a name a user chose (a fuel
// name, a species name, a label) such that the path built from it stays
// inside the folder it is joined to. Letters, digits and "-_.+" are kept;
// every other character (path separators, "..", control characters,
// spaces, non-ASCII) becomes "_", a leading dot becomes "_" (no hidden
// files, no "." or ".."), and the name is cut to 64 bytes. A name that had
// to change gets "-" and eight hex digits of its SHA-256 appended, so two
// different names never share a file. A name that is already safe comes
// back as it is.
//
// The file name is only a handle: the real name is written inside the
// files.
func SafeName(name string) string {
	var b strings.Builder
	for i := 0; i < len(name); i++ {
		c := name[i]
		switch {
		case c >= 'a' && c <= 'z', c >= 'A' && c <= 'Z', c >= '0' && c <= '9', c == '-', c == '_', c == '+':
			b.WriteByte(c)
		case c == '.' && b.Len() > 0:
			b.WriteByte(c)
		default:
			b.WriteByte('_')
		}
	}
	s := b.String()
	if s == name && len(s) <= maxNameBytes && s != "" {
		return s
	}
	sum := sha256.Sum256([]byte(name))
	tag := "-" + hex.EncodeToString(sum[:4])
	if len(s) > maxNameBytes-len(tag) {
		s = s[:maxNameBytes-len(tag)]
	}
	return s + tag
}

// maxTextBytes bounds a text copied from the input into output headers.
const maxTextBytes = 500

// OneLine makes a text from the input safe to copy into an output file
// header, a CSV comment or a summary line: every control character
// (newline, carriage return, tab, escape, the Unicode line and paragraph
// separators) becomes one space, and the text is cut to 500 bytes (at a
// character boundary) with "..." marking the cut. Readers check titles and
// names when they read them; this is the last guard before writing.
func OneLine(s string) string {
	var b strings.Builder
	for _, r := range s {
		if r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || r == '\u2028' || r == '\u2029' {
			r = ' '
		}
		if b.Len()+len(string(r)) > maxTextBytes {
			b.WriteString("...")
			break
		}
		b.WriteRune(r)
	}
	return b.String()
}
