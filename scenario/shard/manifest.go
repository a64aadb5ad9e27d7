package shard

import (
	"encoding/json"
	"errors"
	"fmt"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"
)

// ManifestVersion is the version of manifest.json.
const ManifestVersion = 1

// ErrApart is wrapped by the errors of Belong: the shards given to a merge
// do not belong together.
var ErrApart = errors.New("the shards do not belong together")

// ErrCorrupt is wrapped by the errors of a shard whose files do not hold
// what its sums.json says (a plan.csv cut short or edited): an error of
// the input, found while the merged files are written.
var ErrCorrupt = errors.New("a shard's files disagree with its sums")

// A Manifest says how a shard was made (see the package documentation).
type Manifest struct {
	Version int    `json:"version"`
	Forelay string `json:"forelay"`
	Command string `json:"command"`
	Shard   struct {
		K int `json:"k"`
		N int `json:"n"`
	} `json:"shard"`
	Inputs map[string]string `json:"inputs"`
	Seed   uint64            `json:"seed,omitempty"`
	Paths  int               `json:"paths,omitempty"`
	Args   []string          `json:"args"`
}

// NewManifest returns the manifest of shard s of a run of command with the
// inputs' digests and args (the command and the settings that change the
// output, not --out, --shard or --workers).
func NewManifest(forelay, command string, s Spec, inputs map[string]string, args []string) *Manifest {
	m := &Manifest{Version: ManifestVersion, Forelay: forelay, Command: command, Inputs: maps.Clone(inputs), Args: args}
	if m.Args == nil {
		m.Args = []string{}
	}
	m.Shard.K, m.Shard.N = s.K, s.N
	return m
}

// JSON returns the manifest as indented JSON.
func (m *Manifest) JSON() ([]byte, error) {
	b, err := json.MarshalIndent(m, "", "  ")
	return append(b, '\n'), err
}

// ReadManifest reads dir/manifest.json.
func ReadManifest(dir string) (*Manifest, error) {
	path := filepath.Join(dir, "manifest.json")
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("%s: %w (is %s the --out of a run with --shard?)", path, err, dir)
	}
	var m Manifest
	dec := json.NewDecoder(strings.NewReader(string(b)))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&m); err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	if m.Version != ManifestVersion {
		return nil, fmt.Errorf("%s: version %d, this forelay reads version %d; merge with the forelay that made the shards", path, m.Version, ManifestVersion)
	}
	return &m, nil
}

// Belong checks that the shards of dirs, whose manifests are ms, belong
// together: the same forelay, command, N, inputs, seed, paths and
// arguments, and every K from 0 to N-1 once. The error, wrapping ErrApart,
// names the two shards that differ and what differs, or the shard missing
// or given twice.
func Belong(dirs []string, ms []*Manifest) error {
	if len(ms) == 0 {
		return fmt.Errorf("%w: no shard given", ErrApart)
	}
	a := ms[0]
	for i, m := range ms[1:] {
		what := ""
		switch {
		case m.Forelay != a.Forelay:
			what = fmt.Sprintf("forelay %s and %s", a.Forelay, m.Forelay)
		case m.Command != a.Command:
			what = fmt.Sprintf("command %s and %s", a.Command, m.Command)
		case m.Shard.N != a.Shard.N:
			what = fmt.Sprintf("N = %d and N = %d", a.Shard.N, m.Shard.N)
		case !maps.Equal(m.Inputs, a.Inputs):
			what = "inputs: " + inputsDiffer(a.Inputs, m.Inputs)
		case m.Seed != a.Seed:
			what = fmt.Sprintf("seed %d and %d", a.Seed, m.Seed)
		case m.Paths != a.Paths:
			what = fmt.Sprintf("%d and %d paths", a.Paths, m.Paths)
		case !slices.Equal(m.Args, a.Args):
			what = fmt.Sprintf("arguments %q and %q", strings.Join(a.Args, " "), strings.Join(m.Args, " "))
		}
		if what != "" {
			return fmt.Errorf("%w: %s and %s differ in %s; run every shard with the same command on the same inputs", ErrApart, dirs[0], dirs[i+1], what)
		}
	}
	seen := make(map[int]string, len(ms))
	for i, m := range ms {
		if m.Shard.K < 0 || m.Shard.K >= m.Shard.N {
			return fmt.Errorf("%w: %s is shard %d of %d, out of range", ErrApart, dirs[i], m.Shard.K, m.Shard.N)
		}
		if d, ok := seen[m.Shard.K]; ok {
			return fmt.Errorf("%w: %s and %s are both shard %d/%d; give each shard once", ErrApart, d, dirs[i], m.Shard.K, m.Shard.N)
		}
		seen[m.Shard.K] = dirs[i]
	}
	for k := range a.Shard.N {
		if _, ok := seen[k]; !ok {
			return fmt.Errorf("%w: shard %d/%d is missing (%d of %d given); run it (JOB_COMPLETION_INDEX=%d) and give its --out too", ErrApart, k, a.Shard.N, len(ms), a.Shard.N, k)
		}
	}
	return nil
}

// inputsDiffer names the first input whose digest differs.
func inputsDiffer(a, b map[string]string) string {
	keys := slices.Sorted(maps.Keys(a))
	for k := range b {
		if _, ok := a[k]; !ok {
			keys = append(keys, k)
		}
	}
	for _, k := range keys {
		if a[k] != b[k] {
			return fmt.Sprintf("the %s file (%s and %s)", k, short(a[k]), short(b[k]))
		}
	}
	return "none"
}

// short shortens a digest for a message.
func short(d string) string {
	if d == "" {
		return "none"
	}
	if len(d) > 19 {
		return d[:19] + "..."
	}
	return d
}
