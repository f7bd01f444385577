package main

import (
	"bufio"
	"context"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"
)

// readmeBase is the server address the README's examples use.
const readmeBase = "http://127.0.0.1:8097"

// codeBlock is one fenced block of the README.
type codeBlock struct {
	lang string // the info string: "sh", "python", "text", …
	line int    // line of the opening fence, for messages
	body []string
}

// readmeBlocks returns the fenced code blocks of the README in order.
func readmeBlocks(t *testing.T, path string) []codeBlock {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var out []codeBlock
	var cur *codeBlock
	for i, line := range strings.Split(string(data), "\n") {
		switch {
		case cur == nil && strings.HasPrefix(line, "```"):
			cur = &codeBlock{lang: strings.TrimSpace(strings.TrimPrefix(line, "```")), line: i + 1}
		case cur != nil && strings.TrimSpace(line) == "```":
			out = append(out, *cur)
			cur = nil
		case cur != nil:
			cur.body = append(cur.body, line)
		}
	}
	if cur != nil {
		t.Fatalf("README: code block at line %d is not closed", cur.line)
	}
	return out
}

// expectLine makes a line of output as the README prints it into a pattern:
// "…" after a digit stands for more digits (the README stops copying a
// float64 there), "…" elsewhere for any text; runs of spaces match runs of
// spaces, so that the README need not keep a table's column widths.
func expectLine(want string) *regexp.Regexp {
	var b strings.Builder
	b.WriteString("^")
	parts := strings.Split(want, "…")
	for i, part := range parts {
		b.WriteString(regexp.MustCompile(` +`).ReplaceAllString(regexp.QuoteMeta(part), ` +`))
		if i < len(parts)-1 {
			if part != "" && part[len(part)-1] >= '0' && part[len(part)-1] <= '9' {
				b.WriteString(`\d*`)
			} else {
				b.WriteString(`.*`)
			}
		}
	}
	b.WriteString("$")
	return regexp.MustCompile(b.String())
}

// matchOutput compares output with the lines the README prints for it.
func matchOutput(t *testing.T, what, got string, want []string) {
	t.Helper()
	lines := strings.Split(strings.TrimRight(got, "\n"), "\n")
	if len(want) == 0 {
		return
	}
	if len(lines) != len(want) {
		t.Errorf("%s: %d lines of output, the README prints %d:\n%s", what, len(lines), len(want), got)
		return
	}
	for i, w := range want {
		if !expectLine(w).MatchString(strings.TrimRight(lines[i], " ")) {
			t.Errorf("%s: line %d is\n  %s\nthe README prints\n  %s", what, i+1, lines[i], w)
		}
	}
}

// TestREADMEExamples runs every curl, state and Python example of the
// README against a live server (the steamcell binary, built here, serving
// on a free port) and compares each output with what the README prints
// under it.
func TestREADMEExamples(t *testing.T) {
	root, err := filepath.Abs("../..")
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	bin := filepath.Join(dir, "steamcell")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	python, err := exec.LookPath("python3")
	if err != nil {
		t.Fatalf("the README's Python example needs python3: %v", err)
	}
	base := startServer(t, bin)
	env := append(os.Environ(), "PATH="+dir+string(os.PathListSeparator)+os.Getenv("PATH"))
	run := func(name string, args []string, stdin string) string {
		ctx, cancel := context.WithTimeout(context.Background(), time.Minute)
		defer cancel()
		cmd := exec.CommandContext(ctx, name, args...)
		cmd.Dir, cmd.Env = root, env
		cmd.Stdin = strings.NewReader(stdin)
		var stderr strings.Builder
		cmd.Stderr = &stderr
		out, err := cmd.Output()
		if err != nil {
			t.Errorf("%s: %v\n%s%s", strings.Join(args, " "), err, out, stderr.String())
		}
		return string(out)
	}
	local := func(s string) string {
		s = strings.ReplaceAll(s, readmeBase, base)
		return strings.ReplaceAll(s, " /tmp/", " "+dir+"/")
	}

	blocks := readmeBlocks(t, filepath.Join(root, "README.md"))
	ran := map[string]int{}
	for i, b := range blocks {
		switch b.lang {
		case "sh":
			for j := 0; j < len(b.body); j++ {
				line := strings.TrimSpace(b.body[j])
				kind := ""
				switch {
				case strings.HasPrefix(line, "curl "):
					kind = "curl"
				case strings.HasPrefix(line, "steamcell state "):
					kind = "state"
				case strings.HasPrefix(line, "steamcell table "):
					kind = "table"
				}
				if kind == "" {
					continue
				}
				var want []string
				for j+1 < len(b.body) && strings.HasPrefix(b.body[j+1], "# ") {
					j++
					want = append(want, strings.TrimPrefix(b.body[j], "# "))
				}
				if len(want) == 0 && j == len(b.body)-1 && i+1 < len(blocks) && blocks[i+1].lang == "text" {
					want = blocks[i+1].body // the output shown in a block of its own
				}
				if kind == "state" && len(want) == 0 {
					t.Errorf("README line %d: %s prints no output to compare", b.line+j+1, line)
				}
				got := run("bash", []string{"-c", local(line)}, "")
				matchOutput(t, "README: "+line, got, want)
				ran[kind]++
			}
		case "python":
			if i+1 == len(blocks) || blocks[i+1].lang != "text" {
				t.Errorf("README line %d: the Python example is not followed by a text block of its output", b.line)
				continue
			}
			got := run(python, []string{"-"}, local(strings.Join(b.body, "\n")))
			matchOutput(t, "README Python example at line "+strconv.Itoa(b.line), got, blocks[i+1].body)
			ran["python"]++
		}
	}
	for _, kind := range []string{"curl", "state", "python"} {
		if ran[kind] == 0 {
			t.Errorf("the README has no %s example to run", kind)
		}
	}
	t.Logf("ran %d curl, %d state and %d Python examples", ran["curl"], ran["state"], ran["python"])
}

// startServer starts "steamcell serve" on a free port of 127.0.0.1 and
// returns its base URL; the server is stopped when the test ends.
func startServer(t *testing.T, bin string) string {
	t.Helper()
	cmd := exec.Command(bin, "serve", "--addr", "127.0.0.1:0")
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		_ = cmd.Process.Signal(os.Interrupt)
		_ = cmd.Wait()
	})
	line, err := bufio.NewReader(stdout).ReadString('\n')
	if err != nil {
		t.Fatalf("steamcell serve printed no address: %v", err)
	}
	m := regexp.MustCompile(`http://127\.0\.0\.1:\d+`).FindString(line)
	if m == "" {
		t.Fatalf("steamcell serve printed %q, no address", line)
	}
	return m
}
