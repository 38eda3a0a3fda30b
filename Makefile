# Duosweep: `make run` opens the desktop app on the bundled demo; `make test` runs the whole suite.
SHELL := /bin/bash
export PATH := $(PATH):/usr/local/go/bin
GO ?= go

.PHONY: run test test-short tidy-check deps deps-gui build cli smoke bench package demo clean-bin

run: deps
	$(GO) run ./cmd/duosweep

# The whole suite, with the race detector (needs cgo: gcc).
test: deps tidy-check
	$(GO) vet ./...
	$(GO) test -race -count=1 -timeout 40m ./...

# go.mod and go.sum must stay tidy (direct requirements not marked // indirect); prints the diff when not.
# Works offline with a warm module cache.
tidy-check:
	$(GO) mod tidy -diff

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

# Linux bundle (.tar.xz with binary, .desktop file and icon) from FyneApp.toml at the repository root:
# `fyne package` reads FyneApp.toml only from the folder it packages, so a copy sits there for the run.
package: deps
	@command -v fyne >/dev/null 2>&1 || $(GO) install fyne.io/tools/cmd/fyne@v1.7.4
	cp FyneApp.toml cmd/duosweep/FyneApp.toml
	cd cmd/duosweep && PATH="$$PATH:$$($(GO) env GOPATH)/bin" fyne package -os linux --icon $(CURDIR)/icons/duosweep.png; s=$$?; rm -f FyneApp.toml; exit $$s
	mv cmd/duosweep/Duosweep.tar.xz .
	@ls -l Duosweep.tar.xz

demo: cli
	bin/duosweep-cli demo demo.sweep.json
	bin/duosweep-cli compare demo.sweep.json
