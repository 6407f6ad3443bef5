package main

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestHeadroomWant(t *testing.T) {
	var h headroom
	const mb = 1 << 20
	for _, c := range []struct {
		name             string
		made, free, live uint64
		want             uint64
	}{
		{"the free memory holds the next request", 8 * mb, 10 * mb, 4 * mb, 0},
		{"it lacks some of what the last request made and a quarter", 8 * mb, 6 * mb, 4 * mb, 10 * mb},
		{"a fresh heap", 12 * mb, 0, 3 * mb, 15 * mb},
		{"nothing was made", 0, 0, 3 * mb, 0},
		{"the heap would pass its cap", 100 * mb, 0, 40 * mb, 0},
	} {
		assert.Equal(t, c.want, h.want(c.made, c.free, c.live), c.name)
	}
}
