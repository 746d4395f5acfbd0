package catalog

import (
	"context"
	"database/sql"
	"database/sql/driver"
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
	// conn, when set, is the connection tx runs on: execValues then runs
	// its statements on the driver's connection itself, without the
	// conversion of every value database/sql does (a tenth of a 50,000-part
	// import's writing).
	conn  *sql.Conn
	raw   map[string]driver.Stmt
	named []driver.NamedValue
	// rowsWritten, when set, is called once the rows of new parts are
	// written, before their tables' indexes are built (writeNewParts).
	rowsWritten func()
}

func newTxWriter(tx *sql.Tx) *txWriter {
	return &txWriter{Tx: tx, stmts: map[string]*sql.Stmt{}}
}

// newConnWriter is a txWriter for tx begun on conn; close it before the
// transaction ends.
func newConnWriter(conn *sql.Conn, tx *sql.Tx) *txWriter {
	w := newTxWriter(tx)
	w.conn, w.raw = conn, map[string]driver.Stmt{}
	return w
}

// execValues runs query with args, each a value the driver takes as it is
// (nil, int64, float64, bool, string or []byte), preparing it on first use.
func (w *txWriter) execValues(ctx context.Context, query string, args []any) error {
	if w.conn == nil {
		_, err := w.exec(ctx, query, args...)
		return err
	}
	return w.conn.Raw(func(dc any) error {
		st, ok := w.raw[query]
		if !ok {
			var err error
			if st, err = dc.(driver.ConnPrepareContext).PrepareContext(ctx, query); err != nil {
				return err
			}
			w.raw[query] = st
		}
		w.named = w.named[:0]
		for i, v := range args {
			w.named = append(w.named, driver.NamedValue{Ordinal: i + 1, Value: v})
		}
		_, err := st.(driver.StmtExecContext).ExecContext(ctx, w.named)
		return err
	})
}

// close closes the statements execValues prepared.
func (w *txWriter) close() {
	if w.conn == nil || len(w.raw) == 0 {
		return
	}
	w.conn.Raw(func(any) error {
		for _, st := range w.raw {
			st.Close()
		}
		return nil
	})
	clear(w.raw)
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
