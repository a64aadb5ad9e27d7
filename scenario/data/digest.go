package data

import (
	"crypto/sha256"
	"encoding/hex"
	"os"
)

// Digest returns "sha256:" and the hex SHA-256 of the file at path, the
// form plan.json records its inputs by, so that a later run can tell
// whether an input changed.
func Digest(path string) (string, error) {
	b, err := os.ReadFile(path)
	if err != nil {
		return "", err
	}
	sum := sha256.Sum256(b)
	return "sha256:" + hex.EncodeToString(sum[:]), nil
}
