package evap

import (
	"context"
	"errors"
	"math"
	"slices"
	"testing"
)

// A done context stops HistoryContext, both with transient heating (looked
// at before each bin's path) and in the steady sweep (before each time
// step); the spray is left as it was, so a later History equals one of a
// fresh spray.
func TestHistoryContextStops(t *testing.T) {
	d := make([]float64, 30)
	w := make([]float64, len(d))
	for i := range d {
		d[i] = 2e-6 * math.Pow(50, float64(i)/float64(len(d)-1))
		w[i] = 1
	}
	canceled, cancel := context.WithCancel(context.Background())
	cancel()
	for _, opts := range []HistoryOptions{{}, {Transient: true, InjectionTemperature: 290}} {
		c := waterInAir()
		s, err := c.NewSpray(d, w, opts)
		if err != nil {
			t.Fatal(err)
		}
		h, err := s.HistoryContext(canceled, 0)
		if !errors.Is(err, context.Canceled) || h.T != nil {
			t.Fatalf("transient %v: cancelled history returned %d points, err %v", opts.Transient, len(h.T), err)
		}
		got, err := s.History(0)
		if err != nil {
			t.Fatal(err)
		}
		fresh, err := c.NewSpray(d, w, opts)
		if err != nil {
			t.Fatal(err)
		}
		want, err := fresh.History(0)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(got.T, want.T) || !slices.Equal(got.EvaporatedMassFraction, want.EvaporatedMassFraction) || got.T99 != want.T99 {
			t.Errorf("transient %v: history after a cancelled one differs from a fresh spray's", opts.Transient)
		}
	}
}
