// Command flowregime computes Reynolds and Strouhal numbers, flow regimes,
// drag and power of swimming and flying organisms. See README.md.
package main

import (
	"os"

	"github.com/flowregime/flowregime/cmd/internal/cli"
)

func main() {
	os.Exit(cli.Main(os.Args[1:], cli.System()))
}
