package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"

	"undercool/presets/answer"
)

// render writes an answer in the format asked for, once its results are
// checked: a result that came out NaN is an error, not a printed NaN.
func render(w io.Writer, format string, a answer.Answer) error {
	if err := answer.Check(a); err != nil {
		return err
	}
	var b bytes.Buffer
	var err error
	switch format {
	case "json":
		err = writeJSON(&b, a)
	case "csv":
		err = writeCSV(&b, a.Doc())
	case "markdown":
		err = writeBlocks(&b, markdownBlocks(a.Doc()))
	default:
		err = writeText(&b, a.Doc())
	}
	if err != nil {
		return err
	}
	_, err = w.Write(b.Bytes())
	return err
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

// maxCellWidth is the widest a text cell of a terminal table grows before it wraps.
const maxCellWidth = 56

// writeText draws a doc for a terminal: lines, then tables drawn with box characters.
func writeText(b *bytes.Buffer, d answer.Doc) error {
	fmt.Fprintln(b, d.Title)
	lines(b, d.About, "")
	if len(d.Summary) > 0 {
		b.WriteByte('\n')
		lines(b, d.Summary, "")
	}
	if d.Table != nil {
		b.WriteByte('\n')
		if err := drawTable(b, *d.Table, false); err != nil {
			return err
		}
	}
	for _, t := range d.Tables {
		b.WriteByte('\n')
		fmt.Fprintln(b, t.Title)
		if err := drawTable(b, t, false); err != nil {
			return err
		}
	}
	if len(d.Notes) > 0 {
		b.WriteByte('\n')
		lines(b, d.Notes, "")
	}
	return nil
}

func lines(b *bytes.Buffer, ls []string, lead string) {
	for _, l := range ls {
		fmt.Fprintf(b, "%s%s\n", lead, l)
	}
}

// writeTable renders one table with tablewriter, as text or Markdown:
// formatted columns right-aligned, text left-aligned.
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
	}
	if markdown {
		opts = append(opts, tablewriter.WithRenderer(renderer.NewMarkdown()))
	} else {
		// Long text (sources, descriptions) wraps in a terminal table.
		opts = append(opts, tablewriter.WithRowAutoWrap(tw.WrapNormal), tablewriter.WithRowMaxWidth(maxCellWidth))
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
			lines(b, bl.Lines, "- ")
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
