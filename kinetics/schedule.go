package kinetics

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strings"
)

// A Schedule is a thermal history T(t) made of straight pieces between
// break points: holds, ramps at a rate or over a time, instant jumps, or a
// measured curve. Between two break points the temperature is linear in
// time; two break points at the same time are a jump (the temperature
// changes with no time spent between).
//
// A schedule is written as steps, one per line or separated by ";", with
// "#" starting a comment:
//
//	start at TEMP                    where the schedule begins
//	hold DURATION                    stay where it is
//	hold DURATION at TEMP            the same, saying where (as a first step: start there)
//	cool to TEMP at RATE             a linear ramp down at RATE (K/s, K/min, C/min, ...)
//	cool to TEMP in DURATION         a linear ramp down taking DURATION
//	heat to TEMP at RATE             a linear ramp up
//	heat to TEMP in DURATION
//	jump to TEMP                     an instant change (a part dropped into a bath)
//
// for example "start at 640C; hold 1h; cool to 20C at 50K/s; jump to 300C;
// hold 24h", or "hold 100h at 573K". The first step must say where the
// schedule starts; a cool must go down and a heat up; a hold at a
// temperature other than the current one is refused (write the jump or the
// ramp that gets there). Words are read case-blind; quantities are read by
// the caller's ReadQuantity, so that a temperature or a rate means the same
// in a schedule as anywhere else in the program.
type Schedule struct {
	Time  []float64 // s, non-decreasing from 0 (a measured curve keeps its own times)
	Temp  []float64 // K, one per time
	Steps []Step    // the steps as read, in order
}

// StepKind names a step of a schedule.
type StepKind int

const (
	StepStart StepKind = iota
	StepHold
	StepCool
	StepHeat
	StepJump
	StepCurve // a measured T(t) curve
)

var stepNames = [...]string{"start", "hold", "cool", "heat", "jump", "curve"}

func (k StepKind) String() string { return stepNames[k] }

// Step is one step of a schedule: what was written, and where it leads.
type Step struct {
	Kind       StepKind
	Text       string  // as written (for a curve, its label)
	From, To   float64 // K
	Start, End float64 // s
}

// Quantity is what a word of a schedule stands for.
type Quantity int

const (
	QuantityTemperature Quantity = iota // K
	QuantityDuration                    // s
	QuantityRate                        // K/s
)

var quantityNames = [...]string{"temperature", "duration", "rate"}

func (q Quantity) String() string { return quantityNames[q] }

// ReadQuantity reads one quantity written with its unit ("640C", "1.5 h",
// "0.2K/min") and returns its SI value (K, s, K/s). The command line passes
// its unit parser.
type ReadQuantity func(word string, q Quantity) (float64, error)

// ScheduleError is a step of a schedule that cannot be read, by its number
// from 1 and its text.
type ScheduleError struct {
	Step int
	Text string
	Err  error
}

func (e *ScheduleError) Error() string {
	return fmt.Sprintf("schedule step %d %q: %v", e.Step, e.Text, e.Err)
}

func (e *ScheduleError) Unwrap() error { return e.Err }

// ErrScheduleSyntax is wrapped by every error about the form of a step; the
// message lists the steps allowed.
var ErrScheduleSyntax = errors.New("a step is one of: start at TEMP; hold DURATION [at TEMP]; cool to TEMP at RATE|in DURATION; heat to TEMP at RATE|in DURATION; jump to TEMP")

// ErrEmptySchedule is returned for a schedule in which no time passes.
var ErrEmptySchedule = errors.New("the schedule has no duration: give at least one hold, cool or heat step")

// stepWords is a step split into its verb, the quantity written right
// after it, and the quantities after the keywords at, to and in.
type stepWords struct {
	verb  string
	bare  string
	after map[string]string
}

// splitStep reads the words of one step. Quantities may contain spaces
// ("20 C"): everything between two keywords is one quantity.
func splitStep(s string) (stepWords, error) {
	f := strings.Fields(s)
	w := stepWords{verb: strings.ToLower(f[0]), after: map[string]string{}}
	key := ""
	var val []string
	flush := func() error {
		v := strings.Join(val, " ")
		switch {
		case key == "" && v != "":
			w.bare = v
		case key != "" && v == "":
			return fmt.Errorf("%q needs a value after it", key)
		case key != "":
			if _, dup := w.after[key]; dup {
				return fmt.Errorf("%q is given twice", key)
			}
			w.after[key] = v
		}
		val = nil
		return nil
	}
	for _, word := range f[1:] {
		switch lw := strings.ToLower(word); lw {
		case "at", "to", "in":
			if err := flush(); err != nil {
				return w, err
			}
			key = lw
		default:
			val = append(val, word)
		}
	}
	return w, flush()
}

// only reports an error unless the step has exactly the keywords wanted
// (and a bare quantity only when bare is true).
func (w stepWords) only(bare bool, keys ...string) error {
	if bare != (w.bare != "") {
		return ErrScheduleSyntax
	}
	if len(w.after) != len(keys) {
		return ErrScheduleSyntax
	}
	for _, k := range keys {
		if _, ok := w.after[k]; !ok {
			return ErrScheduleSyntax
		}
	}
	return nil
}

// ParseSchedule reads a schedule written in the steps described at
// Schedule. Errors are *ScheduleError, naming the step and what is allowed.
func ParseSchedule(text string, read ReadQuantity) (Schedule, error) {
	if read == nil {
		panic("kinetics: ParseSchedule: no quantity reader")
	}
	var b scheduleBuilder
	n := 0
	for _, line := range strings.Split(text, "\n") {
		if i := strings.IndexByte(line, '#'); i >= 0 {
			line = line[:i]
		}
		for _, step := range strings.Split(line, ";") {
			step = strings.TrimSpace(step)
			if step == "" {
				continue
			}
			n++
			if err := b.step(step, read); err != nil {
				return Schedule{}, &ScheduleError{Step: n, Text: step, Err: err}
			}
		}
	}
	if b.s.Duration() == 0 || len(b.s.Time) < 2 {
		return Schedule{}, ErrEmptySchedule
	}
	return b.s, nil
}

type scheduleBuilder struct {
	s Schedule
}

func (b *scheduleBuilder) started() bool { return len(b.s.Time) > 0 }

func (b *scheduleBuilder) now() (t, T float64) {
	n := len(b.s.Time)
	return b.s.Time[n-1], b.s.Temp[n-1]
}

func (b *scheduleBuilder) point(t, T float64) {
	b.s.Time = append(b.s.Time, t)
	b.s.Temp = append(b.s.Temp, T)
}

// positive reads a quantity that must be positive and finite.
func positiveQuantity(read ReadQuantity, word string, q Quantity) (float64, error) {
	x, err := read(word, q)
	if err != nil {
		return 0, err
	}
	if !(x > 0) || math.IsInf(x, 1) {
		return 0, fmt.Errorf("the %s %q must be positive", q, word)
	}
	return x, nil
}

// sameTemp is the tolerance within which two temperatures of a schedule
// are one (K): what rounding leaves of a value written in °C or °F.
const sameTemp = 1e-9

var errNotStarted = errors.New("the schedule must first say where it starts: begin with 'start at TEMP' or 'hold DURATION at TEMP'")

// from is where a ramp or a jump starts (time and temperature) and the
// target it goes to.
func (b *scheduleBuilder) from(temp func(string) (float64, error)) (t, T, target float64, err error) {
	if !b.started() {
		return 0, 0, 0, errNotStarted
	}
	if target, err = temp("to"); err != nil {
		return 0, 0, 0, err
	}
	t, T = b.now()
	return t, T, target, nil
}

func (b *scheduleBuilder) step(text string, read ReadQuantity) error {
	w, err := splitStep(text)
	if err != nil {
		return fmt.Errorf("%v; %w", err, ErrScheduleSyntax)
	}
	temp := func(key string) (float64, error) { return positiveQuantity(read, w.after[key], QuantityTemperature) }
	switch w.verb {
	case "start":
		if w.bare != "" && len(w.after) == 0 {
			w.after["at"], w.bare = w.bare, ""
		}
		if err := w.only(false, "at"); err != nil {
			return err
		}
		if b.started() {
			return errors.New("start may only be the first step (use jump to TEMP for an instant change)")
		}
		T, err := temp("at")
		if err != nil {
			return err
		}
		b.point(0, T)
		b.s.Steps = append(b.s.Steps, Step{Kind: StepStart, Text: text, From: T, To: T})
	case "hold":
		_, hasAt := w.after["at"]
		keys := []string{}
		if hasAt {
			keys = append(keys, "at")
		}
		if err := w.only(true, keys...); err != nil {
			return err
		}
		d, err := positiveQuantity(read, w.bare, QuantityDuration)
		if err != nil {
			return err
		}
		if hasAt {
			T, err := temp("at")
			if err != nil {
				return err
			}
			if !b.started() {
				b.point(0, T)
			} else if _, now := b.now(); math.Abs(T-now) > sameTemp {
				return fmt.Errorf("the schedule is at %.6g K here, not %.6g K: write 'jump to %s' (instant) or a cool or heat step first", now, T, w.after["at"])
			}
		}
		if !b.started() {
			return errNotStarted
		}
		t, T := b.now()
		b.point(t+d, T)
		b.s.Steps = append(b.s.Steps, Step{Kind: StepHold, Text: text, From: T, To: T, Start: t, End: t + d})
	case "cool", "heat":
		var err error
		if w.only(false, "to", "at") != nil {
			err = w.only(false, "to", "in")
		}
		if err != nil {
			return err
		}
		t, T, target, err := b.from(temp)
		if err != nil {
			return err
		}
		down := w.verb == "cool"
		if down && !(target < T-sameTemp) || !down && !(target > T+sameTemp) {
			dir := "below"
			if !down {
				dir = "above"
			}
			return fmt.Errorf("%s to %.6g K: the target must lie %s the current %.6g K", w.verb, target, dir, T)
		}
		var d float64
		if r, ok := w.after["at"]; ok {
			rate, err := positiveQuantity(read, r, QuantityRate)
			if err != nil {
				return err
			}
			d = math.Abs(target-T) / rate
		} else if d, err = positiveQuantity(read, w.after["in"], QuantityDuration); err != nil {
			return err
		}
		if !(d > 0) || math.IsInf(d, 1) || t+d == t {
			return fmt.Errorf("the ramp takes %g s, which is no time or no number", d)
		}
		b.point(t+d, target)
		kind := StepCool
		if !down {
			kind = StepHeat
		}
		b.s.Steps = append(b.s.Steps, Step{Kind: kind, Text: text, From: T, To: target, Start: t, End: t + d})
	case "jump":
		if err := w.only(false, "to"); err != nil {
			return err
		}
		t, T, target, err := b.from(temp)
		if err != nil {
			return err
		}
		if math.Abs(target-T) <= sameTemp {
			return fmt.Errorf("the schedule is already at %.6g K", T)
		}
		b.point(t, target)
		b.s.Steps = append(b.s.Steps, Step{Kind: StepJump, Text: text, From: T, To: target, Start: t, End: t})
	default:
		return fmt.Errorf("unknown step %q; %w", w.verb, ErrScheduleSyntax)
	}
	return nil
}

// ScheduleFromCurve makes a schedule of a measured temperature history:
// times in s, strictly increasing, temperatures in K, positive (the checks
// of NewPath; errors are its *PointError). The label names the curve in
// output (a file name).
func ScheduleFromCurve(time, temp []float64, label string) (Schedule, error) {
	p, err := NewPath(time, temp)
	if err != nil {
		return Schedule{}, err
	}
	n := len(p.Time)
	s := Schedule{Time: append([]float64(nil), p.Time...), Temp: append([]float64(nil), p.Temp...)}
	s.Steps = []Step{{Kind: StepCurve, Text: label, From: p.Temp[0], To: p.Temp[n-1], Start: p.Time[0], End: p.Time[n-1]}}
	return s, nil
}

// Start is the time the schedule starts, s.
func (s Schedule) Start() float64 { return s.Time[0] }

// End is the time the schedule ends, s.
func (s Schedule) End() float64 { return s.Time[len(s.Time)-1] }

// Duration is the time the schedule lasts, s (0 for an empty schedule).
func (s Schedule) Duration() float64 {
	if len(s.Time) == 0 {
		return 0
	}
	return s.End() - s.Start()
}

// At is the temperature at time t (K): linear between break points, the
// temperature after a jump at the time of the jump, the first or last
// temperature outside the schedule.
func (s Schedule) At(t float64) float64 {
	n := len(s.Time)
	if t < s.Time[0] {
		return s.Temp[0]
	}
	if t >= s.Time[n-1] {
		return s.Temp[n-1]
	}
	i := sort.Search(n, func(i int) bool { return s.Time[i] > t }) - 1 // last break at or before t
	f := (t - s.Time[i]) / (s.Time[i+1] - s.Time[i])
	return s.Temp[i] + f*(s.Temp[i+1]-s.Temp[i])
}

// Before is the temperature just before time t (K): the same as At except
// at a jump, where it is the temperature the jump starts from. A step that
// ends at t uses it.
func (s Schedule) Before(t float64) float64 {
	n := len(s.Time)
	i := sort.SearchFloat64s(s.Time, t) // first break at or after t
	switch {
	case i == 0:
		return s.Temp[0]
	case i == n:
		return s.Temp[n-1]
	case s.Time[i] == t:
		return s.Temp[i]
	}
	f := (t - s.Time[i-1]) / (s.Time[i] - s.Time[i-1])
	return s.Temp[i-1] + f*(s.Temp[i]-s.Temp[i-1])
}

// Breaks are the distinct times of the break points, ascending (s).
func (s Schedule) Breaks() []float64 {
	var out []float64
	for i, t := range s.Time {
		if i == 0 || t > s.Time[i-1] {
			out = append(out, t)
		}
	}
	return out
}

// Span is the lowest and highest temperature of the schedule (K).
func (s Schedule) Span() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, T := range s.Temp {
		lo, hi = math.Min(lo, T), math.Max(hi, T)
	}
	return lo, hi
}

// String is the schedule as read: its steps joined by "; ".
func (s Schedule) String() string {
	texts := make([]string, len(s.Steps))
	for i, st := range s.Steps {
		texts[i] = st.Text
	}
	return strings.Join(texts, "; ")
}

// ErrScheduleJump is returned where a schedule with an instant jump is
// asked for a path: a path spends time at every temperature it lists.
var ErrScheduleJump = errors.New("the schedule has an instant jump, which a path integral cannot follow: write it as a cool or heat step")

// Path is the schedule as a Path for the path integrals (Along, AlongPath,
// AnalyzeCurve, Additivity, Quench, OnsetAlong): its break points, as they
// are. The integrals take a path as straight in T(t) between its points and
// integrate each ramp, hold or heating step to their tolerance (pathint.go),
// so a ramp needs no points inside it: Path and Sample give the same numbers
// (TestSchedulePathSample). A schedule with a jump gives ErrScheduleJump.
func (s Schedule) Path() (Path, error) {
	for i := 1; i < len(s.Time); i++ {
		if !(s.Time[i] > s.Time[i-1]) {
			return Path{}, fmt.Errorf("%w (at %g s, %g K to %g K)", ErrScheduleJump, s.Time[i-1], s.Temp[i-1], s.Temp[i])
		}
	}
	return Path{Time: append([]float64(nil), s.Time...), Temp: append([]float64(nil), s.Temp...)}, nil
}

// Sample is Path with every ramp also cut into pieces of at most maxDT
// kelvin (> 0): points along the schedule for a table or a figure. The
// path integrals need none of them. A schedule with a jump gives
// ErrScheduleJump.
func (s Schedule) Sample(maxDT float64) (Path, error) {
	if !(maxDT > 0) {
		panic("kinetics: Schedule.Sample: maxDT must be positive")
	}
	b, err := s.Path()
	if err != nil {
		return Path{}, err
	}
	p := Path{Time: []float64{b.Time[0]}, Temp: []float64{b.Temp[0]}}
	for i := 1; i < len(b.Time); i++ {
		t0, t1, T0, T1 := b.Time[i-1], b.Time[i], b.Temp[i-1], b.Temp[i]
		n := max(int(math.Ceil(math.Abs(T1-T0)/maxDT)), 1)
		for k := 1; k <= n; k++ {
			f := float64(k) / float64(n)
			p.Time = append(p.Time, t0+f*(t1-t0))
			p.Temp = append(p.Temp, T0+f*(T1-T0))
		}
		p.Time[len(p.Time)-1], p.Temp[len(p.Temp)-1] = t1, T1
	}
	return p, nil
}
