package dust

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestAVTableExample reads the invented example file and checks the linear
// interpolation (plain arithmetic on its rows), the (0, 0) start and the
// documented constant value beyond the last row.
func TestAVTableExample(t *testing.T) {
	t.Parallel()
	tab, err := LoadAVTable("testdata/sightlines_example.tsv")
	if err != nil {
		t.Fatal(err)
	}
	if tab.Len() != 2 {
		t.Fatalf("%d directions, want 2", tab.Len())
	}
	a := tab.Lines()[0]
	cases := []struct{ d, want float64 }{
		{0, 0}, {50, 0.04}, {100, 0.08}, {175, 0.195}, {250, 0.31}, {625, 0.755}, {4000, 2.5}, {1e5, 2.5},
	}
	for _, c := range cases {
		if got := a.AV(c.d); math.Abs(got-c.want) > 1e-12 {
			t.Errorf("AV(%g) = %.15g, want %g", c.d, got, c.want)
		}
	}
	if a.Covers(4001) || !a.Covers(4000) || a.MaxDistancePc() != 4000 {
		t.Error("Covers/MaxDistancePc wrong")
	}
	b := tab.Lines()[1]
	if got := b.AV(500); got != 0.05 { // flat stretch between 200 and 800 pc
		t.Errorf("flat stretch: %g", got)
	}
	// Nearest: separations by spherical geometry (exact values)
	s, sep := tab.Nearest(30, -1)
	if s != a || math.Abs(sep-1) > 1e-12 {
		t.Errorf("Nearest(30,-1) = (%v, %g), want first line at 1°", s.LDeg, sep)
	}
	if sep := angSepDeg(0, 89, 180, 89); math.Abs(sep-2) > 1e-10 {
		t.Errorf("separation over the pole %g, want 2°", sep)
	}
	if sep := angSepDeg(10, 0, 100, 0); math.Abs(sep-90) > 1e-10 {
		t.Errorf("separation along the equator %g, want 90°", sep)
	}
}

// TestAVTableErrors: each rule of the format gives an error with file:line.
func TestAVTableErrors(t *testing.T) {
	t.Parallel()
	const hdr = "# c\nl_deg b_deg distance_pc av_mag\n"
	cases := []struct {
		name, text, want string
	}{
		{"no header", "1 2 3 4\n", "t.tsv:1:"},
		{"wrong header", "l b d av\n1 2 3 4\n", "t.tsv:1:"},
		{"empty", hdr, "no data rows"},
		{"field count", hdr + "1 2 3\n", "t.tsv:3: "},
		{"not a number", hdr + "1 2 x 4\n", "distance_pc \"x\""},
		{"NaN", hdr + "1 2 3 NaN\n", "av_mag \"NaN\""},
		{"negative distance", hdr + "1 2 -3 0.1\n", "distance_pc -3 pc is negative"},
		{"negative A_V", hdr + "1 2 3 -0.1\n", "av_mag -0.1 mag is negative"},
		{"l range", hdr + "360 2 3 0.1\n", "l_deg 360 deg"},
		{"b range", hdr + "10 91 3 0.1\n", "b_deg 91 deg"},
		{"unsorted distance", hdr + "1 2 30 0.1\n1 2 20 0.2\n", "t.tsv:4: "},
		{"repeated distance", hdr + "1 2 30 0.1\n1 2 30 0.2\n", "must increase strictly"},
		{"decreasing A_V", hdr + "1 2 30 0.3\n1 2 40 0.2\n", "t.tsv:4: "},
		{"A_V at zero", hdr + "1 2 0 0.3\n", "at distance_pc 0"},
		{"split direction", hdr + "1 2 30 0.3\n5 6 40 0.2\n1 2 50 0.4\n", "t.tsv:5: "},
	}
	for _, c := range cases {
		_, err := ReadAVTable(strings.NewReader(c.text), "t.tsv")
		if !errors.Is(err, ErrAVTable) || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: got %v, want ErrAVTable containing %q", c.name, err, c.want)
		}
	}
	if _, err := LoadAVTable("testdata/does-not-exist.tsv"); err == nil {
		t.Error("missing file: no error")
	}
}

// TestConstant: the screen is the same at every distance; negative A_V refused.
func TestConstant(t *testing.T) {
	t.Parallel()
	c, err := NewConstant(0.4)
	if err != nil || c.AV(0) != 0.4 || c.AV(1e4) != 0.4 {
		t.Errorf("Constant: %v %v", c, err)
	}
	if _, err := NewConstant(-0.1); !errors.Is(err, ErrNegativeAV) {
		t.Errorf("NewConstant(-0.1): %v", err)
	}
}
