// Package purchase turns the results picked from a saved search into a
// purchase request: the parts to order grouped by supplier, with what the
// drawer already holds subtracted, subtotals per currency, each solution's
// build sheet and the cautions (BuildRequest). A request is one table of
// the presentation model (Request.Table) and its CSV goes through the
// injection-safe writer of package importers, so a spreadsheet cannot be
// tricked into running a cell.
//
// Prices are per piece in the currency the catalog states; nothing is
// converted between currencies.
package purchase
