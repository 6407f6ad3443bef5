package snapshot

import "encoding/json"

// DecodeByReflection decodes a snapshot's JSON form with encoding/json's
// reflection instead of the scanner, then interprets the records the same
// way: the oracle of the decoder's tests.
func DecodeByReflection(b []byte) (Snapshot, error) {
	var w snapshotWire
	if err := json.Unmarshal(b, &w); err != nil {
		return Snapshot{}, err
	}
	return w.snapshot()
}
