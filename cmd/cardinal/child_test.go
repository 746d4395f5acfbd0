package main

import (
	"bytes"
	"errors"
	"os"
	"os/exec"
	"strings"
	"syscall"
	"testing"
)

// childArgs is the environment variable that turns the test binary into
// the program: it runs the command line it holds (words separated by
// newlines) and exits with its code. Tests that need another process (a
// kill at a chosen moment, another user) start the test binary this way.
const childArgs = "CARDINAL_TEST_CHILD_ARGS"

func TestMain(m *testing.M) {
	if a, ok := os.LookupEnv(childArgs); ok {
		os.Exit(execute(strings.Split(a, "\n"), newEnv()))
	}
	os.Exit(m.Run())
}

// childCommand is the program run as a child process with args, in an
// environment of its own: HOME at home and the extra variables given.
func childCommand(bin, home string, args []string, vars ...string) *exec.Cmd {
	c := exec.Command(bin)
	c.Env = append([]string{childArgs + "=" + strings.Join(args, "\n"), "HOME=" + home, "PATH=" + os.Getenv("PATH")}, vars...)
	return c
}

// runChild runs the program as a child process and returns its exit code
// and streams.
func runChild(t *testing.T, c *exec.Cmd) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	c.Stdout, c.Stderr = &out, &errb
	err := c.Run()
	var ee *exec.ExitError
	switch {
	case errors.As(err, &ee):
		return ee.ExitCode(), out.String(), errb.String()
	case err != nil:
		t.Fatalf("starting the child process: %v", err)
	}
	return 0, out.String(), errb.String()
}

// nobody is the user and group id of 'nobody' on Linux (common practice),
// whom a test running as root becomes to meet permissions.
const nobody = 65534

// asNobody sets the child to run as user nobody.
func asNobody(c *exec.Cmd) {
	c.SysProcAttr = &syscall.SysProcAttr{Credential: &syscall.Credential{Uid: nobody, Gid: nobody}}
}
