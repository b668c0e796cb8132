package presets_test

import (
	"fmt"
	"math"

	"undercool/kinetics"
	"undercool/kinetics/sample"
	"undercool/presets"
)

// Open a shipped card, build its model and ask for the steady-state
// nucleation rate and the critical nucleus at one temperature. The card
// demo-alloy is invented for the demonstrations; it describes no real
// material.
func Example() {
	c, err := presets.Open("demo-alloy")
	if err != nil {
		fmt.Println(err)
		return
	}
	md, err := c.Model()
	if err != nil {
		fmt.Println(err)
		return
	}
	// By hand: Δg = ΔH·ΔT/T_e·2T/(T_e + T) = 2710 J/mol, so r* = 2γv/Δμ =
	// 1.012 nm and n* = (4π/3)·r*³/v = 267 molecules.
	s := md.At(900) // K
	fmt.Printf("%s: T_e = %.0f K\n", c.Name, md.Te())
	fmt.Printf("at 900 K: log10 J = %.2f (J in m^-3 s^-1), r* = %.3g nm, n* = %.0f\n", s.Log10J(), s.Nucleus.Radius*1e9, s.Nucleus.Size)
	// Output:
	// demo-alloy: T_e = 1150 K
	// at 900 K: log10 J = 11.29 (J in m^-3 s^-1), r* = 1.01 nm, n* = 267
}

// The nose of the TTT curve of a card's model: the temperature where a
// hold reaches the fraction 1e-6 soonest, found by a bracketing search.
// The card demo-alloy is invented for the demonstrations.
func Example_nose() {
	c, _ := presets.Open("demo-alloy")
	md, err := c.Model()
	if err != nil {
		fmt.Println(err)
		return
	}
	n, err := md.Nose(0.5*md.Te(), 0.99*md.Te(), 1e-6, kinetics.JMAK{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("nose at %.1f K after %.2f s\n", n.T, math.Exp(n.LnTime))
	// Output:
	// nose at 831.5 K after 6.01 s
}

// The critical cooling rate of a card's model: linear cooling from T_e
// that keeps the transformed fraction below 1e-6, from one integral (the
// extended volume scales as the rate to the power −4). The card demo-alloy
// is invented for the demonstrations.
func Example_criticalRate() {
	c, _ := presets.Open("demo-alloy")
	md, err := c.Model()
	if err != nil {
		fmt.Println(err)
		return
	}
	cl, err := md.LinearCooling(0) // to where the rest of the path is negligible
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("critical cooling rate: %.3g K/s (path to %.1f K)\n", cl.CriticalRate(1e-6), cl.End)
	// Output:
	// critical cooling rate: 8.18 K/s (path to 548.5 K)
}

// The uncertainty of a rate from the spreads of a card's values: each
// Monte Carlo sample is built from the card with its drawn values, by the
// same path as the card's own model. The card demo-alloy is invented for
// the demonstrations.
func ExampleCard_Vary() {
	c, _ := presets.Open("demo-alloy")
	gamma, _ := presets.ParseSpread("gamma", "2%")
	d0, _ := presets.ParseSpread("d0", "x2")
	spreads, err := c.Resolve(map[string]presets.SpreadSpec{"gamma": gamma, "d0": d0})
	if err != nil {
		fmt.Println(err)
		return
	}
	mc := sample.MonteCarlo{
		Spreads: spreads, Build: c.Vary(spreads),
		Outputs: []sample.Output{{Key: "log10_rate_per_m3_s"}},
		Eval: func(md *kinetics.Model) ([]float64, error) {
			return []float64{md.LnJ(1000) / math.Ln10}, nil
		},
		Samples: 2000, Seed: 1,
	}
	u, err := mc.Run()
	if err != nil {
		fmt.Println(err)
		return
	}
	b := u.Bands[0]
	fmt.Printf("log10 J at 1000 K: %.1f, P5 %.1f, P50 %.1f, P95 %.1f\n", u.Base[0], b.P5, b.P50, b.P95)
	fmt.Printf("driven most by %s\n", u.Sensitivity[0][0].Key)
	// Output:
	// log10 J at 1000 K: -13.4, P5 -18.0, P50 -13.4, P95 -8.7
	// driven most by gamma
}
