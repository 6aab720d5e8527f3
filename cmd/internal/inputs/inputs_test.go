package inputs

import "testing"

// The index constants must name the fields in the order of Fields.
func TestIndexOrder(t *testing.T) {
	if len(Fields) != NumFields {
		t.Fatalf("%d fields, %d indices", len(Fields), NumFields)
	}
	for name, want := range map[string]int{"length": Length, "speed": Speed, "medium": Medium, "temperature": Temperature, "latitude": Latitude, "disc": Disc, "humidity": Humidity} {
		if got := Index(name); got != want {
			t.Errorf("Index(%q) = %d, want %d", name, got, want)
		}
	}
}
