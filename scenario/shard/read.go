package shard

import (
	"bufio"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"slices"

	"forelay/forecast"
)

// A File is one file a shard or a merge writes, by name.
type File struct {
	Name string
	Data []byte
}

// readShards reads the manifests of dirs, checks that they belong
// together (Belong) and were made by command, and returns the directories
// and manifests ordered by K.
func readShards(dirs []string, command string) ([]string, []*Manifest, error) {
	ms := make([]*Manifest, len(dirs))
	for i, d := range dirs {
		m, err := ReadManifest(d)
		if err != nil {
			return nil, nil, err
		}
		ms[i] = m
	}
	if err := Belong(dirs, ms); err != nil {
		return nil, nil, err
	}
	if ms[0].Command != command {
		return nil, nil, fmt.Errorf("%w: the shards are of forelay %s, not %s", ErrApart, ms[0].Command, command)
	}
	order := make([]int, len(dirs))
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, func(a, b int) int { return ms[a].Shard.K - ms[b].Shard.K })
	sd, sm := make([]string, len(dirs)), make([]*Manifest, len(dirs))
	for i, j := range order {
		sd[i], sm[i] = dirs[j], ms[j]
	}
	return sd, sm, nil
}

// readJSON decodes dir/name strictly into v, streaming the file through
// the decoder (a shard's sums.json may be large).
func readJSON(dir, name string, v any) error {
	path := filepath.Join(dir, name)
	fh, err := os.Open(path)
	if err != nil {
		return err
	}
	defer fh.Close()
	dec := json.NewDecoder(bufio.NewReaderSize(fh, 1<<16))
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	return nil
}

// Command returns the command the shard in dir was made by, from its
// manifest.
func Command(dir string) (string, error) {
	m, err := ReadManifest(dir)
	if err != nil {
		return "", err
	}
	return m.Command, nil
}

// parsePeriods reads the period labels of a sums.json, of frequency freq
// (its name).
func parsePeriods(freq string, labels []string) ([]forecast.Period, error) {
	f, err := forecast.ParseFrequency(freq)
	if err != nil {
		return nil, fmt.Errorf("sums.json: %w", err)
	}
	out := make([]forecast.Period, len(labels))
	for i, label := range labels {
		if out[i], err = forecast.ParsePeriod(label, f); err != nil {
			return nil, fmt.Errorf("sums.json: %w", err)
		}
	}
	return out, nil
}
