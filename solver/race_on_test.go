//go:build race

package solver

// raceDetector is true when the tests run under the race detector.
const raceDetector = true
