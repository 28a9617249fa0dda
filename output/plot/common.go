package plot

import (
	"fmt"
	"io"
	"math"

	gplot "gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// Size limits of the pictures, in pixels.
const (
	MinSizePx     = 100
	MaxSizePx     = 8000
	DefaultSizePx = 800
)

// size returns the width and height to use, with defaults for zero, or an
// error naming the bad value and the allowed range.
func size(widthPx, heightPx int) (vg.Length, vg.Length, error) {
	if widthPx == 0 {
		widthPx = DefaultSizePx
	}
	if heightPx == 0 {
		heightPx = DefaultSizePx
	}
	for _, v := range []struct {
		name string
		px   int
	}{{"width", widthPx}, {"height", heightPx}} {
		if v.px < MinSizePx || v.px > MaxSizePx {
			return 0, 0, fmt.Errorf("plot: %s %d px outside allowed range [100, 8000] px", v.name, v.px)
		}
	}
	return vg.Length(widthPx), vg.Length(heightPx), nil
}

// newCanvas returns a 72-dpi image canvas, so one point is one pixel.
func newCanvas(w, h vg.Length) *vgimg.Canvas {
	return vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(72))
}

func writePNG(w io.Writer, c *vgimg.Canvas) error {
	_, err := vgimg.PngCanvas{Canvas: c}.WriteTo(w)
	if err != nil {
		return fmt.Errorf("plot: writing png: %w", err)
	}
	return nil
}

// invertY makes magnitude increase downward.
func invertY(p *gplot.Plot) {
	p.Y.Scale = gplot.InvertedScale{Normalizer: gplot.LinearScale{}}
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// splitRight returns the left part of c and a strip of width w at its right.
func splitRight(c draw.Canvas, w vg.Length) (left, right draw.Canvas) {
	left = draw.Crop(c, 0, -w, 0, 0)
	right = draw.Crop(c, c.Size().X-w, 0, 0, 0)
	return left, right
}
