//go:build !noasm && !gccgo && !safe

package tabulate

// gonumLanes says that gonum's floats.Sum is its amd64 assembly, which
// adds in eight lanes (see laneSum).
const gonumLanes = true
