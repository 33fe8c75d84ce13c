package main

import "testing"

func TestTrimCode(t *testing.T) {
	js := "// a comment line\nfunction f() {\n    const s = `one\n    two`;  // kept: not a whole-line comment\n\n    return s; // x\n}\n"
	want := "function f() {\nconst s = `one\n    two`;  // kept: not a whole-line comment\nreturn s; // x\n}\n"
	if got := string(trimCode([]byte(js), false)); got != want {
		t.Errorf("trimCode(js) =\n%q\nwant\n%q", got, want)
	}
	css := "/* head */\nbody {\n  color: red; /* inline */\n  /* two\n     lines */\n  margin: 0;\n}\n"
	wantCSS := "body {\ncolor: red;\nmargin: 0;\n}\n"
	if got := string(trimCode([]byte(css), true)); got != wantCSS {
		t.Errorf("trimCode(css) =\n%q\nwant\n%q", got, wantCSS)
	}
}
