package root

import (
	"os"
	"testing"

	"biasbin/cmd/internal/cmdtest"
)

// childEnv, when set, makes the test binary run as biasbin itself, so the
// reliability tests can run real separate processes.
const childEnv = "BIASBIN_ROOT_CHILD"

func TestMain(m *testing.M) {
	cmdtest.ChildMain(childEnv, New)
	os.Exit(m.Run())
}
