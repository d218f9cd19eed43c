import { render } from 'preact';
import { App } from './ui/App';
import { boot } from './app/boot';

const root = document.getElementById('app');
if (!root) throw new Error('missing #app element');
boot().then(({ initialCase, slots }) => render(<App initialCase={initialCase} slots={slots} />, root));
