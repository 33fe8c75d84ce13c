package main

import (
	"bytes"
	"strings"
)

// trimCode shrinks the page's own scripts and stylesheets before they are inlined: it removes
// the indentation of every line, blank lines, whole-line // comments in JavaScript and /* */
// comments in CSS. It changes nothing inside a JavaScript template literal that spans lines (it
// tracks backticks line by line) and never joins lines, so automatic semicolon insertion and
// line numbers of code are unaffected in meaning. wasm_exec.js is inlined as the toolchain wrote
// it.
func trimCode(src []byte, css bool) []byte {
	var out bytes.Buffer
	out.Grow(len(src))
	inTemplate, inComment := false, false
	for _, line := range strings.Split(string(src), "\n") {
		if inTemplate {
			out.WriteString(line)
			out.WriteByte('\n')
			if strings.Count(line, "`")%2 == 1 {
				inTemplate = false
			}
			continue
		}
		t := strings.TrimSpace(line)
		if css {
			t = stripCSSComments(t, &inComment)
			t = strings.TrimSpace(t)
		} else if strings.HasPrefix(t, "//") {
			continue
		}
		if t == "" {
			continue
		}
		out.WriteString(t)
		out.WriteByte('\n')
		if !css && strings.Count(t, "`")%2 == 1 {
			inTemplate = true
		}
	}
	return out.Bytes()
}

// stripCSSComments removes /* … */ comments from one line of CSS, carrying an open comment to
// the next line in *open.
func stripCSSComments(line string, open *bool) string {
	var b strings.Builder
	for len(line) > 0 {
		if *open {
			i := strings.Index(line, "*/")
			if i < 0 {
				return b.String()
			}
			line = line[i+2:]
			*open = false
			continue
		}
		i := strings.Index(line, "/*")
		if i < 0 {
			b.WriteString(line)
			break
		}
		b.WriteString(line[:i])
		line = line[i+2:]
		*open = true
	}
	return b.String()
}
