// Package browsertest drives the page of steamcell serve in real headless
// Chromium through the DevTools protocol (chromedp): it types into the
// calculator, finds a point on a diagram where its values put it, makes a
// steam table on the page, fills the demo workbook through the drop zone
// and saves a screenshot of each
// kind of diagram under testdata/diagrams/. It is a module of its own so
// that chromedp stays out of the steamcell binary's dependencies. The
// tests fail, never skip, when Chromium is missing; .ci/run installs it.
package browsertest
