package fit

import (
	"errors"
	"math"
	"strings"
	"testing"

	"undercool/cnt"
	"undercool/kinetics"
)

// inductionData makes induction times with the model itself: an invented
// solute (V_m = 117 cm³/mol, γ = 2.5 mJ/m², apparent A = 1e8 m⁻³ s⁻¹) in an
// invented 100 mL vessel, t = 1/(J·V) with J from kinetics.Model.At (fixed prefactor
// and the fixed-S driving force), at three temperatures and several S.
func inductionData(t *testing.T, noise []float64) (T, S, ti []float64, v float64) {
	t.Helper()
	const vm, gamma, A, V = 116.9e-6, 2.5e-3, 1e8, 1e-4
	k := 0
	for _, temp := range []float64{288.15, 298.15, 308.15} {
		for _, s := range []float64{1.6, 1.8, 2.0, 2.4, 3.0} {
			md, err := kinetics.NewModel(kinetics.Material{Driving: cnt.Supersaturation{S: s, Tsat: 320}, Vm: vm, Gamma: gamma, Prefactor: kinetics.PrefactorFixed, J0: A})
			if err != nil {
				t.Fatal(err)
			}
			tt := 1 / (math.Exp(md.LnJ(temp)) * V)
			if noise != nil {
				tt *= math.Exp(noise[k%len(noise)])
			}
			k++
			T, S, ti = append(T, temp), append(S, s), append(ti, tt)
		}
	}
	return T, S, ti, vm / cnt.Avogadro
}

// Round trip: the fit recovers the γ and A the data were made with, to
// rounding (the data lie exactly on the line).
func TestFitInductionRoundTrip(t *testing.T) {
	T, S, ti, v := inductionData(t, nil)
	f, err := Induction(T, S, ti, nil, v, 1, 1e-4)
	if err != nil {
		t.Fatal(err)
	}
	if !relClose(f.Gamma, 2.5e-3, 1e-9) || !relClose(f.A, 1e8, 1e-7) {
		t.Errorf("γ, A = %.12g J/m2, %.10g m^-3 s^-1; want 2.5e-3, 1e8", f.Gamma, f.A)
	}
	if !relClose(f.LnAV, math.Log(1e8*1e-4), 1e-9) {
		t.Errorf("ln(A·V) = %g, want ln(1e4)", f.LnAV)
	}
	// The slope is B·T³ = 16πγ³v²/(3k_B³) (Mullin 2001 §5.3, from memory).
	k := cnt.Boltzmann
	if want := 16 * math.Pi * math.Pow(2.5e-3, 3) * v * v / (3 * k * k * k); !relClose(f.Slope, want, 1e-9) {
		t.Errorf("slope = %g, want %g", f.Slope, want)
	}
	// γ = 2.5 mJ/m² at S = 1.6…3 is a nucleus of a few molecules: flagged.
	if f.Flags&kinetics.FlagSmallNucleus == 0 || !(f.MinSize < 10) {
		t.Errorf("n* from %g to %g, flags %v: want small_nucleus", f.MinSize, f.MaxSize, f.Flags.Keys())
	}
	// Without a volume only A·V is known.
	f, err = Induction(T, S, ti, nil, v, 1, 0)
	if err != nil || !math.IsNaN(f.A) || !relClose(f.LnAV, math.Log(1e4), 1e-9) {
		t.Errorf("no volume: A = %g, ln(AV) = %g, err %v", f.A, f.LnAV, err)
	}
}

// With scatter of ±10 % to ±30 % in the times (fixed, not random) the
// intervals hold the true values and the standard errors agree with the
// interval width.
func TestFitInductionScatter(t *testing.T) {
	T, S, ti, v := inductionData(t, []float64{0.1, -0.2, 0.25, -0.05, 0.3, -0.3, 0.15, -0.1})
	f, err := Induction(T, S, ti, nil, v, 1, 1e-4)
	if err != nil {
		t.Fatal(err)
	}
	if !(f.GammaCI[0] < 2.5e-3 && 2.5e-3 < f.GammaCI[1]) {
		t.Errorf("γ = %g, interval %v does not hold 2.5e-3", f.Gamma, f.GammaCI)
	}
	if !(f.ACI[0] < 1e8 && 1e8 < f.ACI[1]) {
		t.Errorf("A = %g, interval %v does not hold 1e8", f.A, f.ACI)
	}
	if !(f.GammaSE > 0) || !(f.GammaCI[0] < f.Gamma && f.Gamma < f.GammaCI[1]) {
		t.Errorf("γ SE %g, interval %v about %g", f.GammaSE, f.GammaCI, f.Gamma)
	}
	// First order: half-width ≈ t·SE; the cube root bends the interval, and
	// with a slope known to ±30 % here the two agree to about 15 %.
	half := (f.GammaCI[1] - f.GammaCI[0]) / 2
	if r := half / (f.Line.T * f.GammaSE); !(r > 0.85 && r < 1.2) {
		t.Errorf("interval half-width / (t·SE) = %g, want about 1", r)
	}
}

func TestFitInductionErrors(t *testing.T) {
	v := 116.9e-6 / cnt.Avogadro
	for _, c := range []struct {
		name    string
		T, S, t []float64
		msg     string
		index   int
	}{
		{"S = 1", []float64{298, 298}, []float64{1, 2}, []float64{10, 5}, "supersaturation must be above 1", 0},
		{"S < 1", []float64{298, 298}, []float64{2, 0.5}, []float64{10, 5}, "supersaturation must be above 1", 1},
		{"negative S", []float64{298, 298}, []float64{-2, 2}, []float64{10, 5}, "supersaturation", 0},
		{"zero time", []float64{298, 298}, []float64{1.5, 2}, []float64{0, 5}, "induction time", 0},
		{"NaN time", []float64{298, 298}, []float64{1.5, 2}, []float64{10, math.NaN()}, "induction time", 1},
		{"zero temperature", []float64{0, 298}, []float64{1.5, 2}, []float64{10, 5}, "temperature", 0},
	} {
		_, err := Induction(c.T, c.S, c.t, nil, v, 1, 1e-4)
		var pe *kinetics.PointError
		if !errors.As(err, &pe) || pe.Index != c.index || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s: error %v, want point %d with %q", c.name, err, c.index+1, c.msg)
		}
	}
	if _, err := Induction([]float64{298}, []float64{2}, []float64{10}, nil, v, 1, 0); !errors.Is(err, ErrFewPoints) {
		t.Errorf("one point: %v", err)
	}
	if _, err := Induction([]float64{298, 298}, []float64{2, 2}, []float64{10, 20}, nil, v, 1, 0); !errors.Is(err, ErrSameX) {
		t.Errorf("same abscissa: %v", err)
	}
	// Times that fall as S falls: no γ.
	if _, err := Induction([]float64{298, 298, 298}, []float64{1.5, 2, 3}, []float64{1, 10, 100}, nil, v, 1, 0); err == nil || !strings.Contains(err.Error(), "not positive") {
		t.Errorf("wrong-way data: %v", err)
	}
}
