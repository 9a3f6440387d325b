#!/usr/bin/env node
// The command line runs from the bundle (`npm run build`): one file starts fast.
import '../dist/cli.js'
