package main

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"undercool/presets"
)

// BenchmarkFitArrheniusCommand1e6 is the whole of fit arrhenius on a file of a
// million invented diffusivities (the most rows a data file may have):
// reading, the fit with its checks for a Celsius column, and the table
// output (the points are not listed).
func BenchmarkFitArrheniusCommand1e6(b *testing.B) {
	path := filepath.Join(b.TempDir(), "diffusion.csv")
	f, err := os.Create(path)
	if err != nil {
		b.Fatal(err)
	}
	w := bufio.NewWriter(f)
	fmt.Fprintln(w, "temperature_k,diffusivity_m2_per_s")
	for i := range presets.MaxDataRows {
		T := 600 + 500*float64(i)/presets.MaxDataRows
		noise := 0.01
		if i%2 == 1 {
			noise = -noise
		}
		fmt.Fprintf(w, "%.6f,%.6e\n", T, 2e-7*math.Exp(-62e3/(8.314462618*T)+noise))
	}
	if err := w.Flush(); err != nil {
		b.Fatal(err)
	}
	f.Close()
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		var stderr strings.Builder
		if code := run([]string{"fit", "arrhenius", path}, nil, io.Discard, &stderr); code != 0 {
			b.Fatal(stderr.String())
		}
	}
}
