package main

import (
	"runtime/debug"
	"strings"
)

// buildVersion says which undercool this is, from what the Go toolchain wrote
// into the binary: the module version ("(devel)" for a build from a
// working copy), and where the build was made from a repository, the
// commit, its time and whether the working copy had uncommitted changes.
func buildVersion() string {
	info, ok := debug.ReadBuildInfo()
	if !ok {
		return "undercool (no build information)"
	}
	v := info.Main.Version
	if v == "" {
		v = "(devel)"
	}
	s := "undercool " + v
	vcs := map[string]string{}
	for _, kv := range info.Settings {
		if k, ok := strings.CutPrefix(kv.Key, "vcs."); ok {
			vcs[k] = kv.Value
		}
	}
	if rev := vcs["revision"]; rev != "" {
		s += ", commit " + rev[:min(len(rev), 12)]
		if t := vcs["time"]; t != "" {
			s += " (" + t + ")"
		}
		if vcs["modified"] == "true" {
			s += ", with uncommitted changes"
		}
	}
	return s
}
