// Package icons holds Duosweep's own artwork, bundled into the binary.
//
// The app icon (duosweep.svg) is an original design: a branching passage drawn from its start at the
// bottom, with the two crew members as dots on different branches. duosweep.png is rendered from the SVG
// by render.go (go run ./icons/render.go) and is the icon FyneApp.toml names for packaging.
package icons

import (
	_ "embed"

	"fyne.io/fyne/v2"
)

//go:embed duosweep.svg
var appSVG []byte

//go:embed duosweep.png
var appPNG []byte

// App is the application icon as SVG (crisp at any size; used for the window and the About dialog).
var App = fyne.NewStaticResource("duosweep.svg", appSVG)

// AppPNG is the application icon as a 512×512 PNG (the packaging icon).
var AppPNG = fyne.NewStaticResource("duosweep.png", appPNG)
