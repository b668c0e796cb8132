package presets

import (
	"embed"
	"fmt"
	"path"
	"sort"
	"strings"
)

//go:embed cards/*.toml
var cardFS embed.FS

// Names lists the shipped cards, sorted.
func Names() []string {
	ents, err := cardFS.ReadDir("cards")
	if err != nil {
		panic("presets: " + err.Error())
	}
	var out []string
	for _, e := range ents {
		out = append(out, strings.TrimSuffix(e.Name(), ".toml"))
	}
	sort.Strings(out)
	return out
}

// Preset returns a shipped card by name.
func Preset(name string) (*Card, error) {
	data, err := cardFS.ReadFile(path.Join("cards", name+".toml"))
	if err != nil {
		return nil, fmt.Errorf("unknown material %q (shipped: %s; or give a path to a .toml card)", name, strings.Join(Names(), ", "))
	}
	return Parse(data, "preset "+name)
}

// Open returns a card by preset name or by path (see IsPath).
func Open(nameOrPath string) (*Card, error) {
	if IsPath(nameOrPath) {
		return load(nameOrPath)
	}
	return Preset(nameOrPath)
}

// IsPath reports whether Open reads a card from a file: anything ending
// .toml or containing a path separator is a path, anything else a preset's
// name.
func IsPath(nameOrPath string) bool {
	return strings.HasSuffix(nameOrPath, ".toml") || strings.ContainsRune(nameOrPath, '/')
}
