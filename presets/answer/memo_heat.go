package answer

import (
	"fmt"
	"strings"

	"undercool/kinetics"
)

// MemoHeat asks a memo for heating: from From (K) to T_e, the critical
// heating rate always, the fraction at Rate (K/s; 0: none) and the DSC
// peaks at DSC (K/s; none: no table).
type MemoHeat struct {
	From float64
	Rate float64
	DSC  []float64
}

// MemoHeats are the heating answers of a memo.
type MemoHeats struct {
	Critical *HeatCritical
	AtRate   *Heat // nil: no rate asked
	DSC      *DSC  // nil: no DSC asked
}

// heats computes the heating answers of a memo.
func (m *Memo) heats(h MemoHeat) (*MemoHeats, error) {
	in := HeatInput{Card: m.in.Card, Model: m.in.Model, From: h.From, X: m.in.X, Names: m.in.Names}
	out := &MemoHeats{}
	c := in
	c.Critical = true
	a, err := Heats(c)
	if err != nil {
		return nil, err
	}
	out.Critical = a.(*HeatCritical)
	if h.Rate > 0 {
		r := in
		r.Rate = h.Rate
		if a, err = Heats(r); err != nil {
			return nil, err
		}
		out.AtRate = a.(*Heat)
	}
	if len(h.DSC) > 0 {
		d := in
		d.DSC = h.DSC
		if a, err = Heats(d); err != nil {
			return nil, err
		}
		out.DSC = a.(*DSC)
	}
	return out, nil
}

// heatQuestions are the memo's questions on heating.
func (m *Memo) heatQuestions() []string {
	h := m.Heats
	if h == nil {
		return nil
	}
	X := FracLabel(m.in.X)
	from := KelvinCelsius(float64(h.Critical.Inputs.From))
	qs := []string{fmt.Sprintf("How fast must the glass be heated from %s to stay below X = %s (the critical heating rate), and how does that compare with the critical cooling rate?", from, X)}
	if h.AtRate != nil {
		qs = append(qs, fmt.Sprintf("What does heating at %s from %s do?", RateText(float64(h.AtRate.Rate)), from))
	}
	if h.DSC != nil {
		qs = append(qs, "Where do the DSC exotherms of scans at the given heating rates peak and start?")
	}
	return qs
}

// heatBlocks are the memo's section on heating.
func (m *Memo) heatBlocks() []Block {
	h := m.Heats
	if h == nil {
		return nil
	}
	mark := ""
	if w := m.TTT.Inputs.Standing.Mark(); w != "" {
		mark = " " + w
	}
	c := h.Critical
	lines := []string{fmt.Sprintf("Linear heating from %s to T_e = %.2f K, from a nucleus-free glass; the extended volume scales as q⁻⁴ (exact path integral).",
		KelvinCelsius(float64(c.Inputs.From)), m.in.Model.Te())}
	for _, s := range c.summary {
		lines = append(lines, s+mark)
	}
	if r := h.AtRate; r != nil {
		lines = append(lines, r.summary[0]+mark)
	}
	bs := []Block{Heading(2, "Heating"), List(lines...)}
	if d := h.DSC; d != nil {
		t := tableOf(d.Rows)
		for i := range t.Cols {
			if strings.HasPrefix(t.Cols[i].Key, "peak") || strings.HasPrefix(t.Cols[i].Key, "onset") {
				t.Cols[i].Head += mark
			}
		}
		bs = append(bs, Para(fmt.Sprintf("Forward DSC peaks (the largest dX/dT of each scan) and onsets (X = %g %%):", 100*kinetics.OnsetFraction)), TableBlock(*t))
		for _, s := range d.summary {
			bs = append(bs, Para(s+"."))
		}
		bs = append(bs, Para(PeaksMeaning+"."))
	}
	return bs
}
