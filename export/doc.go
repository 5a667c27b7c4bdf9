// Package export is Sectionbench's boundary with the file system: it reads
// and writes the study file (LoadStudy, SaveStudy), reads section
// coordinate files (LoadSectionFile, LoadSections, SectionLoader) and
// writes any file atomically (WriteFileAtomic), so a reader or a crash sees
// the old content or the new, never a part. Errors that concern a file are
// a *FileError naming its path.
//
// What is written lives in the sub-packages, one per concept:
//
//   - export/figure: the figures (gonum/plot) the workbench shows and
//     exports as PNG, SVG or PDF;
//   - export/format: files in a format another program reads — section
//     coordinates (text, CSV), result tables (CSV), the manufacturing
//     outline as DXF and SVG;
//   - export/geometry: the geometry manufacturing needs — skin offsets,
//     spar holes and marks, the outline of templates or the assembly;
//   - export/report: the PDF team report.
//
// Writers take an io.Writer; a caller that writes a file passes it through
// WriteFileAtomic. No package here does GUI work or imports fyne.
//
// Units: millimetres in the study file and in every file for manufacturing,
// metres in a model.Layout. Frames and signs are those of package model
// (see its doc.go).
package export
