package inputs

// FirstUncertain returns the label and text of the first field of src whose
// value carries an uncertainty ("12±1mm"), for commands that do not
// propagate one and must say so rather than drop it; ok is false when none
// does.
func FirstUncertain(src Source) (label, text string, ok bool) {
	var c Cells
	c.Read(src)
	for f := range Fields {
		if c.Given[f] && c.Err[f] == nil && !Fields[f].Text && c.Value[f].SD > 0 {
			t, _, _, _ := src.Lookup(f)
			return c.Label[f], t, true
		}
	}
	return "", "", false
}
