module copoly

go 1.26

require (
	github.com/hack-pad/hackpadfs v0.2.4 // indirect
	github.com/norunners/vert v0.0.0-20221203075838-106a353d42dd // indirect
	gonum.org/v1/gonum v0.17.0 // indirect
)
