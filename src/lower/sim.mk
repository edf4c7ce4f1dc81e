## statevector engine, adjoint gradients, optimizers
