package output

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/astrogo/fitsio"
)

// TestFITSWithFitsio reads a FITS file written here with an independent FITS library,
// github.com/astrogo/fitsio v0.3.0: the header (TTYPE, TFORM, TUNIT, TNULL, NAXIS2, the
// primary keywords) and every numeric column. fitsio does not decode FITS logicals
// ('F' reads as true) and expects a leading NUL in strings, so Bool and String columns
// are checked by astropy in TestAstropyReads instead.
func TestFITSWithFitsio(t *testing.T) {
	path := filepath.Join(t.TempDir(), "cat.fits")
	want := writeTestFile(t, FITS, path, 300, 2, Options{})
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	ff, err := fitsio.Open(f)
	if err != nil {
		t.Fatal(err)
	}
	defer ff.Close()
	h0 := ff.HDU(0).Header()
	for key, v := range map[string]any{"ORIGIN": "starmock", "SYNTHETC": true, "SEED": 42} {
		c := h0.Get(key)
		if c == nil || c.Value != v {
			t.Errorf("primary %s = %v, want %v", key, c, v)
		}
	}
	tab, ok := ff.HDU(1).(*fitsio.Table)
	if !ok {
		t.Fatalf("HDU 1 is %T", ff.HDU(1))
	}
	if tab.NumRows() != 600 || tab.Name() != "CATALOG" {
		t.Errorf("table %q has %d rows, want CATALOG with 600", tab.Name(), tab.NumRows())
	}
	cols := testColumns()
	if tab.NumCols() != len(cols) {
		t.Fatalf("%d columns", tab.NumCols())
	}
	for i, c := range cols {
		fc := tab.Col(i)
		form, _ := fitsTForm(c)
		if fc.Name != c.Name || fc.Unit != c.Unit || strings.TrimSpace(fc.Format) != form {
			t.Errorf("column %d: fitsio sees %q %q %q, want %q %q %q", i, fc.Name, fc.Unit, fc.Format, c.Name, c.Unit, form)
		}
		if _, has := fitsNull(c); has != (fc.Null != "") {
			t.Errorf("column %q TNULL %q", c.Name, fc.Null)
		}
	}
	rows, err := tab.Read(0, tab.NumRows())
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	var (
		id, c64 int64
		comp    int32
		mass    float64
		teff    float32
	)
	// fitsio scans named columns into a map
	r := 0
	for rows.Next() {
		// fitsio scans the named columns into a map
		row := map[string]any{"star_id": nil, "component": nil, "mass_msun": nil, "teff_k": nil, "count64": nil}
		if err := rows.Scan(&row); err != nil {
			t.Fatal(err)
		}
		id, comp, mass, teff, c64 = row["star_id"].(int64), row["component"].(int32), row["mass_msun"].(float64), row["teff_k"].(float32), row["count64"].(int64)
		if id != want.Int64(0)[r] || comp != want.Int32(1)[r] || math.Float64bits(mass) != math.Float64bits(want.Float64(2)[r]) ||
			math.Float32bits(teff) != math.Float32bits(want.Float32(3)[r]) {
			t.Errorf("row %d: fitsio reads %d %d %v %v", r, id, comp, mass, teff)
		}
		if want.IsValid(13, r) && c64 != want.Int64(13)[r] || !want.IsValid(13, r) && c64 != math.MinInt64 {
			t.Errorf("row %d count64 %d", r, c64)
		}
		r++
	}
	if r != 600 {
		t.Errorf("fitsio read %d rows", r)
	}
}

// TestFITSLongString checks the CONTINUE long-string cards against the convention's
// layout (every card 80 characters, '&' before the closing quote of all but the last)
// and that the parser joins them back.
func TestFITSLongString(t *testing.T) {
	text := strings.Repeat("abcdefghij ", 20) + "end"
	var h fitsHeader
	h.card("SIMPLE", fitsLogical(true), "")
	h.card("BITPIX", fitsInt(8), "")
	h.card("NAXIS", fitsInt(0), "")
	start := len(h.b)
	h.longString("TCOMM1", text)
	cards := h.b[start:]
	if len(cards)%80 != 0 || len(cards) < 3*80 {
		t.Fatalf("long string took %d bytes", len(cards))
	}
	for i := 0; i < len(cards); i += 80 {
		card := string(cards[i : i+80])
		last := i+80 == len(cards)
		if i > 0 && !strings.HasPrefix(card, "CONTINUE  '") {
			t.Errorf("card %d %q is not a CONTINUE card", i/80, card)
		}
		if !last && !strings.Contains(card, "&'") {
			t.Errorf("card %d %q lacks the continuation ampersand", i/80, card)
		}
	}
	hdus, err := parseFITS(h.end())
	if err != nil {
		t.Fatal(err)
	}
	if got := hdus[0].values["TCOMM1"]; got != text {
		t.Errorf("joined %q, want %q", got, text)
	}
}
