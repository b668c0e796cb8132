package answer

import (
	"bytes"
	"encoding/json"
)

// Object is a JSON object whose keys are known only at run time (the
// bands of the headline results), in the order given.
type Object []Field

// Field is one entry of an Object.
type Field struct {
	Key   string
	Value any
}

func (o Object) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	for i, f := range o {
		if i > 0 {
			b.WriteByte(',')
		}
		k, _ := json.Marshal(f.Key)
		b.Write(k)
		b.WriteByte(':')
		v, err := json.Marshal(f.Value)
		if err != nil {
			return nil, err
		}
		b.Write(v)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}
