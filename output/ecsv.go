package output

import (
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"
)

// ECSV is the Enhanced Character Separated Values format, version 1.0 (Aldcroft et al.,
// astropy APE 6, https://github.com/astropy/astropy-APEs/blob/main/APE6.rst): a YAML
// header in lines starting with "# ", then an ordinary CSV body whose first line holds
// the column names. Any CSV reader that skips "#" comments reads the body; astropy's
// Table.read(path, format="ascii.ecsv") also recovers types, units, descriptions and
// the meta block.

// ecsvColumn is one entry of the ECSV "datatype" list.
type ecsvColumn struct {
	Name        string `yaml:"name"`
	Unit        string `yaml:"unit,omitempty"`
	Datatype    string `yaml:"datatype"`
	Description string `yaml:"description,omitempty"`
}

// ecsvMeta is the ECSV "meta" mapping: a few keywords for the eye and the full manifest
// as one JSON string under ManifestKey (the same text as in the other formats).
type ecsvMeta struct {
	Tool        string `yaml:"tool"`
	ToolVersion string `yaml:"tool_version"`
	Synthetic   string `yaml:"synthetic"`
	Seed        uint64 `yaml:"seed"`
	Manifest    string `yaml:"starmock.manifest"`
}

type ecsvHeader struct {
	Delimiter string       `yaml:"delimiter"`
	Datatype  []ecsvColumn `yaml:"datatype"`
	Meta      ecsvMeta     `yaml:"meta"`
	Schema    string       `yaml:"schema"`
}

type ecsvWriter struct {
	*base
	line []byte
}

func newECSVWriter(b *base) (*ecsvWriter, error) {
	js, err := b.headerManifest()
	if err != nil {
		return nil, err
	}
	m := prepared(b.meta, b.format, b.cols, 0)
	h := ecsvHeader{Delimiter: ",", Schema: "astropy-2.0",
		Meta: ecsvMeta{Tool: m.Tool, ToolVersion: m.ToolVersion, Synthetic: m.Synthetic, Seed: m.Seed, Manifest: string(js)}}
	for _, c := range b.cols {
		h.Datatype = append(h.Datatype, ecsvColumn{Name: c.Name, Unit: c.Unit, Datatype: c.Kind.String(), Description: c.Description})
	}
	var y bytes.Buffer
	enc := yaml.NewEncoder(&y)
	enc.SetIndent(2)
	if err := enc.Encode(h); err != nil {
		return nil, fmt.Errorf("output: ecsv header: %w", err)
	}
	enc.Close()
	out := b.file.buf
	out.WriteString("# %ECSV 1.0\n# ---\n")
	for _, l := range strings.SplitAfter(strings.TrimRight(y.String(), "\n"), "\n") {
		out.WriteString("# ")
		out.WriteString(l)
	}
	out.WriteByte('\n')
	for i, c := range b.cols {
		if i > 0 {
			out.WriteByte(',')
		}
		out.WriteString(c.Name)
	}
	if _, err := out.WriteString("\n"); err != nil {
		return nil, fmt.Errorf("output: cannot write %q: %w", b.file.final, err)
	}
	return &ecsvWriter{base: b}, nil
}

// Write appends the batch's rows. Floats use the shortest decimal that reads back to
// the same binary value; NaN and infinities print as nan, inf, -inf; booleans as True
// and False; nulls as an empty field; strings are quoted when they contain a comma,
// quote, newline or leading/trailing space, or are empty.
func (w *ecsvWriter) Write(b *Batch) error {
	if err := w.check(b); err != nil {
		return err
	}
	out := w.file.buf
	for r := 0; r < b.N; r++ {
		line := w.line[:0]
		for c := range w.cols {
			if c > 0 {
				line = append(line, ',')
			}
			if !b.IsValid(c, r) {
				continue
			}
			switch col := b.Cols[c].(type) {
			case []float32:
				line = appendFloat(line, float64(col[r]), 32)
			case []float64:
				line = appendFloat(line, col[r], 64)
			case []int64:
				line = strconv.AppendInt(line, col[r], 10)
			case []int32:
				line = strconv.AppendInt(line, int64(col[r]), 10)
			case []int8:
				line = strconv.AppendInt(line, int64(col[r]), 10)
			case []bool:
				if col[r] {
					line = append(line, "True"...)
				} else {
					line = append(line, "False"...)
				}
			case []string:
				line = appendCSVString(line, col[r])
			}
		}
		line = append(line, '\n')
		w.line = line
		if _, err := out.Write(line); err != nil {
			return w.fail(err)
		}
	}
	w.rows += int64(b.N)
	return nil
}

func appendFloat(dst []byte, v float64, bits int) []byte {
	switch {
	case math.IsNaN(v):
		return append(dst, "nan"...)
	case math.IsInf(v, 1):
		return append(dst, "inf"...)
	case math.IsInf(v, -1):
		return append(dst, "-inf"...)
	}
	return strconv.AppendFloat(dst, v, 'g', -1, bits)
}

func appendCSVString(dst []byte, s string) []byte {
	quote := s == "" || s[0] == ' ' || s[len(s)-1] == ' '
	if !quote {
		quote = strings.ContainsAny(s, ",\"\n\r")
	}
	if !quote {
		return append(dst, s...)
	}
	dst = append(dst, '"')
	for i := 0; i < len(s); i++ {
		if s[i] == '"' {
			dst = append(dst, '"')
		}
		dst = append(dst, s[i])
	}
	return append(dst, '"')
}

// Close flushes, renames into place and writes the sidecar.
func (w *ecsvWriter) Close() error { return w.commit(nil) }

// Abort discards the file.
func (w *ecsvWriter) Abort() error { return w.abort() }
