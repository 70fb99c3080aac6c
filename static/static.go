// Package static embeds fogbench's stylesheet, script and the vendored htmx
// (htmx.org 2.0.11 from the npm registry, dist/htmx.min.js, sha256
// d6fdc75f204e6bdefa99b69bf1e6d4ac69b8a364f77929f45c13476b4000f717), so the
// app works offline.
package static

import "embed"

//go:embed *.css *.js
var FS embed.FS
