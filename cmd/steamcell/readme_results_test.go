package main

import (
	"os"
	"strings"
	"testing"
)

// TestReadmeResultsExamples runs every steamcell command shown in the
// README's section on results and uncertainty and compares its output
// with the text block under it (trailing spaces aside), so that the
// README cannot drift from the program.
func TestReadmeResultsExamples(t *testing.T) {
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	start := strings.Index(text, "<!-- results:begin")
	end := strings.Index(text, "<!-- results:end -->")
	if start < 0 || end < start {
		t.Fatal("README has no results section markers")
	}
	blocks := strings.Split(text[start:end], "```")
	ran := 0
	for i := 1; i+2 < len(blocks); i += 2 {
		cmdBlock := blocks[i]
		if !strings.HasPrefix(cmdBlock, "sh\n") {
			continue
		}
		line := strings.TrimSpace(strings.TrimPrefix(cmdBlock, "sh\n"))
		if !strings.HasPrefix(line, "steamcell ") || strings.Contains(line, "\n") {
			t.Fatalf("README shell block %q is not one steamcell command", line)
		}
		want := blocks[i+2]
		if !strings.HasPrefix(want, "text\n") {
			t.Fatalf("README: no text block after %q", line)
		}
		want = strings.TrimPrefix(want, "text\n")
		code, out, errs := runApp(t, strings.Fields(line)[1:]...)
		if code != ExitOK {
			t.Errorf("%s: exit %d: %s", line, code, errs)
			continue
		}
		if got := trimLines(out); got != trimLines(want) {
			t.Errorf("%s: output\n%s\nREADME shows\n%s", line, got, trimLines(want))
		}
		ran++
	}
	if ran < 5 {
		t.Errorf("ran %d README examples, want the 5 the section shows", ran)
	}
}

func trimLines(s string) string {
	lines := strings.Split(strings.TrimRight(s, "\n"), "\n")
	for i, l := range lines {
		lines[i] = strings.TrimRight(l, " ")
	}
	return strings.Join(lines, "\n")
}
