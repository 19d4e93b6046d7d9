"""The syscurve web dashboard (Dash). Start it with `syscurve dashboard`."""
