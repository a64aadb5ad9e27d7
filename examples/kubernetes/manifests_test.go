// Package kubernetes holds the container recipe and the Job manifests of
// a sharded plan (see README.md, "Running the shards on Kubernetes"); its
// tests decode the manifests strictly into the Kubernetes API types and
// run their command lines on this machine.
package kubernetes

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	batchv1 "k8s.io/api/batch/v1"
	corev1 "k8s.io/api/core/v1"
	"sigs.k8s.io/yaml"
)

// mount is where the Jobs mount the volume holding inputs and outputs.
const mount = "/data"

// decodeJob reads a manifest strictly into a batch/v1 Job: YAML to JSON,
// then a JSON decoder that rejects any field the API type does not have.
func decodeJob(t *testing.T, name string) *batchv1.Job {
	t.Helper()
	b, err := os.ReadFile(name)
	if err != nil {
		t.Fatal(err)
	}
	js, err := yaml.YAMLToJSON(b)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	dec := json.NewDecoder(bytes.NewReader(js))
	dec.DisallowUnknownFields()
	var job batchv1.Job
	if err := dec.Decode(&job); err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	if job.APIVersion != "batch/v1" || job.Kind != "Job" {
		t.Fatalf("%s: %s %s, want batch/v1 Job", name, job.APIVersion, job.Kind)
	}
	return &job
}

// TestStrictDecodeRejectsUnknownFields checks that the decoder of the
// tests would catch a misspelt field.
func TestStrictDecodeRejectsUnknownFields(t *testing.T) {
	js, err := yaml.YAMLToJSON([]byte("apiVersion: batch/v1\nkind: Job\nspec:\n  completionsMode: Indexed\n"))
	if err != nil {
		t.Fatal(err)
	}
	dec := json.NewDecoder(bytes.NewReader(js))
	dec.DisallowUnknownFields()
	var job batchv1.Job
	if err := dec.Decode(&job); err == nil || !strings.Contains(err.Error(), "completionsMode") {
		t.Errorf("a misspelt field decoded: %v", err)
	}
}

// container returns the Job's only container, checking the pod settings
// every Job of the folder shares: no restart in place, a user without
// privileges, the data volume from a claim mounted at mount, requests.
func container(t *testing.T, name string, job *batchv1.Job) corev1.Container {
	t.Helper()
	pod := job.Spec.Template.Spec
	if pod.RestartPolicy != corev1.RestartPolicyNever {
		t.Errorf("%s: restartPolicy %q, want Never", name, pod.RestartPolicy)
	}
	if sc := pod.SecurityContext; sc == nil || sc.RunAsNonRoot == nil || !*sc.RunAsNonRoot || sc.RunAsUser == nil || *sc.RunAsUser == 0 {
		t.Errorf("%s: the pod must run as a user other than root", name)
	}
	if len(pod.Containers) != 1 {
		t.Fatalf("%s: %d containers, want 1", name, len(pod.Containers))
	}
	c := pod.Containers[0]
	if !slices.Equal(c.Command, []string{"/forelay"}) {
		t.Errorf("%s: command %q, want /forelay", name, c.Command)
	}
	if sc := c.SecurityContext; sc == nil || sc.ReadOnlyRootFilesystem == nil || !*sc.ReadOnlyRootFilesystem || sc.AllowPrivilegeEscalation == nil || *sc.AllowPrivilegeEscalation {
		t.Errorf("%s: the container must have a read-only root and no privilege escalation", name)
	}
	for _, r := range []corev1.ResourceName{corev1.ResourceCPU, corev1.ResourceMemory} {
		if _, ok := c.Resources.Requests[r]; !ok {
			t.Errorf("%s: no %s request", name, r)
		}
	}
	// Go's soft memory limit, in its own notation (a number of bytes
	// with B, KiB, MiB, GiB or TiB), must lie under the container's
	// limit, or the pod is killed before the collector works harder.
	limit, ok := c.Resources.Limits[corev1.ResourceMemory]
	soft, err := goMemLimit(envOf(c, "GOMEMLIMIT"))
	switch {
	case !ok:
		t.Errorf("%s: no memory limit", name)
	case err != nil:
		t.Errorf("%s: GOMEMLIMIT: %v", name, err)
	case soft >= limit.Value():
		t.Errorf("%s: GOMEMLIMIT of %d bytes, not under the memory limit of %d", name, soft, limit.Value())
	}
	if len(c.VolumeMounts) != 1 || c.VolumeMounts[0].MountPath != mount || len(pod.Volumes) != 1 ||
		pod.Volumes[0].Name != c.VolumeMounts[0].Name || pod.Volumes[0].PersistentVolumeClaim == nil {
		t.Errorf("%s: want one volume from a claim, mounted at %s", name, mount)
	}
	return c
}

// envOf returns the value of the container's environment variable name,
// or "".
func envOf(c corev1.Container, name string) string {
	for _, e := range c.Env {
		if e.Name == name {
			return e.Value
		}
	}
	return ""
}

// goMemLimit reads a GOMEMLIMIT value in bytes: digits and one of the
// suffixes the Go runtime documents (B, KiB, MiB, GiB, TiB).
func goMemLimit(v string) (int64, error) {
	for _, u := range []struct {
		suffix string
		scale  int64
	}{{"TiB", 1 << 40}, {"GiB", 1 << 30}, {"MiB", 1 << 20}, {"KiB", 1 << 10}, {"B", 1}} {
		if num, ok := strings.CutSuffix(v, u.suffix); ok {
			n, err := strconv.ParseInt(num, 10, 64)
			if err != nil || n <= 0 {
				return 0, fmt.Errorf("%q: want a positive whole number before %s", v, u.suffix)
			}
			return n * u.scale, nil
		}
	}
	return 0, fmt.Errorf("%q: want a number of bytes with B, KiB, MiB, GiB or TiB", v)
}

// shardCount checks the Indexed Job of the shards and returns N.
func shardCount(t *testing.T) (int, corev1.Container) {
	t.Helper()
	job := decodeJob(t, "job-shards.yaml")
	s := job.Spec
	if s.CompletionMode == nil || *s.CompletionMode != batchv1.IndexedCompletion {
		t.Fatalf("job-shards.yaml: completionMode must be Indexed")
	}
	if s.Completions == nil || s.Parallelism == nil || *s.Parallelism < 1 || *s.Parallelism > *s.Completions {
		t.Fatalf("job-shards.yaml: want completions and a parallelism of 1 to completions")
	}
	n := int(*s.Completions)
	c := container(t, "job-shards.yaml", job)
	i := slices.Index(c.Args, "--shard")
	if i < 0 || i+1 >= len(c.Args) || c.Args[i+1] != fmt.Sprintf("$(JOB_COMPLETION_INDEX)/%d", n) {
		t.Errorf("job-shards.yaml: args %q: want --shard $(JOB_COMPLETION_INDEX)/%d", c.Args, n)
	}
	if len(c.Args) == 0 || c.Args[0] != "plan" {
		t.Errorf("job-shards.yaml: args %q: want forelay plan", c.Args)
	}
	return n, c
}

// TestManifests checks the fields that matter of the three Jobs and the
// recipe of the image.
func TestManifests(t *testing.T) {
	n, shards := shardCount(t)
	merge := container(t, "job-merge.yaml", decodeJob(t, "job-merge.yaml"))
	var want []string
	for k := range n {
		want = append(want, fmt.Sprintf("%s/shards/%d", mount, k))
	}
	if len(merge.Args) < 3 || merge.Args[0] != "merge" || merge.Args[1] != "--out" || !slices.Equal(merge.Args[3:], want) {
		t.Errorf("job-merge.yaml: args %q: want merge --out DIR and the %d shard folders in order", merge.Args, n)
	}
	rerun := container(t, "job-rerun-index.yaml", decodeJob(t, "job-rerun-index.yaml"))
	if !slices.Equal(rerun.Args, shards.Args) {
		t.Errorf("job-rerun-index.yaml: args %q, want those of job-shards.yaml %q", rerun.Args, shards.Args)
	}
	if k, err := strconv.Atoi(envOf(rerun, "JOB_COMPLETION_INDEX")); err != nil || k < 0 || k >= n {
		t.Errorf("job-rerun-index.yaml: index %q, want JOB_COMPLETION_INDEX set, 0 to %d", envOf(rerun, "JOB_COMPLETION_INDEX"), n-1)
	}
	df, err := os.ReadFile("Dockerfile")
	if err != nil {
		t.Fatal(err)
	}
	for _, need := range []string{"CGO_ENABLED=0", "AS build", "COPY --from=build", "USER 65532:65532", `ENTRYPOINT ["/forelay"]`} {
		if !bytes.Contains(df, []byte(need)) {
			t.Errorf("Dockerfile: no %q", need)
		}
	}
	if strings.Count(string(df), "\nFROM ") != 2 {
		t.Errorf("Dockerfile: want two stages")
	}
}

// varRef is a $(NAME) reference in a container's arguments.
var varRef = regexp.MustCompile(`\$\(([A-Za-z_][A-Za-z0-9_]*)\)`)

// localArgs returns args as the container runs them, with the volume at
// dir: $(NAME) expanded from env as Kubernetes expands it (a name not in
// env is left as written), and the mount path replaced by dir.
func localArgs(args []string, env map[string]string, dir string) []string {
	out := make([]string, len(args))
	for i, a := range args {
		a = varRef.ReplaceAllStringFunc(a, func(m string) string {
			if v, ok := env[m[2:len(m)-1]]; ok {
				return v
			}
			return m
		})
		if a == mount || strings.HasPrefix(a, mount+"/") {
			a = dir + strings.TrimPrefix(a, mount)
		}
		out[i] = a
	}
	return out
}

// TestJobsRunLocally runs the exact command lines of the manifests on this
// machine with a static build of forelay (CGO_ENABLED=0, as the image
// builds it): one process per index with JOB_COMPLETION_INDEX set, the
// merge, and the plan run whole. The merged plan.csv and summary.csv must
// be the whole run's byte for byte, rollup.csv and resources.csv the same
// within 1e-9 relative or half a cent (two decimals). Then one shard is
// removed and rerun by job-rerun-index.yaml, and the merge again gives the
// same files.
func TestJobsRunLocally(t *testing.T) {
	if testing.Short() {
		t.Skip("builds forelay and plans the example portfolio 9 times")
	}
	n, shards := shardCount(t)
	merge := container(t, "job-merge.yaml", decodeJob(t, "job-merge.yaml"))
	rerun := container(t, "job-rerun-index.yaml", decodeJob(t, "job-rerun-index.yaml"))
	tmp := t.TempDir()
	bin := filepath.Join(tmp, "forelay")
	build := exec.Command("go", "build", "-o", bin, "forelay/cmd/forelay")
	build.Env = append(os.Environ(), "CGO_ENABLED=0")
	if out, err := build.CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	data := filepath.Join(tmp, "data")
	if err := os.MkdirAll(data, 0o755); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"plan.yaml", "history.csv"} {
		b, err := os.ReadFile(filepath.Join("..", "portfolio", name))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(data, name), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	runIn := func(env map[string]string, args ...string) {
		t.Helper()
		cmd := exec.Command(bin, args...)
		cmd.Env = os.Environ()
		for k, v := range env {
			cmd.Env = append(cmd.Env, k+"="+v)
		}
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("forelay %s: %v\n%s", strings.Join(args, " "), err, out)
		}
	}
	for k := range n {
		env := map[string]string{"JOB_COMPLETION_INDEX": strconv.Itoa(k), "GOMEMLIMIT": envOf(shards, "GOMEMLIMIT")}
		runIn(env, localArgs(shards.Args, env, data)...)
	}
	runIn(map[string]string{"GOMEMLIMIT": envOf(merge, "GOMEMLIMIT")}, localArgs(merge.Args, nil, data)...)
	runIn(nil, "plan", filepath.Join(data, "plan.yaml"), "--out", filepath.Join(tmp, "whole"), "--charts", "none")
	outDir := localArgs([]string{merge.Args[2]}, nil, data)[0]
	compare(t, filepath.Join(tmp, "whole"), outDir)
	first := map[string][]byte{}
	for _, name := range []string{"plan.csv", "summary.csv", "rollup.csv", "resources.csv"} {
		first[name] = readFile(t, outDir, name)
	}

	env := map[string]string{}
	for _, e := range rerun.Env {
		env[e.Name] = e.Value
	}
	if err := os.RemoveAll(filepath.Join(data, "shards", env["JOB_COMPLETION_INDEX"])); err != nil {
		t.Fatal(err)
	}
	runIn(env, localArgs(rerun.Args, env, data)...)
	runIn(nil, localArgs(merge.Args, nil, data)...)
	for name, b := range first {
		if !bytes.Equal(readFile(t, outDir, name), b) {
			t.Errorf("after the rerun of index %s, %s differs", env["JOB_COMPLETION_INDEX"], name)
		}
	}
}

// compare checks the merged files against the whole run's.
func compare(t *testing.T, whole, merged string) {
	t.Helper()
	for _, name := range []string{"plan.csv", "summary.csv"} {
		if !bytes.Equal(readFile(t, whole, name), readFile(t, merged, name)) {
			t.Errorf("%s differs from the whole run's", name)
		}
	}
	for _, name := range []string{"rollup.csv", "resources.csv"} {
		w, err1 := csv.NewReader(bytes.NewReader(readFile(t, whole, name))).ReadAll()
		g, err2 := csv.NewReader(bytes.NewReader(readFile(t, merged, name))).ReadAll()
		if err1 != nil || err2 != nil || len(w) != len(g) {
			t.Fatalf("%s: %v %v, %d rows, want %d", name, err1, err2, len(g), len(w))
		}
		for i := range w {
			for j := range w[i] {
				a, errA := strconv.ParseFloat(w[i][j], 64)
				b, errB := strconv.ParseFloat(g[i][j], 64)
				if errA != nil || errB != nil {
					if w[i][j] != g[i][j] {
						t.Errorf("%s row %d col %d: %q, want %q", name, i+1, j+1, g[i][j], w[i][j])
					}
				} else if d := math.Abs(a - b); d > 0.005+1e-9 && d > 1e-9*math.Abs(a) {
					t.Errorf("%s row %d col %d: %v, want %v", name, i+1, j+1, b, a)
				}
			}
		}
	}
}

func readFile(t *testing.T, parts ...string) []byte {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(parts...))
	if err != nil {
		t.Fatal(err)
	}
	return b
}
