package sample

import (
	"encoding/binary"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/stat"

	"undercool/kinetics"
)

// Output names one headline result of a sample.
type Output struct {
	Key string // JSON key ending in its unit: "nose_time_s", "log10_rate_per_m3_s"
	// Log: the result is a positive quantity that spans decades (a time, a
	// rate) and its sensitivity is given in decades, log10(r/r0); otherwise
	// in the result's own unit (K for a temperature, decades for a log10).
	Log bool
}

// Eval computes the headline results of one sample in the order of the
// outputs: NaN where the sample has no answer, +Inf for "never". It is
// called from several goroutines at once and must not share mutable state.
type Eval func(md *kinetics.Model) ([]float64, error)

// MonteCarlo is a sampling run: the spreads of the inputs (drawn
// independently of each other), how a model is built from them, the
// headline results and how to compute them.
type MonteCarlo struct {
	Spreads []Spread
	// Build returns the model with the inputs at the values x, one per
	// spread in order. An x[k] equal to Spreads[k].Base leaves that input
	// as the base model has it: all at their bases is the base model. It is
	// called from several goroutines at once.
	Build   func(x []float64) (*kinetics.Model, error)
	Outputs []Output
	Eval    Eval
	Samples int    // ≥ 1
	Seed    uint64 // the same seed gives the same samples, bit for bit, on any number of cores
	Workers int    // goroutines; 0 means runtime.GOMAXPROCS(0)
	// Progress, when not nil, is called after each block of samples with
	// the number done so far, from the worker goroutines.
	Progress func(done, total int)
}

// blockSize is the number of samples drawn from one random stream. Block b
// of a run with seed S holds samples b·blockSize to (b+1)·blockSize − 1 and
// draws them from a ChaCha8 stream keyed by (S, b), so the goroutine that
// runs a block does not change a bit of the results.
const blockSize = 64

// maxRedraws bounds the draws in a row of one parameter of one sample
// that may fall outside its range before the spread is declared too wide.
const maxRedraws = 100

// QuantileDefinition says how P5, P50 and P95 are read from the samples.
const QuantileDefinition = "empirical quantile (gonum stat.Empirical): the smallest sample value with at least the fraction p of the samples at or below it"

// Percentiles is the spread of one headline result over the samples.
type Percentiles struct {
	P5, P50, P95 float64
	Missing      int // samples without an answer (NaN), left out of the quantiles
}

// Effect is the change of a headline result for −1σ and +1σ of one spread
// parameter alone, the others at their base values: in decades for a Log
// output, in the output's unit otherwise. NaN where ±1σ leaves the
// parameter's range or the result has no finite answer there.
type Effect struct {
	Key         string
	Minus, Plus float64
}

// Size is the larger of |Minus| and |Plus|, the ranking key; NaN counts as 0.
func (e Effect) Size() float64 {
	m, p := math.Abs(e.Minus), math.Abs(e.Plus)
	if math.IsNaN(m) {
		m = 0
	}
	if math.IsNaN(p) {
		p = 0
	}
	return math.Max(m, p)
}

// SpreadUse is a spread as a run used it.
type SpreadUse struct {
	Spread
	Redrawn int // draws outside the input's range that were drawn again
}

// Uncertainty is the outcome of a MonteCarlo run.
type Uncertainty struct {
	Samples     int
	Seed        uint64
	Spreads     []SpreadUse
	Outputs     []Output
	Base        []float64     // the results of the base model
	Bands       []Percentiles // per output
	Sensitivity [][]Effect    // per output, one per spread, largest effect first
	Values      [][]float64   // Values[i][k]: output k of sample i
}

// Run draws the samples on all workers and summarizes them. A draw outside
// an input's range (a negative γ, θ above 180°) is drawn again, so the
// distribution is truncated there; SpreadUse.Redrawn counts these.
//
// Errors: a negative or non-finite σ, a base or sample model that Build
// rejects, a spread so wide that its draws keep leaving the range, an
// error of Eval (that of the lowest sample index, so the message too is
// the same on any number of cores).
func (mc *MonteCarlo) Run() (*Uncertainty, error) {
	if mc.Samples < 1 {
		panic("sample: MonteCarlo: Samples must be at least 1")
	}
	if mc.Build == nil || mc.Eval == nil || len(mc.Outputs) == 0 {
		panic("sample: MonteCarlo: no Build, no Eval or no Outputs")
	}
	u := &Uncertainty{Samples: mc.Samples, Seed: mc.Seed, Outputs: mc.Outputs}
	for _, s := range mc.Spreads {
		if !(s.SD >= 0) || math.IsInf(s.SD, 1) {
			return nil, fmt.Errorf("%s: the standard deviation must be finite and not negative, got %g", s.Key, s.SD)
		}
		u.Spreads = append(u.Spreads, SpreadUse{Spread: s})
	}
	base, err := mc.evalAt(mc.bases())
	if err != nil {
		return nil, err
	}
	u.Base = base
	if err := mc.sample(u); err != nil {
		return nil, err
	}
	u.Bands = bands(u.Values, len(mc.Outputs))
	u.Sensitivity = mc.sensitivity(u)
	return u, nil
}

// bases is every input at its base value.
func (mc *MonteCarlo) bases() []float64 {
	x := make([]float64, len(mc.Spreads))
	for k, s := range mc.Spreads {
		x[k] = s.Base
	}
	return x
}

// evalAt builds the model of the inputs x and evaluates the outputs.
func (mc *MonteCarlo) evalAt(x []float64) ([]float64, error) {
	md, err := mc.Build(x)
	if err != nil {
		return nil, err
	}
	out, err := mc.Eval(md)
	if err != nil {
		return nil, err
	}
	if len(out) != len(mc.Outputs) {
		panic(fmt.Sprintf("sample: MonteCarlo: Eval returned %d results for %d outputs", len(out), len(mc.Outputs)))
	}
	return out, nil
}

// blockStream is the random stream of block b of a run with seed.
func blockStream(seed uint64, b int) *rand.Rand {
	var key [32]byte
	copy(key[:8], "undercMC")
	binary.LittleEndian.PutUint64(key[8:], seed)
	binary.LittleEndian.PutUint64(key[16:], uint64(b))
	return rand.New(rand.NewChaCha8(key))
}

// sample fills u.Values and the redraw counts.
func (mc *MonteCarlo) sample(u *Uncertainty) error {
	n, nOut := mc.Samples, len(mc.Outputs)
	nb := (n + blockSize - 1) / blockSize
	workers := mc.Workers
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, nb)
	u.Values = make([][]float64, n)
	flat := make([]float64, n*nOut)
	for i := range u.Values {
		u.Values[i] = flat[i*nOut : (i+1)*nOut : (i+1)*nOut]
	}
	redrawn := make([][]int, nb) // per block, per spread; summed in block order
	errs := make([]error, nb)
	var next, done atomic.Int64
	var firstBad atomic.Int64 // lowest failing block so far; blocks above it are skipped
	firstBad.Store(int64(nb))
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				b := int(next.Add(1) - 1)
				if b >= nb {
					return
				}
				if int64(b) > firstBad.Load() {
					continue
				}
				redrawn[b] = make([]int, len(u.Spreads))
				if err := mc.block(u, b, redrawn[b]); err != nil {
					errs[b] = err
					for cur := firstBad.Load(); int64(b) < cur && !firstBad.CompareAndSwap(cur, int64(b)); cur = firstBad.Load() {
					}
				}
				d := done.Add(int64(min(blockSize, n-b*blockSize)))
				if mc.Progress != nil {
					mc.Progress(int(d), n)
				}
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	for _, r := range redrawn {
		for k := range r {
			u.Spreads[k].Redrawn += r[k]
		}
	}
	return nil
}

// block draws and evaluates the samples of block b. Each sample takes one
// standard normal number per spread, in the order of the spreads, plus
// one more for each draw that fell outside the input's range.
func (mc *MonteCarlo) block(u *Uncertainty, b int, redrawn []int) error {
	rng := blockStream(mc.Seed, b)
	lo, hi := b*blockSize, min((b+1)*blockSize, mc.Samples)
	x := make([]float64, len(u.Spreads))
	for i := lo; i < hi; i++ {
		for k, s := range u.Spreads {
			v := s.value(rng.NormFloat64())
			for tries := 0; !s.Range.Contains(v); tries++ {
				if tries == maxRedraws {
					return fmt.Errorf("%s: the spread is too wide: %d draws in a row fell outside %s; give a smaller standard deviation", s.Key, maxRedraws, s.Range)
				}
				redrawn[k]++
				v = s.value(rng.NormFloat64())
			}
			x[k] = v
		}
		out, err := mc.evalAt(x)
		if err != nil {
			return fmt.Errorf("sample %d: %w", i+1, err)
		}
		copy(u.Values[i], out)
	}
	return nil
}

// bands reads P5, P50 and P95 of each output from the samples, leaving out
// those without an answer; ±Inf ("never") take part.
func bands(values [][]float64, nOut int) []Percentiles {
	out := make([]Percentiles, nOut)
	col := make([]float64, 0, len(values))
	for k := range out {
		col = col[:0]
		for _, v := range values {
			if !math.IsNaN(v[k]) {
				col = append(col, v[k])
			}
		}
		out[k].Missing = len(values) - len(col)
		if len(col) == 0 {
			out[k].P5, out[k].P50, out[k].P95 = math.NaN(), math.NaN(), math.NaN()
			continue
		}
		sort.Float64s(col)
		out[k].P5 = stat.Quantile(0.05, stat.Empirical, col, nil)
		out[k].P50 = stat.Quantile(0.50, stat.Empirical, col, nil)
		out[k].P95 = stat.Quantile(0.95, stat.Empirical, col, nil)
	}
	return out
}

// change is the effect of moving a result from r0 to r; NaN when either
// has no finite answer.
func change(o Output, r0, r float64) float64 {
	d := r - r0
	if o.Log {
		d = math.Log10(r / r0)
	}
	if math.IsInf(d, 0) {
		return math.NaN()
	}
	return d
}

// sensitivity evaluates each spread input at ±1σ alone and ranks them.
func (mc *MonteCarlo) sensitivity(u *Uncertainty) [][]Effect {
	out := make([][]Effect, len(mc.Outputs))
	for k := range out {
		out[k] = make([]Effect, len(u.Spreads))
	}
	for j, s := range u.Spreads {
		var at [2][]float64
		for side, z := range []float64{-1, 1} {
			x := mc.bases()
			x[j] = s.value(z)
			if !s.Range.Contains(x[j]) {
				continue
			}
			if r, err := mc.evalAt(x); err == nil {
				at[side] = r
			}
		}
		for k, o := range mc.Outputs {
			e := Effect{Key: s.Key, Minus: math.NaN(), Plus: math.NaN()}
			if at[0] != nil {
				e.Minus = change(o, u.Base[k], at[0][k])
			}
			if at[1] != nil {
				e.Plus = change(o, u.Base[k], at[1][k])
			}
			out[k][j] = e
		}
	}
	for k := range out {
		sort.SliceStable(out[k], func(a, b int) bool { return out[k][a].Size() > out[k][b].Size() })
	}
	return out
}
