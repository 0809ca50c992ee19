"""Text and table reports for people: the solution and construction in words, the checks, the forces,
and the caution every output carries."""
