package cli

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/quantity"
	"github.com/flowregime/flowregime/media"
)

// readingRole is one column a geometry reads: its role name (also the key
// of --unit), the header names that find it, and its quantity.
type readingRole struct {
	role     string
	names    []string
	kind     quantity.Kind
	unit     string // a usual unit, for messages
	optional bool
	set      func(r *media.Reading, v float64)
}

var (
	roleSpeed = readingRole{"speed", []string{"speed", "rotation", "rotational speed", "angular speed", "angular velocity", "omega"}, quantity.Rotation, "rpm", false,
		func(r *media.Reading, v float64) { r.AngularSpeed = v }}
	roleTorque = readingRole{"torque", []string{"torque"}, quantity.Torque, "mN·m", false,
		func(r *media.Reading, v float64) { r.Torque = v }}
	roleFlow = readingRole{"flow", []string{"flow rate", "flow", "volume flow", "volume flow rate", "q"}, quantity.VolumeFlow, "mL/min", false,
		func(r *media.Reading, v float64) { r.FlowRate = v }}
	rolePressure = readingRole{"pressure", []string{"pressure drop", "pressure", "delta p", "dp"}, quantity.Pressure, "Pa", false,
		func(r *media.Reading, v float64) { r.PressureDrop = v }}
	roleLength = readingRole{"length", []string{"tube length", "capillary length", "length"}, quantity.Length, "mm", true,
		func(r *media.Reading, v float64) { r.TubeLength = v }}
	roleFallSpeed = readingRole{"speed", []string{"fall speed", "terminal speed", "speed", "velocity"}, quantity.Speed, "mm/s", false,
		func(r *media.Reading, v float64) { r.FallSpeed = v }}
	roleFallTime = readingRole{"time", []string{"fall time", "time"}, quantity.Time, "s", false,
		func(r *media.Reading, v float64) { r.FallSpeed = v }} // a time until divided by the fall distance
)

// rolesFor lists the columns a geometry reads.
func rolesFor(geometry string, byTime bool) []readingRole {
	switch geometry {
	case media.GeometryCapillary:
		return []readingRole{roleFlow, rolePressure, roleLength}
	case media.GeometryFallingBall:
		if byTime {
			return []readingRole{roleFallTime}
		}
		return []readingRole{roleFallSpeed}
	}
	return []readingRole{roleSpeed, roleTorque}
}

// rowReject is an input row that could not be read.
type rowReject struct {
	line   int
	reason string
}

// readingTable is the readings of one table with the rows it could not read.
type readingTable struct {
	readings []media.Reading
	rejects  []rowReject
}

// matchRole finds the role a header names, with the unit in its brackets.
func matchRole(h string, roles []readingRole) (int, string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	name, unit := h, ""
	for _, p := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if strings.HasSuffix(h, p[1]) {
			if i := strings.LastIndex(h, p[0]); i > 0 {
				name, unit = h[:i], strings.TrimSpace(h[i+1:len(h)-1])
			}
		}
	}
	n := normName(name)
	for i, r := range roles {
		for _, a := range r.names {
			if n == a {
				return i, unit
			}
		}
	}
	return -1, ""
}

// readReadings reads a table of raw readings. Header problems are usage
// errors; a row that cannot be read is rejected with its line, column and
// reason, never skipped.
func readReadings(r io.Reader, tsv bool, roles []readingRole, units map[string]string) (readingTable, error) {
	var t readingTable
	cr := csv.NewReader(r)
	if tsv {
		cr.Comma = '\t'
	}
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err == io.EOF {
		return t, usagef("the input is empty: a header line naming the %s columns is needed", roleList(roles))
	}
	if err != nil {
		return t, usagef("cannot read the header: %v", err)
	}
	if len(header) > 0 {
		header[0] = strings.TrimPrefix(header[0], "\ufeff")
	}
	col := make([]int, len(roles))
	unit := make([]string, len(roles))
	for i := range col {
		col[i] = -1
	}
	for i, h := range header {
		if k, u := matchRole(h, roles); k >= 0 {
			if col[k] >= 0 {
				return t, usagef("columns %q and %q both hold the %s; keep one", header[col[k]], h, roles[k].role)
			}
			col[k], unit[k] = i, u
		}
	}
	for role, u := range units {
		k := -1
		for i, r := range roles {
			if r.role == role {
				k = i
			}
		}
		if k < 0 {
			return t, usagef("--unit %s=%s: this geometry's columns are %s", role, u, roleList(roles))
		}
		if !quantity.KnownUnit(roles[k].kind, u) {
			return t, usagef("--unit %s=%s: not a unit of %s; accepted: %s", role, u, roles[k].role, strings.Join(quantity.Units(roles[k].kind), ", "))
		}
		unit[k] = u
	}
	for k, r := range roles {
		if col[k] < 0 && !r.optional {
			return t, usagef("no %s column; name one %q (columns: %s)", r.role, r.names[0]+" ("+r.unit+")", strings.Join(header, ", "))
		}
	}
	first := true
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return t, nil
		}
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			t.rejects = append(t.rejects, rowReject{pe.StartLine, fmt.Sprintf("not a valid table row: %v", pe.Err)})
			continue
		}
		if err != nil {
			return t, err
		}
		line, _ := cr.FieldPos(0)
		if len(rec) == 1 && strings.TrimSpace(rec[0]) == "" {
			continue
		}
		if first {
			if err := unitsGiven(rec, header, roles, col, unit); err != nil {
				return t, err
			}
			first = false
		}
		rd := media.Reading{Line: line, TubeLength: math.NaN()}
		if reason := fillReading(&rd, rec, header, roles, col, unit); reason != "" {
			t.rejects = append(t.rejects, rowReject{line, reason})
			continue
		}
		t.readings = append(t.readings, rd)
	}
}

// unitsGiven refuses a table whose column has no unit, neither in its
// header nor by --unit, when the first row's cell is a bare number: every
// row would be refused for it.
func unitsGiven(rec, header []string, roles []readingRole, col []int, unit []string) error {
	for k, r := range roles {
		i := col[k]
		if i < 0 || i >= len(rec) || unit[k] != "" {
			continue
		}
		if _, plain := quantity.PlainNumber(strings.TrimSpace(rec[i])); plain {
			return usagef("column %q has no unit: name it %q or give --unit %s=%s (accepted: %s)", header[i], r.names[0]+" ("+r.unit+")", r.role, r.unit, strings.Join(quantity.Units(r.kind), ", "))
		}
	}
	return nil
}

// fillReading sets the reading's fields from the row, or says why it cannot.
func fillReading(rd *media.Reading, rec, header []string, roles []readingRole, col []int, unit []string) string {
	for k, r := range roles {
		i := col[k]
		if i < 0 {
			continue
		}
		if i >= len(rec) || strings.TrimSpace(rec[i]) == "" {
			if r.optional {
				continue
			}
			return fmt.Sprintf("column %q: no value", header[i])
		}
		v, err := quantity.ParseDefault(r.kind, rec[i], unit[k])
		if err != nil {
			return fmt.Sprintf("column %q: %v", header[i], err)
		}
		if v.PerBodyLength {
			return fmt.Sprintf("column %q: a fall speed in body lengths per second has no meaning here", header[i])
		}
		r.set(rd, v.SI)
	}
	return ""
}

func roleList(roles []readingRole) string {
	var names []string
	for _, r := range roles {
		names = append(names, r.role)
	}
	return strings.Join(names, ", ")
}
