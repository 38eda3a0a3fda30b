// Package geom holds the pure geometry behind the tree editor: the view
// transform between drawing and widget coordinates, hit-testing of nodes and
// corridors, bounding boxes, and the tidy tree layout. It imports nothing from
// fyne, so all of it is covered by plain table tests.
package geom
