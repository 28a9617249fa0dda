package plot

import (
	"fmt"
	"image/color"
	"io"
	"math"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/palette"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/starmock/starmock/output/summary"
)

// HessOptions are the labels and size of a Hess diagram picture.
type HessOptions struct {
	// Title of the picture (of the grid for HessPanels); "" gives "Hess diagram".
	Title string
	// ColourLabel and MagLabel label the axes (e.g. "g − r [mag]", "r [mag]"); required.
	ColourLabel, MagLabel string
	// WidthPx, HeightPx: picture size in pixels, each in [100, 8000]; 0 means 800.
	WidthPx, HeightPx int
	// Expected draws the expected counts (weights) instead of the realised counts.
	Expected bool
}

// hessGrid adapts a Hist2D to plotter.GridXYZ: Z = log10(value), NaN for
// empty cells (drawn transparent).
type hessGrid struct {
	h        *summary.Hist2D
	x, y     summary.Binning
	expected bool
}

func (g hessGrid) Dims() (c, r int) { return g.x.N, g.y.N }
func (g hessGrid) X(c int) float64  { return g.x.Centre(c) }
func (g hessGrid) Y(r int) float64  { return g.y.Centre(r) }
func (g hessGrid) Z(c, r int) float64 {
	var v float64
	if g.expected {
		v = g.h.Expected(c, r)
	} else {
		v = float64(g.h.Count(c, r))
	}
	if v <= 0 {
		return math.NaN()
	}
	return math.Log10(v)
}

// logRange returns the smallest and largest log10 value of the non-empty
// cells, and whether there is any.
func logRange(g hessGrid) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	nc, nr := g.Dims()
	for r := 0; r < nr; r++ {
		for c := 0; c < nc; c++ {
			if z := g.Z(c, r); !math.IsNaN(z) {
				lo, hi = math.Min(lo, z), math.Max(hi, z)
			}
		}
	}
	if !(lo <= hi) {
		return 0, 0, false
	}
	if hi == lo { // a single level: widen so the colour scale is defined
		hi = lo + 1
	}
	// start the scale 10% below the sparsest cell, so cells of one star are
	// not drawn in the palette's near-white end
	return lo - 0.1*(hi-lo), hi, true
}

func greyMap() palette.ColorMap {
	// light grey for sparse cells, dark grey for dense ones (luminance must
	// increase along the controls, so the map is built light-last and reversed)
	m, err := moreland.NewLuminance([]color.Color{color.RGBA{R: 60, G: 60, B: 60, A: 255}, color.RGBA{R: 225, G: 225, B: 225, A: 255}})
	if err != nil {
		panic("plot: grey colour map: " + err.Error()) // fixed valid controls; cannot happen
	}
	return palette.Reverse(m)
}

func densityMap() palette.ColorMap { return palette.Reverse(moreland.ExtendedBlackBody()) }

// hessHeatMap builds the heat map of h with log10 scaling; lo and hi fix the
// colour range when hi > lo (shared by panels), else the data range is used.
func hessHeatMap(h *summary.Hist2D, cmap palette.ColorMap, expected bool, lo, hi float64) (*plotter.HeatMap, float64, float64, error) {
	x, y := h.Binnings()
	g := hessGrid{h: h, x: x, y: y, expected: expected}
	if !(hi > lo) {
		var ok bool
		if lo, hi, ok = logRange(g); !ok {
			return nil, 0, 0, fmt.Errorf("plot: hess diagram is empty (no cell with a count above 0)")
		}
	}
	cmap.SetMin(lo)
	cmap.SetMax(hi)
	hm := plotter.NewHeatMap(g, cmap.Palette(255))
	hm.Min, hm.Max = lo, hi
	hm.NaN = color.Transparent
	hm.Underflow, hm.Overflow = color.Transparent, color.Transparent
	hm.Rasterized = false // the raster path does not follow an inverted Y axis; draw cells as polygons
	return hm, lo, hi, nil
}

func colourBar(lo, hi float64, label string) *gplot.Plot {
	cb := &plotter.ColorBar{ColorMap: densityMap(), Vertical: true, Colors: 255}
	cb.ColorMap.SetMin(lo)
	cb.ColorMap.SetMax(hi)
	p := gplot.New()
	p.Add(cb)
	p.HideX()
	p.Y.Padding = 0
	p.Y.Label.Text = label
	return p
}

func hessPanel(h *summary.Hist2D, title string, opt HessOptions, lo, hi float64) (*gplot.Plot, error) {
	hm, _, _, err := hessHeatMap(h, densityMap(), opt.Expected, lo, hi)
	if err != nil {
		return nil, err
	}
	p := gplot.New()
	p.Title.Text = title
	p.X.Label.Text, p.Y.Label.Text = opt.ColourLabel, opt.MagLabel
	x, y := h.Binnings()
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x.Lo, x.Hi, y.Lo, y.Hi
	invertY(p)
	p.Add(hm)
	return p, nil
}

func barLabel(expected bool) string {
	if expected {
		return "log10 expected stars per cell"
	}
	return "log10 stars per cell"
}

// Hess draws one Hess diagram (2-D histogram of colour × magnitude) as PNG to
// w: log10-scaled counts per cell (empty cells blank), magnitude increasing
// downward, and a colour bar. It returns an error for an empty histogram, a
// missing label or a bad size. The same input gives the same bytes.
func Hess(w io.Writer, h *summary.Hist2D, opt HessOptions) error {
	if h == nil {
		return fmt.Errorf("plot: hess diagram missing (nil)")
	}
	if opt.ColourLabel == "" || opt.MagLabel == "" {
		return fmt.Errorf("plot: hess axis label missing (colour %q, magnitude %q)", opt.ColourLabel, opt.MagLabel)
	}
	wd, ht, err := size(opt.WidthPx, opt.HeightPx)
	if err != nil {
		return err
	}
	title := opt.Title
	if title == "" {
		title = "Hess diagram"
	}
	x, y := h.Binnings()
	lo, hi, ok := logRange(hessGrid{h: h, x: x, y: y, expected: opt.Expected})
	if !ok {
		return fmt.Errorf("plot: hess diagram is empty (no cell with a count above 0)")
	}
	p, err := hessPanel(h, title, opt, lo, hi)
	if err != nil {
		return err
	}
	c := newCanvas(wd, ht)
	dc := draw.New(c)
	left, right := splitRight(dc, vg.Length(float64(wd)*0.16))
	p.Draw(left)
	colourBar(lo, hi, barLabel(opt.Expected)).Draw(draw.Crop(right, 0, 0, vg.Points(40), -vg.Points(30)))
	return writePNG(w, c)
}

// HessPanels draws the Hess diagrams of a set as a grid of panels in one PNG:
// first the sum over all components ("all"), then one panel per component in
// sorted order, on a shared log10 colour scale with one colour bar. Panels are
// laid out in ceil(sqrt(n)) columns. Components with no counts get an empty
// panel; an empty set is an error.
func HessPanels(w io.Writer, set *summary.HessSet, opt HessOptions) error {
	if set == nil {
		return fmt.Errorf("plot: hess set missing (nil)")
	}
	if opt.ColourLabel == "" || opt.MagLabel == "" {
		return fmt.Errorf("plot: hess axis label missing (colour %q, magnitude %q)", opt.ColourLabel, opt.MagLabel)
	}
	wd, ht, err := size(opt.WidthPx, opt.HeightPx)
	if err != nil {
		return err
	}
	names := append([]string{summary.All}, set.Components()...)
	hs := make([]*summary.Hist2D, len(names))
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, n := range names {
		hs[i] = set.Get(n)
		x, y := hs[i].Binnings()
		if l, h, ok := logRange(hessGrid{h: hs[i], x: x, y: y, expected: opt.Expected}); ok {
			lo, hi = math.Min(lo, l), math.Max(hi, h)
		}
	}
	if !(lo <= hi) {
		return fmt.Errorf("plot: hess set is empty (no component has a cell with a count above 0)")
	}
	cols := int(math.Ceil(math.Sqrt(float64(len(names)))))
	rows := (len(names) + cols - 1) / cols
	grid := make([][]*gplot.Plot, rows)
	for r := range grid {
		grid[r] = make([]*gplot.Plot, cols)
	}
	for i, n := range names {
		var p *gplot.Plot
		if hs[i].Total() == 0 && !opt.Expected || opt.Expected && !hasExpected(hs[i]) {
			p = gplot.New()
			p.Title.Text = n + " (no stars)"
			p.X.Label.Text, p.Y.Label.Text = opt.ColourLabel, opt.MagLabel
		} else if p, err = hessPanel(hs[i], n, opt, lo, hi); err != nil {
			return err
		}
		grid[i/cols][i%cols] = p
	}
	for i := len(names); i < rows*cols; i++ { // blank tiles fill the grid
		p := gplot.New()
		p.HideAxes()
		grid[i/cols][i%cols] = p
	}
	c := newCanvas(wd, ht)
	dc := draw.New(c)
	left, right := splitRight(dc, vg.Length(float64(wd)*0.12))
	title := opt.Title
	if title == "" {
		title = "Hess diagram"
	}
	ts := gplot.New().Title.TextStyle
	ts.XAlign, ts.YAlign = draw.XCenter, draw.YTop
	titleH := vg.Points(24)
	left.FillText(ts, vg.Point{X: (left.Min.X + left.Max.X) / 2, Y: left.Max.Y - vg.Points(4)}, title)
	body := draw.Crop(left, 0, 0, 0, -titleH)
	tiles := draw.Tiles{Rows: rows, Cols: cols, PadX: vg.Points(8), PadY: vg.Points(8), PadTop: vg.Points(4), PadBottom: vg.Points(4), PadLeft: vg.Points(4), PadRight: vg.Points(4)}
	canvases := gplot.Align(grid, tiles, body)
	for r := range grid {
		for cI := range grid[r] {
			grid[r][cI].Draw(canvases[r][cI])
		}
	}
	colourBar(lo, hi, barLabel(opt.Expected)).Draw(draw.Crop(right, 0, 0, vg.Points(40), -vg.Points(30)-titleH))
	return writePNG(w, c)
}

func hasExpected(h *summary.Hist2D) bool {
	x, y := h.Binnings()
	for iy := 0; iy < y.N; iy++ {
		for ix := 0; ix < x.N; ix++ {
			if h.Expected(ix, iy) > 0 {
				return true
			}
		}
	}
	return false
}
