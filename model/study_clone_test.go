package model

import (
	"reflect"
	"strconv"
	"testing"
)

// TestCloneSharesNothing fills every field of a study by reflection
// (lists of two, pointers allocated), clones it, changes every value the
// clone reaches and checks that the original did not change. A field
// added to Study (or to anything it holds) is filled too, so a list or
// pointer that Clone would share fails here.
func TestCloneSharesNothing(t *testing.T) {
	var orig, want Study
	fillAll(t, reflect.ValueOf(&orig).Elem(), new(int))
	fillAll(t, reflect.ValueOf(&want).Elem(), new(int))
	c := orig.Clone()
	if !reflect.DeepEqual(c, &orig) {
		t.Fatal("the clone differs from the original")
	}
	changeAll(t, reflect.ValueOf(c).Elem(), "study")
	if reflect.DeepEqual(c, &orig) {
		t.Fatal("changing the clone changed nothing (changeAll missed the fields)")
	}
	if !reflect.DeepEqual(&orig, &want) {
		t.Errorf("changing the clone changed the original at %v: Clone shares a list or pointer there",
			differences(reflect.ValueOf(orig), reflect.ValueOf(want), "study"))
	}
}

// Absent and empty lists stay so: an empty pin list is not nil, an absent
// density list is not empty, so that a clone compares equal with
// reflect.DeepEqual to what it was cloned from.
func TestCloneKeepsEmptyAndAbsent(t *testing.T) {
	cases := []struct {
		name string
		st   *Study
	}{
		{"new study", NewStudy()},
		{"absent pins", func() *Study { s := NewStudy(); s.Pins = nil; return s }()},
		{"empty density lists", func() *Study { s := NewStudy(); s.Density.Panels = []int{}; return s }()},
	}
	for _, c := range cases {
		if got := c.st.Clone(); !reflect.DeepEqual(got, c.st) {
			t.Errorf("%s: clone %+v, want %+v", c.name, got, c.st)
		}
	}
	if (*Study)(nil).Clone() != nil {
		t.Error("a nil study cloned to a study")
	}
}

// fillAll gives every field reachable from v a value of its own, counting
// with n.
func fillAll(t *testing.T, v reflect.Value, n *int) {
	t.Helper()
	*n++
	switch v.Kind() {
	case reflect.Bool:
		v.SetBool(true)
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		v.SetInt(int64(*n))
	case reflect.Float32, reflect.Float64:
		v.SetFloat(float64(*n) + 0.5)
	case reflect.String:
		v.SetString("s" + strconv.Itoa(*n))
	case reflect.Slice:
		v.Set(reflect.MakeSlice(v.Type(), 2, 2))
		for i := range v.Len() {
			fillAll(t, v.Index(i), n)
		}
	case reflect.Array:
		for i := range v.Len() {
			fillAll(t, v.Index(i), n)
		}
	case reflect.Pointer:
		v.Set(reflect.New(v.Type().Elem()))
		fillAll(t, v.Elem(), n)
	case reflect.Map:
		v.Set(reflect.MakeMap(v.Type()))
		for range 2 {
			k, e := reflect.New(v.Type().Key()).Elem(), reflect.New(v.Type().Elem()).Elem()
			fillAll(t, k, n)
			fillAll(t, e, n)
			v.SetMapIndex(k, e)
		}
	case reflect.Struct:
		for i := range v.NumField() {
			if !v.Type().Field(i).IsExported() {
				t.Fatalf("%s.%s is unexported: teach fillAll and changeAll to reach it", v.Type(), v.Type().Field(i).Name)
			}
			fillAll(t, v.Field(i), n)
		}
	default:
		t.Fatalf("fillAll cannot fill a %s (%s): teach it, and check Clone copies it", v.Kind(), v.Type())
	}
}

// changeAll changes every value reachable from v in place (through
// lists, pointers and maps, never replacing them), so that anything the
// clone shares with the original shows in the original.
func changeAll(t *testing.T, v reflect.Value, path string) {
	t.Helper()
	switch v.Kind() {
	case reflect.Bool:
		v.SetBool(!v.Bool())
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		v.SetInt(v.Int() + 1000)
	case reflect.Float32, reflect.Float64:
		v.SetFloat(v.Float() + 1000)
	case reflect.String:
		v.SetString(v.String() + "~")
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			changeAll(t, v.Index(i), path+"["+strconv.Itoa(i)+"]")
		}
	case reflect.Pointer:
		if !v.IsNil() {
			changeAll(t, v.Elem(), path)
		}
	case reflect.Map:
		for _, k := range v.MapKeys() {
			e := reflect.New(v.Type().Elem()).Elem()
			e.Set(v.MapIndex(k))
			changeAll(t, e, path+"["+k.String()+"]")
			v.SetMapIndex(k, e)
		}
	case reflect.Struct:
		for i := range v.NumField() {
			changeAll(t, v.Field(i), path+"."+v.Type().Field(i).Name)
		}
	default:
		t.Fatalf("%s: changeAll cannot change a %s", path, v.Kind())
	}
}

// differences lists the paths where a and b (of one type, as fillAll
// makes them) hold different values.
func differences(a, b reflect.Value, path string) []string {
	switch a.Kind() {
	case reflect.Slice, reflect.Array:
		if a.Len() != b.Len() {
			return []string{path}
		}
		var d []string
		for i := range a.Len() {
			d = append(d, differences(a.Index(i), b.Index(i), path+"["+strconv.Itoa(i)+"]")...)
		}
		return d
	case reflect.Pointer:
		if a.IsNil() || b.IsNil() {
			if a.IsNil() != b.IsNil() {
				return []string{path}
			}
			return nil
		}
		return differences(a.Elem(), b.Elem(), path)
	case reflect.Struct:
		var d []string
		for i := range a.NumField() {
			d = append(d, differences(a.Field(i), b.Field(i), path+"."+a.Type().Field(i).Name)...)
		}
		return d
	}
	if !reflect.DeepEqual(a.Interface(), b.Interface()) {
		return []string{path}
	}
	return nil
}

// BenchmarkStudyClone: the copy the workbench makes of the study on every
// edit, a two-element study with an embedded section of 160 points and a
// pin.
func BenchmarkStudyClone(b *testing.B) {
	st := NewStudy()
	pts := make([][2]float64, 160)
	st.Elements = append(st.Elements, StudyElement{Name: "flap", Section: SectionSource{Embedded: &EmbeddedSection{Name: "flap", Points: pts}}, ChordMM: 100})
	st.Pins = []Pin{{Label: "pin", Cp: []PinCurve{{Points: make([][2]float64, 80)}, {Points: make([][2]float64, 80)}}, Polar: make([][3]float64, 17)}}
	for b.Loop() {
		st.Clone()
	}
}
