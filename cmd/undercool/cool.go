package main

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/pflag"

	"undercool/kinetics"
	"undercool/presets/units"
)

func init() {
	commands["cool"] = &command{
		summary: "Cooling paths: the transformed fraction on linear cooling from Te, the critical cooling rate, the onset of nucleation in a sample volume, a measured cooling curve with its additivity sum, and the quench factor against a C-curve.",
		usage: "undercool cool [--material NAME|FILE.toml] [value flags] (--rate Q[,Q...] | --critical | --curve FILE.csv) " +
			"[--fraction X] [--end T] [--volume V] [--c-curve k1=..,k2=..,k3=..,k4=..,k5=..] [--band DT] [--plot FILE.svg|FILE.png] [--format F]",
		example: "undercool cool --material vit1 --critical",
		setup:   setupCool,
	}
}

// coolFlags are the flags of the cool command besides the material's.
type coolFlags struct {
	rate, end, fraction, volume, curve, ccurve, band string
	critical                                         bool
	fs                                               *pflag.FlagSet
}

func addCoolFlags(fs *pflag.FlagSet) *coolFlags {
	cf := &coolFlags{fs: fs}
	fs.StringVar(&cf.rate, "rate", "", "linear cooling rate from Te, K/s, K/min, K/h or C/s (> 0); several, comma-separated, give a CCT table, e.g. 1,10,100K/s (a bare number takes the unit of the last)")
	fs.BoolVar(&cf.critical, "critical", false, "the critical cooling rate to stay below --fraction, from the exact integral (X_ext scales as rate^-4), with the nose estimate beside it")
	fs.StringVar(&cf.fraction, "fraction", defaultFraction, "transformed fraction to stay below or to reach, strictly between 0 and 1 (1e-6: the usual detection limit)")
	fs.StringVar(&cf.end, "end", "", "end of linear cooling, K, C or F below Te (default: Tg where the card has one, else where the rest of the path adds less than 1e-6 of the extended volume)")
	fs.StringVar(&cf.volume, "volume", "", "sample volume for the onset of nucleation (first nucleus expected), m3, mm3, uL, mL, L or um3 (> 0)")
	fs.StringVar(&cf.curve, "curve", "", "measured cooling curve FILE.csv with columns time_UNIT and temperature_UNIT (e.g. time_s,temperature_c), time strictly increasing")
	fs.StringVar(&cf.ccurve, "c-curve", "", "Evancho-Staley C-curve constants k1=..,k2=..,k3=..,k4=..,k5=.. (k1 < 0 dimensionless, k2 s, k3 and k5 J/mol, k4 K) for the quench factor of --curve; default: the material's TTT curve")
	fs.StringVar(&cf.band, "band", "25K", "width of the temperature bands of the quench-factor table, K (> 0)")
	return cf
}

func (cf *coolFlags) set(name string) bool { return cf.fs.Changed(name) }

// fractionValue parses --fraction.
func (cf *coolFlags) fractionValue() (float64, error) {
	X, err := strconv.ParseFloat(strings.TrimSpace(cf.fraction), 64)
	if err != nil || !(X > 0 && X < 1) {
		return 0, usagef("--fraction: %q is not a number strictly between 0 and 1", cf.fraction)
	}
	return X, nil
}

// rates parses --rate: one or more positive cooling rates in K/s.
func (cf *coolFlags) rates() ([]float64, error) {
	parts := strings.Split(cf.rate, ",")
	last := strings.TrimSpace(parts[len(parts)-1])
	_, unit := splitUnit(last)
	var out []float64
	for _, p := range parts {
		s := strings.TrimSpace(p)
		if n, u := splitUnit(s); u == "" && n != "" {
			s += unit
		}
		q, err := units.Parse(s, units.CoolingRate)
		if err != nil {
			return nil, usagef("--rate: %v", err)
		}
		if !(q > 0) {
			return nil, usagef("--rate: %q must be positive (a cooling rate, K/s)", strings.TrimSpace(p))
		}
		out = append(out, q)
	}
	return out, nil
}

// splitUnit splits "10K/s" into "10" and "K/s".
func splitUnit(s string) (num, unit string) {
	i := strings.IndexFunc(s, func(r rune) bool {
		return !(r >= '0' && r <= '9' || r == '.' || r == '+' || r == '-' || r == 'e' || r == 'E')
	})
	// an exponent 'e' followed by a letter is a unit, not an exponent
	for i > 0 && (s[i-1] == 'e' || s[i-1] == 'E') {
		i--
	}
	if i < 0 {
		return s, ""
	}
	return s[:i], s[i:]
}

// volumeValue parses --volume (m³).
func (cf *coolFlags) volumeValue() (float64, error) {
	return parsePositive("volume", cf.volume, units.Volume, "a sample volume")
}

// bandValue parses --band (K).
func (cf *coolFlags) bandValue() (float64, error) {
	return parsePositive("band", cf.band, units.TemperatureDifference, "a band width, K")
}

// materialGiven reports whether the command line names a material or any
// of its values.
func materialGiven(fs *pflag.FlagSet, mf *materialFlags) bool {
	if fs.Changed("material") || fs.Changed("driving") || fs.Changed("mobility") || fs.Changed("prefactor") {
		return true
	}
	for k := range mf.values {
		if fs.Changed(flagName(k)) {
			return true
		}
	}
	return false
}

func setupCool(fs *pflag.FlagSet) func(*env, []string) error {
	mf := addMaterialFlags(fs)
	cf := addCoolFlags(fs)
	pf := addPlotFlag(fs, "draw the CCT curve for --fraction over the TTT curve, with the cooling lines of --rate,")
	ff := addFormatFlag(fs)
	sf := addSpreadFlags(fs)
	return func(e *env, args []string) error {
		if err := checkStart("cool", args, ff, sf); err != nil {
			return err
		}
		X, err := cf.fractionValue()
		if err != nil {
			return err
		}
		switch {
		case cf.critical && cf.set("rate"):
			return usagef("--critical and --rate: give one or the other (--critical finds the rate; --rate uses the one you give)")
		case cf.set("curve") && (cf.critical || cf.set("rate")):
			return usagef("--curve and --rate/--critical: give one path, a measured curve or linear cooling")
		case !cf.set("curve") && !cf.critical && !cf.set("rate"):
			return usagef("cool: give --rate Q, --critical or --curve FILE.csv (see undercool cool --help)")
		case cf.set("c-curve") && !cf.set("curve"):
			return usagef("--c-curve: the quench factor needs a measured path, give --curve FILE.csv")
		case cf.set("end") && cf.set("curve"):
			return usagef("--end: applies to linear cooling; a measured curve ends where its file does")
		}
		var V float64
		if cf.set("volume") {
			if V, err = cf.volumeValue(); err != nil {
				return err
			}
		}
		band, err := cf.bandValue()
		if err != nil {
			return err
		}
		if err := pf.check(); err != nil {
			return err
		}
		if cf.set("curve") {
			if pf.wanted() {
				return usagef("--plot: draws the CCT of linear cooling; it does not apply to --curve")
			}
			return runCurve(e, fs, mf, cf, ff.value, X, V, band, sf)
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		if done, err := solutionCool(e, cf, pf, c, md, V, ff.value); done { // solution_cool.go
			return err
		}
		if err := coolError(md); err != nil {
			return err
		}
		end := 0.0
		if cf.set("end") {
			if end, err = parseTemp(e, "end", cf.end); err != nil {
				return err
			}
			if !(end < md.Te()) {
				return usagef("--end: %s is not below the equilibrium temperature %.2f K", cf.end, md.Te())
			}
		}
		var rates []float64
		if cf.set("rate") {
			if rates, err = cf.rates(); err != nil {
				return err
			}
		}
		cl, err := md.LinearCooling(end)
		if err != nil {
			return fmt.Errorf("cool: %v", err)
		}
		about, inputs := describeCard(c, md)
		lc := &linearCool{cl: cl, md: md, X: X, V: V, rates: rates, critical: cf.critical, name: c.Name}
		r, err := lc.result(about, inputs)
		if err != nil {
			return err
		}
		heads, eval := coolHeadlines(end, X, V, rates, cf.critical)
		if err := sf.apply(e, r, c, md, heads, eval, nil); err != nil {
			return err
		}
		return renderWithPlot(e, r, ff.value, pf, func() error { return lc.plot(pf) })
	}
}

// coolError turns a model that cannot give a fraction into a usage error.
func coolError(md *kinetics.Model) error {
	if !md.HasGrowth() {
		return usagef("the material has no mobility law, so no growth rate and no transformed fraction: give --mobility with its values (--d0 and --q, or --vft-a, --vft-b and --vft-t0, or --tg)")
	}
	if !md.HasRate() {
		return usagef("%v", kinetics.ErrNoRate)
	}
	return nil
}

// endLine says where and why the linear path ends.
func endLine(cl *kinetics.Cooling) string {
	switch cl.Reason {
	case kinetics.EndGlass:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to Tg = %.2f K (below the glass transition the melt is frozen)", cl.Te, cl.End)
	case kinetics.EndGiven:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to %.2f K (--end)", cl.Te, cl.End)
	default:
		return fmt.Sprintf("path: linear cooling from Te = %.2f K to %.2f K, where the rest of the path adds less than %.0e of the extended volume", cl.Te, cl.End, kinetics.NegligibleRest)
	}
}

// transformLine names the transformation model of every cool result.
const transformLine = "transformation: extended volume Xext = (4 pi/3) integral J(t') [integral u ds]^3 dt' (continuous nucleation at J(T), spherical growth at u(T)), X = 1 - exp(-Xext)"
