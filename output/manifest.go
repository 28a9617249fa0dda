package output

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"

	"github.com/starmock/starmock/internal/version"
)

// SyntheticStatement is the warning every manifest and every file header carries.
const SyntheticStatement = "synthetic catalogue - model prediction, not observations"

// Tool is the name recorded as the producing program.
const Tool = "starmock"

// ManifestKey is the metadata key under which the manifest JSON is stored (Parquet
// footer key/value, Arrow schema metadata, ECSV meta).
const ManifestKey = "starmock.manifest"

// ManifestColumn is one column as listed in a manifest.
type ManifestColumn struct {
	Name        string `json:"name"`
	Kind        string `json:"kind"`
	Unit        string `json:"unit"`
	Description string `json:"description,omitempty"`
	Nullable    bool   `json:"nullable,omitempty"`
}

// Manifest describes how a catalogue was made. It is written as JSON into every file's
// metadata and into the sidecar `<path>.manifest.json`.
//
// The caller fills ScenarioText (the scenario file exactly as given), Scenario (the
// resolved scenario with defaults applied; any value encoding/json can marshal), Seed,
// the counts and the shard. The writer fills Tool, ToolVersion, Synthetic, Format,
// Columns and Rows. Nothing in the manifest embedded in a data file depends on the wall
// clock, so identical batches give identical bytes; only the sidecar carries
// WrittenAtUTC, and only when Options.SidecarTime is set.
//
// Counts may be updated on the same *Manifest after Create and before Close: the Parquet
// footer and the sidecar are written at Close and show the final values, while the
// headers of Arrow IPC, FITS and ECSV are written at Create (FITS also writes a
// MANIFEST extension at Close with the final values). The sidecar is authoritative.
type Manifest struct {
	Tool        string `json:"tool"`
	ToolVersion string `json:"tool_version"`
	Synthetic   string `json:"synthetic"`

	ScenarioText string `json:"scenario_text,omitempty"`
	Scenario     any    `json:"scenario,omitempty"`
	Seed         uint64 `json:"seed"`

	// ComponentStars is the number of stars generated per population component, keyed
	// by component name.
	ComponentStars map[string]int64 `json:"component_stars,omitempty"`
	// TotalStars is the number of stars generated (all components, before detection).
	TotalStars int64 `json:"total_stars"`
	// DetectedPerBand is the number of detected stars per band name.
	DetectedPerBand map[string]int64 `json:"detected_per_band,omitempty"`

	// ShardIndex and ShardCount describe a `--shard i/N` run (0-based index); both 0
	// for an unsharded run.
	ShardIndex int `json:"shard_index"`
	ShardCount int `json:"shard_count"`

	Format  string           `json:"format"`
	Columns []ManifestColumn `json:"columns"`
	// Rows is the number of rows in the file; set by the writer at Close (0 in headers
	// written before any row).
	Rows int64 `json:"rows"`

	// WrittenAtUTC is set only in sidecar files, only when requested, RFC 3339.
	WrittenAtUTC string `json:"written_at_utc,omitempty"`
}

// prepared returns a copy of m (or an empty manifest if m is nil) with the writer-owned
// fields filled in.
func prepared(m *Manifest, format Format, cols []Column, rows int64) Manifest {
	var out Manifest
	if m != nil {
		out = *m
	}
	out.Tool = Tool
	out.ToolVersion = version.Version
	out.Synthetic = SyntheticStatement
	out.Format = format.String()
	out.Columns = make([]ManifestColumn, len(cols))
	for i, c := range cols {
		out.Columns[i] = ManifestColumn{Name: c.Name, Kind: c.Kind.String(), Unit: c.Unit,
			Description: c.Description, Nullable: c.Nullable}
	}
	out.Rows = rows
	out.WrittenAtUTC = ""
	return out
}

// marshalManifest encodes a manifest as compact JSON (map keys sorted by encoding/json,
// so the bytes are deterministic).
func marshalManifest(m Manifest) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(m); err != nil {
		return nil, fmt.Errorf("output: cannot encode manifest: %w", err)
	}
	return bytes.TrimRight(buf.Bytes(), "\n"), nil
}

// SidecarPath returns the sidecar manifest path for a data file: `<path>.manifest.json`.
func SidecarPath(path string) string { return path + ".manifest.json" }

// ReadManifest reads a sidecar manifest file.
func ReadManifest(path string) (*Manifest, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("output: cannot read manifest: %w", err)
	}
	return decodeManifest(data, path)
}

func decodeManifest(data []byte, where string) (*Manifest, error) {
	var m Manifest
	if err := json.Unmarshal(data, &m); err != nil {
		return nil, fmt.Errorf("output: manifest in %q is not valid JSON: %w", where, err)
	}
	return &m, nil
}

// writeFileAtomic writes data to path through a temporary file in the same folder.
func writeFileAtomic(path string, data []byte) error {
	dir, name := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	f, err := createTemp(dir, name)
	if err != nil {
		return fmt.Errorf("output: cannot create %q: %w", path, err)
	}
	tmp := f.Name()
	_, err = f.Write(data)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
		return fmt.Errorf("output: cannot write %q: %w", path, err)
	}
	return nil
}
