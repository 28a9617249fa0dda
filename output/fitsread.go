package output

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"math"
	"os"
	"strconv"
	"strings"
)

// fitsHDU is one parsed header-data unit: header values as raw text (strings unquoted)
// and the data bytes.
type fitsHDU struct {
	values map[string]string
	data   []byte
}

func (h *fitsHDU) int(key string) (int64, error) {
	v, ok := h.values[key]
	if !ok {
		return 0, fmt.Errorf("header keyword %s missing", key)
	}
	n, err := strconv.ParseInt(v, 10, 64)
	if err != nil {
		return 0, fmt.Errorf("header keyword %s = %q is not an integer", key, v)
	}
	return n, nil
}

// parseFITS splits a FITS file into HDUs (Standard 4.0 §3.3, §4.1). It understands the
// fixed-format value cards written by this package and by common FITS writers,
// including CONTINUE long strings; HIERARCH cards are ignored.
func parseFITS(data []byte) ([]fitsHDU, error) {
	var hdus []fitsHDU
	off := 0
	for off < len(data) {
		h := fitsHDU{values: map[string]string{}}
		ended := false
		last := ""
		for !ended {
			if off+80 > len(data) {
				return nil, fmt.Errorf("HDU %d: header not terminated by END", len(hdus))
			}
			card := string(data[off : off+80])
			off += 80
			key := strings.TrimSpace(card[:8])
			if key == "END" {
				ended = true
				break
			}
			if key == "CONTINUE" {
				// long-string convention (Standard 4.0 §4.2.1.2)
				if v, ok := h.values[last]; ok && strings.HasSuffix(v, "&") && strings.HasPrefix(strings.TrimSpace(card[8:]), "'") {
					h.values[last] = strings.TrimSuffix(v, "&") + cardValue(card[8:])
				}
				continue
			}
			if card[8:10] != "= " {
				last = ""
				continue // COMMENT, HISTORY, blank
			}
			h.values[key] = cardValue(card[10:])
			last = key
		}
		off += (fitsBlock - off%fitsBlock) % fitsBlock
		bitpix, err := h.int("BITPIX")
		if err != nil {
			return nil, fmt.Errorf("HDU %d: %w", len(hdus), err)
		}
		naxis, err := h.int("NAXIS")
		if err != nil {
			return nil, fmt.Errorf("HDU %d: %w", len(hdus), err)
		}
		size := int64(0)
		if naxis > 0 {
			size = 1
			for i := int64(1); i <= naxis; i++ {
				n, err := h.int("NAXIS" + strconv.FormatInt(i, 10))
				if err != nil {
					return nil, fmt.Errorf("HDU %d: %w", len(hdus), err)
				}
				size *= n
			}
			pcount, _ := h.int("PCOUNT")
			gcount, err := h.int("GCOUNT")
			if err != nil {
				gcount = 1
			}
			size = abs(bitpix) / 8 * gcount * (pcount + size)
		}
		if int64(off)+size > int64(len(data)) {
			return nil, fmt.Errorf("HDU %d: data of %d bytes runs past the end of the file", len(hdus), size)
		}
		h.data = data[off : int64(off)+size]
		off += int(size)
		off += (fitsBlock - off%fitsBlock) % fitsBlock
		hdus = append(hdus, h)
	}
	return hdus, nil
}

func abs(x int64) int64 {
	if x < 0 {
		return -x
	}
	return x
}

// cardValue extracts the value of a fixed-format card (columns 11-80): a quoted string
// with ” unescaped and trailing spaces removed, or the text before a "/" comment.
func cardValue(s string) string {
	t := strings.TrimLeft(s, " ")
	if strings.HasPrefix(t, "'") {
		var b strings.Builder
		for i := 1; i < len(t); i++ {
			if t[i] == '\'' {
				if i+1 < len(t) && t[i+1] == '\'' {
					b.WriteByte('\'')
					i++
					continue
				}
				break
			}
			b.WriteByte(t[i])
		}
		return strings.TrimRight(b.String(), " ")
	}
	if i := strings.IndexByte(t, '/'); i >= 0 {
		t = t[:i]
	}
	return strings.TrimSpace(t)
}

func readFITS(path string) (*Table, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	hdus, err := parseFITS(data)
	if err != nil {
		return nil, err
	}
	t := &Table{}
	var tab *fitsHDU
	for i := range hdus {
		h := &hdus[i]
		switch {
		case h.values["EXTNAME"] == "MANIFEST":
			if t.Manifest, err = decodeManifest(bytes.TrimRight(h.data, "\x00"), path); err != nil {
				return nil, err
			}
		case h.values["XTENSION"] == "BINTABLE" && tab == nil:
			tab = h
		}
	}
	if tab == nil {
		return nil, errors.New("no BINTABLE extension")
	}
	nullable := map[string]bool{}
	desc := map[string]string{}
	if t.Manifest != nil {
		for _, c := range t.Manifest.Columns {
			nullable[c.Name] = c.Nullable
			desc[c.Name] = c.Description
		}
	}
	ncol, err := tab.int("TFIELDS")
	if err != nil {
		return nil, err
	}
	rowLen, err := tab.int("NAXIS1")
	if err != nil {
		return nil, err
	}
	nrows, err := tab.int("NAXIS2")
	if err != nil {
		return nil, err
	}
	t.Columns = make([]Column, ncol)
	offsets := make([]int, ncol)
	nulls := make([]int64, ncol)
	hasNull := make([]bool, ncol)
	off := 0
	for i := range t.Columns {
		n := strconv.Itoa(i + 1)
		c := Column{Name: tab.values["TTYPE"+n], Unit: tab.values["TUNIT"+n], Description: tab.values["TCOMM"+n]}
		c.Nullable = nullable[c.Name]
		if d, ok := desc[c.Name]; ok {
			c.Description = d // exact text (TCOMMn may have quotes replaced, see longString)
		}
		form := strings.TrimSpace(tab.values["TFORM"+n])
		width := 0
		switch {
		case form == "E" || form == "1E":
			c.Kind, width = Float32, 4
		case form == "D" || form == "1D":
			c.Kind, width = Float64, 8
		case form == "K" || form == "1K":
			c.Kind, width = Int64, 8
		case form == "J" || form == "1J":
			c.Kind, width = Int32, 4
		case form == "I" || form == "1I":
			c.Kind, width = Int8, 2
		case form == "L" || form == "1L":
			c.Kind, width = Bool, 1
		case strings.HasSuffix(form, "A"):
			c.Kind = String
			if width, err = strconv.Atoi(strings.TrimSuffix(form, "A")); err != nil || width <= 0 {
				return nil, fmt.Errorf("column %q: bad TFORM%s %q", c.Name, n, form)
			}
			c.MaxLen = width
		default:
			return nil, fmt.Errorf("column %q: unsupported TFORM%s %q", c.Name, n, form)
		}
		if v, ok := tab.values["TNULL"+n]; ok {
			if nulls[i], err = strconv.ParseInt(v, 10, 64); err != nil {
				return nil, fmt.Errorf("column %q: bad TNULL%s %q", c.Name, n, v)
			}
			hasNull[i] = true
			c.Nullable = true
		}
		offsets[i] = off
		off += width
		t.Columns[i] = c
	}
	if int64(off) != rowLen {
		return nil, fmt.Errorf("columns add up to %d bytes per row, NAXIS1 says %d", off, rowLen)
	}
	b := NewBatch(t.Columns, int(nrows))
	b.N = int(nrows)
	be := binary.BigEndian
	rl := int(rowLen)
	for c, col := range t.Columns {
		valid := b.Valid[c]
		setNull := func(r int) {
			if valid != nil {
				valid[r] = false
			}
		}
		o := offsets[c]
		switch v := b.Cols[c].(type) {
		case []float32:
			for r := range v {
				v[r] = math.Float32frombits(be.Uint32(tab.data[r*rl+o:]))
				if col.Nullable && math.IsNaN(float64(v[r])) {
					setNull(r)
				}
			}
		case []float64:
			for r := range v {
				v[r] = math.Float64frombits(be.Uint64(tab.data[r*rl+o:]))
				if col.Nullable && math.IsNaN(v[r]) {
					setNull(r)
				}
			}
		case []int64:
			for r := range v {
				v[r] = int64(be.Uint64(tab.data[r*rl+o:]))
				if hasNull[c] && v[r] == nulls[c] {
					v[r] = 0
					setNull(r)
				}
			}
		case []int32:
			for r := range v {
				v[r] = int32(be.Uint32(tab.data[r*rl+o:]))
				if hasNull[c] && int64(v[r]) == nulls[c] {
					v[r] = 0
					setNull(r)
				}
			}
		case []int8:
			for r := range v {
				x := int16(be.Uint16(tab.data[r*rl+o:]))
				if hasNull[c] && int64(x) == nulls[c] {
					x = 0
					setNull(r)
				} else if x < math.MinInt8 || x > math.MaxInt8 {
					return nil, fmt.Errorf("column %q row %d: value %d outside the int8 range", col.Name, r, x)
				}
				v[r] = int8(x)
			}
		case []bool:
			for r := range v {
				switch tab.data[r*rl+o] {
				case 'T':
					v[r] = true
				case 'F':
				case 0:
					setNull(r)
				default:
					return nil, fmt.Errorf("column %q row %d: logical byte %q is not T, F or 0", col.Name, r, tab.data[r*rl+o])
				}
			}
		case []string:
			w := col.MaxLen
			for r := range v {
				cell := tab.data[r*rl+o : r*rl+o+w]
				if i := bytes.IndexByte(cell, 0); i >= 0 {
					cell = cell[:i]
				}
				v[r] = string(bytes.TrimRight(cell, " "))
				if col.Nullable && v[r] == "" {
					setNull(r)
				}
			}
		}
	}
	finishBatch(b, t.Columns)
	t.Batch = b
	return t, nil
}
