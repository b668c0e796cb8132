package kinetics

import (
	"errors"
	"fmt"
)

// ErrEndAboveSat is returned when a cooling path would end at or above the
// saturation temperature it starts from.
var ErrEndAboveSat = errors.New("the end of the path must be below the saturation temperature")

// MetastableZone is the onset of nucleation in a volume V (m³, > 0) of a
// solution cooled at rate q (K/s, > 0) from its saturation temperature
// (the model's T_e) down to end (K): the temperature where the expected
// number of nuclei V·∫J dt first reaches 1 (OnsetAlong on a one-step
// LinearPath, integrated and solved to the tolerance of the path integral), and
// with it the metastable zone width ΔT_max = T_sat − T_onset. The onset is
// not reached (Onset.Reached false) when fewer than one nucleus is expected
// by the end of the path. Errors: ErrNoRate, ErrEndAboveSat.
//
// This is the onset of the first nucleus; a detected MSZW also needs the
// crystals to grow to a detectable amount, which a wide zone hides
// (Kubota N., J. Cryst. Growth 310 (2008) 629, from memory).
func (md *Model) MetastableZone(V, q, end float64) (Onset, error) {
	if !(V > 0) || !(q > 0) {
		panic("kinetics: MetastableZone: volume and rate must be positive")
	}
	te := md.te
	if !(end < te) || !(end > 0) {
		return Onset{}, fmt.Errorf("%w (end %g K, saturation %g K)", ErrEndAboveSat, end, te)
	}
	p := LinearPath(te, end, q, 1)
	s, err := md.Along(p)
	if err != nil {
		return Onset{}, err
	}
	return OnsetAlong(p, s, V), nil
}
