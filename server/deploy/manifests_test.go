// Package deploy_test checks the deployment files of steamcell against
// the Kubernetes API types, kustomize itself and the server's real routes.
// It lives in a module of its own so that the main module does not depend
// on the Kubernetes libraries.
package deploy_test

import (
	"bytes"
	"fmt"
	"io/fs"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strings"
	"testing"

	appsv1 "k8s.io/api/apps/v1"
	autoscalingv2 "k8s.io/api/autoscaling/v2"
	corev1 "k8s.io/api/core/v1"
	networkingv1 "k8s.io/api/networking/v1"
	policyv1 "k8s.io/api/policy/v1"
	metav1 "k8s.io/apimachinery/pkg/apis/meta/v1"
	"k8s.io/apimachinery/pkg/apis/meta/v1/unstructured"
	"k8s.io/apimachinery/pkg/labels"
	"sigs.k8s.io/kustomize/api/krusty"
	kusttypes "sigs.k8s.io/kustomize/api/types"
	"sigs.k8s.io/kustomize/kyaml/filesys"
	"sigs.k8s.io/yaml"

	"steamcell/server"
)

const manifests = "kubernetes"

// typed are the kinds the manifests may hold, each with the Go type of
// the Kubernetes API (or of kustomize) it must decode into. A kind not
// listed is an error, except those in unstructuredKinds.
var typed = map[string]func() any{
	"apps/v1 Deployment":                            func() any { return &appsv1.Deployment{} },
	"v1 Service":                                    func() any { return &corev1.Service{} },
	"v1 Secret":                                     func() any { return &corev1.Secret{} },
	"autoscaling/v2 HorizontalPodAutoscaler":        func() any { return &autoscalingv2.HorizontalPodAutoscaler{} },
	"policy/v1 PodDisruptionBudget":                 func() any { return &policyv1.PodDisruptionBudget{} },
	"networking.k8s.io/v1 NetworkPolicy":            func() any { return &networkingv1.NetworkPolicy{} },
	"kustomize.config.k8s.io/v1beta1 Kustomization": func() any { return &kusttypes.Kustomization{} },
}

// unstructuredKinds are custom resources without Go types here: the
// ServiceMonitor of the Prometheus Operator. Their fields are checked one
// by one in TestBuild.
var unstructuredKinds = map[string]bool{"monitoring.coreos.com/v1 ServiceMonitor": true}

// decodeStrict decodes one manifest into its API type; an unknown or
// repeated field is an error.
func decodeStrict(doc []byte) (any, string, error) {
	var tm metav1.TypeMeta
	if err := yaml.Unmarshal(doc, &tm); err != nil {
		return nil, "", err
	}
	key := tm.APIVersion + " " + tm.Kind
	if unstructuredKinds[key] {
		u := &unstructured.Unstructured{}
		return u, key, yaml.Unmarshal(doc, &u.Object)
	}
	mk, ok := typed[key]
	if !ok {
		return nil, key, fmt.Errorf("kind %q is not one the deployment uses", key)
	}
	obj := mk()
	return obj, key, yaml.UnmarshalStrict(doc, obj)
}

// yamlFiles lists the YAML files under dir.
func yamlFiles(t *testing.T, dir string) []string {
	t.Helper()
	var files []string
	err := filepath.WalkDir(dir, func(p string, d fs.DirEntry, err error) error {
		if err == nil && !d.IsDir() && (strings.HasSuffix(p, ".yaml") || strings.HasSuffix(p, ".yml")) {
			files = append(files, p)
		}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(files) == 0 {
		t.Fatalf("no manifests under %s", dir)
	}
	return files
}

// TestManifestsDecodeStrictly: every file (bases, overlays and patches)
// decodes into the Kubernetes API types with no unknown field.
func TestManifestsDecodeStrictly(t *testing.T) {
	// The check itself: a misspelt field is refused.
	if _, _, err := decodeStrict([]byte("apiVersion: apps/v1\nkind: Deployment\nspec:\n  replicaz: 2\n")); err == nil {
		t.Fatal("a Deployment with the field replicaz decoded without error; the check is not strict")
	}
	for _, f := range yamlFiles(t, manifests) {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		for i, doc := range bytes.Split(b, []byte("\n---")) {
			if len(bytes.TrimSpace(doc)) == 0 {
				continue
			}
			if _, key, err := decodeStrict(doc); err != nil {
				t.Errorf("%s, document %d (%s): %v", f, i+1, key, err)
			}
		}
	}
}

// TestKustomizationListsEveryFile: each kustomization names every YAML
// file beside it (as a resource or a patch) and names no file that is
// missing, so that no manifest is left out of a build unnoticed.
func TestKustomizationListsEveryFile(t *testing.T) {
	dirs := 0
	for _, f := range yamlFiles(t, manifests) {
		if filepath.Base(f) != "kustomization.yaml" {
			continue
		}
		dirs++
		dir := filepath.Dir(f)
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		var k kusttypes.Kustomization
		if err := yaml.UnmarshalStrict(b, &k); err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		var listed []string
		for _, r := range k.Resources {
			if st, err := os.Stat(filepath.Join(dir, r)); err != nil {
				t.Errorf("%s lists %s, which does not exist", f, r)
			} else if !st.IsDir() {
				listed = append(listed, filepath.Clean(r))
			}
		}
		for _, p := range k.Patches {
			listed = append(listed, filepath.Clean(p.Path))
		}
		var present []string
		entries, err := os.ReadDir(dir)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range entries {
			if n := e.Name(); !e.IsDir() && n != "kustomization.yaml" && strings.HasSuffix(n, ".yaml") {
				present = append(present, n)
			}
		}
		sort.Strings(listed)
		sort.Strings(present)
		if !slices.Equal(listed, present) {
			t.Errorf("%s lists %q; the directory holds %q", f, listed, present)
		}
	}
	if dirs < 2 {
		t.Errorf("found %d kustomizations, want a base and at least one overlay", dirs)
	}
}

// built is the output of one kustomize build, decoded.
type built struct {
	deployment *appsv1.Deployment
	service    *corev1.Service
	secret     *corev1.Secret
	hpa        *autoscalingv2.HorizontalPodAutoscaler
	pdb        *policyv1.PodDisruptionBudget
	netpol     *networkingv1.NetworkPolicy
	monitor    *unstructured.Unstructured
}

// build runs kustomize (in process, as `kubectl apply -k` would) on dir,
// on a copy of the tree in memory with the overlay's token file written,
// and decodes every resource of the result strictly.
func build(t *testing.T, dir string) built {
	t.Helper()
	mem := filesys.MakeFsInMemory()
	for _, f := range yamlFiles(t, manifests) {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if err := mem.WriteFile("/"+f, b); err != nil {
			t.Fatal(err)
		}
	}
	// The token an operator writes beside the overlay's kustomization.
	for _, overlay := range []string{"kubernetes/overlays/kestrel-bay"} {
		if err := mem.WriteFile("/"+overlay+"/token", []byte("test-token-kestrel\n")); err != nil {
			t.Fatal(err)
		}
	}
	rm, err := krusty.MakeKustomizer(krusty.MakeDefaultOptions()).Run(mem, "/"+dir)
	if err != nil {
		t.Fatalf("kustomize build %s: %v", dir, err)
	}
	out, err := rm.AsYaml()
	if err != nil {
		t.Fatal(err)
	}
	var b built
	for _, doc := range bytes.Split(out, []byte("\n---\n")) {
		obj, key, err := decodeStrict(doc)
		if err != nil {
			t.Fatalf("kustomize build %s: %s: %v", dir, key, err)
		}
		switch o := obj.(type) {
		case *appsv1.Deployment:
			b.deployment = o
		case *corev1.Service:
			b.service = o
		case *corev1.Secret:
			b.secret = o
		case *autoscalingv2.HorizontalPodAutoscaler:
			b.hpa = o
		case *policyv1.PodDisruptionBudget:
			b.pdb = o
		case *networkingv1.NetworkPolicy:
			b.netpol = o
		case *unstructured.Unstructured:
			b.monitor = o
		default:
			t.Errorf("kustomize build %s: unexpected %s", dir, key)
		}
	}
	if b.deployment == nil || b.service == nil || b.secret == nil || b.hpa == nil || b.pdb == nil || b.netpol == nil || b.monitor == nil {
		t.Fatalf("kustomize build %s lacks a resource: %+v", dir, b)
	}
	return b
}

// TestBuild builds the base and the overlay and checks that the pieces fit
// one another: ports, selectors, probes, the secret, the security context.
func TestBuild(t *testing.T) {
	for _, dir := range []string{"kubernetes/base", "kubernetes/overlays/kestrel-bay"} {
		t.Run(dir, func(t *testing.T) {
			b := build(t, dir)
			checkDeployment(t, b)
			checkNeighbours(t, b)
		})
	}
	overlay := build(t, "kubernetes/overlays/kestrel-bay")
	if ns := overlay.deployment.Namespace; ns == "" {
		t.Error("the overlay sets no namespace")
	}
	if img := overlay.deployment.Spec.Template.Spec.Containers[0].Image; !strings.Contains(img, "/steamcell:") {
		t.Errorf("the overlay's image %q names no registry and tag", img)
	}
	if tok := overlay.secret.Data["token"]; len(bytes.TrimSpace(tok)) == 0 {
		t.Error("the overlay's Secret has no token from its token file")
	}
	if min := overlay.hpa.Spec.MinReplicas; min == nil || *min < 2 {
		t.Errorf("the overlay's HPA minReplicas %v, want at least 2", min)
	}
}

func checkDeployment(t *testing.T, b built) {
	t.Helper()
	d := b.deployment
	pod := d.Spec.Template.Spec
	if d.Spec.Replicas == nil || *d.Spec.Replicas < 2 {
		t.Errorf("replicas %v, want at least 2 so that one can drain", d.Spec.Replicas)
	}
	if !labels.SelectorFromSet(d.Spec.Selector.MatchLabels).Matches(labels.Set(d.Spec.Template.Labels)) {
		t.Errorf("the Deployment's selector %v does not match its pods %v", d.Spec.Selector.MatchLabels, d.Spec.Template.Labels)
	}
	if len(pod.Containers) != 1 {
		t.Fatalf("%d containers, want 1", len(pod.Containers))
	}
	c := pod.Containers[0]
	env := map[string]string{}
	for _, e := range c.Env {
		env[e.Name] = e.Value
	}

	// The port: the one the server is told to listen on, named http.
	var port int32
	for _, p := range c.Ports {
		if p.Name == "http" {
			port = p.ContainerPort
		}
	}
	if want := "0.0.0.0:" + fmt.Sprint(port); port == 0 || env["STEAMCELL_ADDR"] != want {
		t.Errorf("container port http %d, STEAMCELL_ADDR %q: want the server on %s", port, env["STEAMCELL_ADDR"], want)
	}

	// Probes: liveness on /healthz, readiness on /readyz, on that port.
	for _, pr := range []struct {
		what  string
		probe *corev1.Probe
		path  string
	}{{"liveness", c.LivenessProbe, "/healthz"}, {"readiness", c.ReadinessProbe, "/readyz"}} {
		if pr.probe == nil || pr.probe.HTTPGet == nil {
			t.Errorf("no HTTP %s probe", pr.what)
			continue
		}
		if pr.probe.HTTPGet.Path != pr.path || pr.probe.HTTPGet.Port.String() != "http" {
			t.Errorf("%s probe GET %s on port %s, want %s on http", pr.what, pr.probe.HTTPGet.Path, pr.probe.HTTPGet.Port.String(), pr.path)
		}
	}

	// Security: not root, nothing to escalate, no capability, read-only root.
	sc := c.SecurityContext
	nonRoot := sc != nil && sc.RunAsNonRoot != nil && *sc.RunAsNonRoot ||
		pod.SecurityContext != nil && pod.SecurityContext.RunAsNonRoot != nil && *pod.SecurityContext.RunAsNonRoot
	if !nonRoot {
		t.Error("runAsNonRoot is not set")
	}
	if pod.SecurityContext == nil || pod.SecurityContext.RunAsUser == nil || *pod.SecurityContext.RunAsUser == 0 {
		t.Error("the pod names no non-zero runAsUser (the image's USER is numeric for this)")
	}
	if sc == nil || sc.ReadOnlyRootFilesystem == nil || !*sc.ReadOnlyRootFilesystem {
		t.Error("readOnlyRootFilesystem is not true")
	}
	if sc == nil || sc.AllowPrivilegeEscalation == nil || *sc.AllowPrivilegeEscalation {
		t.Error("allowPrivilegeEscalation is not false")
	}
	if sc == nil || sc.Capabilities == nil || !slices.Contains(sc.Capabilities.Drop, "ALL") || len(sc.Capabilities.Add) > 0 {
		t.Errorf("capabilities %+v, want drop ALL and add none", sc.Capabilities)
	}

	// Resources: CPU requests are what the HPA's utilisation is taken of.
	for _, name := range []corev1.ResourceName{corev1.ResourceCPU, corev1.ResourceMemory} {
		if _, ok := c.Resources.Requests[name]; !ok {
			t.Errorf("no request of %s", name)
		}
		if _, ok := c.Resources.Limits[name]; !ok {
			t.Errorf("no limit of %s", name)
		}
	}

	// A read-only root: the spool of batch bodies needs a writable /tmp.
	mounts := map[string]corev1.VolumeMount{}
	for _, m := range c.VolumeMounts {
		mounts[m.Name] = m
	}
	volumes := map[string]corev1.Volume{}
	for _, v := range pod.Volumes {
		volumes[v.Name] = v
	}
	tmp := false
	for name, m := range mounts {
		if m.MountPath == "/tmp" && volumes[name].EmptyDir != nil && !m.ReadOnly {
			tmp = true
		}
	}
	if !tmp {
		t.Error("no writable emptyDir on /tmp, where batch bodies over 1 MiB are spooled")
	}

	// The token: the file STEAMCELL_TOKEN_FILE names is the key "token" of
	// the Secret, mounted read-only.
	file := env["STEAMCELL_TOKEN_FILE"]
	found := false
	for name, m := range mounts {
		v := volumes[name]
		if v.Secret != nil && m.ReadOnly && filepath.Join(m.MountPath, "token") == file {
			found = v.Secret.SecretName == b.secret.Name
		}
	}
	if !found {
		t.Errorf("STEAMCELL_TOKEN_FILE %q is not the key token of the Secret %s mounted read-only", file, b.secret.Name)
	}
	if _, ok := b.secret.Data["token"]; !ok {
		if _, ok := b.secret.StringData["token"]; !ok {
			t.Errorf("the Secret %s has no key token", b.secret.Name)
		}
	}

	// The grace period covers the drain and the shutdown.
	if g := pod.TerminationGracePeriodSeconds; g == nil || *g <= 5+30 {
		t.Errorf("terminationGracePeriodSeconds %v, want more than STEAMCELL_DRAIN_DELAY 5s + STEAMCELL_SHUTDOWN_TIMEOUT 30s", g)
	}
	if env["STEAMCELL_DRAIN_DELAY"] != "5s" || env["STEAMCELL_SHUTDOWN_TIMEOUT"] != "30s" {
		t.Errorf("drain %q, shutdown %q: the grace period above assumes 5s and 30s", env["STEAMCELL_DRAIN_DELAY"], env["STEAMCELL_SHUTDOWN_TIMEOUT"])
	}
}

// checkNeighbours: the Service, the HPA, the PDB, the NetworkPolicy and
// the ServiceMonitor find the Deployment's pods and port.
func checkNeighbours(t *testing.T, b built) {
	t.Helper()
	pods := labels.Set(b.deployment.Spec.Template.Labels)
	if s := b.service.Spec.Selector; len(s) == 0 || !labels.SelectorFromSet(s).Matches(pods) {
		t.Errorf("the Service's selector %v does not find the pods %v", s, pods)
	}
	if len(b.service.Spec.Ports) != 1 || b.service.Spec.Ports[0].TargetPort.String() != "http" {
		t.Errorf("Service ports %+v, want one to the container port http", b.service.Spec.Ports)
	}
	for what, sel := range map[string]*metav1.LabelSelector{"PodDisruptionBudget": b.pdb.Spec.Selector, "NetworkPolicy": &b.netpol.Spec.PodSelector} {
		s, err := metav1.LabelSelectorAsSelector(sel)
		if err != nil || s.Empty() || !s.Matches(pods) {
			t.Errorf("the %s's selector %v does not find the pods %v", what, sel, pods)
		}
	}
	if b.pdb.Spec.MinAvailable == nil && b.pdb.Spec.MaxUnavailable == nil {
		t.Error("the PodDisruptionBudget sets neither minAvailable nor maxUnavailable")
	}
	ref := b.hpa.Spec.ScaleTargetRef
	if ref.Kind != "Deployment" || ref.Name != b.deployment.Name || ref.APIVersion != "apps/v1" {
		t.Errorf("the HPA scales %+v, not the Deployment %s", ref, b.deployment.Name)
	}
	cpu := false
	for _, m := range b.hpa.Spec.Metrics {
		if m.Type == autoscalingv2.ResourceMetricSourceType && m.Resource != nil && m.Resource.Name == corev1.ResourceCPU {
			cpu = m.Resource.Target.AverageUtilization != nil
		}
	}
	if !cpu || b.hpa.Spec.MinReplicas == nil || b.hpa.Spec.MaxReplicas < *b.hpa.Spec.MinReplicas {
		t.Errorf("the HPA does not scale on CPU utilisation between sane bounds: %+v", b.hpa.Spec)
	}
	if !slices.Contains(b.netpol.Spec.PolicyTypes, networkingv1.PolicyTypeIngress) || len(b.netpol.Spec.Ingress) == 0 {
		t.Error("the NetworkPolicy does not limit ingress")
	}
	for _, rule := range b.netpol.Spec.Ingress {
		for _, p := range rule.Ports {
			if p.Port == nil || p.Port.String() != "http" {
				t.Errorf("the NetworkPolicy admits port %v, not the server's port http", p.Port)
			}
		}
	}

	// The ServiceMonitor, field by field (no Go type here).
	m := b.monitor.Object
	sel, _, _ := unstructured.NestedStringMap(m, "spec", "selector", "matchLabels")
	if len(sel) == 0 || !labels.SelectorFromSet(sel).Matches(labels.Set(b.service.Labels)) {
		t.Errorf("the ServiceMonitor's selector %v does not find the Service's labels %v", sel, b.service.Labels)
	}
	eps, _, _ := unstructured.NestedSlice(m, "spec", "endpoints")
	if len(eps) != 1 {
		t.Fatalf("ServiceMonitor endpoints %v, want one", eps)
	}
	ep, _ := eps[0].(map[string]any)
	port, _, _ := unstructured.NestedString(ep, "port")
	secret, _, _ := unstructured.NestedString(ep, "authorization", "credentials", "name")
	key, _, _ := unstructured.NestedString(ep, "authorization", "credentials", "key")
	if port != b.service.Spec.Ports[0].Name {
		t.Errorf("the ServiceMonitor scrapes port %q, the Service's port is %q", port, b.service.Spec.Ports[0].Name)
	}
	if secret != b.secret.Name || key != "token" {
		t.Errorf("the ServiceMonitor authenticates with %s/%s, want the Secret %s/token (/metrics wants the token)", secret, key, b.secret.Name)
	}
}

// route is a path that something outside the server asks for.
type route struct {
	what, path string
	token      bool // asked with the token
}

// probeRoutes are the paths the manifests make Kubernetes and Prometheus
// ask for.
func probeRoutes(b built) []route {
	c := b.deployment.Spec.Template.Spec.Containers[0]
	ep, _ := b.monitor.Object["spec"].(map[string]any)["endpoints"].([]any)[0].(map[string]any)
	scrape, _ := ep["path"].(string)
	return []route{
		{"the liveness probe", c.LivenessProbe.HTTPGet.Path, false},
		{"the readiness probe", c.ReadinessProbe.HTTPGet.Path, false},
		{"the ServiceMonitor's scrape", scrape, true},
	}
}

// TestProbesNameRealRoutes asks a real server (the main module's, with a
// token as in the Deployment) for each path the manifests and the
// Containerfile name, the way the probe or the scraper asks it.
func TestProbesNameRealRoutes(t *testing.T) {
	const token = "test-token-kestrel"
	srv := server.New(server.Config{Token: token, Version: "test"})
	routes := probeRoutes(build(t, "kubernetes/base"))
	for _, hc := range containerfileHealthChecks(t) {
		routes = append(routes, route{"the Containerfile's HEALTHCHECK", hc, false})
	}
	for _, r := range routes {
		req := httptest.NewRequest(http.MethodGet, r.path, nil)
		if r.token {
			req.Header.Set("Authorization", "Bearer "+token)
		}
		w := httptest.NewRecorder()
		srv.ServeHTTP(w, req)
		if w.Code != http.StatusOK {
			t.Errorf("%s asks GET %s (token: %v): the server answers %d, want 200", r.what, r.path, r.token, w.Code)
		}
		if r.token {
			// Without the token the scrape is refused: the ServiceMonitor
			// must send it.
			w := httptest.NewRecorder()
			srv.ServeHTTP(w, httptest.NewRequest(http.MethodGet, r.path, nil))
			if w.Code != http.StatusUnauthorized {
				t.Errorf("GET %s without the token: %d, want 401", r.path, w.Code)
			}
		}
	}
	// A draining server fails readiness but not liveness.
	srv.Drain()
	for _, r := range routes[:2] {
		w := httptest.NewRecorder()
		srv.ServeHTTP(w, httptest.NewRequest(http.MethodGet, r.path, nil))
		if want := map[string]int{"/healthz": 200, "/readyz": 503}[r.path]; w.Code != want {
			t.Errorf("%s while draining: %d, want %d", r.what, w.Code, want)
		}
	}
}

// TestEnvironmentNamesAreFlags: each STEAMCELL_ variable the Deployment or
// the Containerfile sets is in the README's table of flags and variables
// (which the main module's tests check against the flags of serve).
func TestEnvironmentNamesAreFlags(t *testing.T) {
	readme, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	row := regexp.MustCompile("(?m)^\\| `--[a-z-]+` \\| `(STEAMCELL_[A-Z_]+)` \\|")
	table := map[string]bool{}
	for _, m := range row.FindAllStringSubmatch(string(readme), -1) {
		table[m[1]] = true
	}
	if len(table) == 0 {
		t.Fatal("no table of flags and variables in README.md")
	}
	var used []string
	for _, e := range build(t, "kubernetes/base").deployment.Spec.Template.Spec.Containers[0].Env {
		used = append(used, e.Name)
	}
	cf, err := os.ReadFile("Containerfile")
	if err != nil {
		t.Fatal(err)
	}
	used = append(used, regexp.MustCompile(`STEAMCELL_[A-Z_]+`).FindAllString(string(cf), -1)...)
	for _, name := range used {
		if strings.HasPrefix(name, "STEAMCELL_") && !table[name] {
			t.Errorf("%s is set by the deployment but is no variable of the README's table", name)
		}
	}
}
