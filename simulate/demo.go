package simulate

import (
	_ "embed"

	"github.com/starmock/starmock/synth"
)

//go:embed demo.yaml
var demoScenario []byte

// DemoScenarioText returns the built-in demo scenario (an invented open cluster seen by
// an invented survey) exactly as embedded.
func DemoScenarioText() []byte { return append([]byte(nil), demoScenario...) }

// DemoScenario parses the built-in demo scenario.
func DemoScenario() (*synth.Scenario, error) {
	return synth.Parse("demo.yaml (built in)", demoScenario)
}
