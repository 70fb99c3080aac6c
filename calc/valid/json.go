package valid

import (
	"bytes"
	"encoding"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"strconv"
	"strings"
	"unicode/utf8"
)

// DecodeJSON reads exactly one JSON value from data into v, strictly: an
// unknown field is an error (a misspelt name is reported, not ignored), as
// are text that is not UTF-8 and anything after the value. Every failure is
// a *FieldError from JSONError: it names the field by its full path in the
// document ("gas.temperature_k", "cases[0].uid", "distribution.edges_m[3]")
// and the kind of value wanted in plain words. doc names the whole document
// ("file", "request", "bundle") for the few errors that concern no one field;
// "" leaves those unnamed, for a caller that puts the document's own path in
// front with Within.
func DecodeJSON(data []byte, v any, doc string) error {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	err := dec.Decode(v)
	if err == nil {
		if _, terr := dec.Token(); terr != io.EOF || !utf8.Valid(data) {
			// Trailing data, or a string the decoder silently mended
			// to U+FFFD: the walk below says where.
			err = errNotClean
		}
	}
	if err != nil {
		return JSONError(data, reflect.TypeOf(v), err, doc)
	}
	return nil
}

var errNotClean = errors.New("json: invalid UTF-8 or trailing data")

// JSONError explains err, the error encoding/json returned for data decoded
// into a value of type t, as a field error for a person: it walks data
// against t to find the first problem in reading order (malformed JSON,
// text that is not UTF-8, an unknown field, a value of the wrong kind, a
// number out of range) and names it by its full path with list indexes.
// No Go type or package name appears in the result. When the walk finds
// nothing (a disagreement with encoding/json), err itself is translated as
// well as its type allows.
func JSONError(data []byte, t reflect.Type, err error, doc string) *FieldError {
	w := &jsonWalker{data: data, dec: json.NewDecoder(bytes.NewReader(data)), doc: doc}
	w.dec.UseNumber()
	if fe := w.document(t); fe != nil {
		return fe
	}
	return ExplainJSONError(err, doc)
}

// Within puts path in front of the field of every field error in err, for
// a value read from inside a larger document: a case in a list ("[2]"), a
// case in a bundle ("cases[0].case"). Other errors come back unchanged.
func Within(path string, err error) error {
	var fe *FieldError
	var es Errors
	switch {
	case errors.As(err, &es):
		out := make(Errors, len(es))
		for i, e := range es {
			out[i] = &FieldError{Field: JoinPath(path, e.Field), Value: e.Value, Message: e.Message}
		}
		return out
	case errors.As(err, &fe):
		return &FieldError{Field: JoinPath(path, fe.Field), Value: fe.Value, Message: fe.Message}
	}
	return err
}

// JoinPath joins a document path and a field path below it: "cases[0]" and
// "uid" give "cases[0].uid", "" and "[1]" give "[1]".
func JoinPath(path, field string) string {
	switch {
	case path == "":
		return field
	case field == "":
		return path
	case strings.HasPrefix(field, "["):
		return path + field
	}
	return path + "." + field
}

var (
	jsonUnmarshaler = reflect.TypeFor[json.Unmarshaler]()
	textUnmarshaler = reflect.TypeFor[encoding.TextUnmarshaler]()
)

type jsonWalker struct {
	data   []byte
	dec    *json.Decoder
	doc    string
	fields map[reflect.Type]map[string]reflect.Type // structFields, per type
}

// document walks the one top-level value and what follows it.
func (w *jsonWalker) document(t reflect.Type) *FieldError {
	if len(bytes.TrimSpace(w.data)) == 0 {
		return &FieldError{Field: w.doc, Message: "is empty; expected JSON"}
	}
	if !json.Valid(w.data) {
		// Malformed JSON first, as encoding/json does: a truncated or
		// broken file is the problem to fix, whatever it holds before.
		t = nil
	}
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if fe := w.value(t, ""); fe != nil {
		return fe
	}
	start := w.dec.InputOffset()
	if _, err := w.dec.Token(); err != io.EOF {
		return &FieldError{Field: w.doc, Message: fmt.Sprintf("has more after the end of its JSON value (%s); send one value", w.where(start))}
	}
	return nil
}

// token reads the next token and checks that its bytes are UTF-8; path
// names the value being read.
func (w *jsonWalker) token(path string) (json.Token, *FieldError) {
	start := w.dec.InputOffset()
	tok, err := w.dec.Token()
	if err != nil {
		return nil, w.syntax(err, path, start)
	}
	if !utf8.Valid(w.data[start:w.dec.InputOffset()]) {
		return nil, &FieldError{Field: w.field(path), Message: "holds text that is not valid UTF-8; save the file as UTF-8"}
	}
	return tok, nil
}

func (w *jsonWalker) field(path string) string {
	if path == "" {
		return w.doc
	}
	return path
}

func (w *jsonWalker) syntax(err error, path string, start int64) *FieldError {
	var se *json.SyntaxError
	switch {
	case errors.Is(err, io.EOF), errors.Is(err, io.ErrUnexpectedEOF):
		return &FieldError{Field: w.doc, Message: "ends too early (truncated JSON)"}
	case errors.As(err, &se):
		// The decoder's token offsets are not from the start of the
		// document; a full scan's are, and point just past the bad byte.
		off := start
		var full *json.SyntaxError
		if errors.As(json.Unmarshal(w.data, new(json.RawMessage)), &full) {
			off = full.Offset - 1
		}
		return &FieldError{Field: w.field(path), Message: fmt.Sprintf("is not valid JSON at %s: %s", w.where(off), strings.TrimPrefix(se.Error(), "json: "))}
	}
	return &FieldError{Field: w.field(path), Message: fmt.Sprintf("is not valid JSON at %s", w.where(start))}
}

// where gives a byte offset as a line and column for a text editor.
func (w *jsonWalker) where(off int64) string {
	off = min(max(off, 0), int64(len(w.data)))
	before := w.data[:off]
	line := bytes.Count(before, []byte("\n")) + 1
	col := utf8.RuneCount(before[bytes.LastIndexByte(before, '\n')+1:]) + 1
	return fmt.Sprintf("line %d, column %d", line, col)
}

// value walks one value that should fit type t (nil: any value).
func (w *jsonWalker) value(t reflect.Type, path string) *FieldError {
	tok, fe := w.token(path)
	if fe != nil {
		return fe
	}
	if tok == nil { // null leaves any Go value as it was
		return nil
	}
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t != nil && (t.Kind() == reflect.Interface || reflect.PointerTo(t).Implements(jsonUnmarshaler)) {
		t = nil // the type reads any JSON itself
	}
	if t != nil && t.Kind() != reflect.Struct && reflect.PointerTo(t).Implements(textUnmarshaler) {
		if _, ok := tok.(string); !ok {
			return w.mismatch(t, tok, path)
		}
		return nil
	}
	switch tok := tok.(type) {
	case json.Delim:
		if tok == '{' {
			return w.object(t, path)
		}
		return w.list(t, path)
	case string:
		if t != nil && t.Kind() != reflect.String && !(t.Kind() == reflect.Slice && t.Elem().Kind() == reflect.Uint8) {
			return w.mismatch(t, tok, path)
		}
	case bool:
		if t != nil && t.Kind() != reflect.Bool {
			return w.mismatch(t, tok, path)
		}
	case json.Number:
		if t != nil {
			return w.number(t, tok, path)
		}
	}
	return nil
}

func (w *jsonWalker) object(t reflect.Type, path string) *FieldError {
	var fields map[string]reflect.Type
	var elem reflect.Type
	switch {
	case t == nil:
	case t.Kind() == reflect.Struct:
		if fields = w.fields[t]; fields == nil {
			if w.fields == nil {
				w.fields = map[reflect.Type]map[string]reflect.Type{}
			}
			fields = structFields(t)
			w.fields[t] = fields
		}
	case t.Kind() == reflect.Map:
		elem = t.Elem()
	default:
		return w.mismatch(t, json.Delim('{'), path)
	}
	for w.dec.More() {
		tok, fe := w.token(path)
		if fe != nil {
			return fe
		}
		key, _ := tok.(string)
		at := JoinPath(path, clipKey(key))
		ft := elem
		if fields != nil {
			var ok bool
			if ft, ok = lookupField(fields, key); !ok {
				return &FieldError{Field: at, Message: "unknown field; check its spelling against the format"}
			}
		}
		if fe := w.value(ft, at); fe != nil {
			return fe
		}
	}
	_, fe := w.token(path) // '}'
	return fe
}

func (w *jsonWalker) list(t reflect.Type, path string) *FieldError {
	var elem reflect.Type
	if t != nil {
		switch t.Kind() {
		case reflect.Slice, reflect.Array:
			elem = t.Elem()
		default:
			return w.mismatch(t, json.Delim('['), path)
		}
	}
	for i := 0; w.dec.More(); i++ {
		if fe := w.value(elem, path+"["+strconv.Itoa(i)+"]"); fe != nil {
			return fe
		}
	}
	_, fe := w.token(path) // ']'
	return fe
}

func (w *jsonWalker) number(t reflect.Type, n json.Number, path string) *FieldError {
	lit := n.String()
	switch t.Kind() {
	case reflect.Float32, reflect.Float64:
		if _, err := strconv.ParseFloat(lit, t.Bits()); err != nil {
			return &FieldError{Field: w.field(path), Value: clipKey(lit), Message: "is too large a number to hold (at most about 1.8e308)"}
		}
		return nil
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		if _, err := strconv.ParseInt(lit, 10, t.Bits()); err != nil {
			return w.wholeNumber(lit, path, err)
		}
		return nil
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		if _, err := strconv.ParseUint(lit, 10, t.Bits()); err != nil {
			return w.wholeNumber(lit, path, err)
		}
		return nil
	}
	return w.mismatch(t, n, path)
}

func (w *jsonWalker) wholeNumber(lit, path string, err error) *FieldError {
	if errors.Is(err, strconv.ErrRange) {
		return &FieldError{Field: w.field(path), Value: clipKey(lit), Message: "is too large a whole number"}
	}
	return &FieldError{Field: w.field(path), Value: clipKey(lit), Message: "must be a whole number"}
}

func (w *jsonWalker) mismatch(t reflect.Type, got json.Token, path string) *FieldError {
	return &FieldError{Field: w.field(path), Value: tokenWords(got), Message: "must be " + KindWords(t)}
}

// KindWords says in plain words what kind of JSON value a Go type reads:
// "a number", "a whole number", "text", "true or false", "a list", "an
// object".
func KindWords(t reflect.Type) string {
	for t != nil && t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t == nil {
		return "a value"
	}
	if t.Kind() != reflect.Struct && reflect.PointerTo(t).Implements(textUnmarshaler) {
		return "text"
	}
	switch t.Kind() {
	case reflect.Float32, reflect.Float64:
		return "a number"
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64,
		reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		return "a whole number"
	case reflect.String:
		return "text"
	case reflect.Bool:
		return "true or false"
	case reflect.Slice:
		if t.Elem().Kind() == reflect.Uint8 {
			return "text"
		}
		return "a list"
	case reflect.Array:
		return "a list"
	case reflect.Map, reflect.Struct:
		return "an object"
	}
	return "a value"
}

// tokenWords shows a JSON token the user gave, in their words.
func tokenWords(tok json.Token) string {
	switch tok := tok.(type) {
	case json.Delim:
		if tok == '{' {
			return "an object"
		}
		return "a list"
	case string:
		return strconv.Quote(clipKey(tok))
	case bool:
		return strconv.FormatBool(tok)
	case json.Number:
		return clipKey(tok.String())
	}
	return "null"
}

func clipKey(s string) string {
	if utf8.RuneCountInString(s) > 60 {
		return string([]rune(s)[:60]) + "…"
	}
	return s
}

// structFields maps the JSON names of a struct's fields (promoted ones
// included) to their types, as encoding/json reads them.
func structFields(t reflect.Type) map[string]reflect.Type {
	out := map[string]reflect.Type{}
	var add func(t reflect.Type)
	add = func(t reflect.Type) {
		for i := range t.NumField() {
			f := t.Field(i)
			tag := f.Tag.Get("json")
			if tag == "-" {
				continue
			}
			name, _, _ := strings.Cut(tag, ",")
			ft := f.Type
			if f.Anonymous && name == "" {
				for ft.Kind() == reflect.Pointer {
					ft = ft.Elem()
				}
				if ft.Kind() == reflect.Struct {
					add(ft)
					continue
				}
			}
			if !f.IsExported() {
				continue
			}
			if name == "" {
				name = f.Name
			}
			if _, dup := out[name]; !dup {
				out[name] = f.Type
			}
		}
	}
	add(t)
	return out
}

// lookupField finds a key as encoding/json does: the exact name first, then
// one that differs only in case.
func lookupField(fields map[string]reflect.Type, key string) (reflect.Type, bool) {
	if t, ok := fields[key]; ok {
		return t, true
	}
	for name, t := range fields {
		if strings.EqualFold(name, key) {
			return t, true
		}
	}
	return nil, false
}

// ExplainJSONError translates an encoding/json error by its type alone,
// without the Go type names its text carries: JSONError's fallback, and the
// translator for a reader that decodes from a stream and so has no bytes to
// walk. It names a field as encoding/json does, dotted and without list
// indexes, so such a reader decodes a list's elements one by one and puts
// each index in front with Within ("cases[3].uid"); an unknown field is
// named by its own key alone.
func ExplainJSONError(err error, doc string) *FieldError {
	var te *json.UnmarshalTypeError
	var se *json.SyntaxError
	switch {
	case errors.As(err, &te):
		field := te.Field
		if field == "" {
			field = doc
		}
		got, _, _ := strings.Cut(te.Value, " ")
		return &FieldError{Field: field, Value: got, Message: "must be " + KindWords(te.Type)}
	case errors.As(err, &se):
		return &FieldError{Field: doc, Message: fmt.Sprintf("is not valid JSON at byte %d: %s", se.Offset, strings.TrimPrefix(se.Error(), "json: "))}
	case strings.HasPrefix(err.Error(), "json: unknown field "):
		name := strings.Trim(strings.TrimPrefix(err.Error(), "json: unknown field "), `"`)
		return &FieldError{Field: name, Message: "unknown field; check its spelling against the format"}
	case errors.Is(err, io.ErrUnexpectedEOF), errors.Is(err, io.EOF):
		return &FieldError{Field: doc, Message: "ends too early (truncated JSON)"}
	}
	return &FieldError{Field: doc, Message: "could not be read as JSON"}
}
