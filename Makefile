# Duosweep: `make run` opens the desktop app on the bundled demo; `make test` runs the whole suite.
SHELL := /bin/bash
export PATH := $(PATH):/usr/local/go/bin
GO ?= go

.PHONY: run test test-short deps deps-gui build cli smoke bench package demo clean-bin

run: deps
	$(GO) run ./cmd/duosweep

# The whole suite, with the race detector (needs cgo: gcc).
test: deps
	$(GO) vet ./...
	$(GO) test -race -count=1 ./...

test-short:
	$(GO) test -short ./...

deps:
	@bash scripts/deps.sh build

deps-gui:
	@bash scripts/deps.sh gui

build: deps
	mkdir -p bin
	$(GO) build -o bin/duosweep ./cmd/duosweep
	$(GO) build -o bin/duosweep-cli ./cmd/duosweep-cli

cli:
	mkdir -p bin
	CGO_ENABLED=0 $(GO) build -o bin/duosweep-cli ./cmd/duosweep-cli

# The real window under Xvfb: a window appears and the process is alive after 5 s.
smoke: deps-gui build
	bash scripts/smoke.sh bin/duosweep

bench:
	$(GO) test -run '^$$' -bench . -benchtime 1x ./...

# Linux bundle (.tar.xz with binary, .desktop file and icon) from FyneApp.toml at the repository root.
package: deps
	@command -v fyne >/dev/null 2>&1 || $(GO) install fyne.io/tools/cmd/fyne@v1.7.4
	PATH="$$PATH:$$($(GO) env GOPATH)/bin" fyne package -os linux --src cmd/duosweep --icon ../../icons/duosweep.png
	@ls -l *.tar.xz

demo: cli
	bin/duosweep-cli demo demo.sweep.json
	bin/duosweep-cli compare demo.sweep.json
