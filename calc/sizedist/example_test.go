package sizedist_test

import (
	"fmt"

	"fogbench/calc/sizedist"
)

// A Rosin–Rammler spray with a Sauter mean diameter of 50 µm and spread 2.5,
// cut into 200 log-spaced classes between 1 and 500 µm.
func ExampleCut() {
	model, err := sizedist.RosinRammlerFromSMD(50e-6, 2.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	bins, err := sizedist.Cut(model, 1e-6, 500e-6, 200, sizedist.SpacingLog)
	if err != nil {
		fmt.Println(err)
		return
	}
	s := bins.Summary()
	fmt.Printf("D32  %.2f µm\n", s.D32*1e6)
	fmt.Printf("D43  %.2f µm\n", s.D43*1e6)
	fmt.Printf("Dv50 %.2f µm\n", s.Dv50*1e6)
	fmt.Printf("relative span %.3f\n", s.RelativeSpan)
	fmt.Printf("outside the classes %.2e of the volume\n", bins.TruncatedBelow+bins.TruncatedAbove)
	// Output:
	// D32  50.10 µm
	// D43  66.09 µm
	// Dv50 64.31 µm
	// relative span 1.147
	// outside the classes 2.09e-05 of the volume
}

// An instrument-style table of volume percent per class.
func ExampleFromFractions() {
	edges := []float64{10e-6, 20e-6, 40e-6, 80e-6}
	b, err := sizedist.FromFractions(edges, []float64{20, 50, 29}, sizedist.BasisVolume)
	if err != nil {
		fmt.Println(err)
		return
	}
	s := b.Summary()
	fmt.Printf("D32 %.2f µm, Dv50 %.2f µm\n", s.D32*1e6, s.Dv50*1e6)
	fmt.Println(s.Warnings[0])
	// Output:
	// D32 30.45 µm, Dv50 35.43 µm
	// fractions summed to 99 %, not 100 %; they were normalised
}
