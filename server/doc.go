// Package server is the HTTP function server of steamcell: it answers
// states of water and steam computed from IAPWS-IF97 by package fn, one
// value at a time for a spreadsheet cell, one state as JSON or CSV, or a
// stream of points in a batch.
//
// Routes (the OpenAPI 3.1 description is served at /openapi.json):
//
//	GET  /state?p=6barg&t=330C          every property of one state (JSON; format=csv)
//	GET  /state/{property}?p=…&t=…      one number as text/plain, for a cell formula
//	GET  /saturation?p=… or ?t=…        the saturation line at p or T
//	POST /batch                         many points, CSV or JSON, streamed in order
//	POST /workbook                      fill an uploaded workbook (when wired in)
//	GET  /openapi.json, /healthz, /metrics
//
// Inputs are read by package fn/point, the same way the command line and
// the workbook read them. Handlers have one shape: read the request, call
// the engine, write the answer; errors go through classify, the one table
// from error kind to HTTP status.
package server
