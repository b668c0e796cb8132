package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"slices"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"

	"undercool/presets/answer"
)

// render writes an answer in the format asked for, once its results are
// checked (a result that came out NaN is an error, not a printed NaN): a
// terminal table fitted to the screen, or CSV, JSON or Markdown whole;
// --columns chooses the columns of the table of any but JSON. Nothing is
// written when it fails.
func render(w io.Writer, f *formatFlag, a answer.Answer) error {
	if err := answer.Check(a); err != nil {
		return err
	}
	var b bytes.Buffer
	if err := f.draw(&b, a); err != nil {
		return err
	}
	_, err := w.Write(b.Bytes())
	return err
}

// draw draws a into b.
func (f *formatFlag) draw(b *bytes.Buffer, a answer.Answer) error {
	if f.value == "json" {
		if f.columns.set {
			return usagef("--columns: JSON holds every value; choose columns for --format table, csv or markdown")
		}
		return writeJSON(b, a)
	}
	d := a.Doc()
	if err := f.choose(&d); err != nil {
		return err
	}
	switch f.value {
	case "csv":
		return writeCSV(b, d)
	case "markdown":
		return writeBlocks(b, markdownBlocks(d))
	}
	return writeText(b, d, f.e.width)
}

// check reports, before any file is written, whether a can be drawn with
// the columns asked for.
func (f *formatFlag) check(a answer.Answer) error {
	var b bytes.Buffer
	return f.draw(&b, a)
}

// choose keeps the columns of --columns in the table the format draws (for
// CSV, an answer's record when it has no table).
func (f *formatFlag) choose(d *answer.Doc) error {
	if !f.columns.set {
		return nil
	}
	t := d.Table
	if t == nil && f.value == "csv" {
		t = d.Record
	}
	if t == nil {
		return usagef("--columns: this answer has no table to choose columns of")
	}
	var keys []string
	for _, c := range t.Cols {
		keys = append(keys, c.Key)
	}
	chosen := answer.Table{Title: t.Title}
	var at []int
	for _, k := range f.columns.keys {
		i := slices.Index(keys, k)
		if i < 0 {
			return usagef("--columns: %q is not a column of this table; its columns are %s", k, strings.Join(keys, ", "))
		}
		at = append(at, i)
		chosen.Cols = append(chosen.Cols, t.Cols[i])
	}
	for _, row := range t.Rows {
		r := make([]any, len(at))
		for j, i := range at {
			r[j] = row[i]
		}
		chosen.Rows = append(chosen.Rows, r)
	}
	*t = chosen
	return nil
}

func writeJSON(b *bytes.Buffer, a any) error {
	out, err := json.MarshalIndent(a, "", "  ")
	if err != nil {
		return err
	}
	b.Write(out)
	b.WriteByte('\n')
	return nil
}

// writeText draws a doc for a terminal of the given width: lines wrapped
// to it, then tables drawn with box characters and fitted to it.
func writeText(b *bytes.Buffer, d answer.Doc, width int) error {
	text := func(ls ...string) {
		for _, l := range ls {
			for _, w := range wrapLine(l, width) {
				fmt.Fprintln(b, w)
			}
		}
	}
	text(d.Title)
	text(d.About...)
	if len(d.Summary) > 0 {
		b.WriteByte('\n')
		text(d.Summary...)
	}
	table := func(t answer.Table) error {
		fitted, left := fitTable(t, width)
		if err := drawTable(b, fitted, false); err != nil {
			return err
		}
		if len(left) > 0 {
			var heads []string
			for _, c := range left {
				heads = append(heads, c.Head)
			}
			text(fmt.Sprintf("not shown, to fit %d characters: %s; choose columns by their keys (the header of --format csv), e.g. --columns %s,%s",
				width, strings.Join(heads, ", "), t.Cols[0].Key, left[0].Key))
		}
		return nil
	}
	if d.Table != nil {
		b.WriteByte('\n')
		if err := table(*d.Table); err != nil {
			return err
		}
	}
	for _, t := range d.Tables {
		b.WriteByte('\n')
		text(t.Title)
		if err := table(t); err != nil {
			return err
		}
	}
	if len(d.Notes) > 0 {
		b.WriteByte('\n')
		text(d.Notes...)
	}
	return nil
}

// width is how many characters a string takes on a screen: one per rune
// (the tables' symbols, °, Δ, —, σ, are all narrow).
func width(s string) int { return utf8.RuneCountInString(s) }

// wrapLine breaks a line at spaces into lines of at most w characters; the
// lines after the first are indented two spaces more than it. A word longer
// than a line is broken where it must be.
func wrapLine(s string, w int) []string {
	lead := s[:len(s)-len(strings.TrimLeft(s, " "))]
	return wrapWords(unbroken(strings.Fields(s)), w, lead, lead+"  ")
}

// unbroken joins the words a line should not break between: "key = value",
// a number with its unit ("1150 K", "14.2 kJ/mol") and a flag with its
// value ("--columns temperature_k").
func unbroken(words []string) []string {
	var out []string
	for _, f := range words {
		if n := len(out); n > 0 {
			last := out[n-1]
			lastWord := last[strings.LastIndex(last, " ")+1:]
			_, numErr := strconv.ParseFloat(lastWord, 64)
			flagValue := strings.HasPrefix(lastWord, "--") && !strings.HasPrefix(f, "-") && !prose(f)
			if f == "=" || lastWord == "=" || numErr == nil && unitLike(f) || flagValue {
				out[n-1] += " " + f
				continue
			}
		}
		out = append(out, f)
	}
	return out
}

// prose reports whether a word is a small word of prose.
func prose(w string) bool {
	return contains([]string{"and", "or", "to", "at", "of", "in", "on", "by", "for", "from", "with", "the", "a", "an", "is", "into", "per", "than", "points"}, strings.TrimRight(w, ",;:.)"))
}

// unitLike reports whether a word reads as a unit after a number: short,
// starting with a letter, °, µ or %, and not a small word of prose.
func unitLike(w string) bool {
	w = strings.TrimRight(w, ",;:.)")
	if w == "" || width(w) > 8 || prose(w) {
		return false
	}
	r, _ := utf8.DecodeRuneInString(w)
	return unicode.IsLetter(r) || strings.ContainsRune("°µ%", r)
}

// wrapWords fills lines of at most w characters with words: the first
// line starts with first, the others with rest.
func wrapWords(words []string, w int, first, rest string) []string {
	var out []string
	line := first
	empty := true
	for _, word := range words {
		switch {
		case empty:
		case width(line)+1+width(word) <= w:
			line += " "
		default:
			out = append(out, line)
			line, empty = rest, true
		}
		for width(line)+width(word) > w && width(line) < w {
			// a word longer than the line: break it
			r := []rune(word)
			n := w - width(line)
			out = append(out, line+string(r[:n]))
			line, word = rest, string(r[n:])
		}
		line += word
		empty = false
	}
	return append(out, line)
}

// written is the format of a cell already written out: itself.
func written(v any) string { return v.(string) }

// longestWord is the width of the longest word of s.
func longestWord(s string) int {
	n := 0
	for _, f := range strings.Fields(s) {
		n = max(n, width(f))
	}
	return n
}

// headWords are the words of a column head, a unit in brackets kept whole:
// "log10 J (m^-3 s^-1)" is "log10", "J", "(m^-3 s^-1)".
func headWords(h string) []string {
	var out []string
	depth := 0
	for _, f := range strings.Fields(h) {
		if depth > 0 {
			out[len(out)-1] += " " + f
		} else {
			out = append(out, f)
		}
		depth += strings.Count(f, "(") - strings.Count(f, ")")
	}
	return out
}

// A text column wraps to no fewer than textMin characters, and keeps words
// of up to wordMax whole; longer ones (a composition, a path) are broken.
const (
	textMin     = 12
	wordMax     = 20
	textComfort = 30 // a text column this wide reads without effort
)

// fitTable fits a table to a screen of w characters: headers wrap at their
// spaces, text cells (left-aligned) at theirs, down to their longest word;
// when even that is too wide, columns go, the largest Col.Drop first and
// the rightmost of equals, never the first. It returns the table with its
// cells written out (wrapped with newlines) and the columns left out, in
// their order.
func fitTable(t answer.Table, w int) (answer.Table, []answer.Col) {
	n := len(t.Cols)
	cells := make([][]string, len(t.Rows))
	for r, row := range t.Rows {
		cells[r] = make([]string, n)
		for i, c := range t.Cols {
			cells[r][i] = c.Cell(row[i])
		}
	}
	natural, least := make([]int, n), make([]int, n)
	for i, c := range t.Cols {
		natural[i] = width(c.Head)
		for _, hw := range headWords(c.Head) {
			least[i] = max(least[i], width(hw))
		}
		cellMax, longest := 0, 0
		for r := range cells {
			cellMax, longest = max(cellMax, width(cells[r][i])), max(longest, longestWord(cells[r][i]))
		}
		natural[i] = max(natural[i], cellMax)
		if c.Text == nil { // text wraps
			least[i] = max(least[i], min(cellMax, max(textMin, min(longest, wordMax))))
		} else {
			least[i] = max(least[i], cellMax)
		}
	}
	keep := make([]bool, n)
	for i := range keep {
		keep[i] = true
	}
	total := func(ws []int) int {
		s := 1
		for i := range ws {
			if keep[i] {
				s += ws[i] + 3 // "│ " + cell + " "
			}
		}
		return s
	}
	// drop leaves out the column to go first, of those with at least the
	// drop order lowest; false when there is none.
	drop := func(lowest int) bool {
		d := -1
		for i := n - 1; i > 0; i-- {
			if keep[i] && t.Cols[i].Drop >= lowest && (d < 0 || t.Cols[i].Drop > t.Cols[d].Drop) {
				d = i
			}
		}
		if d >= 0 {
			keep[d] = false
		}
		return d >= 0
	}
	// Columns that may go make room first for text to read comfortably;
	// then any column but the first goes until the table fits at all.
	comfortable := slices.Clone(least)
	for i, c := range t.Cols {
		if c.Text == nil {
			comfortable[i] = max(least[i], min(natural[i], textComfort))
		}
	}
	for total(comfortable) > w && drop(1) {
	}
	for total(least) > w && drop(0) {
	}
	// Widths: the natural ones where they fit; else the least, with the room
	// left shared out evenly among the columns still short of their natural
	// width (so a column a little short gets all it lacks).
	ws := slices.Clone(natural)
	if total(ws) > w {
		copy(ws, least)
		for room := w - total(ws); room > 0; {
			var short []int
			for i := range ws {
				if keep[i] && ws[i] < natural[i] {
					short = append(short, i)
				}
			}
			if len(short) == 0 {
				break
			}
			share := max(1, room/len(short))
			for _, i := range short {
				g := min(share, natural[i]-ws[i], room)
				ws[i] += g
				room -= g
			}
		}
	}
	out := answer.Table{Title: t.Title}
	var left []answer.Col
	for i, c := range t.Cols {
		if !keep[i] {
			left = append(left, c)
			continue
		}
		c.Head = strings.Join(wrapWords(headWords(c.Head), ws[i], "", ""), "\n")
		if c.Text != nil {
			c.Text = written // the cells below are written out already
		}
		out.Cols = append(out.Cols, c)
	}
	for r := range cells {
		var row []any
		for i, c := range t.Cols {
			if !keep[i] {
				continue
			}
			switch cell := cells[r][i]; {
			case c.Text == nil && width(cell) > ws[i]:
				row = append(row, strings.Join(wrapWords(strings.Fields(cell), ws[i], "", ""), "\n"))
			case c.Text == nil:
				row = append(row, t.Rows[r][i]) // as it was: an empty list stays blank
			default:
				row = append(row, cell)
			}
		}
		out.Rows = append(out.Rows, row)
	}
	return out, left
}

// drawTable renders one table with tablewriter, as text or Markdown:
// formatted columns right-aligned, text left-aligned. A terminal table
// comes fitted (fitTable), its cells written out: nothing wraps here.
func drawTable(b *bytes.Buffer, t answer.Table, markdown bool) error {
	align := make([]tw.Align, len(t.Cols))
	heads := make([]string, len(t.Cols))
	for i, c := range t.Cols {
		align[i] = tw.AlignRight
		if c.Text == nil {
			align[i] = tw.AlignLeft
		}
		heads[i] = c.Head
	}
	opts := []tablewriter.Option{
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithRowAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithHeaderAlignment(tw.AlignCenter),
		tablewriter.WithRowAutoWrap(tw.WrapNone),
		tablewriter.WithHeaderAutoWrap(tw.WrapNone),
	}
	if markdown {
		opts = append(opts, tablewriter.WithRenderer(renderer.NewMarkdown()))
	}
	tab := tablewriter.NewTable(b, opts...)
	tab.Header(heads)
	for _, row := range t.Rows {
		cells := make([]string, len(t.Cols))
		for i, c := range t.Cols {
			cells[i] = c.Cell(row[i])
		}
		if err := tab.Append(cells); err != nil {
			return err
		}
	}
	return tab.Render()
}

// writeCSV writes the main table with its keys as headers, every line of
// text before it as a comment, and further tables as comments too.
func writeCSV(b *bytes.Buffer, d answer.Doc) error {
	fmt.Fprintf(b, "# %s\n", d.Title)
	for _, l := range append(append(append([]string{}, d.About...), d.Summary...), d.Notes...) {
		fmt.Fprintf(b, "# %s\n", l)
	}
	for _, t := range d.Tables {
		fmt.Fprintf(b, "# %s\n", t.Title)
		for _, row := range t.Rows {
			cells := make([]string, len(t.Cols))
			for i, c := range t.Cols {
				cells[i] = c.Cell(row[i])
			}
			fmt.Fprintf(b, "#   %s\n", strings.Join(cells, ", "))
		}
	}
	t := d.Table
	if t == nil {
		t = d.Record
	}
	if t == nil {
		return nil
	}
	cw := csv.NewWriter(b)
	keys := make([]string, len(t.Cols))
	for i, c := range t.Cols {
		keys[i] = c.Key
	}
	if err := cw.Write(keys); err != nil {
		return err
	}
	for _, row := range t.Rows {
		rec := make([]string, len(row))
		for i, v := range row {
			switch x := v.(type) {
			case float64:
				if !math.IsNaN(x) && !math.IsInf(x, 0) {
					rec[i] = strconv.FormatFloat(x, 'g', 8, 64)
				}
			case []string:
				rec[i] = strings.Join(x, ";")
			default:
				if rec[i] = answer.CellText(v); rec[i] == answer.Dash {
					rec[i] = ""
				}
			}
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// markdownBlocks is a doc as Markdown blocks: a heading, the lines as
// lists, the tables with their headings.
func markdownBlocks(d answer.Doc) []answer.Block {
	bs := []answer.Block{answer.Heading(3, d.Title)}
	if len(d.About) > 0 {
		bs = append(bs, answer.List(d.About...))
	}
	if len(d.Summary) > 0 {
		bs = append(bs, answer.List(d.Summary...))
	}
	if d.Table != nil {
		bs = append(bs, answer.TableBlock(*d.Table))
	}
	for _, t := range d.Tables {
		bs = append(bs, answer.Heading(4, t.Title), answer.TableBlock(t))
	}
	if len(d.Notes) > 0 {
		bs = append(bs, answer.List(d.Notes...))
	}
	return bs
}

// writeBlocks is the one Markdown renderer: blocks separated by a blank line.
func writeBlocks(b *bytes.Buffer, bs []answer.Block) error {
	for i, bl := range bs {
		if i > 0 {
			b.WriteByte('\n')
		}
		switch bl.Kind {
		case answer.HeadingBlock:
			fmt.Fprintf(b, "%s %s\n", strings.Repeat("#", bl.Level), bl.Text)
		case answer.ListBlock:
			// an item indented under the one before is a nested item
			for _, l := range bl.Lines {
				item := strings.TrimLeft(l, " ")
				fmt.Fprintf(b, "%s- %s\n", l[:len(l)-len(item)], item)
			}
		case answer.QuoteBlock:
			fmt.Fprintf(b, "> %s\n", bl.Text)
		case answer.CodeBlock:
			fmt.Fprintf(b, "```\n%s\n```\n", bl.Text)
		case answer.TableKind:
			if err := drawTable(b, *bl.Table, true); err != nil {
				return err
			}
		default:
			fmt.Fprintf(b, "%s\n", bl.Text)
		}
	}
	return nil
}
