package measure_test

import (
	"fmt"

	"cylcav/measure"
)

// An invented materials-lab measurement: a cavity's TE011 resonance moves
// from 9.5 GHz empty to 6.57 GHz when filled with a plastic, and its Q0
// falls from 12 000 to 2 600.
func ExampleMeasureDielectric() {
	r, err := measure.MeasureDielectric(measure.DielectricInput{
		FEmpty: 9.5e9, FEmptyErr: 5e3,
		FFilled: 6.57e9, FFilledErr: 5e3,
		Q0Empty: 12000, Q0EmptyErr: 100,
		Q0Filled: 2600, Q0FilledErr: 30,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("eps_r = %.5f +- %.1e\n", r.EpsR, r.EpsRErr)
	fmt.Printf("tan(delta) = %.2e +- %.1e\n", r.TanDelta, r.TanDeltaErr)
	for _, b := range r.Budget {
		fmt.Printf("  %-32s eps_r %.1e  tan(delta) %.1e\n", b.Input, b.EpsR, b.TanDelta)
	}
	// Output:
	// eps_r = 2.09082 +- 3.9e-06
	// tan(delta) = 2.84e-04 +- 5.8e-06
	//   empty frequency                  eps_r 2.2e-06  tan(delta) 2.6e-11
	//   filled frequency                 eps_r 3.2e-06  tan(delta) 3.8e-11
	//   empty Q0                         eps_r 0.0e+00  tan(delta) 8.4e-07
	//   filled Q0                        eps_r 0.0e+00  tan(delta) 4.4e-06
	//   wall model (Rs ~ f^a, a = 0.5)   eps_r 0.0e+00  tan(delta) 3.7e-06
}
