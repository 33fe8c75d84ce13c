//go:build js && wasm

package main

import (
	"os"
	"regexp"
	"slices"
	"testing"

	"copoly/copoly"
	"copoly/copoly/project"
)

// TestErrorCodesInDTS: the ErrorCode type of site/copoly.d.ts lists exactly copoly.Codes(), the
// one definition of the codes the bridge reports.
func TestErrorCodesInDTS(t *testing.T) {
	src, err := os.ReadFile("../site/copoly.d.ts")
	if err != nil {
		t.Fatal(err)
	}
	union := regexp.MustCompile(`(?s)export type ErrorCode =(.*?);`).FindSubmatch(src)
	if union == nil {
		t.Fatal("site/copoly.d.ts has no ErrorCode type")
	}
	var got []string
	for _, m := range regexp.MustCompile(`"([^"]+)"`).FindAllSubmatch(union[1], -1) {
		got = append(got, string(m[1]))
	}
	if want := copoly.Codes(); !slices.Equal(got, want) {
		t.Errorf("ErrorCode of site/copoly.d.ts = %q, want copoly.Codes() = %q", got, want)
	}
}

// TestLimitsInDTS: the Limits interface of site/copoly.d.ts names exactly the limits of
// project.Limits, in their order.
func TestLimitsInDTS(t *testing.T) {
	src, err := os.ReadFile("../site/copoly.d.ts")
	if err != nil {
		t.Fatal(err)
	}
	body := regexp.MustCompile(`(?s)export interface Limits \{(.*?)\n\}`).FindSubmatch(src)
	if body == nil {
		t.Fatal("site/copoly.d.ts has no Limits interface")
	}
	var got, want []string
	for _, m := range regexp.MustCompile(`(\w+): number;`).FindAllSubmatch(body[1], -1) {
		got = append(got, string(m[1]))
	}
	for _, l := range project.Limits() {
		want = append(want, l.Name)
	}
	if !slices.Equal(got, want) {
		t.Errorf("Limits of site/copoly.d.ts = %q, want project.Limits() = %q", got, want)
	}
}
