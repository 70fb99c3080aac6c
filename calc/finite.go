package calc

import (
	"fmt"
	"math"
	"reflect"
	"strings"
)

// nonFinite returns the JSON path of the first NaN or ±Inf in v (a struct,
// pointer, slice or map of them), or "" when every number is finite. It is
// the last guard before a result leaves calc: encoding/json cannot write
// such numbers, and a user must never see them.
func nonFinite(v any) string {
	return walkFinite(reflect.ValueOf(v), "")
}

func walkFinite(v reflect.Value, path string) string {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		if f := v.Float(); math.IsNaN(f) || math.IsInf(f, 0) {
			return fmt.Sprintf("%s = %g", strings.TrimPrefix(path, "."), f)
		}
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			return walkFinite(v.Elem(), path)
		}
	case reflect.Struct:
		t := v.Type()
		for i := range t.NumField() {
			f := t.Field(i)
			if !f.IsExported() {
				continue
			}
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if name == "-" {
				continue
			}
			if name == "" {
				name = f.Name
			}
			if p := walkFinite(v.Field(i), path+"."+name); p != "" {
				return p
			}
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			if p := walkFinite(v.Index(i), fmt.Sprintf("%s[%d]", path, i)); p != "" {
				return p
			}
		}
	case reflect.Map:
		iter := v.MapRange()
		for iter.Next() {
			if p := walkFinite(iter.Value(), fmt.Sprintf("%s.%v", path, iter.Key())); p != "" {
				return p
			}
		}
	}
	return ""
}

// Evaluate computes a case: classes, per-class curvature and evaporation,
// the curvature summary, properties used and the spray history. A result
// holding NaN or ±Inf anywhere is a fault of ours: it is returned as an
// internal error naming the field, never as numbers a user would read.
func Evaluate(c Case) (*Result, error) {
	res, err := evaluate(c)
	if err != nil {
		return nil, err
	}
	if p := nonFinite(res); p != "" {
		return nil, &Error{Code: Internal, Message: "evaluation failed", Err: fmt.Errorf("non-finite result %s", p)}
	}
	return res, nil
}
