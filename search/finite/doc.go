// Package finite guards what the program writes: no output file (drawing,
// plot, report, purchase request) may hold NaN or an infinity. Check walks
// the model a writer is about to write and names the first number that is
// not finite by its path, and Scan reads a written document's numbers; a
// writer refuses to write when either finds one, so that a fault upstream
// shows as an error naming the figure instead of a file with "NaN" in it.
package finite
