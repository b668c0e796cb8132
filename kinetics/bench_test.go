package kinetics_test

import (
	"testing"

	"undercool/kinetics"
)

var sinkF float64
var sinkS kinetics.State

// BenchmarkLnJ is one evaluation of ln J(T) with the attachment prefactor and
// an Arrhenius mobility (target: ≤ 200 ns). The temperature moves so that
// nothing is hoisted out of the loop.
func BenchmarkLnJ(b *testing.B) {
	md := mustModel(b, goldCallister())
	T := 1000.0
	b.ReportAllocs()
	for b.Loop() {
		sinkF += md.LnJ(T)
		T += 1e-6
	}
}

// BenchmarkLnJVFT is the same with a VFT (Stokes–Einstein) mobility.
func BenchmarkLnJVFT(b *testing.B) {
	m := goldCallister()
	m.Mobility = kinetics.VFT{A: -4.5, B: 3000, T0: 500, Jump: 3e-10}
	md := mustModel(b, m)
	T := 1000.0
	b.ReportAllocs()
	for b.Loop() {
		sinkF += md.LnJ(T)
		T += 1e-6
	}
}

// BenchmarkRateTable1000 is a rate table of 1,000 temperatures from 10 K to
// Te with Model.At (target: < 1 ms per table).
func BenchmarkRateTable1000(b *testing.B) {
	md := mustModel(b, goldCallister())
	te := md.Te()
	b.ReportAllocs()
	for b.Loop() {
		for i := range 1000 {
			sinkS = md.At(10 + (te-10)*float64(i)/999)
		}
	}
}

// BenchmarkHeatCritical is the critical heating rate of a shipped glass
// card from Tg to T_e: the unit-rate heating path integrated once, and the
// q⁻⁴ closed form.
func BenchmarkHeatCritical(b *testing.B) {
	heat := glassHeating(b)
	b.ReportAllocs()
	for b.Loop() {
		sinkF += heat().CriticalRate(1e-6)
	}
}

// glassHeating heats the lithium disilicate card from Tg to T_e.
func glassHeating(b *testing.B) func() *kinetics.Heating {
	md := shippedModel(b, "lithium-disilicate")
	return func() *kinetics.Heating {
		h, err := md.LinearHeating(md.Material().Tg, md.Te(), kinetics.NoNuclei)
		if err != nil {
			b.Fatal(err)
		}
		return h
	}
}

// BenchmarkHeatDSCPeaks is the DSC peak and onset at four heating rates
// (2, 5, 10 and 20 K/min) of the same card, from one unit-rate path.
func BenchmarkHeatDSCPeaks(b *testing.B) {
	heat := glassHeating(b)
	b.ReportAllocs()
	for b.Loop() {
		h := heat()
		for _, q := range []float64{2.0 / 60, 5.0 / 60, 10.0 / 60, 20.0 / 60} {
			sinkF += h.Peak(q).T
		}
	}
}
