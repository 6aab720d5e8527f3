package report

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Printable returns s with the characters that would act on a terminal
// instead of showing written out as escapes: the control characters of
// Unicode's Cc category (C0, DEL and C1: \t, \n, \r, else \xNN or \uNNNN)
// and the bidirectional controls (Unicode property Bidi_Control, UAX #9:
// the marks, embeddings, overrides and isolates that reorder what follows
// them). Invalid UTF-8 bytes are written \xNN. Text without any of these
// is returned as is.
func Printable(s string) string { return printable(s, false) }

// printableCell is [Printable] but for line breaks, which a table shows as
// lines of one cell.
func printableCell(s string) string { return printable(s, true) }

func printable(s string, keepNewline bool) string {
	if !needsEscape(s) {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); {
		r, n := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && n == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case r == '\n' && keepNewline:
			b.WriteByte('\n')
		case r == '\n':
			b.WriteString(`\n`)
		case r == '\t':
			b.WriteString(`\t`)
		case r == '\r':
			b.WriteString(`\r`)
		case r < 0x80 && unicode.IsControl(r):
			fmt.Fprintf(&b, `\x%02x`, r)
		case unicode.IsControl(r) || unicode.Is(unicode.Bidi_Control, r):
			fmt.Fprintf(&b, `\u%04x`, r)
		default:
			b.WriteString(s[i : i+n])
		}
		i += n
	}
	return b.String()
}

// needsEscape is a byte scan for anything Printable changes: an ASCII
// control, the lead byte of a C1 control (0xc2) or of a bidirectional
// control (0xd8 for U+061C, 0xe2 for U+200E–U+2069), or invalid UTF-8.
func needsEscape(s string) bool {
	for i := 0; i < len(s); i++ {
		c := s[i]
		if c < 0x20 || c == 0x7f || c == 0xc2 || c == 0xd8 || c == 0xe2 {
			return true
		}
	}
	return !utf8.ValidString(s)
}
