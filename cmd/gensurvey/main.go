// Command gensurvey writes a synthetic survey table to stdout for load tests
// of flowregime batch:
//
//	go run ./cmd/gensurvey -rows 1000000 > survey.csv
//
// The data are invented (see package survey).
package main

import (
	"flag"
	"fmt"
	"os"

	"github.com/flowregime/flowregime/cmd/internal/survey"
)

func main() {
	rows := flag.Int("rows", 1000000, "number of rows")
	seed := flag.Uint64("seed", 1, "random seed")
	flag.Parse()
	if err := survey.Generate(os.Stdout, *rows, *seed); err != nil {
		fmt.Fprintln(os.Stderr, "gensurvey:", err)
		os.Exit(1)
	}
}
