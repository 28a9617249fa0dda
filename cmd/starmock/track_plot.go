package main

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"github.com/starmock/starmock/evolve"
)

// hrPlottable reports whether a track point belongs in the HR diagram: stars
// that shine, excluding neutron stars, black holes and white dwarfs hotter
// than 150 000 K (which would squeeze the nuclear-burning tracks).
func hrPlottable(s evolve.Star) bool {
	switch {
	case s.LuminosityLsun <= 0 || s.TeffK <= 0:
		return false
	case s.Stage == evolve.NeutronStar || s.Stage == evolve.BlackHole || s.Stage == evolve.NoRemnant:
		return false
	case s.Stage.IsWhiteDwarf() && s.TeffK > 1.5e5:
		return false
	}
	return true
}

// plotHR draws the tracks in the Hertzsprung–Russell diagram (log Teff
// increasing to the left, log L upward) and marks the first point of each
// stage, then saves a PNG.
func plotHR(path string, tracks [][]trackPoint, metallicityZ float64) error {
	p := plot.New()
	p.Title.Text = fmt.Sprintf("Evolutionary tracks, Z = %.4g ([Fe/H] = %+.2f) — synthetic", metallicityZ, evolve.FeHFromZ(metallicityZ))
	p.X.Label.Text = "log10 Teff [K]"
	p.Y.Label.Text = "log10 L [Lsun]"
	p.X.Scale = plot.InvertedScale{Normalizer: plot.LinearScale{}}
	p.Add(plotter.NewGrid())
	var marks plotter.XYs
	for i, tr := range tracks {
		var seg plotter.XYs
		legendAdded := false
		flush := func() error {
			if len(seg) >= 2 {
				l, err := plotter.NewLine(append(plotter.XYs(nil), seg...))
				if err != nil {
					return err
				}
				l.Color = plotutil.Color(i)
				l.Width = vg.Points(1.2)
				p.Add(l)
				if !legendAdded {
					p.Legend.Add(fmt.Sprintf("%g Msun", tr[0].initialMassMsun), l)
					legendAdded = true
				}
			}
			seg = seg[:0]
			return nil
		}
		prevStage := evolve.Stage(255)
		var prev plotter.XY
		havePrev := false
		for _, pt := range tr {
			s := pt.star
			if !hrPlottable(s) {
				if err := flush(); err != nil {
					return err
				}
				havePrev = false
				prevStage = s.Stage
				continue
			}
			xy := plotter.XY{X: math.Log10(s.TeffK), Y: math.Log10(s.LuminosityLsun)}
			if s.Stage != prevStage {
				// Mark the first point of every stage; keep the line through
				// continuous transitions and break it at jumps (helium flash,
				// envelope loss, birth of the remnant).
				if err := flush(); err != nil {
					return err
				}
				if havePrev && math.Abs(xy.Y-prev.Y) < 0.3 && math.Abs(xy.X-prev.X) < 0.05 {
					seg = append(seg, prev)
				}
				marks = append(marks, xy)
			}
			seg = append(seg, xy)
			prev, havePrev, prevStage = xy, true, s.Stage
		}
		if err := flush(); err != nil {
			return err
		}
	}
	if len(marks) > 0 {
		sc, err := plotter.NewScatter(marks)
		if err != nil {
			return err
		}
		sc.GlyphStyle.Shape = draw.CircleGlyph{}
		sc.GlyphStyle.Radius = vg.Points(2.5)
		p.Add(sc)
		p.Legend.Add("start of a stage", sc)
	}
	p.Legend.Top = true
	p.Legend.Left = true // hot, luminous corner is empty
	return p.Save(8*vg.Inch, 6*vg.Inch, path)
}
