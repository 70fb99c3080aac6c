// Package views renders fogbench's pages and reports: templ components over
// typed view models, with display logic (units, number formats, which note
// to show) in methods on those models. It computes nothing: every number it
// shows comes from calc through the server, and it imports no store or
// server code.
package views
