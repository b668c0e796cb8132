package population

import (
	"fmt"
	"math"
	"sort"

	"undercool/kinetics"
)

// Class is one size class: particles of one size, and how many there are
// per cubic metre (of alloy, or of solvent for a crystallizer).
type Class struct {
	Size   float64 `json:"size_m"` // radius of a precipitate, characteristic length of a crystal, m
	Number float64 `json:"number_per_m3"`
}

// checkClasses validates classes given at the start.
func checkClasses(cs []Class) error {
	for i, c := range cs {
		if !(c.Size > 0) || math.IsInf(c.Size, 1) || !(c.Number > 0) || math.IsInf(c.Number, 1) {
			return fmt.Errorf("initial class %d: size and number must be positive and finite, got %g m and %g per m3", i+1, c.Size, c.Number)
		}
	}
	return nil
}

func splitClasses(cs []Class) (x, n []float64) {
	for _, c := range cs {
		x, n = append(x, c.Size), append(n, c.Number)
	}
	return x, n
}

func classesOf(x, n []float64) []Class {
	out := make([]Class, len(x))
	for i := range x {
		out[i] = Class{Size: x[i], Number: n[i]}
	}
	return out
}

// moments are the number and the number-weighted mean size of the
// classes (NaN mean where there are none).
func moments(x, n []float64) (num, mean float64) {
	var s float64
	for i := range x {
		num += n[i]
		s += n[i] * x[i]
	}
	if num == 0 {
		return 0, math.NaN()
	}
	return num, s / num
}

// Row holds what every run reports at one time. Non-finite values mean
// none (no nucleus: critical radius +Inf, log10 rate −Inf); the command
// line writes them as a dash or JSON null.
type Row struct {
	Time            float64 `json:"time_s"`
	Temperature     float64 `json:"temperature_k"`
	NumberDensity   float64 `json:"number_density_per_m3"`
	VolumeFraction  float64 `json:"volume_fraction"`
	Supersaturation float64 `json:"supersaturation"` // dissolved over equilibrium concentration
	Log10Rate       float64 `json:"log10_rate_per_m3_s"`
	CriticalRadius  float64 `json:"critical_radius_m"`
}

// commonRow is the Row of a sample, for particles of volume shape·x³, and
// the number-weighted mean size.
func commonRow(sm sample, shape float64) (Row, float64) {
	p := sm.p
	num, mean := moments(sm.x, sm.n)
	return Row{
		Time:            sm.t,
		Temperature:     p.T,
		NumberDensity:   num,
		VolumeFraction:  shape * cubeSum(sm.x, sm.n),
		Supersaturation: p.conc / p.eq,
		Log10Rate:       p.lnJ / math.Ln10,
		CriticalRadius:  p.crit,
	}, mean
}

// Summary is what every run reports beside its rows.
type Summary struct {
	Schedule    string  `json:"schedule"`
	Final       []Class `json:"final_distribution"` // the classes at the end
	Steps       int     `json:"steps"`
	PeakClasses int     `json:"peak_classes"`         // most classes at once (before merging)
	Balance     float64 `json:"solute_balance_error"` // the solute book at the end, relative to the total
}

func summarize(s kinetics.Schedule, last sample, e *engine, balance float64) Summary {
	return Summary{Schedule: s.String(), Final: classesOf(last.x, last.n), Steps: e.steps, PeakClasses: e.peak, Balance: balance}
}

// VolumeQuantile is the size below which the fraction q (0 < q < 1) of the
// particles' volume lies (q = 0.5: the volume median, D50). The classes
// are sorted by size; each stands at the middle of its share of the
// cumulative volume, and between classes the size is interpolated linearly
// in that cumulative share (below the first share or above the last, the
// end classes' sizes). NaN with no particles. This is the basis of laser
// diffraction, the usual measurement of a crystal size distribution.
func VolumeQuantile(cs []Class, q float64) float64 {
	if !(q > 0 && q < 1) {
		panic("population: VolumeQuantile: q must lie in (0, 1)")
	}
	if len(cs) == 0 {
		return math.NaN()
	}
	s := append([]Class(nil), cs...)
	sort.Slice(s, func(i, j int) bool { return s[i].Size < s[j].Size })
	var total float64
	for _, c := range s {
		total += c.Number * c.Size * c.Size * c.Size
	}
	if !(total > 0) {
		return math.NaN()
	}
	prevF, prevX := 0.0, s[0].Size
	var run float64
	for i, c := range s {
		w := c.Number * c.Size * c.Size * c.Size / total
		f := run + w/2
		run += w
		if q <= f {
			if i == 0 {
				return c.Size
			}
			return prevX + (q-prevF)/(f-prevF)*(c.Size-prevX)
		}
		prevF, prevX = f, c.Size
	}
	return s[len(s)-1].Size
}

// Bin is one bin of a histogram of the classes.
type Bin struct {
	Lo     float64 `json:"from_m"`
	Hi     float64 `json:"to_m"`
	Number float64 `json:"number_per_m3"`
}

// Histogram sorts the classes into k bins (k ≥ 1) of equal width in log
// size from the smallest to the largest class, for a plot or a table of
// the distribution. Nil with no particles.
func Histogram(cs []Class, k int) []Bin {
	if k < 1 {
		panic("population: Histogram: need at least one bin")
	}
	if len(cs) == 0 {
		return nil
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, c := range cs {
		lo, hi = math.Min(lo, c.Size), math.Max(hi, c.Size)
	}
	if hi == lo {
		lo, hi = lo*0.99, hi*1.01
	}
	bins := make([]Bin, k)
	step := math.Log(hi/lo) / float64(k)
	for i := range bins {
		bins[i].Lo = lo * math.Exp(step*float64(i))
		bins[i].Hi = lo * math.Exp(step*float64(i+1))
	}
	bins[k-1].Hi = hi
	for _, c := range cs {
		i := int(math.Log(c.Size/lo) / step)
		i = max(0, min(i, k-1))
		bins[i].Number += c.Number
	}
	return bins
}
