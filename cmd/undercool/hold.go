package main

import (
	"github.com/spf13/pflag"

	"undercool/presets/answer"
)

func init() {
	commands["hold"] = &command{
		summary: "The time to transform a fraction in an isothermal hold at one temperature (storage, an anneal), with the nucleation and growth rates and the critical nucleus there.",
		usage:   "undercool hold --at T [--material NAME|FILE.toml] [value flags] [--fraction X] [--lag | --nuclei N] [--volume V] [--format F]",
		example: "undercool hold --material demo-alloy --at 500C --fraction 0.01",
		setup:   setupHold,
	}
}

func setupHold(fs *pflag.FlagSet, e *env) func([]string) error {
	mf := addMaterialFlags(fs)
	at := addTemp(fs, e, "at", "hold temperature, K, C or F (bare = K), above absolute zero; required")
	jf := addJMAKFlags(fs, false)
	volume := addVolume(fs, "", "vessel volume for the induction time 1/(J V) and the polynuclear time to --fraction, m3, L, mL, uL, mm3 or um3 (> 0); with it hold reports both and which dominates")
	ff := addFormat(fs, e)
	sf := addSpreadFlags(fs)
	return func(args []string) error {
		if err := start("hold", args, sf); err != nil {
			return err
		}
		if !at.set {
			return usagef("--at: required: the hold temperature, e.g. --at 700K or --at 450C")
		}
		j, err := jf.jmak()
		if err != nil {
			return err
		}
		c, md, err := mf.model()
		if err != nil {
			return err
		}
		// The mode: with --volume, the induction time of the held volume;
		// without, the time to the fraction.
		var a answer.Answer
		switch {
		case volume.set:
			switch {
			case jf.lag:
				return usagef("--lag and --volume: the induction time is for nuclei forming at the steady rate; give one or the other")
			case jf.nuclei.set:
				return usagef("--nuclei and --volume: the induction time is for nuclei forming at the steady rate; give one or the other")
			case !md.HasRate():
				return usagef("the material has no nucleation rate, so no induction time: give --prefactor fixed with --j0 (the apparent A that fit induction gives), or a mobility law (--solvent-viscosity, --solute-diffusivity, --d0 and --q)")
			}
			smp, err := sf.sampling(e, c)
			if err != nil {
				return err
			}
			a, err = answer.Inductions(answer.InductionInput{Card: c, Model: md, T: at.x, V: volume.x, X: jf.fraction.X[0],
				VolumeText: volume.text, Sampling: smp, Names: flagNames})
			if err != nil {
				return err
			}
		default:
			if err := canTransform(md, j); err != nil {
				return err
			}
			smp, err := sf.sampling(e, c)
			if err != nil {
				return err
			}
			if a, err = answer.Holds(answer.HoldInput{Card: c, Model: md, T: at.x, X: jf.fraction.X[0], JMAK: j, Sampling: smp}); err != nil {
				return err
			}
		}
		return render(e.stdout, ff, a)
	}
}
