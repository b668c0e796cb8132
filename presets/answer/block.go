package answer

// Block is a block of a Markdown document: a heading, a paragraph, a
// list, a quotation, a code block or a table. Markdown is the one format
// that draws blocks; a memo is made of them.
type Block struct {
	Kind  BlockKind
	Level int      // of a heading
	Text  string   // a heading's, paragraph's, quotation's or code block's
	Lines []string // a list's items
	Table *Table
}

// BlockKind says what a block is.
type BlockKind int

// The kinds of block.
const (
	Paragraph BlockKind = iota
	HeadingBlock
	ListBlock
	QuoteBlock
	CodeBlock
	TableKind
)

// Heading is a heading of a level (1: the document's title).
func Heading(level int, text string) Block {
	return Block{Kind: HeadingBlock, Level: level, Text: text}
}

// Para is a paragraph.
func Para(text string) Block { return Block{Text: text} }

// List is a bulleted list.
func List(items ...string) Block { return Block{Kind: ListBlock, Lines: items} }

// Quote is a quoted paragraph.
func Quote(text string) Block { return Block{Kind: QuoteBlock, Text: text} }

// Code is a block of code or a command line.
func Code(text string) Block { return Block{Kind: CodeBlock, Text: text} }

// TableBlock is a table.
func TableBlock(t Table) Block { return Block{Kind: TableKind, Table: &t} }
