package batch

import (
	"strings"

	"github.com/flowregime/flowregime/cmd/internal/inputs"
)

// MappedColumn says which input column holds which quantity, in which unit,
// and which column holds its uncertainty, for the run record.
type MappedColumn struct {
	Column   string `json:"column"`
	Quantity string `json:"quantity"`
	Unit     string `json:"unit,omitempty"`
	SDColumn string `json:"sd_column,omitempty"`
}

// mapped lists the columns that hold quantities, in column order.
func (m *mapping) mapped() []MappedColumn {
	var out []MappedColumn
	for c, h := range m.header {
		for f := range inputs.Fields {
			if m.col[f] != c {
				continue
			}
			mc := MappedColumn{Column: strings.TrimSpace(h), Quantity: inputs.Fields[f].Name, Unit: m.unit[f]}
			if s := m.sdCol[f]; s >= 0 && s < len(m.header) {
				mc.SDColumn = strings.TrimSpace(m.header[s])
			}
			out = append(out, mc)
		}
	}
	return out
}
