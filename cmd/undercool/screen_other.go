//go:build !unix

package main

import "os"

// terminalWidth is 0 where undercool does not ask the terminal its width:
// $COLUMNS, or the default, sets it.
func terminalWidth(*os.File) int { return 0 }
