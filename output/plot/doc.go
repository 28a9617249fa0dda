// Package plot draws the pictures of a run as PNG files with gonum.org/v1/plot:
//
//   - CMD: a colour–magnitude diagram: the true population in grey (a Hess
//     density and/or sample points), detected stars coloured by evolutionary
//     stage with a legend of stage words, magnitude increasing downward;
//   - Hess and HessPanels: Hess diagrams (log10 counts per colour × magnitude
//     cell) with a colour bar, alone or as a grid of per-component panels
//     (sum over components first) on a shared colour scale;
//   - StarCounts: star-count curves N(<m) or dN/dm per band on a logarithmic
//     axis, with Poisson error bars (CurvesFromCounts builds them).
//
// Pictures are drawn from the streaming summaries of package summary (Hess
// histograms, star counts, a capped reservoir sample of points), never from
// all rows in memory. The package does not know about physics: stages are
// words, and StageColour maps the catalogue's stage words to fixed colours
// (unknown words get stable fallback colours). Drawing is deterministic: the
// same input gives the same PNG bytes (72 dpi, one pixel per point; fonts
// embedded in gonum plot).
//
// Errors are returned for empty input, missing axis labels and sizes outside
// [100, 8000] px; slices of unequal length are a caller bug and panic.
//
// # References
//
// None: the pictures follow common practice for colour–magnitude and Hess
// diagrams (brighter magnitudes at the top). The colour maps are Moreland's
// (extended black-body, and a luminance-linear grey) as provided by gonum plot.
//
// # Incomplete
//
// No SVG/PDF output, no contour overlays, no isochrone lines.
package plot
