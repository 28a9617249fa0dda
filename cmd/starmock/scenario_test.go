package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestScenarioCommandStructure: `starmock scenario FILE` accepts a field.structure block
// and rejects a bad value with exit status 2 and the file, line, key and allowed range
// (the error convention of DEVELOPERS.md); `starmock scenario` documents the block.
func TestScenarioCommandStructure(t *testing.T) {
	const text = `seed: 9
components:
  - {name: disc, kind: thin_disc}
field:
  area: {kind: cone, l_deg: 30, b_deg: 45, radius_deg: 0.5}
  structure:
    thin_disc: {scale_height_pc: HEIGHT}
    halo: {axis_ratio: 0.7}
survey:
  bands: [{band: V, limit_5sigma_mag: 20, saturation_mag: 10}]
output: {path: cat}
`
	dir := t.TempDir()
	write := func(name, height string) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, []byte(strings.Replace(text, "HEIGHT", height, 1)), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	good := write("good.yaml", "250")
	if out, stderr, code := runArgs(t, "scenario", good); code != 0 || !strings.Contains(out, "valid") {
		t.Errorf("good file: exit %d, stdout %q, stderr %q", code, out, stderr)
	}
	bad := write("bad.yaml", "-5")
	_, stderr, code := runArgs(t, "scenario", bad)
	if code != 2 {
		t.Errorf("bad file: exit %d, want 2 (stderr %q)", code, stderr)
	}
	want := bad + ":7: field.structure.thin_disc.scale_height_pc: -5 pc is out of range; allowed: [10, 5000] pc"
	if !strings.Contains(stderr, want) {
		t.Errorf("stderr %q, want it to contain %q", stderr, want)
	}
	out, _, code := runArgs(t, "scenario")
	if code != 0 {
		t.Fatalf("scenario: exit %d", code)
	}
	for _, k := range []string{"structure:", "local_density_msun_pc3: 0.040", "scale_height_pc: 300", "axis_ratio: 0.64", "bar_angle_deg: 27"} {
		if !strings.Contains(out, k) {
			t.Errorf("scenario reference lacks %q", k)
		}
	}
}
