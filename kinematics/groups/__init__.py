"""The group forms as classes (driver, RRR, RRP, RPR, the numeric fallback), the decomposition of a
mechanism into them, and the records their construction steps are made of."""
