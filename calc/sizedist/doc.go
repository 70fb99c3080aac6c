// Package sizedist describes droplet-size distributions: parametric models
// (Rosin–Rammler, log-normal, upper-limit, Nukiyama–Tanasawa), binned data
// cut from a model or imported from a measurement, their mean and
// representative diameters, and least-squares fits of a model to binned data.
//
// All diameters are in metres. A distribution has a basis: number (q0, Q0),
// surface (q2, Q2) or volume (q3, Q3) in the notation of ISO 9276-1; mean
// diameters D_pq follow Mugele & Evans (1951), Ind. Eng. Chem. 43(6),
// 1317–1324, which ISO 9276-2:2014 writes as x̄_{k,r} = D_{k+r,r}.
//
// Binned data assume that the number density is constant in D inside each
// class. That one rule gives the class average of D^p used for the means
// (the ASTM E799 class-average rule), the conversion between number and
// volume fractions, and the interpolation of the quantiles inside a class.
// docs/methods-sizedist.md collects the formulas and sources.
package sizedist
