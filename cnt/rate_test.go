package cnt_test

import (
	"math"
	"testing"

	"undercool/cnt"
	"undercool/internal/beckerdoring"
)

// β* = 24·D·n*^(2/3)/λ² by hand: D = 1e-9 m²/s, n* = 1000, λ = 0.3 nm gives
// 24·1e-9·100/9e-20 = 2.6667e13 1/s.
func TestLnAttachmentHand(t *testing.T) {
	got := cnt.LnAttachment(math.Log(1e-9), 1000, 0.3e-9)
	if want := math.Log(24e-9 * 100 / 9e-20); !close(got, want, 1e-14) {
		t.Errorf("ln β* = %.15g, want %.15g", got, want)
	}
	if !close(math.Exp(got), 2.6667e13, 1e-4) {
		t.Errorf("β* = %g, want 2.6667e13", math.Exp(got))
	}
	if got := cnt.LnAttachment(math.Inf(-1), 1000, 0.3e-9); !math.IsInf(got, -1) {
		t.Errorf("ln β*(D = 0) = %g, want -Inf", got)
	}
}

// The attachment rate J = N·Z·β*·exp(−ΔG*/k_BT) against the product
// computed directly where it is representable (Kelton and Greer (2010)
// eq. 2.30).
func TestLnRateDirect(t *testing.T) {
	for _, c := range []struct{ N, Z, beta, barrierKT, T float64 }{
		{3e28, 0.05, 1e10, 40, 1000},
		{1e20, 0.01, 1e3, 70, 300},
		{6e28, 0.2, 5e12, 5, 1500},
	} {
		barrier := c.barrierKT * cnt.Boltzmann * c.T
		want := math.Log(c.N * c.Z * c.beta * math.Exp(-c.barrierKT))
		got := cnt.LnRate(math.Log(c.N), c.Z, math.Log(c.beta), barrier, c.T)
		if !close(got, want, 1e-13) {
			t.Errorf("%+v: ln J = %.15g, want %.15g", c, got, want)
		}
	}
}

// Turnbull D., Fisher J.C., J. Chem. Phys. 17 (1949) 71, eq. 12:
// J = N·(k_BT/h)·exp(−Q/RT)·exp(−ΔG*/k_BT). By hand at T = 1000 K:
// k_BT/h = 1.380649e-20/6.62607015e-34 = 2.08366e13 1/s; Q = 100 kJ/mol gives
// Q/RT = 100000/8314.46 = 12.0272; ΔG* = 40 k_BT; N = 1e28 m⁻³:
// ln J = 64.4724 + 30.6677 − 12.0272 − 40 = 43.1129.
func TestLnRateTurnbullFisherHand(t *testing.T) {
	const T, Q, N = 1000.0, 1e5, 1e28
	barrier := 40 * cnt.Boltzmann * T
	got := cnt.LnRateTurnbullFisher(math.Log(N), Q, barrier, T)
	if !close(got, 43.1129, 1e-5) {
		t.Errorf("ln J = %.7g, want 43.1129 (hand)", got)
	}
	direct := math.Log(N * (cnt.Boltzmann * T / cnt.Planck) * math.Exp(-Q/(cnt.Gas*T)) * math.Exp(-40))
	if !close(got, direct, 1e-13) {
		t.Errorf("ln J = %.15g, direct product %.15g", got, direct)
	}
	if !close(cnt.Boltzmann*T/cnt.Planck, 2.08366e13, 1e-5) {
		t.Errorf("kT/h = %g, want 2.08366e13", cnt.Boltzmann*T/cnt.Planck)
	}
}

func TestLnRateFixedHand(t *testing.T) {
	got := cnt.LnRateFixed(math.Log(1e42), 30*cnt.Boltzmann*500, 500)
	if want := math.Log(1e42) - 30; !close(got, want, 1e-14) {
		t.Errorf("ln J = %g, want %g", got, want)
	}
}

// Rates span hundreds of decades. Each case is built so that the direct
// product N·Z·β*·exp(−ΔG*/kT) overflows or underflows float64 on the way,
// while ln J is an ordinary number. The expected ln J is the sum of logs.
func TestLnRateNoOverflow(t *testing.T) {
	ln := math.Log
	const T = 1000.0
	kT := cnt.Boltzmann * T
	for _, c := range []struct {
		name       string
		lnN, Z     float64
		lnBeta     float64
		barrierKT  float64
		wantLog10J float64
	}{
		// N·Z·β* = 1e30·0.05·1e301 overflows; ΔG*/kT = ln(5e29) brings J to 1e300.
		{"J ~ 1e+300", ln(1e30), 0.05, ln(1e301), ln(5e29), 300},
		// exp(−800) underflows to 0; a prefactor N·Z·β* of e^800·1e-300 lifts J to 1e-300.
		{"J ~ 1e-300", ln(1e30), 0.05, ln(1e-300) + 800 - ln(1e30) - ln(0.05), 800, -300},
		// far beyond float64 either way
		{"J ~ 1e+1000", ln(1e30), 0.1, 1000*math.Ln10 - ln(1e30) - ln(0.1), 0, 1000},
		{"J ~ 1e-5000", ln(1e28), 0.01, ln(1e12), 5000*math.Ln10 + ln(1e28) + ln(0.01) + ln(1e12), -5000},
	} {
		got := cnt.LnRate(c.lnN, c.Z, c.lnBeta, c.barrierKT*kT, T)
		if math.IsInf(got, 0) || math.IsNaN(got) {
			t.Errorf("%s: ln J = %g, want finite", c.name, got)
			continue
		}
		if g := got / math.Ln10; !close(g, c.wantLog10J, 1e-10) {
			t.Errorf("%s: log10 J = %.12g, want %g", c.name, g, c.wantLog10J)
		}
	}
	// The same for Turnbull–Fisher and fixed prefactors: a barrier of 1e5 kT.
	if got := cnt.LnRateTurnbullFisher(ln(1e28), 1e5, 1e5*kT, T); !(got < -9e4 && got > -1.1e5) {
		t.Errorf("Turnbull–Fisher, ΔG* = 1e5 kT: ln J = %g, want about -1e5", got)
	}
	if got := cnt.LnRateFixed(ln(1e40), 1e5*kT, T); !close(got, ln(1e40)-1e5, 1e-14) {
		t.Errorf("fixed, ΔG* = 1e5 kT: ln J = %g", got)
	}
}

// No nucleation gives ln J = −Inf, never NaN (doc comments of LnRate,
// LnRateTurnbullFisher, LnRateFixed).
func TestLnRateSpecialCases(t *testing.T) {
	inf := math.Inf(1)
	for _, c := range []struct {
		name string
		got  float64
	}{
		{"Z = 0", cnt.LnRate(60, 0, 20, 1e-19, 300)},
		{"ln β* = -Inf (no mobility)", cnt.LnRate(60, 0.1, -inf, 1e-19, 300)},
		{"ΔG* = +Inf (no driving force)", cnt.LnRate(60, 0.1, 20, inf, 300)},
		{"no driving force, no mobility", cnt.LnRate(60, 0, -inf, inf, 300)},
		{"Turnbull–Fisher, ΔG* = +Inf", cnt.LnRateTurnbullFisher(60, 1e5, inf, 300)},
		{"fixed, ΔG* = +Inf", cnt.LnRateFixed(60, inf, 300)},
	} {
		if !same(c.got, math.Inf(-1)) {
			t.Errorf("%s: ln J = %g, want -Inf", c.name, c.got)
		}
	}
	// A driving force with no nucleus from Critical goes through as −Inf.
	n := cnt.Critical(0, 0.1, 3e-29, 1, 300)
	if got := cnt.LnRate(60, n.Zeldovich, 20, n.Barrier, 300); !math.IsInf(got, -1) {
		t.Errorf("LnRate of Critical(dmu = 0) = %g, want -Inf", got)
	}
}

// θ = (π²/6)·τ with τ = 4/(π³·Z²·β*), Kashchiev (1969): by hand, Z = 0.05,
// β* = 1e6 1/s give τ = 4/(31.006·2500) = 5.1603e-5 s and θ = 2/(3π·2500)
// = 8.4883e-5 s.
func TestTimeLag(t *testing.T) {
	if got := cnt.TimeLag(0.05, math.Log(1e6)); !close(got, 8.4883e-5, 1e-5) {
		t.Errorf("θ = %g s, want 8.4883e-5 s", got)
	}
	tau := 4 / (math.Pi * math.Pi * math.Pi * 0.02 * 0.02 * 3e4)
	if got, want := cnt.TimeLag(0.02, math.Log(3e4)), math.Pi*math.Pi/6*tau; !close(got, want, 1e-14) {
		t.Errorf("θ = %g s, want π²/6·τ = %g s", got, want)
	}
	for _, c := range []struct {
		name   string
		z, lnB float64
	}{
		{"Z = 0", 0, 10},
		{"β* = 0", 0.05, math.Inf(-1)},
	} {
		if got := cnt.TimeLag(c.z, c.lnB); !math.IsInf(got, 1) {
			t.Errorf("%s: θ = %g, want +Inf", c.name, got)
		}
	}
}

// τ = 1/(2π·Z²·β*), Kelton and Greer (2010) §3.3, by hand: Z = 0.05,
// β* = 1e6 1/s give 1/(2π·0.0025·1e6) = 6.3662e-5 s, 3/4 of the time lag θ
// of the same nucleus.
func TestIncubation(t *testing.T) {
	if got := cnt.Incubation(0.05, math.Log(1e6)); !close(got, 6.3662e-5, 1e-5) {
		t.Errorf("τ = %g s, want 6.3662e-5 s", got)
	}
	if got, want := cnt.Incubation(0.02, math.Log(3e4)), 0.75*cnt.TimeLag(0.02, math.Log(3e4)); !close(got, want, 1e-14) {
		t.Errorf("τ = %g s, want 3θ/4 = %g s", got, want)
	}
	for _, c := range []struct{ z, lnB float64 }{{0, math.Log(1e6)}, {0.05, math.Inf(-1)}} {
		if got := cnt.Incubation(c.z, c.lnB); !math.IsInf(got, 1) {
			t.Errorf("Z = %g, ln β* = %g: τ = %g, want +Inf", c.z, c.lnB, got)
		}
	}
}

// droplet is a CNT droplet of our own with critical size n* and barrier
// ΔG* (in k_BT): its critical nucleus from Critical, and the same droplet
// as a Becker–Döring chain, ΔG(n)/k_BT = −n·Δμ/k_BT + a·n^(2/3) with
// a = (36π)^(1/3)·v^(2/3)·γ/k_BT and attachment k⁺(n) = n^(2/3) (time in
// units of a monomer's attachment time), sizes to 3n*.
func droplet(t *testing.T, nStar, barrier float64) (cnt.Nucleus, *beckerdoring.System) {
	t.Helper()
	const T, v = 1000.0, 1e-29
	kT := cnt.Boltzmann * T
	dmu := 2 * barrier / nStar * kT // ΔG*/n* = Δμ/2
	gamma := math.Cbrt(barrier * kT * 3 * dmu * dmu / (16 * math.Pi * v * v))
	n := cnt.Critical(dmu, gamma, v, 1, T)
	a := math.Cbrt(36*math.Pi) * math.Pow(v, 2.0/3) * gamma / kT
	s, err := beckerdoring.CNT(dmu/kT, a, int(3*nStar))
	if err != nil {
		t.Fatal(err)
	}
	return n, s
}

// TestTimeLagMasterEquation: the time lag against the Becker–Döring master
// equation, solved in time (internal/beckerdoring; the lag of the clusters
// past n* after 60 time lags, exact to 1e-9 there).
//
// The check chosen before the run was 5 % for the droplet of n* = 100 and
// ΔG* = 40 k_BT (CNT-vs-discrete differences of order 1/n* and the
// near-critical expansion). It failed: the master equation's lag is 1.147
// times Kashchiev's, and over barriers of 10 to 160 k_BT the ratio runs
// from 0.72 to 1.61, growing with the barrier: his solution keeps the
// clusters below the critical region at equilibrium, and their relaxation
// takes longer the higher the barrier. So this test holds the library's
// statement of that accuracy (cnt.LnTimeLag) to the master equation, to
// 0.01 in the ratio: a measurement, not a validation. It still checks that
// the intercept lag is the better of Kashchiev's two times above 10 k_BT
// (the characteristic time τ, π²/6 smaller, is 0.53 of the master
// equation's lag at 40 k_BT), and that Critical's nucleus is the chain's
// (n* to 1e-9).
func TestTimeLagMasterEquation(t *testing.T) {
	for _, c := range []struct{ nStar, barrier, ratio float64 }{
		{25, 10, 0.72}, {100, 40, 1.15}, {400, 160, 1.61},
	} {
		n, s := droplet(t, c.nStar, c.barrier)
		if !close(n.Size, c.nStar, 1e-9) {
			t.Fatalf("n* = %.12g, want %g", n.Size, c.nStar)
		}
		// the lag is an integral of the whole transient, which the
		// implicit steps keep at any step (TestTimeLagExact): half a
		// monomer attachment time gives the lag of a twentieth to 1e-6
		st, err := s.Integrate(60*cnt.TimeLag(n.Zeldovich, 2.0/3*math.Log(c.nStar)), 0.5)
		if err != nil {
			t.Fatal(err)
		}
		lag := st.TimeLag(int(c.nStar))
		theta := cnt.TimeLag(n.Zeldovich, 2.0/3*math.Log(c.nStar)) // β* = k⁺(n*) = n*^(2/3)
		if r := lag / theta; math.Abs(r-c.ratio) > 0.01 {
			t.Errorf("n* = %g, ΔG* = %g kT: master equation %.6g, θ %.6g: ratio %.4f, stated %.2f", c.nStar, c.barrier, lag, theta, r, c.ratio)
		}
		if tau := theta * 6 / (math.Pi * math.Pi); c.barrier > 10 && !(math.Abs(math.Log(lag/theta)) < math.Abs(math.Log(lag/tau))) {
			t.Errorf("n* = %g, ΔG* = %g kT: τ = %.6g is closer to the master equation %.6g than θ = %.6g", c.nStar, c.barrier, tau, lag, theta)
		}
		t.Logf("n* = %g, ΔG* = %g kT: master equation lag %.6g, θ = 2/(3π Z²β*) = %.6g (ratio %.4f), τ = %.6g",
			c.nStar, c.barrier, lag, theta, lag/theta, theta*6/(math.Pi*math.Pi))
	}
}

// capRate is ln J of a spherical-cap nucleus at contact angle θ for the
// gold nucleus of TestCriticalGold at ΔT = 230 K (Callister Example 10.1)
// or at a chosen undercooling, with a fixed site density and diffusivity:
// the parts of CNT this package provides, put together.
func capRate(theta, dmu, T float64) (lnJ, barrierKT float64) {
	const gamma, a = 0.132, 0.413e-9
	v := a * a * a / 4
	f := cnt.ShapeFactor(theta)
	n := cnt.Critical(dmu, gamma, v, f, T)
	lnBeta := cnt.LnAttachmentCap(math.Log(1e-9), n.Size, f, theta, math.Cbrt(v))
	return cnt.LnRate(math.Log(1e20), n.Zeldovich, lnBeta, n.Barrier, T), n.Barrier / (cnt.Boltzmann * T)
}

// TestAttachmentCapLimits: the cap attachment against the closed forms of
// its limits, derived by hand from β*_cap = β*(n*/f)·(1 − cos θ)/2 and
// Z = Z_hom/√f: θ = 180° is the homogeneous law exactly; at any θ the
// prefactor is Z·β* = Z_hom·β*_hom/√(2 + cos θ) (1/√2 at 90°, 1/√3 as
// θ → 0); the rate then differs from the homogeneous one by that factor and
// by exp((1 − f)·ΔG*_hom/k_BT).
func TestAttachmentCapLimits(t *testing.T) {
	lnD, jump := math.Log(1e-9), 0.3e-9
	if got, want := cnt.LnAttachmentCap(lnD, 500, 1, 180, jump), cnt.LnAttachment(lnD, 500, jump); got != want {
		t.Errorf("θ = 180°: %.17g, homogeneous %.17g", got, want)
	}
	const T, dmu = 1107.0, 1.16e9 * 0.413e-9 * 0.413e-9 * 0.413e-9 / 4 * 230 / 1337
	hom, bHom := capRate(180, dmu, T)
	for _, theta := range []float64{150, 90, 60, 15, 1, 1e-3, 1e-6} {
		got, b := capRate(theta, dmu, T)
		c := math.Cos(theta * math.Pi / 180)
		want := hom - 0.5*math.Log(2+c) + bHom - b
		if !close(got, want, 1e-12) {
			t.Errorf("θ = %g°: ln J = %.15g, closed form %.15g", theta, got, want)
		}
	}
}

// TestHeterogeneousRateRisesAsThetaFalls: at a fixed site density, J rises
// as the contact angle falls, from 180° to 1e-6°, on 3,000 angles spaced
// evenly in ln θ, for a barrier of B = 63 k_BT (gold at ΔT = 230 K) and of
// 404 k_BT (ΔT = 91 K). From the closed form of LnAttachmentCap, it rises
// step by step wherever B·sin²θ·(2 + cos θ) ≥ 2/3; at the two ends, where
// it does not, it never lies more than 1/(12·B) (near 180°) or 1/(108·B)
// (near 0°) below the largest value at larger angles: the maxima of the
// closed form to leading order in 1/B, whose next terms are of relative
// order 1/(3B) (the dips happen at 1 − cos θ ≈ 1/(9B) and 2/(3B)), so the
// bound is taken as (1 + 1/B) times the leading one. And the barrierless
// rate is the largest: J(1e-6°) above J(15°), J(90°), J(180°).
func TestHeterogeneousRateRisesAsThetaFalls(t *testing.T) {
	const T = 1107.0
	v := 0.413e-9 * 0.413e-9 * 0.413e-9 / 4
	for _, dT := range []float64{230, 91} {
		dmu := 1.16e9 * v * dT / 1337
		prev, B := capRate(180, dmu, T)
		top, rising := prev, true
		const n = 3000
		for i := 1; i <= n; i++ {
			theta := 180 * math.Exp(-float64(i)/n*math.Log(180/1e-6))
			lnJ, _ := capRate(theta, dmu, T)
			s, c := math.Sin(theta*math.Pi/180), math.Cos(theta*math.Pi/180)
			rises := B*s*s*(2+c) >= 2.0/3
			if rises && rising && lnJ < prev-1e-12*math.Abs(prev) {
				t.Errorf("B = %.0f: ln J falls from %.15g to %.15g at θ = %.4g°, where it must rise", B, prev, lnJ, theta)
				break
			}
			bound := (1 + 1/B) / (108 * B)
			if theta > 90 {
				bound = (1 + 1/B) / (12 * B)
			}
			if lnJ < top-bound {
				t.Errorf("B = %.0f: ln J = %.15g at θ = %.4g°, more than %.3g below %.15g", B, lnJ, theta, bound, top)
				break
			}
			prev, top, rising = lnJ, math.Max(top, lnJ), rises
		}
		j0, _ := capRate(1e-6, dmu, T)
		for _, theta := range []float64{15, 90, 180} {
			if j, _ := capRate(theta, dmu, T); !(j0 > j) {
				t.Errorf("B = %.0f: ln J(1e-6°) = %.6g not above ln J(%g°) = %.6g", B, j0, theta, j)
			}
		}
		lg := func(theta float64) float64 { j, _ := capRate(theta, dmu, T); return j / math.Ln10 }
		t.Logf("B = %.0f: log10 J = %.4f at 180°, %.4f at 174°, %.3f at 90°, %.3f at 15°, %.4f at 1°, %.4f at 1e-6°",
			B, lg(180), lg(174), lg(90), lg(15), lg(1), lg(1e-6))
	}
}

// TestSitesOnParticles: 1e18 particles per m³ of 1 µm² each, with
// molecules of 2.7e-29 m³ (v^(2/3) = 9e-20 m²) give 1e18·1e-12/9e-20 =
// 1.111e25 sites per m³ (by hand); bad input gives NaN.
func TestSitesOnParticles(t *testing.T) {
	if got := cnt.SitesOnParticles(1e18, 1e-12, 2.7e-29); !close(got, 1e18*1e-12/9e-20, 1e-12) {
		t.Errorf("sites = %g, want %g", got, 1e18*1e-12/9e-20)
	}
	for _, c := range [][3]float64{{0, 1, 1}, {1, -1, 1}, {1, 1, math.NaN()}, {math.Inf(1), 1, 1}} {
		if got := cnt.SitesOnParticles(c[0], c[1], c[2]); !math.IsNaN(got) {
			t.Errorf("SitesOnParticles(%v) = %g, want NaN", c, got)
		}
	}
}
