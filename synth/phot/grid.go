package phot

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"sync"
)

// GridBand is one band column of a bolometric-correction grid.
type GridBand struct {
	Name        string
	System      System
	Description string
}

// GridNode is one node of a grid, as returned by Grid.Node.
type GridNode struct {
	TeffK, LoggCgs, FeH float64
	BC                  []float64 // bolometric correction per grid band, mag (BC_X = M_bol − M_X)
	Quality             Quality   // QualityEmpirical, QualityModel or QualityBlackbody
	BlackbodyBands      []string  // bands at this node taken from blackbody photometry
	Source              string    // provenance key (see Grid.Sources)
}

// Grid is a bolometric-correction grid: BC_X in mag for each band X on a full
// rectangular lattice of (Teff, log g, [Fe/H]) nodes, with the provenance of
// every node. A Grid is immutable once built and safe for concurrent use.
//
// The text format (written by WriteGrid, read by LoadGrid) is described in the
// package documentation, "Grid file format".
type Grid struct {
	teffK, loggCgs, feh []float64
	bands               []GridBand
	bc                  []float64 // [((ifeh*nG+ig)*nT+it)*nB + b]
	quality             []Quality // per node
	bbMask              []uint64  // per node: bit b set when band b is from a blackbody
	source              []string  // per node
	sources             [][2]string
	comments            []string
}

// ErrGrid is wrapped by every error LoadGrid returns for a malformed grid file.
var ErrGrid = errors.New("invalid bolometric-correction grid")

// MaxGridBands is the largest number of band columns a grid may have.
const MaxGridBands = 64

// Plausibility limits of grid axes, to catch unit mistakes (log Teff for Teff,
// g for log g, Z for [Fe/H] would mostly pass as numbers).
const (
	minGridTeffK, maxGridTeffK = 100.0, 1e7
	minGridLogg, maxGridLogg   = -5.0, 12.0
	minGridFeH, maxGridFeH     = -6.0, 2.0
)

// Axes returns the grid's node values: Teff in K, log g in cgs and [Fe/H] in
// dex, each strictly increasing. The slices are copies.
func (g *Grid) Axes() (teffK, loggCgs, feh []float64) {
	return append([]float64(nil), g.teffK...), append([]float64(nil), g.loggCgs...), append([]float64(nil), g.feh...)
}

// Bands returns the grid's band columns in file order.
func (g *Grid) Bands() []GridBand { return append([]GridBand(nil), g.bands...) }

// Sources returns the provenance legend: pairs of (key, description).
func (g *Grid) Sources() [][2]string { return append([][2]string(nil), g.sources...) }

// BandIndex returns the column index of the named band, or −1.
func (g *Grid) BandIndex(name string) int {
	for i, b := range g.bands {
		if b.Name == name {
			return i
		}
	}
	return -1
}

func (g *Grid) nodeIndex(it, ig, ifeh int) int {
	return (ifeh*len(g.loggCgs)+ig)*len(g.teffK) + it
}

// Node returns node (it, ig, ifeh) of the axes returned by Axes. It panics if an
// index is out of range (a caller bug).
func (g *Grid) Node(it, ig, ifeh int) GridNode {
	if it < 0 || it >= len(g.teffK) || ig < 0 || ig >= len(g.loggCgs) || ifeh < 0 || ifeh >= len(g.feh) {
		panic(fmt.Sprintf("phot: Grid.Node index (%d, %d, %d) out of range", it, ig, ifeh))
	}
	n := g.nodeIndex(it, ig, ifeh)
	nb := len(g.bands)
	node := GridNode{TeffK: g.teffK[it], LoggCgs: g.loggCgs[ig], FeH: g.feh[ifeh],
		BC: append([]float64(nil), g.bc[n*nb:(n+1)*nb]...), Quality: g.quality[n], Source: g.source[n]}
	for b := range g.bands {
		if g.bbMask[n]&(1<<uint(b)) != 0 {
			node.BlackbodyBands = append(node.BlackbodyBands, g.bands[b].Name)
		}
	}
	return node
}

var (
	defaultGridOnce sync.Once
	defaultGrid     *Grid
	defaultGridErr  error
)

// defaultGridFile is the path of the built-in grid inside the embedded data.
const defaultGridFile = "data/default_bc_grid.tsv"

// DefaultGrid returns the built-in bolometric-correction grid for the sixteen
// DefaultBandNames bands, read from the embedded file data/default_bc_grid.tsv
// (assembled by AssembleDefaultGrid; see the package documentation, "Built-in
// grid"). The grid has a single [Fe/H] = 0 slice. The same *Grid is returned on
// every call.
func DefaultGrid() (*Grid, error) {
	defaultGridOnce.Do(func() {
		raw, err := dataFS.ReadFile(defaultGridFile)
		if err != nil {
			defaultGridErr = fmt.Errorf("phot: built-in grid: %w", err)
			return
		}
		defaultGrid, defaultGridErr = parseGrid(bytes.NewReader(raw), defaultGridFile)
	})
	return defaultGrid, defaultGridErr
}

// LoadGrid reads a user bolometric-correction grid in the format of the
// package documentation ("Grid file format") and validates it: every band
// column declared with its system, numeric finite values, each axis strictly
// increasing in file order, a full rectangular lattice (no holes, no
// duplicates), at most MaxGridBands bands. Errors wrap ErrGrid and name the
// file and line.
func LoadGrid(path string) (*Grid, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("grid file: %w", err)
	}
	defer f.Close()
	return parseGrid(f, path)
}

func gridErr(file string, line int, format string, a ...any) error {
	if line > 0 {
		return fmt.Errorf("%w: %s:%d: %s", ErrGrid, file, line, fmt.Sprintf(format, a...))
	}
	return fmt.Errorf("%w: %s: %s", ErrGrid, file, fmt.Sprintf(format, a...))
}

func parseGrid(r io.Reader, file string) (*Grid, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 1<<16), 1<<22)
	g := &Grid{}
	declared := map[string]GridBand{}
	declLine := map[string]int{}
	var order []string
	line := 0
	var cols []string
	colBand := []int{} // column -> band index or -1
	iQual, iBB, iSrc := -1, -1, -1

	type row struct {
		t, lg, fe float64
		bc        []float64
		q         Quality
		bb        uint64
		src       string
		line      int
	}
	var rows []row
	for sc.Scan() {
		line++
		raw := sc.Text()
		text := strings.TrimSpace(raw)
		if text == "" {
			continue
		}
		if strings.HasPrefix(text, "#") {
			body := strings.TrimSpace(strings.TrimPrefix(text, "#"))
			switch {
			case strings.HasPrefix(body, "band:"):
				f := strings.Fields(strings.TrimPrefix(body, "band:"))
				if len(f) < 2 {
					return nil, gridErr(file, line, "band line %q, want \"# band: NAME SYSTEM [description]\" with SYSTEM vega or ab", text)
				}
				sys, err := ParseSystem(f[1])
				if err != nil {
					return nil, gridErr(file, line, "band %s: %v", f[0], err)
				}
				if _, dup := declared[f[0]]; dup {
					return nil, gridErr(file, line, "band %q declared twice (first at line %d)", f[0], declLine[f[0]])
				}
				declared[f[0]] = GridBand{Name: f[0], System: sys, Description: strings.Join(f[2:], " ")}
				declLine[f[0]] = line
				order = append(order, f[0])
			case strings.HasPrefix(body, "source:"):
				v := strings.TrimSpace(strings.TrimPrefix(body, "source:"))
				k, d, ok := strings.Cut(v, "=")
				if !ok {
					return nil, gridErr(file, line, "source line %q, want \"# source: KEY = description\"", text)
				}
				g.sources = append(g.sources, [2]string{strings.TrimSpace(k), strings.TrimSpace(d)})
			default:
				if cols == nil {
					g.comments = append(g.comments, body)
				}
			}
			continue
		}
		fields := strings.Split(strings.TrimRight(raw, "\r"), "\t")
		if len(fields) == 1 {
			fields = strings.Fields(raw)
		}
		if cols == nil {
			cols = fields
			if len(cols) < 4 || cols[0] != "teff_k" || cols[1] != "logg_cgs" || cols[2] != "feh" {
				return nil, gridErr(file, line, "column names start %q, want teff_k, logg_cgs, feh, then one column per band", strings.Join(cols[:min(3, len(cols))], ", "))
			}
			seen := map[string]bool{}
			for i, c := range cols {
				colBand = append(colBand, -1)
				if i < 3 {
					continue
				}
				if seen[c] {
					return nil, gridErr(file, line, "column %q appears twice", c)
				}
				seen[c] = true
				switch c {
				case "quality":
					iQual = i
					continue
				case "blackbody_bands":
					iBB = i
					continue
				case "source":
					iSrc = i
					continue
				}
				b, ok := declared[c]
				if !ok {
					return nil, gridErr(file, line, "band column %q has no \"# band: %s SYSTEM\" header line naming its magnitude system (vega or ab)", c, c)
				}
				colBand[i] = len(g.bands)
				g.bands = append(g.bands, b)
			}
			if len(g.bands) == 0 {
				return nil, gridErr(file, line, "no band columns")
			}
			if len(g.bands) > MaxGridBands {
				return nil, gridErr(file, line, "%d band columns, want at most %d", len(g.bands), MaxGridBands)
			}
			for _, name := range order {
				if !seen[name] {
					return nil, gridErr(file, declLine[name], "band %q declared but has no column", name)
				}
			}
			continue
		}
		if len(fields) != len(cols) {
			return nil, gridErr(file, line, "%d fields, want %d (one per column name)", len(fields), len(cols))
		}
		rw := row{bc: make([]float64, len(g.bands)), q: QualityModel, line: line}
		for i, f := range fields {
			f = strings.TrimSpace(f)
			switch {
			case i < 3:
				v, err := strconv.ParseFloat(f, 64)
				if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
					return nil, gridErr(file, line, "%s %q is not a finite number", cols[i], f)
				}
				switch i {
				case 0:
					if v < minGridTeffK || v > maxGridTeffK {
						return nil, gridErr(file, line, "teff_k %q K, want %g to %g K (kelvin, not log10)", f, minGridTeffK, maxGridTeffK)
					}
					rw.t = v
				case 1:
					if v < minGridLogg || v > maxGridLogg {
						return nil, gridErr(file, line, "logg_cgs %q, want %g to %g (log10 of g in cm s^-2)", f, minGridLogg, maxGridLogg)
					}
					rw.lg = v
				case 2:
					if v < minGridFeH || v > maxGridFeH {
						return nil, gridErr(file, line, "feh %q dex, want %g to %g dex ([Fe/H], not Z)", f, minGridFeH, maxGridFeH)
					}
					rw.fe = v
				}
			case i == iQual:
				q, err := ParseQuality(f)
				if err != nil || q > QualityBlackbody {
					return nil, gridErr(file, line, "quality %q, want empirical, model or blackbody", f)
				}
				rw.q = q
			case i == iBB:
				if f == "-" || f == "" {
					continue
				}
				for _, name := range strings.Split(f, ",") {
					b := -1
					for k := range g.bands {
						if g.bands[k].Name == name {
							b = k
						}
					}
					if b < 0 {
						return nil, gridErr(file, line, "blackbody_bands names %q, which is not a band column", name)
					}
					rw.bb |= 1 << uint(b)
				}
			case i == iSrc:
				rw.src = f
			default:
				v, err := strconv.ParseFloat(f, 64)
				if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
					return nil, gridErr(file, line, "bolometric correction %s = %q, want a finite number in mag", cols[i], f)
				}
				if math.Abs(v) > 50 {
					return nil, gridErr(file, line, "bolometric correction %s = %q mag, want |BC| <= 50 mag (units are magnitudes)", cols[i], f)
				}
				rw.bc[colBand[i]] = v
			}
		}
		rows = append(rows, rw)
	}
	if err := sc.Err(); err != nil {
		return nil, gridErr(file, line, "%v", err)
	}
	if cols == nil {
		return nil, gridErr(file, 0, "no column-name line")
	}
	if len(rows) == 0 {
		return nil, gridErr(file, 0, "no data rows")
	}
	// Axes from file order: teff varies fastest, then logg, then feh.
	nT := 0
	for nT < len(rows) && rows[nT].lg == rows[0].lg && rows[nT].fe == rows[0].fe {
		if nT > 0 && rows[nT].t <= rows[nT-1].t {
			return nil, gridErr(file, rows[nT].line, "teff_k %v K not above the previous %v K: teff_k must increase strictly within each (logg_cgs, feh) block", rows[nT].t, rows[nT-1].t)
		}
		nT++
	}
	for i := 0; i < nT; i++ {
		g.teffK = append(g.teffK, rows[i].t)
	}
	if nT < 2 {
		return nil, gridErr(file, rows[0].line, "only %d teff_k node in the first block, want at least 2", nT)
	}
	// Blocks of nT rows, each one (logg_cgs, feh) pair with the same teff_k nodes.
	type block struct {
		lg, fe float64
		line   int
	}
	var blocks []block
	for bStart := 0; bStart < len(rows); bStart += nT {
		for i := 0; i < nT; i++ {
			k := bStart + i
			if k >= len(rows) {
				return nil, gridErr(file, rows[len(rows)-1].line, "grid has a hole: the block logg_cgs %v, feh %v ends after %d of %d teff_k nodes", rows[bStart].lg, rows[bStart].fe, i, nT)
			}
			rw := rows[k]
			if rw.lg == rows[bStart].lg && rw.fe == rows[bStart].fe && i > 0 && rw.t <= rows[k-1].t {
				return nil, gridErr(file, rw.line, "teff_k %v K not above the previous %v K: teff_k must increase strictly within each (logg_cgs, feh) block", rw.t, rows[k-1].t)
			}
			if rw.lg != rows[bStart].lg || rw.fe != rows[bStart].fe || rw.t != g.teffK[i] {
				return nil, gridErr(file, rw.line, "grid has a hole: expected node teff_k %v K, logg_cgs %v, feh %v here, got teff_k %v K, logg_cgs %v, feh %v (every (logg_cgs, feh) block must list the same teff_k nodes)", g.teffK[i], rows[bStart].lg, rows[bStart].fe, rw.t, rw.lg, rw.fe)
			}
		}
		blocks = append(blocks, block{rows[bStart].lg, rows[bStart].fe, rows[bStart].line})
	}
	// feh slices, each with the same strictly increasing logg_cgs nodes.
	for i, b := range blocks {
		if i == 0 || b.fe != blocks[i-1].fe {
			if i > 0 && b.fe < blocks[i-1].fe {
				return nil, gridErr(file, b.line, "feh %v below the previous slice's %v: feh must increase strictly", b.fe, blocks[i-1].fe)
			}
			g.feh = append(g.feh, b.fe)
			if len(g.feh) > 1 && b.lg != g.loggCgs[0] {
				return nil, gridErr(file, b.line, "grid has a hole: feh %v slice starts at logg_cgs %v, want %v", b.fe, b.lg, g.loggCgs[0])
			}
			if len(g.feh) == 1 {
				g.loggCgs = append(g.loggCgs, b.lg)
			}
			continue
		}
		if b.lg <= blocks[i-1].lg {
			return nil, gridErr(file, b.line, "logg_cgs %v not above the previous block's %v: logg_cgs must increase strictly within each feh slice", b.lg, blocks[i-1].lg)
		}
		if len(g.feh) == 1 {
			g.loggCgs = append(g.loggCgs, b.lg)
			continue
		}
		j := 0
		for j < i && blocks[i-1-j].fe == b.fe {
			j++
		}
		if j >= len(g.loggCgs) || g.loggCgs[j] != b.lg {
			return nil, gridErr(file, b.line, "grid has a hole: logg_cgs %v in feh %v slice does not match the first slice's logg_cgs nodes %v", b.lg, b.fe, g.loggCgs)
		}
	}
	if want := nT * len(g.loggCgs) * len(g.feh); want != len(rows) {
		return nil, gridErr(file, rows[len(rows)-1].line, "grid has a hole: %d rows, want %d teff_k x %d logg_cgs x %d feh = %d", len(rows), nT, len(g.loggCgs), len(g.feh), want)
	}
	nb := len(g.bands)
	g.bc = make([]float64, 0, len(rows)*nb)
	for _, rw := range rows {
		g.bc = append(g.bc, rw.bc...)
		g.quality = append(g.quality, rw.q)
		g.bbMask = append(g.bbMask, rw.bb)
		g.source = append(g.source, rw.src)
	}
	return g, nil
}

// WriteGrid writes g in the text format read by LoadGrid.
func WriteGrid(w io.Writer, g *Grid) error {
	bw := bufio.NewWriter(w)
	for _, c := range g.comments {
		fmt.Fprintf(bw, "# %s\n", c)
	}
	for _, b := range g.bands {
		fmt.Fprintf(bw, "# band: %s %s %s\n", b.Name, b.System, b.Description)
	}
	for _, s := range g.sources {
		fmt.Fprintf(bw, "# source: %s = %s\n", s[0], s[1])
	}
	bw.WriteString("teff_k\tlogg_cgs\tfeh")
	for _, b := range g.bands {
		bw.WriteString("\t" + b.Name)
	}
	bw.WriteString("\tquality\tblackbody_bands\tsource\n")
	nb := len(g.bands)
	for ife := range g.feh {
		for ig := range g.loggCgs {
			for it := range g.teffK {
				n := g.nodeIndex(it, ig, ife)
				fmt.Fprintf(bw, "%s\t%s\t%s", strconv.FormatFloat(g.teffK[it], 'g', -1, 64),
					strconv.FormatFloat(g.loggCgs[ig], 'g', -1, 64), strconv.FormatFloat(g.feh[ife], 'g', -1, 64))
				for b := 0; b < nb; b++ {
					fmt.Fprintf(bw, "\t%.4f", g.bc[n*nb+b])
				}
				var bb []string
				for b := 0; b < nb; b++ {
					if g.bbMask[n]&(1<<uint(b)) != 0 {
						bb = append(bb, g.bands[b].Name)
					}
				}
				bbs := "-"
				if len(bb) > 0 {
					bbs = strings.Join(bb, ",")
				}
				src := g.source[n]
				if src == "" {
					src = "-"
				}
				fmt.Fprintf(bw, "\t%s\t%s\t%s\n", g.quality[n], bbs, src)
			}
		}
	}
	return bw.Flush()
}
