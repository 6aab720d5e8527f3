package inputs

import (
	"strings"
	"unicode"
)

// Compact is the form in which header names are compared: lower case,
// letters and digits only, so that "Tail/wingbeat freq", "tail_wingbeat
// freq" and "TailWingbeatFreq" are one name.
func Compact(s string) string {
	var b strings.Builder
	for _, r := range strings.ToLower(s) {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			b.WriteRune(r)
		}
	}
	return b.String()
}

// Match returns the field whose name or one of whose aliases is the header
// name (compared by Compact), or −1.
func Match(name string) int {
	n := Compact(name)
	if n == "" {
		return -1
	}
	for i, names := range compactNames {
		for _, a := range names {
			if n == a {
				return i
			}
		}
	}
	return -1
}

// compactNames holds each field's name and aliases in Compact form.
var compactNames = func() [][]string {
	out := make([][]string, len(Fields))
	for i, f := range Fields {
		out[i] = append(out[i], Compact(f.Name))
		for _, a := range f.Aliases {
			out[i] = append(out[i], Compact(a))
		}
	}
	return out
}()

// DefaultMissing are the cell texts that mean "not measured": in an
// optional column the value is absent, in a required one the row is
// rejected saying so. A blank cell always means absent.
var DefaultMissing = []string{"NA", "N/A", "NaN", "-", "–", "—", "?"}

// Missing reports whether a trimmed cell text is one of tokens, ignoring
// case ("na", "n/a" and "nan" count).
func Missing(text string, tokens []string) bool {
	for _, t := range tokens {
		if strings.EqualFold(text, t) {
			return true
		}
	}
	return false
}

// suspectWords are header words (in lower case, whole words) and word
// beginnings that name a physical quantity the tool could use. A column
// whose name contains one but matches no field is refused at the header
// rather than left out unseen (common practice, no source: the list is
// the fishery, ornithology and tag-export spellings of issue 12).
var (
	suspectWords = []string{"sal", "tl", "fl", "sl", "bl", "svl", "tbf", "wbf", "fbf", "sst", "sss",
		"amp", "wt", "alt", "elev", "fin", "tail", "wing", "fluke", "cd", "psu", "ppt", "rh", "dia", "diam",
		"len", "freq", "hz", "bd", "ws", "girth"}
	suspectStems = []string{"temp", "salin", "length", "speed", "veloc", "frequen", "beat", "amplit", "mass",
		"weight", "depth", "altitud", "elevat", "span", "chord", "girth", "circumf", "diamet", "width", "height",
		"size", "pressur", "humid", "stroke", "drag", "area", "densit", "viscos", "flap"}
)

// LooksLikeQuantity reports whether a header name (without its unit) reads
// like a physical quantity: a word of suspectWords, or one beginning with
// a stem of suspectStems.
func LooksLikeQuantity(name string) bool {
	words := strings.FieldsFunc(strings.ToLower(name), func(r rune) bool { return !unicode.IsLetter(r) && !unicode.IsDigit(r) })
	for _, w := range words {
		for _, s := range suspectWords {
			if w == s {
				return true
			}
		}
		for _, s := range suspectStems {
			if strings.HasPrefix(w, s) {
				return true
			}
		}
	}
	return false
}

// ByUnit returns the field a column matched as field holds given its
// unit: a "stroke amplitude" in a length unit is the tail or fin
// amplitude (a length), an "amplitude" in an angle unit the stroke angle.
// Otherwise it returns field.
func ByUnit(field int, unitIsLength, unitIsAngle bool) int {
	switch {
	case field == StrokeAngle && unitIsLength:
		return Amplitude
	case field == Amplitude && unitIsAngle:
		return StrokeAngle
	}
	return field
}
