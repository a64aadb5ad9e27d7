package data

import (
	"bytes"
	"fmt"
	"strconv"
	"testing"
	"time"

	"forelay/forecast"
)

// longHistory writes a long history of series series of points months each,
// ending 2026-10, in the layout of examples/generate -kind portfolio: the
// columns family, product, customer, period and value, rows series after
// series. The names cycle over 5 families and 21 products, with one customer
// per block of 21 series (customer-00001, ...); the values are whole numbers
// of 3 to 6 digits, as in the generated portfolio. With keyed false the three
// key cells are joined into one series column instead.
func longHistory(series, points int, keyed bool) []byte {
	families := []string{"milk", "yoghurt", "cream", "cheese", "butter"}
	products := []string{"whole-1l", "semi-1l", "skimmed-1l", "whole-2l", "choc-250ml", "strawberry-250ml",
		"plain-500g", "strawberry-125g", "vanilla-125g", "greek-500g", "drink-250ml",
		"single-250ml", "double-250ml", "whipping-500ml", "sour-200ml",
		"mild-200g", "mature-200g", "curd-250g", "grated-150g", "salted-250g", "unsalted-250g"}
	first := forecast.PeriodOf(forecast.Monthly, time.Date(2026, 10, 1, 0, 0, 0, 0, time.UTC)).Add(1 - points)
	labels := make([]string, points)
	for i := range labels {
		labels[i] = first.Add(i).String()
	}
	var b bytes.Buffer
	b.Grow(series * points * 48)
	sep := ","
	if keyed {
		b.WriteString("family,product,customer,period,value\n")
	} else {
		b.WriteString("series,period,value\n")
		sep = "/"
	}
	var line []byte
	for k := range series {
		p := k % len(products)
		prefix := fmt.Sprintf("%s%s%s%scustomer-%05d,", families[p*len(families)/len(products)], sep, products[p], sep, k/len(products)+1)
		for i, label := range labels {
			line = append(line[:0], prefix...)
			line = append(line, label...)
			line = append(line, ',')
			line = strconv.AppendInt(line, int64(100+(k*7919+i*104729)%900000), 10)
			line = append(line, '\n')
			b.Write(line)
		}
	}
	return b.Bytes()
}

// BenchmarkReadLong10kx120 reads a long history of 10,000 monthly series of
// 120 values (1.2 million rows, about 50 MB) whose names are built from the
// key columns family, product and customer. Target: at most 1 s per read on
// one core (go test -run '^$' -bench ReadLong -cpu 1 ./scenario/data).
// Measured on a shared 2-core AMD EPYC: 0.39 to 0.47 s, 1.24 million
// allocations (one per row: the line's string in encoding/csv); encoding/csv
// takes about half of the time.
func BenchmarkReadLong10kx120(b *testing.B) {
	benchRead(b, longHistory(10000, 120, true), ReadOptions{Key: []string{"family", "product", "customer"}}, 10000)
}

// BenchmarkReadLongSeriesColumn10kx120 reads the same history with the
// names already joined in a series column, to show what the key costs.
func BenchmarkReadLongSeriesColumn10kx120(b *testing.B) {
	benchRead(b, longHistory(10000, 120, false), ReadOptions{}, 10000)
}

// BenchmarkReadLong1kx120 and BenchmarkReadLong10kx12 show how the reading
// time grows with the number of series and with their length.
func BenchmarkReadLong1kx120(b *testing.B) {
	benchRead(b, longHistory(1000, 120, true), ReadOptions{Key: []string{"family", "product", "customer"}}, 1000)
}

func BenchmarkReadLong10kx12(b *testing.B) {
	benchRead(b, longHistory(10000, 12, true), ReadOptions{Key: []string{"family", "product", "customer"}}, 10000)
}

func benchRead(b *testing.B, in []byte, opt ReadOptions, want int) {
	b.SetBytes(int64(len(in)))
	b.ReportAllocs()
	for b.Loop() {
		h, err := ReadHistory(bytes.NewReader(in), "history.csv", opt)
		if err != nil {
			b.Fatal(err)
		}
		if len(h.Series) != want {
			b.Fatalf("%d series, want %d", len(h.Series), want)
		}
	}
}
