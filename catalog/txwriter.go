package catalog

import (
	"context"
	"database/sql"
)

// A txWriter runs the statements of one write transaction, preparing each
// distinct statement once: an import of thousands of parts runs the same
// few inserts over and over.
type txWriter struct {
	*sql.Tx
	stmts map[string]*sql.Stmt
	// index holds the search index records written (nil: removed) and
	// not yet flushed to their chunks (flushIndex).
	index map[int64][]byte
}

func newTxWriter(tx *sql.Tx) *txWriter {
	return &txWriter{Tx: tx, stmts: map[string]*sql.Stmt{}}
}

// exec runs query with args, preparing it on first use. The statements
// close with the transaction.
func (w *txWriter) exec(ctx context.Context, query string, args ...any) (sql.Result, error) {
	st, ok := w.stmts[query]
	if !ok {
		var err error
		if st, err = w.PrepareContext(ctx, query); err != nil {
			return nil, err
		}
		w.stmts[query] = st
	}
	return st.ExecContext(ctx, args...)
}
