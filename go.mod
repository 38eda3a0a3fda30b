module duosweep

go 1.26

require (
	fyne.io/fyne/v2 v2.7.1 // indirect
	github.com/goccy/go-json v0.12.0 // indirect
	github.com/stretchr/testify v1.12.1 // indirect
	gonum.org/v1/gonum v0.17.0 // indirect
)
