// Package locale keeps the desktop app quiet at start under the C or POSIX locale.
//
// Fyne v2.7.1 reads the user's languages with github.com/jeandeaual/go-locale, which takes the first
// non-empty of LC_ALL, LC_MESSAGES and LANG, and then LANGUAGE unless that value is exactly "C" or
// "POSIX". For "C.UTF-8" (servers, containers, CI) it hands fyne the language "C", which fyne cannot
// parse: it logs "Fyne error: Error parsing user locale C" before the window opens, and then falls back
// to English anyway. Normalise names English in LANGUAGE for that case, so fyne reads "en" and says
// nothing.
//
// Only LANGUAGE is changed: it names message languages and nothing else. LC_ALL and LANG stay as they
// are, because the windowing library (GLFW) sets the C library's character type from them
// (setlocale(LC_CTYPE, "")) for text input, and "C.UTF-8" is installed where "en_US.UTF-8" may not be.
//
// The package applies Normalise in its init function. fyne's lang package reads the locale in its own
// init function, so this must run first: Go initialises packages in import-path order among those whose
// imports are ready, and this package imports only os and strings and sorts before "fyne.io/...". The
// app imports it for that side effect alone.
package locale

import (
	"os"
	"strings"
)

// English is the LANGUAGE value set when the locale names no language.
const English = "en"

func init() {
	if key, value, ok := Normalise(os.Getenv); ok {
		os.Setenv(key, value)
	}
}

// Normalise returns the environment variable to set, and its value, so that go-locale hands fyne only
// languages it can parse; ok is false when the environment needs no change. getenv reads the
// environment (os.Getenv in the app).
//
// When the effective locale is exactly C or POSIX, go-locale reports no language and fyne uses English
// quietly: nothing changes. Otherwise go-locale reads LANGUAGE if set, else the locale itself; the C and
// POSIX entries among them (C.UTF-8, POSIX@euro…) are dropped from LANGUAGE, and LANGUAGE becomes
// English when nothing is left.
func Normalise(getenv func(string) string) (key, value string, ok bool) {
	locale := ""
	for _, k := range [...]string{"LC_ALL", "LC_MESSAGES", "LANG"} {
		if locale = getenv(k); locale != "" {
			break
		}
	}
	if locale == "C" || locale == "POSIX" {
		return "", "", false
	}
	entries := []string{locale}
	if languages := getenv("LANGUAGE"); languages != "" {
		entries = strings.Split(languages, ":")
	}
	var keep []string
	for _, e := range entries {
		if !isC(e) {
			keep = append(keep, e)
		}
	}
	if len(keep) == len(entries) {
		return "", "", false // every entry names a language (or none is set at all)
	}
	if len(keep) == 0 {
		return "LANGUAGE", English, true
	}
	return "LANGUAGE", strings.Join(keep, ":"), true
}

// isC reports whether a locale entry names the C or POSIX locale, with any encoding or modifier
// (C.UTF-8, C.utf8, POSIX@euro).
func isC(entry string) bool {
	base, _, _ := strings.Cut(entry, ".")
	base, _, _ = strings.Cut(base, "@")
	return base == "C" || base == "POSIX"
}
