// Package demo holds the embedded demonstration survey: one invented season
// (April–September 2026) at an invented field station with a tarn, an
// estuary and a meadow. Every row is invented to show the tool; none is a
// measurement. Three rows are deliberately suspicious (a speed typed
// ten-fold too high, a tail amplitude larger than the fish, a wingspan
// without a mass) so that screening has something to find.
package demo

import _ "embed"

// Survey is the demo survey as CSV.
//
//go:embed lakeside.csv
var Survey []byte

// Name is how the output refers to the demo survey.
const Name = "invented season at a tarn, an estuary and a meadow (demo data, not measurements)"
