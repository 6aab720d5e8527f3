// Command gensurvey writes a synthetic survey table to stdout for load tests
// of flowregime batch:
//
//	go run ./cmd/gensurvey -rows 1000000 > survey.csv
//	go run ./cmd/gensurvey -kind rich -rows 1000000 > rich.csv
//
// -kind chooses the survey: simple (8 taxa, about 60,000 distinct medium
// conditions), rich (23 taxa, depth, salinity and altitude per row, about
// 600,000 distinct conditions per million rows) or few (the simple survey
// at 38 distinct conditions).
//
// The data are invented (see package survey).
package main

import (
	"flag"
	"fmt"
	"io"
	"os"

	"github.com/flowregime/flowregime/cmd/internal/survey"
)

func main() {
	rows := flag.Int("rows", 1000000, "number of rows")
	seed := flag.Uint64("seed", 1, "random seed")
	kind := flag.String("kind", "simple", "survey: simple, rich or few")
	flag.Parse()
	gen, ok := map[string]func(io.Writer, int, uint64) error{
		"simple": survey.Generate, "rich": survey.GenerateRich, "few": survey.GenerateFew}[*kind]
	if !ok {
		fmt.Fprintf(os.Stderr, "gensurvey: -kind %q is not simple, rich or few\n", *kind)
		os.Exit(2)
	}
	if *rows < 0 || flag.NArg() > 0 {
		fmt.Fprintf(os.Stderr, "gensurvey: -rows must be 0 or more and no other arguments are taken (got -rows %d, %q)\n", *rows, flag.Args())
		os.Exit(2)
	}
	if err := gen(os.Stdout, *rows, *seed); err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
}
