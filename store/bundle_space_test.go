package store

import (
	"io"
	"strings"
	"testing"
)

// spaceSqueezer cuts runs of white space outside strings to one, and
// leaves strings, escapes and the separation of tokens as they were.
func TestSpaceSqueezerKeepsTheJSON(t *testing.T) {
	for in, want := range map[string]string{
		"{ \n\t \"a\" :   1 }":         "{ \"a\" : 1 }",
		`{"name":"two  spaces\t"}`:     `{"name":"two  spaces\t"}`,
		`{"q":"a \"  quoted  \" b"}  `: `{"q":"a \"  quoted  \" b"} `,
		`{"q":"back\\"    , "r":  1}`:  `{"q":"back\\" , "r": 1}`,
		"[1    2]":                     "[1 2]", // still two values: still invalid
	} {
		// One byte at a time too, so state crosses reads.
		for _, r := range []io.Reader{strings.NewReader(in), io.LimitReader(&oneByte{s: in}, int64(len(in)))} {
			got, err := io.ReadAll(&spaceSqueezer{r: r})
			if err != nil || string(got) != want {
				t.Errorf("%q: got %q (%v), want %q", in, got, err, want)
			}
		}
	}
}

type oneByte struct{ s string }

func (o *oneByte) Read(p []byte) (int, error) {
	if o.s == "" {
		return 0, io.EOF
	}
	p[0] = o.s[0]
	o.s = o.s[1:]
	return 1, nil
}

// A bundle padded with white space between its tokens decodes (and a
// padded, unfinished one is refused): the padding once made the decoder
// rescan its buffer at every read, so 256 MiB of it took minutes.
func TestPaddedBundle(t *testing.T) {
	pad := strings.Repeat(" ", 4<<20)
	b, err := DecodeBundle(strings.NewReader(`{"format":"fogbench-bundle/1",` + pad + `"case_count":0,"cases":[` + pad + `]}` + pad))
	if err != nil || len(b.Cases) != 0 {
		t.Fatalf("padded empty bundle: %v", err)
	}
	if _, err := DecodeBundle(strings.NewReader(`{"format":"fogbench-bundle/1","cases":[` + pad)); err == nil {
		t.Fatal("an unfinished padded bundle was accepted")
	}
}
