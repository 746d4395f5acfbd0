// Command cardinal finds stock lenses that meet first-order optical
// requirements, from the user's own catalog of lens prescriptions.
package main

import "os"

func main() {
	os.Exit(execute(os.Args[1:], newEnv()))
}
