package picker


// TEMPORARY CONTRACT FILE. The helper implementing the picker moves each
// declaration into its proper file with a real body and deletes this file.
// Names here are the agreed contract; extend, but do not rename.

// Pick searches stock for the best builds for req.
func Pick(stock Stock, req Request) (Result, error) { panic("picker: Pick not implemented yet") }
