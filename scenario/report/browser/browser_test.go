package browser

import (
	"errors"
	"os"
	"path/filepath"
	"testing"
)

func TestFindEnv(t *testing.T) {
	dir := t.TempDir()
	prog := filepath.Join(dir, "my-chromium")
	if err := os.WriteFile(prog, []byte("#!/bin/sh\n"), 0o755); err != nil {
		t.Fatal(err)
	}
	plain := filepath.Join(dir, "not-a-program")
	if err := os.WriteFile(plain, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name, env, want string
		err             error
	}{
		{"program", prog, prog, nil},
		{"not executable", plain, "", ErrNoBrowser},
		{"missing", filepath.Join(dir, "none"), "", ErrNoBrowser},
		{"directory", dir, "", ErrNoBrowser},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Setenv(EnvPath, tc.env)
			got, err := Find()
			if !errors.Is(err, tc.err) || got != tc.want {
				t.Errorf("Find() = %q, %v; want %q, %v", got, err, tc.want, tc.err)
			}
		})
	}
}
