package beckerdoring

import (
	"math"
	"testing"
)

// testSystem is a droplet of our own with a critical size n* = 100 and a
// barrier ΔG* − ΔG(1) of about 35 k_BT: a = 3·40/100^(2/3), dmu =
// 2a/(3·100^(1/3)) (so that ΔG* = a·n*^(2/3)/3 = 40 k_BT), sizes to 300.
func testSystem(t testing.TB) *System {
	a := 120 / math.Pow(100, 2.0/3)
	s, err := CNT(2*a/(3*math.Cbrt(100)), a, 300)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestSteadyState: integrated long enough (60 time lags), the flux through
// every size equals the exact steady flux of the chain (Steady) to 1e-7,
// which checks the two against each other. The flux is the difference of a
// forward and a backward rate; below the critical size both exceed it by
// many decades and the difference keeps only 16 − log10(k⁺f/J) digits, so
// sizes are checked where k⁺(n)·f(n) is within 10⁶ of J.
func TestSteadyState(t *testing.T) {
	s := testSystem(t)
	st, err := s.Integrate(1500, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	J := s.Steady()
	checked := 0
	for n := 1; n <= s.Size(); n++ {
		if s.plus[n]*st.F(n) > 1e6*J {
			continue
		}
		checked++
		if d := st.Flux(n)/J - 1; !(math.Abs(d) <= 1e-7) {
			t.Errorf("J(%d) = %.10g, steady %.10g (%+.2g)", n, st.Flux(n), J, d)
		}
	}
	if checked < 100 {
		t.Errorf("only %d sizes checked", checked)
	}
}

// TestBookkeeping: the clusters that passed m, less those that passed the
// last size, are the clusters now larger than m (to rounding: the running
// integrals are advanced by the same formula as the concentrations).
func TestBookkeeping(t *testing.T) {
	s := testSystem(t)
	st, err := s.Integrate(60, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range []int{1, 50, 100, 200} {
		var above float64
		for n := m + 1; n <= s.Size(); n++ {
			above += st.F(n)
		}
		got := st.Passed(m) - st.Passed(s.Size())
		if math.Abs(got-above) > 1e-12*math.Max(above, st.Passed(m)) {
			t.Errorf("m = %d: passed m less passed N = %.15g, clusters above m = %.15g", m, got, above)
		}
	}
}

// TestTransientConverges: the flux at n* during the transient (at t = 25,
// about one time lag) converges at second order in the step: the
// differences between steps 0.1, 0.05 and 0.025 fall by 4 (3.5 to 4.5).
// The error at a step, against the Richardson extrapolation, is logged
// (2.6e-5 at 0.05): a caller choosing a step for a transient reads it here.
func TestTransientConverges(t *testing.T) {
	s := testSystem(t)
	flux := func(dt float64) float64 {
		st, err := s.Integrate(25, dt)
		if err != nil {
			t.Fatal(err)
		}
		return st.Flux(100)
	}
	a, b, c := flux(0.1), flux(0.05), flux(0.025)
	if r := (a - b) / (b - c); !(r > 3.5 && r < 4.5) {
		t.Errorf("J(n*, 25) = %.12g, %.12g, %.12g: error ratio %.3g, want about 4", a, b, c, r)
	}
	rich := c + (c-b)/3
	t.Logf("J(n*, 25): error %.2g at dt = 0.1, %.2g at 0.05, %.2g at 0.025", a/rich-1, b/rich-1, c/rich-1)
}

// exactLag is the reference for the time lag: for the linear chain
// f' = A·f + b from f(0) = 0, ∫₀^∞ (f − f_s) dt = A⁻¹·f_s, so the time lag of
// the clusters past n is −(k⁺(n)·y(n) − k⁻(n+1)·y(n+1))/J with A·y = f_s:
// the time lag from the steady state alone (the route of Wu D.T., The time
// lag in transient nucleation, MRS Proc. (1992), from its abstract). Solved
// here with dense Gaussian elimination, not the package's tridiagonal one.
func exactLag(s *System, n int) float64 {
	N := s.n
	m := N - 1 // unknowns f(2) … f(N) at rows 0 … m−1
	A := make([][]float64, m)
	for i := range A {
		A[i] = make([]float64, m)
		k := i + 2
		A[i][i] = -(s.minus[k] + s.plus[k])
		if i > 0 {
			A[i][i-1] = s.plus[k-1]
		}
		if k < N {
			A[i][i+1] = s.minus[k+1]
		}
	}
	solve := func(rhs []float64) []float64 {
		a := make([][]float64, m)
		x := append([]float64(nil), rhs...)
		for i := range a {
			a[i] = append([]float64(nil), A[i]...)
		}
		for c := 0; c < m; c++ {
			p := c
			for r := c + 1; r < m; r++ {
				if math.Abs(a[r][c]) > math.Abs(a[p][c]) {
					p = r
				}
			}
			a[c], a[p], x[c], x[p] = a[p], a[c], x[p], x[c]
			for r := c + 1; r < m; r++ {
				w := a[r][c] / a[c][c]
				for j := c; j < m; j++ {
					a[r][j] -= w * a[c][j]
				}
				x[r] -= w * x[c]
			}
		}
		for r := m - 1; r >= 0; r-- {
			for j := r + 1; j < m; j++ {
				x[r] -= a[r][j] * x[j]
			}
			x[r] /= a[r][r]
		}
		return x
	}
	b := make([]float64, m)
	b[0] = -s.plus[1] // A·f_s = −b, b(2) = k⁺(1)·f(1)
	fs := solve(b)
	y := solve(fs)
	at := func(k int) float64 { // y(k), 0 beyond N and at 1
		if k < 2 || k > N {
			return 0
		}
		return y[k-2]
	}
	jn := s.plus[n]*at(n) - s.minus[n+1]*at(n+1)
	if n == N {
		jn = s.plus[n] * at(n)
	}
	return -jn / s.Steady()
}

// TestTimeLagExact: the time lag of the clusters past n* from the
// integration (60 time lags) against the reference from the steady state
// alone (exactLag). The two are the same number by two routes (the
// backward-difference steps conserve the integral of the transient), so
// the tolerance is 1e-8, what the decay of the transient by t = 1500 and
// the two linear solves leave.
func TestTimeLagExact(t *testing.T) {
	s := testSystem(t)
	st, err := s.Integrate(1500, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	for _, n := range []int{100, 150, 250} {
		got, want := st.TimeLag(n), exactLag(s, n)
		if d := got/want - 1; !(math.Abs(d) <= 1e-8) {
			t.Errorf("n = %d: lag %.12g, reference %.12g (%+.2g)", n, got, want, d)
		}
		t.Logf("n = %d: lag %.10f, reference %.10f", n, got, want)
	}
}

// TestTrace: the flux Trace reports after the last step is the flux of the
// state Integrate returns, step by step the same solution; a size outside
// the chain is an error.
func TestTrace(t *testing.T) {
	s := testSystem(t)
	times, flux, err := s.Trace(150, 30, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	st, err := s.Integrate(30, 0.05)
	if err != nil {
		t.Fatal(err)
	}
	n := len(flux)
	if n != 600 || math.Abs(times[n-1]-30) > 1e-9 || flux[n-1] != st.Flux(150) {
		t.Errorf("%d steps to %.12g: last flux %.15g, Integrate %.15g", n, times[n-1], flux[n-1], st.Flux(150))
	}
	for i := 1; i < n; i++ {
		if !(flux[i] >= flux[i-1]) {
			t.Errorf("flux past 150 falls at step %d: %g then %g", i, flux[i-1], flux[i])
			break
		}
	}
	if _, _, err := s.Trace(0, 1, 0.1); err == nil {
		t.Error("size 0: no error")
	}
	if _, _, err := s.Trace(s.Size()+1, 1, 0.1); err == nil {
		t.Error("size N+1: no error")
	}
}

func TestBadInput(t *testing.T) {
	if _, err := CNT(0, 1, 100); err == nil {
		t.Error("dmu = 0: no error")
	}
	if _, err := CNT(1, 1, 2); err == nil {
		t.Error("N = 2: no error")
	}
	if _, err := New(func(int) float64 { return math.NaN() }, func(int) float64 { return 0 }, 10); err == nil {
		t.Error("k+ NaN: no error")
	}
	s := testSystem(t)
	for _, c := range [][2]float64{{0, 1}, {1, 0}, {math.Inf(1), 1}, {1e9, 1e-9}} {
		if _, err := s.Integrate(c[0], c[1]); err == nil {
			t.Errorf("Integrate(%g, %g): no error", c[0], c[1])
		}
	}
}
