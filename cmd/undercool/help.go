package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/pflag"

	"undercool/presets"
)

// The groups of a command's --help, in the order it shows them. A flag
// belongs to the group its declaration puts it in (setGroup), or else to
// what the command computes.
const (
	groupCompute     = "what to compute"
	groupMaterial    = "the material"
	groupSolution    = "solution values"
	groupUncertainty = "uncertainty"
	groupOutput      = "output"
)

var helpGroups = []string{groupCompute, groupMaterial, groupSolution, groupUncertainty, groupOutput}

// groupKey is the annotation of a flag that names its help group.
const groupKey = "undercool-group"

// setGroup puts flags in a help group.
func setGroup(fs *pflag.FlagSet, group string, names ...string) {
	for _, n := range names {
		if err := fs.SetAnnotation(n, groupKey, []string{group}); err != nil {
			panic("undercool: setGroup: " + err.Error())
		}
	}
}

// groupOf is the help group of a flag.
func groupOf(f *pflag.Flag) string {
	if g := f.Annotations[groupKey]; len(g) > 0 {
		return g[0]
	}
	return groupCompute
}

// paramGroup is the help group of a value of a card.
func paramGroup(p presets.Param) string {
	if p.Group == "solution" {
		return groupSolution
	}
	return groupMaterial
}

// printHelp writes a command's help, fitted to width: its usage,
// summary, flags by group and example. The solution values show only where
// they apply: with --material naming a card that is not a solution they
// are left out, and the help says so.
func printHelp(w io.Writer, width int, name string, cmd *command, fs *pflag.FlagSet, args []string) {
	para := func(s string) {
		for _, l := range wrapLine(s, width) {
			fmt.Fprintln(w, l)
		}
	}
	para(cmd.usage)
	fmt.Fprintln(w)
	para(cmd.summary)
	skip := map[string]string{}
	if c := helpCard(args); c != nil && c.Driving != "solution" {
		skip[groupSolution] = fmt.Sprintf("%s is not a solution; undercool %s --help without --material lists them", c.Name, name)
	}
	for _, g := range helpGroups {
		sub := pflag.NewFlagSet(g, pflag.ContinueOnError)
		sub.SortFlags = false
		fs.VisitAll(func(f *pflag.Flag) {
			if groupOf(f) == g && !f.Hidden {
				sub.AddFlag(f)
			}
		})
		if !sub.HasAvailableFlags() {
			continue
		}
		fmt.Fprintln(w)
		if why, ok := skip[g]; ok {
			para(fmt.Sprintf("%s%s: not shown (%s).", strings.ToUpper(g[:1]), g[1:], why))
			continue
		}
		fmt.Fprintf(w, "%s%s:\n", strings.ToUpper(g[:1]), g[1:])
		fmt.Fprint(w, sub.FlagUsagesWrapped(width))
	}
	fmt.Fprintf(w, "\nExample:\n")
	para("  " + cmd.example)
}

// helpCard is the card --material names on a command line that asks for
// help, nil when there is none or it does not load.
func helpCard(args []string) *presets.Card {
	for i, a := range args {
		var name string
		switch {
		case a == "--material" && i+1 < len(args):
			name = args[i+1]
		case strings.HasPrefix(a, "--material="):
			name = strings.TrimPrefix(a, "--material=")
		default:
			continue
		}
		if c, err := presets.Open(name); err == nil {
			return c
		}
	}
	return nil
}
