// Command steamcell computes properties of water and steam from IAPWS-IF97
// and serves them to spreadsheets, scripts and plant tools.
package main

import "os"

func main() {
	app := NewApp(os.Stdin, os.Stdout, os.Stderr)
	defer app.Close()
	os.Exit(app.Run(os.Args[1:]))
}
