package report

import (
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"
)

// Every code point is checked against Go's Unicode tables: the control
// characters (unicode.IsControl: U+0000–U+001F, U+007F–U+009F) and the
// bidirectional controls (unicode.Bidi_Control, Unicode's PropList.txt)
// never come out raw; every other code point comes out unchanged.
func TestPrintableEveryCodePoint(t *testing.T) {
	for r := rune(0); r <= unicode.MaxRune; r++ {
		if !utf8.ValidRune(r) {
			continue
		}
		in := "a" + string(r) + "b"
		got := Printable(in)
		bad := unicode.IsControl(r) || unicode.Is(unicode.Bidi_Control, r)
		if bad && strings.ContainsRune(got, r) {
			t.Fatalf("U+%04X came out raw: %q", r, got)
		}
		if !bad && got != in {
			t.Fatalf("U+%04X changed: %q", r, got)
		}
	}
}

// Escapes as Go writes them in quoted strings (strconv.Quote): ESC is
// \x1b, tab \t; a right-to-left override (U+202E, UAX #9) is \u202e.
func TestPrintableVectors(t *testing.T) {
	for in, want := range map[string]string{
		"\x1b[31mred\x1b[0m": `\x1b[31mred\x1b[0m`,
		"a\tb\r\nc":          `a\tb\r\nc`,
		"del\x7f":            `del\x7f`,
		"csi\u009b2J":        `csi\u009b2J`,
		"abc\u202edcba":      `abc\u202edcba`,
		"bad\xffutf8":        `bad\xffutf8`,
		"länge (µm) ±½":      "länge (µm) ±½",
	} {
		if got := Printable(in); got != want {
			t.Errorf("Printable(%q) = %q, want %q", in, got, want)
		}
	}
	if got := printableCell("two\nlines\x1b"); got != "two\nlines\\x1b" {
		t.Errorf("a table cell keeps its line breaks: got %q", got)
	}
}

// A table shows no control character raw, in a header or a cell.
func TestTableEscapes(t *testing.T) {
	var b strings.Builder
	if err := Table(&b, []string{"na\x1bme"}, [][]string{{"x\x07y\u202e"}}); err != nil {
		t.Fatal(err)
	}
	out := b.String()
	for _, bad := range []string{"\x1b", "\x07", "\u202e"} {
		if strings.Contains(out, bad) {
			t.Errorf("table holds %q raw:\n%s", bad, out)
		}
	}
	if !strings.Contains(out, `na\x1bme`) || !strings.Contains(out, `x\x07y\u202e`) {
		t.Errorf("escapes missing:\n%s", out)
	}
}

// go test -fuzz FuzzPrintable ./cmd/internal/report: whatever the bytes,
// the result is valid UTF-8 without a control or bidirectional control
// character (Go's unicode tables), and text without any comes back as is.
func FuzzPrintable(f *testing.F) {
	for _, s := range []string{"", "plain", "\x1b[2J", "a\u202eb", "\xc2\x9b", "\xff\xfe", "µm ±"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got := Printable(s)
		if !utf8.ValidString(got) {
			t.Fatalf("%q → %q: invalid UTF-8", s, got)
		}
		clean := utf8.ValidString(s)
		for _, r := range s {
			if unicode.IsControl(r) || unicode.Is(unicode.Bidi_Control, r) {
				clean = false
			}
		}
		for _, r := range got {
			if unicode.IsControl(r) || unicode.Is(unicode.Bidi_Control, r) {
				t.Fatalf("%q → %q holds U+%04X", s, got, r)
			}
		}
		if clean && got != s {
			t.Fatalf("%q changed to %q", s, got)
		}
	})
}
