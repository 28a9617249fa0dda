package output

import (
	"encoding/binary"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/starmock/starmock/internal/version"
)

// FITS layout written here (FITS Standard 4.0, Pence et al. 2010 A&A 524, A42 and the
// IAU FITS Working Group 2018 update):
//
//	HDU 0  primary, no data: ORIGIN, CREATOR, SYNTHETC=T, SEED, shard keywords
//	HDU 1  BINTABLE "CATALOG": TTYPEn/TFORMn/TUNITn/TNULLn/TCOMMn, one row per star
//	HDU 2  IMAGE "MANIFEST": BITPIX=8, NAXIS1 = length of the manifest JSON (UTF-8)
//
// The table is streamed: rows are written as batches arrive and NAXIS2 is patched in
// place at Close, so memory stays bounded by one batch. (github.com/astrogo/fitsio
// v0.3.0 keeps a whole table in memory and encodes each cell by reflection, so it is
// used here only as an independent reader in the tests.) The manifest goes in a
// trailing IMAGE extension rather than header cards because it is written at Close with
// the final counts, and because astropy's Table.read ignores image extensions, so it
// reads the catalogue without a "multiple tables" warning.

const fitsBlock = 2880 // bytes per FITS block (Standard 4.0 §3.1)

// fitsTForm returns the TFORM code and byte width of a column: E float32, D float64,
// K int64, J int32, I int16 (FITS has no signed 8-bit type; Int8 is widened), L logical,
// nA fixed-width character (Standard 4.0 Table 18).
func fitsTForm(c Column) (string, int) {
	switch c.Kind {
	case Float32:
		return "E", 4
	case Float64:
		return "D", 8
	case Int64:
		return "K", 8
	case Int32:
		return "J", 4
	case Int8:
		return "I", 2
	case Bool:
		return "L", 1
	case String:
		n := c.strLen()
		return strconv.Itoa(n) + "A", n
	}
	panic(fmt.Sprintf("output: invalid kind %d", c.Kind))
}

// fitsNull returns the TNULL value used for a nullable integer column (the most negative
// value of the stored type), and whether the column needs one. Float nulls are NaN
// (Standard 4.0 §7.3.3.1), logical nulls are byte 0, string nulls are empty.
func fitsNull(c Column) (int64, bool) {
	if !c.Nullable {
		return 0, false
	}
	switch c.Kind {
	case Int64:
		return math.MinInt64, true
	case Int32:
		return math.MinInt32, true
	case Int8:
		return math.MinInt16, true
	}
	return 0, false
}

// fitsHeader accumulates 80-character header cards.
type fitsHeader struct{ b []byte }

func (h *fitsHeader) card(key, value, comment string) {
	line := fmt.Sprintf("%-8s= %s", key, value)
	if comment != "" && len(line)+3 < 80 {
		line += " / " + comment
	}
	if len(line) > 80 {
		line = line[:80]
	}
	h.b = append(h.b, fmt.Sprintf("%-80s", line)...)
}

// fitsString quotes a character value that fits on one card (Standard 4.0 §4.2.1.1):
// single quotes doubled, padded to at least 8 characters. Callers keep values short
// (keywords, names, units); longer text goes through longString.
func fitsString(s string) string {
	s = strings.ReplaceAll(s, "'", "''")
	if len(s) > 68 {
		s = s[:68]
		if strings.HasSuffix(s, "'") && !strings.HasSuffix(s, "''") {
			s = s[:67]
		}
	}
	return fmt.Sprintf("'%-8s'", s)
}

// longString writes a string value of any length with the long-string convention
// (HEASARC OGIP 1.0 CONTINUE convention, adopted in FITS Standard 4.0 §4.2.1.2): each
// card but the last ends its string with '&' and the text continues in CONTINUE cards.
// Escaped quotes are never split across cards.
//
// In strings that need CONTINUE cards, single quotes are written as double quotes:
// astropy 5.2 drops text from continued strings that contain doubled quotes (seen with
// Debian's python3-astropy 5.2.1). The exact text is in the manifest, which ReadFile
// prefers.
func (h *fitsHeader) longString(key, value string) {
	esc := strings.ReplaceAll(value, "'", "''")
	if len(esc) <= 68 {
		h.card(key, fitsString(value), "")
		return
	}
	esc = strings.ReplaceAll(value, "'", "\"")
	const chunk = 67 // 80 - 10 (key and "= ") - 2 quotes - 1 ampersand
	first := true
	for len(esc) > 0 {
		n := min(chunk, len(esc))
		if n < len(esc) {
			// do not end a chunk inside a doubled quote
			q := 0
			for i := n - 1; i >= 0 && esc[i] == '\''; i-- {
				q++
			}
			if q%2 == 1 {
				n--
			}
		}
		part := esc[:n]
		esc = esc[n:]
		if len(esc) > 0 {
			part += "&"
		}
		var line string
		if first {
			line = fmt.Sprintf("%-8s= '%s'", key, part)
			first = false
		} else {
			line = fmt.Sprintf("CONTINUE  '%s'", part)
		}
		h.b = append(h.b, fmt.Sprintf("%-80s", line)...)
	}
}

func fitsLogical(v bool) string {
	if v {
		return fmt.Sprintf("%20s", "T")
	}
	return fmt.Sprintf("%20s", "F")
}

func fitsInt(v int64) string { return fmt.Sprintf("%20d", v) }

func (h *fitsHeader) comment(text string) {
	for len(text) > 0 {
		n := min(len(text), 72)
		h.b = append(h.b, fmt.Sprintf("COMMENT %-72s", text[:n])...)
		text = text[n:]
	}
}

// end appends END and pads the header to a whole block with spaces.
func (h *fitsHeader) end() []byte {
	h.b = append(h.b, fmt.Sprintf("%-80s", "END")...)
	for len(h.b)%fitsBlock != 0 {
		h.b = append(h.b, ' ')
	}
	return h.b
}

type fitsWriter struct {
	*base
	rowLen   int
	widths   []int
	offsets  []int
	nulls    []int64
	hasNull  []bool
	naxis2At int64 // byte offset of the NAXIS2 card in the file
	written  int64 // bytes written so far
	rowBuf   []byte
}

func newFITSWriter(b *base) (*fitsWriter, error) {
	if len(b.cols) > 999 {
		return nil, fmt.Errorf("%w: %d columns, a FITS table holds at most 999 (Standard 4.0 §7.3.1)", ErrSchema, len(b.cols))
	}
	for _, c := range b.cols {
		if len(c.Name) > 68 {
			return nil, fmt.Errorf("%w: column name %q has %d characters, FITS TTYPE holds at most 68", ErrSchema, c.Name, len(c.Name))
		}
		if len(c.Unit) > 68 {
			return nil, fmt.Errorf("%w: column %q unit %q has %d characters, FITS TUNIT holds at most 68", ErrSchema, c.Name, c.Unit, len(c.Unit))
		}
	}
	w := &fitsWriter{base: b, widths: make([]int, len(b.cols)), offsets: make([]int, len(b.cols)),
		nulls: make([]int64, len(b.cols)), hasNull: make([]bool, len(b.cols))}
	m := prepared(b.meta, b.format, b.cols, 0)

	var p fitsHeader
	p.card("SIMPLE", fitsLogical(true), "conforms to FITS Standard 4.0")
	p.card("BITPIX", fitsInt(8), "no primary data")
	p.card("NAXIS", fitsInt(0), "no primary data")
	p.card("EXTEND", fitsLogical(true), "extensions follow")
	w.commonCards(&p, m)
	p.card("SHARDIDX", fitsInt(int64(m.ShardIndex)), "shard index (0-based), 0 if unsharded")
	p.card("SHARDCNT", fitsInt(int64(m.ShardCount)), "number of shards, 0 if unsharded")
	p.comment(SyntheticStatement + ".")
	p.comment("HDU 1 (CATALOG) holds the catalogue; HDU 2 (MANIFEST) holds the run manifest as UTF-8 JSON bytes.")
	hdr := p.end()

	var t fitsHeader
	t.card("XTENSION", fitsString("BINTABLE"), "binary table extension")
	t.card("BITPIX", fitsInt(8), "8-bit bytes")
	t.card("NAXIS", fitsInt(2), "2-dimensional table")
	for i, c := range b.cols {
		_, width := fitsTForm(c)
		w.widths[i] = width
		w.offsets[i] = w.rowLen
		w.rowLen += width
		w.nulls[i], w.hasNull[i] = fitsNull(c)
	}
	t.card("NAXIS1", fitsInt(int64(w.rowLen)), "bytes per row")
	w.naxis2At = int64(len(hdr) + len(t.b))
	t.card("NAXIS2", fitsInt(0), "number of rows")
	t.card("PCOUNT", fitsInt(0), "no heap")
	t.card("GCOUNT", fitsInt(1), "one group")
	t.card("TFIELDS", fitsInt(int64(len(b.cols))), "number of columns")
	for i, c := range b.cols {
		n := strconv.Itoa(i + 1)
		form, _ := fitsTForm(c)
		t.card("TTYPE"+n, fitsString(c.Name), "")
		t.card("TFORM"+n, fitsString(form), "")
		if c.Unit != "" {
			t.card("TUNIT"+n, fitsString(c.Unit), "")
		}
		if w.hasNull[i] {
			t.card("TNULL"+n, fitsInt(w.nulls[i]), "null value")
		}
		if c.Description != "" {
			t.longString("TCOMM"+n, c.Description)
		}
	}
	t.card("EXTNAME", fitsString("CATALOG"), "synthetic catalogue")
	t.card("LONGSTRN", fitsString("OGIP 1.0"), "CONTINUE cards hold long strings")
	w.commonCards(&t, m)
	hdr = append(hdr, t.end()...)
	if _, err := b.file.buf.Write(hdr); err != nil {
		return nil, fmt.Errorf("output: cannot write %q: %w", b.file.final, err)
	}
	w.written = int64(len(hdr))
	return w, nil
}

// commonCards writes the provenance keywords shared by the primary and table headers.
// SYNTHETC is "SYNTHETIC" cut to the 8-character keyword limit (Standard 4.0 §4.1.2.1).
func (w *fitsWriter) commonCards(h *fitsHeader, m Manifest) {
	h.card("ORIGIN", fitsString(Tool), "program that made this file")
	h.card("CREATOR", fitsString(Tool+" "+version.Version), "program and version")
	h.card("SYNTHETC", fitsLogical(true), "synthetic catalogue, not observations")
	if m.Seed <= math.MaxInt64 {
		h.card("SEED", fitsInt(int64(m.Seed)), "run random seed")
	} else {
		h.card("SEED", fitsString(strconv.FormatUint(m.Seed, 10)), "run random seed")
	}
}

// Write transposes the batch into big-endian rows and appends them.
func (w *fitsWriter) Write(b *Batch) error {
	if err := w.check(b); err != nil {
		return err
	}
	n := b.N
	if n == 0 {
		return nil
	}
	w.rowBuf = grow(w.rowBuf, n*w.rowLen)
	buf := w.rowBuf
	rl := w.rowLen
	be := binary.BigEndian
	for c, col := range w.cols {
		off := w.offsets[c]
		var valid []bool
		if b.Valid != nil && b.Valid[c] != nil {
			valid = b.Valid[c][:n]
		}
		switch v := b.Cols[c].(type) {
		case []float32:
			for r, x := range v[:n] {
				bits := math.Float32bits(x)
				if valid != nil && !valid[r] {
					bits = 0x7fc00000 // quiet NaN marks a null (Standard 4.0 §7.3.3.1)
				}
				be.PutUint32(buf[r*rl+off:], bits)
			}
		case []float64:
			for r, x := range v[:n] {
				bits := math.Float64bits(x)
				if valid != nil && !valid[r] {
					bits = 0x7ff8000000000000
				}
				be.PutUint64(buf[r*rl+off:], bits)
			}
		case []int64:
			for r, x := range v[:n] {
				if valid != nil && !valid[r] {
					x = w.nulls[c]
				} else if w.hasNull[c] && x == w.nulls[c] {
					return fmt.Errorf("%w: column %q row %d holds %d, the FITS null value", ErrSchema, col.Name, r, x)
				}
				be.PutUint64(buf[r*rl+off:], uint64(x))
			}
		case []int32:
			for r, x := range v[:n] {
				if valid != nil && !valid[r] {
					x = int32(w.nulls[c])
				} else if w.hasNull[c] && int64(x) == w.nulls[c] {
					return fmt.Errorf("%w: column %q row %d holds %d, the FITS null value", ErrSchema, col.Name, r, x)
				}
				be.PutUint32(buf[r*rl+off:], uint32(x))
			}
		case []int8:
			for r, x := range v[:n] {
				y := int16(x)
				if valid != nil && !valid[r] {
					y = math.MinInt16
				}
				be.PutUint16(buf[r*rl+off:], uint16(y))
			}
		case []bool:
			for r, x := range v[:n] {
				var ch byte = 'F'
				if valid != nil && !valid[r] {
					ch = 0
				} else if x {
					ch = 'T'
				}
				buf[r*rl+off] = ch
			}
		case []string:
			width := w.widths[c]
			for r, x := range v[:n] {
				cell := buf[r*rl+off : r*rl+off+width]
				if valid != nil && !valid[r] {
					x = ""
				}
				if len(x) > width {
					return fmt.Errorf("%w: column %q row %d: string of %d bytes exceeds the FITS width %d (set Column.MaxLen)", ErrSchema, col.Name, r, len(x), width)
				}
				k := copy(cell, x)
				clear(cell[k:]) // NUL-terminated, NUL-padded (Standard 4.0 §7.3.3.1)
			}
		}
	}
	if _, err := w.file.buf.Write(buf); err != nil {
		return w.fail(err)
	}
	w.written += int64(len(buf))
	w.rows += int64(n)
	return nil
}

// finalize pads the table, writes the MANIFEST extension and patches NAXIS2.
func (w *fitsWriter) finalize() error {
	out := w.file.buf
	if pad := (fitsBlock - w.written%fitsBlock) % fitsBlock; pad > 0 {
		if _, err := out.Write(make([]byte, pad)); err != nil {
			return err
		}
	}
	js, err := marshalManifest(w.finalManifest())
	if err != nil {
		return err
	}
	var h fitsHeader
	h.card("XTENSION", fitsString("IMAGE"), "image extension")
	h.card("BITPIX", fitsInt(8), "bytes")
	h.card("NAXIS", fitsInt(1), "one axis")
	h.card("NAXIS1", fitsInt(int64(len(js))), "length of the manifest JSON in bytes")
	h.card("PCOUNT", fitsInt(0), "")
	h.card("GCOUNT", fitsInt(1), "")
	h.card("EXTNAME", fitsString("MANIFEST"), "run manifest, UTF-8 JSON")
	h.comment("The data of this extension is the starmock run manifest as UTF-8 JSON text.")
	data := append(h.end(), js...)
	for len(data)%fitsBlock != 0 {
		data = append(data, 0)
	}
	if _, err := out.Write(data); err != nil {
		return err
	}
	if err := out.Flush(); err != nil {
		return err
	}
	var nh fitsHeader
	nh.card("NAXIS2", fitsInt(w.rows), "number of rows")
	_, err = w.file.f.WriteAt(nh.b, w.naxis2At)
	return err
}

// Close pads the table, appends the MANIFEST extension with the final counts, patches
// the row count, renames into place and writes the sidecar.
func (w *fitsWriter) Close() error { return w.commit(w.finalize) }

// Abort discards the file.
func (w *fitsWriter) Abort() error { return w.abort() }
