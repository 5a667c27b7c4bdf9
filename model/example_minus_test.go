package model_test

import (
	"fmt"
	"strconv"

	"sectionbench/model"
)

// Numbers shown to a user carry true minus signs, their exponents' too.
func ExampleMinus() {
	fmt.Println(model.Minus(strconv.FormatFloat(-2.5, 'f', -1, 64)))
	fmt.Println(model.Minus(strconv.FormatFloat(-1.3e-14, 'g', 2, 64)))
	// Output:
	// −2.5
	// −1.3e−14
}
