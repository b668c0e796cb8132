// Package answer computes what each undercool command answers for a
// material card, as typed values: the Go types are the JSON schema (keys
// in struct tags, SI values, NaN and ±Inf as null), and each answer also
// says how it reads (Doc: a title, header lines, a summary, tables and
// notes) so that one renderer per format draws any answer. The memo of
// the report command is made of the same answers (Memo).
//
// Answers never mention command-line flags: an input the caller gave by a
// flag is named by the caller.
package answer
