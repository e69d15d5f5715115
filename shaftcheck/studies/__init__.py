"""Studies of a whole design: each turns formulas into typed results and checks."""
