/** Dense linear algebra for the electronic-structure layer (row-major Float64Array matrices). */
export * from './dense';
export * from './eigen';
export * from './orthogonalize';
export * from './singular';
