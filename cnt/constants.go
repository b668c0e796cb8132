package cnt

import "gonum.org/v1/gonum/unit/constant"

// Physical constants, SI, exact in the 2019 SI (CODATA 2018) as carried by gonum.
const (
	Boltzmann = float64(constant.Boltzmann) // k_B, J/K
	Avogadro  = float64(constant.Avogadro)  // N_A, 1/mol
	Planck    = float64(constant.Planck)    // h, J·s
	Gas       = Avogadro * Boltzmann        // R = N_A·k_B, J/(mol·K)
)
