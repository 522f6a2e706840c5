#!/usr/bin/env node
// The installed command: runs the CLI bundle built by `npm install` (prepare → scripts/build.mjs).
import { loadBundle } from "./bundle.mjs";

loadBundle();
