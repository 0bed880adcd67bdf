// Command scalerisk tells whether a water will lay down mineral scale: it
// reads laboratory analyses, checks their quality, computes the aqueous
// speciation and the saturation index of each mineral, and writes text, CSV
// or JSON. Run "scalerisk --help" for the commands.
package main

import "os"

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
