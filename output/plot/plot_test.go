package plot

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
	"math"
	"math/rand/v2"
	"os"
	"strings"
	"testing"

	"github.com/starmock/starmock/output/summary"
)

// decode checks that b is a PNG of the given size and returns it.
func decode(t *testing.T, b []byte, w, h int) image.Image {
	t.Helper()
	img, err := png.Decode(bytes.NewReader(b))
	if err != nil {
		t.Fatalf("png does not decode: %v", err)
	}
	if got := img.Bounds().Size(); got.X != w || got.Y != h {
		t.Fatalf("png size %v, want %dx%d", got, w, h)
	}
	return img
}

// pixelStats counts non-white pixels and returns the mean row of pixels close
// to colour c (within 30 per channel), with their number.
func pixelStats(img image.Image, c color.Color) (nonWhite, near int, meanY float64) {
	cr, cg, cb, _ := c.RGBA()
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				nonWhite++
			}
			if absDiff(r, cr) < 30*257 && absDiff(g, cg) < 30*257 && absDiff(bl, cb) < 30*257 {
				near++
				meanY += float64(y)
			}
		}
	}
	if near > 0 {
		meanY /= float64(near)
	}
	return nonWhite, near, meanY
}

// nonWhiteIn counts non-white pixels inside the fraction [x0, x1) × [y0, y1)
// of the image (to look inside the plot area, away from a colour bar).
func nonWhiteIn(img image.Image, x0, x1, y0, y1 float64) int {
	b := img.Bounds()
	w, h := float64(b.Dx()), float64(b.Dy())
	n := 0
	for y := int(y0 * h); y < int(y1*h); y++ {
		for x := int(x0 * w); x < int(x1*w); x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				n++
			}
		}
	}
	return n
}

func absDiff(a, b uint32) uint32 {
	if a > b {
		return a - b
	}
	return b - a
}

func savePNG(t *testing.T, name string, b []byte) {
	if dir := os.Getenv("STARMOCK_PLOT_DIR"); dir != "" { // for looking at the pictures by eye
		if err := os.WriteFile(dir+"/"+name, b, 0o644); err != nil {
			t.Log(err)
		}
	}
}

func testPoints() CMDPoints {
	r := rand.New(rand.NewPCG(1, 2))
	var p CMDPoints
	add := func(c, m float64, st string, det bool) {
		p.Colour, p.Mag, p.Stage, p.Detected = append(p.Colour, c), append(p.Mag, m), append(p.Stage, st), append(p.Detected, det)
	}
	for range 3000 { // grey truth: faint main sequence
		m := 19 + 5*r.Float64()
		add(0.3+0.25*(m-19)+0.05*r.NormFloat64(), m, "main_sequence", false)
	}
	for range 400 { // detected giants: bright, red
		add(1.0+0.1*r.NormFloat64(), 14+r.Float64(), "red_giant_branch", true)
	}
	add(math.NaN(), 20, "main_sequence", true) // no position: skipped
	return p
}

func TestCMD(t *testing.T) {
	t.Parallel()
	pts := testPoints()
	opt := CMDOptions{Title: "invented cluster", ColourLabel: "g − r [mag]", MagLabel: "r [mag]", WidthPx: 640, HeightPx: 720}
	var a, b bytes.Buffer
	if err := CMD(&a, pts, opt); err != nil {
		t.Fatal(err)
	}
	if err := CMD(&b, pts, opt); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("same input, different PNG bytes")
	}
	savePNG(t, "cmd.png", a.Bytes())
	img := decode(t, a.Bytes(), 640, 720)
	rgb, _ := StageColour("red_giant_branch")
	nonWhite, nearRGB, yRGB := pixelStats(img, rgb)
	_, nearGrey, yGrey := pixelStats(img, color.RGBA{R: 160, G: 160, B: 160, A: 255})
	if nonWhite < 5000 || nearRGB < 200 || nearGrey < 1000 {
		t.Errorf("too few drawn pixels: %d non-white, %d giant-coloured, %d grey", nonWhite, nearRGB, nearGrey)
	}
	// magnitude increases downward: the bright giants (14–15 mag) lie above
	// the faint grey stars (19–24 mag) in image rows (y grows downward)
	if !(yRGB < yGrey) {
		t.Errorf("giant pixels at mean row %.0f, grey at %.0f: magnitude axis not inverted", yRGB, yGrey)
	}
}

func TestCMDWithTruthHess(t *testing.T) {
	t.Parallel()
	cb, _ := summary.NewBinning(-0.5, 2, 50)
	mb, _ := summary.NewBinning(12, 25, 65)
	h := summary.NewHist2D(cb, mb)
	r := rand.New(rand.NewPCG(4, 4))
	for range 20000 {
		m := 14 + 10*r.Float64()
		h.Add(0.2+0.1*(m-14)+0.05*r.NormFloat64(), m)
	}
	var buf bytes.Buffer
	pts := CMDPoints{Colour: []float64{1}, Mag: []float64{15}, Stage: []string{"core_helium_burning"}, Detected: []bool{true}}
	if err := CMD(&buf, pts, CMDOptions{ColourLabel: "g − r [mag]", MagLabel: "r [mag]", TruthHess: h}); err != nil {
		t.Fatal(err)
	}
	savePNG(t, "cmd_hess.png", buf.Bytes())
	img := decode(t, buf.Bytes(), DefaultSizePx, DefaultSizePx)
	if nw := nonWhiteIn(img, 0.2, 0.8, 0.15, 0.85); nw < 5000 {
		t.Errorf("%d non-white pixels in the plot area, want a visible density", nw)
	}
	// only the density, no points: allowed
	if err := CMD(&buf, CMDPoints{}, CMDOptions{ColourLabel: "c", MagLabel: "m", TruthHess: h}); err != nil {
		t.Errorf("density only: %v", err)
	}
}

func TestCMDErrors(t *testing.T) {
	t.Parallel()
	var buf bytes.Buffer
	ok := CMDOptions{ColourLabel: "g − r [mag]", MagLabel: "r [mag]"}
	cases := []struct {
		name string
		pts  CMDPoints
		opt  CMDOptions
		want string
	}{
		{"empty", CMDPoints{}, ok, "plot: cmd has nothing to draw (0 points"},
		{"all NaN", CMDPoints{Colour: []float64{math.NaN()}, Mag: []float64{1}, Stage: []string{"x"}, Detected: []bool{true}}, ok, "nothing to draw (1 points"},
		{"no label", testPoints(), CMDOptions{MagLabel: "r"}, "cmd axis label missing"},
		{"too small", testPoints(), CMDOptions{ColourLabel: "c", MagLabel: "m", WidthPx: 50}, "width 50 px outside allowed range [100, 8000] px"},
	}
	for _, c := range cases {
		err := CMD(&buf, c.pts, c.opt)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: %v, want %q", c.name, err, c.want)
		}
	}
	func() {
		defer func() {
			if recover() == nil {
				t.Error("unequal slice lengths did not panic")
			}
		}()
		CMD(&buf, CMDPoints{Colour: []float64{1, 2}, Mag: []float64{1}, Stage: []string{"a"}, Detected: []bool{true}}, ok)
	}()
}

func testHessSet(t *testing.T) *summary.HessSet {
	cb, _ := summary.NewBinning(-0.5, 2.5, 60)
	mb, _ := summary.NewBinning(12, 26, 70)
	set, err := summary.NewHessSet("g-r", "r", cb, mb)
	if err != nil {
		t.Fatal(err)
	}
	r := rand.New(rand.NewPCG(6, 6))
	for range 30000 {
		m := 14 + 11*r.Float64()
		set.Add("thin_disc", 0.4+0.12*(m-14)+0.06*r.NormFloat64(), m)
		set.AddExpected("thin_disc", 0.4+0.12*(m-14), m, 0.5)
		if r.IntN(3) == 0 {
			set.Add("halo", 0.35+0.05*r.NormFloat64(), 18+6*r.Float64())
		}
		if r.IntN(10) == 0 {
			set.Add("cluster", 1.1+0.04*r.NormFloat64(), 15+0.5*r.Float64())
		}
	}
	return set
}

func TestHess(t *testing.T) {
	t.Parallel()
	set := testHessSet(t)
	opt := HessOptions{Title: "detected stars", ColourLabel: "g − r [mag]", MagLabel: "r [mag]", WidthPx: 700, HeightPx: 600}
	var a, b bytes.Buffer
	if err := Hess(&a, set.Get(summary.All), opt); err != nil {
		t.Fatal(err)
	}
	if err := Hess(&b, set.Get(summary.All), opt); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("Hess: same input, different bytes")
	}
	savePNG(t, "hess.png", a.Bytes())
	img := decode(t, a.Bytes(), 700, 600)
	// the cells of the diagram, inside the plot area (axes excluded: x from
	// 15% to 80% of the width, y from 10% to 85% of the height)
	if nw := nonWhiteIn(img, 0.15, 0.8, 0.1, 0.85); nw < 20000 {
		t.Errorf("Hess: %d non-white pixels in the plot area", nw)
	}
	opt.Expected = true
	if err := Hess(&a, set.Get("thin_disc"), opt); err != nil {
		t.Errorf("expected counts: %v", err)
	}
	empty := set.Get("no_such_component")
	if err := Hess(&b, empty, opt); err == nil || !strings.Contains(err.Error(), "hess diagram is empty") {
		t.Errorf("empty Hess: %v", err)
	}
	if err := Hess(&b, nil, opt); err == nil {
		t.Error("nil Hess accepted")
	}
}

func TestHessPanels(t *testing.T) {
	t.Parallel()
	set := testHessSet(t)
	opt := HessOptions{Title: "per component", ColourLabel: "g − r [mag]", MagLabel: "r [mag]", WidthPx: 1000, HeightPx: 900}
	var a, b bytes.Buffer
	if err := HessPanels(&a, set, opt); err != nil {
		t.Fatal(err)
	}
	if err := HessPanels(&b, set, opt); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a.Bytes(), b.Bytes()) {
		t.Error("HessPanels: same input, different bytes")
	}
	savePNG(t, "hess_panels.png", a.Bytes())
	img := decode(t, a.Bytes(), 1000, 900)
	// the thin-disc panel (bottom right of the 2×2 grid) has drawn cells
	if nw := nonWhiteIn(img, 0.55, 0.85, 0.6, 0.9); nw < 5000 {
		t.Errorf("HessPanels: %d non-white pixels in the thin-disc panel", nw)
	}
	cb, _ := summary.NewBinning(0, 1, 2)
	emptySet, _ := summary.NewHessSet("c", "m", cb, cb)
	if err := HessPanels(&b, emptySet, opt); err == nil || !strings.Contains(err.Error(), "hess set is empty") {
		t.Errorf("empty set: %v", err)
	}
}

func TestStarCounts(t *testing.T) {
	t.Parallel()
	mb, _ := summary.NewBinning(14, 26, 24)
	sc, _ := summary.NewStarCounts([]string{"g", "r", "i"}, mb)
	r := rand.New(rand.NewPCG(2, 2))
	for range 20000 {
		// counts rising ~ 10^(0.3 m): magnitude from an exponential tail
		m := 26 - r.ExpFloat64()/(0.3*math.Ln10)
		for b := range 3 {
			sc.Add(b, "thin_disc", "main_sequence", m-0.3*float64(b))
			sc.AddExpected(b, "thin_disc", "main_sequence", m-0.3*float64(b), 1)
		}
	}
	for _, cum := range []bool{true, false} {
		curves, err := CurvesFromCounts(sc, cum, !cum)
		if err != nil {
			t.Fatal(err)
		}
		if len(curves) != 3 || curves[0].Label != "g" {
			t.Fatalf("curves %d", len(curves))
		}
		if cum && curves[0].N[23] != 20000 {
			t.Errorf("N(<26) in g = %v, want 20000", curves[0].N[23])
		}
		opt := CountsOptions{Title: "invented field", MagLabel: "magnitude [mag]", NLabel: "N(<m)", WidthPx: 600, HeightPx: 500}
		var a, b bytes.Buffer
		if err := StarCounts(&a, curves, opt); err != nil {
			t.Fatal(err)
		}
		if err := StarCounts(&b, curves, opt); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(a.Bytes(), b.Bytes()) {
			t.Error("StarCounts: same input, different bytes")
		}
		if cum {
			savePNG(t, "counts_cum.png", a.Bytes())
		} else {
			savePNG(t, "counts_diff.png", a.Bytes())
		}
		img := decode(t, a.Bytes(), 600, 500)
		_, near, _ := pixelStats(img, curveColours[0])
		if near < 300 {
			t.Errorf("first curve colour on %d pixels only", near)
		}
	}
	var buf bytes.Buffer
	opt := CountsOptions{MagLabel: "m", NLabel: "N"}
	if err := StarCounts(&buf, nil, opt); err == nil || !strings.Contains(err.Error(), "nothing to draw (0 curves") {
		t.Errorf("no curves: %v", err)
	}
	zero := []Curve{{Label: "g", Mag: []float64{20, 21}, N: []float64{0, 0}}}
	if err := StarCounts(&buf, zero, opt); err == nil || !strings.Contains(err.Error(), "no point with N > 0") {
		t.Errorf("zero curves: %v", err)
	}
	if err := StarCounts(&buf, zero, CountsOptions{}); err == nil || !strings.Contains(err.Error(), "axis label missing") {
		t.Errorf("no labels: %v", err)
	}
}

func TestStageOrder(t *testing.T) {
	t.Parallel()
	words, cols := StageOrder([]string{"zeta_phase", "red_giant_branch", "main_sequence", "alpha_phase", "main_sequence"})
	want := []string{"main_sequence", "red_giant_branch", "alpha_phase", "zeta_phase"}
	if strings.Join(words, ",") != strings.Join(want, ",") || len(cols) != 4 {
		t.Errorf("order %v", words)
	}
	if _, known := StageColour("main_sequence"); !known {
		t.Error("main_sequence unknown")
	}
	if _, known := StageColour("zeta_phase"); known {
		t.Error("invented stage reported known")
	}
	if stagePhrase("carbon_oxygen_white_dwarf") != "carbon oxygen white dwarf" {
		t.Error(stagePhrase("carbon_oxygen_white_dwarf"))
	}
}
