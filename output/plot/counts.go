package plot

import (
	"fmt"
	"image/color"
	"io"
	"math"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/starmock/starmock/output/summary"
)

// Curve is one star-count curve: N at each magnitude (equal lengths), with
// an optional uncertainty Err (nil, or the same length) drawn as error bars.
type Curve struct {
	Label string
	Mag   []float64 // mag
	N     []float64 // stars (N(<m), or dN/dm per mag)
	Err   []float64
}

// CountsOptions are the labels and size of a star-count picture.
type CountsOptions struct {
	// Title; "" gives "star counts".
	Title string
	// MagLabel labels the X axis (e.g. "magnitude [mag]"); NLabel the Y axis
	// (e.g. "N(<m)" or "dN/dm [mag⁻¹]"); both required.
	MagLabel, NLabel string
	// WidthPx, HeightPx: picture size in pixels, each in [100, 8000]; 0 means 800.
	WidthPx, HeightPx int
}

var curveColours = []color.RGBA{
	{R: 31, G: 119, B: 180, A: 255}, {R: 44, G: 160, B: 44, A: 255}, {R: 214, G: 39, B: 40, A: 255},
	{R: 148, G: 103, B: 189, A: 255}, {R: 255, G: 127, B: 14, A: 255}, {R: 140, G: 86, B: 75, A: 255},
	{R: 23, G: 190, B: 207, A: 255}, {A: 255},
}

// StarCounts draws star-count curves as PNG to w: one line with points per
// curve (colours in curve order), logarithmic Y axis, legend of curve labels.
// Points with N ≤ 0 or a non-finite value cannot be shown on a log axis and
// are left out (documented, the curve is broken there). It returns an error
// if no curve has a positive point, a label is missing or the size is bad;
// it panics if a curve's slices differ in length (a caller bug).
func StarCounts(w io.Writer, curves []Curve, opt CountsOptions) error {
	if opt.MagLabel == "" || opt.NLabel == "" {
		return fmt.Errorf("plot: star counts axis label missing (magnitude %q, counts %q)", opt.MagLabel, opt.NLabel)
	}
	wd, ht, err := size(opt.WidthPx, opt.HeightPx)
	if err != nil {
		return err
	}
	p := gplot.New()
	p.Title.Text = opt.Title
	if p.Title.Text == "" {
		p.Title.Text = "star counts"
	}
	p.X.Label.Text, p.Y.Label.Text = opt.MagLabel, opt.NLabel
	p.Y.Scale = gplot.LogScale{}
	p.Y.Tick.Marker = gplot.LogTicks{Prec: -1}
	p.Legend.Top, p.Legend.Left = true, true
	drawn := 0
	for i, c := range curves {
		if len(c.N) != len(c.Mag) || c.Err != nil && len(c.Err) != len(c.Mag) {
			panic("plot: StarCounts: a curve's Mag, N and Err must have equal lengths")
		}
		var xys plotter.XYs
		var errs plotter.YErrors
		for j := range c.Mag {
			if !finite(c.Mag[j]) || !finite(c.N[j]) || c.N[j] <= 0 {
				continue
			}
			xys = append(xys, plotter.XY{X: c.Mag[j], Y: c.N[j]})
			if c.Err != nil {
				// the lower bar stops at N/10 at most, so it stays on the log axis
				lo := math.Min(c.Err[j], 0.9*c.N[j])
				errs = append(errs, struct{ Low, High float64 }{lo, c.Err[j]})
			}
		}
		if len(xys) == 0 {
			continue
		}
		col := curveColours[i%len(curveColours)]
		l, s, err := plotter.NewLinePoints(xys)
		if err != nil {
			return fmt.Errorf("plot: star counts curve %q: %w", c.Label, err)
		}
		l.LineStyle.Color, l.LineStyle.Width = col, vg.Points(1.5)
		s.GlyphStyle = draw.GlyphStyle{Color: col, Radius: vg.Points(2), Shape: draw.CircleGlyph{}}
		p.Add(l, s)
		if c.Err != nil {
			eb := &plotter.YErrorBars{XYs: xys, YErrors: errs, LineStyle: draw.LineStyle{Color: col, Width: vg.Points(1)}, CapWidth: vg.Points(4)}
			p.Add(eb)
		}
		p.Legend.Add(c.Label, l, s)
		drawn++
	}
	if drawn == 0 {
		return fmt.Errorf("plot: star counts have nothing to draw (%d curves, no point with N > 0)", len(curves))
	}
	c := newCanvas(wd, ht)
	p.Draw(draw.New(c))
	return writePNG(w, c)
}

// CurvesFromCounts returns one curve per band of sc (all components, all
// stages), in band order: N(<m) at each bin's upper edge with sqrt(N) when
// cumulative is true, else dN/dm (count per bin divided by the bin width,
// per mag) at the bin centre with sqrt(N)/width. expected selects the
// expected counts (with sqrt(Σw²)) instead of the realised ones.
func CurvesFromCounts(sc *summary.StarCounts, cumulative, expected bool) ([]Curve, error) {
	if sc == nil {
		return nil, fmt.Errorf("plot: star counts missing (nil)")
	}
	b := sc.Binning()
	var out []Curve
	for _, band := range sc.Bands() {
		h, err := sc.Get(summary.Key{Band: band, Component: summary.All, Stage: summary.All})
		if err != nil {
			return nil, err
		}
		c := Curve{Label: band, Mag: make([]float64, b.N), N: make([]float64, b.N), Err: make([]float64, b.N)}
		if cumulative {
			cc, cce, ce, cee := h.Cumulative()
			for i := 0; i < b.N; i++ {
				c.Mag[i] = b.Edge(i + 1)
				if expected {
					c.N[i], c.Err[i] = ce[i], cee[i]
				} else {
					c.N[i], c.Err[i] = cc[i], cce[i]
				}
			}
		} else {
			wdt := b.Width()
			for i := 0; i < b.N; i++ {
				c.Mag[i] = b.Centre(i)
				if expected {
					c.N[i], c.Err[i] = h.Expected(i)/wdt, h.ExpectedErr(i)/wdt
				} else {
					c.N[i], c.Err[i] = float64(h.Count(i))/wdt, h.CountErr(i)/wdt
				}
			}
		}
		out = append(out, c)
	}
	return out, nil
}
