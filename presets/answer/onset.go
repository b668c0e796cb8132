package answer

import (
	"fmt"
	"math"

	"undercool/kinetics"
)

// Onset is where the first nucleus is expected in a sample on a path from
// T_e: null where fewer than one is expected on the whole path.
type Onset struct {
	T            Num `json:"onset_temperature_k"`
	Undercooling Num `json:"onset_undercooling_k"` // T_e − T
	Time         Num `json:"onset_time_s"`         // from the start of the path
	Expected     Num `json:"expected_nuclei"`      // on the whole path
}

// onsetNote says what an onset is.
const onsetNote = "onset: where the expected number of nuclei in the volume, V times the integral of J dt, reaches 1 (the sample is then unfrozen with probability 1/e)"

// onsetOf is an onset on a path from te: every description of an onset
// comes from it.
func onsetOf(o kinetics.Onset, te float64) *Onset {
	nan := Num(math.NaN())
	out := &Onset{nan, nan, nan, Num(o.Expected())}
	if o.Reached {
		out.T, out.Undercooling, out.Time = Num(o.Temp), Num(te-o.Temp), Num(o.Time)
	}
	return out
}

func (o *Onset) reached() bool { return o != nil && !math.IsNaN(float64(o.T)) }

// line is the summary line of the onset in a volume V (m³): on linear
// cooling at a rate, or ("") on a measured curve.
func (o *Onset) line(V float64, rate string) string {
	head, path, when := fmt.Sprintf("onset in %.4g m3", V), "curve", fmt.Sprintf(", %s into the curve", ReadableTime(float64(o.Time)))
	if rate != "" {
		head, path, when = head+" at "+rate, "path", " after "+ReadableTime(float64(o.Time))
	}
	if !o.reached() {
		return fmt.Sprintf("%s: none, %.3g nuclei expected on the whole %s", head, float64(o.Expected), path)
	}
	return fmt.Sprintf("%s: first nucleus expected at %.2f K (undercooling %.2f K)%s", head, float64(o.T), float64(o.Undercooling), when)
}

// cell is the onset in a memo's results table: the undercooling, where,
// and on a curve when.
func (o *Onset) cell(curve bool) string {
	if !o.reached() {
		return "none: fewer than one nucleus expected"
	}
	s := fmt.Sprintf("%.2f K, at %.2f K", float64(o.Undercooling), float64(o.T))
	if curve {
		s += ", " + ReadableTime(float64(o.Time)) + " into the curve"
	}
	return s
}
