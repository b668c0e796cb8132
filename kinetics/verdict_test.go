package kinetics_test

import (
	"math"
	"strings"
	"testing"

	"undercool/kinetics"
	"undercool/presets"
	"undercool/presets/units"
)

// demoQuench is the invented quench log of the demo alloy shipped as
// testdata/curves/demo-quench.csv.
func demoQuench(t *testing.T) kinetics.Path {
	t.Helper()
	d, err := presets.ReadDataFile("../testdata/curves/demo-quench.csv", nil, []presets.Column{
		{Quantity: "time", Kind: units.Time, Required: true},
		{Quantity: "temperature", Kind: units.Temperature, Required: true},
	})
	if err != nil {
		t.Fatal(err)
	}
	p, err := kinetics.NewPath(d.Columns["time"], d.Columns["temperature"])
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestVerdictDemoQuench: on the demo alloy's quench log the two measures
// disagree: the path integral stays far below X = 1e-6 (5.4e-8) while the
// additivity sum passes 1 (1.18). The verdict is the path integral's, says
// so in a line, and explains the difference.
func TestVerdictDemoQuench(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	a, err := md.AnalyzeCurve(demoQuench(t), 1e-6, 25)
	if err != nil {
		t.Fatal(err)
	}
	v := a.Verdict()
	if v.Reached || !v.SumReached || v.Agree() {
		t.Fatalf("verdict %+v: want the path integral below X and the sum past 1", v)
	}
	if s := v.String(); !strings.HasPrefix(s, "stays below X = 1e-06 (fraction at the end 5.") {
		t.Errorf("verdict line %q", s)
	}
	if why := v.Why(); !strings.Contains(why, "isokinetic") || !strings.Contains(why, "path integral is the answer") {
		t.Errorf("no reason given for the difference: %q", why)
	}
	t.Logf("%s; additivity sum %.4g: %s", v, v.Sum, v.Why())
}

// TestVerdictAgree: cooled slowly, both measures reach X; the verdict
// names where, and gives no reason to explain.
func TestVerdictAgree(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	p := kinetics.LinearPath(1150, 600, 0.1, 50)
	a, err := md.AnalyzeCurve(p, 1e-6, 25)
	if err != nil {
		t.Fatal(err)
	}
	v := a.Verdict()
	if !v.Reached || !v.SumReached || !v.Agree() || v.Why() != "" {
		t.Fatalf("verdict %+v", v)
	}
	if s := v.String(); !strings.HasPrefix(s, "reaches X = 1e-06 at 9") {
		t.Errorf("verdict line %q", s)
	}
}

// TestSampleFewNuclei: the demo alloy cooled at 0.1 K/s in a sample of
// 1e-12 m³ reaches the mean-field fraction 1e-6 (922 K) long before the
// first nucleus is expected there (908 K): fewer than one nucleus when X is
// reached, and the library says so. In a litre the fraction comes with
// many nuclei.
func TestSampleFewNuclei(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	c, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	s := c.Sample(1e-12, 0.1, 1e-6)
	if !s.Reached || !s.Onset.Reached || !s.FewNuclei() || !(s.Onset.Temp < s.Temp) {
		t.Errorf("1e-12 m3: %+v; want X reached above the onset, with fewer than one nucleus", s)
	}
	// the expected number at the point X is reached, from the onset side:
	// one nucleus at the onset, fewer before
	if !(s.LnNuclei < 0) || math.IsInf(s.LnNuclei, 0) {
		t.Errorf("ln N at X = %g", s.LnNuclei)
	}
	if l := c.Sample(1e-3, 0.1, 1e-6); !l.Reached || l.FewNuclei() || !(l.Onset.Temp > l.Temp) {
		t.Errorf("1 L: %+v; want the first nucleus before X", l)
	}
	t.Logf("1e-12 m3: X at %.2f K with %.3g nuclei expected; first nucleus at %.2f K", s.Temp, math.Exp(s.LnNuclei), s.Onset.Temp)
}

// TestSampleAlongCurve: the same comparison on a measured path agrees with
// the linear cooling it samples.
func TestSampleAlongCurve(t *testing.T) {
	md := shippedModel(t, "demo-alloy")
	c, err := md.LinearCooling(0)
	if err != nil {
		t.Fatal(err)
	}
	a, err := md.AnalyzeCurve(kinetics.LinearPath(1150, c.End, 0.1, 7), 1e-6, 25)
	if err != nil {
		t.Fatal(err)
	}
	got, want := a.Sample(1e-12), c.Sample(1e-12, 0.1, 1e-6)
	if got.FewNuclei() != want.FewNuclei() || math.Abs(got.Temp-want.Temp) > 1e-3 || math.Abs(got.Onset.Temp-want.Onset.Temp) > 1e-3 ||
		math.Abs(got.LnNuclei-want.LnNuclei) > 1e-6 {
		t.Errorf("curve %+v, linear %+v", got, want)
	}
}
