/** Hand-off writers: the integral dump of Knowles & Handy and Tessera's qubit Hamiltonian JSON. */
export { fcidumpLines, formatFortranReal, type FcidumpOptions } from './fcidump';
export { QUBIT_HAMILTONIAN_FORMAT, QUBIT_HAMILTONIAN_VERSION, qubitHamiltonianJson, registerDescription, type QubitHamiltonianJsonOptions } from './qubitHamiltonianJson';
