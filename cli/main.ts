// Entry point of the `plotrate` command line; the commands arrive with the report issue.
console.log('plotrate: yield-response analysis for fertilizer-rate trials (commands coming).');
