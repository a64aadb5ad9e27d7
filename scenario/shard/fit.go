package shard

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
)

// FitSums is sums.json of a shard of a fit: the number of series of the
// history and the index in it of each series the shard fitted, in the
// order of the shard's fit.jsonl lines.
type FitSums struct {
	Version int    `json:"version"`
	Kind    string `json:"kind"`
	Series  int    `json:"series"`
	Own     []int  `json:"own"`
}

// FitFiles returns the files of a shard of a fit: fit.jsonl (lines, one
// JSON object per series fitted, in order) and sums.json, with the index of
// each of those series among the history's series.
func FitFiles(lines []byte, series int, own []int) ([]File, error) {
	js, err := json.Marshal(FitSums{Version: SumsVersion, Kind: "fit", Series: series, Own: own})
	if err != nil {
		return nil, err
	}
	return []File{{"fit.jsonl", lines}, {"sums.json", append(js, '\n')}}, nil
}

// MergeFit merges the shards of a fit in dirs (the --out directories of
// "forelay fit --shard K/N") into fit.jsonl, the lines "forelay fit
// --json" prints for the whole history, in the history's order. Errors
// wrap ErrApart when the shards do not belong together.
func MergeFit(dirs []string) (*Merged, error) {
	dirs, ms, err := readShards(dirs, "fit")
	if err != nil {
		return nil, err
	}
	total := -1
	var lines [][]byte
	from := map[int]int{}
	for i, d := range dirs {
		var s FitSums
		if err := readJSON(d, "sums.json", &s); err != nil {
			return nil, err
		}
		if s.Version != SumsVersion || s.Kind != "fit" {
			return nil, fmt.Errorf("%s: sums.json of version %d, kind %q; this forelay merges version %d of a fit", d, s.Version, s.Kind, SumsVersion)
		}
		if total < 0 {
			total = s.Series
			lines = make([][]byte, total)
		}
		if s.Series != total {
			return nil, fmt.Errorf("%w: %s and %s fit histories of %d and %d series", ErrApart, dirs[0], d, total, s.Series)
		}
		b, err := os.ReadFile(filepath.Join(d, "fit.jsonl"))
		if err != nil {
			return nil, err
		}
		sc := bufio.NewScanner(bytes.NewReader(b))
		sc.Buffer(nil, len(b)+1)
		n := 0
		for sc.Scan() {
			if n >= len(s.Own) {
				return nil, fmt.Errorf("%s: more lines than the %d series of sums.json", filepath.Join(d, "fit.jsonl"), len(s.Own))
			}
			at := s.Own[n]
			if at < 0 || at >= total {
				return nil, fmt.Errorf("%s: series index %d of %d", d, at, total)
			}
			if j, ok := from[at]; ok {
				return nil, fmt.Errorf("%w: %s and %s both fit series %d", ErrApart, dirs[j], d, at+1)
			}
			from[at] = i
			lines[at] = append(bytes.Clone(sc.Bytes()), '\n')
			n++
		}
		if n != len(s.Own) {
			return nil, fmt.Errorf("%s: %d lines for %d series", filepath.Join(d, "fit.jsonl"), n, len(s.Own))
		}
	}
	var out bytes.Buffer
	for i, l := range lines {
		if l == nil {
			return nil, fmt.Errorf("%w: no shard fits series %d of %d", ErrApart, i+1, total)
		}
		out.Write(l)
	}
	return &Merged{Files: []File{{"fit.jsonl", out.Bytes()}}, Text: fmt.Sprintf("merged %d shards of forelay fit: %d series\n", ms[0].Shard.N, total)}, nil
}
