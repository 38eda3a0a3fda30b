package ui

import (
	"sort"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/engine"
)

// column is a column of the candidate table.
type column int

// Columns of the candidate table, in display order.
const (
	colNode    column = iota // the candidate junction, ◆ for the worst exit
	colFoundAt               // when the exit there is found
	colFinder                // who finds it
	colEvacAt                // when both agents are out through it
	numColumns
)

// columnTitles and columnWidths are indexed by column.
var (
	columnTitles = [numColumns]string{"Node", "Found at", "Finder", "Evacuated at"}
	columnWidths = [numColumns]float32{130, 90, 80, 110}
)

// candidateTable is the sortable per-candidate table of the current report. A click on a header sorts
// by that column (again: reversed); a click on a row replays that exit.
type candidateTable struct {
	site   *engine.Site
	report *engine.Report // nil: the table is empty
	rows   []int          // indices into report.Exits, in display order
	// sortCol is the column rows are sorted by (ties by node index), descending when sortDesc
	sortCol  column
	sortDesc bool
	widget   *widget.Table
}

// build makes the table widget; replay is called with the node of a clicked row.
func (c *candidateTable) build(replay func(node int)) fyne.CanvasObject {
	t := widget.NewTable(
		func() (int, int) { return len(c.rows), int(numColumns) },
		func() fyne.CanvasObject {
			l := widget.NewLabel("")
			l.Truncation = fyne.TextTruncateEllipsis
			return l
		},
		func(id widget.TableCellID, o fyne.CanvasObject) {
			o.(*widget.Label).SetText(c.cell(id.Row, column(id.Col)))
		},
	)
	t.ShowHeaderRow = true
	t.CreateHeader = func() fyne.CanvasObject {
		b := widget.NewButton("", nil)
		b.Importance = widget.LowImportance
		b.Alignment = widget.ButtonAlignLeading
		return b
	}
	t.UpdateHeader = func(id widget.TableCellID, o fyne.CanvasObject) {
		c.updateHeader(column(id.Col), o.(*widget.Button))
	}
	t.OnSelected = func(id widget.TableCellID) {
		if id.Row >= 0 && id.Row < len(c.rows) && c.report != nil {
			replay(c.report.Exits[c.rows[id.Row]].Node)
		}
		t.UnselectAll()
	}
	for col, wd := range columnWidths {
		t.SetColumnWidth(col, wd)
	}
	c.widget = t
	return t
}

// updateHeader shows the title of col, with an arrow on the sort column, and sorts by col on a tap.
func (c *candidateTable) updateHeader(col column, b *widget.Button) {
	if col < 0 || col >= numColumns {
		b.SetText("")
		b.OnTapped = nil
		return
	}
	b.Icon = nil
	if col == c.sortCol {
		if c.sortDesc {
			b.Icon = theme.MenuDropDownIcon()
		} else {
			b.Icon = theme.MenuDropUpIcon()
		}
	}
	b.SetText(columnTitles[col])
	b.OnTapped = func() { c.sortBy(col) }
}

// show fills the table with the candidates of report on site (nil: empty).
func (c *candidateTable) show(site *engine.Site, report *engine.Report) {
	c.site, c.report = site, report
	c.sortRows()
	c.widget.Refresh()
}

// sortBy sorts the table by col; a second click on the same column reverses the order.
func (c *candidateTable) sortBy(col column) {
	if c.sortCol == col {
		c.sortDesc = !c.sortDesc
	} else {
		c.sortCol, c.sortDesc = col, false
	}
	c.sortRows()
	c.widget.Refresh()
}

// sortRows orders c.rows by the sort column; ties by node index.
func (c *candidateTable) sortRows() {
	c.rows = c.rows[:0]
	r := c.report
	if r == nil {
		return
	}
	for i := range r.Exits {
		c.rows = append(c.rows, i)
	}
	key := func(i int) (float64, string) {
		ex := r.Exits[i]
		switch c.sortCol {
		case colFoundAt:
			return ex.FoundAt, ""
		case colFinder:
			return 0, finderName(c.site, ex.Finder)
		case colEvacAt:
			return ex.EvacAt, ""
		}
		return float64(ex.Node), "" // scenario order
	}
	sort.SliceStable(c.rows, func(x, y int) bool {
		i, j := c.rows[x], c.rows[y]
		fi, si := key(i)
		fj, sj := key(j)
		less, more := fi < fj || (fi == fj && si < sj), fi > fj || (fi == fj && si > sj)
		if c.sortDesc {
			less, more = more, less
		}
		if less || more {
			return less
		}
		return r.Exits[i].Node < r.Exits[j].Node
	})
}

// cell is the text of one cell.
func (c *candidateTable) cell(row int, col column) string {
	if c.report == nil || row >= len(c.rows) {
		return ""
	}
	ex := c.report.Exits[c.rows[row]]
	switch col {
	case colNode:
		mark := ""
		if ex.Node == c.report.WorstExit {
			mark = " ◆"
		}
		return nodeName(c.site, ex.Node) + mark
	case colFoundAt:
		return clock(ex.FoundAt)
	case colFinder:
		return finderName(c.site, ex.Finder)
	case colEvacAt:
		return clock(ex.EvacAt)
	}
	return ""
}
