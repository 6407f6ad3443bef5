//go:build overlaycore

package main

import (
	"standout/internal/report"
)

// fullReport is left out of the overlay core (report_full.go).
func fullReport(*Request, []report.Analysed, map[string]float64, float64) []byte {
	return errorResponse("this core answers the overlay's checks only; the whole report comes from the report core (standout-report.wasm)")
}
