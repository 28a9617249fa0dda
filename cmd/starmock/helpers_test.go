package main

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// runArgs runs a whole command line through run() into buffers.
func runArgs(t *testing.T, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	var out, errb bytes.Buffer
	code = run(context.Background(), args, &out, &errb)
	return out.String(), errb.String(), code
}

// assertGolden compares got with testdata/<dir>/<name>.golden (line endings normalised),
// rewriting the file first when update is set (flag shown in the failure message).
func assertGolden(t *testing.T, dir, name, got string, update bool, flagName string) {
	t.Helper()
	path := filepath.Join("testdata", dir, name+".golden")
	if update {
		if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("golden file: %v (run with -%s)", err, flagName)
	}
	if w := strings.ReplaceAll(string(want), "\r\n", "\n"); got != w {
		t.Errorf("output differs from %s\n--- got ---\n%s\n--- want ---\n%s", path, got, w)
	}
}
