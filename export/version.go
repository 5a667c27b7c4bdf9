package export

// Version is the program's version, as FyneApp.toml gives it: both
// commands write it into the files they make (the report's appendix to
// reproduce it, table headers, the drawing's title block). The desktop
// app's toolkit reads FyneApp.toml only when started from the
// repository's folder and otherwise said 0.0.1, so cmd/sectionbench
// sets it from here.
const Version = "0.1.0"
