package cnt

import (
	"math"
	"testing"
)

// The dilute-solution driving force against its limits: for c_p = 1 (a
// pure-solute precipitate) it is ln(c/c_eq) exactly; it vanishes at
// c = c_eq; and for a dilute alloy it is c_p·ln(c/c_eq) − (1 − c_p)(c − c_eq)
// to second order in c (series of ln(1 − x)). Checked to 1e-12.
func TestDiluteDriving(t *testing.T) {
	if got := DiluteDriving(2e-3, 1e-4, 1); math.Abs(got-math.Log(20)) > 1e-12 {
		t.Errorf("c_p = 1: %g, want ln 20", got)
	}
	if got := DiluteDriving(1e-3, 1e-3, 0.25); got != 0 {
		t.Errorf("at c = c_eq: %g, want 0", got)
	}
	c, ceq, cp := 1.8e-3, 2e-5, 0.25
	series := cp*math.Log(c/ceq) - (1-cp)*((c-ceq)+(c*c-ceq*ceq)/2+(c*c*c-ceq*ceq*ceq)/3)
	if got := DiluteDriving(c, ceq, cp); math.Abs(got-series) > 1e-10*math.Abs(series) {
		t.Errorf("dilute: %.15g, want %.15g", got, series)
	}
	for _, bad := range [][3]float64{{0, 1e-3, 0.25}, {1, 1e-3, 0.25}, {1e-3, 0, 0.25}, {1e-3, 1e-4, 0}, {math.NaN(), 1e-4, 0.25}} {
		if got := DiluteDriving(bad[0], bad[1], bad[2]); !math.IsNaN(got) {
			t.Errorf("DiluteDriving%v = %g, want NaN", bad, got)
		}
	}
}

// β* = 4π r*² D c/a⁴ by hand for r* = 1 nm, D = 1e-20 m²/s, c = 1e-3,
// a = 0.4 nm: 4π·1e-18·1e-20·1e-3/2.56e-38 = 4.909 s⁻¹.
func TestLnAttachmentSolid(t *testing.T) {
	got := math.Exp(LnAttachmentSolid(math.Log(1e-20), 1e-9, 1e-3, 0.4e-9))
	want := 4 * math.Pi * 1e-18 * 1e-20 * 1e-3 / math.Pow(0.4e-9, 4)
	if math.Abs(got-want) > 1e-12*want {
		t.Errorf("β* = %g, want %g", got, want)
	}
	if got := LnAttachmentSolid(0, math.Inf(1), 1e-3, 1e-10); !math.IsNaN(got) {
		t.Errorf("no nucleus: %g, want NaN", got)
	}
	if got := LnAttachmentSolid(math.Inf(-1), 1e-9, 1e-3, 1e-10); !math.IsInf(got, -1) {
		t.Errorf("no mobility: %g, want -Inf", got)
	}
}
