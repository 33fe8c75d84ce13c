// Package copoly computes copolymer composition, composition drift and monomer sequences for
// binary radical copolymerization.
package copoly
