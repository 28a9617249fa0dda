package phot

import (
	"bytes"
	"flag"
	"os"
	"testing"
)

var update = flag.Bool("update", false, "rewrite data/default_bc_grid.tsv from AssembleDefaultGrid")

// TestDefaultGridFileUpToDate is a regression test: the embedded grid file must
// be exactly what AssembleDefaultGrid writes now (run with -update to rewrite
// it after changing the assembly).
func TestDefaultGridFileUpToDate(t *testing.T) {
	g, err := AssembleDefaultGrid()
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteGrid(&buf, g); err != nil {
		t.Fatal(err)
	}
	if *update {
		if err := os.WriteFile(defaultGridFile, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	raw, err := dataFS.ReadFile(defaultGridFile)
	if err != nil {
		if *update {
			t.Skip("file written; rerun without -update")
		}
		t.Fatal(err)
	}
	if !bytes.Equal(raw, buf.Bytes()) && !*update {
		t.Errorf("%s differs from AssembleDefaultGrid output; run go test -run TestDefaultGridFileUpToDate -update", defaultGridFile)
	}
}
