package answer

import (
	"fmt"
	"math"
	"reflect"
	"strconv"
	"sync"
)

// UndefinedError is a result of an answer that came out NaN or infinite
// where a number must stand: the computation failed, in practice by
// leaving the range of floating-point numbers on inputs far outside their
// usual range. No answer is given rather than a wrong one.
type UndefinedError struct {
	Result string // what it is, from the field's result tag
	Value  float64
}

func (e *UndefinedError) Error() string {
	return fmt.Sprintf("the %s came out %s: the computation left the range of floating-point numbers; is an input far outside its usual range?",
		e.Result, strconv.FormatFloat(e.Value, 'g', -1, 64))
}

// Check returns an *UndefinedError for the first result of a that is NaN
// or infinite, nil when every one is a number. A result is a field of type
// Num or float64 tagged `result:"what it is"`, anywhere in the answer: in
// its rows, in its parts, in the answers a memo is made of (fields JSON
// leaves out are not looked at). A value that may have no answer (a time
// never reached, a nose outside the range, a rate without driving force)
// carries no tag: NaN or +Inf stands for its "none" or "never". Every
// renderer checks the answer first, so a failed result is an error (exit
// 1) in every format, never a printed NaN or a JSON null.
func Check(a any) error { return check(reflect.ValueOf(a)) }

func check(v reflect.Value) error {
	switch v.Kind() {
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			return nil
		}
		return check(v.Elem())
	case reflect.Slice, reflect.Array:
		if !hasResults(v.Type().Elem()) {
			return nil
		}
		for i := range v.Len() {
			if err := check(v.Index(i)); err != nil {
				return err
			}
		}
	case reflect.Struct:
		t := v.Type()
		for i := range t.NumField() {
			f := t.Field(i)
			if !answered(f) {
				continue
			}
			if what, ok := f.Tag.Lookup("result"); ok {
				if x := v.Field(i).Float(); math.IsNaN(x) || math.IsInf(x, 0) {
					return &UndefinedError{what, x}
				}
				continue
			}
			if hasResults(f.Type) {
				if err := check(v.Field(i)); err != nil {
					return err
				}
			}
		}
	}
	return nil
}

// answered reports whether a field is part of the answer: exported, and
// not left out of the JSON.
func answered(f reflect.StructField) bool { return f.IsExported() && f.Tag.Get("json") != "-" }

// resultTypes caches hasResults.
var resultTypes sync.Map // reflect.Type → bool

// hasResults reports whether values of type t may hold a result; an
// interface may hold anything.
func hasResults(t reflect.Type) bool {
	if r, ok := resultTypes.Load(t); ok {
		return r.(bool)
	}
	resultTypes.Store(t, false) // a type that holds itself adds nothing
	r := false
	switch t.Kind() {
	case reflect.Interface:
		r = true
	case reflect.Pointer, reflect.Slice, reflect.Array:
		r = hasResults(t.Elem())
	case reflect.Struct:
		for i := range t.NumField() {
			f := t.Field(i)
			if !answered(f) {
				continue
			}
			if _, ok := f.Tag.Lookup("result"); ok || hasResults(f.Type) {
				r = true
				break
			}
		}
	}
	resultTypes.Store(t, r)
	return r
}
