#!/usr/bin/env node
// The installed command: runs the compiled CLI (built by `npm install` through the prepare script).
import "../dist/cli/main.js";
