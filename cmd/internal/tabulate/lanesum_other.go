//go:build !amd64 || noasm || gccgo || safe

package tabulate

// gonumLanes says that gonum's floats.Sum is its amd64 assembly; here it
// is a plain loop (see laneSum).
const gonumLanes = false
