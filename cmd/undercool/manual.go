package main

import (
	_ "embed"
	"strings"
)

// docSource is this command's doc.go: the manual is written once, there,
// and the help text is read from it.
//
//go:embed doc.go
var docSource string

// manual returns the package comment of doc.go as plain text.
func manual() string {
	s := docSource
	start := strings.Index(s, "/*")
	end := strings.Index(s, "*/")
	if start < 0 || end < start {
		panic("undercool: doc.go has no block comment")
	}
	body := strings.Trim(s[start+2:end], "\n")
	return strings.ReplaceAll(body, "\n\t", "\n  ") + "\n"
}
