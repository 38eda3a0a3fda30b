package locale

import (
	"bytes"
	"log"
	"os"
	"strings"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/lang"
)

func TestNormalise(t *testing.T) {
	for _, tc := range []struct {
		name       string
		env        map[string]string
		key, value string
		ok         bool
	}{
		{"nothing set", nil, "", "", false},
		{"English", map[string]string{"LANG": "en_US.UTF-8"}, "", "", false},
		{"German", map[string]string{"LANG": "de_DE.UTF-8"}, "", "", false},
		// go-locale stops at exactly C or POSIX and reports no language: fyne is quiet already
		{"C", map[string]string{"LANG": "C"}, "", "", false},
		{"POSIX", map[string]string{"LANG": "POSIX"}, "", "", false},
		{"C.UTF-8", map[string]string{"LANG": "C.UTF-8"}, "LANGUAGE", "en", true},
		{"C.utf8", map[string]string{"LANG": "C.utf8"}, "LANGUAGE", "en", true},
		{"POSIX with modifier", map[string]string{"LANG": "POSIX@euro"}, "LANGUAGE", "en", true},
		{"LC_ALL wins over LANG", map[string]string{"LC_ALL": "C.UTF-8", "LANG": "de_DE.UTF-8"}, "LANGUAGE", "en", true},
		{"LC_MESSAGES before LANG", map[string]string{"LC_MESSAGES": "C.UTF-8", "LANG": "fr_FR.UTF-8"}, "LANGUAGE", "en", true},
		{"LC_ALL names a language", map[string]string{"LC_ALL": "fr_FR.UTF-8", "LANG": "C.UTF-8"}, "", "", false},
		{"LANGUAGE already a language", map[string]string{"LANG": "C.UTF-8", "LANGUAGE": "fr:de"}, "", "", false},
		{"C entries dropped from LANGUAGE", map[string]string{"LANG": "C.UTF-8", "LANGUAGE": "fr:C:de"}, "LANGUAGE", "fr:de", true},
		{"LANGUAGE only C", map[string]string{"LANG": "en_GB.UTF-8", "LANGUAGE": "C"}, "LANGUAGE", "en", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			get := func(k string) string { return tc.env[k] }
			key, value, ok := Normalise(get)
			if key != tc.key || value != tc.value || ok != tc.ok {
				t.Fatalf("Normalise = %q, %q, %v; want %q, %q, %v", key, value, ok, tc.key, tc.value, tc.ok)
			}
		})
	}
}

// TestFyneQuiet checks the result against fyne itself: fyne's lang package re-reads the user's
// languages (through go-locale) whenever translations are added, and logs the parse error this package
// exists to avoid. Without Normalise the error must appear (the premise), with it it must not.
func TestFyneQuiet(t *testing.T) {
	var logged bytes.Buffer
	log.SetOutput(&logged)
	t.Cleanup(func() { log.SetOutput(os.Stderr) })
	reload := func() string {
		logged.Reset()
		if err := lang.AddTranslations(fyne.NewStaticResource("en.json", []byte("{}"))); err != nil {
			t.Fatal(err)
		}
		return logged.String()
	}
	for _, l := range []string{"C.UTF-8", "C.utf8", "POSIX.UTF-8"} {
		t.Setenv("LC_ALL", "")
		t.Setenv("LC_MESSAGES", "")
		t.Setenv("LANGUAGE", "")
		t.Setenv("LANG", l)
		if out := reload(); !strings.Contains(out, "Error parsing user locale") {
			t.Fatalf("LANG=%s without Normalise: fyne logged %q, want its parse error (premise gone?)", l, out)
		}
		key, value, ok := Normalise(os.Getenv)
		if !ok {
			t.Fatalf("LANG=%s: no change", l)
		}
		t.Setenv(key, value)
		if out := reload(); out != "" {
			t.Fatalf("LANG=%s, %s=%s: fyne logged %q", l, key, value, out)
		}
	}
}
