package workbook

import "io"

// WriteSheetPackage writes a package of one sheet, row by row, with the
// builder the CSV reader uses: the benchmarks make their million-row
// workbooks with it, in seconds and without holding them in memory.
// rows calls add for each row, in rising order.
func WriteSheetPackage(w io.Writer, sheet string, rows func(add func(n int, vals []any) error) error) error {
	b, err := newPackageBuilder(w, sheet)
	if err != nil {
		return err
	}
	if err := rows(b.row); err != nil {
		return err
	}
	return b.close()
}
