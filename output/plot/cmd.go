package plot

import (
	"fmt"
	"image/color"
	"io"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/starmock/starmock/output/summary"
)

// CMDPoints are the stars of a colour–magnitude diagram as plain slices of
// equal length: colour (mag), magnitude (mag), stage word and detected flag.
// Points with Detected false are drawn as grey truth; detected points are
// drawn on top, coloured by stage. To show the whole true population in grey
// and the detected stars at their observed positions, pass the true
// photometry of every star with Detected false followed by the observed
// photometry of the detected stars with Detected true.
type CMDPoints struct {
	Colour, Mag []float64
	Stage       []string
	Detected    []bool
}

// PointsFromSample converts a reservoir sample to CMDPoints.
func PointsFromSample(ps []summary.Point) CMDPoints {
	out := CMDPoints{Colour: make([]float64, len(ps)), Mag: make([]float64, len(ps)),
		Stage: make([]string, len(ps)), Detected: make([]bool, len(ps))}
	for i, p := range ps {
		out.Colour[i], out.Mag[i], out.Stage[i], out.Detected[i] = p.Colour, p.Mag, p.Stage, p.Detected
	}
	return out
}

// CMDOptions are the labels and size of a colour–magnitude diagram.
type CMDOptions struct {
	// Title of the picture; "" gives "colour–magnitude diagram".
	Title string
	// ColourLabel and MagLabel label the axes, e.g. "g − r [mag]" and
	// "r [mag]"; both are required.
	ColourLabel, MagLabel string
	// WidthPx and HeightPx: picture size in pixels, each in [100, 8000]; 0 means 800.
	WidthPx, HeightPx int
	// TruthHess, if not nil, is drawn below the points as a grey density
	// (log10 of the counts per cell), e.g. the Hess diagram of every true star,
	// so the truth layer needs no point sample at all.
	TruthHess *summary.Hist2D
}

// CMD draws a colour–magnitude diagram as PNG to w: truth in grey (the
// optional TruthHess density and the points with Detected false), detected
// points coloured by stage (see StageColour) with a legend of stage words,
// labelled axes, magnitude increasing downward. Points with a non-finite
// colour or magnitude have no position and are not drawn. It returns an error
// if there is nothing to draw, a label is missing or the size is out of
// range, and panics if the slices of pts differ in length (a caller bug).
// The same input gives the same bytes.
func CMD(w io.Writer, pts CMDPoints, opt CMDOptions) error {
	n := len(pts.Colour)
	if len(pts.Mag) != n || len(pts.Stage) != n || len(pts.Detected) != n {
		panic("plot: CMD: Colour, Mag, Stage and Detected must have equal lengths")
	}
	if opt.ColourLabel == "" || opt.MagLabel == "" {
		return fmt.Errorf("plot: cmd axis label missing (colour %q, magnitude %q)", opt.ColourLabel, opt.MagLabel)
	}
	wd, ht, err := size(opt.WidthPx, opt.HeightPx)
	if err != nil {
		return err
	}
	var truth plotter.XYs
	byStage := map[string]plotter.XYs{}
	var detStages []string
	for i := 0; i < n; i++ {
		if !finite(pts.Colour[i]) || !finite(pts.Mag[i]) {
			continue
		}
		xy := plotter.XY{X: pts.Colour[i], Y: pts.Mag[i]}
		if pts.Detected[i] {
			if _, ok := byStage[pts.Stage[i]]; !ok {
				detStages = append(detStages, pts.Stage[i])
			}
			byStage[pts.Stage[i]] = append(byStage[pts.Stage[i]], xy)
		} else {
			truth = append(truth, xy)
		}
	}
	hasHess := opt.TruthHess != nil && opt.TruthHess.Total() > 0
	if len(truth) == 0 && len(byStage) == 0 && !hasHess {
		return fmt.Errorf("plot: cmd has nothing to draw (%d points, none with finite colour and magnitude, and no truth hess diagram)", n)
	}
	p := gplot.New()
	p.Title.Text = opt.Title
	if p.Title.Text == "" {
		p.Title.Text = "colour–magnitude diagram"
	}
	p.X.Label.Text, p.Y.Label.Text = opt.ColourLabel, opt.MagLabel
	invertY(p)
	p.Legend.Top = true
	p.Legend.Left = false
	grey := color.RGBA{R: 160, G: 160, B: 160, A: 255}
	if hasHess {
		hm, _, _, err := hessHeatMap(opt.TruthHess, greyMap(), false, 0, 0)
		if err != nil {
			return err
		}
		p.Add(hm)
		p.Legend.Add("truth (density)", swatch(color.RGBA{R: 120, G: 120, B: 120, A: 255}))
	}
	if len(truth) > 0 {
		s, err := plotter.NewScatter(truth)
		if err != nil {
			return fmt.Errorf("plot: cmd truth points: %w", err)
		}
		s.GlyphStyle = draw.GlyphStyle{Color: grey, Radius: vg.Points(1), Shape: draw.CircleGlyph{}}
		p.Add(s)
		p.Legend.Add("truth", s)
	}
	words, colours := StageOrder(detStages)
	for i, word := range words {
		s, err := plotter.NewScatter(byStage[word])
		if err != nil {
			return fmt.Errorf("plot: cmd points of stage %q: %w", word, err)
		}
		s.GlyphStyle = draw.GlyphStyle{Color: colours[i], Radius: vg.Points(1.6), Shape: draw.CircleGlyph{}}
		p.Add(s)
		p.Legend.Add(stagePhrase(word), s)
	}
	c := newCanvas(wd, ht)
	p.Draw(draw.New(c))
	return writePNG(w, c)
}

// swatch is a legend thumbnail: a filled square of one colour.
func swatch(c color.Color) gplot.Thumbnailer { return swatchThumb{c} }

type swatchThumb struct{ c color.Color }

func (s swatchThumb) Thumbnail(c *draw.Canvas) {
	pts := []vg.Point{{X: c.Min.X, Y: c.Min.Y}, {X: c.Min.X, Y: c.Max.Y}, {X: c.Max.X, Y: c.Max.Y}, {X: c.Max.X, Y: c.Min.Y}}
	c.FillPolygon(s.c, c.ClipPolygonY(pts))
}
