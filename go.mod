module scalerisk

go 1.26

require (
	github.com/go-echarts/go-echarts/v2 v2.6.7
	github.com/gocarina/gocsv v0.0.0-20240520201108-78e41c74b4b1
	github.com/spf13/cobra v1.10.2
	golang.org/x/term v0.38.0
	gonum.org/v1/gonum v0.17.0
)

require (
	github.com/inconshreveable/mousetrap v1.1.0 // indirect
	github.com/spf13/pflag v1.0.9 // indirect
	golang.org/x/sys v0.39.0 // indirect
)
