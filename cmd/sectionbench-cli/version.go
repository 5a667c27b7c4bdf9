package main

import "sectionbench/export"

// version is the program's version, as in FyneApp.toml (export.Version).
const version = export.Version
