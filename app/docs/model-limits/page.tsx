export const metadata = { title: 'What the model leaves out' };

export default function ModelLimits() {
  return (
    <article className="max-w-3xl space-y-4 leading-relaxed">
      <h1 className="text-2xl font-semibold">What the model leaves out</h1>
      <p>Everything Tauforge makes is a model, to be checked against measurement before anyone trusts it.</p>
      <ul className="list-disc space-y-2 pl-6">
        <li><strong>Ideal tilings.</strong> Cuts come from perfect hyperlattices and sharp occupation domains. Real samples carry phason disorder, vacancies, chemical disorder and relaxations that the cut does not contain.</li>
        <li><strong>Kinematic diffraction.</strong> Intensities are single-scattering |F|². Dynamical scattering (strong in electron diffraction), absorption, extinction and instrument effects beyond a simple profile are not modelled.</li>
        <li><strong>Approximants by linear phason strain.</strong> A p/q cell is the quasicrystal model sheared in perpendicular space; real approximant phases may differ in decoration and symmetry.</li>
        <li><strong>Form factors and displacements.</strong> Tabulated free-atom form factors and one isotropic displacement parameter per site class.</li>
      </ul>
    </article>
  );
}
