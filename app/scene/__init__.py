"""The Scene: the 3D viewport where the numbers meet the part on the bench."""
