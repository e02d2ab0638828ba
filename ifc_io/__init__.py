"""Everything that touches IFC (and BCF): read the frame, read modelled connections, write results.

Depends on ``engine``'s plain data types only.
"""
