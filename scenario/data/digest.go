package data

import (
	"crypto/sha256"
	"encoding/hex"
	"io"
	"os"
)

// Digest returns "sha256:" and the hex SHA-256 of the file at path, the
// form plan.json records its inputs by, so that a later run can tell
// whether an input changed.
func Digest(path string) (string, error) {
	f, err := os.Open(path)
	if err != nil {
		return "", err
	}
	defer f.Close()
	h := sha256.New() // streamed: a large history is never held whole
	if _, err := io.Copy(h, f); err != nil {
		return "", err
	}
	return "sha256:" + hex.EncodeToString(h.Sum(nil)), nil
}
