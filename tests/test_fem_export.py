"""VTU export: the curved mesh and its fields read back through meshio."""
import meshio
import numpy as np

from fem.export import write_vtu
from fem.geometry import round_section
from fem.mesh import mesh_section
from fem.properties import area_moments
from fem.torsion import solve_torsion


def test_vtu_round_trip(tmp_path):
    sm = mesh_section(round_section(0.02))
    tr = solve_torsion(sm, area_moments(sm).centroid)
    path = write_vtu(tmp_path / "s.vtu", sm, {"phi": tr.phi})
    m = meshio.read(path)
    assert m.cells[0].type == "triangle6"
    assert m.cells[0].data.shape == (sm.mesh.t.shape[1], 6)
    assert np.allclose(m.point_data["phi"], tr.phi)
    # the stress function of a round bar is (R² − r²)/2 (exact, Prandtl): check it at the nodes
    r2 = m.points[:, 0] ** 2 + m.points[:, 1] ** 2
    assert np.allclose(m.point_data["phi"], (0.01**2 - r2) / 2, atol=1e-9)
