package deploy_test

import (
	"encoding/json"
	"net"
	"net/http/httptest"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"steamcell/server"
)

// instruction is one instruction of a Containerfile: its keyword in
// capitals and the rest of its (joined) lines.
type instruction struct {
	line int
	cmd  string
	args string
}

// stage is one FROM … and the instructions under it.
type stage struct {
	from, name string
	body       []instruction
}

// parseContainerfile reads the instructions of a Containerfile (comments
// and blank lines dropped, lines ending in \ joined) by stage. No engine
// builds the image here, so this is what can be checked: the text.
func parseContainerfile(t *testing.T) []stage {
	t.Helper()
	b, err := os.ReadFile("Containerfile")
	if err != nil {
		t.Fatal(err)
	}
	var stages []stage
	var cur strings.Builder
	start := 0
	for i, line := range strings.Split(string(b), "\n") {
		trimmed := strings.TrimSpace(line)
		if cur.Len() == 0 && (trimmed == "" || strings.HasPrefix(trimmed, "#")) {
			continue
		}
		if cur.Len() == 0 {
			start = i + 1
		}
		if cont, ok := strings.CutSuffix(trimmed, `\`); ok {
			cur.WriteString(cont + " ")
			continue
		}
		cur.WriteString(trimmed)
		cmd, args, _ := strings.Cut(cur.String(), " ")
		cur.Reset()
		in := instruction{start, strings.ToUpper(cmd), strings.TrimSpace(args)}
		if in.cmd == "FROM" {
			f := strings.Fields(in.args)
			st := stage{from: f[0]}
			if len(f) == 3 && strings.EqualFold(f[1], "AS") {
				st.name = f[2]
			}
			stages = append(stages, st)
			continue
		}
		if len(stages) == 0 {
			t.Fatalf("Containerfile line %d: %s before FROM", in.line, in.cmd)
		}
		stages[len(stages)-1].body = append(stages[len(stages)-1].body, in)
	}
	return stages
}

func (s stage) all(cmd string) []instruction {
	var out []instruction
	for _, in := range s.body {
		if in.cmd == cmd {
			out = append(out, in)
		}
	}
	return out
}

// execForm reads the JSON array of an exec-form instruction.
func execForm(t *testing.T, in instruction) []string {
	t.Helper()
	var argv []string
	if err := json.Unmarshal([]byte(in.args), &argv); err != nil || len(argv) == 0 {
		t.Fatalf("Containerfile line %d: %s %s is not in exec form (a JSON array): there is no shell in the image", in.line, in.cmd, in.args)
	}
	return argv
}

// healthCheck returns the command of the final stage's HEALTHCHECK.
func healthCheck(t *testing.T) []string {
	t.Helper()
	stages := parseContainerfile(t)
	hcs := stages[len(stages)-1].all("HEALTHCHECK")
	if len(hcs) != 1 {
		t.Fatalf("the final stage has %d HEALTHCHECK instructions, want 1", len(hcs))
	}
	_, cmd, ok := strings.Cut(hcs[0].args, "CMD ")
	if !ok {
		t.Fatalf("HEALTHCHECK %s has no CMD", hcs[0].args)
	}
	return execForm(t, instruction{hcs[0].line, "HEALTHCHECK CMD", strings.TrimSpace(cmd)})
}

// containerfileHealthChecks returns the route the HEALTHCHECK asks, for
// TestProbesNameRealRoutes.
func containerfileHealthChecks(t *testing.T) []string {
	argv := healthCheck(t)
	path := "/healthz" // probe's default
	for i, a := range argv {
		if a == "--path" && i+1 < len(argv) {
			path = argv[i+1]
		}
	}
	return []string{path}
}

// TestContainerfile checks what the text can show: two stages, a static
// build by the release script, an empty base, a numeric non-root user, the
// listen address and port, a writable /tmp for the spool under a read-only
// root, and a health check in exec form through the binary itself.
func TestContainerfile(t *testing.T) {
	stages := parseContainerfile(t)
	if len(stages) < 2 {
		t.Fatalf("%d stages, want a build stage and a run stage", len(stages))
	}
	buildStage, run := stages[0], stages[len(stages)-1]
	if buildStage.name == "" || !strings.HasPrefix(buildStage.from, "golang:1.26") {
		t.Errorf("first stage FROM %s AS %q: want a named golang:1.26 build stage (the Go this project uses)", buildStage.from, buildStage.name)
	}
	builds := false
	for _, in := range buildStage.all("RUN") {
		builds = builds || strings.Contains(in.args, "server/deploy/release.sh")
	}
	if !builds {
		t.Error("the build stage does not build with server/deploy/release.sh")
	}
	rel, err := os.ReadFile("release.sh")
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"CGO_ENABLED=0", "-trimpath", "-X main.Version=", "-X main.Commit=", "SHA256SUMS",
		"linux/amd64", "linux/arm64", "windows/amd64", "darwin/arm64"} {
		if !strings.Contains(string(rel), want) {
			t.Errorf("release.sh lacks %q", want)
		}
	}

	if run.from != "scratch" {
		t.Errorf("the final stage is FROM %s, want scratch (a static binary needs nothing)", run.from)
	}
	copied := map[string]bool{}
	for _, in := range run.all("COPY") {
		f := strings.Fields(in.args)
		if len(f) == 3 && f[0] == "--from="+buildStage.name {
			copied[f[2]] = true
		}
	}
	if !copied["/steamcell"] || !copied["/tmp"] {
		t.Errorf("the final stage copies %v from %s, want /steamcell and an empty /tmp", copied, buildStage.name)
	}

	users := run.all("USER")
	if len(users) != 1 {
		t.Fatalf("the final stage has %d USER, want 1", len(users))
	}
	uid, _, _ := strings.Cut(users[0].args, ":")
	if n, err := strconv.Atoi(uid); err != nil || n == 0 {
		t.Errorf("USER %s: want a numeric non-zero user, so that runAsNonRoot can check it", users[0].args)
	}

	env := map[string]string{}
	for _, in := range run.all("ENV") {
		for _, kv := range strings.Fields(in.args) {
			k, v, _ := strings.Cut(kv, "=")
			env[k] = v
		}
	}
	host, port, err := net.SplitHostPort(env["STEAMCELL_ADDR"])
	if err != nil || host != "0.0.0.0" {
		t.Errorf("ENV STEAMCELL_ADDR=%q: want 0.0.0.0 and a port inside the container", env["STEAMCELL_ADDR"])
	}
	if ex := run.all("EXPOSE"); len(ex) != 1 || ex[0].args != port {
		t.Errorf("EXPOSE %v, want the port of STEAMCELL_ADDR %s", ex, port)
	}
	if env["TMPDIR"] != "/tmp" {
		t.Errorf("ENV TMPDIR=%q, want /tmp, the one writable place", env["TMPDIR"])
	}

	ep, cmd := run.all("ENTRYPOINT"), run.all("CMD")
	if len(ep) != 1 || len(cmd) != 1 {
		t.Fatalf("ENTRYPOINT %v, CMD %v: want one of each", ep, cmd)
	}
	if argv := execForm(t, ep[0]); len(argv) != 1 || argv[0] != "/steamcell" {
		t.Errorf("ENTRYPOINT %v, want [\"/steamcell\"]", argv)
	}
	if argv := execForm(t, cmd[0]); len(argv) != 1 || argv[0] != "serve" {
		t.Errorf("CMD %v, want [\"serve\"]", argv)
	}
	if hc := healthCheck(t); hc[0] != "/steamcell" || len(hc) < 2 || hc[1] != "probe" {
		t.Errorf("HEALTHCHECK CMD %v, want /steamcell probe", hc)
	}
}

// TestHealthCheckRuns builds the binary and runs the HEALTHCHECK's command
// line against a real server, with the binary's path and STEAMCELL_ADDR
// put in for the image's: exit 0 while the server answers, non-zero once
// it is gone.
func TestHealthCheckRuns(t *testing.T) {
	bin := filepath.Join(t.TempDir(), "steamcell")
	out, err := exec.Command("go", "build", "-C", "../..", "-o", bin, "./cmd/steamcell").CombinedOutput()
	if err != nil {
		t.Fatalf("go build ./cmd/steamcell: %v\n%s", err, out)
	}
	hs := httptest.NewServer(server.New(server.Config{Token: "test-token-kestrel", Version: "test"}))
	argv := healthCheck(t)
	probe := func() ([]byte, error) {
		c := exec.Command(bin, argv[1:]...)
		c.Env = append(os.Environ(), "STEAMCELL_ADDR="+strings.TrimPrefix(hs.URL, "http://"))
		return c.CombinedOutput()
	}
	if out, err := probe(); err != nil {
		t.Errorf("HEALTHCHECK %v against a running server: %v\n%s", argv, err, out)
	}
	hs.Close()
	if out, err := probe(); err == nil {
		t.Errorf("HEALTHCHECK %v against a stopped server: exit 0 (%s), want a failure", argv, out)
	}
}
