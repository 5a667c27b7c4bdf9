package main

// version is the program's version, as in FyneApp.toml.
const version = "0.1.0"
